import type { FieldParameters } from '../analysis/bandModel.js';
import { inverseNormalMatrix } from '../numeric/leastSquares.js';

/**
 * Standard errors of fitted ligand-field parameters from the Jacobian at the optimum (e.g.
 * Press et al., Numerical Recipes, 3rd ed., 2007, §15.4–15.5), and of the quantities derived
 * from them by linear propagation.
 */

/** Standard errors, cm⁻¹ (β, C/B and Δ/B dimensionless); null where none can be given. */
export interface FitErrors {
  readonly dq: number | null;
  readonly tenDq: number | null;
  readonly B: number | null;
  readonly C: number | null;
  readonly cOverB: number | null;
  readonly deltaOverB: number | null;
  readonly beta: number | null;
}

/** How the standard errors were obtained. */
export type ErrorBasis = 'band-uncertainties' | 'residual-scatter';

/** A free parameter of a band fit. */
export type ParameterName = 'dq' | 'B' | 'C';

/** What {@link standardErrors} needs. */
export interface ErrorInput {
  /** ∂rᵢ/∂pⱼ of the weighted residuals rᵢ = (calcᵢ − obsᵢ)/σᵢ at the optimum. */
  readonly jacobian: readonly (readonly number[])[];
  /** Σ rᵢ² at the optimum. */
  readonly chiSquare: number;
  /** The free parameters, in the Jacobian's column order (Dq first, then B, then C). */
  readonly parameters: readonly ParameterName[];
  /** Dq, B and C at the optimum. */
  readonly field: FieldParameters;
  /** Whether σᵢ are uncertainties given with the bands (else one common, arbitrary σ). */
  readonly uncertaintiesGiven: boolean;
  readonly freeIonB: number | null;
}

/** Errors, the covariance of the free parameters, and how they were obtained. */
export interface ErrorEstimate {
  readonly errors: FitErrors;
  readonly covariance: number[][] | null;
  readonly basis: ErrorBasis | null;
  readonly note: string;
}

/**
 * The covariance of the free parameters: with band uncertainties, (JᵀJ)⁻¹ of the weighted
 * Jacobian, not rescaled by the residuals (this works with as many bands as parameters);
 * without, (JᵀJ)⁻¹ times the residual variance χ²/(m − p), which needs m > p — otherwise there
 * is no estimate, and the note says so. σ(β) leaves out the uncertainty of the free-ion B.
 */
export function standardErrors(input: ErrorInput): ErrorEstimate {
  const { jacobian, chiSquare, parameters, field, uncertaintiesGiven, freeIonB } = input;
  const m = jacobian.length;
  const p = parameters.length;
  const dof = m - p;
  const inverse = inverseNormalMatrix(jacobian);
  const count = `${m} band${m === 1 ? '' : 's'} for ${p} free parameter${p === 1 ? '' : 's'}`;
  let covariance: number[][] | null = null;
  let basis: ErrorBasis | null = null;
  let note: string;
  if (!inverse) {
    note = `no error estimate: the assigned bands do not fix ${parameters.join(', ')} separately`;
  } else if (uncertaintiesGiven) {
    covariance = inverse;
    basis = 'band-uncertainties';
    note =
      'standard errors propagated from the given band uncertainties (not rescaled by the residuals)' +
      (dof > 0 ? `; χ²/dof = ${(chiSquare / dof).toFixed(2)}` : '');
  } else if (dof > 0) {
    const variance = chiSquare / dof;
    covariance = inverse.map((row) => row.map((x) => x * variance));
    basis = 'residual-scatter';
    note = `standard errors from the scatter of the residuals (${count}, ${dof} degree${dof === 1 ? '' : 's'} of freedom)`;
  } else {
    note =
      `no error estimate: with ${count} no degree of freedom is left (the fit is exact); ` +
      'give band uncertainties (e.g. 17400±200) or more bands';
  }
  const sd = (j: number) => {
    const v = covariance?.[j]?.[j];
    return v === undefined ? null : Math.sqrt(Math.max(0, v));
  };
  // σ² of a derived quantity with gradient g over (Dq, B, C): gᵀΣg.
  const propagate = (gradient: readonly number[]) =>
    covariance
      ? Math.sqrt(
          Math.max(
            0,
            gradient.reduce(
              (s, gi, i) => s + gradient.reduce((t, gj, j) => t + gi * gj * (covariance?.[i]?.[j] ?? 0), 0),
              0,
            ),
          ),
        )
      : null;
  const { dq, B, C } = field;
  const single = p === 1;
  const cFitted = p === 3;
  const sdDq = sd(0);
  const sdB = single ? null : sd(1);
  return {
    covariance,
    basis,
    note,
    errors: {
      dq: sdDq,
      tenDq: sdDq === null ? null : 10 * sdDq,
      B: sdB,
      C: cFitted ? sd(2) : null,
      cOverB: cFitted ? propagate([0, -C / B ** 2, 1 / B]) : null,
      deltaOverB: single ? null : propagate([10 / B, (-10 * dq) / B ** 2, 0]),
      beta: sdB === null || freeIonB === null ? null : sdB / freeIonB,
    },
  };
}
