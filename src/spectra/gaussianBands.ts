/**
 * Gaussian absorption bands on a wavenumber axis. A d–d band is broadened by the spread of
 * vibrational displacements between ground and excited state; in the harmonic, linear-coupling
 * picture its envelope is Gaussian in energy (not in wavelength), centred on the vertical
 * (Franck–Condon) transition energy (Henderson & Imbusch, Optical Spectroscopy of Inorganic
 * Solids, 1989, ch. 5). Energies in cm⁻¹; heights in whatever the spectrum's y is.
 */

import { normalRandom } from '../numeric/seededRandom.js';

/** One Gaussian band: `height` at the maximum `center`, full width at half maximum `fwhm`. */
export interface GaussianBand {
  readonly center: number;
  readonly height: number;
  readonly fwhm: number;
}

/** A straight baseline y = offset + slope · (ν̃ − reference). */
export interface LinearBaseline {
  readonly offset: number;
  /** Per cm⁻¹. */
  readonly slope: number;
  /** The wavenumber where the baseline equals `offset`, cm⁻¹. */
  readonly reference: number;
}

/** 4 ln 2: a Gaussian exp(−4 ln 2 · (x − c)² / w²) has FWHM w. */
export const FOUR_LN2 = 4 * Math.LN2;

/** Area of a Gaussian per unit height and FWHM: √(π / (4 ln 2)) ≈ 1.0645. */
export const GAUSSIAN_AREA_FACTOR = Math.sqrt(Math.PI / FOUR_LN2);

/** Value of a band at wavenumber `x`. */
export function gaussianValue(band: GaussianBand, x: number): number {
  const u = (x - band.center) / band.fwhm;
  return band.height * Math.exp(-FOUR_LN2 * u * u);
}

/** Integrated intensity ∫ y dν̃ of a band, in (y unit)·cm⁻¹: height × FWHM × √(π / 4 ln 2). */
export function gaussianArea(band: GaussianBand): number {
  return band.height * band.fwhm * GAUSSIAN_AREA_FACTOR;
}

/** Value of a baseline at wavenumber `x`. */
export function baselineValue(baseline: LinearBaseline, x: number): number {
  return baseline.offset + baseline.slope * (x - baseline.reference);
}

/** The sum of `bands` (and `baseline`, if given) at every wavenumber of `x`. */
export function bandSum(
  bands: readonly GaussianBand[],
  x: ArrayLike<number>,
  baseline?: LinearBaseline,
): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const xi = x[i] as number;
    let y = baseline ? baselineValue(baseline, xi) : 0;
    for (const b of bands) y += gaussianValue(b, xi);
    out[i] = y;
  }
  return out;
}

/** Options of {@link syntheticSpectrum}. */
export interface SyntheticOptions {
  /** Baseline added under the bands. @default none */
  readonly baseline?: LinearBaseline;
  /** Standard deviation of the Gaussian noise added to every point, in y units. @default 0 */
  readonly noise?: number;
  /** Seed of the noise. @default 1 */
  readonly seed?: number;
}

/** Default noise seed of {@link syntheticSpectrum}. */
export const DEFAULT_SYNTHETIC_SEED = 1;

/**
 * A synthetic absorption spectrum on the wavenumbers `x`: Gaussian bands, an optional straight
 * baseline and seeded Gaussian noise, for demo data and recovery tests.
 */
export function syntheticSpectrum(
  bands: readonly GaussianBand[],
  x: ArrayLike<number>,
  options: SyntheticOptions = {},
): Float64Array {
  const y = bandSum(bands, x, options.baseline);
  const noise = options.noise ?? 0;
  if (noise > 0) {
    const normal = normalRandom(options.seed ?? DEFAULT_SYNTHETIC_SEED);
    for (let i = 0; i < y.length; i++) y[i] = (y[i] as number) + noise * normal();
  }
  return y;
}
