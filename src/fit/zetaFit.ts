/**
 * ζ from a band fit: the best spin–orbit-free solution refined with spin–orbit coupling, ζ held
 * or fitted. To fit ζ, the components of a band merged by the fit (a resolved spin–orbit
 * multiplet such as the ν₃ triplet of tetrahedral Co(II), or the ³T₁g(F)/¹Eg pair of Ni(II)) are
 * put back and each assigned to one double-group level of their cubic level, in energy order: of
 * the levels carrying at least {@link COMPONENT_WEIGHT} of that level, the choice closest to the
 * observed components (redone at the fitted values until it holds). Only such
 * splittings fix ζ — band centroids hardly move with it (first moments of a multiplet do not
 * shift to first order, common practice, no source) — so without them ζ is held and the result
 * says why.
 */
import { ensure } from '../core/errors.js';
import { MAX_ZETA } from '../field/spinOrbit.js';
import { type SpinOrbitResult, solveSpinOrbit } from '../field/spinOrbitSolver.js';
import type { FitResult, FitSolution } from './fitTypes.js';
import { type AssignedBand, refineWithSpinOrbit, type SpinOrbitRefinement } from './spinOrbitRefinement.js';

/** Smallest weight of a cubic level for a double-group level to count among its components. */
export const COMPONENT_WEIGHT = 0.2;

/** Relative standard error of ζ above which it is called poorly determined (common practice, no source). */
export const ZETA_RELATIVE_ERROR = 0.3;

/** Times the assignment of components is redone at the fitted values, if it changed there. */
const REASSIGNMENTS = 3;

/** Options of {@link refineFitWithZeta}. */
export interface ZetaFitOptions {
  /** ζ, cm⁻¹: the value held, or the starting value when {@link fitZeta}. */
  readonly zeta: number;
  /** Fit ζ where resolved components determine it. @default false */
  readonly fitZeta?: boolean;
  /** The free ion's ζ, for ζ/ζ(free ion) and the warning above it. @default none */
  readonly freeIonZeta?: number;
  /**
   * The spin–orbit level of each resolved component, lowest component first across all merged
   * bands, e.g. `['Γ3(2)', 'Γ3(3)']` — a published assignment. @default chosen by energy
   */
  readonly components?: readonly string[];
}

/** A band of the ζ refinement and the levels it was assigned to. */
export interface ZetaBand extends AssignedBand {
  /** Index of the fit's band (after merging) it belongs to. */
  readonly band: number;
}

/** What {@link refineFitWithZeta} returns. */
export interface ZetaFit {
  readonly refinement: SpinOrbitRefinement;
  /** The bands as refined: band centroids on cubic levels, resolved components on spin–orbit levels. */
  readonly bands: readonly ZetaBand[];
  /** Whether ζ was asked to be fitted. */
  readonly zetaAsked: boolean;
  /** Whether ζ was in the end fitted (false when asked but the bands do not determine it). */
  readonly zetaFitted: boolean;
  /** ζ / ζ(free ion), or null without a free-ion value. */
  readonly zetaRatio: number | null;
  /** Where ζ or the refinement may mislead, in words. */
  readonly warnings: readonly string[];
}

/**
 * Refines a fit's solution with spin–orbit coupling: ζ held, or fitted from the resolved
 * components of merged bands (held, with a warning, where there are none or too few).
 * @throws InputError for a bad ζ or a solution without assignments.
 */
export function refineFitWithZeta(
  result: FitResult,
  solution: FitSolution,
  options: ZetaFitOptions,
): ZetaFit {
  const zetaAsked = options.fitZeta ?? false;
  ensure(solution.assignments.length > 0, 'the fit has no assigned bands to refine');
  const holdB = solution.bHeld || !solution.bDetermined || result.n === 1 || result.n === 9;
  const fitC = solution.cFitted;
  const start = { dq: solution.dq, B: solution.B, C: solution.C };
  const refine = (bands: readonly ZetaBand[], fitZeta: boolean, zeta: number) =>
    refineWithSpinOrbit({
      n: result.n,
      geometry: result.geometry,
      start,
      zeta,
      fitZeta,
      fitC,
      holdB,
      bands,
    });
  const warnings: string[] = [];
  let bands = centroidBands(solution);
  const parameters = (holdB ? 1 : 2) + (fitC ? 1 : 0) + 1;
  let zetaFitted = false;
  if (zetaAsked) {
    const levels = solveSpinOrbit({ n: result.n, geometry: result.geometry, ...start, zeta: options.zeta });
    const split = componentBands(result, solution, levels, options.components);
    const resolved = split.some((b) => (b.components?.length ?? 0) > 0);
    if (!resolved) {
      warnings.push(
        `ζ held at ${whole(options.zeta)} cm⁻¹: no band is split into resolved components (give each component of a ` +
          'spin–orbit multiplet as a band; they are merged for the cubic fit and put back here), and band centroids do not fix ζ',
      );
    } else if (split.length < parameters) {
      warnings.push(
        `ζ held at ${whole(options.zeta)} cm⁻¹: ${split.length} bands and components for ${parameters} parameters ` +
          `(Dq${holdB ? '' : ', B'}${fitC ? ', C' : ''}, ζ); fewer resolved components than parameters leave ζ undetermined`,
      );
    } else {
      bands = split;
      zetaFitted = true;
    }
  }
  let refinement = refine(bands, zetaFitted, options.zeta);
  // The components' assignment was made at the start; redo it at the fitted values until it holds.
  for (let i = 0; zetaFitted && !options.components && i < REASSIGNMENTS; i++) {
    const again = componentBands(result, solution, refinement.levels);
    if (sameAssignment(again, bands)) break;
    bands = again;
    refinement = refine(bands, true, refinement.zeta);
  }
  const ratio = options.freeIonZeta && options.freeIonZeta > 0 ? refinement.zeta / options.freeIonZeta : null;
  if (zetaFitted) warnings.push(...zetaWarnings(refinement, ratio, bands.length, parameters));
  return { refinement, bands, zetaAsked, zetaFitted, zetaRatio: ratio, warnings };
}

