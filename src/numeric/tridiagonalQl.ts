/**
 * Symmetric eigen-decomposition on typed arrays: Householder reduction to tridiagonal form with
 * the transformations accumulated (tred2), then the QL iteration with implicit shifts (tql2) —
 * the procedures of Wilkinson & Reinsch (Handbook for Automatic Computation II, 1971) in the
 * form of JAMA (Hicks, Moler et al., public domain), the same form ml-matrix uses.
 *
 * Written here, not called through ml-matrix, because the solvers diagonalise thousands of small
 * blocks a second: ml-matrix wraps every call in Matrix objects read element by element, and
 * loading it costs every command a noticeable part of its start-up. The arithmetic is the same
 * operations in the same order as ml-matrix's, so eigenvalues and eigenvectors agree with it bit
 * for bit (test/numeric/tridiagonalQl.test.ts holds it to that). The eigenvalues-only variant
 * skips the accumulation and the rotations of the vectors, which do not feed back into the
 * values, so its eigenvalues are the very same numbers.
 */

/**
 * Eigenvalues (ascending) and eigenvectors of a real symmetric row-major n×n matrix. `vectors`
 * is row-major with column j the eigenvector of `values[j]`.
 */
export function tridiagonalQl(a: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  // vt holds Vᵀ: the hot loops then run along rows of the backing store.
  const vt = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) vt[j * n + i] = a[i * n + j] as number;
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  reduce(n, e, d, vt);
  accumulate(n, d, vt);
  ql(n, e, d, vt);
  const vectors = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) vectors[i * n + j] = vt[j * n + i] as number;
  return { values: d, vectors };
}

/** The eigenvalues (ascending) alone; the same numbers as {@link tridiagonalQl}'s. */
export function tridiagonalQlValues(a: Float64Array, n: number): Float64Array {
  const vt = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) vt[j * n + i] = a[i * n + j] as number;
  const d = new Float64Array(n);
  tridiagonalQlValuesInPlace(vt, n, d, new Float64Array(n));
  return d;
}

/**
 * {@link tridiagonalQlValues} on caller-owned storage, for sweeps that solve the same block sizes
 * thousands of times: `vt` holds the matrix transposed (row-major Aᵀ, destroyed), the ascending
 * eigenvalues go to d[0…n−1], and `e` (length ≥ n) is scratch. The same arithmetic, so the same numbers.
 */
export function tridiagonalQlValuesInPlace(
  vt: Float64Array,
  n: number,
  d: Float64Array,
  e: Float64Array,
): void {
  reduce(n, e, d, vt);
  // Without accumulation, the diagonal of the tridiagonal form is left on the diagonal of vt.
  for (let j = 0; j < n; j++) d[j] = vt[j * n + j] as number;
  e[0] = 0;
  ql(n, e, d, undefined);
}

/** The Householder reduction of tred2 (first part): off-diagonal into e, vectors kept in vt. */
function reduce(n: number, e: Float64Array, d: Float64Array, vt: Float64Array): void {
  // Hot loops: every index stays within n×n by construction. vt[r * n + c] is ml-matrix's V.get(r, c).
  for (let j = 0; j < n; j++) d[j] = vt[j * n + n - 1] as number;
  for (let i = n - 1; i > 0; i--) {
    let scale = 0;
    let h = 0;
    for (let k = 0; k < i; k++) scale = scale + Math.abs(d[k] as number);
    if (scale === 0) {
      e[i] = d[i - 1] as number;
      for (let j = 0; j < i; j++) {
        d[j] = vt[j * n + i - 1] as number;
        vt[j * n + i] = 0;
        vt[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k] = (d[k] as number) / scale;
        h += (d[k] as number) * (d[k] as number);
      }
      let f = d[i - 1] as number;
      let g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h = h - f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        vt[i * n + j] = f;
        g = (e[j] as number) + (vt[j * n + j] as number) * f;
        for (let k = j + 1; k <= i - 1; k++) {
          g += (vt[j * n + k] as number) * (d[k] as number);
          e[k] = (e[k] as number) + (vt[j * n + k] as number) * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j] = (e[j] as number) / h;
        f += (e[j] as number) * (d[j] as number);
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j] = (e[j] as number) - hh * (d[j] as number);
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        g = e[j] as number;
        for (let k = j; k <= i - 1; k++) {
          vt[j * n + k] = (vt[j * n + k] as number) - (f * (e[k] as number) + g * (d[k] as number));
        }
        d[j] = vt[j * n + i - 1] as number;
        vt[j * n + i] = 0;
      }
    }
    d[i] = h;
  }
}

