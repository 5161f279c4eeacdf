import { InputError } from '../core/errors.js';
import { chooseForRefinement, findCandidates, scannedRatios } from './fitCandidates.js';
import { checkFitInput } from './fitChecks.js';
import { rankSolutions, sameSolution } from './fitRanking.js';
import { FIT_DEFAULTS, type FitInput, type FitResult } from './fitTypes.js';
import { resultWarnings } from './fitWarnings.js';
import { type Refined, refine } from './refinement.js';

/**
 * Fitting Dq, Racah B (and C) to observed band maxima, in named steps: the input checks, the
 * candidate assignments from the Δ/B scan, their refinement by Levenberg–Marquardt on the exact
 * solver, and the ranking of the solutions, with warnings where the result can mislead.
 */

/**
 * Fits Dq and B (C held at C/B, or fitted too) to observed band maxima of dⁿ in a cubic field.
 *
 * Without assignments, every assignment of the bands (in energy order) to transitions from the
 * ground state (in energy order) is tried on a coarse Δ/B scan; the promising ones are refined by
 * Levenberg–Marquardt and ranked by weighted rms residual. Solutions within `ambiguityFactor`
 * of the best (or within the band uncertainties) are all returned: ranked first by
 * max(weighted rms, 1), then β ≤ 1 before β > 1, fewer spin-forbidden assignments, lower
 * transitions, and the weighted rms itself.
 *
 * Standard errors: from the given band uncertainties when they are given (exact propagation,
 * also with as many bands as parameters); otherwise from the residual variance Σr²/(m − p),
 * which needs more bands than parameters — with exactly as many, there is no error estimate
 * (null, with a note), never a zero.
 *
 * @throws InputError for bad input: no bands, non-positive energies or uncertainties, an
 * uncertainty on some bands only, more assignments than bands, an unknown or repeated label,
 * fewer bands than free parameters, or bands that no transition of dⁿ can explain.
 */
export function fitBands(input: FitInput): FitResult {
  const setup = checkFitInput(input);
  const { n, geometry, bands } = setup;
  const steps = scannedRatios(setup).length;
  const progress = (done: number, total: number) => input.onProgress?.(done, total);
  const search = findCandidates(setup, input, (i) => progress(i, steps + setup.maxRefined));
  const toRefine = chooseForRefinement(setup, input, search.candidates);
  const ctx = {
    n,
    geometry,
    bands,
    sigmas: setup.sigmas,
    given: setup.given,
    cOverB: setup.cOverB,
    fitC: setup.fitC,
    scan: setup.scan,
    freeB: setup.freeB,
    ...(setup.fixedB !== undefined ? { fixedB: setup.fixedB } : {}),
    ...(input.start ? { start: input.start } : {}),
    ...(input.leastSquares ? { leastSquares: input.leastSquares } : {}),
  };
  const refined: Refined[] = [];
  for (const [i, c] of toRefine.entries()) {
    progress(steps + i, steps + toRefine.length);
    const r = refine(ctx, c);
    if (r && !refined.some((s) => sameSolution(s, r))) refined.push(r);
  }
  progress(steps + toRefine.length, steps + toRefine.length);
  if (refined.length === 0) {
    throw new InputError(
      `no assignment tried gives a usable fit of ${setup.names.join(' and ')}: in each, some parameter is not fixed by ` +
        'the assigned bands, runs to zero, or the fit leaves the ground state it assumed',
    );
  }
  const { solutions, omitted } = rankSolutions(refined, setup.ambiguityFactor, setup.maxSolutions);
  return {
    n,
    geometry,
    cOverB: setup.cOverB,
    cOverBSource: setup.cOverBSource,
    freeIon: setup.freeB === null ? null : { B: setup.freeB, source: input.freeIon?.source ?? null },
    fitC: setup.fitC,
    bands,
    weighting: setup.given ? 'given' : 'equal',
    solutions,
    omitted,
    tried: search.tried,
    refined: toRefine.length,
    warnings: resultWarnings({
      n,
      bands: bands.length,
      solutions: solutions.length,
      ambiguityFactor: setup.ambiguityFactor,
      includeSpinForbidden: input.includeSpinForbidden ?? FIT_DEFAULTS.includeSpinForbidden,
      groundsWithout: search.groundsWithout,
    }),
  };
}
