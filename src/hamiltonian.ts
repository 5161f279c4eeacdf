import { octahedralFieldTerms } from './crystalField.js';
import { microstates } from './microstates.js';
import { type BasisBlock, basisBlock, casimirMatrix, oneBodyMatrix } from './operators.js';
import { repulsionMatrices } from './repulsion.js';

/**
 * The dⁿ Hamiltonian H = B·H_B + C·H_C + Dq·V in the determinant basis: electron repulsion in
 * Racah's B and C (from the Slater–Condon matrices with F² = 49B + 7C, F⁴ = 441C/35) and the
 * cubic crystal field V per unit Dq (octahedral sign). The parts are built once per n and
 * cached, so one point costs an element-wise sum and a diagonalisation.
 */

/** One symmetry block with the parts of the Hamiltonian and the spin Casimir. */
export interface HamiltonianBlock extends BasisBlock {
  /** M_L mod 4 of the block (the C₄(z) class); or M_L itself for a free-ion block. */
  readonly k: number;
  /** Twice M_S of the block. */
  readonly twoMS: number;
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

function buildBlock(masks: number[], k: number, twoMS: number): HamiltonianBlock {
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
    k,
    twoMS,
    partB,
    partC,
    partDq: oneBodyMatrix(block, octahedralFieldTerms()),
    spinSquared: casimirMatrix(D, block, true, (m) => twoMsOfMask(m) / 2),
  };
}

const cubicCache = new Map<number, HamiltonianBlock[]>();

/**
 * The four cubic blocks of dⁿ at the lowest M_S (0 or ½), one per M_L mod 4. That M_S holds one
 * component of every spin multiplet, so these blocks give every level; the crystal field
 * couples m_l = ±2 and so conserves M_L only mod 4. Cached per n.
 */
export function cubicBlocks(n: number): HamiltonianBlock[] {
  const cached = cubicCache.get(n);
  if (cached) return cached;
  const twoMS = n % 2;
  const byClass: number[][] = [[], [], [], []];
  for (const s of microstates(D, n)) {
    if (s.twoMS !== twoMS) continue;
    byClass[((s.ML % 4) + 4) % 4]?.push(s.mask);
  }
  const blocks = byClass.map((masks, k) => buildBlock(masks, k, twoMS));
  cubicCache.set(n, blocks);
  return blocks;
}

/** H = B·H_B + C·H_C + Dq·V of one block, with `dq` the octahedral-sign Dq. */
export function assemble(block: HamiltonianBlock, dq: number, B: number, C: number): Float64Array {
  const size = block.partB.length;
  const out = new Float64Array(size);
  const { partB, partC, partDq } = block;
  for (let i = 0; i < size; i++) {
    out[i] = B * (partB[i] as number) + C * (partC[i] as number) + dq * (partDq[i] as number);
  }
  return out;
}

/**
 * The whole dⁿ Hamiltonian over all C(10, n) determinants with no use of symmetry: the slow,
 * obvious path that tests and the benchmark hold the blocked one against.
 */
export function fullHamiltonian(
  n: number,
  dq: number,
  B: number,
  C: number,
): { size: number; matrix: Float64Array } {
  const masks = microstates(D, n).map((s) => s.mask);
  const block = buildBlock(masks, -1, 0);
  return { size: masks.length, matrix: assemble(block, dq, B, C) };
}

/** The free-ion block of dⁿ (or any lⁿ through `l`) with M_L = 0 and the lowest M_S. */
export function freeIonBlock(l: number, n: number): BasisBlock & { readonly twoMS: number } {
  const twoMS = n % 2;
  const masks = microstates(l, n)
    .filter((s) => s.ML === 0 && s.twoMS === twoMS)
    .map((s) => s.mask);
  return { ...basisBlock(masks), twoMS };
}
