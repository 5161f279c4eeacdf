/**
 * A band fit with spin–orbit coupling: Dq and B (C at a fixed C/B, or free) and ζ — held at a
 * given value or fitted — refined by least squares so that the calculated bands meet the
 * observed ones. A band assigned to a cubic level (`3T1g(F)`) is calculated at the centroid of
 * that level's spin–orbit components: Σ dᵢwᵢEᵢ / Σ dᵢwᵢ over all levels i, with dᵢ the degeneracy
 * and wᵢ the level's weight of that cubic parent (the first moment of the split band, common
 * practice, no source). A band assigned to one spin–orbit level (`Γ8(3)`, a resolved component)
 * is calculated at that level's energy; such bands are what can fix ζ. A resolved component that
 * holds several unresolved spin–orbit levels (`components`) is calculated at their centroid
 * weighted by degeneracy × weight of the cubic level it belongs to (the part of each that carries
 * the spin-allowed parent's intensity; common practice, no source).
 */
import { inverse, Matrix } from 'ml-matrix';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import type { Geometry } from '../field/labels.js';
import { checkZeta, MAX_ZETA } from '../field/spinOrbit.js';
import { type SpinOrbitResult, solveSpinOrbit } from '../field/spinOrbitSolver.js';
import { levenbergMarquardt } from '../numeric/leastSquares.js';

/** One observed band and the level it is assigned to. Energies in cm⁻¹. */
export interface AssignedBand {
  readonly energy: number;
  /** Its uncertainty (weights the fit as 1/σ). @default 1 */
  readonly sigma?: number;
  /** A cubic level label such as `3T1g(F)`, or a spin–orbit level label such as `Γ8(3)`. */
  readonly level: string;
  /**
   * The spin–orbit levels (e.g. `Γ1(1)`, `Γ4(2)`) of the cubic `level` that make up this
   * resolved component; the band is at their centroid weighted by degeneracy × weight of `level`.
   * @default the whole level (its centroid), or the one spin–orbit level `level` names
   */
  readonly components?: readonly string[];
}

/** Input of {@link refineWithSpinOrbit}. */
export interface SpinOrbitRefineInput {
  readonly n: number;
  /** @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  /** Starting values, e.g. a spin–orbit-free fit's result. */
  readonly start: { readonly dq: number; readonly B: number; readonly C: number };
  /** ζ, cm⁻¹: the fixed value, or the start when {@link fitZeta}. */
  readonly zeta: number;
  /** Fit ζ too (needs bands that resolve spin–orbit components). @default false */
  readonly fitZeta?: boolean;
  /** Fit C too; otherwise C/B stays at the start's ratio. @default false */
  readonly fitC?: boolean;
  /** Hold B at the start's value (one band, or d¹ and d⁹ where B plays no part). @default false */
  readonly holdB?: boolean;
  readonly bands: readonly AssignedBand[];
}

/** One band after the fit. */
export interface RefinedBand {
  readonly level: string;
  /** The spin–orbit levels the band was calculated from, when it is a resolved component. */
  readonly components?: readonly string[];
  readonly observed: number;
  readonly calculated: number;
}

/** The result of {@link refineWithSpinOrbit}. */
export interface SpinOrbitRefinement {
  readonly dq: number;
  readonly B: number;
  readonly C: number;
  readonly zeta: number;
  readonly fitZeta: boolean;
  /** Standard errors from the Jacobian and the residual scatter (null where the bands do not outnumber the parameters). */
  readonly errors: {
    readonly dq: number;
    readonly B: number | null;
    readonly C: number | null;
    readonly zeta: number | null;
  } | null;
  /** Root-mean-square residual, cm⁻¹. */
  readonly rms: number;
  readonly bands: readonly RefinedBand[];
  readonly converged: boolean;
  readonly reason: string;
  /** The levels at the fitted parameters. */
  readonly levels: SpinOrbitResult;
}

/** Calculated energy of a band's level at one solution. @throws InputError for a label that names no level. */
export function bandEnergy(result: SpinOrbitResult, level: string): number {
  const direct = result.levels.find((l) => l.label === level);
  if (direct) return direct.energy;
  let weighted = 0;
  let total = 0;
  for (const l of result.levels) {
    const w = l.parentage.find((p) => p.state === level)?.weight ?? 0;
    weighted += l.degeneracy * w * l.energy;
    total += l.degeneracy * w;
  }
  ensure(
    total > 1e-6,
    `band level "${level}": expected a cubic level such as 3T1g(F) or a spin–orbit level such as Γ8(3) of this ion`,
  );
  return weighted / total;
}

/**
 * Calculated energy of a band: a resolved component at the centroid of its spin–orbit levels
 * (degeneracy × weight of the cubic parent), else as {@link bandEnergy}.
 * @throws InputError for a label that names no level.
 */
