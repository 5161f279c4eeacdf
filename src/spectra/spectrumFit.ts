/**
 * The ligand-field fit of bands found in a spectrum: each band goes in with its class (position
 * and uncertainty, width, ε, sharpness; bandClasses.ts), the fit merges components closer than
 * a band width at their centroid and sets sharp bands aside to match them to predicted levels
 * afterwards; here the fit's bands are traced back to the numbers of the found bands.
 */

import { fitBands } from '../fit/fitBands.js';
import type { FitBand, FitInput, FitResult } from '../fit/fitTypes.js';
import type { AbsorptionQuantity } from './absorptionSpectrum.js';
import { fitBandsOf } from './bandClasses.js';
import type { FoundBand } from './bandFinding.js';

/** A fit of found bands and which bands it used. */
export interface FoundBandFit {
  readonly result: FitResult;
  /** Numbers of the bands fitted (those merged into one included). */
  readonly used: readonly number[];
  /** Numbers of the narrow (sharp) bands left out of the fit and matched to levels after it. */
  readonly leftOut: readonly number[];
  /** For each band of `result.bands`, the numbers of the found bands it stands for. */
  readonly members: readonly (readonly number[])[];
}

/** Fit options for found bands: everything of {@link FitInput} but the bands, and the y quantity. */
export type FoundBandFitOptions = Omit<FitInput, 'bands'> & { readonly quantity: AbsorptionQuantity };

/**
 * Fits Dq and B (and C where the bands fix it, or with `fitC`) to ligand-field bands found in
 * a spectrum.
 * @throws InputError when the fit cannot be made (too few bands for the parameters, say).
 */
export function fitFoundBands(ligandField: readonly FoundBand[], options: FoundBandFitOptions): FoundBandFit {
  const { quantity, ...fit } = options;
  const bands = fitBandsOf(ligandField, quantity, {
    n: fit.n,
    geometry: fit.geometry ?? 'oct',
    ...(fit.spinState !== undefined ? { spinState: fit.spinState } : {}),
    includeSpinForbidden: fit.includeSpinForbidden === true,
  });
  const result = fitBands({ ...fit, bands });
  const members = resultMembers(bands, result).map((m) => m.map((i) => (ligandField[i] as FoundBand).number));
  const sharp = new Set(bands.flatMap((b, i) => (b.sharp ? [(ligandField[i] as FoundBand).number] : [])));
  const leftOut = members.flat().filter((k) => sharp.has(k) && bands.some((b) => !b.sharp));
  return {
    result,
    used: ligandField.map((b) => b.number).filter((k) => !leftOut.includes(k)),
    leftOut,
    members,
  };
}

/**
 * Which input bands each band of the result stands for. The fit lists its bands as the input
 * bands in order, each merged group at its first member's place and its other members dropped,
 * sharp bands set aside at the end (all of them kept in place when every band is sharp).
 */
function resultMembers(input: readonly FitBand[], result: FitResult): number[][] {
  const allSharp = input.every((b) => b.sharp);
  const aside = input.flatMap((b, i) => (b.sharp && !allSharp ? [i] : []));
  const groups = new Map<number, readonly number[]>();
  const dropped = new Set<number>();
  for (const m of result.merges) {
    const first = Math.min(...m.members);
    groups.set(first, m.members);
    for (const i of m.members) if (i !== first) dropped.add(i);
  }
  const broad = input
    .map((_, i) => i)
    .filter((i) => !aside.includes(i) && !dropped.has(i))
    .map((i) => [...(groups.get(i) ?? [i])]);
  const members = [...broad, ...aside.map((i) => [i])];
  if (members.length !== result.bands.length) {
    throw new Error(`fit returned ${result.bands.length} bands for ${members.length} traced`);
  }
  return members;
}
