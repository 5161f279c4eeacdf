import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../cli/io.js';
import { splitLabels } from '../../cli/options.js';
import { withError } from '../../cli/present/fitPresent.js';
import { run } from '../../cli/program.js';
import { ensureBuilt, runInProcess } from '../cliRunner.js';

const root = resolve(import.meta.dirname, '../..');
const main = resolve(root, 'dist/cli/main.js');

async function runFit(...args: string[]) {
  const io = memoryIo();
  const code = await run(['fit', ...args], io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

describe('termsplit fit (in process)', () => {
  it('prints the best [Ni(H2O)6]2+ solution, its table, the predicted bands and no errors', async () => {
    const r = await runFit('--ion', 'Ni2+', '--bands', '8500,13800,25300');
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toMatch(/^Fit of Ni²⁺ d⁸, octahedral, to 3 bands/);
    expect(r.stdout).toMatch(/C\/B held at 4\.46 \(free-ion ratio of Ni²⁺\)/);
    expect(r.stdout).toMatch(/Dq {3}= \d+ ± \d+ cm⁻¹/);
    expect(r.stdout).toMatch(/β {4}= 0\.\d+ ± 0\.\d+/);
    expect(r.stdout).toContain('³T₁g(P)');
    expect(r.stdout).toContain('Predicted bands of the best solution');
    expect(r.stdout).toContain('Alternatives: none (this was the only assignment to try).');
  });

  it('prints at least the JSON shape of the issue, best first', async () => {
    const r = await runFit('--ion', 'Ni2+', '--bands', '8500,13800,25300', '--json');
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    const best = json.solutions[0];
    for (const key of ['dq', 'B', 'C', 'beta', 'rms', 'converged']) expect(best).toHaveProperty(key);
    expect(typeof best.errors.dq).toBe('number');
    expect(typeof best.errors.B).toBe('number');
    expect(best.assignments[0]).toMatchObject({ observed: 8500, label: '3T2g' });
    expect(typeof best.assignments[0].calculated).toBe('number');
    expect(best.predicted.map((p: { label: string }) => p.label)).toContain('1Eg(D)');
    expect(best.predicted[0]).toHaveProperty('energy');
    expect(best.predicted[0]).toHaveProperty('wavelength');
    expect(json.cOrigin).toBe('free-ion ratio of Ni2+');
  });

  it('reads bands in nm, eV and kK, per value or for the list, with uncertainties', async () => {
    const perValue = JSON.parse((await runFit('--d', '8', '--bands', '1176nm,725nm,395nm', '--json')).stdout);
    const forList = JSON.parse(
      (await runFit('--d', '8', '--bands', '1176,725,395', '--unit', 'nm', '--json')).stdout,
    );
    expect(perValue.bands[0].energy).toBeCloseTo(1e7 / 1176, 6);
    expect(forList.bands).toEqual(perValue.bands);
    const mixed = JSON.parse(
      (await runFit('--d', '8', '--bands', '1.05eV±0.01,13.8kK±0.2,25300±300', '--json')).stdout,
    );
    // 1 eV = 8065.543937 cm⁻¹ (CODATA 2018).
    expect(mixed.bands[0].energy).toBeCloseTo(1.05 * 8065.543937, 6);
    expect(mixed.bands[0].sigma).toBeCloseTo(80.65543937, 6);
    expect(mixed.bands[1]).toEqual({ energy: 13800, sigma: 200 });
    expect(mixed.bands[2]).toEqual({ energy: 25300, sigma: 300 });
  });

  it('weights bands by their uncertainties and propagates them when every band has one', async () => {
    const json = JSON.parse(
      (await runFit('--ion', 'Cr3+', '--bands', '17400±200,24600±300', '--json')).stdout,
    );
    expect(json.weighting).toBe('given');
    expect(json.solutions[0].errorBasis).toBe('band-uncertainties');
    expect(json.solutions[0].errors.dq).toBeCloseTo(20, 5);
  });

  it('takes assignments with commas inside labels and ? for a band left to the search', async () => {
    expect(splitLabels('3T2g,3T1g(H,1),?')).toEqual(['3T2g', '3T1g(H,1)', '?']);
    const json = JSON.parse(
      (await runFit('--d', '8', '--bands', '8500,13800,25300', '--assign', '3T2g,?,3T1g(P)', '--json'))
        .stdout,
    );
    expect(json.solutions[0].assignments.map((a: { label: string }) => a.label)).toEqual([
      '3T2g',
      '3T1g(F)',
      '3T1g(P)',
    ]);
  });

  it('lists the alternatives of an ambiguous d³ pair and the warnings', async () => {
    const r = await runFit('--ion', 'Cr3+', '--bands', '17400,37800');
    expect(r.stdout).toContain('Alternatives that fit nearly as well:');
    expect(r.stdout).toMatch(/#2 {2}.*Dq \d+.*score .*\[β above 1: implausible\]/);
    expect(r.stdout).toContain('Warnings and cautions:');
    expect(r.stdout).toMatch(/observed band at 37800 cm⁻¹/);
    expect(r.stdout).toMatch(/no error estimate/);
  });

  it('offers spin-forbidden transitions to the search with --spin-forbidden, still ranking the spin-allowed fit first', async () => {
    const json = JSON.parse(
      (await runFit('--ion', 'Ni2+', '--bands', '8500,13800,25300', '--spin-forbidden', '--json')).stdout,
    );
    expect(json.solutions.length).toBeGreaterThan(1);
    expect(json.solutions[0].assignments.every((a: { spinAllowed: boolean }) => a.spinAllowed)).toBe(true);
    expect(
      json.solutions.some((s: { assignments: { spinAllowed: boolean }[] }) =>
        s.assignments.some((a) => !a.spinAllowed),
      ),
    ).toBe(true);
  });

  it('fits C with --fit-c and a C-dependent band', async () => {
    const json = JSON.parse(
      (
        await runFit(
          '--ion',
          'Cr3+',
          '--bands',
          '14900,17400,24600',
          '--assign',
          '2Eg(G),4T2g,4T1g(F)',
          '--fit-c',
          '--json',
        )
      ).stdout,
    );
    expect(json.fitC).toBe(true);
    expect(json.solutions[0].cFitted).toBe(true);
    expect(json.solutions[0].parameters).toEqual(['dq', 'B', 'C']);
  });

  it.each([
    [['--ion', 'Ni2+'], /--bands is required/],
    [['--ion', 'Ni2+', '--bands', ''], /energy list "": expected one or more values/],
    [['--ion', 'Ni2+', '--bands', '8500,abc'], /energy "abc": expected a positive number/],
    [['--ion', 'Ni2+', '--bands', '8500parsec,13800'], /unit "parsec": expected cm-1, nm, eV or kK/],
    [['--ion', 'Ni2+', '--bands', '8500,13800', '--unit', 'Hz'], /unit "Hz"/],
    [
      ['--ion', 'Ni2+', '--bands', '8500,13800', '--assign', '3T2g,3T1g(F),3T1g(P)'],
      /--assign "3T2g,3T1g\(F\),3T1g\(P\)": 3 labels for 2 bands: expected one per band/,
    ],
    [
      ['--ion', 'Ni2+', '--bands', '8500,13800', '--assign', '3T2g'],
      /1 label for 2 bands: expected one per band/,
    ],
    [
      ['--ion', 'Ni2+', '--bands', '8500,13800', '--assign', '4T2g,?'],
      /no such level of d8.*expected one of/,
    ],
    [
      ['--ion', 'V3+', '--bands', '17800'],
      /1 band: .*cannot fix Dq and B: give a second band, or hold B .*\(--B\)/,
    ],
    [['--ion', 'Ni2+', '--bands', '8500,13800', '--fit-c'], /2 bands for 3 free parameters/],
    [['--ion', 'Xx9+', '--bands', '8500,13800'], /unknown ion "Xx9\+"/],
    [['--d', '8', '--bands', '8500,13800', '--geometry', 'square'], /--geometry "square"/],
  ])('exits 2 with one line on stderr for %j', async (args, message) => {
    const r = await runFit(...args);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^termsplit: /);
  });
});

describe('withError', () => {
  it('rounds a value to two significant digits of its error, and prints a lone value without one', () => {
    expect(withError(833.51, 12.28)).toBe('834 ± 12');
    expect(withError(0.87412, 0.0193, 3)).toBe('0.874 ± 0.019');
    expect(withError(1740, null, 1)).toBe('1740.0');
  });
});

describe('termsplit fit (one smoke test of the built command; the rest in process)', () => {
  beforeAll(() => {
    ensureBuilt();
  }, 120_000);

  it('prints the fit for the issue’s command line and exits 0', async () => {
    const r = await runInProcess(['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300']);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toContain('Best solution');
    expect(r.stdout).toContain('³T₂g');
  });

  it('prints one JSON object with --json', () => {
    const r = spawnSync('node', [main, 'fit', '--d', '3', '--bands', '17400,24600', '--json'], {
      encoding: 'utf8',
    });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).solutions[0].dq).toBeCloseTo(1740, 6);
  });

  it('exits 2 with one line and no stdout on bad input', async () => {
    const r = await runInProcess(['fit', '--d', '3', '--bands', '17400,nope']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });
});