/** Each assigned band on its cubic level (the centroid of its spin–orbit components). */
function centroidBands(solution: FitSolution): ZetaBand[] {
  return solution.assignments.map((a) => ({
    band: a.band,
    energy: a.observed,
    level: a.label,
    ...(a.sigma !== null ? { sigma: a.sigma } : {}),
  }));
}

/**
 * The bands with every merged band's components put back and assigned to spin–orbit levels (the
 * `given` ones in order, else by energy).
 * @throws InputError when `given` does not hold one level per component.
 */
function componentBands(
  result: FitResult,
  solution: FitSolution,
  levels: SpinOrbitResult,
  given?: readonly string[],
): ZetaBand[] {
  let next = 0;
  const bands = solution.assignments.flatMap((a) => {
    const merge = result.merges.find((m) => m.band === a.band);
    const sigma = a.sigma !== null ? { sigma: a.sigma } : {};
    const centroid = [{ band: a.band, energy: a.observed, level: a.label, ...sigma }];
    if (!merge || merge.energies.length < 2) return centroid;
    const observed = [...merge.energies].sort((x, y) => x - y);
    const picked = given
      ? observed.map((_, i) => given[next + i] ?? '')
      : assignComponents(levels, a.label, observed);
    next += observed.length;
    if (!picked) return centroid;
    return observed.map((energy, i) => ({
      band: a.band,
      energy,
      level: a.label,
      components: [picked[i] ?? ''],
      ...sigma,
    }));
  });
  ensure(
    !given || given.length === next,
    `${given?.length} spin–orbit levels for ${next} resolved components: expected one per component, lowest first`,
  );
  return bands;
}

/**
 * One spin–orbit level of cubic level `parent` for each observed component (ascending), in
 * energy order: of the levels carrying at least {@link COMPONENT_WEIGHT} of the parent, the
 * choice that lies closest to the components (least squares); null when there are fewer such
 * levels than components.
 */
export function assignComponents(
  levels: SpinOrbitResult,
  parent: string,
  observed: readonly number[],
): string[] | null {
  const candidates = levels.levels.filter(
    (l) => (l.parentage.find((p) => p.state === parent)?.weight ?? 0) >= COMPONENT_WEIGHT,
  );
  const k = observed.length;
  if (candidates.length < k || k === 0) return null;
  let best: string[] | null = null;
  let bestCost = Number.POSITIVE_INFINITY;
  for (const chosen of combinations(candidates.length, k)) {
    const picked = chosen.map((i) => candidates[i]);
    const cost = picked.reduce((s, l, i) => s + ((l?.energy ?? 0) - (observed[i] ?? 0)) ** 2, 0);
    if (cost < bestCost) {
      bestCost = cost;
      best = picked.map((l) => l?.label ?? '');
    }
  }
  return best;
}

/** Every increasing choice of `r` numbers from 0…n−1. */
function combinations(n: number, r: number): number[][] {
  if (r === 0) return [[]];
  const out: number[][] = [];
  const pick = (from: number, chosen: number[]) => {
    if (chosen.length === r) {
      out.push([...chosen]);
      return;
    }
    for (let i = from; i <= n - (r - chosen.length); i++) pick(i + 1, [...chosen, i]);
  };
  pick(0, []);
  return out;
}

function sameAssignment(a: readonly ZetaBand[], b: readonly ZetaBand[]): boolean {
  return (
    a.length === b.length &&
    a.every((x, i) => (x.components ?? []).join() === (b[i]?.components ?? []).join())
  );
}

/** Warnings on a fitted ζ: undetermined, at a bound, poorly determined, above the free ion. */
function zetaWarnings(
  r: SpinOrbitRefinement,
  ratio: number | null,
  observations: number,
  parameters: number,
): string[] {
  const out: string[] = [];
  const error = r.errors?.zeta ?? null;
  if (observations === parameters) {
    out.push(
      `as many bands and components as parameters (${parameters}): ζ is fitted exactly and has no standard error`,
    );
  } else if (error === null) {
    out.push('ζ has no standard error (the bands do not separate it from the other parameters)');
  } else if (error > ZETA_RELATIVE_ERROR * r.zeta) {
    out.push(
      `ζ = ${whole(r.zeta)} ± ${whole(error)} cm⁻¹ is poorly determined: broad, overlapping components fix it only loosely`,
    );
  }
  if (r.zeta < 1 || r.zeta > 0.999 * MAX_ZETA) {
    out.push(
      `ζ ran to the edge of its range (${whole(r.zeta)} cm⁻¹): the components do not look like a spin–orbit splitting`,
    );
  }
  if (ratio !== null && ratio > 1.1) {
    out.push(
      `ζ is ${ratio.toFixed(2)} × the free-ion value: spin–orbit coupling alone does not split the band this much (a Jahn–Teller or low-symmetry splitting is likely)`,
    );
  }
  out.push(
    'a fitted ζ absorbs every splitting of the components the cubic model leaves out (Jahn–Teller, low symmetry, vibronic structure); read it as an upper estimate',
  );
  return out;
}

function whole(x: number): string {
  return Math.round(x).toString();
}
