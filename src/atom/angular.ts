/**
 * Angular-momentum algebra: Wigner 3j symbols, Gaunt coefficients c^k and Wigner rotation
 * matrices, in the Condon–Shortley phase convention.
 */

const FACTORIALS: number[] = (() => {
  const f = [1];
  for (let i = 1; i <= 80; i++) f.push((f[i - 1] ?? 1) * i);
  return f;
})();

function factorial(n: number): number {
  const v = FACTORIALS[n];
  if (v === undefined) throw new RangeError(`factorial of ${n} is outside the table (0…80)`);
  return v;
}

/**
 * Wigner 3j symbol (j1 j2 j3; m1 m2 m3) for integer arguments, by Racah's single-sum formula
 * (Edmonds, Angular Momentum in Quantum Mechanics, 1957, eq. 3.7.3).
 */
export function threeJ(j1: number, j2: number, j3: number, m1: number, m2: number, m3: number): number {
  if (m1 + m2 + m3 !== 0) return 0;
  if (j3 < Math.abs(j1 - j2) || j3 > j1 + j2) return 0;
  if (Math.abs(m1) > j1 || Math.abs(m2) > j2 || Math.abs(m3) > j3) return 0;
  const triangle =
    (factorial(j1 + j2 - j3) * factorial(j1 - j2 + j3) * factorial(-j1 + j2 + j3)) /
    factorial(j1 + j2 + j3 + 1);
  const front = Math.sqrt(
    triangle *
      factorial(j1 + m1) *
      factorial(j1 - m1) *
      factorial(j2 + m2) *
      factorial(j2 - m2) *
      factorial(j3 + m3) *
      factorial(j3 - m3),
  );
  const tMin = Math.max(0, j2 - j3 - m1, j1 - j3 + m2);
  const tMax = Math.min(j1 + j2 - j3, j1 - m1, j2 + m2);
  let sum = 0;
  for (let t = tMin; t <= tMax; t++) {
    const d =
      factorial(t) *
      factorial(j3 - j2 + t + m1) *
      factorial(j3 - j1 + t - m2) *
      factorial(j1 + j2 - j3 - t) *
      factorial(j1 - t - m1) *
      factorial(j2 - t + m2);
    sum += (t % 2 === 0 ? 1 : -1) / d;
  }
  const phase = (j1 - j2 - m3) % 2 === 0 ? 1 : -1;
  return phase * front * sum;
}

/**
 * Gaunt coefficient c^k(l1 m1, l2 m2) = (−1)^{m1} √((2l1+1)(2l2+1)) (l1 k l2; 0 0 0)(l1 k l2; −m1 m1−m2 m2),
 * the angular factor of the Slater–Condon two-electron integrals (Condon & Shortley,
 * The Theory of Atomic Spectra, 1935, ch. 6; Slater, Quantum Theory of Atomic Structure, 1960).
 */
export function gaunt(k: number, l1: number, m1: number, l2: number, m2: number): number {
  const phase = m1 % 2 === 0 ? 1 : -1;
  return (
    phase *
    Math.sqrt((2 * l1 + 1) * (2 * l2 + 1)) *
    threeJ(l1, k, l2, 0, 0, 0) *
    threeJ(l1, k, l2, -m1, m1 - m2, m2)
  );
}

/**
 * Wigner small-d matrix element d^j_{m′m}(β) for integer j (Wigner's formula, as in
 * Edmonds 1957, eq. 4.1.15).
 */
export function wignerSmallD(j: number, mPrime: number, m: number, beta: number): number {
  const c = Math.cos(beta / 2);
  const s = Math.sin(beta / 2);
  const front = Math.sqrt(
    factorial(j + mPrime) * factorial(j - mPrime) * factorial(j + m) * factorial(j - m),
  );
  let sum = 0;
  const sMin = Math.max(0, m - mPrime);
  const sMax = Math.min(j + m, j - mPrime);
  for (let k = sMin; k <= sMax; k++) {
    const sign = (mPrime - m + k) % 2 === 0 ? 1 : -1;
    const d = factorial(j + m - k) * factorial(k) * factorial(mPrime - m + k) * factorial(j - mPrime - k);
    sum += (sign * c ** (2 * j + m - mPrime - 2 * k) * s ** (mPrime - m + 2 * k)) / d;
  }
  return front * sum;
}

/** A complex number as a pair, for the few complex quantities of this project. */
export interface Complex {
  re: number;
  im: number;
}

/**
 * Wigner rotation matrix D^l(α, β, γ) in the z-y-z Euler convention, so that an active rotation
 * takes |l m⟩ to Σ_{m′} D_{m′m} |l m′⟩ with D_{m′m} = e^{−i m′ α} d^l_{m′m}(β) e^{−i m γ}.
 * Returned as `D[m′ + l][m + l]`.
 */
export function wignerD(l: number, alpha: number, beta: number, gamma: number): Complex[][] {
  const out: Complex[][] = [];
  for (let mp = -l; mp <= l; mp++) {
    const row: Complex[] = [];
    for (let m = -l; m <= l; m++) {
      const d = wignerSmallD(l, mp, m, beta);
      const phase = -(mp * alpha + m * gamma);
      row.push({ re: d * Math.cos(phase), im: d * Math.sin(phase) });
    }
    out.push(row);
  }
  return out;
}
