import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../cli/io.js';
import { run } from '../../cli/program.js';
import { ensureBuilt, runInProcess } from '../cliRunner.js';

const root = resolve(import.meta.dirname, '../..');
const main = join(root, 'dist/cli/main.js');
const dir = mkdtempSync(join(tmpdir(), 'termsplit-crossover-'));

afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function cli(...argv: string[]) {
  const io = memoryIo(dir);
  const code = await run(['crossover', ...argv], io);
  return { code, out: io.stdout, err: io.stderr };
}

describe('termsplit crossover (in process)', () => {
  it('gives d6 with --ion Co3+ the 5T2g → 1A1g crossover, with the free-ion B said to be used', async () => {
    const { code, out, err } = await cli('d6', '--ion', 'Co3+', '--json');
    expect([code, err]).toEqual([0, '']);
    const json = JSON.parse(out);
    expect(json.crossings).toHaveLength(1);
    expect(json.crossings[0]).toMatchObject({ from: '5T2g', fromSymbol: '5T2g', toSymbol: '1A1g' });
    expect(json.crossings[0].to).toMatch(/^1A1g/);
    // Tanabe & Sugano 1954, d⁶ at C/B ≈ 4.8: Δc/B ≈ 20 (read off the figure).
    expect(Math.abs(json.crossings[0].deltaOverB - 20)).toBeLessThan(1);
    expect(json.crossings[0].dq).toBeCloseTo((json.crossings[0].deltaOverB * json.B) / 10, 4);
    expect(json.bOrigin).toMatch(/free-ion B of Co3\+/);
    expect(json.sample).toBeNull();
    expect(json.oneElectron.lowSpin.lfseDq).toBe(-24);
    expect(json.oneElectron.impliedPairing).toBeCloseTo(json.crossings[0].tenDq, 6);
    expect(json.magnetism.map((m: { state: string }) => m.state)).toEqual(['5T2g', '1A1g']);
  });

  it('takes n from --ion alone and prints the crossover, the sample verdict, the one-electron picture and cautions', async () => {
    const { code, out } = await cli('--ion', 'Co3+', '--B', '700±20', '--dq', '1300±30');
    expect(code).toBe(0);
    expect(out).toMatch(/⁵T₂g \(S = 2\) → ¹A₁g \(S = 0\)/);
    expect(out).toMatch(/high-spin side/);
    expect(out).toMatch(/uncertainty of the margin/);
    expect(out).toMatch(/−24Dq \+ 2Π/);
    expect(out).toMatch(/Π = Δc/);
    expect(out).toMatch(/2\.5B \+ 4C/);
    expect(out).toMatch(/μ_so = 4\.90 μ_B/);
    expect(out).toMatch(/entropy/);
    expect(out).toMatch(/Mössbauer/);
    expect(out).not.toMatch(/free-ion value/);
  });

  it('puts the sample side and margin in the JSON', async () => {
    const { out } = await cli('d6', '--B', '700', '--cb', '4.8', '--dq', '2000±40', '--json');
    const json = JSON.parse(out);
    const dqC = json.crossings[0].dq;
    expect(json.sample.side).toBe('low-spin');
    expect(json.sample.margin.dq).toBeCloseTo(2000 - dqC, 4);
    expect(json.sample.margin.percent).toBeCloseTo((100 * (2000 - dqC)) / dqC, 4);
    expect(json.sample.sigma.dq).toBeCloseTo(40, 6);
    expect(json.cOverB).toBeCloseTo(4.8, 12);
  });

  it('states that d3 has no crossover and exits 0', async () => {
    const { code, out, err } = await cli('d3', '--B', '700', '--dq', '1700');
    expect([code, err]).toEqual([0, '']);
    expect(out).toMatch(/no spin crossover/);
    expect(out).toMatch(/one arrangement only/);
    const json = JSON.parse((await cli('--ion', 'Cu2+', '--json')).out);
    expect(json.crossings).toEqual([]);
    expect(json.statement).toMatch(/single spin state/);
  });

  it('says a tetrahedral crossover needs an unrealistically large Δt', async () => {
    const { code, out } = await cli('d6', '--geometry', 'tet', '--B', '750');
    expect(code).toBe(0);
    expect(out).toMatch(/Out of reach: tetrahedral d6 changes spin only at Δt = /);
  });

  it('writes the map to the file named by -o, and the map is a PNG', async () => {
    const { code, out } = await cli('d6', '--ion', 'Co3+', '--B', '650', '--dq', '2200', '-o', 'map.png');
    expect(code).toBe(0);
    expect(out).toMatch(/Ground-state map written to map\.png/);
    const bytes = readFileSync(join(dir, 'map.png'));
    expect([...bytes.subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
  });

  it.each([
    [['d11', '--B', '700'], /configuration "d11"/],
    [['p2', '--B', '700'], /expected d1 to d9/],
    [['d6'], /give --B/],
    [[], /give the configuration/],
    [['--ion', 'Xx9+'], /unknown ion "Xx9\+"/],
    [['d7', '--ion', 'Co3+'], /disagrees with --ion Co3\+/],
    [['d6', '--B', '-5'], /--B/],
    [['d6', '--B', '700', '--dq', 'abc'], /--dq/],
    [['d6', '--B', '700', '--geometry', 'cube'], /--geometry "cube"/],
    [['d6', '--B', '700', '--C', '3000', '--cb', '4'], /--C or --cb/],
    [['d6', '--B', '700', '-o', 'map.txt'], /\.png, \.svg or \.pdf/],
    [['d6', '--B', '700', '-o', 'missing/dir/map.svg'], /does not exist/],
  ])('refuses %j with one line on stderr, exit 2 and nothing on stdout', async (argv, message) => {
    const { code, out, err } = await cli(...argv);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message);
    expect(err.trim().split('\n')).toHaveLength(1);
  });

  it('leaves no partial file behind when the output cannot be written (the path is a directory)', async () => {
    mkdirSync(join(dir, 'taken.svg'));
    const { code, out, err } = await cli('d6', '--B', '700', '-o', 'taken.svg');
    expect([code, out]).toEqual([2, '']);
    expect(err).toMatch(/cannot write/);
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });
});

describe('termsplit crossover (end to end)', () => {
  beforeAll(() => {
    ensureBuilt();
  });

  it('prints one JSON object and exits 0', () => {
    const r = spawnSync(
      process.execPath,
      [main, 'crossover', '--ion', 'Fe2+', '--B', '800', '--dq', '1200', '--json'],
      {
        encoding: 'utf8',
      },
    );
    expect(r.status).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.n).toBe(6);
    expect(json.sample.side).toBe('high-spin');
    expect(json.crossings[0].fromSymbol).toBe('5T2g');
  });

  it('exits 2 with one line on stderr for bad input', async () => {
    const r = await runInProcess(['crossover', 'd6', '--B', 'lots']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^termsplit: --B/);
  });
});

describe('termsplit crossover refuses a sample without its own B', () => {
  it('exits 2 for --dq without --B: the free-ion B would misplace the sample', async () => {
    const { code, out, err } = await cli('--ion', 'Fe2+', '--dq', '1200');
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/--dq needs --B/);
  });

  it('states that d3 has no crossover without asking for B', async () => {
    const { code, out } = await cli('d3');
    expect(code).toBe(0);
    expect(out).toMatch(/no choice of spin/);
  });
});
