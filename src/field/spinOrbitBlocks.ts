/**
 * The dⁿ Hamiltonian with spin–orbit coupling, H = B·H_B + C·H_C + Dq·V + ζ·H_ζ, in the
 * determinant basis, split into the M_J classes of the double group (see doubleGroup.ts): one
 * real symmetric block per kept class, each about a quarter of the C(10, n) determinants. Each
 * block also carries what naming and magnetism need: the characters' rotations, S² and the
 * diagonal Zeeman parts M_L and M_S. Built once per n. The full, unblocked matrix is here too:
 * the slow, obvious path the tests and the benchmark hold the blocked one against.
 */
import { rotateDeterminantsByMinors } from '../atom/determinantRotation.js';
import { microstates } from '../atom/microstates.js';
import { oneBodyMatrix } from '../atom/operators.js';
import { keptClasses, mjClass, namingRotations, spinorRotation } from './doubleGroup.js';
import { type DeterminantBlock, determinantBlock } from './hamiltonian.js';
import { spinOrbitTerms } from './spinOrbit.js';

/** One M_J class of dⁿ with the parts of its Hamiltonian. */
export interface SpinOrbitBlock extends DeterminantBlock {
  /** 2M_J mod 8 of the class. */
  readonly cls: number;
  /** How many classes of equal spectrum this block stands for (itself and its time-reversed image). */
  readonly weight: number;
  /** ∂H/∂ζ (Σ l·s), row-major. */
  readonly partZeta: Float64Array;
  /** M_L of each determinant. */
  readonly ML: Float64Array;
  /** M_S of each determinant. */
  readonly MS: Float64Array;
  /** Real part of a C3 rotation (space and spin) within the block. */
  readonly c3: Float64Array;
  /** Real part of a C2′ rotation within the block; null where C2′ leads out of it (and for odd n, where no irrep needs it). */
  readonly c2p: Float64Array | null;
}

const cache = new Map<number, SpinOrbitBlock[]>();

/** The kept M_J blocks of dⁿ (n = 1…9), cached. */
export function spinOrbitBlocks(n: number): SpinOrbitBlock[] {
  const cached = cache.get(n);
  if (cached) return cached;
  const states = microstates(2, n);
  const { c3, c2p } = namingRotations();
  const u3 = spinorRotation(c3);
  const u2 = spinorRotation(c2p);
  const soTerms = spinOrbitTerms();
  const out = keptClasses(n).map(({ cls, weight }) => {
    const members = states.filter((s) => mjClass(s.ML, s.twoMS) === cls);
    const det = determinantBlock(members.map((s) => s.mask));
    const selfMirror = cls === 0 || cls === 4;
    return {
      ...det,
      cls,
      weight,
      partZeta: oneBodyMatrix(det, soTerms),
      ML: Float64Array.from(members, (s) => s.ML),
      MS: Float64Array.from(members, (s) => s.twoMS / 2),
      // By minors: the spinor rotations are dense, where that is several times quicker than
      // expanding electron by electron (equal up to rounding; only traces rounded to characters use them).
      c3: rotateDeterminantsByMinors(det, u3, 10),
      c2p: n % 2 === 0 && selfMirror ? rotateDeterminantsByMinors(det, u2, 10) : null,
    };
  });
  cache.set(n, out);
  return out;
}

/** H = B·H_B + C·H_C + dqOct·V + ζ·H_ζ of one block, row-major. */
export function blockHamiltonian(
  block: SpinOrbitBlock,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
): Float64Array {
  const { partB, partC, partDq, partZeta } = block;
  const h = new Float64Array(partB.length);
  // Hot loop: typed-array reads are in range by construction.
  for (let i = 0; i < h.length; i++) {
    h[i] =
      B * (partB[i] as number) +
      C * (partC[i] as number) +
      dqOct * (partDq[i] as number) +
      zeta * (partZeta[i] as number);
  }
  return h;
}

/**
 * H of the whole dⁿ over all C(10, n) determinants with no use of symmetry: the slow path.
 * `dqOct` has the octahedral sign (a tetrahedral field is a negative one).
 */
export function fullSpinOrbitHamiltonian(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
): { size: number; matrix: Float64Array } {
  const det = determinantBlock(microstates(2, n).map((s) => s.mask));
  const block: SpinOrbitBlock = {
    ...det,
    cls: -1,
    weight: 1,
    partZeta: oneBodyMatrix(det, spinOrbitTerms()),
    ML: new Float64Array(0),
    MS: new Float64Array(0),
    c3: new Float64Array(0),
    c2p: null,
  };
  return { size: det.masks.length, matrix: blockHamiltonian(block, dqOct, B, C, zeta) };
}
