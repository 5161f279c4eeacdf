import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'parse5';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { slugs } from '../../cli/report/runReport.js';
import { runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Node {
  nodeName: string;
  childNodes?: Node[];
  attrs?: { name: string; value: string }[];
}

function count(node: Node, name: string): number {
  return (node.nodeName === name ? 1 : 0) + (node.childNodes ?? []).reduce((s, c) => s + count(c, name), 0);
}

function csvRows(text: string): string[][] {
  return text
    .trim()
    .split('\n')
    .map(
      (line) =>
        line.match(/("([^"]|"")*"|[^,]*)(,|$)/g)?.map((c) => c.replace(/,$/, '').replace(/^"|"$/g, '')) ?? [],
    );
}

describe('termsplit demo (the report of the invented demo sheet)', () => {
  let out: string;
  let json: {
    generator: string;
    invented: boolean;
    series: { name: string; tenDq: number; B: number | null }[];
    samples: {
      name: string;
      slug: string;
      figures: { diagram?: string; spectrum?: string };
      spin?: { side: string };
    }[];
    problems: unknown[];
    methods: string;
  };

  beforeAll(async () => {
    // The suite's one demo run (test/globalSetup.ts), by the built binary with its default workers.
    out = join(inject('demoCwd'), 'termsplit-demo');
    const r = inject('demoRun');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/INVENTED/);
    json = JSON.parse(readFileSync(join(out, 'report.json'), 'utf8'));
  });

  it('writes report.html, report.md, report.json, tables and figures', () => {
    for (const f of [
      'report.html',
      'report.md',
      'report.json',
      'tables/series.csv',
      'figures/series-10dq.svg',
    ]) {
      expect(existsSync(join(out, f))).toBe(true);
    }
    expect(json.generator).toBe('termsplit report');
    expect(json.invented).toBe(true);
    expect(json.samples).toHaveLength(7);
    expect(json.problems).toEqual([]);
  });

  it('writes an HTML page that parses, with a figure per SVG file and no external resources', () => {
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    const doc = parse(html) as unknown as Node;
    const svgFiles = readdirSync(join(out, 'figures')).filter((f) => f.endsWith('.svg'));
    expect(count(doc, 'figure')).toBe(svgFiles.length);
    expect(count(doc, 'svg')).toBeGreaterThanOrEqual(svgFiles.length);
    expect(count(doc, 'table')).toBeGreaterThan(7);
    expect(html).not.toMatch(/<script|<link |src="http/);
  });

  it('every figure file is an SVG document', () => {
    for (const f of readdirSync(join(out, 'figures'))) {
      const svg = readFileSync(join(out, 'figures', f), 'utf8');
      expect(svg).toMatch(/<svg[\s>]/);
      expect(svg.trimEnd()).toMatch(/<\/svg>$/);
      expect(svg.length).toBeGreaterThan(5000);
    }
  });

  it('the series CSV holds the JSON series, row by row', () => {
    const rows = csvRows(readFileSync(join(out, 'tables/series.csv'), 'utf8'));
    expect(rows[0]?.[0]).toBe('sample');
    expect(rows.slice(1).map((r) => r[0])).toEqual(json.series.map((s) => s.name));
    rows.slice(1).forEach((r, i) => {
      const tenDq = Number((r[4] ?? '').split(' ± ')[0]);
      expect(Math.abs(tenDq - (json.series[i]?.tenDq ?? 0))).toBeLessThanOrEqual(0.5);
    });
  });

  it('the series table agrees with a single-sample fit of the same bands', async () => {
    const single = await runInProcess(
      ['fit', '--ion', 'Ni2+', '--bands', '10200±150,16500±200,27300±250', '--json'],
      dir,
    );
    const best = JSON.parse(single.stdout).solutions[0];
    const entry = json.series.find((s) => s.name === '[Ni(mz)6]2+');
    expect(entry?.tenDq).toBeCloseTo(best.tenDq, 6);
    expect(entry?.B).toBeCloseTo(best.B, 6);
  });

  it('gives the spin-state verdict of the iron(II) sample, and the methods paragraph names the model and its sources', () => {
    expect(json.samples.find((s) => s.name === '[Fe(tvc)3]2+')?.spin?.side).toBe('low-spin');
    expect(json.methods).toMatch(/Slater–Condon/);
    expect(json.methods).toMatch(/Levenberg/);
  });
});

describe('termsplit report with bad sheets', () => {
  function sheet(name: string, samples: unknown[]): string {
    const path = join(dir, `${name}.json`);
    writeFileSync(path, JSON.stringify({ title: name, samples }));
    return path;
  }

  it('reports the good samples and names the sample and field of each bad one on stderr and in the report', async () => {
    const path = sheet('mixed', [
      { name: 'good', ion: 'Ni2+', bands: '8500,13800,25300' },
      { name: 'no-ion', bands: '8500' },
      { name: 'wrong-type', ion: 'Ni2+', bands: '8500', fitC: 'yes' },
      { name: 'unknown-ion', ion: 'Qq2+', bands: '8500' },
      { name: 'no-file', ion: 'Cr3+', spectrum: 'missing.csv' },
    ]);
    const r = await runInProcess(['report', path, '-o', join(dir, 'mixed-report')], dir);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/sample "no-ion": field "ion"/);
    expect(r.stderr).toMatch(/sample "wrong-type": field "fitC"/);
    expect(r.stderr).toMatch(/sample "unknown-ion": field "ion": unknown ion "Qq2\+"/);
    expect(r.stderr).toMatch(/sample "no-file": field "spectrum.file": no such file: missing.csv/);
    const json = JSON.parse(readFileSync(join(dir, 'mixed-report/report.json'), 'utf8'));
    expect(json.samples.map((s: { name: string }) => s.name)).toEqual(['good']);
    expect(json.problems).toHaveLength(4);
    expect(readFileSync(join(dir, 'mixed-report/report.md'), 'utf8')).toMatch(/Samples not reported/);
  });

  it('exits 2 and writes nothing when every sample fails', async () => {
    const path = sheet('all-bad', [{ name: 'x', ion: 'Qq2+', bands: '8500' }]);
    const r = await runInProcess(['report', path, '-o', join(dir, 'all-bad-report')], dir);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(existsSync(join(dir, 'all-bad-report'))).toBe(false);
  });

  it('exits 2 for an unreadable sheet and for a folder that is not a report', async () => {
    const bad = join(dir, 'broken.json');
    writeFileSync(bad, '{ not json');
    expect((await runInProcess(['report', bad], dir)).code).toBe(2);
    const other = join(dir, 'someone-else');
    mkdirSync(other);
    writeFileSync(join(other, 'notes.txt'), 'keep me');
    const path = sheet('one', [{ name: 'a', ion: 'Ni2+', bands: '8500,13800,25300' }]);
    const r = await runInProcess(['report', path, '-o', other], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/not a termsplit report/);
    expect(readFileSync(join(other, 'notes.txt'), 'utf8')).toBe('keep me');
  });

  it('a second run replaces its own earlier report', async () => {
    const path = sheet('twice', [{ name: 'a', ion: 'Ni2+', bands: '8500,13800,25300' }]);
    const target = join(dir, 'twice-report');
    expect((await runInProcess(['report', path, '-o', target], dir)).code).toBe(0);
    expect((await runInProcess(['report', path, '-o', target], dir)).code).toBe(0);
    expect(readdirSync(dir).filter((f) => f.includes('.partial'))).toEqual([]);
  });

  it('reads the CSV form of a sheet', async () => {
    const path = join(dir, 'series.csv');
    writeFileSync(path, 'name,ion,geometry,bands\nA,Ni2+,oct,8500;13800;25300\nB,Cr3+,oct,17400;24600\n');
    const r = await runInProcess(['report', path, '-o', join(dir, 'csv-report'), '--json'], dir);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).series.map((s: { name: string }) => s.name)).toEqual(['A', 'B']);
  });
});

describe('report helpers', () => {
  it('slugs makes distinct file-name stems', () => {
    expect(slugs(['[Ni(mz)6]2+', '[Ni(mz)6]2-', '---'])).toEqual(['ni-mz-6-2', 'ni-mz-6-2-2', 'sample']);
  });
});
