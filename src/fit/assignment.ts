import type { FieldParameters } from '../analysis/bandModel.js';
import { InputError } from '../core/errors.js';
import type { RatioScan, ScanLevel } from './ratioScan.js';

/**
 * The search over assignments of observed bands to transitions: at every point of a
 * {@link RatioScan}, the observed bands in energy order are given, in the same order, to a
 * choice of the lowest transitions from that point's ground state (order-preserving: a higher
 * band never goes to a lower transition), each choice gets its best scale in closed form, and
 * every distinct choice keeps the scan points where it fits best as starting values.
 */

/** One observed band as the search sees it. */
export interface SearchBand {
  /** Band maximum, cm⁻¹. */
  readonly energy: number;
  /** Weight 1/σ² of its residual. */
  readonly weight: number;
}

/** Defaults of {@link AssignmentSearchOptions}. */
export const ASSIGNMENT_DEFAULTS = {
  includeSpinForbidden: false,
  extraCandidates: 2,
  extraCandidatesWithForbidden: 8,
  maxSpinChange: 1,
  startsPerAssignment: 2,
} as const;

/** Options of {@link searchAssignments}. */
export interface AssignmentSearchOptions {
  /** Identity key fixed for each band (same order as the bands); null or missing means searched. */
  readonly fixed?: readonly (string | null | undefined)[];
  /** Offer spin-forbidden transitions to the search too. @default false */
  readonly includeSpinForbidden?: boolean;
  /**
   * How many transitions beyond the number of searched bands are offered at each point (the
   * lowest ones; so up to this many may go unobserved below the highest assigned one).
   * @default 2 with spin-allowed transitions only, 8 with spin-forbidden ones too
   */
  readonly extraCandidates?: number;
  /**
   * Largest |ΔS| of a spin-forbidden transition offered to the search. Transitions with
   * |ΔS| = 2 (e.g. sextet → doublet) are weaker again by orders of magnitude than those with
   * |ΔS| = 1 and are practically never seen (common practice, no source); they can still be
   * assigned by name. @default 1
   */
  readonly maxSpinChange?: number;
  /**
   * Hold the scale along each ray (B; Dq for d¹/d⁹) at this value instead of fitting it in closed
   * form: the search for a fit with B held. @default undefined (fitted)
   */
  readonly fixedScale?: number;
  /** Local minima along the scan kept as starting values per assignment. @default 2 */
  readonly startsPerAssignment?: number;
  /** Search only from ground states of this spin S. @default undefined (every ground state) */
  readonly groundSpin?: number;
}

/** An assignment with a starting point for the fit. */
export interface AssignmentCandidate {
  /** Identity key of the ground state the transitions start from. */
  readonly groundKey: string;
  readonly groundLabel: string;
  /** Identity key of the level each band is assigned to, in the bands' order. */
  readonly keys: readonly string[];
  /** Labels of those levels at the starting point. */
  readonly labels: readonly string[];
  /** Weighted sum of squared residuals at the starting point. */
  readonly chiSquare: number;
  /** Index of the starting point in the scan. */
  readonly pointIndex: number;
  /** Starting parameters: the scan ray times its best scale. */
  readonly start: FieldParameters;
}

/** Outcome of {@link searchAssignments}. */
export interface AssignmentSearch {
  /** Every distinct assignment and start, best scan fit first. */
  readonly candidates: readonly AssignmentCandidate[];
  /** Number of distinct assignments tried. */
  readonly tried: number;
  /** Labels of ground states met on the scan for which no assignment of all bands existed. */
  readonly groundsWithout: readonly string[];
}

/** One assignment met on the scan: χ² and best scale at each point (∞ where not offered). */
interface Entry {
  groundKey: string;
  keys: string[];
  chi: Float64Array;
  scale: Float64Array;
}

/** Calls `visit` with every increasing choice of `k` indices from 0…n−1. */
function combinations(n: number, k: number, visit: (chosen: readonly number[]) => void): void {
  const chosen: number[] = [];
  const step = (from: number) => {
    if (chosen.length === k) {
      visit(chosen);
      return;
    }
    for (let i = from; i <= n - (k - chosen.length); i++) {
      chosen.push(i);
      step(i + 1);
      chosen.pop();
    }
  };
  step(0);
}

/**
 * The minimum of the parabola through χ² at scan points i−1, i, i+1 (evenly spaced in log Δ/B),
 * kept within half a step of i, with the scale interpolated linearly: a better start than the
 * grid point itself. Undefined at the ends of the scan or where the parabola does not open upward.
 */
