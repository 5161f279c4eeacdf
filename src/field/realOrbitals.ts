/**
 * The five real d orbitals, in the order xy, yz, z², xz, x²−y² (the real combinations of
 * m = −2 … 2), as quadratic forms d(r) = rᵀQr on the unit sphere, all with the same norm
 * (d_z² = (3z² − 1)/2, the others √3·xy, √3·yz, √3·xz, (√3/2)(x² − y²)). A one-electron field of
 * any symmetry is a real symmetric 5×5 matrix over them (row-major, `V[5i + j]`); a rotation or
 * reflection acts on them by a real orthogonal 5×5 matrix.
 */

import type { Complex } from '../atom/angular.js';

/** A direction or position in space. */
export type Vec3 = readonly [number, number, number];

/** A 3×3 matrix, row-major. */
export type Mat3 = readonly number[];

/** Names of the real d orbitals in the order used throughout. */
export const REAL_ORBITALS = ['xy', 'yz', 'z2', 'xz', 'x2-y2'] as const;

/** Name of one real d orbital. */
export type RealOrbital = (typeof REAL_ORBITALS)[number];

const H = Math.sqrt(3) / 2;

/** The quadratic form Q of each real orbital (row-major 3×3, symmetric, traceless, tr Q² = 3/2). */
const FORMS: readonly Mat3[] = [
  [0, H, 0, H, 0, 0, 0, 0, 0],
  [0, 0, 0, 0, 0, H, 0, H, 0],
  [-0.5, 0, 0, 0, -0.5, 0, 0, 0, 1],
  [0, 0, H, 0, 0, 0, H, 0, 0],
  [H, 0, 0, 0, -H, 0, 0, 0, 0],
];

/** tr(QᵢQᵢ), the same for every orbital. */
const FORM_NORM = 1.5;

function form(i: number): Mat3 {
  const q = FORMS[i];
  if (!q) throw new Error(`real d orbital ${i} does not exist`);
  return q;
}

/** uᵀ Q v for a 3×3 matrix Q. */
export function sandwich(u: Vec3, q: Mat3, v: Vec3): number {
  let s = 0;
  for (let a = 0; a < 3; a++) {
    for (let b = 0; b < 3; b++) s += (u[a] ?? 0) * (q[3 * a + b] ?? 0) * (v[b] ?? 0);
  }
  return s;
}

/** The value of each real orbital's quadratic form between two directions, uᵀQᵢv. */
export function formValues(u: Vec3, v: Vec3): number[] {
  return FORMS.map((q) => sandwich(u, q, v));
}

function multiply3(a: Mat3, b: Mat3): number[] {
  const out = new Array<number>(9).fill(0);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      let s = 0;
      for (let k = 0; k < 3; k++) s += (a[3 * i + k] ?? 0) * (b[3 * k + j] ?? 0);
      out[3 * i + j] = s;
    }
  }
  return out;
}

/** Transpose of a 3×3 matrix. */
export function transpose3(a: Mat3): number[] {
  return [0, 3, 6, 1, 4, 7, 2, 5, 8].map((k) => a[k] ?? 0);
}

/**
 * The real orthogonal 5×5 matrix T of a rotation or reflection R (3×3 orthogonal, active) on
 * the real d orbitals: (R dᵢ)(r) = dᵢ(Rᵀr) = Σⱼ T[j][i] dⱼ(r), so T[5j + i] = tr(Qⱼ R Qᵢ Rᵀ)/tr(Qⱼ²).
 * Inversion is the identity here: d orbitals are even.
 */
export function orbitalTransform(r: Mat3): Float64Array {
  const rt = transpose3(r);
  const out = new Float64Array(25);
  for (let i = 0; i < 5; i++) {
    const moved = multiply3(multiply3(r, form(i)), rt);
    for (let j = 0; j < 5; j++) {
      const qj = form(j);
      let tr = 0;
      for (let k = 0; k < 9; k++) tr += (qj[k] ?? 0) * (moved[k] ?? 0);
      out[5 * j + i] = tr / FORM_NORM;
    }
  }
  return out;
}

