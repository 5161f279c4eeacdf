import {
  type CrossoverAnalysis,
  crossoverAnalysis,
  type SampleVerdict,
  sampleVerdict,
} from '../analysis/crossover.js';
import type { Geometry } from '../field/labels.js';
import type { FitSolution } from './fitTypes.js';

/**
 * The spin-state verdict of a fitted sample: the crossover analysed at the fit's own B and C,
 * and the sample placed with the fit's Dq, σ(Dq), σ(B) and their correlation from the
 * covariance, so that the margin's uncertainty carries the fit's.
 */
export interface FitSpinVerdict {
  readonly analysis: CrossoverAnalysis;
  readonly verdict: SampleVerdict;
  /** Correlation of Dq and B in the fit, when the fit has a covariance. */
  readonly correlation?: number;
}

/** Correlation coefficient of two fitted parameters, or undefined without a covariance. */
export function fitCorrelation(
  solution: FitSolution,
  a: 'dq' | 'B' | 'C',
  b: 'dq' | 'B' | 'C',
): number | undefined {
  const i = solution.parameters.indexOf(a);
  const j = solution.parameters.indexOf(b);
  const cov = solution.covariance;
  if (i < 0 || j < 0 || !cov) return undefined;
  const vi = cov[i]?.[i];
  const vj = cov[j]?.[j];
  const cij = cov[i]?.[j];
  if (vi === undefined || vj === undefined || cij === undefined || !(vi > 0) || !(vj > 0)) return undefined;
  return Math.max(-1, Math.min(1, cij / Math.sqrt(vi * vj)));
}

/** Places a fitted sample against the crossover of its dⁿ (see {@link FitSpinVerdict}). */
export function fitSpinVerdict(n: number, geometry: Geometry, solution: FitSolution): FitSpinVerdict {
  const analysis = crossoverAnalysis({ n, geometry, B: solution.B, C: solution.C });
  const correlation = fitCorrelation(solution, 'dq', 'B');
  const verdict = sampleVerdict(analysis, {
    dq: solution.dq,
    ...(solution.errors.dq !== null ? { sigmaDq: solution.errors.dq } : {}),
    ...(solution.errors.B !== null ? { sigmaB: solution.errors.B } : {}),
    ...(correlation !== undefined ? { correlation } : {}),
  });
  return { analysis, verdict, ...(correlation !== undefined ? { correlation } : {}) };
}
