import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import { bandEnergy, refineWithSpinOrbit } from '../../src/fit/spinOrbitRefinement.js';
import { expectClose } from '../helpers.js';

describe('refineWithSpinOrbit', () => {
  it('bandEnergy of a cubic level is its unsplit energy at ζ → 0 (the centroid of its components)', () => {
    const r = solveSpinOrbit({ n: 8, dq: 850, B: 900, C: 3960, zeta: 1e-3 });
    const t2 = bandEnergy(r, '3T2g');
    expectClose(t2, 8500, 0, 0.01);
  });

  it('refineWithSpinOrbit recovers Dq and B with ζ held, from band centroids computed at known values (round trip)', () => {
    const truth = solveSpinOrbit({ n: 8, dq: 850, B: 900, C: 3960, zeta: 600 });
    const levels = ['3T2g', '3T1g(F)', '3T1g(P)'];
    const bands = levels.map((level) => ({ level, energy: bandEnergy(truth, level) }));
    const fit = refineWithSpinOrbit({ n: 8, start: { dq: 800, B: 850, C: 3740 }, zeta: 600, bands });
    expectClose(fit.dq, 850, 1e-6);
    expectClose(fit.B, 900, 1e-6);
    expect(fit.rms).toBeLessThan(1e-3);
  });

  it('refineWithSpinOrbit fits ζ with Dq and B from resolved spin–orbit components of ³T₂g plus the ³T₁g(P) band (round trip, d⁸)', () => {
    const truth = solveSpinOrbit({ n: 8, dq: 850, B: 900, C: 3960, zeta: 600 });
    const resolved = truth.levels.slice(1, 5).map((l) => l.label);
    const bands = [...resolved, '3T1g(P)'].map((level) => ({ level, energy: bandEnergy(truth, level) }));
    const fit = refineWithSpinOrbit({
      n: 8,
      start: { dq: 820, B: 870, C: 3828 },
      zeta: 450,
      fitZeta: true,
      bands,
    });
    expectClose(fit.zeta, 600, 1e-5);
    expectClose(fit.dq, 850, 1e-6);
    expectClose(fit.B, 900, 1e-6);
  });

  it('refineWithSpinOrbit refuses an unknown level label with InputError', () => {
    expect(() =>
      refineWithSpinOrbit({
        n: 8,
        start: { dq: 800, B: 850, C: 3740 },
        zeta: 600,
        bands: [
          { level: '4T2g', energy: 8500 },
          { level: '3T2g', energy: 8600 },
        ],
      }),
    ).toThrow(InputError);
  });
});
