/**
 * The one-electron picture of high and low spin, as chemists use it beside the full
 * calculation: electrons in the t₂g/e_g (Td: e/t₂) sets, the ligand-field stabilisation energy
 * (LFSE), the spin pairs the low-spin arrangement adds, and the mean spin-pairing energy Π.
 *
 * Conventions (Figgis & Hitchman, Ligand Field Theory and its Applications, 2000, ch. 3; any
 * inorganic text; the barycentre rule fixes the numbers):
 * - octahedral: t₂g at −4Dq, e_g at +6Dq (10Dq = Δo);
 * - tetrahedral: e at −6Dq_t, t₂ at +4Dq_t (10Dq_t = Δt, given as a positive number).
 * The LFSE counts only the orbital energies. Pairing is counted as the pairs a state has beyond
 * those of the high-spin arrangement, so the high-spin state carries no Π term and, e.g.,
 * octahedral d⁶ low spin is −24Dq + 2Π (the form of most tables; some texts add the pairs the
 * free ion already has to both states, which leaves every difference unchanged).
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { configurationText, type Geometry } from '../field/labels.js';

/** Orbital energies per unit Dq: the lower and upper set of each geometry. */
export const ORBITAL_ENERGY_DQ = {
  oct: { t2: -4, e: 6 },
  tet: { t2: 4, e: -6 },
} as const;

/** Orbitals in each set. */
const T2_ORBITALS = 3;
const E_ORBITALS = 2;

/** One spin arrangement of dⁿ in the one-electron picture. */
export interface OneElectronState {
  /** `high-spin` (Hund's rule over all five orbitals) or `low-spin` (the lower set filled first). */
  readonly spin: 'high-spin' | 'low-spin';
  /** Electrons in t₂ (t₂g). */
  readonly t2: number;
  /** Electrons in e (e_g). */
  readonly e: number;
  /** Plain text, e.g. `t2g^4 eg^2` (Oh) or `e^3 t2^3` (Td). */
  readonly configuration: string;
  /** Unpaired electrons. */
  readonly unpaired: number;
  /** Total spin, unpaired / 2. */
  readonly S: number;
  /** Electron pairs in the d shell. */
  readonly pairs: number;
  /** LFSE as a multiple of Dq (negative is stabilised), e.g. −24 for octahedral d⁶ low spin. */
  readonly lfseDq: number;
  /** Pairs beyond those of the high-spin arrangement: the multiple of Π in the LFSE table. */
  readonly extraPairs: number;
}

/** The spin arrangements of dⁿ in one geometry. */
export interface OneElectronStates {
  readonly n: number;
  readonly geometry: Geometry;
  readonly highSpin: OneElectronState;
  /** Absent where the lower set takes all electrons without pairing beyond Hund's rule (no choice of spin). */
  readonly lowSpin?: OneElectronState;
}

function unpairedIn(electrons: number, orbitals: number): number {
  return electrons <= orbitals ? electrons : 2 * orbitals - electrons;
}

/** An arrangement; `highSpinPairs` is the pair count of the high-spin one (its own, for high spin). */
function arrangement(
  spin: OneElectronState['spin'],
  t2: number,
  e: number,
  geometry: Geometry,
  highSpinPairs?: number,
): OneElectronState {
  const unpaired = unpairedIn(t2, T2_ORBITALS) + unpairedIn(e, E_ORBITALS);
  const pairs = (t2 + e - unpaired) / 2;
  const w = ORBITAL_ENERGY_DQ[geometry];
  return {
    spin,
    t2,
    e,
    configuration: configurationText(t2, e, geometry),
    unpaired,
    S: unpaired / 2,
    pairs,
    lfseDq: w.t2 * t2 + w.e * e,
    extraPairs: pairs - (highSpinPairs ?? pairs),
  };
}

/**
 * High- and low-spin arrangements of dⁿ with their LFSE and extra pairs: octahedral d⁴–d⁷ and
 * tetrahedral d³–d⁶ have both; every other case has one.
 * @throws InputError for n outside 1…9 or an unknown geometry.
 */
