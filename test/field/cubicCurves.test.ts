/**
 * The sweep's fast path, cubicCurves (one component of each ²ˢ⁺¹Γ, eigenvalues alone), held to
 * the full labelled solver, cubicLevels, point by point, and to closed forms along whole curves.
 */
import { describe, expect, it } from 'vitest';
import { cubicCurves, cubicLevels } from '../../src/field/cubic.js';
import type { Geometry } from '../../src/field/labels.js';

/** Dq grid, cm⁻¹: the free ion, weak, crossover-region and strong fields. */
const GRID = [0, 40, 400, 900, 1500, 1900, 2300, 3100, 4500];

function compare(n: number, geometry: Geometry, B: number, C: number, dqs: readonly number[]): number {
  const sign = geometry === 'oct' ? 1 : -1;
  const curves = cubicCurves(
    n,
    dqs.map((d) => sign * d),
    B,
    C,
    geometry,
  );
  let worst = 0;
  dqs.forEach((dq, i) => {
    const full = cubicLevels(n, sign * dq, B, C, geometry, false);
    expect(curves).toHaveLength(full.levels.length);
    for (const level of full.levels) {
      const curve = curves.find((c) => c.label === level.label);
      expect(curve, `${level.label} of d${n} ${geometry}`).toBeDefined();
      if (!curve) continue;
      expect([curve.symbol, curve.S, curve.irrep, curve.parent]).toEqual([
        level.symbol,
        level.S,
        level.irrep,
        level.parent,
      ]);
      worst = Math.max(worst, Math.abs((curve.energies[i] as number) - level.energy));
    }
  });
  return worst;
}

describe('cubicCurves against the full solver', () => {
  for (const geometry of ['oct', 'tet'] as const) {
    it(`d1–d9 ${geometry}, C/B 3.2, 4.5 and 5.7: the same levels, names and energies (to 1e-8 cm⁻¹) at every Dq`, () => {
      for (let n = 1; n <= 9; n++) {
        for (const cOverB of [3.2, 4.5, 5.7]) {
          expect(compare(n, geometry, 850, 850 * cOverB, GRID)).toBeLessThan(1e-8);
        }
      }
    });
  }

  it('d4–d7 on a fine grid of Dq through the high-spin/low-spin region', () => {
    const fine = Array.from({ length: 61 }, (_, i) => i * 60);
    for (const n of [4, 5, 6, 7]) expect(compare(n, 'oct', 1000, 4200, fine)).toBeLessThan(1e-8);
  });
});

describe('cubicCurves against closed forms', () => {
  // Tanabe & Sugano, J. Phys. Soc. Japan 9, 753 (1954); Griffith, The Theory of Transition-Metal
  // Ions (1961): in d³ and d⁸ (Oh), ⁴T₂g and ³T₂g lie exactly 10Dq above the ground state, and in
  // d¹ ²E_g lies 10Dq above ²T₂g, whatever B and C.
  it('d3 ⁴T₂g, d8 ³T₂g and d1 ²E_g lie at 10Dq above the ground state along the whole curve', () => {
    const dqs = [100, 700, 1300, 2100, 3000];
    for (const [n, label] of [
      [3, '4T2g'],
      [8, '3T2g'],
      [1, '2Eg'],
    ] as const) {
      const curve = cubicCurves(n, dqs, 918, 3850, 'oct').find((c) => c.label === label);
      expect(curve, `${label} of d${n}`).toBeDefined();
      dqs.forEach((dq, i) => {
        expect(curve?.energies[i]).toBeCloseTo(10 * dq, 6);
      });
    }
  });
});
