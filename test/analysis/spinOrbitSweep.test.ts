import { describe, expect, it } from 'vitest';
import { sweepSpinOrbit } from '../../src/analysis/spinOrbitSweep.js';
import { SWEEP_B } from '../../src/analysis/sweep.js';
import { InputError } from '../../src/core/errors.js';
import { solveSpinOrbit, spinOrbitEnergies, spinOrbitLevels } from '../../src/field/spinOrbitSolver.js';
import { expectClose } from '../helpers.js';

describe('spinOrbitEnergies', () => {
  it('spinOrbitEnergies names and places every level as spinOrbitLevels does (d³, d⁶, d⁷ at a generic point)', () => {
    for (const n of [3, 6, 7]) {
      const fast = spinOrbitEnergies(n, 1300, 800, 3400, 450);
      const full = spinOrbitLevels(n, 1300, 800, 3400, 450, 'oct', false);
      expect(fast?.map((l) => l.irrep)).toEqual(full.levels.map((l) => l.irrep));
      fast?.forEach((l, i) => {
        expectClose(l.energy, full.levels[i]?.energy ?? Number.NaN, 1e-11, 1e-7);
      });
    }
  });

  it('spinOrbitEnergies gives up (null) at ζ = 0, where the class pattern cannot tell the irreps apart', () => {
    expect(spinOrbitEnergies(3, 1300, 800, 3400, 0)).toBeNull();
  });
});

describe('sweepSpinOrbit', () => {
  it('sweepSpinOrbit(d³) follows every level from ⁴F₃/₂ of the free ion to ⁴A₂g at strong field', () => {
    const d = sweepSpinOrbit(3, { cOverB: 4.2, zetaOverB: 0.3, maxDeltaOverB: 30, points: 31 });
    expect(d.curves.length).toBe(spinOrbitLevels(3, 100, 1000, 4200, 300, 'oct', false).levels.length);
    for (const c of d.curves) expect(c.values.length).toBe(31);
    const ground = d.curves.find((c) => c.values[0] === 0);
    expect(ground?.freeIon).toBe('4F3/2');
    const strongGround = d.curves.find((c) => c.values[30] === 0);
    expect(strongGround?.strongField).toBe('4A2g');
    expect(strongGround?.irrep).toBe('Γ8');
  });

  it('sweepSpinOrbit refuses a negative ζ/B with InputError', () => {
    expect(() => sweepSpinOrbit(3, { zetaOverB: -0.1 })).toThrow(InputError);
  });
});

describe('sweepSpinOrbit: parents along the curves', () => {
  it('sweepSpinOrbit names each curve at the right edge by the parent that holds most of its weight there (d⁷ tetrahedral, d⁸)', () => {
    for (const [n, geometry] of [
      [7, 'tet'],
      [8, 'oct'],
    ] as const) {
      const d = sweepSpinOrbit(n, { geometry, cOverB: 4.5, zetaOverB: 0.4, maxDeltaOverB: 30, points: 20 });
      const B = SWEEP_B;
      const exact = solveSpinOrbit({ n, geometry, dq: 3 * B, B, C: 4.5 * B, zeta: 0.4 * B });
      let agree = 0;
      for (const c of d.curves) {
        const level = exact.levels.find((l) => l.label === c.label);
        if (c.parents.at(-1)?.parent === level?.parent) agree++;
      }
      // Away from near-degeneracies the adiabatic parent is the largest one; allow a few mixed levels.
      expect(agree / d.curves.length).toBeGreaterThan(0.9);
    }
  });
});