/** T V Tᵀ: a 5×5 field carried by the orbital transform T (the field of the moved ligands). */
export function transformField(t: Float64Array, v: Float64Array): Float64Array {
  const tv = new Float64Array(25);
  for (let i = 0; i < 5; i++) {
    for (let j = 0; j < 5; j++) {
      let s = 0;
      for (let k = 0; k < 5; k++) s += (t[5 * i + k] ?? 0) * (v[5 * k + j] ?? 0);
      tv[5 * i + j] = s;
    }
  }
  const out = new Float64Array(25);
  for (let i = 0; i < 5; i++) {
    for (let j = 0; j < 5; j++) {
      let s = 0;
      for (let k = 0; k < 5; k++) s += (tv[5 * i + k] ?? 0) * (t[5 * j + k] ?? 0);
      out[5 * i + j] = s;
    }
  }
  return out;
}

/**
 * ⟨m|real orbital i⟩ in the Condon–Shortley phase: xy = i(|−2⟩ − |2⟩)/√2, yz = i(|−1⟩ + |1⟩)/√2,
 * z² = |0⟩, xz = (|−1⟩ − |1⟩)/√2, x² − y² = (|−2⟩ + |2⟩)/√2. Returned as `U[m + 2][i]`.
 */
export function realToComplex(): Complex[][] {
  const s = Math.SQRT1_2;
  const z = { re: 0, im: 0 };
  const u: Complex[][] = Array.from({ length: 5 }, () => Array.from({ length: 5 }, () => ({ ...z })));
  const set = (m: number, i: number, re: number, im: number) => {
    const row = u[m + 2];
    if (row) row[i] = { re, im };
  };
  set(-2, 0, 0, s);
  set(2, 0, 0, -s);
  set(-1, 1, 0, s);
  set(1, 1, 0, s);
  set(0, 2, 1, 0);
  set(-1, 3, s, 0);
  set(1, 3, -s, 0);
  set(-2, 4, s, 0);
  set(2, 4, s, 0);
  return u;
}

/**
 * A real-orbital field in the complex |m⟩ basis, U V U†, returned as `[m′ + 2][m + 2]`. It is
 * Hermitian and in general complex (a field without a vertical mirror plane through x).
 */
export function fieldInComplexBasis(v: Float64Array): Complex[][] {
  const u = realToComplex();
  const out: Complex[][] = [];
  for (let a = 0; a < 5; a++) {
    const row: Complex[] = [];
    for (let b = 0; b < 5; b++) {
      let re = 0;
      let im = 0;
      for (let i = 0; i < 5; i++) {
        for (let j = 0; j < 5; j++) {
          const x = v[5 * i + j] ?? 0;
          if (x === 0) continue;
          const p = u[a]?.[i] ?? { re: 0, im: 0 };
          const q = u[b]?.[j] ?? { re: 0, im: 0 };
          // p · x · conj(q)
          re += x * (p.re * q.re + p.im * q.im);
          im += x * (p.im * q.re - p.re * q.im);
        }
      }
      row.push({ re, im });
    }
    out.push(row);
  }
  return out;
}

/** Unit vector along v. */
export function unit(v: Vec3): Vec3 {
  const r = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / r, v[1] / r, v[2] / r];
}

/** Cross product. */
export function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/** Dot product. */
export function dot(a: Vec3, b: Vec3): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** R v for a 3×3 matrix R. */
export function apply3(r: Mat3, v: Vec3): Vec3 {
  const at = (k: number) => r[k] ?? 0;
  return [
    at(0) * v[0] + at(1) * v[1] + at(2) * v[2],
    at(3) * v[0] + at(4) * v[1] + at(5) * v[2],
    at(6) * v[0] + at(7) * v[1] + at(8) * v[2],
  ];
}

/** The rotation by `angle` about the unit axis n (right-handed, active), Rodrigues' formula. */
export function axisRotation(n: Vec3, angle: number): number[] {
  const [x, y, z] = unit(n);
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const t = 1 - c;
  return [
    t * x * x + c,
    t * x * y - s * z,
    t * x * z + s * y,
    t * x * y + s * z,
    t * y * y + c,
    t * y * z - s * x,
    t * x * z - s * y,
    t * y * z + s * x,
    t * z * z + c,
  ];
}

/** The reflection through the plane with unit normal n: I − 2nnᵀ. */
export function reflection(n: Vec3): number[] {
  const u = unit(n);
  const out: number[] = [];
  for (let a = 0; a < 3; a++)
    for (let b = 0; b < 3; b++) out.push((a === b ? 1 : 0) - 2 * (u[a] ?? 0) * (u[b] ?? 0));
  return out;
}

/** Matrix product of two 3×3 matrices. */
export function compose3(a: Mat3, b: Mat3): number[] {
  return multiply3(a, b);
}
