/**
 * Free-ion term energies of lⁿ: the Slater–Condon repulsion matrix (repulsion.ts) of the
 * M_L = 0, lowest-M_S block diagonalised, each level named by its L and S read from ⟨L²⟩ and
 * ⟨S²⟩ (Condon & Shortley, The Theory of Atomic Spectra, 1935, ch. 6), for Slater integrals or
 * for Racah's B and C.
 */

import { ensure } from '../core/errors.js';
import { freeIonBlock } from '../field/hamiltonian.js';
import { clusterSorted, resolveSubspace, symmetricEigen } from '../numeric/eigen.js';
import { decodeFloats, encodeFloats } from '../numeric/storedFloats.js';
import { STORED_D_FREE_ION_PARTS } from './freeIonData.js';
import { quantumNumbers } from './microstates.js';
import { casimirMatrix } from './operators.js';
import { repulsionMatrices, slaterFromRacah } from './repulsion.js';
import { termSymbol } from './terms.js';

/** One free-ion term with its energy. */
export interface FreeIonTerm {
  readonly S: number;
  readonly L: number;
  /** Term symbol, e.g. `"4F"`. */
  readonly term: string;
  /**
   * The symbol with a prefix a, b, … (lowest first, as in atomic energy-level tables) when the
   * configuration has that term more than once, e.g. `"a2D"`, `"b2D"`; else the bare symbol.
   */
  readonly name: string;
  /** Energy above the lowest term, cm⁻¹. */
  readonly energy: number;
  /** (2S+1)(2L+1). */
  readonly degeneracy: number;
}

/** The Slater–Condon parts and Casimirs of the M_L = 0, lowest-M_S block of lⁿ, row-major. */
export interface FreeIonParts {
  readonly size: number;
  /** ∂H/∂F², ∂H/∂F⁴, … */
  readonly parts: Float64Array[];
  readonly l2: Float64Array;
  readonly s2: Float64Array;
}

/** Stored {@link FreeIonParts} of dⁿ: the size, and parts, L² and S² as stored floats. */
export interface StoredFreeIonParts {
  readonly size: number;
  readonly floats: string;
}

const partsCache = new Map<number, FreeIonParts>();

/**
 * The parts of lⁿ, once per (l, n): for d shells decoded from the stored copy in freeIonData.ts
 * (quicker at start-up than building; test/atom/freeIonData.test.ts holds it equal to
 * {@link buildFreeIonParts}, bit for bit), else built.
 */
function freeIonParts(l: number, n: number): FreeIonParts {
  const key = l * 100 + n;
  const cached = partsCache.get(key);
  if (cached) return cached;
  const stored = l === 2 ? STORED_D_FREE_ION_PARTS[n] : undefined;
  const parts = (stored && decodeFreeIonParts(l, stored)) ?? buildFreeIonParts(l, n);
  partsCache.set(key, parts);
  return parts;
}

/** Repulsion matrices and Casimirs of the M_L = 0, lowest-M_S block of lⁿ, built. */
export function buildFreeIonParts(l: number, n: number): FreeIonParts {
  const block = freeIonBlock(l, n);
  return {
    size: block.masks.length,
    parts: repulsionMatrices(l, block),
    l2: casimirMatrix(l, block, false, (m) => quantumNumbers(l, m).ML),
    s2: casimirMatrix(l, block, true, (m) => quantumNumbers(l, m).twoMS / 2),
  };
}

/** The parts as stored data (for the generator of freeIonData.ts). */
export function encodeFreeIonParts(p: FreeIonParts): StoredFreeIonParts {
  return { size: p.size, floats: encodeFloats([...p.parts, p.l2, p.s2]) };
}

/** The parts of an lⁿ shell (l Slater parts) from stored data; undefined where they cannot be read. */
export function decodeFreeIonParts(l: number, stored: StoredFreeIonParts): FreeIonParts | undefined {
  const take = decodeFloats(stored.floats);
  if (!take) return undefined;
  const square = stored.size * stored.size;
  return {
    size: stored.size,
    parts: Array.from({ length: l }, () => take(square)),
    l2: take(square),
    s2: take(square),
  };
}

