import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT, runInProcess } from '../cliRunner.js';
import { expectClose } from '../helpers.js';

// End to end in a real browser: the page `termsplit explore` writes, driven by playwright-core in
// Debian's headless Chromium. The energies the page computes are checked against
// `termsplit levels --json` (the same library in Node); the update times are printed.
const CHROMIUM = process.env.CHROMIUM ?? '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
if (!haveChromium) console.log(`no Chromium at ${CHROMIUM}: the explorer's browser test is skipped`);

interface Level {
  label: string;
  energy: number;
}

/** The levels of `termsplit levels --json` for these parameters. */
async function cliLevels(ion: string, dq: string, B: string, cb: string) {
  const r = await runInProcess(['levels', '--ion', ion, '--dq', dq, '--B', B, '--cb', cb, '--json']);
  expect(r.code).toBe(0);
  return (JSON.parse(r.stdout) as { levels: Level[] }).levels;
}

/** The same labels in the same order, and energies equal to 0.01 cm⁻¹. */
function expectSameLevels(shown: Level[], expected: Level[]): void {
  expect(shown.map((l) => l.label)).toEqual(expected.map((l) => l.label));
  for (const [i, l] of shown.entries()) expectClose(l.energy, expected[i]?.energy ?? Number.NaN, 0, 0.01);
}

/** The level table's rows: label and exact energy. */
function pageLevels(tab: Page) {
  return tab.locator('#level-table tbody tr').evaluateAll((rows) =>
    rows.map((r) => ({
      label: r.getAttribute('data-label') ?? '',
      energy: Number(r.getAttribute('data-energy')),
    })),
  );
}

function fragment(tab: Page): Promise<URLSearchParams> {
  return tab.evaluate<string>('location.hash').then((h) => new URLSearchParams(h.slice(1)));
}

/** Waits until the page's permalink holds this value (the page has then redrawn). */
function waitForParam(tab: Page, key: string, value: string) {
  return tab.waitForFunction(
    `new URLSearchParams(location.hash.slice(1)).get(${JSON.stringify(key)}) === ${JSON.stringify(value)}`,
  );
}

describe.skipIf(!haveChromium)('the explorer page in headless Chromium', () => {
  let browser: Browser;
  let dir: string;
  let tab: Page;
  const errors: string[] = [];
  /** The time of the last update after the Dq slider moved, ms. */
  let dqMove = '';

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'termsplit-explore-'));
    // Band maxima of [Ni(H2O)6]2+: 8500, 13800, 25300 cm⁻¹ (Lever, Inorganic Electronic
    // Spectroscopy, 2nd ed., 1984) — here only as points to draw.
    const r = await runInProcess(
      [
        'explore',
        '--ion',
        'Ni2+',
        '--dq',
        '850',
        '--B',
        '900',
        '--bands',
        '8500,13800,25300',
        '-o',
        'page.html',
      ],
      dir,
    );
    expect(r.code, r.stderr).toBe(0);
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--no-first-run',
        '--disable-background-networking',
      ],
    });
    tab = await browser.newPage({ viewport: { width: 1200, height: 900 } });
    tab.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') errors.push(m.text());
    });
    tab.on('pageerror', (e) => errors.push(e.message));
    tab.on('requestfailed', (q) => errors.push(`request failed: ${q.url()}`));
    await tab.goto(pathToFileURL(join(dir, 'page.html')).href);
    await tab.locator('#level-table').waitFor();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('opens with the levels of termsplit levels --json for the same Ni2+ parameters', async () => {
    const cb = (await fragment(tab)).get('cb') ?? '';
    const expected = await cliLevels('Ni2+', '850', '900', cb);
    const shown = await pageLevels(tab);
    expectSameLevels(shown, expected);
  });

  it('moving the Dq slider by keyboard changes the table and the diagram, still equal to levels --json', async () => {
    const before = await pageLevels(tab);
    const line = tab.locator('#diagram [data-current]');
    const x0 = await line.getAttribute('x1');
    await tab.locator('#dq').focus();
    for (let i = 0; i < 15; i++) await tab.keyboard.press('ArrowRight');
    await waitForParam(tab, 'dq', '1000');
    expect(await tab.locator('#dq-value').inputValue()).toBe('1000');
    dqMove = (await tab.locator('#explorer').getAttribute('data-update-ms')) ?? '';
    const after = await pageLevels(tab);
    expect(after[1]?.energy).not.toBe(before[1]?.energy);
    expect(await line.getAttribute('x1')).not.toBe(x0);
    const cb = (await fragment(tab)).get('cb') ?? '';
    const expected = await cliLevels('Ni2+', '1000', '900', cb);
    expectSameLevels(after, expected);
  });

  it('shows the observed bands on the diagram and a curve’s parent and make-up on hover', async () => {
    expect(await tab.locator('#diagram [data-observed]').count()).toBe(3);
    await tab.locator('#level-table tbody tr').nth(1).hover();
    await expect
      .poll(() => tab.locator('#hover-info').textContent())
      .toMatch(/parent term .*strong field t₂g/);
  });

  it('overlays a spectrum loaded from a file, with the predicted transitions as sticks', async () => {
    expect(await tab.locator('#spectrum-figure').isHidden()).toBe(true);
    await tab
      .locator('#spectrum-file')
      .setInputFiles(resolve(ROOT, 'fixtures/spectra/ni-tvc3-epsilon-wavenumber.txt'));
    await tab.locator('#spectrum [data-spectrum]').waitFor();
    expect(await tab.locator('#spectrum-figure').isVisible()).toBe(true);
    expect(await tab.locator('#spectrum [data-stick]').count()).toBeGreaterThan(0);
  });

  it('updates a 200-point diagram of every dⁿ (printed, in ms) and logs no errors', async () => {
    const times: string[] = [];
    for (let n = 1; n <= 9; n++) {
      await tab.locator('#n').selectOption(String(n));
      await waitForParam(tab, 'n', String(n));
      const cold = await tab.locator('#explorer').getAttribute('data-update-ms');
      // A new C/B: the whole diagram is solved again, now with the dⁿ's tables cached.
      await tab.locator('#cOverB-value').fill(String(4 + n / 10));
      await tab.locator('#cOverB-value').dispatchEvent('change');
      await waitForParam(tab, 'cb', String(4 + n / 10));
      const main = tab.locator('#explorer');
      times.push(
        `d${n} ${cold} / ${await main.getAttribute('data-update-ms')} (library ${await main.getAttribute('data-compute-ms')})`,
      );
    }
    const load = loadavg()
      .map((l) => l.toFixed(1))
      .join(' ');
    console.log(
      `explorer update, ms: Dq moved (d8) ${dqMove}; new dⁿ / then a new C/B (whole diagram): ${times.join(', ')}; load average ${load} on ${availableParallelism()} cores`,
    );
    expect(errors).toEqual([]);
  });
});
