import { describe, expect, it } from 'vitest';
import { inverseNormalMatrix, levenbergMarquardt } from '../../src/numeric/leastSquares.js';

// A straight line through scattered points: the least-squares line and its covariance have
// closed forms (e.g. Press et al., Numerical Recipes, 3rd ed., 2007, §15.2).
const xs = [1, 2, 3, 4, 5, 6];
const ys = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2];

function lineClosedForm() {
  const n = xs.length;
  const mx = xs.reduce((s, x) => s + x, 0) / n;
  const my = ys.reduce((s, y) => s + y, 0) / n;
  const sxx = xs.reduce((s, x) => s + (x - mx) ** 2, 0);
  const sxy = xs.reduce((s, x, i) => s + (x - mx) * ((ys[i] ?? 0) - my), 0);
  const b = sxy / sxx;
  const a = my - b * mx;
  const s2 = xs.reduce((s, x, i) => s + ((ys[i] ?? 0) - a - b * x) ** 2, 0) / (n - 2);
  return { a, b, varA: s2 * (1 / n + mx ** 2 / sxx), varB: s2 / sxx, s2 };
}

const rosenbrock = (p: readonly number[]) => [10 * ((p[1] ?? 0) - (p[0] ?? 0) ** 2), 1 - (p[0] ?? 0)];

describe('levenbergMarquardt', () => {
  it('finds the least-squares line of the closed form, with the default finite-difference Jacobian', () => {
    const fit = levenbergMarquardt({
      start: [0, 0],
      residuals: (p) => xs.map((x, i) => (p[0] ?? 0) + (p[1] ?? 0) * x - (ys[i] ?? 0)),
    });
    const exact = lineClosedForm();
    expect(fit.converged).toBe(true);
    expect(fit.parameters[0]).toBeCloseTo(exact.a, 8);
    expect(fit.parameters[1]).toBeCloseTo(exact.b, 8);
  });

  it('gives the closed-form covariance through inverseNormalMatrix times the residual variance', () => {
    const J = xs.map((x) => [1, x]);
    const inverse = inverseNormalMatrix(J);
    const exact = lineClosedForm();
    expect(inverse).not.toBeNull();
    expect((inverse?.[0]?.[0] ?? 0) * exact.s2).toBeCloseTo(exact.varA, 12);
    expect((inverse?.[1]?.[1] ?? 0) * exact.s2).toBeCloseTo(exact.varB, 12);
  });

  it('reaches the minimum (1, 1) of the Rosenbrock function as an exact fit (Rosenbrock, Comput. J. 3, 175, 1960)', () => {
    const fit = levenbergMarquardt(
      {
        start: [-1.2, 1],
        residuals: rosenbrock,
        jacobian: (p) => [
          [-20 * (p[0] ?? 0), 10],
          [-1, 0],
        ],
      },
      { exactSumOfSquares: 1e-24 },
    );
    expect(fit.reason).toBe('exact-fit');
    expect(fit.converged).toBe(true);
    expect(fit.parameters[0]).toBeCloseTo(1, 10);
    expect(fit.parameters[1]).toBeCloseTo(1, 10);
  });

  it('stops at the iteration limit and says it did not converge', () => {
    const fit = levenbergMarquardt({ start: [-1.2, 1], residuals: rosenbrock }, { maxIterations: 2 });
    expect(fit.iterations).toBe(2);
    expect(fit.converged).toBe(false);
    expect(fit.reason).toBe('iteration-limit');
  });

  it('keeps a parameter inside its bounds and converges onto the bound', () => {
    const fit = levenbergMarquardt({ start: [0], upper: [2], residuals: (p) => [(p[0] ?? 0) - 3] });
    expect(fit.parameters[0]).toBe(2);
    expect(fit.converged).toBe(true);
    expect(fit.reason).toBe('small-step');
  });

  it('stops on a vanishing gradient or a tiny step for a nonzero residual, not at the limit', () => {
    const fit = levenbergMarquardt({ start: [10], residuals: (p) => [(p[0] ?? 0) - 1, (p[0] ?? 0) - 3] });
    expect(fit.parameters[0]).toBeCloseTo(2, 8);
    expect(fit.converged).toBe(true);
    expect(fit.iterations).toBeLessThan(10);
  });
});

describe('levenbergMarquardt with holdAtBounds', () => {
  // r = (p0 − 3, p1 − 1, p0 + p1 − 4) with p0 ≤ 2: on the bound, Σr² in p1 alone is least at
  // p1 = 1.5 (closed form: the mean of 1 and 2).
  const problem = {
    residuals: (p: readonly number[]) => [(p[0] ?? 0) - 3, (p[1] ?? 0) - 1, (p[0] ?? 0) + (p[1] ?? 0) - 4],
    start: [0, 0],
    upper: [2, Number.POSITIVE_INFINITY],
  };

  it('levenbergMarquardt holds a parameter pushed against its bound and solves for the others', () => {
    const r = levenbergMarquardt(problem, { holdAtBounds: true });
    expect(r.converged).toBe(true);
    expect(r.parameters[0]).toBe(2);
    expect(r.parameters[1]).toBeCloseTo(1.5, 8);
  });

  it('levenbergMarquardt without holdAtBounds stops short there: the clamped steps are no descent steps of p1', () => {
    const clamped = levenbergMarquardt(problem);
    expect(clamped.parameters[0]).toBe(2);
    expect(Math.abs((clamped.parameters[1] ?? 0) - 1.5)).toBeGreaterThan(1e-3);
  });
});

describe('inverseNormalMatrix', () => {
  it('returns null when the columns are dependent or there are fewer rows than parameters', () => {
    expect(
      inverseNormalMatrix([
        [1, 2],
        [2, 4],
        [3, 6],
      ]),
    ).toBeNull();
    expect(inverseNormalMatrix([[1, 2]])).toBeNull();
  });
});
