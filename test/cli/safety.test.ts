/*
 * Regression tests for bad and hostile input found by fuzzing the command line: crashes, hangs,
 * unescaped output, silent misreads and messages that named derived values. Everything runs in
 * process; each case must end in one line on stderr and exit 2, or in a correct result.
 */
import { spawnSync } from 'node:child_process';
import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'parse5';
import { afterAll, describe, expect, it } from 'vitest';
import { readTextFile } from '../../cli/files.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';
import { parseSampleSheet } from '../../src/sheets/sampleSheet.js';
import { readSpectrum } from '../../src/spectra/spectrumAnalysis.js';
import { ROOT, runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-safety-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const CR = join(ROOT, 'fixtures/spectra/cr-mz6-absorbance-nm.csv');
const CO_JCAMP = join(ROOT, 'fixtures/spectra/co-ors4-absorbance-nm.jdx');

/** Whether text holds a control character other than line feed and tab (C0, DEL or C1). */
function hasControl(text: string): boolean {
  return [...text].some((c) => {
    const k = c.charCodeAt(0);
    return (k < 0x20 && k !== 0x0a && k !== 0x09) || (k >= 0x7f && k <= 0x9f);
  });
}

/** Runs in the scratch folder and checks the bad-input contract: exit 2, one line, empty stdout. */
async function refused(argv: string[], message: RegExp): Promise<void> {
  const r = await runInProcess(argv, dir);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).toMatch(/^termsplit: [^\n]*\n$/);
  expect(r.stderr).toMatch(message);
}

describe('crashes found by fuzzing now refuse the value (exit 2)', () => {
  it('terms d3 --B 1e308 --C 3850 refuses --B', async () => {
    await refused(
      ['terms', 'd3', '--B', '1e308', '--C', '3850'],
      /--B "1e308": expected a number of cm⁻¹ from 0 to 5000/,
    );
  });

  it('levels --B 1e-320 refuses the denormal B and writes no figure', async () => {
    await refused(
      ['levels', '--d', '3', '--dq', '1740', '--B', '1e-320', '-o', 'x.svg'],
      /--B "1e-320".*too close to zero/,
    );
    expect(existsSync(join(dir, 'x.svg'))).toBe(false);
  });

  it('spectrum --min-width 1e-320 refuses the width', async () => {
    await refused(['spectrum', CR, '--ion', 'Cr3+', '--min-width', '1e-320'], /--min-width "1e-320"/);
  });
});

describe('hangs found by fuzzing now refuse at once', () => {
  it.each([
    [['diagram', 'd3', '--max', '1e-320'], /--max "1e-320"/],
    [['diagram', 'd3', '--emax', '1e-310', '-o', 'e.svg'], /--emax "1e-310"/],
    [['diagram', 'd3', '--points', '100000'], /--points "100000": expected a whole number from 2 to 5000/],
    [
      ['crossover', 'd6', '--B', '700', '--cb', '1000', '-o', 'c.png'],
      /--cb "1000": expected a positive number from 1 to 20/,
    ],
    [['report', 'sheet.json', '--jobs', '1000'], /--jobs "1000": expected a whole number from 1 to 64/],
  ])('%j refuses the value without working on it', async (argv, message) => {
    const started = Date.now();
    await refused(argv, message);
    expect(Date.now() - started).toBeLessThan(2000);
    expect(existsSync(join(dir, 'e.svg')) || existsSync(join(dir, 'c.png'))).toBe(false);
  });

  it('spectrum refuses devices, named pipes, folders and files over the size cap without reading them', async () => {
    await refused(['spectrum', '/dev/zero'], /\/dev\/zero: not a regular file/);
    const fifo = join(dir, 'pipe');
    if (spawnSync('mkfifo', [fifo]).status === 0)
      await refused(['spectrum', fifo], /pipe: not a regular file/);
    await refused(['spectrum', '.'], /it is a folder, not a file/);
    const huge = join(dir, 'huge.csv');
    writeFileSync(huge, '');
    truncateSync(huge, 300 * 1024 * 1024); // sparse: no disk used
    await refused(['spectrum', huge], /huge\.csv: \d+ bytes, expected at most \d+ bytes/);
    rmSync(huge);
  });
});

