import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, ensureBuilt, runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-magnetism-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('termsplit magnetism (in process)', () => {
  it('prints μ_eff against T beside spin-only for octahedral Co²⁺, with the free-ion ζ by default', async () => {
    const r = await runInProcess(['magnetism', '--ion', 'Co2+', '--dq', '930', '--B', '970']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('ζ = 533 cm⁻¹');
    expect(r.stdout).toContain('spin-only 3.873 μ_B');
    expect(r.stdout).toMatch(/300\.0 .* 3\.873/);
  });

  it('gives Kotani’s t₂g¹ value in JSON: μ_eff(kT = ζ) ≈ 1.760 μ_B (Kotani 1949)', async () => {
    const T = 154 / 0.6950348;
    const r = await runInProcess([
      'magnetism',
      '--d',
      '1',
      '--dq',
      '1e5',
      '--zeta',
      '154',
      '--tmin',
      String(T),
      '--tmax',
      '300',
      '--json',
    ]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.points[0].muEff).toBeCloseTo(1.7597, 2);
    expect(out.ground.withSpinOrbit).toBe('Γ8(1)');
  });

  it('writes the figure with -o and names it', async () => {
    const r = await runInProcess(
      ['magnetism', '--ion', 'Ni2+', '--dq', '850', '--B', '900', '-o', 'ni.png'],
      dir,
    );
    expect(r.code).toBe(0);
    expect(readFileSync(join(dir, 'ni.png')).subarray(1, 4).toString()).toBe('PNG');
  });

  it('refuses a negative ζ, or no ζ without an ion, in one line with exit code 2', async () => {
    for (const argv of [
      ['magnetism', '--d', '3', '--dq', '1740', '--B', '725', '--zeta', '-5'],
      ['magnetism', '--d', '3', '--dq', '1740', '--B', '725'],
      ['magnetism', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--k', '2'],
    ]) {
      const r = await runInProcess(argv);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  });
});

describe('termsplit magnetism (one smoke test of the built command)', () => {
  beforeAll(() => {
    ensureBuilt();
  }, 120_000);

  it('prints one JSON object with --json', () => {
    const r = spawnSync('node', [BIN, 'magnetism', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--json'], {
      encoding: 'utf8',
    });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).ground.withoutSpinOrbit).toBe('4A2g');
  });
});
