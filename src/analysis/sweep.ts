/**
 * Correlation (Tanabe–Sugano-style) diagram data: E/B of every level of dⁿ above the ground
 * state as Δ/B goes from 0 to a maximum at fixed C/B, one curve per labelled state, with the
 * exact Δ/B of every change of ground-state spin (Tanabe & Sugano, J. Phys. Soc. Japan 9, 753,
 * 1954, for the form of the diagram).
 *
 * Units: the Hamiltonian B·H_B + C·H_C + Dq·V is linear in B, C and Dq, so E/B depends on C/B and
 * Δ/B alone. The sweep therefore solves at the fixed Racah B = {@link SWEEP_B} cm⁻¹ with
 * C = (C/B)·B and Dq = (Δ/B)·B/10, and divides every energy by B; no value depends on that choice
 * beyond rounding.
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { DEFAULT_C_OVER_B, MAX_C_OVER_B } from '../core/ions.js';
import { cubicCurves, cubicLevels } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import { csvText } from '../sheets/csv.js';
import type { Caution } from './cautions.js';
import { CROSSING_DEFAULTS, groundStateCrossings } from './groundState.js';

/** Racah B (cm⁻¹) the sweep solves at before dividing by it; see the module notes. */
export const SWEEP_B = 1000;

/** Largest Δ/B of a sweep unless given. */
export const DEFAULT_MAX_DELTA_OVER_B = 40;

/** Number of evenly spaced Δ/B values of a sweep unless given. */
export const DEFAULT_SWEEP_POINTS = 400;

/** Largest Δ/B a sweep accepts: far beyond the strong-field limit of any diagram. */
export const MAX_SWEEP_DELTA_OVER_B = 1000;

/** Most points a sweep accepts (each is one full diagonalisation). */
export const MAX_SWEEP_POINTS = 100_000;

