/**
 * From bands found in a spectrum to the observations a ligand-field fit takes: the energy of
 * each d–d band with a standard uncertainty.
 */

import type { FoundBand } from './bandFinding.js';

/** One observed transition energy and its standard uncertainty, cm⁻¹. */
export interface BandObservation {
  readonly energy: number;
  readonly sigma: number;
}

/**
 * The part of a band's FWHM taken as the uncertainty of its position as a transition energy,
 * besides the fit's own: a Gaussian centre is the vertical transition only as far as the band
 * really is one symmetric Gaussian, and overlap, asymmetry and unresolved structure move it by
 * a fraction of the width (common practice, no source).
 */
export const POSITION_WIDTH_FRACTION = 0.05;

/** Options of {@link ligandFieldBands} and {@link bandObservations}. */
export interface ObservationOptions {
  /** Keep bands flagged as charge transfer (intense or high in energy). @default false */
  readonly includeChargeTransfer?: boolean;
  /** Part of the FWHM added (in quadrature) to the fit's uncertainty. @default {@link POSITION_WIDTH_FRACTION} */
  readonly widthFraction?: number;
}

/**
 * The bands a ligand-field fit should use: those whose maximum lies inside the window (an edge
 * band's maximum was not measured), without the charge-transfer-like ones unless asked.
 */
export function ligandFieldBands(bands: readonly FoundBand[], options: ObservationOptions = {}): FoundBand[] {
  return bands.filter(
    (b) =>
      !b.flags.includes('blue-edge') &&
      !b.flags.includes('red-edge') &&
      (options.includeChargeTransfer === true || !b.chargeTransfer),
  );
}

/**
 * The fit input from found bands: energy = the Gaussian centre, σ = √(σ_fit² + (f · FWHM)²)
 * with f = `widthFraction`; a fit uncertainty that could not be determined counts as zero,
 * leaving the width term.
 */
export function bandObservations(
  bands: readonly FoundBand[],
  options: ObservationOptions = {},
): BandObservation[] {
  const f = options.widthFraction ?? POSITION_WIDTH_FRACTION;
  return ligandFieldBands(bands, options).map((b) => ({ energy: b.center, sigma: positionSigma(b, f) }));
}

/** σ of a band's position as a transition energy: √(σ_fit² + (f · FWHM)²), an undetermined σ_fit counting as zero. */
export function positionSigma(band: FoundBand, widthFraction = POSITION_WIDTH_FRACTION): number {
  return Math.hypot(Number.isFinite(band.centerSigma) ? band.centerSigma : 0, widthFraction * band.fwhm);
}
