/**
 * Determinants over the real d orbitals (spin-orbital p < 5: real orbital p with spin α,
 * p ≥ 5: real orbital p − 5 with β; the same bit-mask algebra as the |m_l⟩ determinants). A field
 * of any symmetry is real here, so every Hamiltonian stays real symmetric and the ordinary
 * symmetric eigensolver applies; in the |m_l⟩ basis a general field is complex. The electron
 * repulsion is carried over from the |m_l⟩ determinants by the exact change of basis (a product of
 * one-electron unitaries, whose determinant-level matrix elements are minors), so the
 * Slater–Condon rules stay in one place.
 */

import { microstates } from '../atom/microstates.js';
import {
  type BasisBlock,
  basisBlock,
  casimirMatrix,
  type OneBodyTerm,
  oneBodyMatrix,
} from '../atom/operators.js';
import { congruence } from '../numeric/eigen.js';
import { determinantBlock } from './hamiltonian.js';
import { realToComplex } from './realOrbitals.js';

/** The parts of H over the real-orbital determinants of one M_S. */
export interface RealDeterminantBlock extends BasisBlock {
  /** Twice M_S of every determinant. */
  readonly twoMS: number;
  /** ∂H/∂B, row-major. */
  readonly partB: Float64Array;
  /** ∂H/∂C, row-major. */
  readonly partC: Float64Array;
  /** S², row-major. */
  readonly spinSquared: Float64Array;
}

/** Occupied orbital indices (0…4) of one spin in a mask. */
function occupied(mask: number, beta: boolean): number[] {
  const out: number[] = [];
  for (let i = 0; i < 5; i++) if (mask & (1 << (i + (beta ? 5 : 0)))) out.push(i);
  return out;
}

/** Determinant of a small complex matrix (row-major re, im), by elimination with partial pivoting. */
function complexDeterminant(re: number[], im: number[], k: number): [number, number] {
  let dr = 1;
  let di = 0;
  for (let c = 0; c < k; c++) {
    let pivot = c;
    for (let r = c + 1; r < k; r++) {
      if (
        Math.hypot(re[r * k + c] ?? 0, im[r * k + c] ?? 0) >
        Math.hypot(re[pivot * k + c] ?? 0, im[pivot * k + c] ?? 0)
      )
        pivot = r;
    }
    const pr = re[pivot * k + c] ?? 0;
    const pi = im[pivot * k + c] ?? 0;
    if (pr === 0 && pi === 0) return [0, 0];
    if (pivot !== c) {
      for (let j = 0; j < k; j++) {
        [re[c * k + j], re[pivot * k + j]] = [re[pivot * k + j] ?? 0, re[c * k + j] ?? 0];
        [im[c * k + j], im[pivot * k + j]] = [im[pivot * k + j] ?? 0, im[c * k + j] ?? 0];
      }
      dr = -dr;
      di = -di;
    }
    [dr, di] = [dr * pr - di * pi, dr * pi + di * pr];
    const norm = pr * pr + pi * pi;
    for (let r = c + 1; r < k; r++) {
      const ar = re[r * k + c] ?? 0;
      const ai = im[r * k + c] ?? 0;
      // factor = a / pivot
      const fr = (ar * pr + ai * pi) / norm;
      const fi = (ai * pr - ar * pi) / norm;
      for (let j = c; j < k; j++) {
        const br = re[c * k + j] ?? 0;
        const bi = im[c * k + j] ?? 0;
        re[r * k + j] = (re[r * k + j] ?? 0) - (fr * br - fi * bi);
        im[r * k + j] = (im[r * k + j] ?? 0) - (fr * bi + fi * br);
      }
    }
  }
  return [dr, di];
}

/** A one-electron change of basis or symmetry operation: ⟨row orbital|U|column orbital⟩. */
export interface OrbitalMatrix {
  readonly re: (row: number, col: number) => number;
  readonly im: (row: number, col: number) => number;
}

/** The minors det U[a, b] for every pair of k-subsets a, b (as bit masks over 5 orbitals). */
function minorTable(subsets: readonly number[], u: OrbitalMatrix): { re: Float64Array; im: Float64Array } {
  const m = subsets.length;
  const re = new Float64Array(m * m);
  const im = new Float64Array(m * m);
  const lists = subsets.map((s) => occupied(s, false));
  lists.forEach((a, r) => {
    lists.forEach((b, c) => {
      const mr: number[] = [];
      const mi: number[] = [];
      for (const i of a) {
        for (const j of b) {
          mr.push(u.re(i, j));
          mi.push(u.im(i, j));
        }
      }
      const [dr, di] = a.length === 0 ? [1, 0] : complexDeterminant(mr, mi, a.length);
      re[r * m + c] = dr;
      im[r * m + c] = di;
    });
  });
  return { re, im };
}