describe('report output is escaped', () => {
  const hostile = {
    title: '<script>alert(1)</script>\n# not a heading',
    about: 'see [here](javascript:alert(1)) <img src=x onerror=alert(2)>',
    samples: [
      { name: '=HYPERLINK("http://x","y")', ion: 'Ni2+', bands: '8500,13800,25300' },
      { name: '<b>bold</b>\u0000\u001b[31mred', ion: 'Cr3+', bands: '17400,24600' },
    ],
  };

  it('report writes titles and sample names as text in Markdown, HTML and CSV', async () => {
    const sheet = join(dir, 'hostile.json');
    writeFileSync(sheet, JSON.stringify(hostile));
    const out = join(dir, 'hostile-report');
    const r = await runInProcess(['report', sheet, '-o', out], dir);
    expect(r.code, r.stderr).toBe(0);
    const md = readFileSync(join(out, 'report.md'), 'utf8');
    // Only unescaped marks count: `\\<` shows as `<` and is not markup.
    expect(md).not.toMatch(/(?<!\\)<(script|img|b>)|(?<!\\)\]\(javascript/);
    expect(hasControl(md)).toBe(false);
    expect(md.split('\n')[0]).toBe('# \\<script\\>alert(1)\\</script\\> # not a heading');
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(hasControl(html)).toBe(false);
    const names: string[] = [];
    const walk = (n: { nodeName: string; childNodes?: unknown[] }) => {
      names.push(n.nodeName);
      for (const c of n.childNodes ?? []) walk(c as typeof n);
    };
    walk(parse(html) as unknown as { nodeName: string; childNodes?: unknown[] });
    expect(names).not.toContain('script');
    expect(names).not.toContain('img');
    expect(names).not.toContain('b');
    const csv = readFileSync(join(out, 'tables/series.csv'), 'utf8');
    expect(csv).toMatch(/^"'=HYPERLINK\(""http:\/\/x"",""y""\)"/m);
    expect(csv).not.toMatch(/^=/m);
  });

  it('stderr shows control characters of names as text: no escape codes reach the terminal', async () => {
    const r = await runInProcess(
      ['levels', '--ion', '\u001b]0;owned\u0007Cr3+\nsecond line', '--dq', '1740', '--B', '700'],
      dir,
    );
    expect(r.code).toBe(2);
    expect(hasControl(r.stderr)).toBe(false);
    expect(r.stderr).toMatch(/^termsplit: [^\n]*\\u001b\]0;owned\\u0007Cr3\+\\u000asecond line[^\n]*\n$/);
  });

  it('a sheet may not name spectrum files outside its folder and the working folder unless --allow-outside-files', async () => {
    const sheets = join(dir, 'sheets');
    const elsewhere = mkdtempSync(join(tmpdir(), 'termsplit-elsewhere-'));
    mkdirSync(sheets);
    try {
      const outside = join(elsewhere, 'cr.csv');
      writeFileSync(outside, readFileSync(CR));
      const samples = [
        { name: 'ok', ion: 'Ni2+', bands: '8500,13800,25300' },
        { name: 'passwd', ion: 'Cr3+', spectrum: '/etc/passwd' },
        { name: 'far', ion: 'Cr3+', spectrum: outside },
      ];
      const sheet = join(sheets, 's.json');
      writeFileSync(sheet, JSON.stringify({ samples }));
      const r = await runInProcess(['report', sheet, '-o', join(dir, 'outside-report'), '--json'], sheets);
      expect(r.code).toBe(0);
      expect(r.stderr).toMatch(
        /sample "passwd": field "spectrum.file": \/etc\/passwd lies outside the sheet's folder/,
      );
      expect(r.stderr).toMatch(/sample "far": field "spectrum.file": .*lies outside/);
      expect(JSON.stringify(JSON.parse(r.stdout))).not.toMatch(/root:/);
      const allowed = await runInProcess(
        ['report', sheet, '-o', join(dir, 'outside-report'), '--allow-outside-files', '--json'],
        sheets,
      );
      expect(JSON.parse(allowed.stdout).samples.map((s: { name: string }) => s.name)).toEqual(['ok', 'far']);
    } finally {
      rmSync(elsewhere, { recursive: true, force: true });
    }
  });
});

