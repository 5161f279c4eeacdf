/**
 * Correlation-diagram data with spin–orbit coupling: E/B of every double-group level of dⁿ above
 * the ground level as Δ/B goes from 0 to a maximum at fixed C/B and ζ/B. Levels of one
 * double-group irrep never cross (von Neumann & Wigner, Phys. Z. 30, 467, 1929), so the i-th
 * Γ8 from below is one state along the whole sweep; each curve is named by its free-ion level
 * ²ˢ⁺¹L_J at Δ/B = 0 and its main cubic parent at the largest Δ/B. Solved at B = SWEEP_B and
 * divided by B, as in sweep.ts.
 */
import { freeIonLevels } from '../atom/jLevels.js';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { DEFAULT_C_OVER_B, MAX_C_OVER_B } from '../core/ions.js';
import type { DoubleIrrep } from '../field/doubleGroup.js';
import type { Geometry } from '../field/labels.js';
import { checkZeta } from '../field/spinOrbit.js';
import {
  type LevelEnergy,
  type SpinOrbitResult,
  spinOrbitEnergies,
  spinOrbitLevels,
} from '../field/spinOrbitSolver.js';
import {
  type CorrelationDiagram,
  DEFAULT_MAX_DELTA_OVER_B,
  DEFAULT_SWEEP_POINTS,
  MAX_SWEEP_DELTA_OVER_B,
  MAX_SWEEP_POINTS,
  SWEEP_B,
} from './sweep.js';

