/**
 * Eigenvalues only of a real symmetric matrix: Householder reduction to tridiagonal form, then
 * the implicit QL iteration with Wilkinson shifts (Wilkinson & Reinsch, Handbook for Automatic
 * Computation II, 1971, procedures tred1 and tqli as in Press et al., Numerical Recipes, 3rd ed.,
 * 2007, §11.3–11.4). Written here because ml-matrix always accumulates the eigenvectors, which
 * costs about three times as much; sweeps that need the energies alone use this.
 */

/** Ascending eigenvalues of a real symmetric row-major n×n matrix (only its lower triangle is read). */
export function symmetricEigenvalues(matrix: Float64Array, n: number): Float64Array {
  const a = Float64Array.from(matrix);
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  tridiagonalise(a, n, d, e);
  implicitQL(d, e, n);
  return d.sort();
}

/** Householder reduction of `a` (overwritten) to the tridiagonal matrix of diagonal d and sub-diagonal e[1…]. */
function tridiagonalise(a: Float64Array, n: number, d: Float64Array, e: Float64Array): void {
  // Hot loops: every index stays within n×n by construction.
  for (let i = n - 1; i > 0; i--) {
    const l = i - 1;
    const row = i * n;
    let h = 0;
    if (l > 0) {
      let scale = 0;
      for (let k = 0; k <= l; k++) scale += Math.abs(a[row + k] as number);
      if (scale === 0) {
        e[i] = a[row + l] as number;
      } else {
        for (let k = 0; k <= l; k++) {
          const x = (a[row + k] as number) / scale;
          a[row + k] = x;
          h += x * x;
        }
        const f = a[row + l] as number;
        const g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        a[row + l] = f - g;
        let ff = 0;
        for (let j = 0; j <= l; j++) {
          let gg = 0;
          for (let k = 0; k <= j; k++) gg += (a[j * n + k] as number) * (a[row + k] as number);
          for (let k = j + 1; k <= l; k++) gg += (a[k * n + j] as number) * (a[row + k] as number);
          e[j] = gg / h;
          ff += (e[j] as number) * (a[row + j] as number);
        }
        const hh = ff / (h + h);
        for (let j = 0; j <= l; j++) {
          const fj = a[row + j] as number;
          const gj = (e[j] as number) - hh * fj;
          e[j] = gj;
          for (let k = 0; k <= j; k++)
            a[j * n + k] = (a[j * n + k] as number) - (fj * (e[k] as number) + gj * (a[row + k] as number));
        }
      }
    } else {
      e[i] = a[row + l] as number;
    }
    d[i] = h;
  }
  for (let i = 0; i < n; i++) d[i] = a[i * n + i] as number;
}

/** Eigenvalues of the tridiagonal (d, e) in place in d, unsorted. */
function implicitQL(d: Float64Array, e: Float64Array, n: number): void {
  for (let i = 1; i < n; i++) e[i - 1] = e[i] as number;
  if (n > 0) e[n - 1] = 0;
  for (let l = 0; l < n; l++) {
    let iterations = 0;
    for (;;) {
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m] as number) + Math.abs(d[m + 1] as number);
        if (Math.abs(e[m] as number) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++iterations > 60) throw new Error('symmetricEigenvalues: QL iteration does not converge');
      let g = ((d[l + 1] as number) - (d[l] as number)) / (2 * (e[l] as number));
      let r = Math.hypot(g, 1);
      g = (d[m] as number) - (d[l] as number) + (e[l] as number) / (g + (g >= 0 ? r : -r));
      let s = 1;
      let c = 1;
      let p = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        const f = s * (e[i] as number);
        const b = c * (e[i] as number);
        r = Math.hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1] = (d[i + 1] as number) - p;
          e[m] = 0;
          break;
        }
        s = f / r;
        c = g / r;
        g = (d[i + 1] as number) - p;
        r = ((d[i] as number) - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
      }
      if (r === 0 && i >= l) continue;
      d[l] = (d[l] as number) - p;
      e[l] = g;
      e[m] = 0;
    }
  }
}
