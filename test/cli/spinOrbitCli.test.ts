import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-zeta-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('--zeta on levels, terms and diagram (in process)', () => {
  it('levels --zeta ion adds the double-group levels of Ni²⁺ with the ³T₁g(F)/¹Eg mixing in their parentage', async () => {
    const r = await runInProcess(['levels', '--ion', 'Ni2+', '--dq', '850', '--B', '900', '--zeta', 'ion']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('With spin–orbit coupling, ζ = 649 cm⁻¹');
    expect(r.stdout).toMatch(/Γ3 .*% ³T₁g\(F\) \+ .*% ¹Eg\(D\)/);
    const json = JSON.parse(
      (
        await runInProcess([
          'levels',
          '--ion',
          'Ni2+',
          '--dq',
          '850',
          '--B',
          '900',
          '--zeta',
          '649',
          '--json',
        ])
      ).stdout,
    );
    expect(json.spinOrbit.ground).toBe('Γ5(1)');
    expect(json.spinOrbit.levels.length).toBe(20);
  });

  it('levels without --zeta prints no spin–orbit section and no spinOrbit key', async () => {
    const r = await runInProcess(['levels', '--ion', 'Ni2+', '--dq', '850', '--B', '900', '--json']);
    expect(JSON.parse(r.stdout).spinOrbit).toBeUndefined();
  });

  it('terms d1 --zeta 154 gives ²D₃/₂ and ²D₅/₂ 385 cm⁻¹ apart (5ζ/2)', async () => {
    const r = await runInProcess(['terms', 'd1', '--zeta', '154', '--json']);
    expect(r.code).toBe(0);
    const levels = JSON.parse(r.stdout).levels;
    expect(levels.map((l: { label: string }) => l.label)).toEqual(['2D3/2', '2D5/2']);
    expect(levels[1].energy).toBeCloseTo(385, 9);
  });

  it('diagram --zeta writes double-group curves as CSV and says ζ/B', async () => {
    const r = await runInProcess(
      [
        'diagram',
        'd3',
        '--ion',
        'Cr3+',
        '--zeta',
        'ion',
        '--points',
        '40',
        '--data',
        'cr.csv',
        '-o',
        'cr.png',
      ],
      dir,
    );
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('ζ/B = 0.297');
    expect(readFileSync(join(dir, 'cr.csv'), 'utf8').split('\n')[0]).toMatch(/^Delta\/B,Γ8\(1\)/);
  });

  it('fit --zeta ion refines the best Ni²⁺ solution with ζ held, in text and JSON', async () => {
    const argv = ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--zeta', 'ion'];
    const text = await runInProcess(argv);
    expect(text.code).toBe(0);
    expect(text.stdout).toContain('With spin–orbit coupling (ζ = 649 cm⁻¹, held');
    const json = JSON.parse((await runInProcess([...argv, '--json'])).stdout);
    expect(json.spinOrbit.zeta).toBe(649);
    expect(json.spinOrbit.bands.map((b: { level: string }) => b.level)).toEqual([
      '3T2g',
      '3T1g(F)',
      '3T1g(P)',
    ]);
    expect(json.spinOrbit.dq).toBeGreaterThan(780);
    expect(json.spinOrbit.dq).toBeLessThan(880);
  });

  it('fit --fit-zeta fits ζ from the Ni²⁺ pair 13 800 / 15 400 cm⁻¹ and shows each component on its Γ level with parentage', async () => {
    const argv = ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,15400,25300', '--cb', '4.2', '--fit-zeta'];
    const text = await runInProcess(argv);
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(
      /With spin–orbit coupling \(ζ = \d+ ± \d+ cm⁻¹, fitted, 0\.\d\d × the free ion/,
    );
    expect(text.stdout).toMatch(/Γ3\(3\), \d+ % ¹Eg\(D\) \+ \d+ % ³T₁g\(F\) +15400/);
    const json = JSON.parse((await runInProcess([...argv, '--json'])).stdout);
    expect(json.spinOrbit.zetaFitted).toBe(true);
    expect(json.spinOrbit.errors.zeta).toBeGreaterThan(0);
    expect(json.spinOrbit.bands.map((b: { components?: string[] }) => b.components?.[0] ?? null)).toEqual([
      null,
      'Γ4(2)',
      'Γ3(3)',
      null,
    ]);
  });

  it('fit --fit-zeta without resolved components holds ζ and says so; without a starting ζ it is refused', async () => {
    const held = JSON.parse(
      (await runInProcess(['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--fit-zeta', '--json']))
        .stdout,
    );
    expect(held.spinOrbit.zetaFitted).toBe(false);
    expect(held.spinOrbit.zeta).toBe(649);
    expect(held.spinOrbit.warnings[0]).toMatch(/^ζ held at 649 cm⁻¹/);
    const refused = await runInProcess(['fit', '--d', '8', '--bands', '8500,13800,25300', '--fit-zeta']);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toMatch(/--fit-zeta needs a starting ζ/);
  });

  it('fit --fit-zeta --zeta-levels takes the published Γ3/Γ3 assignment of the Ni²⁺ pair (Lever 1984, from memory) and refuses a wrong count', async () => {
    const argv = ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,15400,25300', '--cb', '4.2', '--fit-zeta'];
    const json = JSON.parse((await runInProcess([...argv, '--zeta-levels', 'G3(2),Γ3(3)', '--json'])).stdout);
    expect(json.spinOrbit.bands.map((b: { components?: string[] }) => b.components?.[0] ?? null)).toEqual([
      null,
      'Γ3(2)',
      'Γ3(3)',
      null,
    ]);
    expect(json.spinOrbit.zetaOverFreeIon).toBeGreaterThan(0.7);
    expect(json.spinOrbit.zetaOverFreeIon).toBeLessThan(1.0);
    const wrong = await runInProcess([...argv, '--zeta-levels', 'Γ3(2)']);
    expect(wrong.code).toBe(2);
    expect(wrong.stderr).toMatch(/1 spin–orbit levels for 2 resolved components/);
  });

  it('crossover --zeta ion puts μ_eff with spin–orbit coupling at the sample beside the spin-only moments', async () => {
    const argv = ['crossover', '--ion', 'Fe2+', '--B', '800', '--dq', '1150', '--zeta', 'ion'];
    const text = await runInProcess(argv);
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(/sample, Dq = 1150 cm⁻¹: ground Γ5 \(mainly ⁵T₂g\), μ_eff = /);
    const json = JSON.parse((await runInProcess([...argv, '--json'])).stdout);
    expect(json.magnetism[0].spinOnly).toBeCloseTo(4.899, 3);
    // ⁵T₂g: an unquenched orbital moment puts μ_eff above spin-only at room temperature (Figgis & Lewis 1964).
    expect(json.magnetismSpinOrbit.points[0].muEff[0]).toBeGreaterThan(5.2);
  });

  it('refuses a negative or absurd --zeta, and --zeta ion without an ion, in one line with exit code 2', async () => {
    for (const argv of [
      ['levels', '--d', '3', '--dq', '1740', '--B', '725', '--zeta', '-1'],
      ['levels', '--d', '3', '--dq', '1740', '--B', '725', '--zeta', '1e7'],
      ['levels', '--d', '3', '--dq', '1740', '--B', '725', '--zeta', 'ion'],
      ['terms', 'p2', '--zeta', '100'],
      ['diagram', 'd3', '--zeta', '300'],
      ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--zeta', '-3'],
    ]) {
      const r = await runInProcess(argv, dir);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  });
});
