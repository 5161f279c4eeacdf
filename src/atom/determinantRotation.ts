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
  block.masks.forEach((mask, col) => {
    let vec = new Map<number, Complex>([[0, { re: 1, im: 0 }]]);
    for (let p = width - 1; p >= 0; p--) {
      if (!(mask & (1 << p))) continue;
      const next = new Map<number, Complex>();
      for (const [partial, c] of vec) {
        for (let q = 0; q < width; q++) {
          const u = U[q]?.[p];
          if (!u || (u.re === 0 && u.im === 0) || partial & (1 << q)) continue;
          const sign = parity(partial, q);
          const target = partial | (1 << q);
          const acc = next.get(target) ?? { re: 0, im: 0 };
          acc.re += sign * (c.re * u.re - c.im * u.im);
          acc.im += sign * (c.re * u.im + c.im * u.re);
          next.set(target, acc);
        }
      }
      vec = next;
    }
    for (const [target, c] of vec) {
      const row = block.index.get(target);
      if (row !== undefined) out[row * n + col] = c.re;
    }
  });
  return out;
}
