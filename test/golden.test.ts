/**
 * Golden outputs: the JSON of every README example and the demo's report.json, saved from the
 * release before the source tree was regrouped. A behaviour change shows here; when it is meant,
 * the files in fixtures/golden/ are re-saved in the same commit and the commit says why.
 */
import { mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { ROOT, runInProcess, words } from './cliRunner.js';

const GOLDEN = join(ROOT, 'fixtures/golden');

/** The commands as saved, one a line, `npx termsplit` first. */
/** The README's report of the demo sheet: the same report as `termsplit demo`. */
const DEMO_SHEET_REPORT = 'npx termsplit report fixtures/demo/samples.json ';

const commands = readFileSync(join(GOLDEN, 'commands.txt'), 'utf8').trim().split('\n');

/** Drops what legitimately differs between runs: the date and the folder the run happened in. */
function normalise(value: unknown, dir: string): unknown {
  return JSON.parse(JSON.stringify(value).replaceAll(`${dir}/`, ''), (key, v) =>
    key === 'date' ? 'DATE' : v,
  );
}

function golden(name: string): unknown {
  return normalise(JSON.parse(readFileSync(join(GOLDEN, name), 'utf8')), '/tmp/golden');
}

const dir = mkdtempSync(join(tmpdir(), 'termsplit-golden-'));
symlinkSync(join(ROOT, 'fixtures'), join(dir, 'fixtures'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('golden JSON outputs', () => {
  commands.forEach((line, i) => {
    const file = `${String(i + 1).padStart(2, '0')}.json`;
    if (line.startsWith(DEMO_SHEET_REPORT)) {
      // The demo sheet's report is computed once per suite (test/globalSetup.ts); it differs from
      // this command's only in how the sheet is named.
      it(`${line} --json equals fixtures/golden/${file} (from the suite's demo run)`, () => {
        const expected = golden(file) as { sheet: string };
        const report = JSON.parse(
          readFileSync(join(inject('demoCwd'), 'termsplit-demo/report.json'), 'utf8'),
        );
        expect(normalise({ ...report, sheet: expected.sheet }, dir)).toEqual(expected);
      });
      return;
    }
    it(`${line} --json equals fixtures/golden/${file}`, async () => {
      const argv = words(line).slice(2);
      if (!argv.includes('--json')) argv.push('--json');
      const r = await runInProcess(argv, dir);
      expect(r.code).toBe(0);
      expect(normalise(JSON.parse(r.stdout), dir)).toEqual(golden(file));
    }, 60_000);
  });

  it('the demo report.json equals fixtures/golden/demo-report.json', () => {
    const report = JSON.parse(readFileSync(join(inject('demoCwd'), 'termsplit-demo/report.json'), 'utf8'));
    expect(normalise(report, dir)).toEqual(golden('demo-report.json'));
  });
});
