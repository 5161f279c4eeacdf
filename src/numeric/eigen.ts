/**
 * Dense linear algebra for the solvers: symmetric eigen-decomposition (tridiagonalQl.ts),
 * congruence transforms and bilinear forms, resolution of a degenerate subspace by a second
 * operator, and clustering of sorted eigenvalues into degenerate runs.
 */

import { tridiagonalQl } from './tridiagonalQl.js';

/** Eigenvalues (ascending) and orthonormal eigenvectors of a real symmetric matrix. */
export interface SymmetricEigen {
  readonly size: number;
  readonly values: Float64Array;
  /** Row-major n×n; column j is the eigenvector of `values[j]` (its overall sign is arbitrary). */
  readonly vectors: Float64Array;
}

/**
 * Diagonalises a real symmetric row-major matrix by Householder tridiagonalisation and QL
 * iteration (tred2/tql2, the same arithmetic as ml-matrix's), pairs sorted by eigenvalue.
 */
export function symmetricEigen(a: Float64Array, n: number): SymmetricEigen {
  if (n === 0) return { size: 0, values: new Float64Array(0), vectors: new Float64Array(0) };
  if (n === 1) return { size: 1, values: Float64Array.of(a[0] ?? 0), vectors: Float64Array.of(1) };
  const { values, vectors } = tridiagonalQl(a, n);
  return { size: n, values, vectors };
}

/**
 * Wᵀ X W: the operator X (row-major n×n) carried into the basis of W's m orthonormal columns
 * (W row-major n×m). Returns m×m.
 */
export function congruence(w: Float64Array, x: Float64Array, n: number, m = n): Float64Array {
  const xw = new Float64Array(n * m);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < n; k++) {
      const xik = x[i * n + k] ?? 0;
      if (xik === 0) continue;
      for (let j = 0; j < m; j++) xw[i * m + j] = (xw[i * m + j] ?? 0) + xik * (w[k * m + j] ?? 0);
    }
  }
  const out = new Float64Array(m * m);
  for (let k = 0; k < n; k++) {
    for (let i = 0; i < m; i++) {
      const wki = w[k * m + i] ?? 0;
      if (wki === 0) continue;
      for (let j = 0; j < m; j++) out[i * m + j] = (out[i * m + j] ?? 0) + wki * (xw[k * m + j] ?? 0);
    }
  }
  return out;
}

/** Column j of a row-major n×n matrix. */
export function column(m: Float64Array, n: number, j: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = m[i * n + j] ?? 0;
  return out;
}

/** uᵀ A v for a row-major n×n matrix A. */
export function bilinear(u: Float64Array, a: Float64Array, v: Float64Array): number {
  const n = u.length;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const ui = u[i] ?? 0;
    if (ui === 0) continue;
    let row = 0;
    for (let j = 0; j < n; j++) row += (a[i * n + j] ?? 0) * (v[j] ?? 0);
    sum += ui * row;
  }
  return sum;
}

/**
 * Splits the span of orthonormal vectors into eigenspaces of a symmetric operator that commutes
 * with whatever made them degenerate: diagonalises the operator restricted to the span and
 * groups its eigenvalues within `tol`. Returns each group's value and orthonormal vectors.
 */
export function resolveSubspace(
  vectors: readonly Float64Array[],
  op: Float64Array,
  tol: number,
): { value: number; vectors: Float64Array[] }[] {
  const m = vectors.length;
  if (m === 0) return [];
  const first = vectors[0];
  if (m === 1 && first) return [{ value: bilinear(first, op, first), vectors: [first] }];
  const small = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = i; j < m; j++) {
      const vi = vectors[i];
      const vj = vectors[j];
      if (!vi || !vj) continue;
      const x = bilinear(vi, op, vj);
      small[i * m + j] = x;
      small[j * m + i] = x;
    }
  }
  const eig = symmetricEigen(small, m);
  const dim = first?.length ?? 0;
  const groups: { value: number; vectors: Float64Array[] }[] = [];
  for (let c = 0; c < m; c++) {
    const v = new Float64Array(dim);
    for (let i = 0; i < m; i++) {
      const w = eig.vectors[i * m + c] ?? 0;
      const vi = vectors[i];
      if (!vi || w === 0) continue;
      for (let r = 0; r < dim; r++) v[r] = (v[r] ?? 0) + w * (vi[r] ?? 0);
    }
    const value = eig.values[c] ?? 0;
    const last = groups[groups.length - 1];
    if (last && Math.abs(value - last.value) <= tol) last.vectors.push(v);
    else groups.push({ value, vectors: [v] });
  }
  return groups;
}

/** Groups ascending values into runs whose neighbours differ by at most `tol`; returns index runs. */
export function clusterSorted(values: readonly number[], tol: number): number[][] {
  const runs: number[][] = [];
  values.forEach((v, i) => {
    const last = runs[runs.length - 1];
    const prev = i > 0 ? values[i - 1] : undefined;
    if (last && prev !== undefined && v - prev <= tol) last.push(i);
    else runs.push([i]);
  });
  return runs;
}
