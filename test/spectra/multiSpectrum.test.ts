import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { MULTI_SPECTRUM, multiSpectrumText } from '../../fixtures/spectra/generate.js';
import { findIon, freeIonRatio } from '../../src/index.js';
import { analyseEveryColumn, analyseSpectrum } from '../../src/spectra/spectrumAnalysis.js';
import { parseSpectrumText, spectrumColumns } from '../../src/spectra/spectrumText.js';
import { runInProcess } from '../cliRunner.js';
import { expectClose } from '../helpers.js';

/**
 * Files of several spectra: the INVENTED three-batch [Cr(mz)₆]³⁺ file of
 * fixtures/spectra/generate.ts (instrument lines, two header rows, one x and three y columns).
 */

const root = resolve(__dirname, '../..');
const file = resolve(root, 'fixtures/spectra', MULTI_SPECTRUM.file);
const text = readFileSync(file, 'utf8');
const cr = findIon('Cr3+');
const options = {
  fileName: file,
  baseline: 'linear' as const,
  includeChargeTransfer: false,
  concentration: 0.02,
  pathLength: 1,
  fit: {
    n: cr.n,
    geometry: 'oct' as const,
    ion: cr,
    ratio: { cOverB: freeIonRatio(cr) ?? 4.5, origin: 'free ion' },
    includeSpinForbidden: false,
  },
};
const dir = mkdtempSync(join(tmpdir(), 'termsplit-multi-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('spectrumColumns', () => {
  it('is what the generator makes, marked invented', () => {
    expect(text).toBe(multiSpectrumText(MULTI_SPECTRUM));
    expect(text).toContain('INVENTED');
  });

  it('lists the columns under their joined header rows and keeps instrument lines as metadata, out of the labels', () => {
    const layout = spectrumColumns(text);
    expect(layout.columns.map((c) => c.label)).toEqual([
      'Wavelength (nm)',
      'batch A Absorbance',
      'batch B Absorbance',
      'batch C Absorbance',
    ]);
    expect(layout.metadata.map((m) => [m.key, m.value])).toEqual([
      ['Instrument', 'invented double-beam UV-vis-NIR'],
      ['Date', '2026-01-15, 10:32'],
      ['operator', 'invented, slit=2 nm, scan=600 nm/min, mode=absorbance'],
    ]);
    expect(layout.rows).toBe(771);
    expect(layout.x).toBe(1);
    for (const c of layout.columns) expect(c.label).not.toMatch(/slit|Instrument|invented/);
  });
});

describe('parseSpectrumText and analyseSpectrum on a file of several spectra', () => {
  it('picks a column by number or by header, and says which columns were read', () => {
    expect(parseSpectrumText(text, { yColumn: 'batch B' }).columns).toEqual({ x: 1, y: 3, count: 4 });
    const raw = parseSpectrumText(text, { yColumn: 4 });
    expect(raw.yLabel).toBe('batch C Absorbance');
    expect(raw.metadata?.length).toBe(3);
  });

  it('cautions when the y column was left to the default in a file of more than two columns', () => {
    const r = analyseSpectrum(text, {
      ...options,
      names: { concentrationAndPath: 'c, l', yColumn: '--y-col' },
    });
    expect(r.cautions[0]).toMatch(
      /the file has 4 columns; column 2 \("batch A Absorbance"\) was read as y by default: --y-col/,
    );
    const chosen = analyseSpectrum(text, { ...options, yColumn: 2 });
    expect(chosen.cautions.join()).not.toMatch(/was read as y by default/);
  });
});

describe('analyseEveryColumn', () => {
  it('fits each batch to its invented Dq and B within 3 %', () => {
    const results = analyseEveryColumn(text, { ...options, yColumn: 'all' });
    expect(results.map((r) => r.column)).toEqual([2, 3, 4]);
    results.forEach((r, i) => {
      const truth = (MULTI_SPECTRUM.spectra[i] as (typeof MULTI_SPECTRUM.spectra)[number]).spectrum;
      const best =
        'analysis' in r && r.analysis.fit && 'result' in r.analysis.fit
          ? r.analysis.fit.result.solutions[0]
          : undefined;
      expectClose(best?.dq, truth.dq, 0.03);
      expectClose(best?.B, truth.B, 0.03);
    });
  });

  it('reports a column that cannot be analysed and goes on; refuses JCAMP-DX and a file with x only', () => {
    const bad = 'nm,A,A\n400,0.1,x\n500,0.2,y\n';
    expect(() => analyseEveryColumn(bad, options)).toThrow(/no column could be analysed/);
    expect(() => analyseEveryColumn('##TITLE=x\n', options)).toThrow(/JCAMP-DX file is read as one spectrum/);
    expect(() => analyseEveryColumn('nm\n400\n500\n', options)).toThrow(/no column besides x/);
  });
});

describe('termsplit spectrum and report with several spectra, in process', () => {
  it('--list-columns --json lists the columns and the metadata', async () => {
    const r = await runInProcess(['spectrum', file, '--list-columns', '--json']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.columns).toHaveLength(4);
    expect(out.metadata[0].key).toBe('Instrument');
  });

  it('--y-col all gives one result per column in JSON, with the columns read and one figure each', async () => {
    const r = await runInProcess(
      ['spectrum', file, '--y-col', 'all', '--ion', 'Cr3+', '--json', '-o', join(dir, 'batches.svg')],
      dir,
    );
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.spectra.map((s: { y: { column: number } }) => s.y.column)).toEqual([2, 3, 4]);
    expect(out.spectra[0].x.column).toBe(1);
    expect(
      readdirSync(dir)
        .filter((f) => f.startsWith('batches'))
        .sort(),
    ).toEqual(['batches-col2.svg', 'batches-col3.svg', 'batches-col4.svg']);
  });

  it('a sheet sample with yColumn "all" becomes one sample per column in the report', async () => {
    writeFileSync(join(dir, 'series.csv'), text);
    writeFileSync(
      join(dir, 'sheet.json'),
      JSON.stringify({
        title: 'invented batches',
        invented: true,
        samples: [
          {
            name: 'Cr(mz)6',
            ion: 'Cr3+',
            spectrum: { file: 'series.csv', yColumn: 'all', conc: 0.02, path: 1 },
          },
        ],
      }),
    );
    const r = await runInProcess(['report', 'sheet.json', '-o', 'out', '--jobs', '1'], dir);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const report = JSON.parse(readFileSync(join(dir, 'out/report.json'), 'utf8'));
    expect(report.samples.map((s: { name: string }) => s.name)).toEqual([
      'Cr(mz)6 (batch A Absorbance)',
      'Cr(mz)6 (batch B Absorbance)',
      'Cr(mz)6 (batch C Absorbance)',
    ]);
  }, 60_000);
});
