import { describe, expect, it } from 'vitest';
import {
  buildFreeIonParts,
  decodeFreeIonParts,
  encodeFreeIonParts,
  type FreeIonParts,
} from '../../src/atom/freeIon.js';
import { STORED_D_FREE_ION_PARTS } from '../../src/atom/freeIonData.js';

/** The parts with every array as its bytes, so that equality means the same bits. */
function asBits(p: FreeIonParts | undefined) {
  const bits = (a: Float64Array) => Array.from(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
  return p && { size: p.size, parts: p.parts.map(bits), l2: bits(p.l2), s2: bits(p.s2) };
}

describe('stored free-ion parts', () => {
  it('STORED_D_FREE_ION_PARTS decodes to what buildFreeIonParts builds, bit for bit, for d0 to d10 (else run npm run generate:data)', () => {
    expect(STORED_D_FREE_ION_PARTS).toHaveLength(11);
    for (let n = 0; n <= 10; n++) {
      const stored = STORED_D_FREE_ION_PARTS[n];
      if (!stored) throw new Error(`no stored parts for d${n}`);
      expect(asBits(decodeFreeIonParts(2, stored)), `d${n}`).toEqual(asBits(buildFreeIonParts(2, n)));
      expect(encodeFreeIonParts(buildFreeIonParts(2, n))).toEqual(stored);
    }
  });
});
