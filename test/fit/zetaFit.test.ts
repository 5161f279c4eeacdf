import { describe, expect, it } from 'vitest';
import { findIon } from '../../src/core/ions.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import { fitBands } from '../../src/fit/fitBands.js';
import { bandEnergy, refineWithSpinOrbit } from '../../src/fit/spinOrbitRefinement.js';
import { assignComponents, COMPONENT_WEIGHT, refineFitWithZeta } from '../../src/fit/zetaFit.js';
import { expectClose } from '../helpers.js';

/** The best solution of a fit of Ni²⁺ bands (free-ion B and C/B). */
function nickelBest(energies: readonly number[]) {
  const fit = fitBands({ n: 8, bands: energies.map((energy) => ({ energy })), freeIon: findIon('Ni2+') });
  const best = fit.solutions[0];
  if (!best) throw new Error('no solution');
  return { fit, best };
}

describe('refineFitWithZeta', () => {
  it('refineFitWithZeta recovers Dq, B and ζ of tetrahedral d⁷ from the ⁴T₁(F) centroid and three resolved ⁴T₁(P) components computed at known values (round trip)', () => {
    const truth = solveSpinOrbit({ n: 7, geometry: 'tet', dq: 400, B: 750, C: 3450, zeta: 450 });
    const multiplet = truth.levels.filter(
      (l) => (l.parentage.find((p) => p.state === '4T1(P)')?.weight ?? 0) >= COMPONENT_WEIGHT,
    );
    const picked = [multiplet[0], multiplet[2], multiplet.at(-1)].map((l) => l?.energy ?? 0);
    const bands = [bandEnergy(truth, '4T1(F)'), ...picked].map((energy) => ({ energy }));
    const fit = fitBands({ n: 7, geometry: 'tet', bands, cOverB: 4.6 });
    const best = fit.solutions[0];
    if (!best) throw new Error('no solution');
    const z = refineFitWithZeta(fit, best, { zeta: 350, fitZeta: true });
    expect(z.zetaFitted).toBe(true);
    expectClose(z.refinement.zeta, 450, 1e-5);
    expectClose(z.refinement.dq, 400, 1e-6);
    expectClose(z.refinement.B, 750, 1e-6);
    expect(z.bands.filter((b) => b.components).map((b) => b.components?.[0])).toEqual(
      [multiplet[0], multiplet[2], multiplet.at(-1)].map((l) => l?.label),
    );
  });

  it('refineFitWithZeta holds ζ and says why when no band is split into resolved components', () => {
    const { fit, best } = nickelBest([8500, 13800, 25300]);
    const z = refineFitWithZeta(fit, best, { zeta: 649, fitZeta: true });
    expect(z.zetaAsked).toBe(true);
    expect(z.zetaFitted).toBe(false);
    expect(z.refinement.zeta).toBe(649);
    expect(z.warnings[0]).toMatch(/^ζ held at 649 cm⁻¹: no band is split into resolved components/);
  });

  it('refineFitWithZeta says ζ has no standard error when the components only match the parameters (Ni²⁺: ν₁ and a pair, Dq, B, ζ)', () => {
    const { fit, best } = nickelBest([8500, 13800, 15400]);
    const z = refineFitWithZeta(fit, best, { zeta: 600, fitZeta: true });
    expect(z.bands).toHaveLength(3);
    expect(z.refinement.errors).toBeNull();
    expect(z.warnings.join(' ')).toMatch(/as many bands and components as parameters \(3\)/);
  });

  it('assignComponents picks, in energy order, the spin–orbit levels of the cubic level closest to the components', () => {
    const levels = solveSpinOrbit({ n: 8, dq: 850, B: 900, C: 3960, zeta: 600 });
    const of = (label: string) => levels.levels.find((l) => l.label === label)?.energy ?? 0;
    expect(assignComponents(levels, '3T1g(F)', [of('Γ1(1)'), of('Γ3(3)')])).toEqual(['Γ1(1)', 'Γ3(3)']);
    expect(assignComponents(levels, '3A2g', [1, 2])).toBeNull();
  });
});

describe('ζ of [Ni(H₂O)₆]²⁺ from the ³T₁g(F)/¹Eg pair', () => {
  // Bands of the hexaaqua ion, cm⁻¹: ν₁ 8500 (³T₂g), the double band 13 800 / 15 400
  // (³T₁g(F) and ¹Eg mixed by spin–orbit coupling near their crossing, both components of E
  // symmetry, Γ3), ν₃ 25 300 (³T₁g(P)) — A. B. P. Lever, Inorganic Electronic Spectroscopy,
  // 2nd ed., 1984 (values from memory). The reduction of ζ in such complexes to roughly
  // 0.7–1.0 of the free-ion value is likewise from memory (common practice).
  const bands = [
    { energy: 8500, level: '3T2g' },
    { energy: 13800, level: '3T1g(F)', components: ['Γ3(2)'] },
    { energy: 15400, level: '3T1g(F)', components: ['Γ3(3)'] },
    { energy: 25300, level: '3T1g(P)' },
  ];
  const zetaFree = findIon('Ni2+')?.zeta ?? 0;

  it('refineWithSpinOrbit with C fitted puts ζ/ζ(free ion) in 0.7–1.0 and C/B in the usual 3.5–5 (from memory)', () => {
    const fit = refineWithSpinOrbit({
      n: 8,
      start: { dq: 870, B: 910, C: 4280 },
      zeta: zetaFree,
      fitZeta: true,
      fitC: true,
      bands,
    });
    expect(fit.zeta / zetaFree).toBeGreaterThan(0.7);
    expect(fit.zeta / zetaFree).toBeLessThan(1.0);
    expect(fit.C / fit.B).toBeGreaterThan(3.5);
    expect(fit.C / fit.B).toBeLessThan(5);
    expect(fit.rms).toBeLessThan(1);
  });

  it('refineWithSpinOrbit at C/B = 4.2 gives ζ within 0.7–1.0 of the free ion with a standard error below a fifth of it', () => {
    const fit = refineWithSpinOrbit({
      n: 8,
      start: { dq: 870, B: 910, C: 3822 },
      zeta: zetaFree,
      fitZeta: true,
      bands,
    });
    expect(fit.zeta / zetaFree).toBeGreaterThan(0.7);
    expect(fit.zeta / zetaFree).toBeLessThan(1.0);
    expect(fit.errors?.zeta ?? Number.POSITIVE_INFINITY).toBeLessThan(0.2 * fit.zeta);
  });
});
