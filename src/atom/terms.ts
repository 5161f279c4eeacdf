/**
 * Russell–Saunders terms of lⁿ by counting microstates: the N(M_L, M_S) table, terms peeled from
 * it highest (M_L, M_S) first, J levels, the ground level by Hund's rules, and the parsing of
 * configurations such as `3d8` (Condon & Shortley, The Theory of Atomic Spectra, 1935, ch. 7).
 */

import { InputError } from '../core/errors.js';
import { microstates, SHELL_LETTERS } from './microstates.js';

/** Letters of total orbital angular momentum L = 0, 1, 2, … (J is skipped by convention). */
export const TERM_LETTERS = 'SPDFGHIKLMNOQRTUV';

/** A Russell–Saunders term ²ˢ⁺¹L of a configuration, with how many times it occurs. */
export interface Term {
  /** Total spin S (0, ½, 1, …). */
  readonly S: number;
  /** Total orbital angular momentum L. */
  readonly L: number;
  /** How many independent terms of this S and L the configuration has (d³ has two ²D). */
  readonly count: number;
  /** The term symbol in plain text, e.g. `"2D"`. */
  readonly symbol: string;
}

/** A parsed configuration such as `3d8`: principal quantum number (when given), l and n. */
export interface Configuration {
  readonly principal?: number;
  readonly l: number;
  readonly n: number;
  /** Canonical text, e.g. `"d8"` or `"3d8"`. */
  readonly text: string;
}

/** The table N(M_L, M_S) of microstate counts, for M_L ≥ 0 and M_S ≥ 0 (the rest follows by symmetry). */
export interface MicrostateTable {
  /** M_L values, highest first. */
  readonly ML: readonly number[];
  /** M_S values, highest first. */
  readonly MS: readonly number[];
  /** `counts[i][j]` is the number of microstates with M_L = ML[i] and M_S = MS[j]. */
  readonly counts: readonly (readonly number[])[];
}

/** The Hund's-rules ground level of a configuration. */
export interface GroundLevel {
  readonly term: Term;
  /** Ground J: |L − S| below half filling, L + S above it (S at exactly half filling, where L = 0). */
  readonly J: number;
  /** Plain-text level symbol such as `"4F3/2"`. */
  readonly symbol: string;
}

/** Letter of orbital angular momentum L. */
export function termLetter(L: number): string {
  const letter = TERM_LETTERS[L];
  if (letter === undefined) throw new RangeError(`no term letter for L = ${L}`);
  return letter;
}

/** Text of a half-integer or integer, e.g. 1.5 → `"3/2"`, 2 → `"2"`. */
export function halfIntegerText(x: number): string {
  return Number.isInteger(x) ? String(x) : `${Math.round(2 * x)}/2`;
}

/** Plain-text term symbol, e.g. (S = 3/2, L = 3) → `"4F"`. */
export function termSymbol(S: number, L: number): string {
  return `${Math.round(2 * S + 1)}${termLetter(L)}`;
}

/**
 * Parses a configuration such as `p2`, `d3`, `3d8` or `4f7`.
 * @throws InputError naming the text when it is not of that form or n is out of range.
 */
export function parseConfiguration(text: string): Configuration {
  const match = /^\s*(\d*)\s*([spdf])\s*\^?\s*(\d+)\s*$/i.exec(text);
  if (!match) {
    throw new InputError(
      `configuration "${text}": expected a shell letter s, p, d or f and an electron count, e.g. d3, 3d8, f2`,
    );
  }
  const [, principalText = '', letter = '', countText = ''] = match;
  const l = SHELL_LETTERS.indexOf(letter.toLowerCase() as (typeof SHELL_LETTERS)[number]);
  const n = Number(countText);
  const cap = 2 * (2 * l + 1);
  if (n > cap) {
    throw new InputError(
      `configuration "${text}": ${/^[fs]$/i.test(letter) ? 'an' : 'a'} ${letter} shell holds 0 to ${cap} electrons, got ${n}`,
    );
  }
  let principal: number | undefined;
  if (principalText !== '') {
    principal = Number(principalText);
    if (principal < l + 1) {
      throw new InputError(
        `configuration "${text}": ${/^[fs]$/i.test(letter) ? 'an' : 'a'} ${letter} shell needs principal quantum number ≥ ${l + 1}, got ${principal}`,
      );
    }
  }
  const core = `${letter.toLowerCase()}${n}`;
  return principal === undefined ? { l, n, text: core } : { principal, l, n, text: `${principal}${core}` };
}

/** Counts N(M_L, M_S) over the non-negative quadrant. */
export function microstateTable(l: number, n: number): MicrostateTable {
  const states = microstates(l, n);
  let maxML = 0;
  let maxTwoMS = 0;
  for (const s of states) {
    maxML = Math.max(maxML, s.ML);
    maxTwoMS = Math.max(maxTwoMS, s.twoMS);
  }
  const minTwoMS = n % 2;
  const ML: number[] = [];
  for (let m = maxML; m >= 0; m--) ML.push(m);
  const twoMS: number[] = [];
  for (let t = maxTwoMS; t >= minTwoMS; t -= 2) twoMS.push(t);
  const counts = ML.map(() => twoMS.map(() => 0));
  for (const s of states) {
    if (s.ML < 0 || s.twoMS < 0) continue;
    const row = counts[maxML - s.ML];
    const j = (maxTwoMS - s.twoMS) / 2;
    if (row !== undefined && row[j] !== undefined) row[j] += 1;
  }
  return { ML, MS: twoMS.map((t) => t / 2), counts };
}

/**
 * The Russell–Saunders terms of lⁿ, found by peeling blocks off the microstate table: the
 * highest remaining M_L, and at it the highest M_S, starts a term with L = M_L, S = M_S, whose
 * (2L+1)(2S+1) microstates are then removed, as many times as that entry counts.
 * Sorted by S, then L, both descending.
 */
export function termsOf(l: number, n: number): Term[] {
  const table = microstateTable(l, n);
  const rest = table.counts.map((row) => [...row]);
  const nML = table.ML.length;
  const nMS = table.MS.length;
  const found: Term[] = [];
  for (let i = 0; i < nML; i++) {
    for (let j = 0; j < nMS; j++) {
      const count = rest[i]?.[j] ?? 0;
      if (count <= 0) continue;
      const L = table.ML[i] ?? 0;
      const S = table.MS[j] ?? 0;
      found.push({ S, L, count, symbol: termSymbol(S, L) });
      for (let a = i; a < nML; a++) {
        const row = rest[a];
        if (!row) continue;
        for (let b = j; b < nMS; b++) row[b] = (row[b] ?? 0) - count;
      }
    }
  }
  return found.sort((x, y) => y.S - x.S || y.L - x.L);
}

/** The J values |L − S| … L + S of a term, ascending. */
export function jLevels(S: number, L: number): number[] {
  const out: number[] = [];
  for (let J = Math.abs(L - S); J <= L + S + 1e-9; J += 1) out.push(J);
  return out;
}

/**
 * The ground level by Hund's rules: greatest S, then greatest L; J = |L − S| when the shell is
 * less than half full and L + S when it is more than half full.
 */
export function hundGround(l: number, n: number): GroundLevel {
  const terms = termsOf(l, n);
  const term = terms[0];
  if (!term) throw new InputError(`configuration with l = ${l}, n = ${n} has no terms`);
  const half = 2 * l + 1;
  const J = n <= half ? Math.abs(term.L - term.S) : term.L + term.S;
  return { term, J, symbol: `${term.symbol}${halfIntegerText(J)}` };
}