/** Options of {@link sweepSpinOrbit}. */
export interface SpinOrbitSweepOptions {
  /** @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  /** C/B held fixed. @default DEFAULT_C_OVER_B (4.5) */
  readonly cOverB?: number;
  /** ζ/B held fixed (e.g. 0.3 for Ni²⁺: ζ ≈ 650, B ≈ 1080 cm⁻¹). */
  readonly zetaOverB: number;
  /** @default DEFAULT_MAX_DELTA_OVER_B (40) */
  readonly maxDeltaOverB?: number;
  /** @default DEFAULT_SWEEP_POINTS (400) */
  readonly points?: number;
  /** Called after each solved point, for progress display. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** One double-group level followed along the sweep. */
export interface SpinOrbitCurve {
  /** Irrep and rank from below, e.g. `Γ8(3)`. */
  readonly label: string;
  readonly irrep: DoubleIrrep;
  /** The free-ion level at Δ/B = 0, e.g. `4F3/2`. */
  readonly freeIon: string;
  /** The main spin–orbit-free cubic parent at the largest Δ/B, e.g. `4T1g(F)`. */
  readonly strongField: string;
  /** E/B above the ground level at each Δ/B. */
  readonly values: readonly number[];
}

/** The data of one correlation diagram with spin–orbit coupling. */
export interface SpinOrbitDiagram {
  readonly n: number;
  readonly geometry: Geometry;
  readonly cOverB: number;
  readonly zetaOverB: number;
  readonly maxDeltaOverB: number;
  readonly deltaOverB: readonly number[];
  /** Every level's curve, ordered by energy just above Δ/B = 0. */
  readonly curves: readonly SpinOrbitCurve[];
}

/**
 * Sweeps Δ/B at fixed C/B and ζ/B for dⁿ (n = 1…9) with spin–orbit coupling.
 * @throws InputError for a bad n, C/B, ζ/B, maximum or point count.
 */
export function sweepSpinOrbit(n: number, options: SpinOrbitSweepOptions): SpinOrbitDiagram {
  const geometry = options.geometry ?? DEFAULT_GEOMETRY;
  const cOverB = options.cOverB ?? DEFAULT_C_OVER_B;
  const maxDeltaOverB = options.maxDeltaOverB ?? DEFAULT_MAX_DELTA_OVER_B;
  const points = options.points ?? DEFAULT_SWEEP_POINTS;
  const { zetaOverB } = options;
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
    Number.isFinite(zetaOverB) && zetaOverB >= 0 && zetaOverB <= 20,
    `ζ/B ${zetaOverB}: expected a number from 0 to 20`,
  );
  ensure(
    Number.isFinite(maxDeltaOverB) && maxDeltaOverB > 0 && maxDeltaOverB <= MAX_SWEEP_DELTA_OVER_B,
    `largest Δ/B ${maxDeltaOverB}: expected a positive number up to ${MAX_SWEEP_DELTA_OVER_B}`,
  );
  ensure(
    Number.isInteger(points) && points >= 2 && points <= MAX_SWEEP_POINTS,
    `points ${points}: expected a whole number from 2 to ${MAX_SWEEP_POINTS}`,
  );
  const B = SWEEP_B;
  const C = cOverB * B;
  const zeta = zetaOverB * B;
  checkZeta(zeta);
  const sign = geometry === 'oct' ? 1 : -1;
  const xs = Array.from({ length: points }, (_, i) => (maxDeltaOverB * i) / (points - 1));
  const values = new Map<string, number[]>();
  let first: SpinOrbitResult | undefined;
  let last: SpinOrbitResult | undefined;
  xs.forEach((x, i) => {
    const dqOct = (sign * x * B) / 10;
    const ends = i === 0 || i === xs.length - 1;
    // Inside the sweep eigenvalues alone name the levels; the ends need eigenvectors for parentage.
    const fast = ends ? null : spinOrbitEnergies(n, dqOct, B, C, zeta);
    let levels: readonly LevelEnergy[] | null = fast;
    if (!levels) {
      const r = spinOrbitLevels(n, dqOct, B, C, zeta, geometry, ends);
      if (i === 0) first = r;
      if (ends) last = r;
      levels = r.levels;
    }
    const rank = new Map<string, number>();
    for (const l of levels) {
      const k = (rank.get(l.irrep) ?? 0) + 1;
      rank.set(l.irrep, k);
      const label = `${l.irrep}(${k})`;
      const list = values.get(label) ?? [];
      list.push(l.energy / B);
      values.set(label, list);
    }
    options.onProgress?.(i + 1, xs.length);
  });
  const strong = new Map((last?.levels ?? []).map((l) => [l.label, l.parent]));
  const jLevels = freeIonLevels(n, B, C, zeta);
  const curves = (first?.levels ?? []).map((l) => ({
    label: l.label,
    irrep: l.irrep,
    freeIon: jLevels.find((j) => Math.abs(j.energy - l.energy) <= 1e-6 * B)?.label ?? l.parent,
    strongField: strong.get(l.label) ?? '',
    values: values.get(l.label) ?? [],
  }));
  const order = (c: SpinOrbitCurve) => c.values[1] ?? c.values[0] ?? 0;
  return {
    n,
    geometry,
    cOverB,
    zetaOverB,
    maxDeltaOverB,
    deltaOverB: xs,
    curves: [...curves].sort((a, b) => order(a) - order(b)),
  };
}

/**
 * The diagram in the form of {@link CorrelationDiagram}, for the CSV and figure code of the
 * spin–orbit-free diagram. Spin is no longer a good quantum number, so every curve is given
 * S = 0 and the diagram one region: all curves are drawn alike, and a change of ground level
 * shows as a kink, with no spin regions or crossings.
 */
export function spinOrbitAsCorrelation(d: SpinOrbitDiagram): CorrelationDiagram {
  const ground = d.curves.find((c) => c.values[0] === 0)?.label ?? '';
  return {
    n: d.n,
    geometry: d.geometry,
    cOverB: d.cOverB,
    maxDeltaOverB: d.maxDeltaOverB,
    points: d.deltaOverB.length,
    deltaOverB: d.deltaOverB,
    curves: d.curves.map((c) => ({
      label: c.label,
      symbol: c.irrep,
      S: 0,
      irrep: c.irrep,
      parent: c.freeIon,
      strongField: c.strongField,
      values: c.values,
    })),
    crossings: [],
    regions: [{ fromDeltaOverB: 0, toDeltaOverB: d.maxDeltaOverB, S: 0, ground }],
    zetaOverB: d.zetaOverB,
  };
}