function quantum(x: number): number {
  // x = J(J+1) → J, rounded to the nearest half-integer.
  return Math.round(((-1 + Math.sqrt(1 + 4 * Math.max(0, x))) / 2) * 2) / 2;
}

/**
 * Free-ion terms of lⁿ and their energies for given Slater integrals F², F⁴, … (F⁰ left out):
 * the M_L = 0, lowest-M_S block of the Slater–Condon matrix is diagonalised, and each level's
 * L and S are read from ⟨L²⟩ and ⟨S²⟩ (resolving any degeneracy by diagonalising L², then S²,
 * within it). That block holds one component of every term, so all terms appear once each.
 * Sorted by energy; energies relative to the lowest term.
 */
export function freeIonTermsSlater(l: number, n: number, slater: readonly number[]): FreeIonTerm[] {
  ensure(
    slater.length === l,
    `free-ion energies of an l = ${l} shell need ${l} Slater integrals, got ${slater.length}`,
  );
  const { size, parts, l2, s2 } = freeIonParts(l, n);
  const h = new Float64Array(size * size);
  parts.forEach((part, i) => {
    const f = slater[i] ?? 0;
    for (let j = 0; j < h.length; j++) h[j] = (h[j] ?? 0) + f * (part[j] ?? 0);
  });
  const eig = symmetricEigen(h, size);
  const values = Array.from(eig.values);
  const scale = 1 + Math.max(0, ...values.map(Math.abs));
  const tol = 1e-8 * scale;
  const raw: { S: number; L: number; energy: number }[] = [];
  for (const run of clusterSorted(values, tol)) {
    const vectors = run.map((j) => {
      const v = new Float64Array(size);
      for (let i = 0; i < size; i++) v[i] = eig.vectors[i * size + j] ?? 0;
      return v;
    });
    const energy = run.reduce((s, j) => s + (values[j] ?? 0), 0) / run.length;
    for (const byL of resolveSubspace(vectors, l2, 1e-6)) {
      for (const byS of resolveSubspace(byL.vectors, s2, 1e-6)) {
        for (let c = 0; c < byS.vectors.length; c++) {
          raw.push({ S: quantum(byS.value), L: quantum(byL.value), energy });
        }
      }
    }
  }
  raw.sort((a, b) => a.energy - b.energy);
  const ground = raw[0]?.energy ?? 0;
  const seen = new Map<string, number>();
  const total = new Map<string, number>();
  for (const t of raw) {
    const sym = termSymbol(t.S, t.L);
    total.set(sym, (total.get(sym) ?? 0) + 1);
  }
  return raw.map((t) => {
    const term = termSymbol(t.S, t.L);
    const index = seen.get(term) ?? 0;
    seen.set(term, index + 1);
    const repeated = (total.get(term) ?? 0) > 1;
    return {
      S: t.S,
      L: t.L,
      term,
      name: repeated ? `${'abcdefghijklmnopqrstuvwxyz'[index] ?? String(index + 1)}${term}` : term,
      energy: t.energy - ground,
      degeneracy: Math.round((2 * t.S + 1) * (2 * t.L + 1)),
    };
  });
}

/**
 * Free-ion terms of dⁿ for Racah parameters B and C (cm⁻¹), energies above the lowest term
 * (Racah, Phys. Rev. 62, 438, 1942; tabulated for every dⁿ in Griffith, The Theory of
 * Transition-Metal Ions, 1961).
 */
export function freeIonTerms(n: number, B: number, C: number): FreeIonTerm[] {
  ensure(
    Number.isInteger(n) && n >= 0 && n <= 10,
    `d-electron count ${n}: expected a whole number from 0 to 10`,
  );
  ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  const { F2, F4 } = slaterFromRacah(B, C);
  return freeIonTermsSlater(2, n, [F2, F4]);
}
