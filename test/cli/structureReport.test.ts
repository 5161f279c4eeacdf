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

  it('parseSampleSheet reads the geometry columns of a CSV sheet into the structure field', () => {
    const sheet = parseSampleSheet(
      [
        'name,ion,bands,shape,bonds,eds,free,levels,tetragonal',
        'a,Cr3+,17200;19300,trans-MA4B2,"A=7000,1000; B=5500 800",,eSigma(A);B,4Eg;4B2g,',
        'b,Cu2+,9000;12500;15500,,,,,2A1g 2B2g 2Eg,"1200,1500,400"',
        'c,Cu2+,9000,square-plane,"6000,900",1200,,,',
      ].join('\n'),
      'csv',
    );
    expect(sheet.problems).toEqual([]);
    expect(sheet.samples[0]?.structure).toEqual({
      shape: 'trans-MA4B2',
      bonds: { A: [7000, 1000], B: [5500, 800] },
      free: ['eSigma(A)', 'B'],
      assign: ['4Eg', '4B2g'],
    });
    expect(sheet.samples[1]?.structure).toEqual({
      tetragonal: [1200, 1500, 400],
      assign: ['2A1g', '2B2g', '2Eg'],
    });
    expect(sheet.samples[2]?.structure).toEqual({
      shape: 'square-plane',
      bonds: { '*': [6000, 900] },
      eds: 1200,
    });
    const bad = parseSampleSheet('name,ion,bands,tetragonal\nx,Cu2+,9000,"1200,oops,400"', 'csv');
    expect(bad.problems[0]?.field).toBe('structure.tetragonal.1');
    expect(bad.problems[0]?.message).toContain('oops');
  });

  it('termsplit report shows the fit with the geometry, with a caution, when the cubic fit fails', async () => {
    // Invented sheet: three kept components of a d9 ion, which no cubic model assigns.
    const path = join(dir, 'planar.csv');
    writeFileSync(
      path,
      [
        '# invented test data',
        'name,ion,bands,keep_bands,shape,bonds,eds,free,levels',
        'invented planar copper,Cu2+,12500;14250;16900,yes,square-plane,"5000,1000",1000,eSigma(L);ePi(L);eDs,2B2g;2Eg;2A1g',
      ].join('\n'),
    );
    const r = await runInProcess(['report', path, '-o', join(dir, 'planar'), '--jobs', '1', '--json'], dir);
    expect(r.code).toBe(0);
    const md = readFileSync(join(dir, 'planar', 'report.md'), 'utf8');
    expect(md).toContain('The cubic fit failed');
    expect(md).toContain('1 of those shown with the fit of their geometry only');
    expect(md).toContain('With its geometry: square-plane, D4h');
    const json = JSON.parse(readFileSync(join(dir, 'planar', 'report.json'), 'utf8'));
    expect(json.samples).toEqual([]);
    expect(json.structureOnly[0].structure.parameters['ePi(L)']).toBeCloseTo(875, 3);
  });
});