function parabolicVertex(
  scan: RatioScan,
  i: number,
  chi: (i: number) => number,
  scaleAt: (i: number) => number | undefined,
): { direction: FieldParameters; scale: number; chiSquare: number } | undefined {
  const [below, here, above] = [chi(i - 1), chi(i), chi(i + 1)];
  const curvature = below - 2 * here + above;
  if (scan.scale !== 'B' || !Number.isFinite(below) || !Number.isFinite(above) || !(curvature > 0)) {
    return undefined;
  }
  const chiSquare = Math.max(0, here - (below - above) ** 2 / (8 * curvature));
  // Nothing to gain (e.g. an exact fit on the grid point itself).
  if (!(here - chiSquare > 1e-9 * (below + above))) return undefined;
  const offset = Math.max(-0.5, Math.min(0.5, (0.5 * (below - above)) / curvature));
  const j = offset < 0 ? i - 1 : i + 1;
  const f = Math.abs(offset);
  const x = scan.points[i]?.deltaOverB;
  const xj = scan.points[j]?.deltaOverB;
  const s = scaleAt(i);
  const sj = scaleAt(j);
  if (x == null || xj == null || s === undefined || sj === undefined) return undefined;
  const deltaOverB = x * (xj / x) ** f;
  return {
    direction: { dq: deltaOverB / 10, B: 1, C: scan.cOverB },
    scale: s + f * (sj - s),
    chiSquare,
  };
}

/**
 * All assignments of `bands` to transitions along `scan`, each with its best starting points.
 * Assignments whose ground state is itself one of the fixed levels are skipped.
 */
export function searchAssignments(
  scan: RatioScan,
  bands: readonly SearchBand[],
  options: AssignmentSearchOptions = {},
): AssignmentSearch {
  const includeSpinForbidden = options.includeSpinForbidden ?? ASSIGNMENT_DEFAULTS.includeSpinForbidden;
  const maxSpinChange = options.maxSpinChange ?? ASSIGNMENT_DEFAULTS.maxSpinChange;
  const extra =
    options.extraCandidates ??
    (includeSpinForbidden
      ? ASSIGNMENT_DEFAULTS.extraCandidatesWithForbidden
      : ASSIGNMENT_DEFAULTS.extraCandidates);
  const startsPerAssignment = options.startsPerAssignment ?? ASSIGNMENT_DEFAULTS.startsPerAssignment;
  const fixed = bands.map((_, i) => options.fixed?.[i] ?? null);
  const fixedKeys = new Set(fixed.filter((k): k is string => k !== null));
  const free = bands
    .map((b, i) => ({ b, i }))
    .filter(({ i }) => fixed[i] === null)
    .sort((a, c) => a.b.energy - c.b.energy)
    .map(({ i }) => i);

  // Hot loop (thousands of choices per point with spin-forbidden transitions): a level is a
  // one-character code in the assignment's id, and χ² and scale go into per-point arrays.
  const codes = new Map<string, string>();
  const codeOf = (key: string) => {
    let c = codes.get(key);
    if (c === undefined) {
      c = String.fromCharCode(0x100 + codes.size);
      codes.set(key, c);
    }
    return c;
  };
  const count = scan.points.length;
  const found = new Map<string, Entry>();
  const groundsSeen = new Map<string, boolean>();
  const energies = new Float64Array(bands.length);
  scan.points.forEach((point, pointIndex) => {
    const ground = point.ground;
    if (fixedKeys.has(ground.key)) return;
    if (options.groundSpin !== undefined && Math.abs(ground.S - options.groundSpin) > 1e-9) return;
    if (!groundsSeen.has(ground.label)) groundsSeen.set(ground.label, false);
    const byKey = new Map(point.excited.map((l) => [l.key, l]));
    const pool = point.excited.filter(
      (l) =>
        !fixedKeys.has(l.key) &&
        (l.spinAllowed || (includeSpinForbidden && Math.abs(l.S - ground.S) <= maxSpinChange + 1e-9)),
    );
    const offered = Math.min(pool.length, free.length + extra);
    if (offered < free.length) return;
    groundsSeen.set(ground.label, true);
    const levels: ScanLevel[] = bands.map((_, i) => byKey.get(fixed[i] ?? '') ?? ground);
    const groundCode = codeOf(ground.key);
    combinations(offered, free.length, (chosen) => {
      for (let j = 0; j < chosen.length; j++) {
        const level = pool[chosen[j] as number] as ScanLevel;
        levels[free[j] as number] = level;
      }
      // Best scale s along the ray: weighted linear least squares of ν ≈ s·e.
      let num = 0;
      let den = 0;
      for (let i = 0; i < bands.length; i++) {
        const b = bands[i] as SearchBand;
        const e = (levels[i] as ScanLevel).energy;
        energies[i] = e;
        num += b.weight * b.energy * e;
        den += b.weight * e * e;
      }
      const scale = options.fixedScale ?? (den > 0 ? num / den : 0);
      if (!(scale > 0)) return;
      let chiSquare = 0;
      for (let i = 0; i < bands.length; i++) {
        const b = bands[i] as SearchBand;
        chiSquare += b.weight * (b.energy - scale * (energies[i] as number)) ** 2;
      }
      let id = groundCode;
      for (const level of levels) id += codeOf(level.key);
      let entry = found.get(id);
      if (!entry) {
        entry = {
          groundKey: ground.key,
          keys: levels.map((l) => l.key),
          chi: new Float64Array(count).fill(Number.POSITIVE_INFINITY),
          scale: new Float64Array(count),
        };
        found.set(id, entry);
      }
      entry.chi[pointIndex] = chiSquare;
      entry.scale[pointIndex] = scale;
    });
  });

  const candidates: AssignmentCandidate[] = [];
  const levelMaps = new Map<number, Map<string, ScanLevel>>();
  const levelsAt = (i: number) => {
    let map = levelMaps.get(i);
    if (!map) {
      const point = scan.points[i];
      map = new Map(point ? [point.ground, ...point.excited].map((l) => [l.key, l]) : []);
      levelMaps.set(i, map);
    }
    return map;
  };
  for (const entry of found.values()) {
    const chi = (i: number) => (i >= 0 && i < count ? (entry.chi[i] as number) : Number.POSITIVE_INFINITY);
    const minima = [];
    for (let i = 0; i < count; i++) {
      if (Number.isFinite(chi(i)) && chi(i) <= chi(i - 1) && chi(i) <= chi(i + 1)) minima.push(i);
    }
    minima.sort((a, b) => chi(a) - chi(b));
    for (const pointIndex of minima.slice(0, startsPerAssignment)) {
      const point = scan.points[pointIndex];
      if (!point) continue;
      const at = levelsAt(pointIndex);
      const assigned = entry.keys.map((k) => at.get(k));
      const vertex = parabolicVertex(scan, pointIndex, chi, (i) => entry.scale[i]);
      const d = vertex?.direction ?? point.direction;
      const scale = vertex?.scale ?? (entry.scale[pointIndex] as number);
      candidates.push({
        groundKey: entry.groundKey,
        groundLabel: point.ground.label,
        keys: entry.keys,
        labels: assigned.map((l) => l?.label ?? '?'),
        chiSquare: vertex?.chiSquare ?? chi(pointIndex),
        pointIndex,
        start: { dq: scale * d.dq, B: scale * d.B, C: scale * d.C },
      });
    }
  }
  candidates.sort((a, b) => a.chiSquare - b.chiSquare);
  return {
    candidates,
    tried: found.size,
    groundsWithout: [...groundsSeen].filter(([, ok]) => !ok).map(([label]) => label),
  };
}

