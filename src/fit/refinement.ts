import { type FieldParameters, levelKeys, transitions } from '../analysis/bandModel.js';
import { type CubicResult, MAX_PARAMETER } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import {
  type LeastSquaresOptions,
  type LeastSquaresResult,
  levenbergMarquardt,
  STOP_REASON_TEXT,
} from '../numeric/leastSquares.js';
import type { AssignmentCandidate } from './assignment.js';
import { type ParameterName, standardErrors } from './fitErrors.js';
import { cachedSolver, energyJacobian, fieldOf, parameterSet, vectorOf } from './fitModel.js';
import type { FitAssignment, FitBand, FitInput, FitSolution, PredictedBand } from './fitTypes.js';
import { solutionWarnings } from './fitWarnings.js';
import type { RatioScan } from './ratioScan.js';

/**
 * Refinement of one assignment: Levenberg–Marquardt on the exact solver from the assignment's
 * starting point, then the solution it ends at — parameters, residuals, standard errors, the
 * predicted levels and the solution's warnings.
 */

/** Lower bound of every parameter, cm⁻¹ (positivity). */
const LOWER_BOUND = 1e-3;

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
  readonly start?: FitInput['start'];
  readonly leastSquares?: LeastSquaresOptions;
}

/** A refined assignment: its solution (unranked) and what the ranking needs besides. */
export interface Refined {
  readonly solution: Omit<FitSolution, 'rank'>;
  readonly keys: readonly string[];
  /** Bands assigned to spin-forbidden transitions. */
  readonly spinForbidden: number;
  /** Spin-allowed transitions left without a band below the highest assigned one. */
  readonly skipped: number;
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
  modelFor: (names: readonly ParameterName[]) => Model,
): { names: ParameterName[]; cHeld: boolean; scale: number } | undefined {
  let names = parameterSet(ctx.n, ctx.fixedB, ctx.fitC);
  const p0 = vectorOf(names, startField);
  const t0 = modelFor(names)(p0);
  const J0 = energyJacobian(names, p0, t0, modelFor(names));
  const scale = Math.max(...t0.energies.map(Math.abs));
  const determined = names.map((_, j) =>
    J0.some((row) => Math.abs((row[j] ?? 0) * (p0[j] ?? 0)) > 1e-9 * scale),
  );
  const cHeld = ctx.fitC && names.length === 3 && determined[2] === false;
  if (cHeld) names = parameterSet(ctx.n, ctx.fixedB, false);
  if (!determined[0] || (names.length >= 2 && !determined[1])) return undefined;
  return { names, cHeld, scale };
}

/** Levenberg–Marquardt on the weighted residuals, within the parameter bounds. */
function leastSquaresFit(
  ctx: RefineContext,
  names: readonly ParameterName[],
  start: readonly number[],
  model: Model,
): LeastSquaresResult {
  const { sigmas } = ctx;
  const observed = ctx.bands.map((b) => b.energy);
  const weigh = (rows: number[][]) => rows.map((row, i) => row.map((x) => x / (sigmas[i] ?? 1)));
  const scaleSq = observed.reduce((s, x, i) => s + (x / (sigmas[i] ?? 1)) ** 2, 0);
  return levenbergMarquardt(
    {
      start: [...start],
      lower: names.map(() => LOWER_BOUND),
      // The solver accepts parameters up to MAX_PARAMETER; a trial step may not go beyond.
      upper: names.map(() => MAX_PARAMETER),
      residuals: (p) => model(p).energies.map((x, i) => (x - (observed[i] ?? 0)) / (sigmas[i] ?? 1)),
      jacobian: (p) => weigh(energyJacobian(names, p, model(p), model)),
    },
    { exactSumOfSquares: 1e-22 * scaleSq, ...ctx.leastSquares },
  );
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
  const modelFor = (names: readonly ParameterName[]) => (p: readonly number[]) =>
    transitions(solve(fieldOf(names, p, ctx.cOverB, ctx.fixedB)), candidate.groundKey, candidate.keys);

  const free = freeParameters(ctx, startField, modelFor);
  if (!free) return undefined;
  const { names, cHeld, scale } = free;
  const model = modelFor(names);
  const fit = leastSquaresFit(ctx, names, vectorOf(names, startField), model);
  const p = fit.parameters;
  // A parameter driven to its bound (B → 0, say) marks no genuine minimum of this assignment.
  if (p.some((x) => x <= LOWER_BOUND * (1 + 1e-9))) return undefined;
  const levels = solve(fieldOf(names, p, ctx.cOverB, ctx.fixedB));
  const keys = levelKeys(levels);
  // The assignment was made from one ground state; an optimum where another level lies lower
  // belongs to a different assignment (searched separately).
  const groundEnergy = levels.levels[keys.indexOf(candidate.groundKey)]?.energy ?? Number.POSITIVE_INFINITY;
  if (groundEnergy > 1e-9 * Math.max(1, scale)) return undefined;
  return solutionOf(ctx, candidate, { names, cHeld, fit, levels, calculated: model(p).energies });
}

