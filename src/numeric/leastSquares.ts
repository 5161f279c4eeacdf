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
 * JᵀJ and the gradient g = Jᵀr, with the largest cosine between r and a column of J, which is
 * zero at a stationary point whatever the scale of the parameters. Plain loops: spectra give
 * thousands of residuals, and building ml-matrix objects of that size each iteration cost more
 * than the sums themselves.
 */
function normalEquations(J: readonly (readonly number[])[], r: readonly number[], ss: number) {
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
  const A = new Matrix(np, np);
  for (let j = 0; j < np; j++) {
    for (let k = j; k < np; k++) {
      const v = a[j * np + k] as number;
      A.set(j, k, v);
      A.set(k, j, v);
    }
  }
  const rNorm = Math.sqrt(ss);
  const cosine = Math.max(...g.map((gj, j) => Math.abs(gj) / (Math.sqrt(A.get(j, j)) * rNorm || 1)));
  return { A, g, cosine };
}

/**
 * The step of the damped normal equations (JᵀJ + μ·diag(scale))·δ = −g, or undefined when the
 * damped matrix is not positive definite (the damping must grow).
 */
function dampedStep(
  A: Matrix,
  g: readonly number[],
  mu: number,
  scale: readonly number[],
  held: ReadonlySet<number>,
): number[] | undefined {
  const np = g.length;
  const damped = new Float64Array(np * np);
  for (let j = 0; j < np; j++) {
    for (let k = 0; k < np; k++) damped[j * np + k] = A.get(j, k);
    damped[j * np + j] = A.get(j, j) + mu * (scale[j] ?? 1);
  }
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
function predictedDecrease(A: Matrix, g: readonly number[], step: readonly number[]): number {
  const As = A.mmul(Matrix.columnVector(step)).to1DArray();
  return -step.reduce((s, sj, j) => s + sj * (2 * (g[j] ?? 0) + (As[j] ?? 0)), 0);
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
  const np = problem.start.length;
  ensure(np > 0, 'least squares: expected at least one parameter');
  const lower = problem.lower ?? problem.start.map(() => Number.NEGATIVE_INFINITY);
  const upper = problem.upper ?? problem.start.map(() => Number.POSITIVE_INFINITY);
  ensure(lower.length === np && upper.length === np, 'least squares: bounds must match the parameters');
  const clamp = (p: readonly number[]) =>
    p.map((x, j) => Math.min(Math.max(x, lower[j] ?? x), upper[j] ?? x));
  let evaluations = 0;
  const residuals = (p: readonly number[]) => {
    evaluations++;
    return problem.residuals(p);
  };
  const jacobianOf = (p: readonly number[], r: readonly number[]) =>
    problem.jacobian ? problem.jacobian(p, r) : forwardJacobian(residuals, p, r);

  let p = clamp(problem.start);
  let r = [...residuals(p)];
  let ss = sumSquares(r);
  let J = jacobianOf(p, r);
  let mu = o.initialDamping;
  let nu = 2;
  let iterations = 0;
  const finish = (reason: StopReason): LeastSquaresResult => ({
    parameters: p,
    residuals: r,
    sumOfSquares: ss,
    jacobian: J,
    iterations,
    evaluations,
    converged: reason !== 'iteration-limit' && reason !== 'no-descent',
    reason,
  });

  while (iterations < o.maxIterations) {
    if (ss <= o.exactSumOfSquares) return finish('exact-fit');
    iterations++;
    const { A, g, cosine } = normalEquations(J, r, ss);
    if (cosine <= o.gradientTolerance) return finish('small-gradient');
    // Marquardt's scaling; a parameter no residual depends on gets a unit scale instead of zero.
    const scale = g.map((_, j) => A.get(j, j) || 1);
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
      const trial = clamp(p.map((x, j) => x + (delta[j] ?? 0)));
      const step = trial.map((x, j) => x - (p[j] ?? 0));
      if (isSmallStep(step, p, o.stepTolerance)) return finish('small-step');
      const rt = [...residuals(trial)];
      const sst = sumSquares(rt);
      const predicted = predictedDecrease(A, g, step);
      const actual = ss - sst;
      if (actual > 0 && Number.isFinite(sst)) {
        const rho = predicted > 0 ? actual / predicted : 1;
        const small = actual <= o.reductionTolerance * ss && predicted <= o.reductionTolerance * ss;
        p = trial;
        r = rt;
        ss = sst;
        J = jacobianOf(p, r);
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
 * A model of one curve point: returns its value at `x` and fills `gradient[k]` with
 * ∂value/∂p[k] (`gradient` has the length of p).
 */
export type GradientModel = (p: Float64Array, x: number, gradient: Float64Array) => number;

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
 * Fits y ≈ model(p, x) by {@link levenbergMarquardt}, with the model's analytic gradient as the
 * Jacobian: the form the band decomposition of spectra needs.
 */
export function fitCurve(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  model: GradientModel,
  p0: ArrayLike<number>,
  options: CurveFitOptions = {},
): CurveFitResult {
  const P = p0.length;
  const n = x.length;
  const g = new Float64Array(P);
  // The model gives its gradient with every value, so each evaluation keeps it: the Jacobian
  // asked for next, at the point just evaluated, is then read back instead of computed again.
  let lastQ: Float64Array | undefined;
  let lastGradients = new Float64Array(0);
  const evaluate = (q: Float64Array, r: number[] | undefined, gradients: Float64Array) => {
    for (let i = 0; i < n; i++) {
      g.fill(0);
      const v = model(q, x[i] as number, g);
      if (r) r[i] = (y[i] as number) - v;
      gradients.set(g, i * P);
    }
  };
  const residuals = (p: readonly number[]) => {
    const q = Float64Array.from(p);
    const r = new Array<number>(n);
    lastGradients = new Float64Array(n * P);
    evaluate(q, r, lastGradients);
    lastQ = q;
    return r;
  };
  const jacobian = (p: readonly number[]) => {
    const q = Float64Array.from(p);
    let gradients = lastGradients;
    if (!lastQ || q.some((v, k) => v !== lastQ?.[k])) {
      gradients = new Float64Array(n * P);
      evaluate(q, undefined, gradients);
    }
    const rows: number[][] = [];
    for (let i = 0; i < n; i++) {
      const row = new Array<number>(P);
      for (let k = 0; k < P; k++) row[k] = -(gradients[i * P + k] as number);
      rows.push(row);
    }
    return rows;
  };
  const result = levenbergMarquardt(
    {
      start: Array.from(p0),
      residuals,
      jacobian,
      ...(options.min ? { lower: Array.from(options.min) } : {}),
      ...(options.max ? { upper: Array.from(options.max) } : {}),
    },
    {
      maxIterations: options.maxIterations ?? LEAST_SQUARES_DEFAULTS.maxIterations,
      reductionTolerance: options.relativeTolerance ?? CURVE_FIT_TOLERANCE,
      holdAtBounds: options.holdAtBounds ?? LEAST_SQUARES_DEFAULTS.holdAtBounds,
    },
  );
  const curvature = new Float64Array(P * P);
  for (const row of result.jacobian) {
    for (let j = 0; j < P; j++) {
      const a = row[j] ?? 0;
      if (a === 0) continue;
      for (let k = 0; k < P; k++) curvature[j * P + k] = (curvature[j * P + k] as number) + a * (row[k] ?? 0);
    }
  }
  return {
    p: Float64Array.from(result.parameters),
    chi2: result.sumOfSquares,
    curvature,
    iterations: result.iterations,
    reason: result.reason,
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
