import { describe, expect, it } from 'vitest';
import { solveCubic } from '../../src/field/cubic.js';
import { DOUBLE_IRREP_DIMENSION, spinOrbitSplitting } from '../../src/field/doubleGroup.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';

describe('spinOrbitSplitting', () => {
  it('spinOrbitSplitting gives the textbook splittings: ⁴T₁ → Γ6 + Γ7 + 2Γ8, ³T₁g → Γ1 + Γ3 + Γ4 + Γ5, ⁶A₁ → Γ7 + Γ8 (Koster et al. 1963)', () => {
    expect(spinOrbitSplitting('T1', 1.5).sort()).toEqual(['Γ6', 'Γ7', 'Γ8', 'Γ8']);
    expect(spinOrbitSplitting('T1g', 1).sort()).toEqual(['Γ1', 'Γ3', 'Γ4', 'Γ5']);
    expect(spinOrbitSplitting('A1g', 2.5).sort()).toEqual(['Γ7', 'Γ8']);
  });

  it.each([2, 3, 5, 6, 7])(
    'spinOrbitSplitting of every cubic level of d%i counts the irreps the spin–orbit solver finds, with dimensions (2S+1)·dim Γ',
    (n) => {
      const cubic = solveCubic({ n, dq: 1500, B: 800, C: 3600 });
      const withZeta = solveSpinOrbit({ n, dq: 1500, B: 800, C: 3600, zeta: 300, parentage: false });
      const count = new Map<string, number>();
      const dim: Record<string, number> = { A1: 1, A2: 1, E: 2, T1: 3, T2: 3 };
      for (const l of cubic.levels) {
        const parts = spinOrbitSplitting(l.irrep, l.S);
        const total = parts.reduce((s, g) => s + DOUBLE_IRREP_DIMENSION[g], 0);
        expect(total).toBe((2 * l.S + 1) * (dim[l.irrep.replace(/g$/, '')] ?? 0));
        for (const g of parts) count.set(g, (count.get(g) ?? 0) + 1);
      }
      const found = new Map<string, number>();
      for (const l of withZeta.levels) found.set(l.irrep, (found.get(l.irrep) ?? 0) + 1);
      expect(Object.fromEntries(found)).toEqual(Object.fromEntries(count));
    },
  );
});
