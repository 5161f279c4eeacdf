/**
 * Second-quantised operators acting on determinant bit masks (see microstates.ts for the
 * spin-orbital order that fixes every fermion sign).
 */

import { mlOf, popcount } from './microstates.js';

/** (−1)^(number of occupied spin-orbitals below p): the sign of moving a†_p or a_p into place. */
export function parity(mask: number, p: number): number {
  return popcount(mask & ((1 << p) - 1)) & 1 ? -1 : 1;
}

/** One term `value · a†_to a_from` of a one-electron operator. */
export interface OneBodyTerm {
  readonly to: number;
  readonly from: number;
  readonly value: number;
}

/** A sparse vector over determinants: mask → coefficient. */
export type DeterminantVector = Map<number, number>;

/** Adds `scale · Σ_terms value a†_to a_from |mask⟩` into `out`. */
export function applyOneBody(
  mask: number,
  terms: readonly OneBodyTerm[],
  out: DeterminantVector,
  scale = 1,
): void {
  for (const t of terms) {
    const fromBit = 1 << t.from;
    if (!(mask & fromBit)) continue;
    const s1 = parity(mask, t.from);
    const m1 = mask ^ fromBit;
    const toBit = 1 << t.to;
    if (m1 & toBit) continue;
    const s2 = parity(m1, t.to);
    const m2 = m1 | toBit;
    out.set(m2, (out.get(m2) ?? 0) + scale * s1 * s2 * t.value);
  }
}

/** Applies a one-electron operator to a sparse vector. */
export function applyOneBodyToVector(v: DeterminantVector, terms: readonly OneBodyTerm[]): DeterminantVector {
  const out: DeterminantVector = new Map();
  for (const [mask, c] of v) applyOneBody(mask, terms, out, c);
  return out;
}

/** A set of determinants with an index, the basis of one symmetry block. */
export interface BasisBlock {
  readonly masks: readonly number[];
  readonly index: ReadonlyMap<number, number>;
}

/** Makes a {@link BasisBlock} from masks. */
export function basisBlock(masks: readonly number[]): BasisBlock {
  return { masks, index: new Map(masks.map((m, i) => [m, i])) };
}

/**
 * Dense row-major matrix of a one-electron operator within a block. The operator must map the
 * block into itself (conserve its quantum numbers); other components are an error.
 */
export function oneBodyMatrix(block: BasisBlock, terms: readonly OneBodyTerm[]): Float64Array {
  const n = block.masks.length;
  const out = new Float64Array(n * n);
  block.masks.forEach((mask, col) => {
    const image: DeterminantVector = new Map();
    applyOneBody(mask, terms, image);
    for (const [m, c] of image) {
      const row = block.index.get(m);
      if (row === undefined) throw new Error('one-electron operator leaves its symmetry block');
      out[row * n + col] = (out[row * n + col] ?? 0) + c;
    }
  });
  return out;
}

/** The raising operator L+ (or S+ with `spin`) of a shell, as one-electron terms. */
export function raisingTerms(l: number, spin: boolean): OneBodyTerm[] {
  const width = 2 * l + 1;
  const terms: OneBodyTerm[] = [];
  if (spin) {
    // S+ turns β into α on the same orbital.
    for (let j = 0; j < width; j++) terms.push({ to: j, from: j + width, value: 1 });
    return terms;
  }
  for (let p = 0; p < 2 * width; p++) {
    const m = mlOf(l, p);
    if (m === l) continue;
    terms.push({ to: p + 1, from: p, value: Math.sqrt(l * (l + 1) - m * (m + 1)) });
  }
  return terms;
}

/** The adjoint (lowering) of a list of real one-electron terms. */
export function adjointTerms(terms: readonly OneBodyTerm[]): OneBodyTerm[] {
  return terms.map((t) => ({ to: t.from, from: t.to, value: t.value }));
}

/**
 * Matrix of L² (or S² with `spin`) in a block of fixed M_L (or M_S) per determinant, by
 * X² = X₋X₊ + X_z² + X_z with X_z read off each determinant.
 */
export function casimirMatrix(
  l: number,
  block: BasisBlock,
  spin: boolean,
  zOf: (mask: number) => number,
): Float64Array {
  return casimirFromRaising(block, raisingTerms(l, spin), zOf);
}

/**
 * X² = X₋X₊ + X_z² + X_z of an angular momentum given by its raising operator (L₊, S₊ or their
 * sum J₊) in a block that keeps X_z, read off each determinant by `zOf`.
 */
export function casimirFromRaising(
  block: BasisBlock,
  raise: readonly OneBodyTerm[],
  zOf: (mask: number) => number,
): Float64Array {
  const lower = adjointTerms(raise);
  const n = block.masks.length;
  const out = new Float64Array(n * n);
  block.masks.forEach((mask, col) => {
    const up: DeterminantVector = new Map();
    applyOneBody(mask, raise, up);
    const image = applyOneBodyToVector(up, lower);
    const z = zOf(mask);
    image.set(mask, (image.get(mask) ?? 0) + z * z + z);
    for (const [m, c] of image) {
      if (c === 0) continue;
      const row = block.index.get(m);
      if (row === undefined) throw new Error('angular-momentum operator leaves its symmetry block');
      out[row * n + col] = (out[row * n + col] ?? 0) + c;
    }
  });
  return out;
}
