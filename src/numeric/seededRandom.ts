/**
 * Reproducible pseudo-random numbers for synthetic spectra (demo data and tests): the same seed
 * gives the same numbers on every machine, which `Math.random` cannot promise.
 */

/**
 * A uniform generator on [0, 1) from a 32-bit seed: mulberry32 (T. Ettinger, public-domain
 * 32-bit mixing generator, 2017). Small and fast; its period of 2³² is ample for a spectrum.
 */
export function uniformRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A standard normal generator (mean 0, variance 1) from a 32-bit seed, by the Box–Muller
 * transform (Box & Muller, Ann. Math. Statist. 29, 610, 1958) of {@link uniformRandom}.
 */
export function normalRandom(seed: number): () => number {
  const uniform = uniformRandom(seed);
  return () => {
    // 1 − u lies in (0, 1], so the logarithm is finite.
    const u = 1 - uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
}