describe('silent misreads are now refused or named', () => {
  const jcamp = readFileSync(CO_JCAMP, 'utf8');
  it.each([
    ['##NPOINTS=901', '##NPOINTS=500', /##NPOINTS=500, but the data hold 901 points/],
    [
      '##XFACTOR=1',
      '##XFACTOR=2',
      /##XFACTOR=2: the first x of the data, 400 × 2 = 800, is not ##FIRSTX=400/,
    ],
    [
      '##YFACTOR=0.00001',
      '##YFACTOR=1',
      /##FIRSTY=0.10317, but the first y of the data is 10317 after ##YFACTOR=1/,
    ],
  ])('spectrum refuses a JCAMP-DX file whose %s is changed to %s', async (from, to, message) => {
    const path = join(dir, 'changed.jdx');
    writeFileSync(path, jcamp.replace(from, to));
    await refused(['spectrum', path], message);
  });

  it('readTextFile and readSpectrum read trailing-comma rows, padded headers and UTF-16 with a byte-order mark as the plain file', () => {
    const plain = readFileSync(CR, 'utf8');
    const lines = plain.trimEnd().split('\n');
    const header = lines.findIndex((l) => !l.startsWith('#'));
    const edit = (f: (line: string, i: number) => string) =>
      `${lines.map((l, i) => (l.startsWith('#') ? l : f(l, i))).join('\n')}\n`;
    const variants: Record<string, string | Buffer> = {
      'trailing.csv': edit((l) => `${l},`),
      'padded.csv': edit((l, i) =>
        i === header
          ? l
              .split(',')
              .map((h) => `  ${h}\t`)
              .join(',')
          : l,
      ),
      'utf16.csv': Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(plain, 'utf16le')]),
    };
    const read = (path: string) => {
      const raw = readSpectrum(readTextFile(path), { fileName: path });
      return { x: [...raw.x], y: [...raw.y], xLabel: raw.xLabel, yLabel: raw.yLabel };
    };
    const reference = read(CR);
    expect(reference.x.length).toBeGreaterThan(100);
    for (const [name, data] of Object.entries(variants)) {
      writeFileSync(join(dir, name), data);
      expect(read(join(dir, name)), name).toEqual(reference);
    }
  });

  it('spectrum names UTF-16 without a byte-order mark instead of misreading it', async () => {
    writeFileSync(join(dir, 'utf16-nobom.csv'), Buffer.from(readFileSync(CR, 'utf8'), 'utf16le'));
    await refused(['spectrum', 'utf16-nobom.csv'], /NUL bytes .*UTF-16 text without a byte-order mark/);
  });

  it('spectrum cautions that an all-negative absorbance spectrum is not to be trusted', async () => {
    const lines = readFileSync(CR, 'utf8').trimEnd().split('\n');
    const negative = lines.map((l) =>
      /^[\d.]+,[\d.eE+-]+$/.test(l) ? l.replace(/,(.+)$/, (_, y) => `,${-Math.abs(Number(y)) - 0.01}`) : l,
    );
    writeFileSync(join(dir, 'negative.csv'), `${negative.join('\n')}\n`);
    const r = await runInProcess(['spectrum', 'negative.csv', '--json'], dir);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).cautions[0]).toMatch(/every absorbance value is zero or negative/);
  });

  it.each([
    [['spectrum', CR, '--ion', 'Cr3+', '--spin-state', 'x'], /--spin-state "x": expected high or low/],
    [['spectrum', CR, '--ion', 'Cr3+', '--cb', '1e308'], /--cb "1e308"/],
    [
      ['levels', '--d', '3', '--dq', '0x10', '--B', '700'],
      /--dq "0x10": expected a number of cm⁻¹ \(plain decimal digits\)/,
    ],
    [['levels', '--d', '3', '--dq', '', '--B', '700'], /--dq "": expected/],
    [
      ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--assign', '3T2g'],
      /1 label for 3 bands: expected one per band/,
    ],
    [
      ['fit', '--ion', 'Ni2+', '--bands', '1e-320,13800,25300'],
      /energy "1e-320": expected 100 to 200000 cm⁻¹/,
    ],
    [
      ['fit', '--ion', 'Ni2+', '--bands', '0.0001nm,13800,25300'],
      /energy "0.0001nm": expected 100 to 200000/,
    ],
    [['fit', '--ion', 'Ni2+', '--bands', '8500±1e308,13800±1,25300±1'], /uncertainty in "8500±1e308"/],
    [['crossover', 'd6', '--B', '700±1e-320'], /--B "700±1e-320": expected an uncertainty from 0.001/],
  ])('%j is refused, not downgraded or guessed', async (argv, message) => {
    await refused(argv, message);
  });

  it('units on --B are refused the same way by every command', async () => {
    for (const argv of [
      ['crossover', 'd6', '--B', '700nm'],
      ['levels', '--d', '6', '--dq', '1000', '--B', '700nm'],
      ['diagram', 'd6', '--dq', '1000', '--B', '700nm'],
      ['fit', '--d', '6', '--bands', '16000,23000', '--B', '700nm'],
    ]) {
      await refused(argv, /--B "700nm": expected a (positive )?number of cm⁻¹ \(plain decimal digits\)/);
    }
  });

  it('--C 0 and --cb 1000 get the same answer from every command', async () => {
    const zeroC = /--C "0" with B = 700 cm⁻¹ gives C\/B = 0: expected C\/B from 1 to 20/;
    for (const argv of [
      ['levels', '--d', '6', '--dq', '1000', '--B', '700', '--C', '0'],
      ['crossover', 'd6', '--B', '700', '--C', '0'],
      ['diagram', 'd6', '--dq', '1000', '--B', '700', '--C', '0'],
      ['spectrum', CR, '--d', '3', '--dq', '1000', '--B', '700', '--C', '0'],
    ]) {
      await refused(argv, zeroC);
    }
    const bigCb = /--cb "1000": expected a positive number from 1 to 20/;
    for (const argv of [
      ['levels', '--d', '6', '--dq', '1000', '--B', '700', '--cb', '1000'],
      ['crossover', 'd6', '--B', '700', '--cb', '1000'],
      ['diagram', 'd6', '--cb', '1000'],
      ['fit', '--d', '6', '--bands', '16000,23000', '--cb', '1000'],
      ['spectrum', CR, '--ion', 'Cr3+', '--cb', '1000'],
    ]) {
      await refused(argv, bigCb);
    }
  });
});

