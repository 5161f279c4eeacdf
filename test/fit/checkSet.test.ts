import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { findIon, fitBands } from '../../src/index.js';
import { ROOT } from '../cliRunner.js';

/**
 * The check set: published band maxima of textbook complexes, each with its source in the
 * fixture, fitted with the default options (no assignments, no spin state, no C choice).
 */
interface Row {
  complex: string;
  ion: string;
  geometry: 'oct' | 'tet';
  bands: number[];
  dq: number;
  B: number | null;
  spin: number;
  source: string;
}

const rows: Row[] = JSON.parse(
  readFileSync(join(ROOT, 'fixtures/reference/band-fit-check-set.json'), 'utf8'),
).rows;

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('fitBands on the check set of published complexes, default options', () => {
  it('has at least 15 rows, each with a source', () => {
    expect(rows.length).toBeGreaterThanOrEqual(15);
    for (const row of rows) expect(row.source.length).toBeGreaterThan(20);
  });

  it.each(rows)('fits $complex ($bands) to the published Dq within 5 %, B within 10 %, spin $spin', (row) => {
    const ion = findIon(row.ion);
    const r = fitBands({
      n: ion.n,
      geometry: row.geometry,
      bands: row.bands.map((energy) => ({ energy })),
      freeIon: ion,
    });
    const best = r.solutions[0];
    expect(best?.spin).toBe(row.spin);
    expect(rel(best?.dq ?? 0, row.dq)).toBeLessThan(0.05);
    if (row.B !== null) {
      expect(best?.bDetermined).toBe(true);
      expect(rel(best?.B ?? 0, row.B)).toBeLessThan(0.1);
    }
  });
});
