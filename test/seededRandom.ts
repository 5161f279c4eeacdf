/** Seeded pseudo-random numbers for tests: mulberry32 (Tommy Ettinger, public domain, 2017). */

/** A generator of uniform numbers in [0, 1) from a 32-bit seed. */
export function seededRandom(seed: number): () => number {
  let s = seed | 0;
  return () => {
    s = (s + 0x6d2b79f5) | 0;
    let t = Math.imul(s ^ (s >>> 15), 1 | s);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates from a uniform generator (Box & Muller, Ann. Math. Stat. 29, 610, 1958). */
export function gaussian(uniform: () => number): () => number {
  return () => {
    const u = 1 - uniform();
    const v = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}
