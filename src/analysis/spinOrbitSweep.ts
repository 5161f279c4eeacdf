/**
 * Correlation-diagram data with spin–orbit coupling: E/B of every double-group level of dⁿ above
 * the ground level as Δ/B goes from 0 to a maximum at fixed C/B and ζ/B. Levels of one
 * double-group irrep never cross (von Neumann & Wigner, Phys. Z. 30, 467, 1929), so the i-th
 * Γ8 from below is one state along the whole sweep; each curve is named by its free-ion level
 * ²ˢ⁺¹L_J at Δ/B = 0 and its main cubic parent at the largest Δ/B. Along the sweep each curve
 * also carries its parent ²ˢ⁺¹Γ by adiabatic correlation: levels of one double-group irrep do not
 * cross as ζ is switched on either, so the k-th Γ8 from below belongs to the k-th Γ8 among the
 * spin–orbit-free levels' splittings (Γ ⊗ D^S) at the same Δ/B. That is the dominant parent away
 * from near-degeneracies and changes where two spin–orbit-free parents cross, which is where their
 * mixing is largest. Solved at B = SWEEP_B and divided by B, as in sweep.ts.
 */
import { freeIonLevels } from '../atom/jLevels.js';
import { ensure } from '../core/errors.js';
import { cubicLevels } from '../field/cubic.js';
import { type DoubleIrrep, spinOrbitSplitting } from '../field/doubleGroup.js';
import type { Geometry } from '../field/labels.js';
import { checkZeta } from '../field/spinOrbit.js';
import {
  type LevelEnergy,
  type SpinOrbitResult,
  spinOrbitEnergies,
  spinOrbitLevels,
} from '../field/spinOrbitSolver.js';
import { type CorrelationDiagram, SWEEP_B, sweepSettings } from './sweep.js';

/** Largest ζ/B a sweep accepts (5d ions reach about 7). */
export const MAX_ZETA_OVER_B = 20;

/** Most points along a sweep at which the curves' parents are worked out (evenly spread). */
export const PARENT_POINTS = 200;

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
  /** Its parent ²ˢ⁺¹Γ along the sweep (adiabatic correlation), one entry where it changes. */
  readonly parents: readonly ParentStretch[];
}

