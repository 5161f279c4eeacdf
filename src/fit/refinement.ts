import { type FieldParameters, levelKeys, transitions } from '../analysis/bandModel.js';
import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import {
  type LeastSquaresOptions,
  type LeastSquaresResult,
  levenbergMarquardt,
  STOP_REASON_TEXT,
} from '../numeric/leastSquares.js';
import type { AssignmentCandidate } from './assignment.js';
import { bandPicture } from './bandPicture.js';
import { type ParameterName, standardErrors } from './fitErrors.js';
import { cachedSolver, energyJacobian, fieldOf, parameterSet, vectorOf } from './fitModel.js';
import { scoreSolution } from './fitScore.js';
import type { FitBand, FitInput, FitSolution } from './fitTypes.js';
import { solutionWarnings } from './fitWarnings.js';
import type { RatioScan } from './ratioScan.js';

/**
 * Refinement of one assignment: Levenberg–Marquardt on the exact solver from the assignment's
 * starting point, then the solution it ends at — parameters, residuals, standard errors, the
 * predicted levels and the solution's warnings.
 */

/** Lower bound of every parameter, cm⁻¹ (positivity). */
const LOWER_BOUND = 1e-3;

/**
 * Upper bounds of the parameters inside the optimiser, cm⁻¹: far beyond any 3d complex (10Dq
 * stays below about 45 000 cm⁻¹ and free-ion B below about 1300 cm⁻¹; common practice, no
 * source), so a genuine optimum never meets them; a trial step beyond is projected back, and an
 * assignment whose fit runs to a bound has no genuine minimum.
 */
export const PARAMETER_BOUNDS = { dq: 8000, B: 3000, C: 15000 } as const;

/**
 * β assumed to place the levels when the bands do not fix B (one band at a multiple of Dq): a
 * mid-range value for 3d complexes (common practice, no source); nothing reported depends on it
 * but the predicted levels that do depend on B.
 */
export const NOMINAL_BETA = 0.8;

/** B assumed for the same purpose without a free-ion B, cm⁻¹ (common practice, no source). */
export const NOMINAL_B = 800;

/** What every refinement of one fit shares. */
export interface RefineContext {
  readonly n: number;
  readonly geometry: Geometry;
  readonly bands: readonly FitBand[];
  readonly sigmas: readonly number[];
  /** Whether the band uncertainties were given (else `sigmas` hold the default precision). */
  readonly given: boolean;
  readonly cOverB: number;
  readonly fitC: boolean;
  readonly scan: RatioScan;
  readonly freeB: number | null;
  /** B held fixed (only Dq is fitted), when given. */
  readonly fixedB?: number;
  /** Whether C is fitted because the bands can fix it: then a C none depends on is held silently. */
  readonly cAuto?: boolean;
  /** Sharp bands, matched to predicted levels after the fit. */
  readonly sharp: readonly FitBand[];
  /** The element (e.g. `Fe`), for advice that holds for one element only; null when unknown. */
  readonly element: string | null;
  readonly start?: FitInput['start'];
  readonly leastSquares?: LeastSquaresOptions;
}

/** A refined assignment: its solution (unranked) and what the ranking needs besides. */
export interface Refined {
  readonly solution: Omit<FitSolution, 'rank'>;
  /** The candidate refined. */
  readonly candidate: AssignmentCandidate;
  readonly keys: readonly string[];
  /** Bands assigned to spin-forbidden transitions. */
  readonly spinForbidden: number;
}

type Model = (p: readonly number[]) => ReturnType<typeof transitions>;

/**
 * The parameters the assigned bands can fix: a parameter none of them depends on cannot be
 * fitted, so C is then held at the starting C/B (`cHeld`); without Dq or B the assignment is
 * not usable (undefined).
 */
