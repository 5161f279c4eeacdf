import type { BandMerge, FitBand } from './fitTypes.js';

/**
 * Merging of band components before a fit: maxima closer than about one band width are not
 * separate transitions of the cubic model but one transition split by something the model
 * leaves out — a Jahn–Teller distortion (d¹, d⁹, high-spin d⁴ and d⁶), spin–orbit coupling (the
 * ν₃ triplet of tetrahedral Co(II)) or a shoulder. They are merged into one band at their
 * intensity-weighted centroid, the usual estimate of the cubic transition energy. Sharp bands
 * are set aside here: they are matched to predicted levels after the fit.
 */

/** Defaults of the merging. */
export const MERGE_DEFAULTS = {
  /**
   * Width (FWHM) assumed for a broad spin-allowed d–d band when none is given, cm⁻¹: such bands
   * are 2000–4000 cm⁻¹ wide in solution at room temperature (common practice, no source).
   */
  bandWidth: 3000,
  /**
   * Width assumed for the bands of high-spin d⁵, all spin-forbidden (ΔS = 1) and narrower: the
   * bands of [Mn(H2O)6]2+ are a few hundred to about 1500 cm⁻¹ wide (common practice, no source).
   */
  forbiddenBandWidth: 1200,
  /** Components closer than this many widths are merged: closer than a width, two bands are not resolved as separate maxima. */
  factor: 1,
} as const;

/** The bands as the fit sees them. */
export interface MergedBands {
  /** Broad bands after merging (each at its first member's place), then sharp bands. */
  readonly bands: readonly FitBand[];
  /** How many of `bands` are broad (fitted); the rest are sharp. */
  readonly broad: number;
  readonly merges: readonly BandMerge[];
}

/** Why components of dⁿ are merged, in words. */
function mergeReason(n: number, count: number): string {
  const jahnTeller = n === 1 || n === 9 || n === 4 || n === 6;
  if (jahnTeller && count === 2) {
    return (
      `a Jahn–Teller pair: the single spin-allowed band of ${n === 4 || n === 6 ? 'high-spin ' : ''}d${n} ` +
      `(${n === 1 || n === 6 ? 'to an E state' : 'from an E ground state'}) is split by a Jahn–Teller distortion, ` +
      'so 10Dq is taken from the centroid'
    );
  }
  return 'components of one transition (a spin–orbit multiplet, a low-symmetry splitting or a shoulder), taken at their centroid';
}

/** The intensity-weighted centroid of some bands (equal weights unless every one has ε). */
function centroid(members: readonly FitBand[]): FitBand {
  const weighted = members.every((b) => b.epsilon !== undefined && b.epsilon > 0);
  const w = members.map((b) => (weighted ? (b.epsilon ?? 1) : 1));
  const total = w.reduce((s, x) => s + x, 0);
  const energy = members.reduce((s, b, i) => s + (w[i] ?? 0) * b.energy, 0) / total;
  const withSigma = members.every((b) => b.sigma !== undefined);
  const sigma = withSigma
    ? Math.sqrt(members.reduce((s, b, i) => s + (w[i] ?? 0) * (b.sigma ?? 0) ** 2, 0) / total)
    : undefined;
  const epsilon = weighted ? Math.max(...members.map((b) => b.epsilon ?? 0)) : undefined;
  const widths = members.map((b) => b.width);
  const width = widths.every((x) => x !== undefined)
    ? Math.max(...members.map((b) => b.energy)) -
      Math.min(...members.map((b) => b.energy)) +
      Math.max(...(widths as number[]))
    : undefined;
  return {
    energy,
    ...(sigma !== undefined ? { sigma } : {}),
    ...(epsilon !== undefined ? { epsilon } : {}),
    ...(width !== undefined ? { width } : {}),
  };
}

/**
 * Merges the broad bands closer than `factor` band widths (each pair's mean width, given or
 * assumed) into one at their centroid; sets sharp bands aside (unless every band is sharp).
 * With `merge` false, only the sharp bands are set aside.
 */
export function mergeBands(bands: readonly FitBand[], n: number, merge: boolean): MergedBands {
  const allSharp = bands.every((b) => b.sharp);
  const isSharp = (b: FitBand) => Boolean(b.sharp) && !allSharp;
  const broad = bands.map((b, i) => ({ b, i })).filter(({ b }) => !isSharp(b));
  const sharp = bands.filter(isSharp);
  const assumed = n === 5 ? MERGE_DEFAULTS.forbiddenBandWidth : MERGE_DEFAULTS.bandWidth;
  const widthOf = (b: FitBand) => b.width ?? assumed;
  const sorted = [...broad].sort((a, c) => a.b.energy - c.b.energy);
  const groups: { b: FitBand; i: number }[][] = [];
  for (const item of sorted) {
    const group = groups.at(-1);
    const last = group?.at(-1);
    const close =
      merge &&
      last !== undefined &&
      item.b.energy - last.b.energy <= MERGE_DEFAULTS.factor * ((widthOf(item.b) + widthOf(last.b)) / 2);
    if (close && group) group.push(item);
    else groups.push([item]);
  }
  // Keep the input order: each group stands where its first member stood.
  groups.sort((a, c) => Math.min(...a.map((x) => x.i)) - Math.min(...c.map((x) => x.i)));
  const merges: BandMerge[] = [];
  const fitted = groups.map((group, k) => {
    if (group.length === 1) return group[0]?.b as FitBand;
    const members = [...group].sort((a, c) => a.i - c.i);
    const band = centroid(members.map((x) => x.b));
    merges.push({
      band: k,
      members: members.map((x) => x.i),
      energies: members.map((x) => x.b.energy),
      centroid: band.energy,
      reason: mergeReason(n, members.length),
    });
    return band;
  });
  return { bands: [...fitted, ...sharp], broad: fitted.length, merges };
}