describe('sample sheets take the same ranges as the options', () => {
  it('parseSampleSheet refuses a C/B of 1000 or 1e-320 and a denormal concentration, sample by sample', () => {
    const sheet = parseSampleSheet(
      JSON.stringify({
        samples: [
          { name: 'ok', ion: 'Ni2+', bands: '8500,13800,25300', cb: 4.5 },
          { name: 'big', ion: 'Ni2+', bands: '8500,13800,25300', cb: 1000 },
          { name: 'tiny', ion: 'Ni2+', bands: '8500,13800,25300', cb: 1e-320 },
          { name: 'conc', ion: 'Cr3+', spectrum: { file: 'cr.csv', conc: 1e-320, path: 1 } },
        ],
      }),
      'json',
    );
    expect(sheet.samples.map((s) => s.name)).toEqual(['ok']);
    expect(sheet.problems.map((p) => `${p.sample} ${p.field}: ${p.message}`)).toEqual([
      'big cb: expected a positive number from 1 to 20 (C/B), got 1000',
      'tiny cb: expected a positive number from 1 to 20 (C/B), got 1e-320',
      'conc spectrum.conc: expected a number of mol/L from 1e-12 to 100, got 1e-320',
    ]);
  });
});

describe('messages name the option given, not a derived value', () => {
  it('levels --C 1e308 names --C, not "Racah C = Infinity"', async () => {
    await refused(
      ['levels', '--d', '3', '--dq', '1740', '--B', '700', '--C', '1e308'],
      /^termsplit: --C "1e308"/,
    );
  });

  it('crossover with a sample far beyond any crossover names --dq and the Δ/B it gives', async () => {
    await refused(
      ['crossover', 'd6', '--B', '10', '--cb', '20', '--dq', '10000', '-o', 'm.png'],
      /^termsplit: --dq "10000" with B = 10 cm⁻¹ gives Δ\/B = 10Dq\/B = 10000: expected Δ\/B up to 200/,
    );
  });

  it('random option values (seeded) give exit 0 or one line naming a given option, never an internal error', async () => {
    const random = uniformRandom(4242);
    const pick = <T>(xs: readonly T[]): T => xs[Math.floor(random() * xs.length)] as T;
    const value = () =>
      pick([
        () => `${(random() * 12000).toFixed(1)}`,
        () => `${(random() * 10).toFixed(2)}e${Math.round(random() * 640 - 320)}`,
        () => `-${(random() * 100).toFixed(0)}`,
        () => pick(['0', '1e-320', '1e308', 'Infinity', '0x10', '', ' ', '5e-301']),
      ])();
    const seen = new Set<number>();
    for (let i = 0; i < 80; i++) {
      const d = String(1 + Math.floor(random() * 9));
      const argv =
        i % 4 === 3
          ? [
              'crossover',
              `d${pick([4, 5, 6, 7])}`,
              '--B',
              value(),
              pick(['--cb', '--C']),
              value(),
              '--dq',
              value(),
            ]
          : i % 4 === 2
            ? ['terms', `d${d}`, '--B', value(), '--C', value()]
            : [
                'levels',
                ...(i % 2 ? ['--d', d] : ['--ion', 'Co3+']),
                '--dq',
                value(),
                '--B',
                value(),
                pick(['--cb', '--C']),
                value(),
              ];
      const r = await runInProcess(argv, dir);
      seen.add(r.code);
      expect(r.code, `${JSON.stringify(argv)}: ${r.stderr}`).not.toBe(1);
      if (r.code === 2) {
        expect(r.stderr).toMatch(/^termsplit: [^\n]*\n$/);
        expect(r.stderr).toMatch(/^termsplit: (--(dq|B|C|cb|d|ion) |configuration |d\d|give )/);
        expect(r.stderr).not.toMatch(/Racah [BC] = |Dq = \d|= Infinity|NaN/);
      }
    }
    expect([...seen].sort()).toEqual([0, 2]);
  });
});
