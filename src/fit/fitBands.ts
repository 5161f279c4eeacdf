import {
  type FieldParameters,
  levelKeys,
  solveAt,
  type Transitions,
  transitions,
} from '../analysis/bandModel.js';
import { ensure, InputError } from '../core/errors.js';
import { DEFAULT_C_OVER_B, MAX_C_OVER_B } from '../core/ions.js';
import { type CubicResult, MAX_PARAMETER } from '../field/cubic.js';
import { type Geometry, parseStateLabel } from '../field/labels.js';
import {
  type LeastSquaresOptions,
  levenbergMarquardt,
  STOP_REASON_TEXT,
  type StopReason,
} from '../numeric/leastSquares.js';
import {
  ASSIGNMENT_DEFAULTS,
  type AssignmentCandidate,
  type AssignmentSearch,
  levelKeyOfLabel,
  searchAssignments,
} from './assignment.js';
import { type ErrorBasis, type FitErrors, type ParameterName, standardErrors } from './fitErrors.js';
import { FIT_WARNING_LIMITS, type FitWarning, solutionWarnings } from './fitWarnings.js';
import { type RatioScan, ratioScan, type ScanOptions, singleTerm } from './ratioScan.js';

/**
 * Fitting Dq, Racah B (and C) to observed band maxima: a search over assignments of the bands
 * to transitions, starting values from the Δ/B scan, Levenberg–Marquardt on the exact solver,
 * standard errors from the Jacobian at the optimum, and warnings where the result can mislead.
 */

/** One observed band maximum. */
export interface FitBand {
  /** Band maximum, cm⁻¹. */
  readonly energy: number;
  /** Standard uncertainty of the maximum, cm⁻¹ (give it for every band or for none). */
  readonly sigma?: number;
}

/** The free ion a complex is compared with, for β = B/B(free ion). A `FreeIon` of ions.ts fits. */
export interface FreeIonReference {
  readonly ion?: string;
  readonly B?: number;
  readonly C?: number;
  /** Where the free-ion values come from. */
  readonly source?: string;
}

/** Defaults of {@link FitInput}. */
export const FIT_DEFAULTS = {
  geometry: 'oct',
  fitC: false,
  includeSpinForbidden: false,
  /**
   * Uncertainty of a band maximum assumed for ranking when none is given, cm⁻¹: cubic-model
   * fits usually leave residuals of a few hundred cm⁻¹ on broad d–d maxima (common practice,
   * no source), so fits closer than this are not told apart by their residuals.
   */
  bandPrecision: 200,
  /** Alternatives are kept while their weighted rms is within this factor of the best. */
  ambiguityFactor: 2,
  /** Scan fits within this factor of the best scan fit are refined (looser: the scan is coarse). */
  refineFactor: 3,
  maxRefined: 16,
  maxSolutions: 8,
  /** C/B values scanned besides the starting one when C is fitted (the usual range for 3d complexes). */
  cOverBScan: [3, 4, 5, 6] as readonly number[],
} as const;

