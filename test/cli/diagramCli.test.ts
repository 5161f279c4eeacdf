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
let dir: string;

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), 'termsplit-diagram-'));
});

afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

/** A fresh empty directory for one test. */
function freshDir(name: string): string {
  const d = join(dir, name);
  mkdirSync(d);
  return d;
}

describe('termsplit diagram (in process)', () => {
  it('writes the figure and the CSV data where asked and says where', async () => {
    const cwd = freshDir('files');
    const io = memoryIo(cwd);
    const code = await run(
      ['diagram', 'd6', '--cb', '4.8', '--points', '80', '-o', 'd6.svg', '--data', 'd6.csv'],
      io,
    );
    expect(code).toBe(0);
    expect(io.stderr).toBe('');
    expect(io.stdout).toContain(`Figure written to ${join(cwd, 'd6.svg')}`);
    expect(io.stdout).toContain(`Curve data written to ${join(cwd, 'd6.csv')}`);
    expect(io.stdout).toMatch(/Ground state changes at Δ\/B = 20\.0\d\d: ⁵T₂g \(S = 2\) below/);
    expect(io.stdout).toMatch(/measurement decides/);
    expect(readFileSync(join(cwd, 'd6.svg'), 'utf8')).toMatch(/<\/svg>\s*$/);
    const csv = readFileSync(join(cwd, 'd6.csv'), 'utf8').split('\n');
    expect(csv[0]?.startsWith('Delta/B,5T2g,')).toBe(true);
    expect(csv.filter((l) => l !== '')).toHaveLength(1 + 80 + 1);
  });

  it('writes d<n>-<geometry>.png in the working directory when no -o is given', async () => {
    const cwd = freshDir('default');
    const io = memoryIo(cwd);
    expect(await run(['diagram', 'd3', '--geometry', 'tet', '--points', '40'], io)).toBe(0);
    expect(readdirSync(cwd)).toEqual(['d3-tet.png']);
    expect(io.stdout).toContain(`Figure written to ${join(cwd, 'd3-tet.png')}`);
    expect([...readFileSync(join(cwd, 'd3-tet.png')).subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
  });

  it('prints the curve data as one JSON object with --json, writing no figure unless -o is given', async () => {
    const cwd = freshDir('json');
    const io = memoryIo(cwd);
    expect(await run(['diagram', '--ion', 'Fe2+', '--points', '50', '--json'], io)).toBe(0);
    expect(readdirSync(cwd)).toEqual([]);
    const out = JSON.parse(io.stdout);
    expect(out).toMatchObject({ ion: 'Fe2+', n: 6, geometry: 'oct', figure: null, data: null, points: 50 });
    expect(out.cOrigin).toBe('free-ion ratio of Fe2+');
    expect(out.cOverB).toBeCloseTo(3901 / 1058, 6);
    expect(out.curves).toHaveLength(43);
    expect(out.crossings).toHaveLength(1);
  });

  it('marks the sample: its Δ/B and its bands over B, in the JSON and the summary', async () => {
    const cwd = freshDir('sample');
    const args = ['diagram', 'd6', '--points', '50', '--dq', '1900', '--B', '1050', '--bands', '16500,23000'];
    const io = memoryIo(cwd);
    expect(await run([...args, '-o', 'fe.pdf', '--json'], io)).toBe(0);
    const out = JSON.parse(io.stdout);
    expect(out.sample.deltaOverB).toBeCloseTo(19000 / 1050, 6);
    expect(out.sample.bandsOverB[0]).toBeCloseTo(16500 / 1050, 6);
    expect(out.figure).toBe(join(cwd, 'fe.pdf'));
    expect(readFileSync(join(cwd, 'fe.pdf')).subarray(0, 5).toString()).toBe('%PDF-');
    const text = memoryIo(cwd);
    expect(await run([...args, '-o', 'fe.png'], text)).toBe(0);
    expect(text.stdout).toMatch(/Sample: Dq = 1900 cm⁻¹, B = 1050 cm⁻¹ → Δ\/B = 18\.10/);
    expect(text.stdout).toMatch(/bands at E\/B 15\.71, 21\.90/);
    expect(text.stdout).toMatch(/its bands fall on them only as far as its own C\/B is close/);
  });

  it('writes the JSON data file', async () => {
    const cwd = freshDir('jsondata');
    expect(
      await run(['diagram', 'd2', '--points', '30', '-o', 'd2.png', '--data', 'd2.json'], memoryIo(cwd)),
    ).toBe(0);
    const data = JSON.parse(readFileSync(join(cwd, 'd2.json'), 'utf8'));
    expect(data).toMatchObject({ n: 2, geometry: 'oct', points: 30 });
    expect(data.curves[0].values).toHaveLength(30);
  });

  it('shows a progress line on stderr only when stderr is a terminal', async () => {
    const cwd = freshDir('progress');
    const io = memoryIo(cwd);
    (io as { errIsTTY: boolean }).errIsTTY = true;
    expect(await run(['diagram', 'd2', '--points', '20', '--json'], io)).toBe(0);
    expect(io.stderr).toMatch(/d2 oct: sweeping Δ\/B 100%/);
    JSON.parse(io.stdout);
  });

  it.each([
    [['d6', '--max', '-3'], /--max "-3": expected a positive number/],
    [['d6', '--points', '0'], /--points "0": expected a whole number from 2 to 5000/],
    [['d6', '--points', '2.5'], /--points "2.5": expected a whole number/],
    [['d6', '--points', '200000'], /--points "200000": expected a whole number from 2 to 5000/],
    [['d6', '-o', 'd6.gif'], /output file "d6.gif": expected a .png, .svg or .pdf extension/],
    [['d6', '-o', 'missing/d6.png'], /cannot write .*missing\/d6.png: directory .* does not exist/],
    [['d6', '--data', 'd6.txt'], /--data "d6.txt": expected a .csv or .json extension/],
    [['d6', '-o', 'ok.png', '--data', 'missing/d6.csv'], /cannot write .*missing\/d6.csv/],
    [['d6', '--bands', '16500,23000'], /--bands needs the sample's --dq and --B/],
    [['d6', '--dq', '1900'], /--dq and --B go together/],
    [['d6', '--dq', '5000', '--B', '1000'], /Δ\/B = 10Dq\/B = 50.00 lies beyond --max 40/],
    [['d6', '--dq', '1900', '--B', '1050', '--bands', '16500,abc'], /energy "abc"/],
    [['d10'], /expected d1 to d9/],
    [['p2'], /expected a d configuration/],
    [['d5', '--ion', 'Fe2+'], /d5 disagrees with --ion Fe2\+, which is d6/],
    [[], /give the configuration \(e.g. d6\) or the ion/],
    [['d6', '--cb', '-1'], /--cb "-1": expected a positive number/],
    [['d6', '--geometry', 'square'], /--geometry "square": expected oct or tet/],
    [['d6', '--emax', '0'], /--emax "0": expected a positive number/],
  ])('diagram %j: one line on stderr, exit 2, nothing on stdout, no file', async (args, message) => {
    const cwd = freshDir(`bad-${Math.random().toString(36).slice(2)}`);
    const io = memoryIo(cwd);
    // Short sweeps keep the suite fast where the point count is not what is tested.
    const points = args.includes('--points') ? [] : ['--points', '40'];
    expect(await run(['diagram', ...args, ...points], io)).toBe(2);
    expect(io.stdout).toBe('');
    expect(io.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(io.stderr).toMatch(/^termsplit: /);
    expect(io.stderr).toMatch(message);
    expect(readdirSync(cwd)).toEqual([]);
  });
});

describe('termsplit levels -o (in process)', () => {
  it('draws the level diagram and keeps the table on stdout', async () => {
    const cwd = freshDir('levels');
    const io = memoryIo(cwd);
    expect(await run(['levels', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '-o', 'cr.svg'], io)).toBe(0);
    expect(io.stdout).toMatch(/Predicted spin-allowed bands/);
    expect(io.stdout).toContain(`Level diagram written to ${join(cwd, 'cr.svg')}`);
    expect(readFileSync(join(cwd, 'cr.svg'), 'utf8')).toMatch(/^(<\?xml[^>]*>\s*)?<svg/);
    const json = memoryIo(cwd);
    expect(
      await run(['levels', '--d', '3', '--dq', '1740', '--B', '725', '-o', 'cr.png', '--json'], json),
    ).toBe(0);
    expect(JSON.parse(json.stdout).figure).toBe(join(cwd, 'cr.png'));
  });

  it('refuses an unknown extension before writing anything', async () => {
    const cwd = freshDir('levels-bad');
    const io = memoryIo(cwd);
    expect(await run(['levels', '--d', '3', '--dq', '1740', '--B', '725', '-o', 'cr.bmp'], io)).toBe(2);
    expect(io.stdout).toBe('');
    expect(io.stderr).toMatch(/^termsplit: output file "cr.bmp": expected a .png, .svg or .pdf extension\n$/);
    expect(readdirSync(cwd)).toEqual([]);
  });
});

describe('termsplit diagram (end to end)', () => {
  it('writes a PDF through the installed command', () => {
    const cwd = freshDir('e2e');
    const r = spawnSync(
      process.execPath,
      [main, 'diagram', 'd6', '--cb', '4.8', '--points', '60', '-o', 'd6.pdf'],
      {
        cwd,
        encoding: 'utf8',
      },
    );
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toContain(join(cwd, 'd6.pdf'));
    expect(readFileSync(join(cwd, 'd6.pdf')).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('exits 2 with one line on bad input', async () => {
    const cwd = freshDir('e2e-bad');
    const r = await runInProcess(['diagram', 'd6', '--max', '-3'], cwd);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe('termsplit: --max "-3": expected a positive number up to 200\n');
    expect(readdirSync(cwd)).toEqual([]);
  });
});