function freeParameters(
  ctx: RefineContext,
  startField: FieldParameters,
  modelFor: (names: readonly ParameterName[], heldB: number | undefined) => Model,
): { names: ParameterName[]; cHeld: boolean; heldB: number | undefined; scale: number } | undefined {
  let names = parameterSet(ctx.n, ctx.fixedB, ctx.fitC);
  const p0 = vectorOf(names, startField);
  const t0 = modelFor(names, ctx.fixedB)(p0);
  const J0 = energyJacobian(names, p0, t0, modelFor(names, ctx.fixedB));
  const scale = Math.max(...t0.energies.map(Math.abs));
  const determined = names.map((_, j) =>
    J0.some((row) => Math.abs((row[j] ?? 0) * (p0[j] ?? 0)) > 1e-9 * scale),
  );
  if (!determined[0]) return undefined;
  const cHeld = ctx.fitC && names.length === 3 && determined[2] === false;
  if (cHeld) names = parameterSet(ctx.n, ctx.fixedB, false);
  let heldB = ctx.fixedB;
  if (names.length >= 2 && !determined[1]) {
    // No assigned band depends on B (one band at a multiple of Dq): Dq alone is fitted, and B
    // is held at a nominal value only to place the other levels.
    heldB = ctx.freeB === null ? NOMINAL_B : NOMINAL_BETA * ctx.freeB;
    names = ['dq'];
  }
  // Fewer bands than parameters: the assignment cannot fix them.
  if (t0.energies.length < names.length) return undefined;
  return { names, cHeld, heldB, scale };
}

/** Levenberg–Marquardt on the weighted residuals, within the parameter bounds. */
function leastSquaresFit(
  ctx: RefineContext,
  names: readonly ParameterName[],
  start: readonly number[],
  model: Model,
): LeastSquaresResult & { bound: number[] } {
  const { sigmas } = ctx;
  const observed = ctx.bands.map((b) => b.energy);
  const bound: number[] = names.map((name) => PARAMETER_BOUNDS[name]);
  // With C held at C/B × B, B must stay where C does.
  if (names.length === 2) bound[1] = Math.min(PARAMETER_BOUNDS.B, PARAMETER_BOUNDS.C / ctx.cOverB);
  const weigh = (rows: number[][]) => rows.map((row, i) => row.map((x) => x / (sigmas[i] ?? 1)));
  const scaleSq = observed.reduce((s, x, i) => s + (x / (sigmas[i] ?? 1)) ** 2, 0);
  const fit = levenbergMarquardt(
    {
      start: [...start],
      lower: names.map(() => LOWER_BOUND),
      upper: bound,
      residuals: (p) => model(p).energies.map((x, i) => (x - (observed[i] ?? 0)) / (sigmas[i] ?? 1)),
      jacobian: (p) => weigh(energyJacobian(names, p, model(p), model)),
    },
    { exactSumOfSquares: 1e-22 * scaleSq, ...ctx.leastSquares },
  );
  return { ...fit, bound };
}

/**
 * Refines one assignment. Undefined when it gives no usable solution: a parameter not fixed by
 * the bands, one driven to its bound, or an optimum where another level than the assumed ground
 * state lies lowest.
 */
export function refine(ctx: RefineContext, candidate: AssignmentCandidate): Refined | undefined {
  const startField: FieldParameters = ctx.start
    ? {
        dq: ctx.start.dq,
        B: ctx.start.B ?? 0,
        C: ctx.start.C ?? ctx.cOverB * (ctx.start.B ?? 0),
      }
    : candidate.start;
  const solve = cachedSolver(ctx.n, ctx.geometry);
  const modelFor = (names: readonly ParameterName[], heldB: number | undefined) => (p: readonly number[]) =>
    transitions(solve(fieldOf(names, p, ctx.cOverB, heldB)), candidate.groundKey, candidate.keys);

  const free = freeParameters(ctx, startField, modelFor);
  if (!free) return undefined;
  const { names, cHeld, heldB, scale } = free;
  const model = modelFor(names, heldB);
  const fit = leastSquaresFit(ctx, names, vectorOf(names, startField), model);
  const p = fit.parameters;
  // A parameter driven to a bound (B → 0, say) marks no genuine minimum of this assignment.
  if (
    p.some(
      (x, j) => x <= LOWER_BOUND * (1 + 1e-9) || x >= (fit.bound[j] ?? Number.POSITIVE_INFINITY) * (1 - 1e-9),
    )
  )
    return undefined;
  const levels = solve(fieldOf(names, p, ctx.cOverB, heldB));
  const keys = levelKeys(levels);
  // The assignment was made from one ground state; an optimum where another level lies lower
  // belongs to a different assignment (searched separately).
  const groundEnergy = levels.levels[keys.indexOf(candidate.groundKey)]?.energy ?? Number.POSITIVE_INFINITY;
  if (groundEnergy > 1e-9 * Math.max(1, scale)) return undefined;
  return solutionOf(ctx, candidate, { names, cHeld, heldB, fit, levels, calculated: model(p).energies });
}

