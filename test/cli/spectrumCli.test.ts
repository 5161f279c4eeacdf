import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../cli/io.js';
import { run } from '../../cli/program.js';
import { syntheticSpectrum } from '../../src/spectra/gaussianBands.js';

const root = resolve(__dirname, '../..');
const fixture = (name: string) => resolve(root, 'fixtures/spectra', name);
let dir = '';

function write(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

async function cli(...argv: string[]) {
  const io = memoryIo(dir);
  const code = await run(argv, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'termsplit-spectrum-'));
});

afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('termsplit spectrum in process', () => {
  it('finds the bands of the nm/absorbance demo CSV, predicts transitions and writes an SVG figure', async () => {
    const r = await cli(
      'spectrum',
      fixture('cr-mz6-absorbance-nm.csv'),
      '--ion',
      'Cr3+',
      '--dq',
      '1960',
      '--B',
      '700',
      '--conc',
      '0.02',
      '--path',
      '1',
      '-o',
      'cr.svg',
    );
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('x: "Wavelength (nm)" in nm (from the header "Wavelength (nm)")');
    expect(r.stdout).toContain('converted: ε = A / (c·l)');
    expect(r.stdout).toMatch(
      /Ligand-field bands for a fit of Dq and B[^\n]*\n {2}14\d{3}±\d+, 14\d{3}±\d+, 19[56]\d\d±\d+, 267\d\d±\d+ cm⁻¹/,
    );
    expect(r.stdout).toContain('⁴T₁g(F)');
    expect(r.stdout).toContain('rises at the blue end of the window');
    const svg = readFileSync(join(dir, 'cr.svg'), 'utf8');
    expect(svg.startsWith('<?xml') || svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('</svg>');
  });

  it('prints one JSON object with the bands, the fit input and the predicted levels', async () => {
    const r = await cli(
      'spectrum',
      fixture('ni-tvc3-epsilon-wavenumber.txt'),
      '--ion',
      'Ni2+',
      '--dq',
      '1150',
      '--B',
      '820',
      '--json',
    );
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.format).toBe('semicolon-delimited, decimal comma');
    expect(j.quantity).toBe('epsilon');
    expect(j.observations.map((o: { energy: number }) => Math.round(o.energy / 100))).toEqual([
      115, 135, 181, 287,
    ]);
    expect(j.bands.at(-1).flags).toContain('blue-edge');
    expect(j.bands.at(-1).ligandField).toBe(false);
    expect(j.predicted.levels[0].label).toBe('3A2g');
  });

  it('reads JCAMP-DX and writes PNG and PDF figures', async () => {
    for (const out of ['co.png', 'co.pdf']) {
      const r = await cli(
        'spectrum',
        fixture('co-ors4-absorbance-nm.jdx'),
        '--conc',
        '0.002',
        '--path',
        '1',
        '-o',
        out,
      );
      expect(r.code).toBe(0);
      expect(r.stdout).toContain('Read 901 points (JCAMP-DX).');
      expect(r.stdout).toContain('is the wing of a band whose maximum lies below');
    }
    expect(readFileSync(join(dir, 'co.png')).subarray(0, 8)).toEqual(
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    );
    expect(readFileSync(join(dir, 'co.pdf')).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('limits the window with --range and keeps charge-transfer-like bands with --include-ct', async () => {
    const r = await cli(
      'spectrum',
      fixture('ni-tvc3-epsilon-wavenumber.txt'),
      '--range',
      '600-2000nm',
      '--json',
    );
    const j = JSON.parse(r.stdout);
    expect(j.window.from).toBeCloseTo(5000, 6);
    expect(j.window.to).toBeCloseTo(1e7 / 600, 6);
    expect(j.observations.length).toBe(2);
    const x = Float64Array.from({ length: 2501 }, (_, i) => 10000 + i * 10);
    const y = syntheticSpectrum(
      [
        { center: 15000, height: 20, fwhm: 2500 },
        { center: 31000, height: 1500, fwhm: 3000 },
      ],
      x,
    );
    const path = write('ct.csv', `cm-1,epsilon\n${Array.from(x, (v, i) => `${v},${y[i]}`).join('\n')}\n`);
    const without = JSON.parse((await cli('spectrum', path, '--json')).stdout);
    const withCt = JSON.parse((await cli('spectrum', path, '--json', '--include-ct')).stdout);
    expect(without.observations.length).toBe(1);
    expect(withCt.observations.length).toBe(2);
  });
});

describe('termsplit spectrum fits by default what the issue lists (invented check spectra)', () => {
  it('--B without --dq holds B and fits Dq to [Cr(vor)6]3+', async () => {
    const r = await cli(
      'spectrum',
      fixture('cr-vor6-absorbance-nm.csv'),
      '--ion',
      'Cr3+',
      '--B',
      '640',
      '--json',
    );
    expect(r.code).toBe(0);
    const best = JSON.parse(r.stdout).fit.solutions[0];
    expect(best.bHeld).toBe(true);
    expect(best.B).toBe(640);
    expect(best.dq).toBeCloseTo(1600, -1);
  });

  it('merges the spin–orbit triplet of tetrahedral [Co(qel)4]2− by default, says so, and keeps it apart with --keep-bands', async () => {
    const file = fixture('co-qel4-epsilon-wavenumber.csv');
    const text = await cli('spectrum', file, '--ion', 'Co2+', '--geometry', 'tet');
    expect(text.stdout).toMatch(
      /bands 2, 3, 4 merged into fit band 2 at their ε-weighted centroid 150\d\d cm⁻¹/,
    );
    expect(text.stdout).toContain('--keep-bands fits them apart');
    expect(text.stdout).not.toContain('charge transfer?');
    const kept = JSON.parse(
      (await cli('spectrum', file, '--ion', 'Co2+', '--geometry', 'tet', '--keep-bands', '--json')).stdout,
    );
    expect(kept.fit.mergedBands ?? []).toEqual([]);
  });

  it('--spin-state low is honoured for high-spin [Mn(pld)6]2+: no low-spin assignment fits, and it says so', async () => {
    const r = await cli(
      'spectrum',
      fixture('mn-pld6-absorbance-nm.csv'),
      '--ion',
      'Mn2+',
      '--spin-state',
      'low',
      '--json',
    );
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.fit.failure ?? '').toMatch(/no assignment/);
    expect(j.cautions.join(' ')).not.toMatch(/Mössbauer/);
  });
});

describe('termsplit spectrum bad input', () => {
  const rows = (pairs: [number | string, number | string][]) =>
    `Wavelength (nm),Absorbance\n${pairs.map(([a, b]) => `${a},${b}`).join('\n')}\n`;
  const ramp = (n: number) => Array.from({ length: n }, (_, i) => [400 + i, 0.1] as [number, number]);

  const cases: [string, () => string[], RegExp][] = [
    ['an empty file', () => [write('empty.csv', '')], /empty\.csv: the file is empty$/],
    [
      'no numeric rows',
      () => [write('words.csv', 'a,b\nc,d\n')],
      /words\.csv: no rows of numbers found in 3 lines$/,
    ],
    [
      'non-monotonic x',
      () => [write('zigzag.csv', rows([...ramp(30), [420, 0.1]]))],
      /zigzag\.csv: line 32: x = 420 after 429 breaks the rising order of x/,
    ],
    [
      'a duplicated x',
      () => [write('twice.csv', rows([...ramp(30), [429, 0.2]]))],
      /twice\.csv: line 32: x = 429 repeats the x of line 31/,
    ],
    [
      'a NaN value',
      () => [write('nan.csv', rows([...ramp(10), [410, 'NaN'], ...ramp(30).slice(11)]))],
      /nan\.csv: line 12: y value "NaN" \(column 2\) is not a number$/,
    ],
    [
      'a range outside the data',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '--range', '1500-2000nm'],
      /cr-mz6-absorbance-nm\.csv: range 5000–6667 cm⁻¹ lies outside the data \(9091–30303 cm⁻¹\)$/,
    ],
    [
      'no bands',
      () => [
        write(
          'flat.csv',
          rows(
            Array.from({ length: 300 }, (_, i) => [400 + i, (0.1 + 0.001 * Math.sin(i * 7.3)).toFixed(5)]),
          ),
        ),
      ],
      /flat\.csv: no d–d bands found in \d+–\d+ cm⁻¹/,
    ],
    [
      'a file that does not give the x unit',
      () => [write('bare.txt', '400 0.1\n401 0.2\n402 0.3\n')],
      /bare\.txt: x column "column 1" does not say whether x is in nm, cm-1 or eV/,
    ],
    [
      'an --x-unit that disagrees with the header',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '--x-unit', 'cm-1'],
      /--x-unit cm-1 disagrees with the file's header "Wavelength \(nm\)" \(nm\)/,
    ],
    [
      'a missing file',
      () => [join(dir, 'nothing.csv')],
      /cannot read .*nothing\.csv: no such file or directory$/,
    ],
    [
      '--conc without --path',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '--conc', '0.1'],
      /give both --conc/,
    ],
    [
      '--spin-state with --dq and --B (predicted levels, no fit to apply it to)',
      () => [
        fixture('cr-mz6-absorbance-nm.csv'),
        '--ion',
        'Cr3+',
        '--dq',
        '1960',
        '--B',
        '700',
        '--spin-state',
        'high',
      ],
      /--spin-state: this applies to the fit/,
    ],
    [
      '--B without an ion to fit',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '--B', '700'],
      /--B: give --ion \(or --d\)/,
    ],
    [
      '--C without --B or --dq',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '--ion', 'Cr3+', '--C', '3000'],
      /--C is held in the fit only together with --B/,
    ],
    [
      'an unknown figure format',
      () => [fixture('cr-mz6-absorbance-nm.csv'), '-o', 'x.jpg'],
      /expected a \.png, \.svg or \.pdf/,
    ],
  ];

  it.each(cases)(
    'refuses %s: one line on stderr, exit 2, nothing on stdout, no figure',
    async (_, args, message) => {
      const before = readdirSync(dir).filter((f) => f.startsWith('bad-figure'));
      const argv = args();
      const r = await cli('spectrum', ...argv, ...(argv.includes('-o') ? [] : ['-o', 'bad-figure.svg']));
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.split('\n').filter((l) => l !== '').length).toBe(1);
      expect(r.stderr.trim()).toMatch(message);
      expect(readdirSync(dir).filter((f) => f.startsWith('bad-figure'))).toEqual(before);
    },
  );
});

describe('termsplit spectrum end to end', () => {
  it('runs from the built command line and exits 0', () => {
    const main = resolve(root, 'dist/cli/main.js');
    const ok = spawnSync(
      process.execPath,
      [main, 'spectrum', fixture('cr-mz6-absorbance-nm.csv'), '--json'],
      {
        encoding: 'utf8',
      },
    );
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).bands.length).toBe(5);
  });

  it('exits 2 with one line on an empty file', async () => {
    const bad = await cli('spectrum', write('empty2.csv', ''));
    expect(bad.code).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/^termsplit: .*empty2\.csv: the file is empty\n$/);
  });
});
