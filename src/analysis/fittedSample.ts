/**
 * A sample placed by a band fit: its band maxima are fitted at a held C/B, and the best
 * solution's Dq and B (with standard errors and their correlation) stand in for given ones when
 * the sample is set against the spin crossover.
 */

import { InputError } from '../core/errors.js';
import type { Geometry } from '../core/geometry.js';
import type { FreeIon } from '../core/ions.js';
import { fitBands } from '../fit/fitBands.js';
import type { FitSolution } from '../fit/fitTypes.js';
import { fitCorrelation } from '../fit/fitVerdict.js';

/** What a band fit needs to place a sample. */
export interface FittedSampleInput {
  readonly n: number;
  readonly geometry: Geometry;
  /** Band maxima, cm⁻¹, each with its standard error where known. */
  readonly bands: readonly { readonly energy: number; readonly sigma?: number }[];
  readonly ion?: FreeIon;
  /** C/B held in the fit. */
  readonly cOverB: number;
}

/** The sample as the band fit places it. */
export interface FittedSample {
  readonly B: number;
  readonly C: number;
  /** Standard error of B, where the fit gives one. */
  readonly sigmaB?: number;
  /** Dq with its standard error, where the fit gives one. */
  readonly dq: { readonly value: number; readonly sigma?: number };
  /** Correlation of Dq and B in the fit. */
  readonly correlation?: number;
  /** The best solution. */
  readonly solution: FitSolution;
  /** Other assignments that fit nearly as well. */
  readonly alternatives: number;
}

/**
 * Fits the bands at the given C/B and returns the best solution's B, C and Dq with their errors.
 * @throws InputError when no assignment of the bands fits dⁿ.
 */
export function fittedSample(input: FittedSampleInput): FittedSample {
  const result = fitBands({
    n: input.n,
    geometry: input.geometry,
    bands: input.bands,
    ...(input.ion ? { freeIon: input.ion } : {}),
    cOverB: input.cOverB,
  });
  const best = result.solutions[0];
  if (!best) throw new InputError(`no assignment of these bands fits d${input.n}`);
  const correlation = fitCorrelation(best, 'dq', 'B');
  return {
    B: best.B,
    C: best.C,
    ...(best.errors.B !== null ? { sigmaB: best.errors.B } : {}),
    dq: { value: best.dq, ...(best.errors.dq !== null ? { sigma: best.errors.dq } : {}) },
    ...(correlation !== undefined ? { correlation } : {}),
    solution: best,
    alternatives: result.solutions.length - 1,
  };
}
