import { Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { qrLeastSquares } from '../../src/numeric/householderQr.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';

/** A random m×n matrix, column-major, and the same as ml-matrix rows. */
function randomTall(m: number, n: number, random: () => number) {
  const a = Float64Array.from({ length: m * n }, () => random() * 2 - 1);
  const rows = Array.from({ length: m }, (_, i) =>
    Array.from({ length: n }, (_, j) => a[j * m + i] as number),
  );
  return { a, rows };
}

describe('qrLeastSquares', () => {
  it('qrLeastSquares equals ml-matrix’s solve of a tall system bit for bit', () => {
    const random = uniformRandom(11);
    for (const [m, n] of [
      [5, 2],
      [40, 7],
      [300, 12],
    ] as const) {
      const { a, rows } = randomTall(m, n, random);
      const b = Array.from({ length: m }, () => random());
      const reference = solve(new Matrix(rows), Matrix.columnVector(b)).getColumn(0);
      expect(Array.from(qrLeastSquares(a, m, n, b) ?? [])).toEqual(reference);
    }
  });

  it('qrLeastSquares fits the least-squares line of the closed form (Press et al., Numerical Recipes, 3rd ed., 2007, §15.2)', () => {
    const x = [0, 1, 2, 3, 4];
    const y = [1.1, 2.9, 5.2, 6.8, 9.1];
    const m = x.length;
    const a = Float64Array.from([...x.map(() => 1), ...x]);
    const [b0, b1] = qrLeastSquares(a, m, 2, y) ?? [];
    const mx = x.reduce((s, v) => s + v, 0) / m;
    const my = y.reduce((s, v) => s + v, 0) / m;
    const slope =
      x.reduce((s, v, i) => s + (v - mx) * ((y[i] as number) - my), 0) /
      x.reduce((s, v) => s + (v - mx) ** 2, 0);
    expect(b1).toBeCloseTo(slope, 12);
    expect(b0).toBeCloseTo(my - slope * mx, 12);
  });

  it('qrLeastSquares returns undefined when R has a zero on its diagonal (here a zero column)', () => {
    const a = Float64Array.from([1, 2, 3, 0, 0, 0]);
    expect(qrLeastSquares(a, 3, 2, [1, 2, 3])).toBeUndefined();
  });
});
