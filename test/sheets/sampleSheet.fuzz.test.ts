import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseSampleSheet } from '../../src/sheets/sampleSheet.js';
import { fuzz, mutated, readOrRefuse } from '../fuzz.js';

/**
 * Property tests of sample sheets (fixed seed, test/fuzz.ts): the same random samples written as
 * JSON and as CSV read to the same checked samples; random edits of either are read (with the
 * bad samples listed as problems) or refused in one line.
 */

const ION = fc.constantFrom('Ni2+', 'Cr3+', 'Co2+', 'V3+', 'Fe2+', 'Mn2+', 'Cu2+', 'Ti3+');

const sample = fc.record({
  name: fc.stringMatching(/^[A-Za-z][A-Za-z0-9 ()_.-]{0,15}$/).map((s) => s.trim() || 'x'),
  ion: ION,
  geometry: fc.constantFrom('oct', 'tet'),
  bands: fc.array(fc.integer({ min: 3_000, max: 45_000 }), { minLength: 1, maxLength: 4 }),
  cb: fc.option(
    fc.integer({ min: 30, max: 60 }).map((v) => v / 10),
    { nil: undefined },
  ),
  keepBands: fc.boolean(),
});

type Sample = typeof sample extends fc.Arbitrary<infer S> ? S : never;

const samples = fc.uniqueArray(sample, { minLength: 1, maxLength: 5, selector: (s) => s.name });

function asJson(list: readonly Sample[]): string {
  return JSON.stringify({
    title: 'fuzz',
    samples: list.map((s) => ({
      name: s.name,
      ion: s.ion,
      geometry: s.geometry,
      bands: s.bands.join(', '),
      ...(s.cb !== undefined ? { cb: s.cb } : {}),
      keepBands: s.keepBands,
    })),
  });
}

function asCsv(list: readonly Sample[]): string {
  const rows = list.map((s) =>
    [s.name, s.ion, s.geometry, `"${s.bands.join(', ')}"`, s.cb ?? '', s.keepBands ? 'yes' : 'no'].join(','),
  );
  return ['# a comment', 'name,ion,geometry,bands,cb,keep_bands', ...rows, ''].join('\n');
}

describe('parseSampleSheet (property)', () => {
  it('reads the same random samples written as JSON and as CSV to the same checked samples', () => {
    fuzz(
      fc.property(samples, (list) => {
        const json = parseSampleSheet(asJson(list), 'json');
        const csv = parseSampleSheet(asCsv(list), 'csv');
        expect(json.problems).toEqual([]);
        expect(csv.samples).toEqual(json.samples);
        expect(json.samples.map((s) => s.bands?.map((b) => b.value))).toEqual(list.map((s) => s.bands));
      }),
      120,
    );
  });

  it('reads random edits of a JSON sheet, bad samples as problems, or refuses them in one line', () => {
    fuzz(
      fc.property(
        samples.chain((list) => mutated(asJson(list), 5)),
        (text) => {
          const sheet = readOrRefuse(() => parseSampleSheet(text, 'json'));
          for (const p of sheet?.problems ?? []) expect(p.message).not.toBe('');
        },
      ),
      300,
    );
  });

  it('reads random edits of a CSV sheet, bad samples as problems, or refuses them in one line', () => {
    fuzz(
      fc.property(
        samples.chain((list) => mutated(asCsv(list), 5)),
        (text) => {
          const sheet = readOrRefuse(() => parseSampleSheet(text, 'csv'));
          for (const p of sheet?.problems ?? []) expect(p.message).not.toBe('');
        },
      ),
      300,
    );
  });

  it('reads random JSON values as sheets or refuses them in one line', () => {
    fuzz(
      fc.property(fc.jsonValue({ maxDepth: 3 }), (value) => {
        readOrRefuse(() => parseSampleSheet(JSON.stringify(value), 'json'));
        readOrRefuse(() => parseSampleSheet(JSON.stringify({ samples: [value] }), 'json'));
      }),
      200,
    );
  });
});
