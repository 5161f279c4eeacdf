import type { FieldParameters } from '../analysis/bandModel.js';
import { ensure } from '../core/errors.js';
import { type CubicCurve, cubicCurves } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';

/**
 * The coarse scan behind the fit's starting values: the classical band-ratio method (ratios of
 * band energies depend only on Δ/B at fixed C/B — Tanabe & Sugano, J. Phys. Soc. Japan 9, 753,
 * 1954; Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984) generalised to every dⁿ by
 * running the exact solver along Δ/B. Every energy of H = B·H_B + C·H_C + Dq·V is homogeneous of
 * degree one in (Dq, B, C), so along a ray of fixed Δ/B and C/B all band energies are one
 * profile times B; the scan stores that profile, and any set of observed bands then gets its
 * best B at each Δ/B in closed form.
 */

/** Defaults of {@link ScanOptions}. */
export const SCAN_DEFAULTS = { minDeltaOverB: 0.5, maxDeltaOverB: 80, points: 48 } as const;

/** Options of {@link ratioScan}. */
export interface ScanOptions {
  /** Smallest Δ/B = 10Dq/B scanned. @default 0.5 */
  readonly minDeltaOverB?: number;
  /** Largest Δ/B scanned (strong-field cyanides reach about 75). @default 80 */
  readonly maxDeltaOverB?: number;
  /** Number of scan points, spaced evenly in log(Δ/B). @default 48 */
  readonly points?: number;
}

/** One level at a scan point, with its energy per unit of the scale parameter. */
export interface ScanLevel {
  /** Identity key: symbol and rank among the levels of that symbol, e.g. `4T1g#1` (as `levelKeys` in analysis/bandModel.ts). */
  readonly key: string;
  readonly label: string;
  readonly S: number;
  /** Energy above the ground state divided by the scale parameter (B, or Dq for d¹/d⁹). */
  readonly energy: number;
  /** Same spin as this point's ground state. */
  readonly spinAllowed: boolean;
}

/** One ray of the scan. */
export interface ScanPoint {
  /** Dq, B and C per unit of the scale parameter: the actual parameters are scale × these. */
  readonly direction: FieldParameters;
  /** Δ/B on this ray; null for d¹ and d⁹, which have no B. */
  readonly deltaOverB: number | null;
  readonly ground: ScanLevel;
  /** Every other level, by energy. */
  readonly excited: readonly ScanLevel[];
}

/** The scan of one dⁿ, geometry and C/B. */
export interface RatioScan {
  readonly n: number;
  readonly geometry: Geometry;
  readonly cOverB: number;
  /** The parameter fitted in closed form along each ray. */
  readonly scale: 'B' | 'dq';
  readonly minDeltaOverB: number;
  readonly maxDeltaOverB: number;
  readonly points: readonly ScanPoint[];
}

const memo = new Map<string, RatioScan>();
const MEMO_SIZE = 32;

/** Whether dⁿ has a single term (d¹, d⁹), so that only Dq matters. */
export function singleTerm(n: number): boolean {
  return n === 1 || n === 9;
}

/**
 * The levels along Δ/B at fixed C/B (for d¹ and d⁹ a single ray, energies per unit Dq).
 * Results are kept for reuse: the scan depends only on its arguments.
 * @throws InputError for a bad range or C/B.
 */
export function ratioScan(
  n: number,
  geometry: Geometry,
  cOverB: number,
  options: ScanOptions = {},
): RatioScan {
  const { minDeltaOverB, maxDeltaOverB, points } = { ...SCAN_DEFAULTS, ...options };
  ensure(
    minDeltaOverB > 0 && maxDeltaOverB > minDeltaOverB,
    `Δ/B scan range ${minDeltaOverB}…${maxDeltaOverB}: expected 0 < smallest < largest`,
  );
  ensure(Number.isInteger(points) && points >= 2, `scan points ${points}: expected a whole number ≥ 2`);
  ensure(Number.isFinite(cOverB) && cOverB > 0, `C/B = ${cOverB}: expected a positive number`);
  const key = `${n}:${geometry}:${cOverB}:${minDeltaOverB}:${maxDeltaOverB}:${points}`;
  const hit = memo.get(key);
  if (hit) return hit;
  const single = singleTerm(n);
  const directions: { direction: FieldParameters; deltaOverB: number | null }[] = single
    ? [{ direction: { dq: 1, B: 0, C: 0 }, deltaOverB: null }]
    : Array.from({ length: points }, (_, i) => {
        const x = minDeltaOverB * (maxDeltaOverB / minDeltaOverB) ** (i / (points - 1));
        return { direction: { dq: x / 10, B: 1, C: cOverB }, deltaOverB: x };
      });
  // Along the scan only Dq changes: the sweep's fast path gives every level's energy, by label.
  const { B, C } = directions[0]?.direction ?? { B: 1, C: cOverB };
  const sign = geometry === 'oct' ? 1 : -1;
  const curves = cubicCurves(
    n,
    directions.map(({ direction }) => sign * direction.dq),
    B,
    C,
    geometry,
  );
  const keys = curveKeys(curves);
  const scan: RatioScan = {
    n,
    geometry,
    cOverB,
    scale: single ? 'dq' : 'B',
    minDeltaOverB,
    maxDeltaOverB,
    points: directions.map(({ direction, deltaOverB }, i) => {
      const byEnergy = curves
        .map((c, j) => ({ key: keys[j] ?? '', label: c.label, S: c.S, energy: c.energies[i] as number }))
        .sort((a, b) => a.energy - b.energy);
      const groundS = byEnergy[0]?.S;
      const [ground, ...excited] = byEnergy.map((l) => ({ ...l, spinAllowed: l.S === groundS }));
      if (!ground) throw new Error(`no levels for d${n}`);
      return { direction, deltaOverB, ground, excited };
    }),
  };
  if (memo.size >= MEMO_SIZE) memo.delete(memo.keys().next().value ?? '');
  memo.set(key, scan);
  return scan;
}

/**
 * Identity keys of the curves (as `levelKeys` in analysis/bandModel.ts gives them for a solved point): the curves
 * of one symbol come in rank order, and levels of one symbol never cross.
 */
function curveKeys(curves: readonly CubicCurve[]): string[] {
  const seen = new Map<string, number>();
  return curves.map((c) => {
    const rank = seen.get(c.symbol) ?? 0;
    seen.set(c.symbol, rank + 1);
    return `${c.symbol}#${rank}`;
  });
}
