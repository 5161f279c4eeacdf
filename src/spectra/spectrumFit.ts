/**
 * The ligand-field fit of bands found in a spectrum: which bands go in, and the fit itself.
 * Narrow bands (flagged `narrow`) are left out unless spin-forbidden transitions are searched
 * too: they are most often spin-forbidden, and a search over spin-allowed transitions only would
 * misassign them; if nothing but narrow bands is left, those are fitted.
 */

import { fitBands } from '../fit/fitBands.js';
import type { FitInput, FitResult } from '../fit/fitTypes.js';
import type { FoundBand } from './bandFinding.js';
import { bandObservations } from './bandObservations.js';

/** A fit of found bands and which bands it used. */
export interface FoundBandFit {
  readonly result: FitResult;
  /** Numbers of the bands fitted. */
  readonly used: readonly number[];
  /** Numbers of the narrow bands left out. */
  readonly leftOut: readonly number[];
}

/** Fit options for found bands: everything of {@link FitInput} but the bands themselves. */
export type FoundBandFitOptions = Omit<FitInput, 'bands'>;

/**
 * Fits Dq and B (and C with `fitC`) to ligand-field bands found in a spectrum, each at its
 * centre with the uncertainty of {@link bandObservations}.
 * @throws InputError when the fit cannot be made (too few bands for the parameters, say).
 */
export function fitFoundBands(ligandField: readonly FoundBand[], options: FoundBandFitOptions): FoundBandFit {
  const broad = options.includeSpinForbidden
    ? [...ligandField]
    : ligandField.filter((b) => !b.flags.includes('narrow'));
  const use = broad.length > 0 ? broad : [...ligandField];
  const observations = bandObservations(use, { includeChargeTransfer: true });
  const result = fitBands({
    ...options,
    bands: observations.map((o) => ({ energy: o.energy, sigma: o.sigma })),
  });
  return {
    result,
    used: use.map((b) => b.number),
    leftOut: ligandField.filter((b) => !use.includes(b)).map((b) => b.number),
  };
}
