import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseSampleSheet } from '../../src/sheets/sampleSheet.js';
import { runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-sheet-zeta-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('parseSampleSheet: the zeta field', () => {
  it('parseSampleSheet takes ζ as cm⁻¹ or "ion" (the free-ion value), per sample or as a default, in JSON and CSV', () => {
    const json = parseSampleSheet(
      JSON.stringify({
        defaults: { zeta: 'ion' },
        samples: [
          { name: 'a', ion: 'Co2+', bands: '8100,19600' },
          { name: 'b', ion: 'Ni2+', bands: '8500,13800', zeta: 500 },
        ],
      }),
      'json',
    );
    expect(json.samples.map((s) => s.zeta)).toEqual([533, 500]);
    const csv = parseSampleSheet(
      'name,ion,bands,zeta\nc,Ni2+,8500;13800,ion\nd,Cr3+,17400;24600,200\n',
      'csv',
    );
    expect(csv.samples.map((s) => s.zeta)).toEqual([649, 200]);
  });

  it('parseSampleSheet reports a negative ζ as a problem of that sample, naming the field', () => {
    const sheet = parseSampleSheet(
      JSON.stringify({ samples: [{ name: 'bad', ion: 'Ni2+', bands: '8500,13800', zeta: -4 }] }),
      'json',
    );
    expect(sheet.samples).toHaveLength(0);
    expect(sheet.problems[0]?.field).toBe('zeta');
    expect(sheet.problems[0]?.message).toMatch(/spin–orbit ζ/);
  });
});

describe('termsplit report with ζ in the sheet', () => {
  it('report adds μ_eff with spin–orbit coupling beside spin-only for a sample with zeta', async () => {
    const sheet = join(dir, 'samples.json');
    writeFileSync(
      sheet,
      JSON.stringify({
        title: 'ζ check (invented example)',
        invented: true,
        samples: [{ name: 'ni-zeta', ion: 'Ni2+', bands: '8500,13800,25300', zeta: 'ion' }],
      }),
    );
    const r = await runInProcess(['report', sheet, '-o', join(dir, 'out')], dir);
    expect(r.code).toBe(0);
    const report = JSON.parse(readFileSync(join(dir, 'out/report.json'), 'utf8'));
    const mag = report.samples[0].magnetism;
    expect(mag.zeta).toBe(649);
    expect(mag.spinOnly).toBeCloseTo(2.828, 3);
    // ³A₂g with λ < 0: μ_eff above spin-only (Figgis 1966).
    expect(mag.muEff[2]).toBeGreaterThan(2.9);
    expect(readFileSync(join(dir, 'out/report.md'), 'utf8')).toContain(
      'Magnetic moment with spin–orbit coupling',
    );
  });
});

describe('the fitZeta field', () => {
  it('parseSampleSheet reads fitZeta (JSON) and fit_zeta (CSV), starting ζ at the free-ion value', () => {
    const json = parseSampleSheet(
      JSON.stringify({
        samples: [{ name: 'a', ion: 'Ni2+', bands: '8500,13800,15400,25300', fitZeta: true }],
      }),
      'json',
    );
    expect(json.samples[0]).toMatchObject({ fitZeta: true, zeta: 649 });
    const csv = parseSampleSheet('name,ion,bands,fit_zeta\nb,Ni2+,8500;13800;15400;25300,yes\n', 'csv');
    expect(csv.samples[0]).toMatchObject({ fitZeta: true, zeta: 649 });
  });

  it('report with fitZeta gives ζ with its error and each component on its Γ level (invented sample)', async () => {
    const sheet = join(dir, 'fit-zeta.json');
    writeFileSync(
      sheet,
      JSON.stringify({
        title: 'ζ fit check (invented example)',
        invented: true,
        samples: [{ name: 'ni-fit', ion: 'Ni2+', bands: '8500,13800,15400,25300', cb: 4.2, fitZeta: true }],
      }),
    );
    const r = await runInProcess(['report', sheet, '-o', join(dir, 'fit-out')], dir);
    expect(r.code).toBe(0);
    const sample = JSON.parse(readFileSync(join(dir, 'fit-out/report.json'), 'utf8')).samples[0];
    expect(sample.zetaFit.fitted).toBe(true);
    expect(sample.zetaFit.components.map((c: { level: string }) => c.level)).toEqual(['Γ4(2)', 'Γ3(3)']);
    expect(sample.magnetism.zeta).toBe(sample.zetaFit.zeta);
    expect(readFileSync(join(dir, 'fit-out/report.md'), 'utf8')).toMatch(
      /Spin–orbit ζ fitted: \d+ ± \d+ cm⁻¹/,
    );
  });
});