/** What a finished least-squares run leaves for {@link solutionOf}. */
interface Optimum {
  readonly names: readonly ParameterName[];
  readonly cHeld: boolean;
  readonly fit: LeastSquaresResult;
  readonly levels: CubicResult;
  readonly calculated: readonly number[];
}

/** The band-by-band picture of a solution: assignments, predicted levels, skipped transitions. */
function bandPicture(
  ctx: RefineContext,
  candidate: AssignmentCandidate,
  levels: CubicResult,
  calculated: readonly number[],
) {
  const keys = levelKeys(levels);
  const groundS = levels.ground.S;
  const byKey = new Map(levels.levels.map((l, i) => [keys[i] ?? '', l]));
  const assignments: FitAssignment[] = ctx.bands.map((b, i) => {
    const level = byKey.get(candidate.keys[i] ?? '');
    return {
      band: i,
      observed: b.energy,
      sigma: b.sigma ?? null,
      calculated: calculated[i] ?? 0,
      difference: b.energy - (calculated[i] ?? 0),
      label: level?.label ?? '?',
      spinAllowed: level?.S === groundS,
    };
  });
  const bandOf = new Map(candidate.keys.map((k, i) => [k, i]));
  const predicted: PredictedBand[] = levels.levels.slice(1).map((l, i) => ({
    label: l.label,
    symbol: l.symbol,
    energy: l.energy,
    spinAllowed: l.spinAllowed,
    band: bandOf.get(keys[i + 1] ?? '') ?? null,
  }));
  // Spin-allowed transitions left without a band below the highest assigned one: a measure of
  // how many bands the assignment supposes unseen.
  const highest = Math.max(...candidate.keys.map((k) => keys.indexOf(k)));
  const skipped = levels.levels.filter(
    (l, i) => i > 0 && i < highest && l.spinAllowed && !bandOf.has(keys[i] ?? ''),
  ).length;
  return { assignments, predicted, skipped };
}

/** The solution at an optimum: parameters, residuals, errors, levels and warnings. */
function solutionOf(ctx: RefineContext, candidate: AssignmentCandidate, optimum: Optimum): Refined {
  const { names, cHeld, fit, levels, calculated } = optimum;
  const { bands, sigmas } = ctx;
  const observed = bands.map((b) => b.energy);
  const field = fieldOf(names, fit.parameters, ctx.cOverB, ctx.fixedB);
  const differences = observed.map((o, i) => o - (calculated[i] ?? 0));
  const m = bands.length;
  const dof = m - names.length;
  const chiSquare = differences.reduce((s, d, i) => s + (d / (sigmas[i] ?? 1)) ** 2, 0);
  const rms = Math.sqrt(differences.reduce((s, d) => s + d * d, 0) / m);

  // d¹ and d⁹ have no B at all; with B held, Δ/B and β follow from the value given.
  const single = names.length === 1 && ctx.fixedB === undefined;
  const { dq, B, C } = field;
  const cFitted = names.length === 3;
  const deltaOverB = single ? null : (10 * dq) / B;
  const beta = single || ctx.freeB === null ? null : B / ctx.freeB;
  // The LM's Jacobian at the optimum is exact in Dq and B (see energyJacobian).
  const estimate = standardErrors({
    jacobian: fit.jacobian,
    chiSquare,
    parameters: names,
    field,
    uncertaintiesGiven: ctx.given,
    freeIonB: ctx.freeB,
  });
  const { assignments, predicted, skipped } = bandPicture(ctx, candidate, levels, calculated);
  const reasonText = STOP_REASON_TEXT[fit.reason];
  const warnings = solutionWarnings({
    result: levels,
    observed,
    assigned: assignments,
    beta,
    deltaOverB,
    scanRange: [ctx.scan.minDeltaOverB, ctx.scan.maxDeltaOverB],
    cFitted,
    cHeld,
    rms,
    reducedChiSquare: ctx.given && dof > 0 ? chiSquare / dof : null,
    converged: fit.converged,
    reasonText,
  });
  return {
    keys: candidate.keys,
    spinForbidden: assignments.filter((a) => !a.spinAllowed).length,
    skipped,
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
      parameters: names,
      errors: estimate.errors,
      errorBasis: estimate.basis,
      errorNote: estimate.note,
      covariance: estimate.covariance,
      rms,
      weightedRms: Math.sqrt(chiSquare / m),
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
