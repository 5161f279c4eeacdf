/**
 * Electron repulsion within one shell by the Slater–Condon rules, written as the
 * second-quantised operator Σ_{p<q, r<s} ⟨pq‖rs⟩ a†_p a†_q a_s a_r so that every fermion sign
 * comes from the operator algebra. For equivalent electrons
 * ⟨ab|1/r₁₂|cd⟩ = δ(m_s^a, m_s^c) δ(m_s^b, m_s^d) Σ_k c^k(l m_a, l m_c) c^k(l m_d, l m_b) F^k
 * (Condon & Shortley 1935, §6.8; Slater 1960).
 */

import { gaunt } from './angular.js';
import { mlOf, twoMsOf } from './microstates.js';
import { type BasisBlock, parity } from './operators.js';

/** One (p, q) target of a pair (r, s) with its antisymmetrised coefficients per F^k, k = 2, 4, …, 2l. */
interface PairTarget {
  readonly p: number;
  readonly q: number;
  readonly coeff: readonly number[];
}

const pairTableCache = new Map<number, Map<number, PairTarget[]>>();

function direct(l: number, k: number, a: number, b: number, c: number, d: number): number {
  if (twoMsOf(l, a) !== twoMsOf(l, c) || twoMsOf(l, b) !== twoMsOf(l, d)) return 0;
  const ma = mlOf(l, a);
  const mb = mlOf(l, b);
  const mc = mlOf(l, c);
  const md = mlOf(l, d);
  if (ma + mb !== mc + md) return 0;
  return gaunt(k, l, ma, l, mc) * gaunt(k, l, md, l, mb);
}

/** For each occupied pair r < s (key r·64 + s), the pairs p < q it scatters into. */
function pairTable(l: number): Map<number, PairTarget[]> {
  const cached = pairTableCache.get(l);
  if (cached) return cached;
  const width = 2 * (2 * l + 1);
  const table = new Map<number, PairTarget[]>();
  for (let r = 0; r < width; r++) {
    for (let s = r + 1; s < width; s++) {
      const targets: PairTarget[] = [];
      for (let p = 0; p < width; p++) {
        for (let q = p + 1; q < width; q++) {
          const coeff: number[] = [];
          let any = false;
          for (let k = 2; k <= 2 * l; k += 2) {
            const v = direct(l, k, p, q, r, s) - direct(l, k, p, q, s, r);
            coeff.push(v);
            if (Math.abs(v) > 1e-15) any = true;
          }
          if (any) targets.push({ p, q, coeff });
        }
      }
      table.set(r * 64 + s, targets);
    }
  }
  pairTableCache.set(l, table);
  return table;
}

/**
 * Matrices of the electron repulsion within a block, one per Slater integral F^k for
 * k = 2, 4, …, 2l (row-major). F⁰ only shifts every level of a configuration equally and is
 * left out, so energies from these matrices are relative.
 */
export function repulsionMatrices(l: number, block: BasisBlock): Float64Array[] {
  const table = pairTable(l);
  const n = block.masks.length;
  const out = Array.from({ length: l }, () => new Float64Array(n * n));
  const width = 2 * (2 * l + 1);
  block.masks.forEach((mask, col) => {
    for (let r = 0; r < width; r++) {
      if (!(mask & (1 << r))) continue;
      const s1 = parity(mask, r);
      const m1 = mask ^ (1 << r);
      for (let s = r + 1; s < width; s++) {
        if (!(m1 & (1 << s))) continue;
        const s2 = parity(m1, s);
        const m2 = m1 ^ (1 << s);
        for (const t of table.get(r * 64 + s) ?? []) {
          if (m2 & (1 << t.q) || m2 & (1 << t.p)) continue;
          const s3 = parity(m2, t.q);
          const m3 = m2 | (1 << t.q);
          const s4 = parity(m3, t.p);
          const m4 = m3 | (1 << t.p);
          const row = block.index.get(m4);
          if (row === undefined) throw new Error('electron repulsion leaves its symmetry block');
          const sign = s1 * s2 * s3 * s4;
          t.coeff.forEach((c, i) => {
            const mat = out[i];
            if (mat && c !== 0) mat[row * n + col] = (mat[row * n + col] ?? 0) + sign * c;
          });
        }
      }
    }
  });
  return out;
}

/** Slater integrals F², F⁴ of a d shell from Racah's B and C. */
export interface DSlaterIntegrals {
  readonly F2: number;
  readonly F4: number;
}

/**
 * F² = 49B + 7C and F⁴ = 441C/35, the inverse of Racah's B = F₂ − 5F₄, C = 35F₄ with
 * F₂ = F²/49, F₄ = F⁴/441 (Racah, Phys. Rev. 62, 438, 1942; Griffith, The Theory of
 * Transition-Metal Ions, 1961, §4.2). Racah's A (= F₀ − 49F₄) only shifts all levels.
 */
export function slaterFromRacah(B: number, C: number): DSlaterIntegrals {
  return { F2: 49 * B + 7 * C, F4: (441 * C) / 35 };
}
