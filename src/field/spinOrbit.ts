/**
 * The one-electron spin–orbit operator ζ Σᵢ lᵢ·sᵢ of a d shell as second-quantised terms over
 * the 10 spin-orbitals, and the checks on ζ. With l·s = l_z s_z + ½(l₊s₋ + l₋s₊) and
 * Condon–Shortley phases every matrix element is real (Condon & Shortley, The Theory of Atomic
 * Spectra, 1935, §5.4), so the whole Hamiltonian stays a real symmetric matrix.
 */
import { spinOrbital } from '../atom/microstates.js';
import type { OneBodyTerm } from '../atom/operators.js';
import { ensure } from '../core/errors.js';

const D = 2;

/**
 * Largest ζ accepted, cm⁻¹: the heaviest 5d ions have ζ of about 5000 cm⁻¹ (common practice, no
 * source), so four times that is already no d ion.
 */
export const MAX_ZETA = 20000;

/**
 * Refuses a ζ that is not a finite number from 0 to {@link MAX_ZETA} cm⁻¹.
 * @throws InputError naming the value.
 */
export function checkZeta(zeta: number): void {
  ensure(
    Number.isFinite(zeta) && zeta >= 0 && zeta <= MAX_ZETA,
    `spin–orbit ζ = ${zeta}: expected a number of cm⁻¹ from 0 to ${MAX_ZETA}`,
  );
}

/** Σ l·s per unit ζ as one-electron terms a†_to a_from (the matrix is real and symmetric). */
export function spinOrbitTerms(): OneBodyTerm[] {
  const terms: OneBodyTerm[] = [];
  for (let m = -D; m <= D; m++) {
    // l_z s_z: m_l·m_s on each spin-orbital.
    terms.push({ to: spinOrbital(D, m, true), from: spinOrbital(D, m, true), value: m / 2 });
    terms.push({ to: spinOrbital(D, m, false), from: spinOrbital(D, m, false), value: -m / 2 });
    if (m < D) {
      // ½ l₊s₋ takes (m, α) to (m+1, β); ½ l₋s₊ is its adjoint.
      const value = Math.sqrt(D * (D + 1) - m * (m + 1)) / 2;
      const up = spinOrbital(D, m, true);
      const down = spinOrbital(D, m + 1, false);
      terms.push({ to: down, from: up, value });
      terms.push({ to: up, from: down, value });
    }
  }
  return terms;
}