/** tred2's second part: the transformations accumulated into vt, the diagonal into d. */
function accumulate(n: number, d: Float64Array, vt: Float64Array): void {
  for (let i = 0; i < n - 1; i++) {
    vt[i * n + n - 1] = vt[i * n + i] as number;
    vt[i * n + i] = 1;
    const h = d[i + 1] as number;
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = (vt[(i + 1) * n + k] as number) / h;
      for (let j = 0; j <= i; j++) {
        let g = 0;
        for (let k = 0; k <= i; k++) g += (vt[(i + 1) * n + k] as number) * (vt[j * n + k] as number);
        for (let k = 0; k <= i; k++) vt[j * n + k] = (vt[j * n + k] as number) - g * (d[k] as number);
      }
    }
    for (let k = 0; k <= i; k++) vt[(i + 1) * n + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = vt[j * n + n - 1] as number;
    vt[j * n + n - 1] = 0;
  }
  vt[(n - 1) * n + n - 1] = 1;
}

/** √(a² + b²) without overflow, as JAMA writes it. */
export function hypotenuse(a: number, b: number): number {
  if (Math.abs(a) > Math.abs(b)) {
    const r = b / a;
    return Math.abs(a) * Math.sqrt(1 + r * r);
  }
  if (b !== 0) {
    const r = a / b;
    return Math.abs(b) * Math.sqrt(1 + r * r);
  }
  return 0;
}

/** tql2: QL iterations on (d, e), rotating vt when given; then values sorted ascending with their vectors. */
function ql(n: number, e: Float64Array, d: Float64Array, vt: Float64Array | undefined): void {
  for (let i = 1; i < n; i++) e[i - 1] = e[i] as number;
  e[n - 1] = 0;
  let f = 0;
  let tst1 = 0;
  const eps = Number.EPSILON;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l] as number) + Math.abs(e[l] as number));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m] as number) <= eps * tst1) break;
      m++;
    }
    if (m > l) {
      do {
        let g = d[l] as number;
        let p = ((d[l + 1] as number) - g) / (2 * (e[l] as number));
        let r = hypotenuse(p, 1);
        if (p < 0) r = -r;
        d[l] = (e[l] as number) / (p + r);
        d[l + 1] = (e[l] as number) * (p + r);
        const dl1 = d[l + 1] as number;
        let h = g - (d[l] as number);
        for (let i = l + 2; i < n; i++) d[i] = (d[i] as number) - h;
        f = f + h;
        p = d[m] as number;
        let c = 1;
        let c2 = c;
        let c3 = c;
        const el1 = e[l + 1] as number;
        let s = 0;
        let s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * (e[i] as number);
          h = c * p;
          r = hypotenuse(p, e[i] as number);
          e[i + 1] = s * r;
          s = (e[i] as number) / r;
          c = p / r;
          p = c * (d[i] as number) - s * g;
          d[i + 1] = h + s * (c * g + s * (d[i] as number));
          if (vt) {
            const row = i * n;
            const next = row + n;
            for (let k = 0; k < n; k++) {
              const x = vt[next + k] as number;
              vt[next + k] = s * (vt[row + k] as number) + c * x;
              vt[row + k] = c * (vt[row + k] as number) - s * x;
            }
          }
        }
        p = (-s * s2 * c3 * el1 * (e[l] as number)) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l] as number) > eps * tst1);
    }
    d[l] = (d[l] as number) + f;
    e[l] = 0;
  }
  sortPairs(n, d, vt);
}

/** Selection sort of the values, ascending, swapping the vectors along (tql2's last step). */
function sortPairs(n: number, d: Float64Array, vt: Float64Array | undefined): void {
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    let p = d[i] as number;
    for (let j = i + 1; j < n; j++) {
      if ((d[j] as number) < p) {
        k = j;
        p = d[j] as number;
      }
    }
    if (k !== i) {
      d[k] = d[i] as number;
      d[i] = p;
      if (vt) {
        for (let j = 0; j < n; j++) {
          const x = vt[i * n + j] as number;
          vt[i * n + j] = vt[k * n + j] as number;
          vt[k * n + j] = x;
        }
      }
    }
  }
}
