import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { serveHtml } from '../../cli/commands/explore.js';
import type { ExplorerData } from '../../explorer/data.js';
import { ROOT, runBinary, runInProcess } from '../cliRunner.js';
import { expectClose } from '../helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-explore-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The data JSON written into a page. */
function pageData(file: string): ExplorerData {
  const html = readFileSync(join(dir, file), 'utf8');
  const m = /<script type="application\/json" id="explorer-data">(.*?)<\/script>/s.exec(html);
  expect(m).not.toBeNull();
  return JSON.parse(m?.[1] ?? '{}') as ExplorerData;
}

describe('termsplit explore (in process)', () => {
  it('writes one self-contained page: no external script, style or font, the data and the bundle inlined', async () => {
    const r = await runInProcess(
      ['explore', '--d', '6', '--dq', '2000', '--B', '700', '--cb', '4.8', '-o', 'd6.html'],
      dir,
    );
    expect(r.code, r.stderr).toBe(0);
    const html = readFileSync(join(dir, 'd6.html'), 'utf8');
    expect(html).not.toMatch(/<script[^>]+src=|<link[^>]+href=|@import|url\(http/);
    expect(html).toContain('<label for="dq">');
    const [s] = pageData('d6.html').samples;
    expect(s).toMatchObject({ n: 6, geometry: 'oct', dq: 2000, B: 700, cOverB: 4.8, zeta: 0, bands: [] });
  });

  it('starts from the best fit of --bands, as termsplit fit gives it, when Dq and B are not given', async () => {
    // Band maxima of [Ni(H2O)6]2+ (Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984).
    const bands = '8500,13800,25300';
    const r = await runInProcess(
      ['explore', '--ion', 'Ni2+', '--bands', bands, '--json', '-o', 'ni.html'],
      dir,
    );
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { samples: { dq: number; B: number; origin: string }[] };
    const fit = await runInProcess(['fit', '--ion', 'Ni2+', '--bands', bands, '--json']);
    const best = (JSON.parse(fit.stdout) as { solutions: { dq: number; B: number }[] }).solutions[0];
    expectClose(out.samples[0]?.dq, best?.dq ?? Number.NaN, 0, 0.05);
    expectClose(out.samples[0]?.B, best?.B ?? Number.NaN, 0, 0.05);
    expect(out.samples[0]?.origin).toBe('the best fit of the bands');
  });

  it('puts a spectrum file into the page as wavenumbers', async () => {
    const spectrum = resolve(ROOT, 'fixtures/spectra/cr-mz6-absorbance-nm.csv');
    const r = await runInProcess(
      ['explore', '--ion', 'Cr3+', '--dq', '1740', '--B', '700', '--spectrum', spectrum, '-o', 'cr.html'],
      dir,
    );
    expect(r.code, r.stderr).toBe(0);
    const w = pageData('cr.html').samples[0]?.spectrum?.wavenumber ?? [];
    expect(w.length).toBeGreaterThan(100);
    expect((w[1] ?? 0) > (w[0] ?? 0)).toBe(true);
  });

  it('gives each fitted sample of a sheet its own entry', async () => {
    writeFileSync(
      join(dir, 'sheet.csv'),
      'name,ion,geometry,bands\n"A (invented)",Ni2+,oct,8500;13800;25300\n"B (invented)",Cr3+,oct,17400;24600\n',
    );
    const r = await runInProcess(['explore', '--sheet', 'sheet.csv', '-o', 'sheet.html'], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(pageData('sheet.html').samples.map((s) => [s.name, s.n])).toEqual([
      ['A (invented)', 8],
      ['B (invented)', 3],
    ]);
  });

  it('refuses bad input in one line with exit code 2 and writes nothing', async () => {
    for (const argv of [
      ['explore', '--d', '12'],
      ['explore', '--d', '3', '--serve', '80'],
      ['explore', '--sheet', 'sheet.csv', '--d', '3'],
    ]) {
      const r = await runInProcess([...argv, '-o', 'bad.html'], dir);
      expect(r.code).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
    expect(existsSync(join(dir, 'bad.html'))).toBe(false);
  });

  it('serveHtml serves the page on the loopback interface', async () => {
    const server = await serveHtml('<p>page</p>', 0);
    try {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      const res = await fetch(`http://127.0.0.1:${port}/`);
      expect(res.headers.get('content-type')).toContain('text/html');
      expect(await res.text()).toBe('<p>page</p>');
    } finally {
      server.close();
    }
  });
});

describe('termsplit explore (built binary)', () => {
  it('writes the page from the command line', () => {
    const r = runBinary(['explore', '--d', '3', '--dq', '1700', '--B', '700', '-o', join(dir, 'smoke.html')]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain('smoke.html');
    expect(readFileSync(join(dir, 'smoke.html'), 'utf8')).toContain('id="explorer-data"');
  });
});
