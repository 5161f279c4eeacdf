/**
 * The ground-state map of dⁿ: over Δ/B and C/B, which spin state is lowest. Energies are
 * homogeneous in (B, C, Dq), so the map is the same for every B; each row (one C/B) is scanned
 * in Δ/B and every change of ground spin pinned down exactly by {@link groundStateCrossings}.
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { solveCubic } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import { type GroundCrossing, groundStateCrossings } from './groundState.js';

/** B used for the computation, cm⁻¹; any value gives the same map. */
export const MAP_B = 1000;

/** Defaults of {@link GroundMapOptions}. */
export const GROUND_MAP_DEFAULTS = {
  maxDeltaOverB: 50,
  minCOverB: 3,
  maxCOverB: 7,
  rows: 17,
  columns: 100,
} as const;

/** Options of {@link groundStateMap}. */
export interface GroundMapOptions {
  /** @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  /** Right edge of the map in Δ/B. @default 50 */
  readonly maxDeltaOverB?: number;
  /** Lowest C/B. @default 3 */
  readonly minCOverB?: number;
  /** Highest C/B. @default 7 */
  readonly maxCOverB?: number;
  /** Rows (C/B values, evenly spaced, ends included). @default 17 */
  readonly rows?: number;
  /** Scan points per row in Δ/B before the roots are refined (a window of one spin narrower than one step can be missed). @default 100 */
  readonly columns?: number;
  /** Called after each row with (rows done, rows in all), e.g. for a progress line. */
  readonly onRow?: (done: number, total: number) => void;
}

/** A stretch of Δ/B in one row over which one state is lowest. */
export interface MapSegment {
  /** Left end, Δ/B. */
  readonly from: number;
  /** Right end, Δ/B. */
  readonly to: number;
  /** Plain ²ˢ⁺¹Γ of the ground state, e.g. `5T2g`. */
  readonly symbol: string;
  readonly S: number;
}

/** One row of the map: a C/B value and what is lowest along Δ/B. */
export interface MapRow {
  readonly cOverB: number;
  /** Changes of ground spin along the row (Dq at {@link MAP_B}). */
  readonly crossings: readonly GroundCrossing[];
  /** The stretches between them, left to right, covering 0…maxDeltaOverB. */
  readonly segments: readonly MapSegment[];
}

/** The map over Δ/B × C/B. */
export interface GroundStateMap {
  readonly n: number;
  readonly geometry: Geometry;
  readonly maxDeltaOverB: number;
  readonly rows: readonly MapRow[];
  /** The ground states that occur, highest spin first. */
  readonly states: readonly { readonly symbol: string; readonly S: number }[];
}

/**
 * Which spin state is lowest over 0 < Δ/B ≤ maxDeltaOverB and minCOverB ≤ C/B ≤ maxCOverB.
 * @throws InputError for n outside 1…9, an unknown geometry or an empty or reversed range.
 */
export function groundStateMap(n: number, options: GroundMapOptions = {}): GroundStateMap {
  const d = GROUND_MAP_DEFAULTS;
  const {
    geometry = DEFAULT_GEOMETRY,
    maxDeltaOverB = d.maxDeltaOverB,
    minCOverB = d.minCOverB,
    maxCOverB = d.maxCOverB,
    rows = d.rows,
    columns = d.columns,
  } = options;
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  ensure(
    Number.isFinite(maxDeltaOverB) && maxDeltaOverB > 0,
    `largest Δ/B ${maxDeltaOverB}: expected a positive number`,
  );
  ensure(
    Number.isFinite(minCOverB) && minCOverB > 0 && Number.isFinite(maxCOverB) && maxCOverB >= minCOverB,
    `C/B range ${minCOverB}…${maxCOverB}: expected 0 < lowest ≤ highest`,
  );
  ensure(Number.isInteger(rows) && rows >= 1, `rows ${rows}: expected a whole number ≥ 1`);
  ensure(Number.isInteger(columns) && columns >= 2, `columns ${columns}: expected a whole number ≥ 2`);
  const out: MapRow[] = [];
  for (let i = 0; i < rows; i++) {
    const cOverB = rows === 1 ? minCOverB : minCOverB + ((maxCOverB - minCOverB) * i) / (rows - 1);
    const C = cOverB * MAP_B;
    const crossings = groundStateCrossings({
      n,
      geometry,
      B: MAP_B,
      C,
      maxDeltaOverB,
      scanPoints: columns,
    });
    const segments: MapSegment[] = [];
    let left = 0;
    for (const c of crossings) {
      segments.push({ from: left, to: c.deltaOverB, symbol: c.fromSymbol, S: c.fromS });
      left = c.deltaOverB;
    }
    const last = crossings.at(-1);
    if (last) {
      segments.push({ from: left, to: maxDeltaOverB, symbol: last.toSymbol, S: last.toS });
    } else {
      const g = solveCubic({ n, geometry, dq: (maxDeltaOverB * MAP_B) / 20, B: MAP_B, C }).ground;
      segments.push({ from: 0, to: maxDeltaOverB, symbol: g.symbol, S: g.S });
    }
    out.push({ cOverB, crossings, segments });
    options.onRow?.(i + 1, rows);
  }
  const states = new Map<string, number>();
  for (const row of out) for (const s of row.segments) states.set(s.symbol, s.S);
  return {
    n,
    geometry,
    maxDeltaOverB,
    rows: out,
    states: [...states].map(([symbol, S]) => ({ symbol, S })).sort((a, b) => b.S - a.S),
  };
}
