import { halfIntegerText } from '../atom/terms.js';
import { InputError } from '../core/errors.js';
import type { AssignmentCandidate } from './assignment.js';
import { type MergedBands, mergeBands } from './bandMerging.js';
import {
  type CandidateSet,
  chooseForRefinement,
  type FitPlan,
  findCandidates,
  scannedRatios,
} from './fitCandidates.js';
import { checkFitInput, type FitSetup } from './fitChecks.js';
import { rankSolutions, sameSolution } from './fitRanking.js';
import {
  FIT_DEFAULTS,
  type FitInput,
  type FitResult,
  type FitSolution,
  type SpinHypothesis,
} from './fitTypes.js';
import { resultWarnings } from './fitWarnings.js';
import { singleTerm } from './ratioScan.js';
import { type RefineContext, type Refined, refine } from './refinement.js';

/**
 * Fitting Dq, Racah B (and C) to observed band maxima, in named steps: the input checks, the
 * merging of band components, the candidate assignments of each ground-spin hypothesis from the
 * Δ/B scan, their refinement by Levenberg–Marquardt on the exact solver, and the ranking of the
 * solutions by a documented score, with warnings where the result can mislead.
 */

/** d-electron counts whose spin-allowed (or ΔS = 1) bands can depend on C, so that C is fitted from three bands. */
const C_SENSITIVE = new Set([4, 5, 6]);

/** The plan of the fit: the bands after merging, and whether C is fitted. */
function planOf(setup: FitSetup, merged: MergedBands): FitPlan {
  const bands = merged.bands.slice(0, merged.broad);
  const cAuto = setup.fitC === undefined && bands.length >= 3 && C_SENSITIVE.has(setup.n);
  return {
    ...setup,
    bands,
    sigmas: bands.map((b) => b.sigma ?? setup.bandPrecision),
    fitC: setup.fitC ?? cAuto,
    cAuto,
  };
}

/**
 * With C free, every candidate is first refined with C held at its own starting C/B (cheap: the
 * Jacobian then needs no extra solver call), and only this many of the best, plus the best of
 * each ground spin, are refined again with C free from there.
 */
const FREE_C_REFINEMENTS = 3;

/** Refines the candidates, dropping duplicates; `step` is called before each. */
function refineAll(
  ctx: RefineContext,
  candidates: readonly AssignmentCandidate[],
  step: (i: number) => void,
): Refined[] {
  const refined: Refined[] = [];
  for (const [i, c] of candidates.entries()) {
    step(i);
    const r = refine(ctx, c);
    if (r && !refined.some((s) => sameSolution(s, r))) refined.push(r);
  }
  return refined;
}

/**
 * Refinement with C free in two stages (see {@link FREE_C_REFINEMENTS}); the second stage starts
 * each chosen assignment at its first-stage optimum.
 */
function refineWithFreeC(
  ctx: RefineContext,
  candidates: readonly AssignmentCandidate[],
  step: (i: number) => void,
): Refined[] {
  const held = candidates.flatMap((c, i) => {
    step(i);
    const r = refine({ ...ctx, fitC: false, cOverB: c.start.C / c.start.B }, c);
    return r ? [r] : [];
  });
  held.sort((a, b) => a.solution.score.total - b.solution.score.total);
  const chosen = held.filter(
    (r, i) => i < FREE_C_REFINEMENTS || held.findIndex((x) => x.solution.spin === r.solution.spin) === i,
  );
  const { start: _given, ...free } = ctx;
  return refineAll(
    free,
    chosen.map((r) => ({
      ...r.candidate,
      start: { dq: r.solution.dq, B: r.solution.B, C: r.solution.C },
    })),
    () => undefined,
  );
}

/** The element symbol of an ion name such as `Fe2+`, or null. */
function elementOf(ion: string | undefined): string | null {
  return ion?.match(/^[A-Z][a-z]?/)?.[0] ?? null;
}

/** Each hypothesis with its best solution's rank, or why it has none. */
function hypothesisOutcomes(
  plan: FitPlan,
  candidates: CandidateSet,
  solutions: readonly FitSolution[],
): SpinHypothesis[] {
  const m = plan.bands.length;
  return candidates.hypotheses.map((h) => {
    const best = solutions.find((s) => s.spin === h.spin);
    const spin = `${h.kind === 'only' ? '' : `${h.kind}-spin `}S = ${halfIntegerText(h.spin)} (${h.ground})`;
    const note = best
      ? null
      : h.candidates === 0
        ? `no ${spin} solution: ${m} band${m === 1 ? '' : 's'} cannot all be ${h.transitions === 'spin-forbidden' ? '' : 'spin-allowed '}transitions from ${h.ground}`
        : `no ${spin} solution: no assignment of the band${m === 1 ? '' : 's'} from ${h.ground} gives a usable fit ` +
          `(${m === 1 ? 'one band cannot fix both Dq and B for it' : 'some parameter is not fixed by the bands or runs to a bound'})`;
    return {
      spin: h.spin,
      kind: h.kind,
      ground: h.ground,
      transitions: h.transitions,
      bestRank: best?.rank ?? null,
      note,
    };
  });
}

