import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseEnergy, parseEnergyList, toWavenumber } from '../../src/core/units.js';
import { parseRange } from '../../src/spectra/energyRange.js';
import { fuzz, mutated, readOrRefuse } from '../fuzz.js';

/**
 * Property tests of energies, band lists and ± uncertainties (fixed seed, test/fuzz.ts): a band
 * written with any unit and spelling of ± reads back to its value in cm⁻¹; random edits are read
 * or refused in one line.
 */

/** A band: a value in its unit (kept well inside the accepted range), an optional uncertainty. */
const band = fc
  .record({
    unit: fc.constantFrom('', 'cm-1', 'nm', 'eV', 'kK'),
    cm: fc.integer({ min: 2_000, max: 60_000 }),
    sigmaPercent: fc.option(fc.integer({ min: 1, max: 20 }), { nil: undefined }),
    pm: fc.constantFrom('±', '+-', '+/-'),
    space: fc.constantFrom('', ' '),
  })
  .map((b) => {
    const unit = b.unit === '' ? 'cm-1' : b.unit;
    const value = Number(
      (unit === 'nm'
        ? 1e7 / b.cm
        : unit === 'eV'
          ? b.cm / 8065.543937
          : unit === 'kK'
            ? b.cm / 1000
            : b.cm
      ).toPrecision(6),
    );
    const sigma =
      b.sigmaPercent === undefined ? undefined : Number(((value * b.sigmaPercent) / 100).toPrecision(3));
    const text = `${value}${b.space}${b.unit}${sigma === undefined ? '' : `${b.pm}${sigma}`}`;
    return { text, value, sigma, unit: unit as 'cm-1' | 'nm' | 'eV' | 'kK' };
  });

describe('parseEnergy and parseEnergyList (property)', () => {
  it('read a band in any unit, with any spelling of ±, to its value in cm⁻¹ and its σ through the conversion', () => {
    fuzz(
      fc.property(band, (b) => {
        const e = parseEnergy(b.text);
        expect(e.value).toBeCloseTo(toWavenumber(b.value, b.unit), 6);
        if (b.sigma === undefined) expect(e.sigma).toBeUndefined();
        else {
          const expected = b.unit === 'nm' ? (1e7 / b.value ** 2) * b.sigma : toWavenumber(b.sigma, b.unit);
          expect(e.sigma).toBeCloseTo(expected, 6);
        }
      }),
      300,
    );
  });

  it('read a list joined by "," or ";" as its items', () => {
    fuzz(
      fc.property(
        fc.array(band, { minLength: 1, maxLength: 6 }),
        fc.constantFrom(',', ';', ', ', ' ; '),
        (bands, sep) => {
          const list = parseEnergyList(bands.map((b) => b.text).join(sep));
          expect(list).toEqual(bands.map((b) => parseEnergy(b.text)));
        },
      ),
      150,
    );
  });

  it('read random edits of a band list or refuse them in one line', () => {
    fuzz(
      fc.property(
        fc
          .array(band, { minLength: 1, maxLength: 5 })
          .chain((bands) => mutated(bands.map((b) => b.text).join(', '))),
        (text) => {
          const list = readOrRefuse(() => parseEnergyList(text));
          for (const e of list ?? []) {
            expect(Number.isFinite(e.value) && e.value > 0).toBe(true);
            if (e.sigma !== undefined) expect(e.sigma > 0 && e.sigma <= e.value).toBe(true);
          }
        },
      ),
      400,
    );
  });

  it('parseRange reads random text or refuses it in one line', () => {
    fuzz(
      fc.property(
        fc.oneof(fc.string({ maxLength: 20 }), mutated('330-1300nm', 3), mutated('8000-30000', 3)),
        (text) => {
          const r = readOrRefuse(() => parseRange(text));
          if (r) expect(r.from < r.to).toBe(true);
        },
      ),
      300,
    );
  });
});