export function oneElectronStates(n: number, geometry: Geometry = DEFAULT_GEOMETRY): OneElectronStates {
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  const lowerOrbitals = geometry === 'oct' ? T2_ORBITALS : E_ORBITALS;
  // High spin: one electron in each of the five orbitals first, then pairing from the lower set.
  const hsLower = n <= 5 ? Math.min(n, lowerOrbitals) : Math.min(lowerOrbitals + (n - 5), 2 * lowerOrbitals);
  // Low spin: the lower set filled completely first.
  const lsLower = Math.min(n, 2 * lowerOrbitals);
  const split = (lower: number) =>
    geometry === 'oct' ? { t2: lower, e: n - lower } : { t2: n - lower, e: lower };
  const hs = split(hsLower);
  const highSpin = arrangement('high-spin', hs.t2, hs.e, geometry);
  if (lsLower === hsLower) return { n, geometry, highSpin };
  const ls = split(lsLower);
  return { n, geometry, highSpin, lowSpin: arrangement('low-spin', ls.t2, ls.e, geometry, highSpin.pairs) };
}

/**
 * Mean spin-pairing energy Π of octahedral dⁿ (n = 4…7) in terms of Racah B and C: the
 * electron-repulsion energy of the lowest low-spin strong-field state minus that of the lowest
 * high-spin one, per extra pair — d⁴ 6B + 5C, d⁵ 7.5B + 5C, d⁶ 2.5B + 4C, d⁷ 4B + 4C (Griffith,
 * The Theory of Transition-Metal Ions, 1961; reproduced in inorganic texts such as Huheey,
 * Inorganic Chemistry; from memory). These are the strong-field limit of the full model without
 * configuration interaction (test/lfse.test.ts checks this limit with the solver). A
 * tetrahedral dⁿ is the octahedral d¹⁰⁻ⁿ with the field reversed (hole equivalence), so it takes
 * that formula.
 */
const PAIRING_COEFFICIENTS: Readonly<Record<number, { readonly B: number; readonly C: number }>> = {
  4: { B: 6, C: 5 },
  5: { B: 7.5, C: 5 },
  6: { B: 2.5, C: 4 },
  7: { B: 4, C: 4 },
};

/** Π as a multiple of B and C for dⁿ in a geometry (see {@link pairingEnergy}), or undefined without a spin choice. */
export function pairingCoefficients(
  n: number,
  geometry: Geometry = DEFAULT_GEOMETRY,
): { readonly B: number; readonly C: number } | undefined {
  return PAIRING_COEFFICIENTS[geometry === 'oct' ? n : 10 - n];
}

/**
 * The classroom estimate of the mean spin-pairing energy Π, cm⁻¹, from Racah B and C (Griffith
 * 1961; see {@link pairingCoefficients}); undefined for dⁿ with no choice of spin.
 * @throws InputError for n outside 1…9, an unknown geometry or a negative B or C.
 */
export function pairingEnergy(n: number, geometry: Geometry, B: number, C: number): number | undefined {
  ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  oneElectronStates(n, geometry);
  const k = pairingCoefficients(n, geometry);
  return k ? k.B * B + k.C * C : undefined;
}

/**
 * The mean pairing energy Π at which the one-electron picture puts its crossover at `dq`:
 * LFSE(HS)·Dq = LFSE(LS)·Dq + p·Π, so Π = (LFSE_HS − LFSE_LS)·Dq / p. For every dⁿ with a spin
 * choice this is 10Dq, i.e. Δc = Π by definition: at the full model's crossover Dq it is the Π
 * that the full model implies. Undefined without a spin choice.
 */
export function impliedPairingEnergy(states: OneElectronStates, dq: number): number | undefined {
  const { highSpin, lowSpin } = states;
  if (!lowSpin) return undefined;
  return ((highSpin.lfseDq - lowSpin.lfseDq) * dq) / lowSpin.extraPairs;
}
