/**
 * The dⁿ Hamiltonian H = B·H_B + C·H_C + Dq·V in the determinant basis: electron repulsion in
 * Racah's B and C (from the Slater–Condon matrices with F² = 49B + 7C, F⁴ = 441C/35) and the
 * cubic crystal field V per unit Dq (octahedral sign).
 */

import { microstates } from '../atom/microstates.js';
import { type BasisBlock, basisBlock, casimirMatrix, oneBodyMatrix } from '../atom/operators.js';
import { repulsionMatrices } from '../atom/repulsion.js';
import { octahedralFieldTerms } from './crystalField.js';

/** The parts of the Hamiltonian and the spin Casimir over a set of determinants. */
export interface DeterminantBlock extends BasisBlock {
  /** ∂H/∂B, row-major. */
  readonly partB: Float64Array;
  /** ∂H/∂C, row-major. */
  readonly partC: Float64Array;
  /** ∂H/∂Dq for an octahedral field, row-major. */
  readonly partDq: Float64Array;
  /** S², row-major. */
  readonly spinSquared: Float64Array;
}

const D = 2;

function twoMsOfMask(mask: number): number {
  let a = 0;
  for (let p = 0; p < 10; p++) if (mask & (1 << p)) a += p < 5 ? 1 : -1;
  return a;
}

/**
 * Builds the parts over `masks`, which must be closed under H and S² (a block of fixed M_S and
 * M_L mod 4, or all determinants).
 */
export function determinantBlock(masks: readonly number[]): DeterminantBlock {
  const block = basisBlock(masks);
  const [f2, f4] = repulsionMatrices(D, block);
  const size = masks.length * masks.length;
  const partB = new Float64Array(size);
  const partC = new Float64Array(size);
  for (let i = 0; i < size; i++) {
    const a = f2?.[i] ?? 0;
    const b = f4?.[i] ?? 0;
    partB[i] = 49 * a;
    partC[i] = 7 * a + (441 / 35) * b;
  }
  return {
    ...block,
    partB,
    partC,
    partDq: oneBodyMatrix(block, octahedralFieldTerms()),
    spinSquared: casimirMatrix(D, block, true, (m) => twoMsOfMask(m) / 2),
  };
}

/**
 * Determinants of dⁿ at the lowest M_S (0 or ½) grouped by M_L mod 4, for k = 0, 1, 2. That M_S
 * holds one component of every spin multiplet; the crystal field couples m_l = ±2 and so
 * conserves M_L only mod 4. The class k = 3 is the mirror image (m_l → −m_l, a symmetry of H)
 * of k = 1 and has the same eigenvalues, so it is not needed.
 */
export function determinantClasses(n: number): number[][] {
  const twoMS = n % 2;
  const byClass: number[][] = [[], [], []];
  for (const s of microstates(D, n)) {
    if (s.twoMS !== twoMS) continue;
    byClass[((s.ML % 4) + 4) % 4]?.push(s.mask);
  }
  return byClass;
}

/**
 * H = B·H_B + C·H_C + Dq·V of the whole dⁿ over all C(10, n) determinants, with no use of
 * symmetry: the slow, obvious path that tests and the benchmark hold the blocked one against.
 * `dq` has the octahedral sign.
 */
export function fullHamiltonian(
  n: number,
  dq: number,
  B: number,
  C: number,
): { size: number; matrix: Float64Array } {
  const block = determinantBlock(microstates(D, n).map((s) => s.mask));
  const size = block.masks.length;
  const matrix = new Float64Array(size * size);
  for (let i = 0; i < matrix.length; i++) {
    matrix[i] = B * (block.partB[i] ?? 0) + C * (block.partC[i] ?? 0) + dq * (block.partDq[i] ?? 0);
  }
  return { size, matrix };
}

/** The free-ion block of lⁿ with M_L = 0 and the lowest M_S. */
export function freeIonBlock(l: number, n: number): BasisBlock & { readonly twoMS: number } {
  const twoMS = n % 2;
  const masks = microstates(l, n)
    .filter((s) => s.ML === 0 && s.twoMS === twoMS)
    .map((s) => s.mask);
  return { ...basisBlock(masks), twoMS };
}
