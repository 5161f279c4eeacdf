import { EigenvalueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { adaptedBlocks } from '../../src/field/cubicBasis.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';
import { tridiagonalQl, tridiagonalQlValues } from '../../src/numeric/tridiagonalQl.js';

/** ml-matrix's decomposition of the same matrix, as plain arrays: the reference the port must match. */
function reference(a: Float64Array, n: number): { values: number[]; vectors: number[] } {
  const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
  const evd = new EigenvalueDecomposition(rows, { assumeSymmetric: true });
  const V = evd.eigenvectorMatrix;
  const vectors: number[] = [];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) vectors.push(V.get(i, j));
  return { values: evd.realEigenvalues, vectors };
}

function randomSymmetric(n: number, random: () => number): Float64Array {
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const x = random() * 2 - 1;
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  }
  return a;
}

describe('tridiagonalQl', () => {
  it('tridiagonalQl equals ml-matrix’s EigenvalueDecomposition bit for bit on random symmetric matrices', () => {
    const random = uniformRandom(11);
    for (const n of [2, 3, 7, 18, 33]) {
      const a = randomSymmetric(n, random);
      const { values, vectors } = tridiagonalQl(a, n);
      const expected = reference(a, n);
      expect(Array.from(values)).toEqual(expected.values);
      expect(Array.from(vectors)).toEqual(expected.vectors);
      expect(Array.from(tridiagonalQlValues(a, n))).toEqual(expected.values);
    }
  });

  it('tridiagonalQl equals ml-matrix bit for bit on the d5 Hamiltonian blocks, degenerate levels included', () => {
    for (const block of adaptedBlocks(5)) {
      const m = block.size;
      const h = new Float64Array(m * m);
      for (let i = 0; i < h.length; i++) h[i] = 800 * (block.partB[i] ?? 0) + 3600 * (block.partC[i] ?? 0);
      for (let i = 0; i < m; i++) h[i * m + i] = (h[i * m + i] ?? 0) + 1500 * (block.fieldDiagonal[i] ?? 0);
      if (m < 2) continue;
      const { values, vectors } = tridiagonalQl(h, m);
      const expected = reference(h, m);
      expect(Array.from(values)).toEqual(expected.values);
      expect(Array.from(vectors)).toEqual(expected.vectors);
      expect(Array.from(tridiagonalQlValues(h, m))).toEqual(expected.values);
    }
  });

  it('tridiagonalQl of a diagonal matrix returns its entries sorted with unit vectors', () => {
    const { values, vectors } = tridiagonalQl(Float64Array.from([3, 0, 0, 0, -1, 0, 0, 0, 2]), 3);
    expect(Array.from(values)).toEqual([-1, 2, 3]);
    expect(Array.from(vectors).map(Math.abs)).toEqual([0, 0, 1, 1, 0, 0, 0, 1, 0]);
  });
});
