/**
 * The class of each band found in a spectrum, as the ligand-field fit takes it: its position
 * with an uncertainty, its width, its ε (when the spectrum is in ε) and whether it is sharp.
 *
 * Sharp bands are narrow bands of transitions within one strong-field configuration (²Eg of
 * Cr(III), ¹Eg of Ni(II)): their energy barely depends on Dq, so the fit does not use them to fix
 * Dq and B but matches them to the predicted spin-forbidden levels afterwards. Not every narrow
 * component is such a band:
 * - narrow components that overlap one another into a broad envelope are the parts of one split
 *   transition (the spin–orbit triplet of ν₃ of tetrahedral Co(II)); they are passed as ordinary
 *   bands, and the fit merges them at their centroid;
 * - a narrow band as intense as spin-allowed bands of its geometry is not spin-forbidden;
 * - for d⁵ the high-spin ground state (⁶A₁) has no spin-allowed band at all: every band is a
 *   ΔS = 1 band, and the narrow ones (⁴A₁g/⁴Eg(G), ⁴Eg(D)) are the field-independent bands that
 *   fix B and C, so they are fitted, unless the ion is said to be low-spin.
 */

import type { Geometry } from '../core/geometry.js';
import type { FitBand } from '../fit/fitTypes.js';
import type { AbsorptionQuantity } from './absorptionSpectrum.js';
import { type FoundBand, NARROW_BAND_FWHM } from './bandFinding.js';
import { INTENSITY_LIMITS } from './bandIntensity.js';
import { positionSigma } from './bandObservations.js';

/**
 * A narrow band counts as sharp (spin-forbidden) only with ε below this many times the
 * spin-forbidden limit of its geometry (common practice, no source).
 */
export const SHARP_EPSILON_FACTOR = 5;

/** What the classes depend on. */
export interface BandClassOptions {
  readonly n: number;
  readonly geometry: Geometry;
  /** The ground-state spin, when it is known. */
  readonly spinState?: 'high' | 'low';
  /** Whether the fit may assign bands to spin-forbidden transitions: then no band is set aside as sharp. */
  readonly includeSpinForbidden: boolean;
}

/**
 * Narrow bands that belong to a broad envelope: neighbours (by centre) that overlap, that is lie
 * closer than their mean FWHM, are chained, and a chain of two or more whose envelope (span of
 * centres plus the largest FWHM) is at least {@link NARROW_BAND_FWHM} wide is one split band.
 */
export function multipletComponents(bands: readonly FoundBand[]): Set<FoundBand> {
  const narrow = bands.filter((b) => b.flags.includes('narrow')).sort((a, b) => a.center - b.center);
  const chains: FoundBand[][] = [];
  for (const b of narrow) {
    const chain = chains.at(-1);
    const last = chain?.at(-1);
    if (chain && last && b.center - last.center <= (b.fwhm + last.fwhm) / 2) chain.push(b);
    else chains.push([b]);
  }
  const out = new Set<FoundBand>();
  for (const chain of chains) {
    const first = chain[0] as FoundBand;
    const last = chain.at(-1) as FoundBand;
    const envelope = last.center - first.center + Math.max(...chain.map((b) => b.fwhm));
    if (chain.length > 1 && envelope >= NARROW_BAND_FWHM) for (const b of chain) out.add(b);
  }
  return out;
}

/** Whether narrow bands of this ion are set aside as sharp at all (see the module comment on d⁵). */
function setsSharpAside(options: BandClassOptions): boolean {
  return !options.includeSpinForbidden && !(options.n === 5 && options.spinState !== 'low');
}

/** The sharp bands among `bands` (see the module comment). */
export function sharpBands(
  bands: readonly FoundBand[],
  quantity: AbsorptionQuantity,
  options: BandClassOptions,
): Set<FoundBand> {
  if (!setsSharpAside(options)) return new Set();
  const parts = multipletComponents(bands);
  const ceiling = SHARP_EPSILON_FACTOR * INTENSITY_LIMITS[options.geometry].spinForbidden;
  return new Set(
    bands.filter(
      (b) => b.flags.includes('narrow') && !parts.has(b) && (quantity !== 'epsilon' || b.height < ceiling),
    ),
  );
}

/**
 * The fit's bands: each found band at its centre with the uncertainty of
 * {@link positionSigma}, its FWHM as width, its height as ε when the spectrum is in ε, and
 * the sharp ones marked.
 */
export function fitBandsOf(
  bands: readonly FoundBand[],
  quantity: AbsorptionQuantity,
  options: BandClassOptions,
): FitBand[] {
  const sharp = sharpBands(bands, quantity, options);
  return bands.map((b) => ({
    energy: b.center,
    sigma: positionSigma(b),
    width: b.fwhm,
    ...(quantity === 'epsilon' && b.height > 0 ? { epsilon: b.height } : {}),
    ...(sharp.has(b) ? { sharp: true } : {}),
  }));
}
