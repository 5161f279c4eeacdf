/**
 * How intense absorption bands of transition-metal complexes usually are, by molar
 * absorptivity ε at the band maximum (L mol⁻¹ cm⁻¹): spin-forbidden bands ε ≪ 1, Laporte-
 * forbidden d–d bands of centrosymmetric complexes ε ≈ 1–100, d–d bands without a centre of
 * symmetry (tetrahedral) ε ≈ 100–1000, charge-transfer bands ε ≥ 10³. These ranges are a rule of
 * thumb (common practice, no source); real bands cross them.
 */

/** Below this ε a band is in the range of spin-forbidden bands. */
export const SPIN_FORBIDDEN_EPSILON = 1;
/** Up to this ε, d–d bands of centrosymmetric complexes. */
export const CENTROSYMMETRIC_EPSILON = 100;
/** From this ε on, the range of charge-transfer (and fully allowed) bands. */
export const CHARGE_TRANSFER_EPSILON = 1000;

/** The usual intensity range a band falls in. */
export type IntensityRange =
  | 'spin-forbidden'
  | 'centrosymmetric d–d'
  | 'non-centrosymmetric d–d'
  | 'charge transfer';

/** The usual range that a band of maximum molar absorptivity `epsilon` falls in. */
export function intensityRange(epsilon: number): IntensityRange {
  if (epsilon < SPIN_FORBIDDEN_EPSILON) return 'spin-forbidden';
  if (epsilon < CENTROSYMMETRIC_EPSILON) return 'centrosymmetric d–d';
  if (epsilon < CHARGE_TRANSFER_EPSILON) return 'non-centrosymmetric d–d';
  return 'charge transfer';
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