/** Input of {@link fitBands}. Energies in cm⁻¹. */
export interface FitInput {
  /** Number of d electrons, 1…9. */
  readonly n: number;
  /** @default 'oct' */
  readonly geometry?: Geometry;
  /** The observed band maxima (in any order). */
  readonly bands: readonly FitBand[];
  /** The free ion, for β and the default C/B. */
  readonly freeIon?: FreeIonReference;
  /** C/B held during the fit (or the starting C/B with `fitC`). @default the free ion's C/B, else {@link DEFAULT_C_OVER_B} */
  readonly cOverB?: number;
  /** Fit C as a third parameter. @default false */
  readonly fitC?: boolean;
  /**
   * Level label for each band, in the bands' order (e.g. `3T2g`, `3T1g(F)`, or Unicode `³T₁g(F)`),
   * read as labelled at `cOverB` (see {@link levelKeyOfLabel}); null, `?` or missing entries are
   * searched. @default all searched
   */
  readonly assignments?: readonly (string | null)[];
  /** Let the search assign bands to spin-forbidden transitions too. @default false */
  readonly includeSpinForbidden?: boolean;
  /**
   * Hold Racah B at this value (cm⁻¹; C at C/B times it) and fit Dq alone: for spectra with one
   * band, such as high-spin d⁴ and d⁶ (one spin-allowed band, at exactly 10Dq). β is then not a
   * result but follows from the value given. @default undefined (B fitted)
   */
  readonly fixedB?: number;
  /**
   * The ground state's spin when it is known (from magnetic measurement, say): `high` keeps only
   * assignments from the ground states of the largest S met on the scan, `low` those of the
   * smallest. @default undefined (both)
   */
  readonly spinState?: 'high' | 'low';
  /**
   * Transitions offered beyond the number of searched bands (see {@link searchAssignments}).
   * @default 2, or 8 with spin-forbidden transitions ({@link ASSIGNMENT_DEFAULTS})
   */
  readonly extraCandidates?: number;
  /**
   * Start every least-squares fit here instead of at its assignment's best scan point (C
   * defaults to C/B × B). @default the scan's starting values
   */
  readonly start?: { readonly dq: number; readonly B?: number; readonly C?: number };
  /** The Δ/B scan for assignments and starting values. @default {@link SCAN_DEFAULTS} */
  readonly scan?: ScanOptions;
  /** Tolerances and limits of the least squares. @default {@link LEAST_SQUARES_DEFAULTS} */
  readonly leastSquares?: LeastSquaresOptions;
  /** @default 200 cm⁻¹ (see {@link FIT_DEFAULTS}) */
  readonly bandPrecision?: number;
  /** @default 2 */
  readonly ambiguityFactor?: number;
  /** Most assignments refined by least squares. @default 16 */
  readonly maxRefined?: number;
  /** Most solutions returned. @default 8 */
  readonly maxSolutions?: number;
  /**
   * Called as the work proceeds, with the steps done and the steps expected (the scans, then
   * the refinements; the total is revised once the scans have shown how many to refine).
   * @default none
   */
  readonly onProgress?: (done: number, total: number) => void;
}

/** One band's place in a solution. */
export interface FitAssignment {
  /** Index of the band in the input. */
  readonly band: number;
  readonly observed: number;
  readonly sigma: number | null;
  readonly calculated: number;
  /** Observed − calculated, cm⁻¹. */
  readonly difference: number;
  readonly label: string;
  readonly spinAllowed: boolean;
}

/** A predicted transition of a solution. */
export interface PredictedBand {
  readonly label: string;
  readonly symbol: string;
  /** Energy above the ground state, cm⁻¹. */
  readonly energy: number;
  readonly spinAllowed: boolean;
  /** Index of the observed band assigned to it, or null. */
  readonly band: number | null;
}

/** One solution of the fit. */
export interface FitSolution {
  /** 1 = best. */
  readonly rank: number;
  readonly dq: number;
  /** 10Dq = Δ. */
  readonly tenDq: number;
  /** Racah B; 0 for d¹ and d⁹, which have none. */
  readonly B: number;
  readonly C: number;
  readonly cOverB: number | null;
  readonly deltaOverB: number | null;
  /** B / B(free ion), or null without a free-ion B. */
  readonly beta: number | null;
  /** Whether C was a free parameter of this solution (false when held at C/B). */
  readonly cFitted: boolean;
  /** Whether B was held at a given value (only Dq fitted). */
  readonly bHeld: boolean;
  /** Names of the free parameters, in the order of `covariance`. */
  readonly parameters: readonly ('dq' | 'B' | 'C')[];
  readonly errors: FitErrors;
  readonly errorBasis: ErrorBasis | null;
  /** How the errors were obtained, or why there are none. */
  readonly errorNote: string;
  readonly covariance: number[][] | null;
  /** rms of observed − calculated, cm⁻¹. */
  readonly rms: number;
  /** rms of the residuals in units of the band uncertainties (given, or the default precision). */
  readonly weightedRms: number;
  /** Σ ((obs − calc)/σ)², with σ given or the default precision. */
  readonly chiSquare: number;
  /** Bands minus free parameters. */
  readonly dof: number;
  readonly assignments: readonly FitAssignment[];
  /** Ground-state label. */
  readonly ground: string;
  /** Every excited level, by energy. */
  readonly predicted: readonly PredictedBand[];
  readonly converged: boolean;
  readonly reason: StopReason;
  readonly reasonText: string;
  readonly iterations: number;
  readonly warnings: readonly FitWarning[];
  /** The solver's full output at the optimum. */
  readonly levels: CubicResult;
}

