/**
 * Doubles stored as text: the little-endian bytes of each float64 in base64, so that reading them
 * back gives the very same bits (generated data modules such as the cubic bases use it).
 */

/** Whether this platform stores doubles little-endian, as the stored bytes are. */
const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** The arrays, one after the other, as base64 text. */
export function encodeFloats(arrays: readonly Float64Array[]): string {
  const length = arrays.reduce((s, p) => s + p.length, 0);
  const view = new DataView(new ArrayBuffer(8 * length));
  let at = 0;
  for (const p of arrays) {
    for (const x of p) {
      view.setFloat64(at, x, true);
      at += 8;
    }
  }
  let binary = '';
  for (let i = 0; i < view.byteLength; i++) binary += String.fromCharCode(view.getUint8(i));
  return btoa(binary);
}

/**
 * The doubles of {@link encodeFloats}'s text, with a reader that hands out the next `count` of
 * them as a view; undefined on a big-endian platform (the caller then computes them).
 */
export function decodeFloats(text: string): ((count: number) => Float64Array) | undefined {
  if (!LITTLE_ENDIAN) return undefined;
  const binary = atob(text);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  const floats = new Float64Array(bytes.buffer);
  let at = 0;
  return (count) => {
    at += count;
    return floats.subarray(at - count, at);
  };
}