/** What a finished least-squares run leaves for {@link solutionOf}. */
interface Optimum {
  readonly names: readonly ParameterName[];
  readonly cHeld: boolean;
  /** B held (given, or nominal where the bands do not fix it), else undefined. */
  readonly heldB: number | undefined;
  readonly fit: LeastSquaresResult;
  readonly levels: CubicResult;
  readonly calculated: readonly number[];
}

/** The solution at an optimum: parameters, residuals, errors, levels and warnings. */
function solutionOf(ctx: RefineContext, candidate: AssignmentCandidate, optimum: Optimum): Refined {
  const { names, cHeld, heldB, fit, levels, calculated } = optimum;
  const { bands, sigmas } = ctx;
  const observed = bands.map((b) => b.energy);
  const field = fieldOf(names, fit.parameters, ctx.cOverB, heldB);
  const differences = observed.map((o, i) => o - (calculated[i] ?? 0));
  const m = bands.length;
  const dof = m - names.length;
  const chiSquare = differences.reduce((s, d, i) => s + (d / (sigmas[i] ?? 1)) ** 2, 0);
  const rms = Math.sqrt(differences.reduce((s, d) => s + d * d, 0) / m);

  // d¹ and d⁹ have no B at all; with B held, Δ/B and β follow from the value given; with B
  // not fixed by the bands there are none.
  const single = names.length === 1 && heldB === undefined;
  const bDetermined = single || heldB === undefined || ctx.fixedB !== undefined;
  const { dq, B, C } = field;
  const cFitted = names.length === 3;
  const deltaOverB = single || !bDetermined ? null : (10 * dq) / B;
  const beta = single || !bDetermined || ctx.freeB === null ? null : B / ctx.freeB;
  // The LM's Jacobian at the optimum is exact in Dq and B (see energyJacobian).
  const estimate = standardErrors({
    jacobian: fit.jacobian,
    chiSquare,
    parameters: names,
    field,
    uncertaintiesGiven: ctx.given,
    freeIonB: ctx.freeB,
  });
  const { assignments, predicted, sharp } = bandPicture(levels, bands, candidate.keys, calculated, ctx.sharp);
  const weightedRms = Math.sqrt(chiSquare / m);
  const score = scoreSolution({
    geometry: ctx.geometry,
    levels,
    bands,
    assignments,
    predicted,
    sharp,
    sharpCount: ctx.sharp.length,
    weightedRms,
    beta,
  });
  const reasonText = STOP_REASON_TEXT[fit.reason];
  const warnings = solutionWarnings({
    result: levels,
    observed,
    assigned: assignments,
    beta,
    deltaOverB,
    scanRange: [ctx.scan.minDeltaOverB, ctx.scan.maxDeltaOverB],
    cFitted,
    cHeld: cHeld && !ctx.cAuto,
    bDetermined,
    element: ctx.element,
    rms,
    reducedChiSquare: ctx.given && dof > 0 ? chiSquare / dof : null,
    converged: fit.converged,
    reasonText,
  });
  return {
    candidate,
    keys: candidate.keys,
    spinForbidden: assignments.filter((a) => !a.spinAllowed).length,
    solution: {
      dq,
      tenDq: 10 * dq,
      B,
      C,
      cOverB: single ? null : C / B,
      deltaOverB,
      beta,
      cFitted,
      bHeld: ctx.fixedB !== undefined,
      bDetermined,
      spin: levels.ground.S,
      score,
      sharp,
      parameters: names,
      errors: estimate.errors,
      errorBasis: estimate.basis,
      errorNote: estimate.note,
      covariance: estimate.covariance,
      rms,
      weightedRms,
      chiSquare,
      dof,
      assignments,
      ground: levels.ground.label,
      predicted,
      converged: fit.converged,
      reason: fit.reason,
      reasonText,
      iterations: fit.iterations,
      warnings,
      levels,
    },
  };
}
