import { describe, expect, it } from 'vitest';
import { type AdaptedBlock, adaptedBlocks, buildAdaptedBlocks } from '../../src/field/cubicBasis.js';
import { decodeAdaptedBlocks, encodeAdaptedBlocks } from '../../src/field/cubicBasisCodec.js';
import { STORED_CUBIC_BASES } from '../../src/field/cubicBasisData.js';
import { determinantClasses } from '../../src/field/hamiltonian.js';

/** The bytes of a typed array, so that equality means the same bits (−0 and NaN payloads included). */
function bits(a: Float64Array | null): number[] | null {
  return a && Array.from(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
}

/** A block with its arrays as bytes, for one toEqual over everything. */
function asBits(b: AdaptedBlock) {
  return {
    k: b.k,
    S: b.S,
    parity: b.parity,
    size: b.size,
    eCount: [...b.eCount],
    masks: [...b.masks],
    partB: bits(b.partB),
    partC: bits(b.partC),
    fieldDiagonal: bits(b.fieldDiagonal),
    c3Sum: bits(b.c3Sum),
    toDeterminants: bits(b.toDeterminants),
  };
}

describe('stored cubic bases', () => {
  it('STORED_CUBIC_BASES decodes to what buildAdaptedBlocks builds, bit for bit, for d1 to d9 (else run npm run generate:data)', () => {
    expect(STORED_CUBIC_BASES).toHaveLength(9);
    for (let n = 1; n <= 9; n++) {
      const stored = STORED_CUBIC_BASES[n - 1];
      if (!stored) throw new Error(`no stored basis for d${n}`);
      const decoded = decodeAdaptedBlocks(n, stored, determinantClasses(n));
      expect(decoded?.map(asBits), `d${n}`).toEqual(buildAdaptedBlocks(n).map(asBits));
    }
  });

  it('adaptedBlocks returns the stored blocks, and encodeAdaptedBlocks gives back the stored data', () => {
    for (const n of [3, 6]) {
      // Decoded blocks are views of one buffer; built ones each have their own.
      const [first, second] = adaptedBlocks(n);
      expect(first?.partB.buffer).toBe(second?.partB.buffer);
      expect(adaptedBlocks(n).map(asBits)).toEqual(buildAdaptedBlocks(n).map(asBits));
      expect(encodeAdaptedBlocks(adaptedBlocks(n))).toEqual(STORED_CUBIC_BASES[n - 1]);
    }
  });
});
