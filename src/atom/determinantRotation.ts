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
