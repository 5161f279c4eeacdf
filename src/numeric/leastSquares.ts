/**
 * Bounded nonlinear least squares by the Levenberg–Marquardt method (Levenberg, Q. Appl. Math.
 * 2, 164, 1944; Marquardt, J. SIAM 11, 431, 1963), with Marquardt's scaling of the damping by
 * diag(JᵀJ) and the gain-ratio update of the damping of Nielsen (Damping parameter in Marquardt's
 * method, IMM-REP-1999-05, 1999; Madsen, Nielsen & Tingleff, Methods for Non-Linear Least
 * Squares Problems, 2004, §3.2).
 *
 * Written here on ml-matrix rather than taken from ml-levenberg-marquardt because the band fit
 * needs what that library does not give: the reason it stopped (it stops only on an absolute
 * sum-of-squares threshold or the iteration limit, so every fit with a nonzero residual runs to
 * the limit), the Jacobian at the optimum for the covariance, fits with a single data point, and
 * a caller-supplied Jacobian that may reuse one model evaluation for every residual (the library
 * calls the model once per data point and per parameter).
 */

import { CholeskyDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { ensure } from '../core/errors.js';

/** Why {@link levenbergMarquardt} stopped. */
export type StopReason =
  | 'exact-fit'
  | 'small-step'
  | 'small-reduction'
  | 'small-gradient'
  | 'iteration-limit'
  | 'no-descent';

/** Plain-English explanation of each {@link StopReason}. */
export const STOP_REASON_TEXT: Readonly<Record<StopReason, string>> = {
  'exact-fit': 'the residuals vanished to rounding error: an exact fit',
  'small-step': 'the relative change of every parameter fell below the step tolerance',
  'small-reduction': 'the relative decrease of the sum of squares fell below the reduction tolerance',
  'small-gradient': 'the gradient of the sum of squares vanished (residuals orthogonal to the Jacobian)',
  'iteration-limit': 'the iteration limit was reached before any convergence test passed',
  'no-descent': 'no step that lowers the sum of squares could be found, even with very strong damping',
};

/** Options of {@link levenbergMarquardt}. */
export interface LeastSquaresOptions {
  /** Largest number of iterations (Jacobian evaluations). @default 100 */
  readonly maxIterations?: number;
  /** Stop when every parameter changes by less than this fraction of its size. @default 1e-10 */
  readonly stepTolerance?: number;
  /** Stop when the sum of squares drops by less than this fraction (actual and predicted). @default 1e-14 */
  readonly reductionTolerance?: number;
  /** Stop when the cosine between the residual vector and every Jacobian column is below this. @default 1e-10 */
  readonly gradientTolerance?: number;
  /** Stop as an exact fit when the sum of squares is at most this. @default 0 */
  readonly exactSumOfSquares?: number;
  /** Starting damping, relative to diag(JᵀJ). @default 1e-3 */
  readonly initialDamping?: number;
  /**
   * Hold a parameter that sits on a bound while the descent direction points out of the box
   * (see heldAtBounds) instead of solving for it and clamping the step. @default false
   */
  readonly holdAtBounds?: boolean;
}

/** Defaults of {@link LeastSquaresOptions}. */
export const LEAST_SQUARES_DEFAULTS = {
  maxIterations: 100,
  stepTolerance: 1e-10,
  reductionTolerance: 1e-14,
  gradientTolerance: 1e-10,
  exactSumOfSquares: 0,
  initialDamping: 1e-3,
  holdAtBounds: false,
} as const;

/** A least-squares problem: minimise Σ rᵢ(p)². */
export interface LeastSquaresProblem {
  /** The residual vector at p. */
  readonly residuals: (p: readonly number[]) => readonly number[];
  /**
   * The Jacobian ∂rᵢ/∂pⱼ at p (one row per residual), given r(p). Default: forward differences
   * with step 1e-7·max(|pⱼ|, 1).
   */
  readonly jacobian?: (p: readonly number[], r: readonly number[]) => number[][];
  readonly start: readonly number[];
  /** Lower bounds; steps are projected onto the box. @default −∞ */
  readonly lower?: readonly number[];
  /** Upper bounds. @default +∞ */
  readonly upper?: readonly number[];
}

/** Outcome of {@link levenbergMarquardt}. */
export interface LeastSquaresResult {
  readonly parameters: number[];
  readonly residuals: number[];
  readonly sumOfSquares: number;
  /** The Jacobian at `parameters` as used by the last iteration. */
  readonly jacobian: number[][];
  readonly iterations: number;
  /** Residual evaluations, including those inside the default Jacobian. */
  readonly evaluations: number;
  /** True unless the iteration limit was reached or no descent step was found. */
  readonly converged: boolean;
  readonly reason: StopReason;
}

function forwardJacobian(
  f: (p: readonly number[]) => readonly number[],
  p: readonly number[],
  r: readonly number[],
): number[][] {
  const columns = p.map((pj, j) => {
    const h = 1e-7 * Math.max(Math.abs(pj), 1);
    const q = [...p];
    q[j] = pj + h;
    const rq = f(q);
    return r.map((ri, i) => ((rq[i] ?? 0) - ri) / h);
  });
  return r.map((_, i) => columns.map((c) => c[i] ?? 0));
}

const sumSquares = (r: readonly number[]) => r.reduce((s, x) => s + x * x, 0);

/**
 * The normal equations of a step: JᵀJ (row-major, both triangles), g = Jᵀr, and the largest
 * cosine between r and a column of J, which is zero at a stationary point whatever the scale of
 * the parameters.
 */
interface NormalEquations {
  readonly A: Float64Array;
  readonly g: number[];
  readonly cosine: number;
}

/** The normal equations from JᵀJ's upper triangle and g (see {@link NormalEquations}). */
function completed(a: Float64Array, g: number[], np: number, ss: number): NormalEquations {
  for (let j = 0; j < np; j++) for (let k = j + 1; k < np; k++) a[k * np + j] = a[j * np + k] as number;
  const rNorm = Math.sqrt(ss);
  const cosine = Math.max(
    ...g.map((gj, j) => Math.abs(gj) / (Math.sqrt(a[j * np + j] as number) * rNorm || 1)),
  );
  return { A: a, g, cosine };
}

/**
 * JᵀJ and the gradient g = Jᵀr of a Jacobian given as rows. Plain loops: spectra give
 * thousands of residuals, and building ml-matrix objects of that size each iteration cost more
 * than the sums themselves.
 */
function normalEquations(
  J: readonly (readonly number[])[],
  r: readonly number[],
  ss: number,
): NormalEquations {
  const np = J[0]?.length ?? 0;
  const a = new Float64Array(np * np);
  const g = new Array<number>(np).fill(0);
  for (let i = 0; i < J.length; i++) {
    const row = J[i] as readonly number[];
    const ri = r[i] as number;
    for (let j = 0; j < np; j++) {
      const v = row[j] as number;
      if (v === 0) continue;
      g[j] = (g[j] as number) + v * ri;
      for (let k = j; k < np; k++) a[j * np + k] = (a[j * np + k] as number) + v * (row[k] as number);
    }
  }
  return completed(a, g, np, ss);
}

/**
 * The step of the damped normal equations (JᵀJ + μ·diag(scale))·δ = −g, or undefined when the
 * damped matrix is not positive definite (the damping must grow).
 */
function dampedStep(
  A: Float64Array,
  g: readonly number[],
  mu: number,
  scale: readonly number[],
  held: ReadonlySet<number>,
): number[] | undefined {
  const np = g.length;
  const damped = Float64Array.from(A);
  for (let j = 0; j < np; j++) damped[j * np + j] = (A[j * np + j] as number) + mu * (scale[j] ?? 1);
  for (const j of held) {
    for (let k = 0; k < np; k++) {
      damped[j * np + k] = 0;
      damped[k * np + j] = 0;
    }
    damped[j * np + j] = 1;
  }
  return choleskySolve(
    damped,
    np,
    g.map((x, j) => (held.has(j) ? 0 : -x)),
  );
}

/**
 * The solution of M·x = b for a symmetric M (row-major, size n), by Cholesky factorisation, or
 * undefined when M is not positive definite. The same operations in the same order as ml-matrix's
 * CholeskyDecomposition and its solve, so the steps are bit-identical; written out because the fit
 * takes thousands of steps and building, cloning and factorising ml-matrix objects for each took
 * a fifth of a spectrum's band search.
 */
function choleskySolve(M: Float64Array, n: number, b: readonly number[]): number[] | undefined {
  const L = new Float64Array(n * n);
  let positiveDefinite = true;
  for (let j = 0; j < n; j++) {
    let d = 0;
    for (let k = 0; k < j; k++) {
      let s = 0;
      for (let i = 0; i < k; i++) s += (L[k * n + i] as number) * (L[j * n + i] as number);
      s = ((M[j * n + k] as number) - s) / (L[k * n + k] as number);
      L[j * n + k] = s;
      d = d + s * s;
    }
    d = (M[j * n + j] as number) - d;
    positiveDefinite &&= d > 0;
    L[j * n + j] = Math.sqrt(Math.max(d, 0));
  }
  if (!positiveDefinite) return undefined;
  const x = [...b];
  for (let k = 0; k < n; k++) {
    for (let i = 0; i < k; i++) x[k] = (x[k] as number) - (x[i] as number) * (L[k * n + i] as number);
    x[k] = (x[k] as number) / (L[k * n + k] as number);
  }
  for (let k = n - 1; k >= 0; k--) {
    for (let i = k + 1; i < n; i++) x[k] = (x[k] as number) - (x[i] as number) * (L[i * n + k] as number);
    x[k] = (x[k] as number) / (L[k * n + k] as number);
  }
  return x;
}

/** No parameter held. */
const NONE_HELD: ReadonlySet<number> = new Set();

/**
 * The parameters that sit on a bound while the descent direction −g points out of the box. They
 * are held for the step: a step solved with them free and then clamped is not a descent step of
 * the others, and the damping then climbs while the fit crawls (a band pinned at its widest).
 */
function heldAtBounds(
  p: readonly number[],
  g: readonly number[],
  lower: readonly number[],
  upper: readonly number[],
): Set<number> {
  const held = new Set<number>();
  p.forEach((x, j) => {
    const gj = g[j] ?? 0;
    if ((x <= (lower[j] ?? -Infinity) && gj > 0) || (x >= (upper[j] ?? Infinity) && gj < 0)) held.add(j);
  });
  return held;
}

/** Whether every component of `step` is below the relative-plus-absolute step tolerance at `p`. */
function isSmallStep(step: readonly number[], p: readonly number[], tolerance: number): boolean {
  return step.every((s, j) => Math.abs(s) <= tolerance * (Math.abs(p[j] ?? 0) + tolerance));
}

/** Predicted decrease of the linear model ‖r + J·step‖²: −(2gᵀs + sᵀAs). */
function predictedDecrease(A: Float64Array, g: readonly number[], step: readonly number[]): number {
  const np = step.length;
  let decrease = 0;
  for (let j = 0; j < np; j++) {
    let As = 0;
    for (let k = 0; k < np; k++) As += (A[j * np + k] as number) * (step[k] as number);
    decrease += (step[j] as number) * (2 * (g[j] ?? 0) + As);
  }
  return -decrease;
}

/** A Jacobian in some storage, with how to take the normal equations from it. */
interface JacobianForm<J> {
  /** The Jacobian at p, given r(p). */
  readonly at: (p: readonly number[], r: readonly number[]) => J;
  readonly normal: (J: J, r: readonly number[], ss: number) => NormalEquations;
}

/** Where the iteration ended. */
interface Minimum<J> {
  readonly p: number[];
  readonly r: number[];
  readonly ss: number;
  readonly J: J;
  readonly iterations: number;
  readonly reason: StopReason;
}

/**
 * The Levenberg–Marquardt iteration from `start` (already in the box), whatever the Jacobian's
 * storage: {@link levenbergMarquardt} keeps it as rows, {@link fitCurve} in one flat array.
 */
function minimise<J>(
  start: readonly number[],
  lower: readonly number[],
  upper: readonly number[],
  /** The residuals at p, in a new array each call (the iteration keeps them). */
  residuals: (p: readonly number[]) => number[],
  jacobian: JacobianForm<J>,
  o: Required<LeastSquaresOptions>,
): Minimum<J> {
  let p = [...start];
  let r = residuals(p);
  let ss = sumSquares(r);
  let J = jacobian.at(p, r);
  let mu = o.initialDamping;
  let nu = 2;
  let iterations = 0;
  const finish = (reason: StopReason): Minimum<J> => ({ p, r, ss, J, iterations, reason });

  while (iterations < o.maxIterations) {
    if (ss <= o.exactSumOfSquares) return finish('exact-fit');
    iterations++;
    const { A, g, cosine } = jacobian.normal(J, r, ss);
    if (cosine <= o.gradientTolerance) return finish('small-gradient');
    // Marquardt's scaling; a parameter no residual depends on gets a unit scale instead of zero.
    const scale = g.map((_, j) => (A[j * g.length + j] as number) || 1);
    const held = o.holdAtBounds ? heldAtBounds(p, g, lower, upper) : NONE_HELD;
    let accepted = false;
    while (!accepted) {
      const delta = dampedStep(A, g, mu, scale, held);
      if (!delta) {
        mu *= nu;
        nu *= 2;
        if (mu > 1e16) return finish('no-descent');
        continue;
      }
      const trial = clamped(
        p.map((x, j) => x + (delta[j] ?? 0)),
        lower,
        upper,
      );
      const step = trial.map((x, j) => x - (p[j] ?? 0));
      if (isSmallStep(step, p, o.stepTolerance)) return finish('small-step');
      const rt = residuals(trial);
      const sst = sumSquares(rt);
      const predicted = predictedDecrease(A, g, step);
      const actual = ss - sst;
      if (actual > 0 && Number.isFinite(sst)) {
        const rho = predicted > 0 ? actual / predicted : 1;
        const small = actual <= o.reductionTolerance * ss && predicted <= o.reductionTolerance * ss;
        p = trial;
        r = rt;
        ss = sst;
        J = jacobian.at(p, r);
        mu *= Math.max(1 / 3, 1 - (2 * rho - 1) ** 3);
        nu = 2;
        accepted = true;
        if (isSmallStep(step, p, o.stepTolerance)) return finish('small-step');
        if (small) return finish('small-reduction');
      } else {
        mu *= nu;
        nu *= 2;
        if (mu > 1e16) return finish('no-descent');
      }
    }
  }
  return finish(ss <= o.exactSumOfSquares ? 'exact-fit' : 'iteration-limit');
}

/** The bounds of a problem, each −∞/+∞ where not given, checked against the parameters. */
function boundsOf(np: number, lower?: readonly number[], upper?: readonly number[]) {
  ensure(np > 0, 'least squares: expected at least one parameter');
  const lo = lower ?? new Array<number>(np).fill(Number.NEGATIVE_INFINITY);
  const hi = upper ?? new Array<number>(np).fill(Number.POSITIVE_INFINITY);
  ensure(lo.length === np && hi.length === np, 'least squares: bounds must match the parameters');
  return { lower: lo, upper: hi };
}

/** `p` moved into the box. */
function clamped(p: readonly number[], lower: readonly number[], upper: readonly number[]): number[] {
  return p.map((x, j) => Math.min(Math.max(x, lower[j] ?? x), upper[j] ?? x));
}

/**
 * Minimises Σ rᵢ(p)² from `problem.start` within the bounds.
 * @throws InputError for an empty start or bounds of the wrong length.
 */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  options: LeastSquaresOptions = {},
): LeastSquaresResult {
  const o = { ...LEAST_SQUARES_DEFAULTS, ...options };
  const { lower, upper } = boundsOf(problem.start.length, problem.lower, problem.upper);
  let evaluations = 0;
  const residuals = (p: readonly number[]) => {
    evaluations++;
    return [...problem.residuals(p)];
  };
  const m = minimise(
    clamped(problem.start, lower, upper),
    lower,
    upper,
    residuals,
    {
      at: (p, r) => (problem.jacobian ? problem.jacobian(p, r) : forwardJacobian(residuals, p, r)),
      normal: normalEquations,
    },
    o,
  );
  return {
    parameters: m.p,
    residuals: m.r,
    sumOfSquares: m.ss,
    jacobian: m.J,
    iterations: m.iterations,
    evaluations,
    converged: m.reason !== 'iteration-limit' && m.reason !== 'no-descent',
    reason: m.reason,
  };
}

