import { InputError } from '../core/errors.js';
import { parseStateLabel } from '../field/labels.js';
import {
  ASSIGNMENT_DEFAULTS,
  type AssignmentCandidate,
  type AssignmentSearch,
  searchAssignments,
} from './assignment.js';
import type { FitSetup } from './fitChecks.js';
import { FIT_DEFAULTS, type FitInput } from './fitTypes.js';
import { ratioScan } from './ratioScan.js';

/**
 * The candidates of a band fit: the assignments of the bands to transitions found on the Δ/B
 * scan (at every C/B scanned), restricted to the ground spin asked for, and the few of them
 * chosen for refinement.
 */

/** The candidates of several searches (one per C/B), keeping the best starts of each assignment. */
function mergeSearches(searches: readonly AssignmentSearch[]): AssignmentSearch {
  const all = searches.flatMap((s) => s.candidates).sort((a, b) => a.chiSquare - b.chiSquare);
  const starts = new Map<string, number>();
  const candidates = all.filter((c) => {
    const id = `${c.groundKey}|${c.keys.join()}`;
    const count = starts.get(id) ?? 0;
    starts.set(id, count + 1);
    return count < ASSIGNMENT_DEFAULTS.startsPerAssignment;
  });
  const without = searches.map((s) => new Set(s.groundsWithout));
  return {
    candidates,
    tried: starts.size,
    groundsWithout: [...(without[0] ?? [])].filter((g) => without.every((w) => w.has(g))),
  };
}

/** The C/B values scanned: with C free, the usual range too, so that an assignment needing another C/B gets a start near its optimum. */
export function scannedRatios(setup: FitSetup): number[] {
  return setup.fitC ? [...new Set([setup.cOverB, ...FIT_DEFAULTS.cOverBScan])] : [setup.cOverB];
}

/** The ground-state spin S of a candidate. */
function spinOf(c: AssignmentCandidate): number {
  return (Number(parseStateLabel(c.groundLabel)?.multiplicity ?? 1) - 1) / 2;
}

/** The refusal when no assignment of the bands exists: which limit the bands run into. */
function noCandidateError(setup: FitSetup, input: FitInput): InputError {
  const { n, geometry, scan } = setup;
  const m = setup.bands.length;
  const most = Math.max(...scan.points.map((pt) => pt.excited.length));
  const mostAllowed = Math.max(...scan.points.map((pt) => pt.excited.filter((l) => l.spinAllowed).length));
  const where = `d${n} (${geometry === 'oct' ? 'octahedral' : 'tetrahedral'})`;
  return new InputError(
    m > most
      ? `${m} bands: ${where} has only ${most} excited level${most === 1 ? '' : 's'}`
      : input.includeSpinForbidden || m <= mostAllowed
        ? `${m} bands cannot be assigned to the transitions of ${where} with the assignments given`
        : `${m} bands: ${where} has at most ${mostAllowed} spin-allowed transition${mostAllowed === 1 ? '' : 's'} ` +
          'from any ground state; include spin-forbidden transitions to assign more bands',
  );
}

/**
 * Every assignment of the bands found on the scans, restricted to the ground spin asked for.
 * `progress` is called before each scan with its index.
 * @throws InputError when no assignment exists.
 */
export function findCandidates(
  setup: FitSetup,
  input: FitInput,
  progress: (done: number) => void,
): AssignmentSearch {
  const { n, geometry, cOverB, scan, bands, sigmas, fixed, fixedB } = setup;
  const ratios = scannedRatios(setup);
  let search = mergeSearches(
    ratios.map((ratio, i) => {
      progress(i);
      return searchAssignments(
        ratio === cOverB ? scan : ratioScan(n, geometry, ratio, input.scan),
        bands.map((b, i) => ({ energy: b.energy, weight: 1 / (sigmas[i] ?? 1) ** 2 })),
        {
          fixed,
          includeSpinForbidden: input.includeSpinForbidden ?? FIT_DEFAULTS.includeSpinForbidden,
          ...(fixedB !== undefined ? { fixedScale: fixedB } : {}),
          ...(input.extraCandidates !== undefined ? { extraCandidates: input.extraCandidates } : {}),
        },
      );
    }),
  );
  if (input.spinState !== undefined && search.candidates.length > 0) {
    const spins = search.candidates.map(spinOf);
    const wanted = input.spinState === 'high' ? Math.max(...spins) : Math.min(...spins);
    search = { ...search, candidates: search.candidates.filter((c) => spinOf(c) === wanted) };
  }
  if (search.candidates.length === 0) throw noCandidateError(setup, input);
  return search;
}

/**
 * The candidates worth refining: those whose scan fit is within the refine factor of the best
 * of their ground state, at most `maxRefined` of them, with each ground state keeping its best
 * few. From a given start, each assignment is refined once.
 */
export function chooseForRefinement(
  setup: FitSetup,
  input: FitInput,
  candidates: readonly AssignmentCandidate[],
): AssignmentCandidate[] {
  const m = setup.bands.length;
  const { maxRefined } = setup;
  const scanRms = (c: AssignmentCandidate) => Math.sqrt(c.chiSquare / m);
  // The scan's best fit is judged per ground state: a high-spin assignment must not be cut
  // because a low-spin one scans better (or the other way round).
  const bestScan = new Map<string, number>();
  for (const c of candidates) {
    bestScan.set(c.groundKey, Math.min(bestScan.get(c.groundKey) ?? Number.POSITIVE_INFINITY, scanRms(c)));
  }
  const seenAssignments = new Set<string>();
  const eligible = candidates
    .filter((c) => scanRms(c) <= FIT_DEFAULTS.refineFactor * Math.max(bestScan.get(c.groundKey) ?? 0, 1))
    .filter((c) => {
      if (!input.start) return true;
      const id = `${c.groundKey}|${c.keys.join()}`;
      if (seenAssignments.has(id)) return false;
      seenAssignments.add(id);
      return true;
    });
  // The scan ranks candidates of different ground states on one scale, but its minima are only
  // starting points: a high-spin assignment that scans worse than many low-spin ones may still
  // refine best. So each ground state keeps its own best few, then the rest fill the quota.
  const perGround = Math.max(1, Math.floor(maxRefined / 4));
  const kept = new Set<AssignmentCandidate>();
  const byGround = new Map<string, number>();
  for (const c of eligible) {
    const k = byGround.get(c.groundKey) ?? 0;
    if (k < perGround) {
      kept.add(c);
      byGround.set(c.groundKey, k + 1);
    }
  }
  for (const c of eligible) if (kept.size < Math.max(maxRefined, kept.size) && !kept.has(c)) kept.add(c);
  return eligible.filter((c) => kept.has(c)).slice(0, Math.max(maxRefined, byGround.size * perGround));
}
