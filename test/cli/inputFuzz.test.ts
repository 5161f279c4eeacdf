import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, runInProcess } from '../cliRunner.js';
import { fuzz, mutated } from '../fuzz.js';

/**
 * The command line on randomly edited inputs (fixed seed, test/fuzz.ts), in process: every run
 * ends with exit 0, or exit 2 with one line on stderr, nothing on stdout and no output file or
 * temporary left behind.
 */

const dir = mkdtempSync(join(tmpdir(), 'termsplit-input-fuzz-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A short spectrum (every 4th row of the invented Cr(III) demo file), so each run is quick. */
const SPECTRUM = readFileSync(resolve(ROOT, 'fixtures/spectra/cr-mz6-absorbance-nm.csv'), 'utf8')
  .split('\n')
  .filter((_line, i) => i < 3 || i % 4 === 0)
  .join('\n');

const SHEET = JSON.stringify({
  title: 'fuzz',
  samples: [
    { name: 'a', ion: 'Ni2+', bands: '8500, 13800±200, 25300' },
    { name: 'b', ion: 'Cr3+', bands: '17400, 24600' },
  ],
});

function expectCleanEnd(r: { code: number; stdout: string; stderr: string }, leftovers: string[]): void {
  if (r.code === 0) return;
  expect(r.code).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).toMatch(/^termsplit: [^\n]+\n$/);
  expect(leftovers).toEqual([]);
}

describe('termsplit on edited inputs (property, in process)', () => {
  it('spectrum: exit 0, or exit 2 with one line and no figure', async () => {
    let k = 0;
    await fuzz(
      fc.asyncProperty(mutated(SPECTRUM, 4), async (text) => {
        const name = `s${k++}`;
        writeFileSync(join(dir, `${name}.csv`), text);
        const r = await runInProcess(['spectrum', `${name}.csv`, '--ion', 'Cr3+', '-o', `${name}.svg`], dir);
        expectCleanEnd(
          r,
          readdirSync(dir).filter((f) => f.startsWith(`${name}.svg`) || f.startsWith(`.${name}.svg`)),
        );
      }),
      6,
    );
  }, 120_000);

  it('report: exit 0, or exit 2 with one line and no report folder', async () => {
    let k = 0;
    await fuzz(
      fc.asyncProperty(mutated(SHEET, 4), async (text) => {
        const name = `r${k++}`;
        writeFileSync(join(dir, `${name}.json`), text);
        const r = await runInProcess(['report', `${name}.json`, '-o', `${name}-out`, '--jobs', '1'], dir);
        if (r.code === 0) return;
        // A sheet with some bad samples still reports the others (exit 0); exit 2 leaves nothing.
        expectCleanEnd(
          { ...r, stderr: r.stderr.split('\n').at(-2)?.concat('\n') ?? '' },
          readdirSync(dir).filter((f) => f.includes(`${name}-out`)),
        );
      }),
      6,
    );
  }, 120_000);
});