/** The refusal when no assignment refines to a usable fit. */
function noSolutionError(plan: FitPlan): InputError {
  const m = plan.bands.length;
  const where = `d${plan.n} (${plan.geometry === 'oct' ? 'octahedral' : 'tetrahedral'})`;
  return new InputError(
    m === 1 && plan.names.length > 1
      ? `1 band: no transition of ${where} offered to it lies at a multiple of Dq whatever B is, so one band cannot fix ` +
          'Dq and B: give a second band, or hold B at a known value (--B)'
      : `no assignment tried gives a usable fit of ${plan.names.join(' and ')}: in each, some parameter is not fixed by ` +
          'the assigned bands, runs to a bound, or the fit leaves the ground state it assumed',
  );
}

/**
 * Fits Dq and B (and C where the bands fix it, or when asked) to observed band maxima of dⁿ in
 * a cubic field.
 *
 * Band components closer than about a band width are first merged at their centroid
 * ({@link mergeBands}; not when assignments are given, or with `merge: false`), and sharp bands
 * set aside. Then, for every ground spin the ion can have (or the one asked for), every
 * assignment of the bands (in energy order) to the transitions that can be seen from that
 * ground state — spin-allowed ones, or the ΔS = 1 ones where there are none (high-spin d⁵) — is
 * tried on a coarse Δ/B scan; the promising ones are refined by Levenberg–Marquardt with the
 * parameters bounded, sharp bands are matched to the levels, and the solutions are ranked by
 * {@link rankSolutions}. The best solution of every ground spin is always listed.
 *
 * Standard errors: from the given band uncertainties when they are given (exact propagation,
 * also with as many bands as parameters); otherwise from the residual variance Σr²/(m − p),
 * which needs more bands than parameters — with exactly as many, there is no error estimate
 * (null, with a note), never a zero.
 *
 * @throws InputError for bad input: no bands, non-positive energies, uncertainties, ε or
 * widths, an uncertainty on some bands only, more assignments than bands, an unknown or repeated
 * label, too few bands for C, bands that no transition of dⁿ can explain, or bands that cannot
 * belong to the spin state asked for.
 */
export function fitBands(input: FitInput): FitResult {
  const setup = checkFitInput(input);
  const { n, geometry } = setup;
  const assigned = setup.fixed.some((k) => k !== null);
  const merge = (input.merge ?? FIT_DEFAULTS.merge) && !assigned;
  const merged = assigned
    ? { bands: setup.bands, broad: setup.bands.length, merges: [] }
    : mergeBands(setup.bands, n, merge);
  const plan = planOf(setup, merged);
  const ratios = scannedRatios(plan).length;
  let scans = 0;
  const progress = (done: number, total: number) => input.onProgress?.(done, total);
  const candidates = findCandidates(plan, input, () => progress(scans++, 2 * ratios + plan.maxRefined));
  const toRefine = chooseForRefinement(plan, input, candidates.search.candidates);
  const ctx: RefineContext = {
    n,
    geometry,
    bands: plan.bands,
    sigmas: plan.sigmas,
    given: plan.given,
    cOverB: plan.cOverB,
    fitC: plan.fitC,
    cAuto: plan.cAuto,
    scan: plan.scan,
    freeB: plan.freeB,
    sharp: merged.bands.slice(merged.broad),
    element: elementOf(input.freeIon?.ion),
    ...(plan.fixedB !== undefined ? { fixedB: plan.fixedB } : {}),
    ...(input.start ? { start: input.start } : {}),
    ...(input.leastSquares ? { leastSquares: input.leastSquares } : {}),
  };
  const step = (i: number) => progress(scans + i, scans + toRefine.length);
  // Two stages only from the scan's starts: a given start is refined as it is.
  const refined =
    ctx.fitC && !input.start && !singleTerm(n)
      ? refineWithFreeC(ctx, toRefine, step)
      : refineAll(ctx, toRefine, step);
  progress(scans + toRefine.length, scans + toRefine.length);
  if (refined.length === 0) throw noSolutionError(plan);
  const { solutions, omitted } = rankSolutions(refined, plan.ambiguityFactor, plan.maxSolutions);
  const hypotheses = hypothesisOutcomes(plan, candidates, solutions);
  const spins = plan.scan.points.map((pt) => pt.ground.S);
  return {
    n,
    geometry,
    cOverB: plan.cOverB,
    cOverBSource: plan.cOverBSource,
    freeIon: plan.freeB === null ? null : { B: plan.freeB, source: input.freeIon?.source ?? null },
    fitC: plan.fitC,
    cChoice: setup.fitC !== undefined ? 'given' : plan.cAuto ? 'bands-determine-it' : 'held',
    bands: merged.bands,
    merges: merged.merges,
    hypotheses,
    weighting: plan.given ? 'given' : 'equal',
    solutions,
    omitted,
    tried: candidates.search.tried,
    refined: toRefine.length,
    warnings: resultWarnings({
      n,
      geometry,
      bands: plan.bands.length,
      solutions: solutions.length,
      ambiguityFactor: plan.ambiguityFactor,
      includeSpinForbidden: input.includeSpinForbidden ?? FIT_DEFAULTS.includeSpinForbidden,
      groundsWithout: candidates.search.groundsWithout,
      merges: merged.merges,
      merge,
      bestSpin: solutions[0]?.spin ?? 0,
      highestSpin: Math.max(...spins),
      cAuto: plan.cAuto,
      hypotheses,
    }),
  };
}
