/**
 * Where the ground state of dⁿ changes its spin as Dq grows (high-spin → low-spin): each change
 * found on a scan of the ground spin (eigenvalues alone) and then pinned down as a root of
 * E(lowest of one spin) − E(lowest of the other), with the full solver at every step.
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { type CubicResult, cubicLevels, groundSpin } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import { brentRoot } from '../numeric/roots.js';

/** One change of ground-state spin. */
export interface GroundCrossing {
  /** Dq at the change, cm⁻¹ (positive; Δ = 10Dq). */
  readonly dq: number;
  /** Δ/B = 10Dq/B at the change. */
  readonly deltaOverB: number;
  /** Ground-state label just below the change (smaller Dq), e.g. `5T2g`. */
  readonly from: string;
  /** Ground-state label just above it, e.g. `1A1g(I)`. */
  readonly to: string;
  /** Plain ²ˢ⁺¹Γ of {@link from}, without the parent term, e.g. `5T2g`. */
  readonly fromSymbol: string;
  /** Plain ²ˢ⁺¹Γ of {@link to}, e.g. `1A1g`. */
  readonly toSymbol: string;
  readonly fromS: number;
  readonly toS: number;
}

/** Input of {@link groundStateCrossings}. */
export interface CrossingInput {
  readonly n: number;
  /** @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  readonly B: number;
  readonly C: number;
  /** Largest Δ/B scanned. @default 60 */
  readonly maxDeltaOverB?: number;
  /** Scan points before refinement (a change between two points is never missed unless two changes fall between them). @default 240 */
  readonly scanPoints?: number;
  /** Absolute tolerance of the root in Dq, cm⁻¹. @default 1e-7 */
  readonly dqTolerance?: number;
}

/** Defaults of {@link CrossingInput}. */
export const CROSSING_DEFAULTS = { maxDeltaOverB: 60, scanPoints: 240, dqTolerance: 1e-7 } as const;

function lowestOfSpin(result: CubicResult, S: number): number {
  const level = result.levels.find((l) => l.S === S);
  return level ? level.energy : Number.POSITIVE_INFINITY;
}

/**
 * Every change of ground-state spin for 0 < Δ/B ≤ maxDeltaOverB, in order of Dq.
 * Empty for dⁿ without one in that range (d¹–d³, d⁸, d⁹; and in Td for real B).
 */
export function groundStateCrossings(input: CrossingInput): GroundCrossing[] {
  const { n, geometry = DEFAULT_GEOMETRY, B, C } = input;
  const maxDeltaOverB = input.maxDeltaOverB ?? CROSSING_DEFAULTS.maxDeltaOverB;
  const scanPoints = input.scanPoints ?? CROSSING_DEFAULTS.scanPoints;
  const dqTolerance = input.dqTolerance ?? CROSSING_DEFAULTS.dqTolerance;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(Number.isFinite(B) && B > 0, `Racah B = ${B}: expected a positive number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  ensure(maxDeltaOverB > 0, `largest Δ/B ${maxDeltaOverB}: expected a positive number`);
  ensure(
    Number.isInteger(scanPoints) && scanPoints >= 2,
    `scan points ${scanPoints}: expected a whole number ≥ 2`,
  );
  const sign = geometry === 'oct' ? 1 : -1;
  // Energies and labels are all the search needs: eigenvalues only.
  const solve = (dq: number) => cubicLevels(n, sign * dq, B, C, geometry, false);
  const maxDq = (maxDeltaOverB * B) / 10;
  const out: GroundCrossing[] = [];
  let prevDq = 0;
  let prevS = groundSpin(n, 0, B, C);
  for (let i = 1; i <= scanPoints; i++) {
    const dq = (maxDq * i) / scanPoints;
    // The scan watches the ground spin only (eigenvalues alone); the full solver labels the ends.
    const curS = groundSpin(n, sign * dq, B, C);
    if (curS !== prevS) {
      const prev = solve(prevDq);
      const cur = solve(dq);
      const sLow = prev.ground.S;
      const sHigh = cur.ground.S;
      const root = brentRoot(
        (x) => {
          const r = solve(x);
          return lowestOfSpin(r, sLow) - lowestOfSpin(r, sHigh);
        },
        prevDq,
        dq,
        { xTolerance: dqTolerance },
      );
      out.push({
        dq: root,
        deltaOverB: (10 * root) / B,
        from: prev.ground.label,
        to: cur.ground.label,
        fromSymbol: prev.ground.symbol,
        toSymbol: cur.ground.symbol,
        fromS: sLow,
        toS: sHigh,
      });
    }
    prevDq = dq;
    prevS = curS;
  }
  return out;
}