/** Outcome of {@link fitBands}. */
export interface FitResult {
  readonly n: number;
  readonly geometry: Geometry;
  /** C/B held (or started from, with `fitC`). */
  readonly cOverB: number;
  readonly cOverBSource: 'given' | 'free-ion' | 'default';
  /** The free-ion B that β refers to, and its source; null without one. */
  readonly freeIon: { readonly B: number; readonly source: string | null } | null;
  readonly fitC: boolean;
  readonly bands: readonly FitBand[];
  /** Whether the residuals were weighted by given uncertainties or equally. */
  readonly weighting: 'given' | 'equal';
  /** Best first: those within the ambiguity factor of the best. */
  readonly solutions: readonly FitSolution[];
  /** Solutions within the factor left out by `maxSolutions`. */
  readonly omitted: number;
  /** Distinct assignments tried on the scan. */
  readonly tried: number;
  /** Assignments refined by least squares. */
  readonly refined: number;
  readonly warnings: readonly FitWarning[];
}

/**
 * Relative forward-difference step for ∂E/∂C: truncation (~h) and rounding (eigenvalues good to
 * ~1e-12 relative, divided by h) both stay near 1e-6 of the derivative or below.
 */
const C_STEP = 1e-5;
/** Lower bound of every parameter, cm⁻¹ (positivity). */
const LOWER_BOUND = 1e-3;

interface Refined {
  solution: Omit<FitSolution, 'rank'>;
  keys: readonly string[];
  spinForbidden: number;
  skipped: number;
}

interface Context {
  n: number;
  geometry: Geometry;
  bands: readonly FitBand[];
  sigmas: readonly number[];
  given: boolean;
  cOverB: number;
  fitC: boolean;
  scan: RatioScan;
  freeB: number | null;
  /** B held fixed (only Dq is fitted), when given. */
  fixedB?: number;
  start?: FitInput['start'];
  leastSquares?: LeastSquaresOptions;
}

function parameterSet(ctx: Context, fitC: boolean): ParameterName[] {
  return singleTerm(ctx.n) || ctx.fixedB !== undefined ? ['dq'] : fitC ? ['dq', 'B', 'C'] : ['dq', 'B'];
}

function fieldOf(
  names: readonly ParameterName[],
  p: readonly number[],
  cOverB: number,
  fixedB?: number,
): FieldParameters {
  const dq = p[0] ?? 0;
  if (names.length === 1)
    return fixedB === undefined ? { dq, B: 0, C: 0 } : { dq, B: fixedB, C: cOverB * fixedB };
  const B = p[1] ?? 0;
  return { dq, B, C: names.length === 3 ? (p[2] ?? 0) : cOverB * B };
}

/**
 * The Jacobian ∂E/∂p of the band energies: ∂E/∂Dq exactly from the Hellmann–Feynman slopes
 * ({@link fieldSlope}); ∂E/∂C (when C is free) by a forward difference; and ∂E/∂B from Euler's
 * relation for functions homogeneous of degree one, Dq·∂E/∂Dq + B·∂E/∂B + C·∂E/∂C = E (with C
 * held at C/B the C term is part of the B derivative, and Dq·∂E/∂Dq + B·dE/dB = E). So at fixed
 * C/B the Jacobian costs no solver call beyond the energies themselves.
 */
function energyJacobian(
  names: readonly ParameterName[],
  p: readonly number[],
  at: Transitions,
  model: (p: readonly number[]) => Transitions,
): number[][] {
  const dq = p[0] ?? 0;
  const B = p[1] ?? 1;
  const C = p[2] ?? 0;
  let dC: number[] | undefined;
  if (names.length === 3) {
    const h = C_STEP * Math.max(C, 1);
    const plus = model([dq, B, C + h]).energies;
    dC = plus.map((e, i) => (e - (at.energies[i] ?? 0)) / h);
  }
  return at.energies.map((e, i) => {
    const dDq = at.slopes[i] ?? 0;
    if (names.length === 1) return [dDq];
    const dCi = dC?.[i] ?? 0;
    const dB = (e - dq * dDq - C * dCi) / B;
    return dC ? [dDq, dB, dCi] : [dDq, dB];
  });
}

/** Solver calls of one refinement, kept by parameter values (the Jacobian reuses the residuals' call). */
function cachedSolver(n: number, geometry: Geometry): (f: FieldParameters) => CubicResult {
  const cache = new Map<string, CubicResult>();
  return (f) => {
    const key = `${f.dq},${f.B},${f.C}`;
    let result = cache.get(key);
    if (!result) {
      result = solveAt(n, geometry, f);
      if (cache.size >= 8) cache.delete(cache.keys().next().value ?? '');
      cache.set(key, result);
    }
    return result;
  };
}