/**
 * (JᵀJ)⁻¹ from a Jacobian by singular-value decomposition, or null when J is rank-deficient
 * (smallest singular value below `rcond` times the largest), i.e. when the data do not fix the
 * parameters separately. Multiply by the residual variance, or use a Jacobian of residuals
 * divided by their standard uncertainties, to get the parameter covariance (e.g. Press et al.,
 * Numerical Recipes, 3rd ed., 2007, §15.4–15.5).
 */
export function inverseNormalMatrix(
  jacobian: readonly (readonly number[])[],
  rcond = 1e-10,
): number[][] | null {
  const J = new Matrix(jacobian.map((row) => [...row]));
  const svd = new SingularValueDecomposition(J, { autoTranspose: true });
  const s = svd.diagonal;
  const smax = Math.max(...s);
  const np = J.columns;
  if (s.length < np || !(smax > 0) || s.some((x) => !(x > rcond * smax))) return null;
  const V = svd.rightSingularVectors;
  const out: number[][] = [];
  for (let i = 0; i < np; i++) {
    const row: number[] = [];
    for (let j = 0; j < np; j++) {
      let sum = 0;
      for (let k = 0; k < s.length; k++) sum += (V.get(i, k) * V.get(j, k)) / (s[k] ?? 1) ** 2;
      row.push(sum);
    }
    out.push(row);
  }
  return out;
}

