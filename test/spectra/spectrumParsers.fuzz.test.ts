import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { absorptionSpectrum } from '../../src/spectra/absorptionSpectrum.js';
import { readSpectrum } from '../../src/spectra/spectrumAnalysis.js';
import { parseJcampSpectrum } from '../../src/spectra/spectrumJcamp.js';
import { parseSpectrumText, spectrumColumns } from '../../src/spectra/spectrumText.js';
import { fuzz, mutated, readOrRefuse } from '../fuzz.js';

/**
 * Property tests of the spectrum readers (fixed seed, test/fuzz.ts): a random spectrum written in
 * any of the accepted text forms reads back to the same numbers; random edits of a file are read
 * or refused with one line, never another exception.
 */

/** A random spectrum: strictly rising x (nm, three decimals) and y (three decimals, may be negative). */
const spectrum = fc
  .record({
    start: fc.integer({ min: 200_000, max: 400_000 }),
    steps: fc.array(fc.integer({ min: 1, max: 5_000 }), { minLength: 2, maxLength: 40 }),
    seedY: fc.array(fc.integer({ min: -1_000, max: 5_000 }), { minLength: 41, maxLength: 41 }),
  })
  .map(({ start, steps, seedY }) => {
    const x = [start];
    for (const s of steps) x.push((x.at(-1) as number) + s);
    return { x: x.map((v) => v / 1000), y: x.map((_, i) => (seedY[i] as number) / 1000) };
  });

/** The ways a spectrum's text may be laid out. */
const layout = fc.record({
  delimiter: fc.constantFrom(',', ';', '\t', ' ', '  '),
  comma: fc.boolean(),
  header: fc.constantFrom('', 'Wavelength (nm),Absorbance', 'nm,A'),
  comments: fc.boolean(),
  eol: fc.constantFrom('\n', '\r\n'),
  bom: fc.boolean(),
  metadata: fc.boolean(),
});

type Layout = typeof layout extends fc.Arbitrary<infer L> ? L : never;

/** The reference formatting: three decimals, the layout's delimiter and decimal sign. */
function written(s: { x: number[]; y: number[] }, l: Layout): string {
  // A decimal comma needs a delimiter that is not a comma.
  const comma = l.comma && l.delimiter !== ',';
  const num = (v: number) => (comma ? v.toFixed(3).replace('.', ',') : v.toFixed(3));
  const d = l.delimiter;
  const header = l.header === '' ? [] : [l.header.replace(',', d.trim() === '' ? '\t' : d)];
  const lines = [
    ...(l.metadata ? ['Instrument: invented', 'Date: 2026-01-01'] : []),
    ...(l.comments ? ['# a comment'] : []),
    // A header with a space inside cannot be split on whitespace: written tab-separated only then.
    ...(d.trim() === '' && header.length > 0 && / /.test(l.header) ? [] : header),
    ...s.x.map((x, i) => `${num(x)}${d}${num(s.y[i] as number)}`),
    ...(l.comments ? ['% end'] : []),
  ];
  return `${l.bom ? '\uFEFF' : ''}${lines.join(l.eol)}${l.eol}`;
}

describe('parseSpectrumText (property)', () => {
  it('reads a random spectrum in any accepted layout back to the written numbers', () => {
    fuzz(
      fc.property(spectrum, layout, (s, l) => {
        const raw = parseSpectrumText(written(s, l));
        expect([...raw.x]).toEqual(s.x.map((v) => Number(v.toFixed(3))));
        expect([...raw.y]).toEqual(s.y.map((v) => Number(v.toFixed(3))));
        expect(raw.metadata?.length ?? 0).toBe(l.metadata ? 2 : 0);
      }),
      150,
    );
  });

  it('reads random edits of a spectrum file, units applied, or refuses them in one line', () => {
    fuzz(
      fc.property(
        spectrum.chain((s) => layout.chain((l) => mutated(written(s, l)))),
        (text) => {
          readOrRefuse(() => spectrumColumns(text));
          readOrRefuse(() =>
            absorptionSpectrum(parseSpectrumText(text), { xUnit: 'nm', yUnit: 'absorbance' }),
          );
        },
      ),
      300,
    );
  });

  it('refuses random text in one line (or reads it when it happens to be a spectrum)', () => {
    fuzz(
      fc.property(fc.string({ maxLength: 200, unit: 'grapheme' }), (text) => {
        readOrRefuse(() => readSpectrum(text, {}));
      }),
      200,
    );
  });
});

/** JCAMP-DX in the (X++(Y..Y)) form, Y as integers times YFACTOR. */
function jcamp(s: { x: number[]; y: number[] }): string {
  const lines = [
    '##TITLE=fuzz (invented)',
    '##JCAMP-DX=4.24',
    '##DATA TYPE=UV/VIS SPECTRUM',
    '##XUNITS=NANOMETERS',
    '##YUNITS=ABSORBANCE',
    '##XFACTOR=1',
    '##YFACTOR=0.001',
    `##FIRSTX=${s.x[0]}`,
    `##LASTX=${s.x.at(-1)}`,
    `##NPOINTS=${s.x.length}`,
    '##XYDATA=(XY..XY)',
    ...s.x.map((x, i) => `${x}, ${Math.round((s.y[i] as number) * 1000)}`),
    '##END=',
  ];
  return `${lines.join('\n')}\n`;
}

describe('parseJcampSpectrum (property)', () => {
  it('reads a random (XY..XY) spectrum back to the written numbers', () => {
    fuzz(
      fc.property(spectrum, (s) => {
        const raw = parseJcampSpectrum(jcamp(s));
        expect(raw.x.length).toBe(s.x.length);
        raw.x.forEach((v, i) => {
          expect(v).toBeCloseTo(s.x[i] as number, 6);
        });
        raw.y.forEach((v, i) => {
          expect(v).toBeCloseTo(s.y[i] as number, 6);
        });
      }),
      60,
    );
  });

  it('reads random edits of a JCAMP-DX file, units applied, or refuses them in one line', () => {
    fuzz(
      fc.property(
        spectrum.chain((s) => mutated(jcamp(s))),
        (text) => {
          readOrRefuse(() => absorptionSpectrum(parseJcampSpectrum(text)));
        },
      ),
      200,
    );
  });
});