export function assignedBandEnergy(result: SpinOrbitResult, band: Omit<AssignedBand, 'energy'>): number {
  if (!band.components || band.components.length === 0) return bandEnergy(result, band.level);
  let weighted = 0;
  let total = 0;
  let plain = 0;
  for (const label of band.components) {
    const l = result.levels.find((x) => x.label === label);
    ensure(
      l !== undefined,
      `band component "${label}": expected a spin–orbit level such as Γ8(3) of this ion`,
    );
    // A small floor keeps a component defined where its parent weight vanishes along the fit.
    const w = l.degeneracy * Math.max(l.parentage.find((p) => p.state === band.level)?.weight ?? 0, 1e-3);
    weighted += w * l.energy;
    total += w;
    plain += l.energy;
  }
  return total > 0 ? weighted / total : plain / band.components.length;
}

/**
 * Refines Dq, B (and C, ζ where asked) against assigned bands with spin–orbit coupling.
 * @throws InputError for bad parameters, a bad ζ, too few bands or an unknown level label.
 */
export function refineWithSpinOrbit(input: SpinOrbitRefineInput): SpinOrbitRefinement {
  const { n, geometry = DEFAULT_GEOMETRY, start, bands } = input;
  const fitZeta = input.fitZeta ?? false;
  const holdB = input.holdB ?? false;
  const fitC = (input.fitC ?? false) && !holdB;
  checkZeta(input.zeta);
  const count = (holdB ? 1 : 2) + (fitC ? 1 : 0) + (fitZeta ? 1 : 0);
  ensure(bands.length >= count, `${bands.length} bands: expected at least ${count} for the parameters asked`);
  for (const b of bands) {
    ensure(
      Number.isFinite(b.energy) && b.energy > 0,
      `band energy ${b.energy}: expected a positive number of cm⁻¹`,
    );
    ensure(
      b.sigma === undefined || (Number.isFinite(b.sigma) && b.sigma > 0),
      `band σ ${b.sigma}: expected a positive number`,
    );
  }
  const cOverB = start.B > 0 ? start.C / start.B : 0;
  const unpack = (p: readonly number[]) => {
    const dq = p[0] ?? 0;
    const B = holdB ? start.B : (p[1] ?? 0);
    const C = fitC ? (p[2] ?? 0) : cOverB * B;
    const zeta = fitZeta ? (p[count - 1] ?? 0) : input.zeta;
    return { dq, B, C, zeta };
  };
  const solve = (p: readonly number[]) => solveSpinOrbit({ n, geometry, ...unpack(p) });
  const residuals = (p: readonly number[]) => {
    const r = solve(p);
    return bands.map((b) => (assignedBandEnergy(r, b) - b.energy) / (b.sigma ?? 1));
  };
  const startVector = [
    start.dq,
    ...(holdB ? [] : [start.B]),
    ...(fitC ? [start.C] : []),
    ...(fitZeta ? [input.zeta] : []),
  ];
  const fit = levenbergMarquardt(
    {
      residuals,
      start: startVector,
      lower: startVector.map(() => 0),
      upper: [1e5, ...(holdB ? [] : [1e4]), ...(fitC ? [5e4] : []), ...(fitZeta ? [MAX_ZETA] : [])],
    },
    { maxIterations: 60 },
  );
  const best = unpack(fit.parameters);
  const levels = solve(fit.parameters);
  const calculated = bands.map((b) => ({
    level: b.level,
    ...(b.components ? { components: b.components } : {}),
    observed: b.energy,
    calculated: assignedBandEnergy(levels, b),
  }));
  const rms = Math.sqrt(calculated.reduce((s, b) => s + (b.calculated - b.observed) ** 2, 0) / bands.length);
  return {
    ...best,
    fitZeta,
    errors: standardErrors(fit.jacobian, fit.sumOfSquares, bands.length, { holdB, fitC, fitZeta }),
    rms,
    bands: calculated,
    converged: fit.converged,
    reason: fit.reason,
    levels,
  };
}

/** σ of each parameter from s²(JᵀJ)⁻¹, s² = Σr²/(m − p); null with no degrees of freedom or a singular JᵀJ. */
function standardErrors(
  jacobian: number[][],
  sumOfSquares: number,
  m: number,
  held: { holdB: boolean; fitC: boolean; fitZeta: boolean },
): SpinOrbitRefinement['errors'] {
  const p = jacobian[0]?.length ?? 0;
  if (m <= p) return null;
  const J = new Matrix(jacobian);
  let covariance: Matrix;
  try {
    covariance = inverse(J.transpose().mmul(J)).mul(sumOfSquares / (m - p));
  } catch {
    return null;
  }
  const sd = (i: number) => Math.sqrt(Math.max(0, covariance.get(i, i)));
  return {
    dq: sd(0),
    B: held.holdB ? null : sd(1),
    C: held.fitC ? sd(2) : null,
    zeta: held.fitZeta ? sd(p - 1) : null,
  };
}