/**
 * A model of a whole curve: fills `values[i]` with its value at `x[i]` and
 * `gradients[k·n + i]` with ∂value/∂p[k] there (n = x.length; one column of the Jacobian
 * after another), every entry, each call.
 */
export type CurveModel = (
  p: Float64Array,
  x: ArrayLike<number>,
  values: Float64Array,
  gradients: Float64Array,
) => void;

/** Options of {@link fitCurve}. */
export interface CurveFitOptions {
  /** Lower bounds of the parameters. @default none */
  readonly min?: ArrayLike<number>;
  /** Upper bounds of the parameters. @default none */
  readonly max?: ArrayLike<number>;
  /** Iteration limit. @default LEAST_SQUARES_DEFAULTS.maxIterations */
  readonly maxIterations?: number;
  /** Stop when a step lowers the sum of squares by less than this fraction. @default 1e-9 */
  readonly relativeTolerance?: number;
  /** See {@link LeastSquaresOptions.holdAtBounds}. @default false */
  readonly holdAtBounds?: boolean;
}

/** Default relative tolerance of {@link fitCurve}: a curve of noisy data needs no more. */
export const CURVE_FIT_TOLERANCE = 1e-9;

/** A fitted curve: parameters, χ² = Σ residual², JᵀJ (row-major) and iterations. */
export interface CurveFitResult {
  readonly p: Float64Array;
  readonly chi2: number;
  readonly curvature: Float64Array;
  readonly iterations: number;
  readonly reason: StopReason;
}

