/**
 * Brent's method for a root of a continuous function in a bracketing interval: bisection's
 * safety with inverse quadratic interpolation's speed (Brent, Algorithms for Minimization
 * without Derivatives, 1973, ch. 4).
 */

/** Options of {@link brentRoot}. */
export interface RootOptions {
  /** Absolute tolerance on x. @default 1e-10 */
  readonly xTolerance?: number;
  /** Iteration limit. @default 200 */
  readonly maxIterations?: number;
}

/** Default absolute tolerance on x for {@link brentRoot}. */
export const DEFAULT_ROOT_TOLERANCE = 1e-10;

/**
 * A root of `f` in [a, b], where f(a) and f(b) have opposite signs (or one is zero).
 * @throws RangeError when the interval does not bracket a sign change.
 */
export function brentRoot(f: (x: number) => number, a: number, b: number, options: RootOptions = {}): number {
  const { xTolerance = DEFAULT_ROOT_TOLERANCE, maxIterations = 200 } = options;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) throw new RangeError(`no sign change of the function between ${a} and ${b}`);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < maxIterations; i++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xTolerance;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}
