/**
 * Slater determinants (microstates) of n equivalent electrons in one shell of orbital angular
 * momentum l.
 *
 * A determinant is a bit mask over the 2(2l+1) spin-orbitals. Spin-orbital p has
 * m_l = (p mod (2l+1)) − l and m_s = +½ for p < 2l+1 (α), −½ otherwise (β). The determinant of
 * a mask is the product of creation operators in ascending p acting on the vacuum; every
 * fermion sign in this project follows from that order.
 */

import { InputError } from '../core/errors.js';

/** One determinant with its quantum numbers. */
export interface Microstate {
  /** Occupied spin-orbitals as a bit mask. */
  readonly mask: number;
  /** Total M_L = Σ m_l. */
  readonly ML: number;
  /** Twice the total M_S (an integer, to keep half-integers exact). */
  readonly twoMS: number;
}

/** Orbital letters of the shells s, p, d, f by l. */
export const SHELL_LETTERS = ['s', 'p', 'd', 'f'] as const;

/** The largest l handled (f shells). */
export const MAX_L = 3;

/** Number of spatial orbitals of a shell, 2l + 1. */
export function orbitalCount(l: number): number {
  return 2 * l + 1;
}

/** m_l of spin-orbital p in a shell of angular momentum l. */
export function mlOf(l: number, p: number): number {
  return (p % (2 * l + 1)) - l;
}

/** Twice m_s of spin-orbital p: +1 (α) or −1 (β). */
export function twoMsOf(l: number, p: number): number {
  return p < 2 * l + 1 ? 1 : -1;
}

/** Spin-orbital index of (m_l, α or β). */
export function spinOrbital(l: number, ml: number, alpha: boolean): number {
  return ml + l + (alpha ? 0 : 2 * l + 1);
}

/** Number of set bits. */
export function popcount(x: number): number {
  let v = x - ((x >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (((v + (v >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** Binomial coefficient C(n, k) for small non-negative integers. */
export function binomial(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return Math.round(r);
}

function checkShell(l: number, n: number): void {
  if (!Number.isInteger(l) || l < 0 || l > MAX_L) {
    throw new InputError(`orbital angular momentum l = ${l}: expected 0 (s), 1 (p), 2 (d) or 3 (f)`);
  }
  const cap = 2 * (2 * l + 1);
  if (!Number.isInteger(n) || n < 0 || n > cap) {
    throw new InputError(
      `electron count ${n} for ${l === 0 || l === 3 ? 'an' : 'a'} ${SHELL_LETTERS[l]} shell: expected a whole number from 0 to ${cap}`,
    );
  }
}

/** M_L and 2M_S of a determinant mask. */
export function quantumNumbers(l: number, mask: number): { ML: number; twoMS: number } {
  let ML = 0;
  let twoMS = 0;
  for (let p = 0, rest = mask; rest !== 0; p++, rest >>>= 1) {
    if (rest & 1) {
      ML += mlOf(l, p);
      twoMS += twoMsOf(l, p);
    }
  }
  return { ML, twoMS };
}

/**
 * All C(4l+2, n) determinants of lⁿ, in ascending mask order.
 * @throws InputError when l or n is out of range.
 */
export function microstates(l: number, n: number): Microstate[] {
  checkShell(l, n);
  const width = 2 * (2 * l + 1);
  const out: Microstate[] = [];
  if (n === 0) return [{ mask: 0, ML: 0, twoMS: 0 }];
  const limit = 1 << width;
  // Gosper's hack: the next larger integer with the same number of set bits.
  for (let mask = (1 << n) - 1; mask < limit; ) {
    out.push({ mask, ...quantumNumbers(l, mask) });
    const c = mask & -mask;
    const r = mask + c;
    mask = (((r ^ mask) >>> 2) / c) | r;
  }
  return out;
}
