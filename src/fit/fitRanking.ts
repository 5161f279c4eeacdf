import type { FitSolution } from './fitTypes.js';
import { FIT_WARNING_LIMITS } from './fitWarnings.js';
import type { Refined } from './refinement.js';

/**
 * The ranking of refined solutions: duplicates dropped, those within the ambiguity factor of the
 * best kept, put in order of plausibility and residuals, and the best of every ground spin kept
 * in the list.
 */

/**
 * Two refinements that end at the same parameters with the same band energies are one solution
 * (also when they assign a band to either of two exactly degenerate levels, such as ⁴A₁g and
 * ⁴Eg(G) of d⁵).
 */
export function sameSolution(a: Refined, b: Refined): boolean {
  const close = (x: number, y: number) => Math.abs(x - y) <= 1e-6 * Math.max(Math.abs(x), Math.abs(y), 1);
  const sa = a.solution;
  const sb = b.solution;
  return (
    sa.ground === sb.ground &&
    close(sa.dq, sb.dq) &&
    close(sa.B, sb.B) &&
    close(sa.C, sb.C) &&
    sa.assignments.every((x, i) => close(x.calculated, sb.assignments[i]?.calculated ?? Number.NaN))
  );
}

/** Ranked solutions, and how many within the factor were left out by `maxSolutions`. */
export interface Ranking {
  readonly solutions: FitSolution[];
  readonly omitted: number;
}

/**
 * Ranks refined solutions. Kept are those within `ambiguityFactor` of the best weighted rms
 * (floored at 1, so fits within the band uncertainties tie) and, always, the best of every
 * ground spin (whether a d⁴–d⁷ sample is high- or low-spin is for the chemist to settle, not for
 * a cut-off). They are ordered by:
 * 1. plausible β first: a β outside (0.4, 1] is physically implausible for a complex, and such
 *    solutions follow every plausible one whatever their residuals;
 * 2. the ranking score ({@link scoreSolution}: residuals, β window, two-electron transitions,
 *    unobserved strong bands, intensity classes), lower first;
 * 3. fewer spin-forbidden assignments (within one ground spin: from a sextet ground every band
 *    is spin-forbidden), then the weighted rms.
 * The first `maxSolutions` are listed, plus the best of any ground spin not among them.
 */
export function rankSolutions(
  refined: readonly Refined[],
  ambiguityFactor: number,
  maxSolutions: number,
): Ranking {
  const floor = (r: Refined) => Math.max(r.solution.weightedRms, 1);
  const best = Math.min(...refined.map(floor));
  const sameSpin = (a: Refined, b: Refined) => a.solution.spin === b.solution.spin;
  const implausible = (r: Refined) => {
    const beta = r.solution.beta;
    return Number(beta !== null && (beta > 1 || beta < FIT_WARNING_LIMITS.lowBeta));
  };
  const order = (a: Refined, b: Refined) =>
    implausible(a) - implausible(b) ||
    a.solution.score.total - b.solution.score.total ||
    (sameSpin(a, b) ? a.spinForbidden - b.spinForbidden : 0) ||
    a.solution.weightedRms - b.solution.weightedRms;
  const sorted = [...refined].sort(order);
  const accepted = sorted.filter((r) => r.solution.weightedRms <= ambiguityFactor * best);
  const shown = accepted.slice(0, maxSolutions);
  for (const r of sorted) {
    if (!shown.some((x) => x.solution.spin === r.solution.spin)) shown.push(r);
  }
  shown.sort(order);
  return {
    solutions: shown.map((r, i) => ({ rank: i + 1, ...r.solution })),
    omitted: accepted.filter((r) => !shown.includes(r)).length,
  };
}
