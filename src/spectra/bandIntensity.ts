/**
 * How intense absorption bands of transition-metal complexes usually are, by molar
 * absorptivity ε at the band maximum (L mol⁻¹ cm⁻¹), and how that depends on the geometry.
 *
 * Octahedral (centrosymmetric) complexes: spin-forbidden bands ε ≲ 1, spin-allowed d–d bands
 * (Laporte-forbidden, gaining intensity by vibronic coupling) ε ≈ 1–100, and up to a few hundred
 * where the centre of symmetry is lost. Tetrahedral complexes have no centre of symmetry, so d–p
 * mixing makes their d–d bands 10–100 times stronger: spin-allowed ε ≈ 50–1000 and more
 * (ν₃ of [CoCl₄]²⁻ ≈ 600, of [Co(NCS)₄]²⁻ ≈ 1800), spin-forbidden ones up to about 10.
 * Charge-transfer bands are fully allowed: ε ≈ 10³–10⁵, mostly ≥ 10⁴. Lever, Inorganic Electronic
 * Spectroscopy, 2nd ed., Elsevier 1984, ch. 4 and 6 (from memory). The limits below are a rule of
 * thumb drawn from these ranges (common practice, no source); real bands cross them.
 */

import type { Geometry } from '../core/geometry.js';

/** Below this ε a band is in the range of spin-forbidden bands (octahedral, or geometry unknown). */
export const SPIN_FORBIDDEN_EPSILON = 1;
/** Up to this ε, d–d bands of centrosymmetric complexes. */
export const CENTROSYMMETRIC_EPSILON = 100;
/** From this ε on, the range of charge-transfer (and fully allowed) bands (octahedral, or geometry unknown). */
export const CHARGE_TRANSFER_EPSILON = 1000;

/** Limits of the usual ε ranges in one geometry, L mol⁻¹ cm⁻¹. */
export interface IntensityLimits {
  /** Below: spin-forbidden. */
  readonly spinForbidden: number;
  /** From here on: charge transfer; d–d bands of this geometry stay below. */
  readonly chargeTransfer: number;
}

/**
 * The ε limits by geometry: tetrahedral d–d bands reach a few thousand (so charge transfer is
 * taken from 5000 on) and tetrahedral spin-forbidden bands reach about 10 (Lever 1984, from
 * memory; the cut-offs are common practice, no source).
 */
export const INTENSITY_LIMITS: Readonly<Record<Geometry, IntensityLimits>> = {
  oct: { spinForbidden: SPIN_FORBIDDEN_EPSILON, chargeTransfer: CHARGE_TRANSFER_EPSILON },
  tet: { spinForbidden: 10, chargeTransfer: 5000 },
};

/** The usual intensity range a band falls in. */
export type IntensityRange =
  | 'spin-forbidden'
  | 'centrosymmetric d–d'
  | 'non-centrosymmetric d–d'
  | 'charge transfer';

/**
 * The usual range that a band of maximum molar absorptivity `epsilon` falls in. With a
 * tetrahedral geometry every d–d band is non-centrosymmetric; without a geometry, the
 * octahedral limits hold and ε from 100 on counts as non-centrosymmetric.
 */
export function intensityRange(epsilon: number, geometry?: Geometry): IntensityRange {
  const limits = INTENSITY_LIMITS[geometry ?? 'oct'];
  if (epsilon < limits.spinForbidden) return 'spin-forbidden';
  if (epsilon >= limits.chargeTransfer) return 'charge transfer';
  if (geometry === 'tet' || epsilon >= CENTROSYMMETRIC_EPSILON) return 'non-centrosymmetric d–d';
  return 'centrosymmetric d–d';
}

/**
 * f per unit ∫ε dν̃ (L mol⁻¹ cm⁻²): f = 4.32 × 10⁻⁹ ∫ε dν̃ (Lever, Inorganic Electronic
 * Spectroscopy, 2nd ed., 1984; from memory).
 */
export const OSCILLATOR_STRENGTH_FACTOR = 4.32e-9;

/** Oscillator strength of a band from its integrated molar absorptivity ∫ε dν̃ (L mol⁻¹ cm⁻²). */
export function oscillatorStrength(integratedEpsilon: number): number {
  return OSCILLATOR_STRENGTH_FACTOR * integratedEpsilon;
}
