import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { type CubicResult, cubicLevels } from '../../src/field/cubic.js';
import { fullSpinOrbitHamiltonian } from '../../src/field/spinOrbitBlocks.js';
import {
  type SpinOrbitResult,
  solveSpinOrbit,
  spinOrbitLevels,
  spinOrbitStates,
} from '../../src/field/spinOrbitSolver.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose } from '../helpers.js';

/** Every component energy, each level repeated by its degeneracy, ascending. */
function expanded(r: SpinOrbitResult | CubicResult): number[] {
  return r.levels.flatMap((l) => new Array<number>(l.degeneracy).fill(l.energy)).sort((a, b) => a - b);
}

function irreps(r: SpinOrbitResult): string {
  return r.levels.map((l) => l.irrep).join(' ');
}

describe('solveSpinOrbit: one d electron or hole (closed forms)', () => {
  // d¹ in Oh: Γ7 lies only in t₂g, at −4Dq + ζ; the two Γ8 (t₂g and e_g) mix through ⟨t₂g Γ8|ζl·s|e_g Γ8⟩
  // = √(3/2)ζ, the diagonal entries being −4Dq − ζ/2 and 6Dq (Griffith, The Theory of
  // Transition-Metal Ions, 1961, ch. 9; Figgis & Hitchman, Ligand Field Theory and its Applications,
  // 2000, ch. 5; from memory). Within t₂g alone Γ8 and Γ7 are 3ζ/2 apart.
  it('solveSpinOrbit(d¹, oct) gives Γ8 ground, Γ7 and the e_g Γ8 by the 2×2 secular equation', () => {
    for (const [dq, zeta] of [
      [2000, 154],
      [1800, 500],
      [300, 1000],
    ] as const) {
      const r = solveSpinOrbit({ n: 1, dq, B: 0, C: 0, zeta });
      expect(irreps(r)).toBe('Γ8 Γ7 Γ8');
      const a = -4 * dq - zeta / 2;
      const b = 6 * dq;
      const root = Math.sqrt(((a - b) / 2) ** 2 + 1.5 * zeta * zeta);
      const low = (a + b) / 2 - root;
      expectClose(r.levels[1]?.energy, -4 * dq + zeta - low, 1e-10, 1e-7);
      expectClose(r.levels[2]?.energy, 2 * root, 1e-10, 1e-7);
    }
  });

  it('solveSpinOrbit(d¹, oct) splits t₂g into Γ8 and Γ7 by 3ζ/2 when e_g is far away, and keeps e_g a single Γ8', () => {
    const r = solveSpinOrbit({ n: 1, dq: 1e5, B: 0, C: 0, zeta: 200 });
    expectClose(r.levels[1]?.energy, 300, 1e-3);
    expect(r.levels[1]?.parent).toBe('2T2g');
    expect(r.levels[2]?.irrep).toBe('Γ8');
    expect(r.levels[2]?.parent).toBe('2Eg');
  });

  // Free-ion ²D: J = 5/2 at +ζ and J = 3/2 at −3ζ/2 (λ = ζ, L·S = ½[J(J+1) − L(L+1) − S(S+1)]);
  // in the double group J = 3/2 → Γ8 and J = 5/2 → Γ7 + Γ8 (Bethe 1929). A hole reverses the sign.
  it('solveSpinOrbit(d¹, Dq = 0) splits ²D by 5ζ/2 with ²D₃/₂ (Γ8) lowest; d⁹ puts ²D₅/₂ (Γ7 + Γ8) lowest', () => {
    const d1 = solveSpinOrbit({ n: 1, dq: 0, B: 0, C: 0, zeta: 154 });
    expectClose(d1.levels[1]?.energy, 385, 1e-12);
    expect(d1.levels[0]?.irrep).toBe('Γ8');
    expect(new Set(d1.levels.slice(1).map((l) => l.irrep))).toEqual(new Set(['Γ7', 'Γ8']));
    const d9 = solveSpinOrbit({ n: 9, dq: 0, B: 0, C: 0, zeta: 829 });
    expect(new Set(d9.levels.slice(0, 2).map((l) => l.irrep))).toEqual(new Set(['Γ7', 'Γ8']));
    expectClose(d9.levels[0]?.energy, 0);
    expectClose(d9.levels[2]?.energy, 2.5 * 829, 1e-12);
  });

  it('solveSpinOrbit(d⁹, oct) reverses d¹: e_g Γ8 ground, t₂g Γ7 below its Γ8 by about 3ζ/2', () => {
    const r = solveSpinOrbit({ n: 9, dq: 1e5, B: 0, C: 0, zeta: 200 });
    expect(irreps(r)).toBe('Γ8 Γ7 Γ8');
    expectClose((r.levels[2]?.energy ?? 0) - (r.levels[1]?.energy ?? 0), 300, 1e-3);
  });

  it('solveSpinOrbit(d¹, tet) keeps e a Γ8 ground and splits t₂ into Γ8 and Γ7 by about 3ζ/2', () => {
    const r = solveSpinOrbit({ n: 1, geometry: 'tet', dq: 1e5, B: 0, C: 0, zeta: 200 });
    expect(irreps(r)).toBe('Γ8 Γ8 Γ7');
    expect(r.levels[0]?.parent).toBe('2E');
    expectClose((r.levels[2]?.energy ?? 0) - (r.levels[1]?.energy ?? 0), 300, 1e-3);
  });
});