/** Options of {@link sweepDiagram}. */
export interface SweepOptions {
  /** Octahedral or tetrahedral field. @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  /**
   * C/B held fixed along the sweep (for a named ion, its free-ion ratio, see `freeIonRatio`).
   * @default DEFAULT_C_OVER_B (4.5)
   */
  readonly cOverB?: number;
  /** Largest Δ/B. @default DEFAULT_MAX_DELTA_OVER_B (40) */
  readonly maxDeltaOverB?: number;
  /** Evenly spaced Δ/B values from 0 to the maximum, both ends included. @default DEFAULT_SWEEP_POINTS (400) */
  readonly points?: number;
  /**
   * Scan points of the search for changes of ground-state spin (a change is found unless two
   * fall between neighbouring points); fewer is faster for an interactive view.
   * @default CROSSING_DEFAULTS.scanPoints (240)
   */
  readonly crossingScanPoints?: number;
  /** Called after each solved point, for progress display. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** One state followed from Δ/B = 0 to the maximum. */
export interface DiagramCurve {
  /** The solver's unique label, e.g. `4T1g(P)`: the same state at every point. */
  readonly label: string;
  /** ²ˢ⁺¹Γ, e.g. `4T1g`. */
  readonly symbol: string;
  readonly S: number;
  /** Irrep, `T1g` in Oh, `T1` in Td. */
  readonly irrep: string;
  /** Free-ion term at Δ/B = 0, e.g. `4P` or `a2D`. */
  readonly parent: string;
  /** Main strong-field configuration at the largest Δ/B, e.g. `t2g^2 eg^1`. */
  readonly strongField: string;
  /** E/B above the ground state at each {@link CorrelationDiagram.deltaOverB}. */
  readonly values: readonly number[];
  /**
   * With spin–orbit coupling: the curve's parent ²ˢ⁺¹Γ and its spin along the sweep, one entry
   * where it changes (the figure styles each stretch by it); absent otherwise.
   */
  readonly stretches?: readonly {
    readonly fromDeltaOverB: number;
    readonly parent: string;
    readonly S: number;
  }[];
  /** A label for the figure in place of `label`, e.g. `Γ5 3T1g(F)`. @default label */
  readonly caption?: string;
}

/** A change of ground-state spin along the sweep. */
export interface DiagramCrossing {
  /** Δ/B of the change (root of the energy difference, not a grid point). */
  readonly deltaOverB: number;
  /** Ground-state label below the change, e.g. `5T2g`. */
  readonly from: string;
  /** Ground-state label above it, e.g. `1A1g(I)`. */
  readonly to: string;
  readonly fromS: number;
  readonly toS: number;
}

/** A stretch of Δ/B with one ground-state spin. */
export interface SpinRegion {
  readonly fromDeltaOverB: number;
  readonly toDeltaOverB: number;
  /** Spin of the ground state here; a curve of this S is spin-allowed from the ground state here. */
  readonly S: number;
  /** Ground-state label here. */
  readonly ground: string;
}

/** The data of one correlation diagram. */
export interface CorrelationDiagram {
  readonly n: number;
  readonly geometry: Geometry;
  readonly cOverB: number;
  readonly maxDeltaOverB: number;
  /** The evenly spaced grid size asked for. */
  readonly points: number;
  /**
   * Δ/B of every column, ascending: the evenly spaced grid with each crossing's exact Δ/B
   * inserted, so that the kink of every curve at a change of ground state is drawn where it is.
   */
  readonly deltaOverB: readonly number[];
  /** Every level's curve, ordered by energy just above Δ/B = 0. */
  readonly curves: readonly DiagramCurve[];
  /** Changes of ground-state spin, by Δ/B. */
  readonly crossings: readonly DiagramCrossing[];
  /** The stretches between the crossings (one region when there is none). */
  readonly regions: readonly SpinRegion[];
  /** ζ/B where the curves include spin–orbit coupling (double-group levels, no spin regions); absent otherwise. */
  readonly zetaOverB?: number;
}

/**
 * The settings of a sweep with their defaults, checked: n 1…9, the geometry, C/B, the largest Δ/B
 * and the point count (shared by the diagrams with and without spin–orbit coupling).
 * @throws InputError naming the value at fault.
 */
export function sweepSettings(
  n: number,
  options: Omit<SweepOptions, 'onProgress'>,
): { geometry: Geometry; cOverB: number; maxDeltaOverB: number; points: number } {
  const geometry = options.geometry ?? DEFAULT_GEOMETRY;
  const cOverB = options.cOverB ?? DEFAULT_C_OVER_B;
  const maxDeltaOverB = options.maxDeltaOverB ?? DEFAULT_MAX_DELTA_OVER_B;
  const points = options.points ?? DEFAULT_SWEEP_POINTS;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  ensure(
    Number.isFinite(cOverB) && cOverB > 0 && cOverB <= MAX_C_OVER_B,
    `C/B ${cOverB}: expected a positive number up to ${MAX_C_OVER_B}`,
  );
  ensure(
    Number.isFinite(maxDeltaOverB) && maxDeltaOverB > 0 && maxDeltaOverB <= MAX_SWEEP_DELTA_OVER_B,
    `largest Δ/B ${maxDeltaOverB}: expected a positive number up to ${MAX_SWEEP_DELTA_OVER_B}`,
  );
  ensure(
    Number.isInteger(points) && points >= 2 && points <= MAX_SWEEP_POINTS,
    `points ${points}: expected a whole number from 2 to ${MAX_SWEEP_POINTS}`,
  );
  return { geometry, cOverB, maxDeltaOverB, points };
}

/**
 * Sweeps Δ/B from 0 to `maxDeltaOverB` at fixed C/B for dⁿ (n = 1…9) in an octahedral or
 * tetrahedral field: the energy of every level above the ground state, in units of B, followed
 * by label (levels of one ²ˢ⁺¹Γ never cross, so the solver's labels name the same state at every
 * point), with the exact crossings found by {@link groundStateCrossings}.
 * @throws InputError for n outside 1…9, a non-positive C/B or maximum, or a point count outside
 * 2…{@link MAX_SWEEP_POINTS}.
 */
export function sweepDiagram(n: number, options: SweepOptions = {}): CorrelationDiagram {
  const { geometry, cOverB, maxDeltaOverB, points } = sweepSettings(n, options);
  const B = SWEEP_B;
  const C = cOverB * B;
  const scanPoints = options.crossingScanPoints ?? CROSSING_DEFAULTS.scanPoints;
  const crossings: DiagramCrossing[] = groundStateCrossings({
    n,
    geometry,
    B,
    C,
    maxDeltaOverB,
    scanPoints,
  }).map((c) => ({ deltaOverB: c.deltaOverB, from: c.from, to: c.to, fromS: c.fromS, toS: c.toS }));
  const xs = gridWithCrossings(maxDeltaOverB, points, crossings);
  const sign = geometry === 'oct' ? 1 : -1;
  const dqs = xs.map((x) => (sign * x * B) / 10);
  const byLabel = new Map(
    cubicCurves(n, dqs, B, C, geometry, options.onProgress).map((c) => [c.label, c] as const),
  );
  // The full solver names the curves: in its order at Δ/B = 0 (which settles ties in the sort
  // below), with the strong-field make-up at the last point.
  const first = cubicLevels(n, dqs[0] ?? 0, B, C, geometry, false);
  const last = cubicLevels(n, dqs[dqs.length - 1] ?? 0, B, C, geometry);
  const strongField = new Map(last.levels.map((l) => [l.label, l.configuration]));
  if (first.levels.length !== byLabel.size) {
    throw new Error(`d${n}: ${first.levels.length} levels at Δ/B = 0, ${byLabel.size} curves`);
  }
  const curves = first.levels.map((l) => {
    const curve = byLabel.get(l.label);
    if (!curve) throw new Error(`d${n}: level ${l.label} has no curve`);
    return {
      label: l.label,
      symbol: l.symbol,
      S: l.S,
      irrep: l.irrep,
      parent: l.parent,
      values: Array.from(curve.energies, (e) => e / B),
    };
  });
  // Order by energy just above Δ/B = 0, where the levels of one term have begun to split.
  const order = (c: (typeof curves)[number]) => c.values[1] ?? c.values[0] ?? 0;
  const sorted = [...curves].sort((a, b) => order(a) - order(b));
  return {
    n,
    geometry,
    cOverB,
    maxDeltaOverB,
    points,
    deltaOverB: xs,
    curves: sorted.map((c) => ({ ...c, strongField: strongField.get(c.label) ?? '' })),
    crossings,
    regions: spinRegions(xs, sorted, crossings, maxDeltaOverB),
  };
}

/** The evenly spaced grid 0…max with the crossings' Δ/B inserted in order (unless one is a grid value). */
function gridWithCrossings(max: number, points: number, crossings: readonly DiagramCrossing[]): number[] {
  const xs = Array.from({ length: points }, (_, i) => (max * i) / (points - 1));
  const step = max / (points - 1);
  for (const c of crossings) {
    const nearest = Math.round(c.deltaOverB / step);
    if (Math.abs(c.deltaOverB - nearest * step) > 1e-9 * max) xs.push(c.deltaOverB);
  }
  return xs.sort((a, b) => a - b);
}

function spinRegions(
  xs: readonly number[],
  curves: readonly { label: string; S: number; values: readonly number[] }[],
  crossings: readonly DiagramCrossing[],
  max: number,
): SpinRegion[] {
  const bounds = [0, ...crossings.map((c) => c.deltaOverB), max];
  const regions: SpinRegion[] = [];
  for (let r = 0; r + 1 < bounds.length; r++) {
    const from = bounds[r] ?? 0;
    const to = bounds[r + 1] ?? max;
    // The ground state in the middle of the region: the curve at zero there.
    const mid = (from + to) / 2;
    let i = 0;
    for (let j = 0; j < xs.length; j++)
      if (Math.abs((xs[j] ?? 0) - mid) < Math.abs((xs[i] ?? 0) - mid)) i = j;
    let ground = curves[0];
    for (const c of curves) if ((c.values[i] ?? 0) < (ground?.values[i] ?? 0)) ground = c;
    regions.push({ fromDeltaOverB: from, toDeltaOverB: to, S: ground?.S ?? 0, ground: ground?.label ?? '' });
  }
  return regions;
}

/** Digits after the point in the CSV text (E/B to 10⁻⁶, far below any use of a diagram). */
export const CSV_DIGITS = 6;

function csvNumber(x: number): string {
  return String(Number(x.toFixed(CSV_DIGITS)));
}

/**
 * The curves as CSV text: a header `Delta/B,<label>,<label>,…` (labels as the solver writes
 * them, e.g. `4T1g(F)`; quoted where they hold a comma) and one row per Δ/B, values E/B.
 */
export function diagramCsv(diagram: CorrelationDiagram): string {
  const header = ['Delta/B', ...diagram.curves.map((c) => c.label)];
  const rows = diagram.deltaOverB.map((x, i) =>
    [x, ...diagram.curves.map((c) => c.values[i] ?? Number.NaN)].map(csvNumber),
  );
  return csvText([header, ...rows]);
}

/** The diagram as a plain object for JSON: settings, units, crossings, regions and every curve. */
export function diagramJson(diagram: CorrelationDiagram) {
  return {
    n: diagram.n,
    geometry: diagram.geometry,
    cOverB: diagram.cOverB,
    maxDeltaOverB: diagram.maxDeltaOverB,
    points: diagram.points,
    units: 'x is Δ/B = 10Dq/B; values are E/B above the ground state',
    crossings: diagram.crossings,
    regions: diagram.regions,
    deltaOverB: diagram.deltaOverB,
    curves: diagram.curves,
  };
}

/**
 * Cautions a reader of the diagram needs: where it shows a change of ground state, that the
 * crossover is the ideal cubic model's, not a prediction of what a compound does.
 */
export function diagramCautions(diagram: CorrelationDiagram): Caution[] {
  const out: Caution[] = diagram.crossings.map((c) => ({
    code: 'spin-state',
    message:
      `d${diagram.n}: the ground state changes at Δ/B = ${c.deltaOverB.toFixed(2)} for C/B = ${diagram.cOverB.toFixed(2)} ` +
      'in an ideal cubic field; which spin state a real compound adopts near there depends also on temperature, ' +
      'lattice, entropy and lower symmetry — magnetic or Mössbauer measurement decides',
  }));
  if (diagram.geometry === 'tet' && diagram.crossings.length > 0) {
    out.push({
      code: 'spin-state',
      message:
        'tetrahedral fields are weak (Δt ≈ 4/9 Δo for the same ligands, common practice, no source), so ' +
        'real tetrahedral complexes seldom come near the low-spin side of this diagram',
    });
  }
  return out;
}