/**
 * ⟨row determinant|U|column determinant⟩ for a one-electron U applied to every electron (spin
 * untouched): the product of the α and β minors of U, as every determinant is its α creators
 * then its β creators in ascending order. Rows and columns must share the spin counts.
 */
export function determinantMatrix(
  rows: readonly number[],
  cols: readonly number[],
  u: OrbitalMatrix,
): { re: Float64Array; im: Float64Array } {
  const alphaOf = (mask: number) => mask & 31;
  const betaOf = (mask: number) => (mask >> 5) & 31;
  const alphaSets = [...new Set([...rows, ...cols].map(alphaOf))];
  const betaSets = [...new Set([...rows, ...cols].map(betaOf))];
  const alphaIndex = new Map(alphaSets.map((s, i) => [s, i]));
  const betaIndex = new Map(betaSets.map((s, i) => [s, i]));
  const ma = minorTable(alphaSets, u);
  const mb = minorTable(betaSets, u);
  const na = alphaSets.length;
  const nb = betaSets.length;
  const re = new Float64Array(rows.length * cols.length);
  const im = new Float64Array(rows.length * cols.length);
  const colA = cols.map((c) => alphaIndex.get(alphaOf(c)) ?? 0);
  const colB = cols.map((c) => betaIndex.get(betaOf(c)) ?? 0);
  rows.forEach((rowMask, r) => {
    const ra = (alphaIndex.get(alphaOf(rowMask)) ?? 0) * na;
    const rb = (betaIndex.get(betaOf(rowMask)) ?? 0) * nb;
    for (let c = 0; c < cols.length; c++) {
      const ar = ma.re[ra + (colA[c] ?? 0)] ?? 0;
      const ai = ma.im[ra + (colA[c] ?? 0)] ?? 0;
      if (ar === 0 && ai === 0) continue;
      const br = mb.re[rb + (colB[c] ?? 0)] ?? 0;
      const bi = mb.im[rb + (colB[c] ?? 0)] ?? 0;
      re[r * cols.length + c] = ar * br - ai * bi;
      im[r * cols.length + c] = ar * bi + ai * br;
    }
  });
  return { re, im };
}

/** Twice M_S of a determinant. */
function twoMsOfMask(mask: number): number {
  return occupied(mask, false).length - occupied(mask, true).length;
}

const blockCache = new Map<string, RealDeterminantBlock>();

/**
 * The real-orbital determinants of dⁿ with twice M_S = `twoMS`, with the electron repulsion and
 * S² over them; cached per (n, M_S). ⟨D_m|D_real⟩ = W is unitary, so H_real = W†H_mW, which is
 * real because the repulsion and the real orbitals are.
 */
export function realDeterminantBlock(n: number, twoMS: number): RealDeterminantBlock {
  const key = `${n}:${twoMS}`;
  const cached = blockCache.get(key);
  if (cached) return cached;
  const masks = microstates(2, n)
    .filter((s) => s.twoMS === twoMS)
    .map((s) => s.mask);
  const complex = determinantBlock(masks);
  const u = realToComplex();
  // Orbital index i of the |m⟩ side is m + 2, the order of the |m_l⟩ spin-orbitals.
  const w = determinantMatrix(masks, masks, {
    re: (m, i) => u[m]?.[i]?.re ?? 0,
    im: (m, i) => u[m]?.[i]?.im ?? 0,
  });
  const size = masks.length;
  const carry = (x: Float64Array) => {
    const a = congruence(w.re, x, size);
    const b = congruence(w.im, x, size);
    return a.map((v, i) => v + (b[i] ?? 0));
  };
  const block = basisBlock(masks);
  const out: RealDeterminantBlock = {
    ...block,
    twoMS,
    partB: carry(complex.partB),
    partC: carry(complex.partC),
    spinSquared: casimirMatrix(2, block, true, (m) => twoMsOfMask(m) / 2),
  };
  blockCache.set(key, out);
  return out;
}

/** The one-electron terms of a real 5×5 field on the 10 real spin-orbitals. */
export function fieldTerms(v: Float64Array): OneBodyTerm[] {
  const terms: OneBodyTerm[] = [];
  for (const offset of [0, 5]) {
    for (let a = 0; a < 5; a++) {
      for (let b = 0; b < 5; b++) {
        const value = v[5 * a + b] ?? 0;
        if (value !== 0) terms.push({ to: a + offset, from: b + offset, value });
      }
    }
  }
  return terms;
}

/** Matrix of a real 5×5 one-electron field over a block of real-orbital determinants. */
export function fieldMatrix(block: BasisBlock, v: Float64Array): Float64Array {
  return oneBodyMatrix(block, fieldTerms(v));
}

/** Matrix of a spatial operation, given by its real orbital transform T (5×5), over a block. */
export function operationMatrix(block: BasisBlock, t: Float64Array): Float64Array {
  return determinantMatrix(block.masks, block.masks, {
    re: (i, j) => t[5 * i + j] ?? 0,
    im: () => 0,
  }).re;
}