/** A stretch of a curve with one spin–orbit-free parent. */
export interface ParentStretch {
  /** Δ/B from which this parent holds (until the next stretch). */
  readonly fromDeltaOverB: number;
  /** The cubic level, e.g. `3T1g(F)`. */
  readonly parent: string;
  readonly S: number;
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
  const { geometry, cOverB, maxDeltaOverB, points } = sweepSettings(n, options);
  const { zetaOverB } = options;
  ensure(
    Number.isFinite(zetaOverB) && zetaOverB >= 0 && zetaOverB <= MAX_ZETA_OVER_B,
    `ζ/B ${zetaOverB}: expected a number from 0 to ${MAX_ZETA_OVER_B}`,
  );
  const B = SWEEP_B;
  const C = cOverB * B;
  const zeta = zetaOverB * B;
  checkZeta(zeta);
  const sign = geometry === 'oct' ? 1 : -1;
  const xs = Array.from({ length: points }, (_, i) => (maxDeltaOverB * i) / (points - 1));
  const stride = Math.max(1, Math.ceil(points / PARENT_POINTS));
  const values = new Map<string, number[]>();
  const parents = new Map<string, ParentStretch[]>();
  let first: SpinOrbitResult | undefined;
  let last: SpinOrbitResult | undefined;
  xs.forEach((x, i) => {
    const dqOct = (sign * x * B) / 10;
    const ends = i === 0 || i === xs.length - 1;
    // Inside the sweep eigenvalues alone name the levels; the ends need eigenvectors (Δ/B = 0 for
    // the free-ion coincidences, the last point for the parentage that names the curves there).
    const fast = ends ? null : spinOrbitEnergies(n, dqOct, B, C, zeta);
    let levels: readonly LevelEnergy[] | null = fast;
    if (!levels) {
      const r = spinOrbitLevels(n, dqOct, B, C, zeta, geometry, i === xs.length - 1);
      if (i === 0) first = r;
      if (ends) last = r;
      levels = r.levels;
    }
    const rank = new Map<string, number>();
    // At Δ/B = 0 the levels of one term coincide and leave the correlation open: take the next
    // point's. Parents are worked out at every stride-th point only: they change rarely, and the
    // labelled spin–orbit-free solve at every point would add a third to the sweep.
    const dqParents = i === 0 && xs.length > 1 ? (sign * (xs[1] ?? 0) * B) / 10 : dqOct;
    const slots =
      i % stride === 0 || i === xs.length - 1 ? adiabaticParents(n, dqParents, B, C, geometry) : undefined;
    for (const l of levels) {
      const k = (rank.get(l.irrep) ?? 0) + 1;
      rank.set(l.irrep, k);
      const label = `${l.irrep}(${k})`;
      const list = values.get(label) ?? [];
      list.push(l.energy / B);
      values.set(label, list);
      const slot = slots?.get(l.irrep)?.[k - 1];
      const stretches = parents.get(label) ?? [];
      if (slot && stretches.at(-1)?.parent !== slot.parent)
        stretches.push({ fromDeltaOverB: x, parent: slot.parent, S: slot.S });
      parents.set(label, stretches);
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
    parents: parents.get(l.label) ?? [],
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
 * For each double-group irrep, the spin–orbit-free levels' components of that irrep in energy
 * order (each as often as Γ ⊗ D^S holds it): the k-th is the parent of the k-th level of the irrep.
 */
function adiabaticParents(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  geometry: Geometry,
): Map<DoubleIrrep, { parent: string; S: number }[]> {
  const slots = new Map<DoubleIrrep, { parent: string; S: number; energy: number }[]>();
  for (const l of cubicLevels(n, dqOct, B, C, geometry).levels) {
    for (const irrep of spinOrbitSplitting(l.irrep, l.S)) {
      const list = slots.get(irrep) ?? [];
      list.push({ parent: l.label, S: l.S, energy: l.energy });
      slots.set(irrep, list);
    }
  }
  for (const list of slots.values()) list.sort((a, b) => a.energy - b.energy);
  return slots;
}

/** The parent stretch of a curve at Δ/B = x (the last one starting at or before x). */
export function parentAt(curve: SpinOrbitCurve, x: number): ParentStretch | undefined {
  let found = curve.parents[0];
  for (const p of curve.parents) if (p.fromDeltaOverB <= x) found = p;
  return found;
}

/**
 * The diagram in the form of {@link CorrelationDiagram}, for the CSV and figure code of the
 * spin–orbit-free diagram. Spin is no longer a good quantum number, but each curve's parent
 * ²ˢ⁺¹Γ has one: a curve takes the spin of its parent at the largest Δ/B (its label there reads
 * `Γ5 3T1g(F)`), each stretch of it carries its own parent, and the regions and crossings are
 * where the ground level's parent changes spin — so the figure draws curves of spin-allowed
 * parentage strong and the others light, as in the diagram without ζ.
 */
export function spinOrbitAsCorrelation(d: SpinOrbitDiagram): CorrelationDiagram {
  const xs = d.deltaOverB;
  const groundAt = xs.map((_, i) => d.curves.find((c) => c.values[i] === 0) ?? d.curves[0]);
  const groundParent = xs.map((x, i) => {
    const c = groundAt[i];
    return (c && parentAt(c, x)) ?? { fromDeltaOverB: 0, parent: '', S: 0 };
  });
  const crossings: CorrelationDiagram['crossings'][number][] = [];
  for (let i = 1; i < xs.length; i++) {
    const a = groundParent[i - 1];
    const b = groundParent[i];
    if (a && b && a.S !== b.S) {
      crossings.push({
        deltaOverB: ((xs[i - 1] ?? 0) + (xs[i] ?? 0)) / 2,
        from: a.parent,
        to: b.parent,
        fromS: a.S,
        toS: b.S,
      });
    }
  }
  const bounds = [0, ...crossings.map((c) => c.deltaOverB), d.maxDeltaOverB];
  const regions = bounds.slice(1).map((to, r) => {
    const from = bounds[r] ?? 0;
    const at = groundParent[xs.findIndex((x) => x >= (from + to) / 2)] ?? groundParent[0];
    return { fromDeltaOverB: from, toDeltaOverB: to, S: at?.S ?? 0, ground: at?.parent ?? '' };
  });
  return {
    n: d.n,
    geometry: d.geometry,
    cOverB: d.cOverB,
    maxDeltaOverB: d.maxDeltaOverB,
    points: xs.length,
    deltaOverB: xs,
    curves: d.curves.map((c) => {
      const end = c.parents.at(-1);
      return {
        label: c.label,
        symbol: c.irrep,
        S: end?.S ?? 0,
        irrep: c.irrep,
        parent: c.freeIon,
        strongField: c.strongField,
        values: c.values,
        stretches: c.parents,
        caption: end ? `${c.irrep} ${end.parent}` : c.label,
      };
    }),
    crossings,
    regions,
    zetaOverB: d.zetaOverB,
  };
}