/**
 * JᵀJ and g = Jᵀr for J = −G, the model gradients G stored column after column: each entry is
 * the same sum, term for term in the same order, as {@link normalEquations} forms on the rows of
 * J ((−a)(−b) = ab exactly), so the steps are bit-identical. The loops run entry by entry down
 * the columns, so each sum stays in a register: the fit of a spectrum forms these sums
 * thousands of times over hundreds of points.
 */
function gradientNormalEquations(
  columns: Float64Array,
  np: number,
  r: readonly number[],
  ss: number,
): NormalEquations {
  const n = r.length;
  const a = new Float64Array(np * np);
  const g = new Array<number>(np);
  for (let j = 0; j < np; j++) {
    const cj = j * n;
    let gj = 0;
    for (let i = 0; i < n; i++) {
      const v = columns[cj + i] as number;
      if (v !== 0) gj += -v * (r[i] as number);
    }
    g[j] = gj;
    // Four entries of the row at a time (each its own sum, in the same order), so each value
    // of column j is read once for four products.
    let k = j;
    for (; k + 3 < np; k += 4) {
      const c0 = k * n;
      const c1 = c0 + n;
      const c2 = c1 + n;
      const c3 = c2 + n;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let i = 0; i < n; i++) {
        const v = columns[cj + i] as number;
        if (v === 0) continue;
        s0 += v * (columns[c0 + i] as number);
        s1 += v * (columns[c1 + i] as number);
        s2 += v * (columns[c2 + i] as number);
        s3 += v * (columns[c3 + i] as number);
      }
      a[j * np + k] = s0;
      a[j * np + k + 1] = s1;
      a[j * np + k + 2] = s2;
      a[j * np + k + 3] = s3;
    }
    for (; k < np; k++) {
      const ck = k * n;
      let s = 0;
      for (let i = 0; i < n; i++) {
        const v = columns[cj + i] as number;
        if (v !== 0) s += v * (columns[ck + i] as number);
      }
      a[j * np + k] = s;
    }
  }
  return completed(a, g, np, ss);
}

