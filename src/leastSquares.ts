import { CholeskyDecomposition, Matrix } from 'ml-matrix';

/**
 * Damped non-linear least squares (Levenberg–Marquardt) with bounds, for models with an
 * analytic gradient (Marquardt, J. SIAM 11, 431, 1963; Press et al., Numerical Recipes, 3rd
 * ed., 2007, §15.5).
 *
 * Written here rather than taken from ml-levenberg-marquardt because that package stops only
 * when the sum of squares falls below an absolute threshold (with noisy data it always runs to
 * its iteration limit), keeps steps that raise the sum of squares, and returns no curvature
 * matrix; band decomposition fits many models per spectrum and needs a relative stopping rule,
 * rejected uphill steps, and JᵀJ for the parameter uncertainties.
 */

/**
 * A model: writes its value at `x` and returns it, filling `gradient[k]` with ∂value/∂p[k]
 * (gradient has the length of p).
 */
export type GradientModel = (p: Float64Array, x: number, gradient: Float64Array) => number;

/** Options of {@link leastSquares}. */
export interface LeastSquaresOptions {
  /** Lower bounds of the parameters. @default none */
  readonly min?: ArrayLike<number>;
  /** Upper bounds of the parameters. @default none */
  readonly max?: ArrayLike<number>;
  /** Iteration limit. @default 200 */
  readonly maxIterations?: number;
  /** Stop when an accepted step lowers the sum of squares by less than this fraction. @default 1e-9 */
  readonly relativeTolerance?: number;
}

/** Default iteration limit of {@link leastSquares}. */
export const LEAST_SQUARES_MAX_ITERATIONS = 200;
/** Default relative stopping tolerance of {@link leastSquares}. */
export const LEAST_SQUARES_TOLERANCE = 1e-9;

/** The result of {@link leastSquares}. */
export interface LeastSquaresResult {
  /** Best parameters. */
  readonly p: Float64Array;
  /** Sum of squared residuals at `p`. */
  readonly chi2: number;
  /** JᵀJ at `p` (row-major, P × P): the covariance is s² (JᵀJ)⁻¹. */
  readonly curvature: Float64Array;
  readonly iterations: number;
}

/**
 * Minimises Σ (y − model(p, x))² from `p0` by Levenberg–Marquardt steps with Marquardt's
 * diagonal scaling; parameters are clamped to their bounds after each step.
 */
export function leastSquares(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  model: GradientModel,
  p0: ArrayLike<number>,
  options: LeastSquaresOptions = {},
): LeastSquaresResult {
  const P = p0.length;
  const lo = options.min;
  const hi = options.max;
  const clamp = (p: Float64Array) => {
    for (let k = 0; k < P; k++) {
      const a = lo ? (lo[k] as number) : -Infinity;
      const b = hi ? (hi[k] as number) : Infinity;
      p[k] = Math.min(b, Math.max(a, p[k] as number));
    }
    return p;
  };
  const maxIterations = options.maxIterations ?? LEAST_SQUARES_MAX_ITERATIONS;
  const tolerance = options.relativeTolerance ?? LEAST_SQUARES_TOLERANCE;
  let p = clamp(Float64Array.from(p0));
  let state = normalEquations(x, y, model, p);
  let lambda = 1e-3;
  let iterations = 0;
  for (; iterations < maxIterations; iterations++) {
    const a = Matrix.zeros(P, P);
    for (let j = 0; j < P; j++) {
      for (let k = 0; k < P; k++) a.set(j, k, state.jtj[j * P + k] as number);
      // Marquardt's scaling damps each parameter in its own units; the floor keeps a
      // parameter with no gradient from making the matrix singular.
      const d = state.jtj[j * P + j] as number;
      a.set(j, j, d * (1 + lambda) + 1e-12 * (1 + d));
    }
    const chol = new CholeskyDecomposition(a);
    if (!chol.isPositiveDefinite()) {
      lambda *= 10;
      if (lambda > 1e12) break;
      continue;
    }
    const step = chol.solve(Matrix.columnVector(Array.from(state.jtr))).getColumn(0);
    const trial = clamp(p.map((v, k) => v + (step[k] as number)));
    const next = normalEquations(x, y, model, trial);
    if (next.chi2 < state.chi2) {
      const gain = state.chi2 - next.chi2;
      p = trial;
      const done = gain <= tolerance * state.chi2;
      state = next;
      lambda = Math.max(lambda / 10, 1e-12);
      if (done) break;
    } else {
      lambda *= 10;
      if (lambda > 1e12) break;
    }
  }
  return { p, chi2: state.chi2, curvature: state.jtj, iterations };
}

/** χ², JᵀJ and Jᵀr at p. */
function normalEquations(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  model: GradientModel,
  p: Float64Array,
): { chi2: number; jtj: Float64Array; jtr: Float64Array } {
  const P = p.length;
  const g = new Float64Array(P);
  const jtj = new Float64Array(P * P);
  const jtr = new Float64Array(P);
  let chi2 = 0;
  for (let i = 0; i < x.length; i++) {
    const r = (y[i] as number) - model(p, x[i] as number, g);
    chi2 += r * r;
    for (let j = 0; j < P; j++) {
      const gj = g[j] as number;
      if (gj === 0) continue;
      jtr[j] = (jtr[j] as number) + gj * r;
      for (let k = j; k < P; k++) jtj[j * P + k] = (jtj[j * P + k] as number) + gj * (g[k] as number);
    }
  }
  for (let j = 0; j < P; j++) for (let k = 0; k < j; k++) jtj[j * P + k] = jtj[k * P + j] as number;
  return { chi2, jtj, jtr };
}

/**
 * The covariance matrix s² (JᵀJ)⁻¹ (row-major) from a fit's curvature matrix; `undefined`
 * when JᵀJ is singular (a parameter the data do not determine).
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
