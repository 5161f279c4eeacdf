/**
 * Magnetic susceptibility χ(T) and effective moment μ_eff(T) of dⁿ in a cubic field with
 * spin–orbit coupling, from every computed state: the Zeeman operator μ_z = −μ_B(k·L_z + g·S_z)
 * in the eigenbasis and the second derivative of the free energy in the field,
 *   χ = N Σ_{i,j} |⟨i|μ_z|j⟩|² (w_i − w_j)/(E_j − E_i),   with w_i/kT where E_i = E_j,
 * which is Van Vleck's formula (Van Vleck, The Theory of Electric and Magnetic Susceptibilities,
 * 1932, ch. 7) written so that near-degenerate pairs pass smoothly into the first-order term.
 * A cubic ion is magnetically isotropic, so χ_zz is χ; μ_eff = √(3kTχ/Nμ_B²).
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { type CubicInput, checkCubicInput } from '../field/cubic.js';
import { checkZeta } from '../field/spinOrbit.js';
import { spinOrbitStates } from '../field/spinOrbitSolver.js';
import { congruence } from '../numeric/eigen.js';

/** Boltzmann's constant in cm⁻¹ K⁻¹ (CODATA 2018, k/hc). */
export const BOLTZMANN_CM = 0.6950348;

/** N_Aμ_B²/3k in cm³ K mol⁻¹ (CODATA 2018 values, cgs-emu): χ_mol·T = CURIE_CONSTANT · μ_eff². */
export const CURIE_CONSTANT = 0.1250494;

/** The spin g factor of the Zeeman term unless given: 2, as in the spin-only formula and Kotani's theory (the free electron has 2.0023). */
export const DEFAULT_SPIN_G = 2;

/** The orbital reduction factor k unless given: 1, the ionic limit. */
export const DEFAULT_ORBITAL_REDUCTION = 1;

/** Lowest and highest temperature accepted, K. */
export const MIN_TEMPERATURE = 0.1;
export const MAX_TEMPERATURE = 10000;

/** Input of {@link susceptibility}. Energies in cm⁻¹, temperatures in K. */
export interface SusceptibilityInput extends CubicInput {
  /** Spin–orbit ζ (reduce it yourself for covalency: ζ = k′ζ_free-ion). */
  readonly zeta: number;
  /** Orbital reduction factor k on L in the Zeeman term, 0…1. @default DEFAULT_ORBITAL_REDUCTION (1) */
  readonly k?: number;
  /** Spin g factor. @default DEFAULT_SPIN_G (2) */
  readonly g?: number;
  /** Temperatures, K, each MIN_TEMPERATURE…MAX_TEMPERATURE. */
  readonly temperatures: readonly number[];
}

/** The magnetism at one temperature. */
export interface MomentPoint {
  /** K. */
  readonly T: number;
  /** Molar susceptibility, cm³ mol⁻¹ (cgs-emu; ×4π·10⁻⁶ for m³ mol⁻¹). */
  readonly chi: number;
  /** χT, cm³ K mol⁻¹. */
  readonly chiT: number;
  /** μ_eff in Bohr magnetons. */
  readonly muEff: number;
}

/** One block's levels (relative to the ground) and squared Zeeman elements. */
interface ZeemanBlock {
  readonly weight: number;
  readonly energies: Float64Array;
  /** |⟨i|k·L_z + g·S_z|j⟩|², row-major. */
  readonly squared: Float64Array;
}

/**
 * χ, χT and μ_eff of dⁿ at each temperature, from all states of the full Hamiltonian (repulsion,
 * cubic field, spin–orbit coupling) with the Zeeman term along a fourfold axis.
 * @throws InputError for bad n, Dq, B, C, ζ, k, g or temperature.
 */
export function susceptibility(input: SusceptibilityInput): MomentPoint[] {
  const { n, geometry = DEFAULT_GEOMETRY, dq, B, C, zeta, temperatures } = input;
  const k = input.k ?? DEFAULT_ORBITAL_REDUCTION;
  const g = input.g ?? DEFAULT_SPIN_G;
  checkCubicInput(input);
  checkZeta(zeta);
  ensure(Number.isFinite(k) && k >= 0 && k <= 1, `orbital reduction k = ${k}: expected a number from 0 to 1`);
  ensure(Number.isFinite(g) && g >= 1.5 && g <= 2.5, `spin g = ${g}: expected a number from 1.5 to 2.5`);
  for (const T of temperatures) {
    ensure(
      Number.isFinite(T) && T >= MIN_TEMPERATURE && T <= MAX_TEMPERATURE,
      `temperature ${T} K: expected ${MIN_TEMPERATURE} to ${MAX_TEMPERATURE} K`,
    );
  }
  const blocks = zeemanBlocks(n, geometry === 'oct' ? dq : -dq, B, C, zeta, k, g);
  return temperatures.map((T) => momentAt(blocks, T));
}

function zeemanBlocks(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
  k: number,
  g: number,
): ZeemanBlock[] {
  const { blocks, eigs } = spinOrbitStates(n, dqOct, B, C, zeta);
  let zero = Number.POSITIVE_INFINITY;
  for (const e of eigs) zero = Math.min(zero, e.values[0] ?? zero);
  return blocks.map((b, bi) => {
    const eig = eigs[bi];
    if (!eig) throw new Error('missing block eigenvectors');
    const m = eig.size;
    const zeeman = new Float64Array(m * m);
    for (let i = 0; i < m; i++) zeeman[i * m + i] = k * (b.ML[i] as number) + g * (b.MS[i] as number);
    const inEigenbasis = congruence(eig.vectors, zeeman, m);
    return {
      weight: b.weight,
      energies: Float64Array.from(eig.values, (v) => v - zero),
      squared: inEigenbasis.map((x) => x * x),
    };
  });
}

/** (1 − e^{−x})/x for x ≥ 0, 1 at 0, without cancellation. */
function relaxation(x: number): number {
  return x < 1e-12 ? 1 : -Math.expm1(-x) / x;
}

function momentAt(blocks: readonly ZeemanBlock[], T: number): MomentPoint {
  const beta = 1 / (BOLTZMANN_CM * T);
  let partition = 0;
  let sum = 0;
  for (const { weight, energies, squared } of blocks) {
    const m = energies.length;
    const boltzmann = Float64Array.from(energies, (e) => Math.exp(-beta * e));
    for (let i = 0; i < m; i++) {
      partition += weight * (boltzmann[i] as number);
      sum += weight * (squared[i * m + i] as number) * (boltzmann[i] as number) * beta;
      for (let j = i + 1; j < m; j++) {
        const ei = energies[i] as number;
        const ej = energies[j] as number;
        const low = ei <= ej ? i : j;
        // Each unordered pair counts twice: (i, j) and (j, i) give the same term.
        sum +=
          2 *
          weight *
          (squared[i * m + j] as number) *
          (boltzmann[low] as number) *
          beta *
          relaxation(beta * Math.abs(ej - ei));
      }
    }
  }
  // χ_zz per ion in μ_B²/cm⁻¹; μ_eff² = 3kT·χ_zz.
  const muSquared = (3 * (sum / partition)) / beta;
  const chiT = CURIE_CONSTANT * muSquared;
  return { T, chi: chiT / T, chiT, muEff: Math.sqrt(muSquared) };
}