describe('solveSpinOrbit: invariants', () => {
  const cases = [
    [2, 1850, 860, 3784, 209],
    [3, 1740, 725, 3190, 273],
    [4, 2100, 830, 3430, 230],
    [5, 1500, 800, 3500, 400],
    [6, 2000, 1065, 4600, 580],
    [7, 930, 970, 4268, 533],
    [8, 850, 900, 3960, 649],
  ] as const;

  it('solveSpinOrbit with ζ = 0 gives the cubic solver’s levels to 10⁻⁸ cm⁻¹ (d² … d⁸)', () => {
    for (const [n, dq, B, C] of cases) {
      const so = expanded(solveSpinOrbit({ n, dq, B, C, zeta: 0, parentage: false }));
      const cubic = expanded(cubicLevels(n, dq, B, C, 'oct'));
      expect(so.length).toBe(cubic.length);
      so.forEach((e, i) => {
        expectClose(e, cubic[i] ?? Number.NaN, 0, 1e-8);
      });
    }
  });

  it('spinOrbitStates keeps the trace of H whatever ζ (Σ l·s is traceless over dⁿ)', () => {
    for (const [n, dq, B, C, zeta] of cases) {
      const trace = (z: number) => {
        const { blocks, eigs } = spinOrbitStates(n, dq, B, C, z);
        return eigs.reduce(
          (s, e, i) => s + (blocks[i]?.weight ?? 0) * e.values.reduce((a, v) => a + v, 0),
          0,
        );
      };
      expectClose(trace(zeta), trace(0), 1e-11, 1e-6);
    }
  });

  it('solveSpinOrbit (blocked by M_J class) matches the full 252 × 252 d⁵ and 210 × 210 d⁴ matrices', () => {
    for (const [n, dq, B, C, zeta] of [cases[3], cases[2]]) {
      const blocked = expanded(solveSpinOrbit({ n, dq, B, C, zeta, parentage: false }));
      const { size, matrix } = fullSpinOrbitHamiltonian(n, dq, B, C, zeta);
      const full = symmetricEigen(matrix, size).values;
      expect(blocked.length).toBe(size);
      blocked.forEach((e, i) => {
        expectClose(e, (full[i] ?? 0) - (full[0] ?? 0), 1e-11, 1e-7);
      });
    }
  });

  // Electrons ↔ holes: the one-electron operators change sign, repulsion does not, and a
  // tetrahedral field is the octahedral one with Dq reversed; so dⁿ in Td with ζ has the spectrum
  // of d¹⁰⁻ⁿ in Oh with −ζ (Griffith 1961, §9.7, from memory).
  it('spinOrbitLevels(dⁿ, tet, ζ) equals d¹⁰⁻ⁿ oct with −ζ, labels included', () => {
    for (const [n, dq, B, C, zeta] of [
      [3, 400, 700, 3000, 300],
      [2, 500, 650, 2900, 200],
      [7, 390, 780, 3500, 500],
    ] as const) {
      const tet = spinOrbitLevels(n, -dq, B, C, zeta, 'tet', false);
      const oct = spinOrbitLevels(10 - n, dq, B, C, -zeta, 'oct', false);
      expect(irreps(tet)).toBe(irreps(oct));
      tet.levels.forEach((l, i) => {
        expectClose(l.energy, oct.levels[i]?.energy ?? Number.NaN, 1e-11, 1e-7);
      });
    }
  });

  it('solveSpinOrbit gives every level the dimension of its irrep, and the dimensions add up to C(10, n)', () => {
    for (const [n, dq, B, C, zeta] of cases) {
      const r = solveSpinOrbit({ n, dq, B, C, zeta, parentage: false });
      const total = r.levels.reduce((s, l) => s + l.degeneracy, 0);
      expect(total).toBe([1, 10, 45, 120, 210, 252, 210, 120, 45, 10][n]);
    }
  });
});

describe('solveSpinOrbit: parentage', () => {
  it('solveSpinOrbit(d⁷ Co²⁺ aqua-like, oct) names the ⁴T₁g(F) parent of the lowest four levels, weights summing to 1', () => {
    const r = solveSpinOrbit({ n: 7, dq: 930, B: 970, C: 4268, zeta: 533 });
    expect(r.ground.irrep).toBe('Γ6');
    for (const l of r.levels.slice(0, 4)) {
      expect(l.parent).toBe('4T1g(F)');
      expect(l.parentage.reduce((s, p) => s + p.weight, 0)).toBeGreaterThan(0.999);
    }
    // ⁴T₁ × Γ8 (S = 3/2) = Γ6 + Γ7 + 2Γ8: the ground term's 12 states in 4 levels (Bethe 1929).
    expect(
      r.levels
        .slice(0, 4)
        .map((l) => l.irrep)
        .sort(),
    ).toEqual(['Γ6', 'Γ7', 'Γ8', 'Γ8']);
    expect(r.levels[4]?.parent).not.toBe('4T1g(F)');
  });

  it('solveSpinOrbit at Dq = 0 names free-ion terms as parents', () => {
    const r = solveSpinOrbit({ n: 3, dq: 0, B: 918, C: 3850, zeta: 273 });
    expect(r.ground.parent).toBe('4F');
  });
});

describe('solveSpinOrbit: bad input', () => {
  it('solveSpinOrbit refuses a negative, non-finite or absurd ζ with one-line InputError', () => {
    for (const zeta of [-1, Number.NaN, Number.POSITIVE_INFINITY, 1e6]) {
      expect(() => solveSpinOrbit({ n: 3, dq: 1000, B: 700, C: 3000, zeta })).toThrow(InputError);
    }
    expect(() => solveSpinOrbit({ n: 3, dq: 1000, B: 700, C: 3000, zeta: -5 })).toThrow(/ζ = -5: expected/);
  });
});
