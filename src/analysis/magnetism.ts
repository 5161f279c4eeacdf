/**
 * Spin-only magnetic moments of cubic states, and where the real moment departs from them.
 *
 * μ_so = g√(S(S+1)) μ_B with g = 2, i.e. √(4S(S+1)) = √(n(n+2)) for n unpaired electrons
 * (Figgis, Introduction to Ligand Fields, 1966, ch. 10; any inorganic text).
 */

import { ensure } from '../core/errors.js';
import type { CubicIrrep } from '../field/symmetry.js';

/** The g value of the spin-only formula (the free-electron 2.0023, rounded as the formula has it). */
export const SPIN_ONLY_G = 2;

/** Spin-only moment μ_so = √(4S(S+1)) in Bohr magnetons. @throws InputError unless 2S is a whole number ≥ 0. */
export function spinOnlyMoment(S: number): number {
  ensure(Number.isInteger(2 * S) && S >= 0, `spin S = ${S}: expected 0, 1/2, 1, 3/2, …`);
  return SPIN_ONLY_G * Math.sqrt(S * (S + 1));
}

/**
 * How the orbital angular momentum of a ground term enters its moment: `none` (S = 0, or an A₁
 * term with no orbital moment to mix in), `second-order` (A₂ and E terms: small shifts by
 * spin–orbit mixing with an excited T₂ term) or `first-order` (T terms: unquenched orbital
 * moment, real moments differ from spin-only and vary with temperature).
 */
export type OrbitalContribution = 'none' | 'second-order' | 'first-order';

/** The spin-only moment of a state with what to expect of the real one. */
export interface MomentEstimate {
  /** State label, e.g. `5T2g`. */
  readonly state: string;
  readonly S: number;
  /** μ_so in μ_B. */
  readonly spinOnly: number;
  readonly orbital: OrbitalContribution;
  /** One sentence for a report. */
  readonly note: string;
}

/** α of μ_eff = μ_so(1 − αλ/10Dq) for orbital singlet and doublet ground terms (Figgis 1966, from memory). */
const SECOND_ORDER_ALPHA: Partial<Record<CubicIrrep, number>> = { A2: 4, E: 2 };

/**
 * The spin-only moment of a cubic state of dⁿ, with a note on the orbital contribution of its
 * term. The sign of the second-order shift follows λ = ±ζ/2S: positive below half filling
 * (n < 5: moment below spin-only), negative above it (n > 5: above spin-only).
 */
export function momentEstimate(
  state: {
    readonly label: string;
    readonly S: number;
    readonly cubicIrrep: CubicIrrep;
  },
  n: number,
): MomentEstimate {
  const spinOnly = spinOnlyMoment(state.S);
  const base = { state: state.label, S: state.S, spinOnly };
  if (state.S === 0) {
    return {
      ...base,
      orbital: 'none',
      note: 'diamagnetic (S = 0); at most a small temperature-independent paramagnetism remains',
    };
  }
  const irrep = state.cubicIrrep;
  if (irrep === 'T1' || irrep === 'T2') {
    return {
      ...base,
      orbital: 'first-order',
      note:
        'orbitally degenerate (T) ground term: its orbital moment is not quenched, so the real moment departs from ' +
        'spin-only and varies with temperature and distortion (Figgis & Lewis, Prog. Inorg. Chem. 6, 37, 1964)',
    };
  }
  const alpha = SECOND_ORDER_ALPHA[irrep];
  if (alpha !== undefined) {
    return {
      ...base,
      orbital: 'second-order',
      note:
        `orbital ${irrep === 'E' ? 'doublet (E)' : 'singlet (A₂)'}: no first-order orbital moment; spin–orbit mixing ` +
        `with an excited T₂ term shifts it slightly, μ ≈ μ_so(1 − ${alpha}λ/10Dq) (Figgis 1966, from memory): ` +
        (n < 5
          ? `for d${n}, a less than half-filled shell, λ > 0 and the moment lies a little below spin-only`
          : `for d${n}, a more than half-filled shell, λ < 0 and the moment lies a little above spin-only`),
    };
  }
  return {
    ...base,
    orbital: 'none',
    note: 'orbital singlet (A₁): no orbital moment to speak of; the moment is close to spin-only',
  };
}
