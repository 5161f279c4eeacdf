/**
 * A rotation (or any one-electron unitary) applied to Slater determinants: each creation
 * operator a†_p becomes Σ_q U[q][p] a†_q, applied in the order that builds the determinant, so
 * the fermion signs come out of the algebra (see microstates.ts for that order).
 */
import type { Complex } from './angular.js';
import type { BasisBlock } from './operators.js';
import { parity } from './operators.js';

/**
 * Real part of ⟨D′|R|D⟩ within a block, for a one-electron matrix `U[q][p]` over all `width`
 * spin-orbitals. Entries outside the block are dropped: the trace of R over an eigenspace that
 * lies in the block needs nothing else.
 */
export function rotateDeterminants(
  block: BasisBlock,
  U: readonly (readonly Complex[])[],
  width: number,
): Float64Array {
  const n = block.masks.length;
  const out = new Float64Array(n * n);
  const columns = nonzeroColumns(U, width);
  // Partial determinants are kept dense by mask (2^width slots, re and im) with their masks listed
  // in the order first reached, so the sums run in a fixed order without a Map per step.
  const size = 1 << width;
  let re = new Float64Array(size);
  let im = new Float64Array(size);
  let nextRe = new Float64Array(size);
  let nextIm = new Float64Array(size);
  const seen = new Uint8Array(size);
  block.masks.forEach((mask, col) => {
    let keys = [0];
    re[0] = 1;
    im[0] = 0;
    for (let p = width - 1; p >= 0; p--) {
      if (!(mask & (1 << p))) continue;
      const next: number[] = [];
      const column = columns[p] ?? [];
      for (const partial of keys) {
        const cRe = re[partial] as number;
        const cIm = im[partial] as number;
        for (const { q, u } of column) {
          if (partial & (1 << q)) continue;
          const sign = parity(partial, q);
          const target = partial | (1 << q);
          if (!seen[target]) {
            seen[target] = 1;
            nextRe[target] = 0;
            nextIm[target] = 0;
            next.push(target);
          }
          nextRe[target] = (nextRe[target] as number) + sign * (cRe * u.re - cIm * u.im);
          nextIm[target] = (nextIm[target] as number) + sign * (cRe * u.im + cIm * u.re);
        }
      }
      for (const target of next) seen[target] = 0;
      [re, nextRe] = [nextRe, re];
      [im, nextIm] = [nextIm, im];
      keys = next;
    }
    for (const target of keys) {
      const row = block.index.get(target);
      if (row !== undefined) out[row * n + col] = re[target] as number;
    }
  });
  return out;
}

/** For each spin-orbital p, the nonzero U[q][p] with their q, in increasing q. */
function nonzeroColumns(
  U: readonly (readonly Complex[])[],
  width: number,
): { readonly q: number; readonly u: Complex }[][] {
  return Array.from({ length: width }, (_, p) => {
    const column: { q: number; u: Complex }[] = [];
    for (let q = 0; q < width; q++) {
      const u = U[q]?.[p];
      if (u && (u.re !== 0 || u.im !== 0)) column.push({ q, u });
    }
    return column;
  });
}

/**
 * The same matrix as {@link rotateDeterminants}, each entry as one determinant: ⟨D′|R|D⟩ is the
 * determinant of U[q′][p] over the occupied spin-orbitals q′ of D′ (rows) and p of D (columns),
 * both ascending, the order in which a determinant is built. Much cheaper where U is dense (the
 * C₃ rotations); equal to it up to rounding (test/atom/determinantRotation.test.ts).
 */
export function rotateDeterminantsByMinors(
  block: BasisBlock,
  U: readonly (readonly Complex[])[],
  width: number,
): Float64Array {
  const n = block.masks.length;
  const occupied = block.masks.map((mask) => {
    const bits: number[] = [];
    for (let p = 0; p < width; p++) if (mask & (1 << p)) bits.push(p);
    return bits;
  });
  const k = occupied[0]?.length ?? 0;
  const re = new Float64Array(k * k);
  const im = new Float64Array(k * k);
  const out = new Float64Array(n * n);
  occupied.forEach((rows, row) => {
    occupied.forEach((cols, col) => {
      for (let a = 0; a < k; a++) {
        for (let b = 0; b < k; b++) {
          const u = U[rows[a] as number]?.[cols[b] as number];
          re[a * k + b] = u?.re ?? 0;
          im[a * k + b] = u?.im ?? 0;
        }
      }
      out[row * n + col] = realDeterminant(re, im, k);
    });
  });
  return out;
}

/** Real part of the determinant of the complex k×k matrix (re, im), both overwritten: elimination with partial pivoting. */
function realDeterminant(re: Float64Array, im: Float64Array, k: number): number {
  let dre = 1;
  let dim = 0;
  for (let c = 0; c < k; c++) {
    let pivot = c;
    let best = 0;
    for (let r = c; r < k; r++) {
      const size = (re[r * k + c] as number) ** 2 + (im[r * k + c] as number) ** 2;
      if (size > best) {
        best = size;
        pivot = r;
      }
    }
    if (best === 0) return 0;
    if (pivot !== c) {
      for (let j = 0; j < k; j++) {
        const x = re[c * k + j] as number;
        re[c * k + j] = re[pivot * k + j] as number;
        re[pivot * k + j] = x;
        const y = im[c * k + j] as number;
        im[c * k + j] = im[pivot * k + j] as number;
        im[pivot * k + j] = y;
      }
      dre = -dre;
      dim = -dim;
    }
    const pr = re[c * k + c] as number;
    const pi = im[c * k + c] as number;
    const nextRe = dre * pr - dim * pi;
    dim = dre * pi + dim * pr;
    dre = nextRe;
    for (let r = c + 1; r < k; r++) {
      // f = M[r][c] / pivot = M[r][c] · conj(pivot) / |pivot|².
      const mr = re[r * k + c] as number;
      const mi = im[r * k + c] as number;
      const fr = (mr * pr + mi * pi) / best;
      const fi = (mi * pr - mr * pi) / best;
      for (let j = c + 1; j < k; j++) {
        const cr = re[c * k + j] as number;
        const ci = im[c * k + j] as number;
        re[r * k + j] = (re[r * k + j] as number) - (fr * cr - fi * ci);
        im[r * k + j] = (im[r * k + j] as number) - (fr * ci + fi * cr);
      }
    }
  }
  return dre;
}
