import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runInProcess } from './cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-integration-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('fit → diagram and fit → crossover', () => {
  it('fit --diagram draws the correlation diagram with the fitted sample (a PNG)', async () => {
    const r = await runInProcess(
      ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--diagram', 'ni.png'],
      dir,
    );
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Correlation diagram with the sample written to ni.png');
    const png = readFileSync(join(dir, 'ni.png'));
    expect(png.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
    expect(png.length).toBeGreaterThan(20_000);
  });

  it('fit --diagram refuses d⁹ (no Racah B) with exit 2 and writes nothing', async () => {
    const r = await runInProcess(['fit', '--ion', 'Cu2+', '--bands', '12500', '--diagram', 'cu.png'], dir);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(existsSync(join(dir, 'cu.png'))).toBe(false);
  });

  // [Co(NH3)6]3+: bands near 21000 and 29500 cm⁻¹, a low-spin d⁶ complex (Lever, Inorganic
  // Electronic Spectroscopy, 1984; from memory).
  it('crossover --bands places low-spin [Co(NH3)6]3+ on the low-spin side from its band fit', async () => {
    const r = await runInProcess(['crossover', '--ion', 'Co3+', '--bands', '21000,29500', '--json'], dir);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.fit.B).toBeGreaterThan(550);
    expect(j.fit.B).toBeLessThan(700);
    expect(j.sample.side).toBe('low-spin');
    expect(j.bOrigin).toMatch(/fitted to the bands/);
  });

  it('crossover --bands with --dq is refused: the fit gives Dq', async () => {
    const r = await runInProcess(
      ['crossover', '--ion', 'Co3+', '--bands', '21000,29500', '--dq', '2300'],
      dir,
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/leave out --dq/);
  });
});