function refine(ctx: Context, candidate: AssignmentCandidate): Refined | undefined {
  const { n, geometry, bands, sigmas } = ctx;
  const observed = bands.map((b) => b.energy);
  const startField: FieldParameters = ctx.start
    ? {
        dq: ctx.start.dq,
        B: ctx.start.B ?? 0,
        C: ctx.start.C ?? ctx.cOverB * (ctx.start.B ?? 0),
      }
    : candidate.start;
  const solve = cachedSolver(n, geometry);
  const modelFor = (names: readonly ParameterName[]) => (p: readonly number[]) =>
    transitions(solve(fieldOf(names, p, ctx.cOverB, ctx.fixedB)), candidate.groundKey, candidate.keys);
  const vectorOf = (names: readonly ParameterName[], f: FieldParameters) =>
    names.map((name) => (name === 'dq' ? f.dq : name === 'B' ? f.B : f.C));

  // A parameter none of the assigned bands depends on cannot be fitted: C is then held at the
  // starting C/B; without Dq or B the assignment is not usable.
  let names = parameterSet(ctx, ctx.fitC);
  const p0 = vectorOf(names, startField);
  const t0 = modelFor(names)(p0);
  const J0 = energyJacobian(names, p0, t0, modelFor(names));
  const scale = Math.max(...t0.energies.map(Math.abs));
  const determined = names.map((_, j) =>
    J0.some((row) => Math.abs((row[j] ?? 0) * (p0[j] ?? 0)) > 1e-9 * scale),
  );
  const cHeld = ctx.fitC && names.length === 3 && determined[2] === false;
  if (cHeld) names = parameterSet(ctx, false);
  if (!determined[0] || (names.length >= 2 && !determined[1])) return undefined;

  const model = modelFor(names);
  const weigh = (rows: number[][]) => rows.map((row, i) => row.map((x) => x / (sigmas[i] ?? 1)));
  const scaleSq = observed.reduce((s, x, i) => s + (x / (sigmas[i] ?? 1)) ** 2, 0);
  const fit = levenbergMarquardt(
    {
      start: vectorOf(names, startField),
      lower: names.map(() => LOWER_BOUND),
      // The solver accepts parameters up to MAX_PARAMETER; a trial step may not go beyond.
      upper: names.map(() => MAX_PARAMETER),
      residuals: (p) => model(p).energies.map((x, i) => (x - (observed[i] ?? 0)) / (sigmas[i] ?? 1)),
      jacobian: (p) => weigh(energyJacobian(names, p, model(p), model)),
    },
    { exactSumOfSquares: 1e-22 * scaleSq, ...ctx.leastSquares },
  );
  const p = fit.parameters;
  // A parameter driven to its bound (B → 0, say) marks no genuine minimum of this assignment.
  if (p.some((x) => x <= LOWER_BOUND * (1 + 1e-9))) return undefined;
  const field = fieldOf(names, p, ctx.cOverB, ctx.fixedB);
  const levels = solve(field);
  const keys = levelKeys(levels);
  // The assignment was made from one ground state; an optimum where another level lies lower
  // belongs to a different assignment (searched separately).
  const groundEnergy = levels.levels[keys.indexOf(candidate.groundKey)]?.energy ?? Number.POSITIVE_INFINITY;
  if (groundEnergy > 1e-9 * Math.max(1, scale)) return undefined;

  const calculated = model(p).energies;
  const differences = observed.map((o, i) => o - (calculated[i] ?? 0));
  const m = bands.length;
  const dof = m - names.length;
  const chiSquare = differences.reduce((s, d, i) => s + (d / (sigmas[i] ?? 1)) ** 2, 0);
  const rms = Math.sqrt(differences.reduce((s, d) => s + d * d, 0) / m);
  const weightedRms = Math.sqrt(chiSquare / m);

  // d¹ and d⁹ have no B at all; with B held, Δ/B and β follow from the value given.
  const single = names.length === 1 && ctx.fixedB === undefined;
  const { dq, B, C } = field;
  const cFitted = names.length === 3;
  const deltaOverB = single ? null : (10 * dq) / B;
  const beta = single || ctx.freeB === null ? null : B / ctx.freeB;
  // The LM's Jacobian at the optimum is exact in Dq and B (see energyJacobian).
  const {
    errors,
    covariance,
    basis: errorBasis,
    note: errorNote,
  } = standardErrors({
    jacobian: fit.jacobian,
    chiSquare,
    parameters: names,
    field,
    uncertaintiesGiven: ctx.given,
    freeIonB: ctx.freeB,
  });

  const groundS = levels.ground.S;
  const byKey = new Map(levels.levels.map((l, i) => [keys[i] ?? '', l]));
  const assignments: FitAssignment[] = bands.map((b, i) => {
    const level = byKey.get(candidate.keys[i] ?? '');
    return {
      band: i,
      observed: b.energy,
      sigma: b.sigma ?? null,
      calculated: calculated[i] ?? 0,
      difference: differences[i] ?? 0,
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
      errors,
      errorBasis,
      errorNote,
      covariance,
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

/**
 * Two refinements that end at the same parameters with the same band energies are one solution
 * (also when they assign a band to either of two exactly degenerate levels, such as ⁴A₁g and
 * ⁴Eg(G) of d⁵).
 */
function sameSolution(a: Refined, b: Refined): boolean {
  const close = (x: number, y: number) => Math.abs(x - y) <= 1e-6 * Math.max(Math.abs(x), Math.abs(y), 1);
  const sa = a.solution;
  const sb = b.solution;
  return (
    sa.ground === sb.ground &&
    close(sa.dq, sb.dq) &&
    close(sa.B, sb.B) &&
    close(sa.C, sb.C) &&
    sa.assignments.every((x, i) => close(x.calculated, sb.assignments[i]?.calculated ?? Number.NaN))
  );
}

/** The candidates of several searches (one per C/B), keeping the best starts of each assignment. */
function mergeSearches(searches: readonly AssignmentSearch[]): AssignmentSearch {
  const all = searches.flatMap((s) => s.candidates).sort((a, b) => a.chiSquare - b.chiSquare);
  const starts = new Map<string, number>();
  const candidates = all.filter((c) => {
    const id = `${c.groundKey}|${c.keys.join()}`;
    const count = starts.get(id) ?? 0;
    starts.set(id, count + 1);
    return count < ASSIGNMENT_DEFAULTS.startsPerAssignment;
  });
  const without = searches.map((s) => new Set(s.groundsWithout));
  return {
    candidates,
    tried: starts.size,
    groundsWithout: [...(without[0] ?? [])].filter((g) => without.every((w) => w.has(g))),
  };
}

/**
 * Fits Dq and B (C held at C/B, or fitted too) to observed band maxima of dⁿ in a cubic field.
 *
 * Without assignments, every assignment of the bands (in energy order) to transitions from the
 * ground state (in energy order) is tried on a coarse Δ/B scan; the promising ones are refined by
 * Levenberg–Marquardt and ranked by weighted rms residual. Solutions within `ambiguityFactor`
 * of the best (or within the band uncertainties) are all returned: ranked first by
 * max(weighted rms, 1), then β ≤ 1 before β > 1, fewer spin-forbidden assignments, lower
 * transitions, and the weighted rms itself.
 *
 * Standard errors: from the given band uncertainties when they are given (exact propagation,
 * also with as many bands as parameters); otherwise from the residual variance Σr²/(m − p),
 * which needs more bands than parameters — with exactly as many, there is no error estimate
 * (null, with a note), never a zero.
 *
 * @throws InputError for bad input: no bands, non-positive energies or uncertainties, an
 * uncertainty on some bands only, more assignments than bands, an unknown or repeated label,
 * fewer bands than free parameters, or bands that no transition of dⁿ can explain.
 */
export function fitBands(input: FitInput): FitResult {
  const { n, bands } = input;
  const geometry = input.geometry ?? FIT_DEFAULTS.geometry;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  ensure(bands.length > 0, 'no bands: give at least one observed band maximum');
  for (const [i, b] of bands.entries()) {
    ensure(
      Number.isFinite(b.energy) && b.energy > 0,
      `band ${i + 1} = ${b.energy}: expected a positive number of cm⁻¹`,
    );
    ensure(
      b.sigma === undefined || (Number.isFinite(b.sigma) && b.sigma > 0),
      `uncertainty of band ${i + 1} = ${b.sigma}: expected a positive number of cm⁻¹`,
    );
  }
  const withSigma = bands.filter((b) => b.sigma !== undefined).length;
  ensure(
    withSigma === 0 || withSigma === bands.length,
    `uncertainties given for ${withSigma} of ${bands.length} bands: give one for every band or for none`,
  );
  const single = singleTerm(n);
  const fitC = input.fitC ?? FIT_DEFAULTS.fitC;
  ensure(!(fitC && single), `fitting C: d${n} has a single free-ion term, so only Dq can be fitted`);
  const freeB = input.freeIon?.B ?? null;
  const freeRatio =
    input.freeIon?.B !== undefined && input.freeIon.C !== undefined
      ? input.freeIon.C / input.freeIon.B
      : undefined;
  const cOverB = input.cOverB ?? freeRatio ?? DEFAULT_C_OVER_B;
  ensure(
    Number.isFinite(cOverB) && cOverB > 0 && cOverB <= MAX_C_OVER_B,
    `C/B = ${cOverB}: expected a positive number up to ${MAX_C_OVER_B}`,
  );
  const cOverBSource =
    input.cOverB !== undefined ? 'given' : freeRatio !== undefined ? 'free-ion' : 'default';
  const bandPrecision = input.bandPrecision ?? FIT_DEFAULTS.bandPrecision;
  const ambiguityFactor = input.ambiguityFactor ?? FIT_DEFAULTS.ambiguityFactor;
  const maxSolutions = input.maxSolutions ?? FIT_DEFAULTS.maxSolutions;
  const maxRefined = input.maxRefined ?? FIT_DEFAULTS.maxRefined;
  ensure(bandPrecision > 0, `band precision ${bandPrecision}: expected a positive number of cm⁻¹`);
  ensure(ambiguityFactor >= 1, `ambiguity factor ${ambiguityFactor}: expected a number ≥ 1`);
  ensure(
    Number.isInteger(maxSolutions) && maxSolutions >= 1,
    `most solutions ${maxSolutions}: expected a whole number ≥ 1`,
  );
  ensure(
    Number.isInteger(maxRefined) && maxRefined >= 1,
    `most refined ${maxRefined}: expected a whole number ≥ 1`,
  );
  const fixedB = input.fixedB;
  ensure(
    fixedB === undefined || (Number.isFinite(fixedB) && fixedB > 0),
    `held B = ${fixedB}: expected a positive number of cm⁻¹`,
  );
  ensure(!(fixedB !== undefined && single), `holding B: d${n} has a single free-ion term and no B`);
  ensure(!(fixedB !== undefined && fitC), 'holding B and fitting C: fit C only with B free');
  const names = single || fixedB !== undefined ? ['Dq'] : fitC ? ['Dq', 'B', 'C'] : ['Dq', 'B'];
  ensure(
    bands.length >= names.length,
    `${bands.length} band${bands.length === 1 ? '' : 's'} for ${names.length} free parameters (${names.join(', ')}): ` +
      `give at least ${names.length} bands${fitC ? ', or hold C/B fixed' : ''}` +
      (names.length === 2 && bands.length === 1
        ? ` — with one band (high-spin d4 or d6 has just one spin-allowed band, at 10Dq), hold B at a value (fixedB, --B)`
        : ''),
  );
  const assignments = input.assignments ?? [];
  ensure(
    assignments.length <= bands.length,
    `${assignments.length} assignments for ${bands.length} band${bands.length === 1 ? '' : 's'}: expected at most one per band`,
  );

  const scan = ratioScan(n, geometry, cOverB, input.scan);
  const fixed = bands.map((_, i) => {
    const label = assignments[i];
    return label === null || label === undefined || label.trim() === '?' || label.trim() === ''
      ? null
      : levelKeyOfLabel(scan, label);
  });
  const fixedKeys = fixed.filter((k): k is string => k !== null);
  ensure(
    new Set(fixedKeys).size === fixedKeys.length,
    `assignments ${assignments.filter((a) => a).join(', ')}: each level can take only one band`,
  );
  const alwaysGround = fixedKeys.find((k) => scan.points.every((pt) => pt.ground.key === k));
  if (alwaysGround) {
    const label = scan.points[0]?.ground.label ?? alwaysGround;
    throw new InputError(
      `assignment "${label}" is the ground state of d${n}: assign bands to excited levels`,
    );
  }

  const given = withSigma > 0;
  const sigmas = bands.map((b) => b.sigma ?? bandPrecision);
  // With C free, the search scans the usual C/B range too, so that an assignment that needs
  // another C/B than the starting one still gets a start near its optimum.
  const ratios = fitC ? [...new Set([cOverB, ...FIT_DEFAULTS.cOverBScan])] : [cOverB];
  const progress = (done: number, total: number) => input.onProgress?.(done, total);
  let search = mergeSearches(
    ratios.map((ratio, i) => {
      progress(i, ratios.length + maxRefined);
      return searchAssignments(
        ratio === cOverB ? scan : ratioScan(n, geometry, ratio, input.scan),
        bands.map((b, i) => ({ energy: b.energy, weight: 1 / (sigmas[i] ?? 1) ** 2 })),
        {
          fixed,
          includeSpinForbidden: input.includeSpinForbidden ?? FIT_DEFAULTS.includeSpinForbidden,
          ...(fixedB !== undefined ? { fixedScale: fixedB } : {}),
          ...(input.extraCandidates !== undefined ? { extraCandidates: input.extraCandidates } : {}),
        },
      );
    }),
  );
  const spinOf = (c: AssignmentCandidate) =>
    (Number(parseStateLabel(c.groundLabel)?.multiplicity ?? 1) - 1) / 2;
  if (input.spinState !== undefined && search.candidates.length > 0) {
    const spins = search.candidates.map(spinOf);
    const wanted = input.spinState === 'high' ? Math.max(...spins) : Math.min(...spins);
    search = { ...search, candidates: search.candidates.filter((c) => spinOf(c) === wanted) };
  }
  if (search.candidates.length === 0) {
    const m = bands.length;
    const most = Math.max(...scan.points.map((pt) => pt.excited.length));
    const mostAllowed = Math.max(...scan.points.map((pt) => pt.excited.filter((l) => l.spinAllowed).length));
    const where = `d${n} (${geometry === 'oct' ? 'octahedral' : 'tetrahedral'})`;
    throw new InputError(
      m > most
        ? `${m} bands: ${where} has only ${most} excited level${most === 1 ? '' : 's'}`
        : input.includeSpinForbidden || m <= mostAllowed
          ? `${m} bands cannot be assigned to the transitions of ${where} with the assignments given`
          : `${m} bands: ${where} has at most ${mostAllowed} spin-allowed transition${mostAllowed === 1 ? '' : 's'} ` +
            'from any ground state; include spin-forbidden transitions to assign more bands',
    );
  }

  const m = bands.length;
  const scanRms = (c: AssignmentCandidate) => Math.sqrt(c.chiSquare / m);
  // The scan's best fit is judged per ground state: a high-spin assignment must not be cut
  // because a low-spin one scans better (or the other way round).
  const bestScan = new Map<string, number>();
  for (const c of search.candidates) {
    bestScan.set(c.groundKey, Math.min(bestScan.get(c.groundKey) ?? Number.POSITIVE_INFINITY, scanRms(c)));
  }
  const seenAssignments = new Set<string>();
  const eligible = search.candidates
    .filter((c) => scanRms(c) <= FIT_DEFAULTS.refineFactor * Math.max(bestScan.get(c.groundKey) ?? 0, 1))
    .filter((c) => {
      if (!input.start) return true;
      // From a given start, each assignment needs fitting only once.
      const id = `${c.groundKey}|${c.keys.join()}`;
      if (seenAssignments.has(id)) return false;
      seenAssignments.add(id);
      return true;
    });
  // The scan ranks candidates of different ground states on one scale, but its minima are only
  // starting points: a high-spin assignment that scans worse than many low-spin ones may still
  // refine best. So each ground state keeps its own best few, then the rest fill the quota.
  const perGround = Math.max(1, Math.floor(maxRefined / 4));
  const kept = new Set<AssignmentCandidate>();
  const byGround = new Map<string, number>();
  for (const c of eligible) {
    const k = byGround.get(c.groundKey) ?? 0;
    if (k < perGround) {
      kept.add(c);
      byGround.set(c.groundKey, k + 1);
    }
  }
  for (const c of eligible) if (kept.size < Math.max(maxRefined, kept.size) && !kept.has(c)) kept.add(c);
  const toRefine = eligible
    .filter((c) => kept.has(c))
    .slice(0, Math.max(maxRefined, byGround.size * perGround));
  const ctx: Context = {
    n,
    geometry,
    bands,
    sigmas,
    given,
    cOverB,
    fitC,
    scan,
    freeB,
    ...(fixedB !== undefined ? { fixedB } : {}),
    ...(input.start ? { start: input.start } : {}),
    ...(input.leastSquares ? { leastSquares: input.leastSquares } : {}),
  };
  const refined: Refined[] = [];
  for (const [i, c] of toRefine.entries()) {
    progress(ratios.length + i, ratios.length + toRefine.length);
    const r = refine(ctx, c);
    if (r && !refined.some((s) => sameSolution(s, r))) refined.push(r);
  }
  progress(ratios.length + toRefine.length, ratios.length + toRefine.length);
  if (refined.length === 0) {
    throw new InputError(
      `no assignment tried gives a usable fit of ${names.join(' and ')}: in each, some parameter is not fixed by ` +
        'the assigned bands, runs to zero, or the fit leaves the ground state it assumed',
    );
  }
  const floor = (r: Refined) => Math.max(r.solution.weightedRms, 1);
  const best = Math.min(...refined.map(floor));
  // Fewer spin-forbidden assignments rank first only between solutions from the same ground spin:
  // from a sextet ground state (high-spin d⁵) every band is spin-forbidden.
  const sameSpin = (a: Refined, b: Refined) => a.solution.levels.ground.S === b.solution.levels.ground.S;
  // A β outside (lowBeta, 1] is physically implausible for a complex: such solutions are listed
  // after every plausible one, whatever their residuals.
  const implausible = (r: Refined) => {
    const beta = r.solution.beta;
    return Number(beta !== null && (beta > 1 || beta < FIT_WARNING_LIMITS.lowBeta));
  };
  const order = (a: Refined, b: Refined) =>
    implausible(a) - implausible(b) ||
    floor(a) - floor(b) ||
    (sameSpin(a, b) ? a.spinForbidden - b.spinForbidden : 0) ||
    a.skipped - b.skipped ||
    a.solution.weightedRms - b.solution.weightedRms;
  const accepted = refined.filter((r) => r.solution.weightedRms <= ambiguityFactor * best).sort(order);
  // The best solution of every ground spin stays in the list even beyond maxSolutions: whether a
  // d⁴–d⁷ sample is high- or low-spin is for the chemist to settle, not for a cut-off.
  const shown = accepted.slice(0, maxSolutions);
  for (const r of accepted) {
    if (!shown.some((x) => x.solution.levels.ground.S === r.solution.levels.ground.S)) shown.push(r);
  }
  const solutions = shown.map((r, i) => ({ rank: i + 1, ...r.solution }));

  const warnings: FitWarning[] = [];
  if (solutions.length > 1) {
    warnings.push({
      code: 'ambiguous',
      message:
        `${solutions.length} assignments fit nearly as well (weighted rms within a factor of ${ambiguityFactor} of ` +
        'the best, or within the band uncertainties): the band positions alone do not decide; weigh intensities, ' +
        'band widths and β < 1',
    });
  }
  if ([1, 4, 6, 9].includes(n) && m >= 2) {
    warnings.push({
      code: 'jahn-teller-pair',
      message:
        `high-spin d${n} has a single spin-allowed band (${n === 1 || n === 6 ? 'to an E state' : 'from an E ground state'}), ` +
        'which a Jahn–Teller distortion often splits into two components: if two of these bands are such a pair, ' +
        '10Dq is about their mean — fit that one value with B held (--B)',
    });
  }
  for (const label of search.groundsWithout) {
    warnings.push({
      code: 'ground-without-assignment',
      message:
        `no assignment of ${m} band${m === 1 ? '' : 's'} to ${input.includeSpinForbidden ? '' : 'spin-allowed '}` +
        `transitions from the ground state ${label} exists, so no solution assumes it` +
        (input.includeSpinForbidden ? '' : '; include spin-forbidden transitions to consider it'),
    });
  }
  return {
    n,
    geometry,
    cOverB,
    cOverBSource,
    freeIon: freeB === null ? null : { B: freeB, source: input.freeIon?.source ?? null },
    fitC,
    bands,
    weighting: given ? 'given' : 'equal',
    solutions,
    omitted: accepted.length - shown.length,
    tried: search.tried,
    refined: toRefine.length,
    warnings,
  };
}
