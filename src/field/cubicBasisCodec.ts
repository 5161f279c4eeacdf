/**
 * The cubic adapted blocks of one dⁿ as stored data and back: each block's (k, S, parity,
 * e-counts), and all its numbers (∂H/∂B, ∂H/∂C, the C₃ class sum, the basis vectors) as the
 * little-endian bytes of their doubles in base64, so that decoding gives the very same bits the
 * build gave. Decoding takes a fraction of a millisecond; building takes 30–200 ms at start-up.
 */
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
  const parts = blocks.flatMap((b) => [b.partB, b.partC, ...(b.c3Sum ? [b.c3Sum] : []), b.toDeterminants]);
  const length = parts.reduce((s, p) => s + p.length, 0);
  const view = new DataView(new ArrayBuffer(8 * length));
  let at = 0;
  for (const p of parts) {
    for (const x of p) {
      view.setFloat64(at, x, true);
      at += 8;
    }
  }
  let binary = '';
  for (let i = 0; i < view.byteLength; i++) binary += String.fromCharCode(view.getUint8(i));
  return {
    blocks: blocks.map((b) => [b.k, b.S, b.parity, [...b.eCount], b.c3Sum ? 1 : 0]),
    floats: btoa(binary),
  };
}

/** Whether this platform stores doubles little-endian, as the stored bytes are. */
const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/**
 * The blocks of dⁿ from stored data, over the determinant classes of `classes` (from
 * determinantClasses(n)); undefined on a big-endian platform, where the caller builds them.
 */
export function decodeAdaptedBlocks(
  n: number,
  stored: StoredCubicBasis,
  classes: readonly (readonly number[])[],
): AdaptedBlock[] | undefined {
  if (!LITTLE_ENDIAN) return undefined;
  const binary = atob(stored.floats);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  const floats = new Float64Array(bytes.buffer);
  let at = 0;
  const take = (count: number) => {
    at += count;
    return floats.subarray(at - count, at);
  };
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
