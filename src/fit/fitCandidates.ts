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

/** A checked fit input with the bands as fitted (after merging) and the choice of C settled. */
export interface FitPlan extends Omit<FitSetup, 'fitC'> {
  readonly fitC: boolean;
  /** Whether C is fitted because the bands can fix it (not because the caller asked). */
  readonly cAuto: boolean;
}

/** The C/B values scanned: with C free, the usual range too, so that an assignment needing another C/B gets a start near its optimum. */
export function scannedRatios(plan: FitPlan): number[] {
  return plan.fitC ? [...new Set([plan.cOverB, ...FIT_DEFAULTS.cOverBScan])] : [plan.cOverB];
}

/** The ground-state spin S of a candidate. */
function spinOf(c: AssignmentCandidate): number {
  return (Number(parseStateLabel(c.groundLabel)?.multiplicity ?? 1) - 1) / 2;
}

/** The ground-state spins the ion can have along the scan, and which of them are hypotheses of this fit. */
function groundSpins(plan: FitPlan, input: FitInput): { all: number[]; tried: number[] } {
  const all = [...new Set(plan.scan.points.map((pt) => pt.ground.S))].sort((a, b) => b - a);
  const high = all[0] ?? 0;
  const low = all.at(-1) ?? 0;
  if (input.spinState === 'high') return { all, tried: [high] };
  if (input.spinState === 'low') return { all, tried: [low] };
  // Tetrahedral complexes of the 3d ions are high-spin: Δt ≈ 4/9 Δo stays far below the
  // pairing energy (common practice, no source), so the low-spin states are no hypothesis.
  return { all, tried: plan.geometry === 'tet' ? [high] : all };
}

/** The candidates of each ground-spin hypothesis, with all of them together. */
export interface CandidateSet {
  readonly search: AssignmentSearch;
  readonly hypotheses: readonly HypothesisPlan[];
}

/** One ground-spin hypothesis before refinement. */
export interface HypothesisPlan {
  readonly spin: number;
  readonly kind: 'high' | 'low' | 'only';
  readonly transitions: 'spin-allowed' | 'spin-forbidden' | 'both';
  readonly candidates: number;
  /** The ground-state label met on the scan for this spin. */
  readonly ground: string;
}

/** The refusal when no assignment of the bands exists: which limit the bands run into. */
function noCandidateError(
  plan: FitPlan,
  input: FitInput,
  spins: readonly number[],
  all: readonly number[],
): InputError {
  const { n, geometry, scan } = plan;
  const m = plan.bands.length;
  const where = `d${n} (${geometry === 'oct' ? 'octahedral' : 'tetrahedral'})`;
  const points = scan.points.filter((pt) => spins.includes(pt.ground.S));
  const most = Math.max(...scan.points.map((pt) => pt.excited.length));
  const mostAllowed = Math.max(...points.map((pt) => pt.excited.filter((l) => l.spinAllowed).length));
  const band = `${m} band${m === 1 ? '' : 's'}`;
  if (m > most) {
    return new InputError(
      `${band}: ${where} has only ${most} excited level${most === 1 ? '' : 's'}` +
        (input.merge === false
          ? ': if some are components of one split band, let them be merged (without --keep-bands or keep_bands)'
          : ''),
    );
  }
  if (input.spinState !== undefined && all.length > 1) {
    const g = points[0]?.ground.label ?? '';
    return new InputError(
      `${band}: cannot belong to ${input.spinState}-spin ${where} (ground state ${g}), which has ${mostAllowed} ` +
        `spin-allowed transition${mostAllowed === 1 ? '' : 's'}; give fewer bands, or leave the spin state open`,
    );
  }
  return new InputError(
    input.includeSpinForbidden || m <= mostAllowed
      ? `${band} cannot be assigned to the transitions of ${where} with the assignments given`
      : `${band}: ${where} has at most ${mostAllowed} spin-allowed transition${mostAllowed === 1 ? '' : 's'} ` +
          'from any ground state; include spin-forbidden transitions to assign more bands',
  );
}

/**
 * The candidates of every ground-spin hypothesis: for each spin the ion can have (restricted by
 * `spinState`), the assignments to spin-allowed transitions from that ground state, or, where
 * there are none (high-spin d⁵), to its ΔS = 1 transitions. `progress` is called before each scan.
 * @throws InputError when no hypothesis has an assignment of the bands.
 */
export function findCandidates(
  plan: FitPlan,
  input: FitInput,
  progress: (done: number) => void,
): CandidateSet {
  const { n, geometry, cOverB, scan, bands, sigmas, fixed, fixedB } = plan;
  const ratios = scannedRatios(plan);
  const includeSpinForbidden = input.includeSpinForbidden ?? FIT_DEFAULTS.includeSpinForbidden;
  const searchBands = bands.map((b, i) => ({ energy: b.energy, weight: 1 / (sigmas[i] ?? 1) ** 2 }));
  const searchAt = (withForbidden: boolean, groundSpin?: number) =>
    mergeSearches(
      ratios.map((ratio, i) => {
        progress(i);
        return searchAssignments(
          ratio === cOverB ? scan : ratioScan(n, geometry, ratio, input.scan),
          searchBands,
          {
            fixed,
            includeSpinForbidden: withForbidden,
            ...(fixedB !== undefined ? { fixedScale: fixedB } : {}),
            ...(groundSpin !== undefined ? { groundSpin } : {}),
            ...(input.extraCandidates !== undefined ? { extraCandidates: input.extraCandidates } : {}),
          },
        );
      }),
    );
  const { all, tried } = groundSpins(plan, input);
  const first = searchAt(includeSpinForbidden);
  const candidates: AssignmentCandidate[] = first.candidates.filter((c) => tried.includes(spinOf(c)));
  const hypotheses: HypothesisPlan[] = [];
  let groundsWithout = first.groundsWithout;
  for (const spin of tried) {
    let own = candidates.filter((c) => spinOf(c) === spin).length;
    let transitions: HypothesisPlan['transitions'] = includeSpinForbidden ? 'both' : 'spin-allowed';
    const hasAllowed = scan.points.some(
      (pt) => pt.ground.S === spin && pt.excited.some((l) => l.spinAllowed),
    );
    if (own === 0 && !includeSpinForbidden && !hasAllowed) {
      // No spin-allowed transitions at all (high-spin d⁵): the ΔS = 1 bands are what can be seen.
      const forbidden = searchAt(true, spin);
      candidates.push(...forbidden.candidates);
      own = forbidden.candidates.length;
      transitions = 'spin-forbidden';
      const label = scan.points.find((pt) => pt.ground.S === spin)?.ground.label;
      if (own > 0) groundsWithout = groundsWithout.filter((g) => g !== label);
    }
    const ground = scan.points.find((pt) => pt.ground.S === spin)?.ground.label ?? '';
    const kind = all.length === 1 ? 'only' : spin === all[0] ? 'high' : 'low';
    hypotheses.push({ spin, kind, transitions, candidates: own, ground });
  }
  candidates.sort((a, b) => a.chiSquare - b.chiSquare);
  if (candidates.length === 0) throw noCandidateError(plan, input, tried, all);
  // Grounds of spins not tried are not worth a warning.
  const triedLabels = new Set(
    scan.points.filter((pt) => tried.includes(pt.ground.S)).map((pt) => pt.ground.label),
  );
  return {
    search: {
      candidates,
      tried: first.tried,
      groundsWithout: groundsWithout.filter((g) => triedLabels.has(g)),
    },
    hypotheses,
  };
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
