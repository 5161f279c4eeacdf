/**
 * Where the ground state of dⁿ changes its spin as Dq grows (high-spin → low-spin): each change
 * found on a scan of the ground spin (eigenvalues alone) and then pinned down as a root of
 * E(lowest of one spin) − E(lowest of the other), from the exact eigenvalues of the symmetry blocks
 * at every step (the full solver labels the two ground states).
 *
 * The scan gives the ground spin at every point of its grid, but solves only the two ends, and
 * between two solved points, where it cannot prove the spin unchanged, the midpoint, then each half
 * again: the lowest level of each spin is a concave function of Dq (the least eigenvalue of a
 * matrix affine in Dq), so it lies above its chord and below the extended chords of its
 * neighbouring intervals (or the steepest slope any level has, where there is no neighbour); where
 * the ground spin's upper bound stays below every other spin's lower bound, no grid point between
 * has another ground spin. The result is that of the full scan; a d⁶ scan of 240 points solves 11.
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { cubicLevels, lowestBySpin } from '../field/cubic.js';
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
  const spins = groundSpins(n, sign, B, C, maxDq, scanPoints);
  const out: GroundCrossing[] = [];
  let prevDq = 0;
  let prevS = spins[0];
  for (let i = 1; i <= scanPoints; i++) {
    const dq = (maxDq * i) / scanPoints;
    // The scan watches the ground spin only; the full solver labels the ends.
    const curS = spins[i];
    if (curS !== prevS) {
      const prev = solve(prevDq);
      const cur = solve(dq);
      const sLow = prev.ground.S;
      const sHigh = cur.ground.S;
      // The root needs the lowest level of two spins only: eigenvalues of the blocks, no labels.
      const low = new Float64Array(SPIN_SLOTS);
      const root = brentRoot(
        (x) => {
          lowestBySpin(n, sign * x, B, C, low, [sLow, sHigh]);
          return (low[2 * sLow] as number) - (low[2 * sHigh] as number);
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

/** Spins 0…5/2 in `lowestBySpin`'s table (index 2S). */
const SPIN_SLOTS = 6;

/**
 * The ground spin at Dq = maxDq·i/points, i = 0…points (the same numbers as {@link groundSpin} at
 * each point), solving the two ends, and between two solved points, where the bounds leave a
 * doubt, the midpoint, then each half again. `sign` is +1 in an octahedral field, −1 in a
 * tetrahedral one.
 */
export function groundSpins(
  n: number,
  sign: number,
  B: number,
  C: number,
  maxDq: number,
  points: number,
): number[] {
  const dqAt = (i: number) => (maxDq * i) / points;
  const spins = new Array<number>(points + 1);
  const lows = new Map<number, Float64Array>();
  const solveAt = (i: number) => {
    const low = new Float64Array(SPIN_SLOTS);
    const S = lowestBySpin(n, sign * dqAt(i), B, C, low);
    lows.set(i, low);
    spins[i] = S;
  };
  solveAt(0);
  solveAt(points);
  // The largest |∂E/∂Dq| of any level: the e-set count b = 0…min(n, 4) gives −4(n − b) + 6b.
  const steepest = Math.max(4 * n, 6 * Math.min(n, 4) - 4 * (n - Math.min(n, 4)));
  const bounds: Bounds = { lows, dqAt, steepest };
  // Settles the grid points strictly between a and b; left and right are solved points outside.
  const settle = (left: number | undefined, a: number, b: number, right: number | undefined): void => {
    if (b - a < 2) return;
    const S = spins[a] as number;
    if (S === spins[b] && unchangedBetween(S, [left, a, b, right], bounds)) {
      for (let i = a + 1; i < b; i++) spins[i] = S;
      return;
    }
    const mid = Math.floor((a + b) / 2);
    solveAt(mid);
    settle(left, a, mid, b);
    settle(a, mid, b, right);
  };
  settle(undefined, 0, points, undefined);
  return spins as number[];
}

/** What the bounds of {@link unchangedBetween} read: the solved points' lowest levels by spin. */
interface Bounds {
  readonly lows: ReadonlyMap<number, Float64Array>;
  readonly dqAt: (i: number) => number;
  readonly steepest: number;
}

/**
 * Whether the lowest level of spin S stays below every other spin's lowest level between solved
 * grid points a and b (with a margin for rounding): S's upper bound there is the lesser of its
 * chords extended from the solved points `left` and `right` outside (or of the steepest slope
 * where there is none), the others' lower bound their chord; both piecewise linear, so compared
 * at the ends and at the upper bound's corner.
 */
function unchangedBetween(
  S: number,
  [left, a, b, right]: readonly [number | undefined, number, number, number | undefined],
  { lows, dqAt, steepest }: Bounds,
): boolean {
  const f = (i: number, slot: number) => (lows.get(i) as Float64Array)[slot] as number;
  const own = 2 * S;
  const xa = dqAt(a);
  const xb = dqAt(b);
  const fa = f(a, own);
  const fb = f(b, own);
  // Concave: slope right of a ≤ the chord slope left of a; slope left of b ≥ the chord slope right of b.
  const slopeA = left !== undefined ? (fa - f(left, own)) / (xa - dqAt(left)) : steepest;
  const slopeB = right !== undefined ? (f(right, own) - fb) / (dqAt(right) - xb) : -steepest;
  const upper = (t: number) => Math.min(fa + slopeA * (t - xa), fb + slopeB * (t - xb));
  const corner = slopeA !== slopeB ? (fb - fa + slopeA * xa - slopeB * xb) / (slopeA - slopeB) : xa;
  const at = [xa, xb, ...(corner > xa && corner < xb ? [corner] : [])];
  const margin = 1e-9 * (Math.abs(fa) + Math.abs(fb) + 1);
  for (let slot = 0; slot < SPIN_SLOTS; slot++) {
    if (slot === own) continue;
    const ga = f(a, slot);
    const gb = f(b, slot);
    if (ga === Number.POSITIVE_INFINITY) continue;
    const lower = (t: number) => ga + ((gb - ga) * (t - xa)) / (xb - xa);
    if (at.some((t) => lower(t) - upper(t) <= margin)) return false;
  }
  return true;
}
