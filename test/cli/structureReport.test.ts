import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseSampleSheet } from '../../src/index.js';
import { runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-structure-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** An invented sheet (not measured data): one trans-MA₄B₂ Cr³⁺ sample with its geometry. */
const SHEET = {
  title: 'invented structure test',
  invented: true,
  samples: [
    {
      name: 'invented trans chromium',
      ion: 'Cr3+',
      bands: '17200, 19300, 24500',
      structure: {
        shape: 'trans-MA4B2',
        bonds: { A: [7000, 1000], B: [5500, 800] },
        free: ['eSigma(A)', 'eSigma(B)', 'B'],
      },
    },
  ],
};

describe('report with a sample geometry', () => {
  it('parseSampleSheet keeps the structure field and names a bad one', () => {
    const ok = parseSampleSheet(JSON.stringify(SHEET), 'json');
    expect(ok.samples[0]?.structure?.shape).toBe('trans-MA4B2');
    const bad = parseSampleSheet(
      JSON.stringify({
        samples: [
          {
            name: 'x',
            ion: 'Cu2+',
            bands: '9000',
            structure: { shape: 'square-plane', tetragonal: [1, 2, 3] },
          },
        ],
      }),
      'json',
    );
    expect(bad.problems[0]?.field).toBe('structure');
  });

  it('termsplit report shows the geometry used and the fit with it', async () => {
    const path = join(dir, 'sheet.json');
    writeFileSync(path, JSON.stringify(SHEET));
    const r = await runInProcess(['report', path, '-o', join(dir, 'out'), '--jobs', '1'], dir);
    expect(r.code).toBe(0);
    const md = readFileSync(join(dir, 'out', 'report.md'), 'utf8');
    expect(md).toContain('With its geometry: trans-MA4B2, D4h');
    expect(md).toContain('Schäffer and C. K. Jørgensen');
    expect(
      readFileSync(join(dir, 'out', 'tables', 'invented-trans-chromium-structure-bands.csv'), 'utf8'),
    ).toContain('24500');
  });
});
