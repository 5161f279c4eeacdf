import { describe, expect, it } from 'vitest';
import { spinOnlyMoment } from '../../src/analysis/magnetism.js';
import { BOLTZMANN_CM, susceptibility } from '../../src/analysis/susceptibility.js';
import { InputError } from '../../src/core/errors.js';
import { expectClose } from '../helpers.js';

describe('susceptibility', () => {
  // Kotani's t₂g¹ curve, g = 2, k = 1: μ_eff² = [8 + (3x − 8)e^{−3x/2}] / [x(2 + e^{−3x/2})] with
  // x = ζ/kT (Kotani, J. Phys. Soc. Japan 4, 293, 1949; Figgis, Introduction to Ligand Fields,
  // 1966, ch. 10). A very large Dq leaves e_g out of reach, as Kotani's t₂g-only model has it.
  it("susceptibility(d¹, oct, huge Dq) reproduces Kotani's μ_eff against kT/ζ to 0.01 μ_B", () => {
    const zeta = 154;
    const kTOverZeta = [0.05, 0.1, 0.2, 0.5, 1, 2, 5];
    const points = susceptibility({
      n: 1,
      dq: 1e5,
      B: 0,
      C: 0,
      zeta,
      temperatures: kTOverZeta.map((t) => (t * zeta) / BOLTZMANN_CM),
    });
    points.forEach((p, i) => {
      const x = 1 / (kTOverZeta[i] ?? 1);
      const e = Math.exp(-1.5 * x);
      expectClose(p.muEff, Math.sqrt((8 + (3 * x - 8) * e) / (x * (2 + e))), 0, 0.01);
    });
  });

  // Orbital singlet and doublet ground terms: μ_eff = μ_so(1 − αλ/10Dq) with α = 4 (A₂) and 2 (E),
  // λ = ±ζ/2S (Figgis, Introduction to Ligand Fields, 1966, ch. 10; Figgis & Lewis, Prog. Inorg.
  // Chem. 6, 37, 1964). First order in λ/10Dq and without the temperature-independent part, so it
  // is checked at 2 K with λ/10Dq ≈ 0.01.
  it.each([
    [3, 'A₂ (⁴A₂g)', 2000, 273, 273 / 3, 4, 1.5],
    [8, 'A₂ (³A₂g)', 3000, 649, -649 / 2, 4, 1],
    [9, 'E (²Eg)', 3000, 300, -300, 2, 0.5],
  ])(
    'susceptibility(d%i, oct) gives the %s limit μ_so(1 − αλ/10Dq)',
    (n, _term, dq, zeta, lambda, alpha, S) => {
      const [p] = susceptibility({ n, dq, B: 900, C: 3600, zeta, temperatures: [2] });
      expectClose(p?.muEff, spinOnlyMoment(S) * (1 - (alpha * lambda) / (10 * dq)), 0, 0.003);
    },
  );

  it('susceptibility with ζ = 0 and no orbital Zeeman term (k = 0) gives the spin-only moment of the ground spin', () => {
    for (const [n, S] of [
      [2, 1],
      [3, 1.5],
      [5, 2.5],
      [7, 1.5],
      [8, 1],
    ] as const) {
      const [p] = susceptibility({ n, dq: 1000, B: 900, C: 3600, zeta: 0, k: 0, temperatures: [300] });
      expectClose(p?.muEff, spinOnlyMoment(S), 1e-9);
    }
  });

  it('susceptibility gives the Curie law χT = 0.12505·μ_eff² and χ in cm³ mol⁻¹', () => {
    const [p] = susceptibility({ n: 5, dq: 800, B: 900, C: 3600, zeta: 0, temperatures: [300] });
    // ⁶A₁g: μ_so = √35, χT = 0.125049·35 = 4.377 cm³ K mol⁻¹ (CODATA constants).
    expectClose(p?.chiT, 4.3767, 1e-4);
    expectClose(p?.chi, (p?.chiT ?? 0) / 300, 1e-12);
  });

  it('susceptibility refuses k outside 0…1 and a temperature of 0 K with InputError', () => {
    const base = { n: 7, dq: 900, B: 900, C: 3600, zeta: 500 };
    expect(() => susceptibility({ ...base, k: 1.5, temperatures: [300] })).toThrow(InputError);
    expect(() => susceptibility({ ...base, temperatures: [0] })).toThrow(/temperature 0 K/);
  });
});
