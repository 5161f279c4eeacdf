/**
 * Linear least squares, x minimising ‖A·x − b‖ for a matrix A with more rows than columns, by
 * Householder QR: the procedure of JAMA's QRDecomposition (Hicks, Moler et al., public domain) in
 * the same operations and order as ml-matrix's QrDecomposition and its solve, which `solve` of
 * ml-matrix uses for such a matrix, so the solution agrees with it bit for bit
 * (test/numeric/householderQr.test.ts holds it to that).
 *
 * Written here on a column-major typed array because ml-matrix reads and writes every element
 * through a method call: the one solve of a spectrum's band search for the starting heights
 * (hundreds of points, a dozen columns) took a tenth of the whole command there.
 */

import { hypotenuse } from './tridiagonalQl.js';

/**
 * The least-squares solution of A·x = b, A given column-major (`a[j·m + i]` = A[i][j], m rows,
 * n columns, m ≥ n), or undefined when A is rank-deficient (a zero on R's diagonal).
 */
export function qrLeastSquares(
  a: Float64Array,
  m: number,
  n: number,
  b: ArrayLike<number>,
): Float64Array | undefined {
  const qr = Float64Array.from(a);
  const rdiag = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    let nrm = 0;
    for (let i = k; i < m; i++) nrm = hypotenuse(nrm, qr[ck + i] as number);
    if (nrm !== 0) {
      if ((qr[ck + k] as number) < 0) nrm = -nrm;
      for (let i = k; i < m; i++) qr[ck + i] = (qr[ck + i] as number) / nrm;
      qr[ck + k] = (qr[ck + k] as number) + 1;
      for (let j = k + 1; j < n; j++) {
        const cj = j * m;
        let s = 0;
        for (let i = k; i < m; i++) s += (qr[ck + i] as number) * (qr[cj + i] as number);
        s = -s / (qr[ck + k] as number);
        for (let i = k; i < m; i++) qr[cj + i] = (qr[cj + i] as number) + s * (qr[ck + i] as number);
      }
    }
    rdiag[k] = -nrm;
  }
  if (rdiag.some((d) => d === 0)) return undefined;
  const x = Float64Array.from(b);
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    let s = 0;
    for (let i = k; i < m; i++) s += (qr[ck + i] as number) * (x[i] as number);
    s = -s / (qr[ck + k] as number);
    for (let i = k; i < m; i++) x[i] = (x[i] as number) + s * (qr[ck + i] as number);
  }
  for (let k = n - 1; k >= 0; k--) {
    x[k] = (x[k] as number) / (rdiag[k] as number);
    for (let i = 0; i < k; i++) x[i] = (x[i] as number) - (x[k] as number) * (qr[k * m + i] as number);
  }
  return x.slice(0, n);
}
