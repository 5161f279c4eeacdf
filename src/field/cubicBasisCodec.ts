/**
 * The cubic adapted blocks of one dⁿ as stored data and back: each block's (k, S, parity,
 * e-counts), and all its numbers (∂H/∂B, ∂H/∂C, the C₃ class sum, the basis vectors) as stored
 * floats (storedFloats.ts), so that decoding gives the very same bits the build gave. Decoding
 * takes a fraction of a millisecond; building takes 30–200 ms at start-up.
 */
import { decodeFloats, encodeFloats } from '../numeric/storedFloats.js';
import type { AdaptedBlock } from './cubicBasis.js';

/** One stored block: k, S, parity, the e-set electron count of each basis vector, and 1 if it has a C₃ class sum. */
export type StoredBlock = readonly [
  k: number,
  S: number,
  parity: number,
  eCount: readonly number[],
  hasC3: 0 | 1,
];

/** The adapted blocks of one dⁿ, in the order built. */
export interface StoredCubicBasis {
  readonly blocks: readonly StoredBlock[];
  /** Per block in order: partB, partC, c3Sum (if any), toDeterminants; float64 little-endian, base64. */
  readonly floats: string;
}

/** The blocks as stored data (for the generator of cubicBasisData.ts). */
export function encodeAdaptedBlocks(blocks: readonly AdaptedBlock[]): StoredCubicBasis {
  return {
    blocks: blocks.map((b) => [b.k, b.S, b.parity, [...b.eCount], b.c3Sum ? 1 : 0]),
    floats: encodeFloats(
      blocks.flatMap((b) => [b.partB, b.partC, ...(b.c3Sum ? [b.c3Sum] : []), b.toDeterminants]),
    ),
  };
}

/**
 * The blocks of dⁿ from stored data, over the determinant classes of `classes` (from
 * determinantClasses(n)); undefined on a big-endian platform, where the caller builds them.
 */
export function decodeAdaptedBlocks(
  n: number,
  stored: StoredCubicBasis,
  classes: readonly (readonly number[])[],
): AdaptedBlock[] | undefined {
  const take = decodeFloats(stored.floats);
  if (!take) return undefined;
  return stored.blocks.map(([k, S, parity, eCount, hasC3]) => {
    const masks = classes[k] ?? [];
    const m = eCount.length;
    return {
      k,
      S,
      parity,
      size: m,
      partB: take(m * m),
      partC: take(m * m),
      fieldDiagonal: Float64Array.from(eCount, (b) => -4 * (n - b) + 6 * b),
      eCount,
      c3Sum: hasC3 ? take(m * m) : null,
      masks,
      toDeterminants: take(masks.length * m),
    };
  });
}