/**
 * Fits y ≈ model(p, x) by the iteration of {@link levenbergMarquardt}, with the model's analytic
 * gradient as the Jacobian: the form the band decomposition of spectra needs.
 * @throws InputError for an empty start or bounds of the wrong length.
 */
export function fitCurve(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  model: CurveModel,
  p0: ArrayLike<number>,
  options: CurveFitOptions = {},
): CurveFitResult {
  const P = p0.length;
  const n = x.length;
  const values = new Float64Array(n);
  // The model gives its gradient with every value, so each evaluation keeps it: the Jacobian
  // asked for next, at the point just evaluated, is then read back instead of computed again.
  // Two buffers take turns, so a trial point never overwrites the Jacobian in use.
  const buffers = [new Float64Array(n * P), new Float64Array(n * P)];
  let current = 0;
  let lastQ: Float64Array | undefined;
  const evaluate = (q: Float64Array, r: number[] | undefined) => {
    model(q, x, values, buffers[1 - current] as Float64Array);
    if (r) for (let i = 0; i < n; i++) r[i] = (y[i] as number) - (values[i] as number);
    lastQ = q;
  };
  const residuals = (p: readonly number[]) => {
    const r = new Array<number>(n);
    evaluate(Float64Array.from(p), r);
    return r;
  };
  const jacobian = (p: readonly number[]): Float64Array => {
    if (!lastQ || p.some((v, k) => v !== lastQ?.[k])) evaluate(Float64Array.from(p), undefined);
    current = 1 - current;
    return buffers[current] as Float64Array;
  };
  const { lower, upper } = boundsOf(
    P,
    options.min ? Array.from(options.min) : undefined,
    options.max ? Array.from(options.max) : undefined,
  );
  const o = {
    ...LEAST_SQUARES_DEFAULTS,
    maxIterations: options.maxIterations ?? LEAST_SQUARES_DEFAULTS.maxIterations,
    reductionTolerance: options.relativeTolerance ?? CURVE_FIT_TOLERANCE,
    holdAtBounds: options.holdAtBounds ?? LEAST_SQUARES_DEFAULTS.holdAtBounds,
  };
  const m = minimise(
    clamped(Array.from(p0), lower, upper),
    lower,
    upper,
    residuals,
    { at: jacobian, normal: (G, r, ss) => gradientNormalEquations(G, P, r, ss) },
    o,
  );
  // JᵀJ at the solution, each entry summed over the points in order, as from the rows of J.
  const curvature = new Float64Array(P * P);
  for (let j = 0; j < P; j++) {
    for (let k = 0; k < P; k++) {
      let s = 0;
      for (let i = 0; i < n; i++) {
        const a = -(m.J[j * n + i] as number);
        if (a !== 0) s += a * -(m.J[k * n + i] as number);
      }
      curvature[j * P + k] = s;
    }
  }
  return {
    p: Float64Array.from(m.p),
    chi2: m.ss,
    curvature,
    iterations: m.iterations,
    reason: m.reason,
  };
}

/**
 * The covariance s² (JᵀJ)⁻¹ (row-major) from a curvature matrix JᵀJ; `undefined` when JᵀJ is
 * singular (a parameter the data do not determine).
 */
export function covariance(curvature: Float64Array, size: number, s2: number): Float64Array | undefined {
  const a = new Matrix(size, size);
  for (let j = 0; j < size; j++)
    for (let k = 0; k < size; k++) a.set(j, k, curvature[j * size + k] as number);
  const chol = new CholeskyDecomposition(a);
  if (!chol.isPositiveDefinite()) return undefined;
  const inv = chol.solve(Matrix.eye(size, size));
  const out = new Float64Array(size * size);
  for (let j = 0; j < size; j++) for (let k = 0; k < size; k++) out[j * size + k] = s2 * inv.get(j, k);
  return out;
}