/** Superscript and subscript digits to plain ones, whitespace removed. */
function normaliseLabel(text: string): string {
  const digits = '⁰¹²³⁴⁵⁶⁷⁸⁹';
  const low = '₀₁₂₃₄₅₆₇₈₉';
  return [...text.replace(/\s+/g, '')]
    .map((c) => {
      const i = digits.indexOf(c);
      const j = low.indexOf(c);
      return i >= 0 ? String(i) : j >= 0 ? String(j) : c;
    })
    .join('');
}

/**
 * The identity key of a level named by its label (`3T1g(F)`, or Unicode `³T₁g(F)`; case is
 * forgiven where unambiguous), as labelled at the scan's C/B — for d⁴–d⁶ the parent letters of
 * some labels depend on C/B.
 * @throws InputError for a label no level has (listing those that exist) or one that names
 * several levels.
 */
export function levelKeyOfLabel(scan: RatioScan, text: string): string {
  const { n, geometry } = scan;
  const mid = scan.points[Math.floor(scan.points.length / 2)];
  if (!mid) throw new Error('empty scan');
  const levels = [mid.ground, ...mid.excited];
  const wanted = normaliseLabel(text);
  const exact = levels.find((l) => l.label === wanted);
  if (exact) return exact.key;
  const folded = levels.filter((l) => l.label.toLowerCase() === wanted.toLowerCase());
  if (folded.length === 1 && folded[0]) return folded[0].key;
  const bySymbol = levels.filter((l) => l.label.startsWith(`${wanted}(`));
  if (bySymbol.length > 1) {
    throw new InputError(
      `assignment "${text}": d${n} has several such levels; expected one of ${bySymbol.map((l) => l.label).join(', ')}`,
    );
  }
  throw new InputError(
    `assignment "${text}": no such level of d${n} (${geometry === 'oct' ? 'octahedral' : 'tetrahedral'}); ` +
      `expected one of ${levels.map((l) => l.label).join(', ')}`,
  );
}
