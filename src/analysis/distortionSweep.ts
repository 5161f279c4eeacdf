/**
 * Levels of dⁿ along a distortion coordinate (e.g. the axial-to-equatorial eσ ratio from 1,
 * octahedral, to 0, square planar), labelled in the group that the whole path keeps (taken at its
 * midpoint), so that each curve is one level: levels of one spin and irrep never cross, so the
 * k-th level of a symbol is the same curve all along.
 */

import { ensure } from '../core/errors.js';
import { type FieldSpec, fieldOf, groupOf, idealised, symmetrised } from '../field/distortedComplex.js';
import { solveField, symmetryContext } from '../field/lowSymmetrySolver.js';

/** Input of {@link distortionSweep}. Energies in cm⁻¹. */
export interface DistortionSweepInput {
  readonly n: number;
  readonly B: number;
  readonly C: number;
  /** The field at coordinate x. */
  readonly fieldAt: (x: number) => FieldSpec;
  readonly from: number;
  readonly to: number;
  /** What x is, for axis titles and column heads. */
  readonly coordinate: string;
  /** Number of intervals. @default DEFAULT_SWEEP_STEPS */
  readonly steps?: number;
  /** Called after each point with the points done and the total. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** One level followed along the path. */
export interface DistortionCurve {
  readonly label: string;
  readonly S: number;
  /** Same spin as the ground level at the start of the path. */
  readonly spinAllowed: boolean;
  /** Energy above the ground level at each point, cm⁻¹. */
  readonly energies: readonly number[];
}

/** Levels along a distortion. */
export interface DistortionSweep {
  readonly n: number;
  readonly B: number;
  readonly C: number;
  readonly coordinate: string;
  readonly x: readonly number[];
  readonly group: string;
  /** The ground level's label at each point. */
  readonly ground: readonly string[];
  readonly curves: readonly DistortionCurve[];
}

/** Default number of intervals of a sweep. */
export const DEFAULT_SWEEP_STEPS = 50;

/** Most intervals accepted. */
export const MAX_SWEEP_STEPS = 1000;

/**
 * The levels along x from `from` to `to`.
 * @throws InputError for a bad step count or bad field parameters at some point.
 */
export function distortionSweep(input: DistortionSweepInput): DistortionSweep {
  const { n, B, C, from, to } = input;
  const steps = input.steps ?? DEFAULT_SWEEP_STEPS;
  ensure(
    Number.isInteger(steps) && steps >= 1 && steps <= MAX_SWEEP_STEPS,
    `steps ${steps}: expected a whole number from 1 to ${MAX_SWEEP_STEPS}`,
  );
  ensure(
    Number.isFinite(from) && Number.isFinite(to) && from !== to,
    `distortion range ${from} to ${to}: expected two different numbers`,
  );
  const group = groupOf(input.fieldAt((from + to) / 2));
  const symmetry = symmetryContext(n, group);
  const x = Array.from({ length: steps + 1 }, (_, i) => from + ((to - from) * i) / steps);
  const series = new Map<string, { S: number; energies: number[] }>();
  const ground: string[] = [];
  let groundS = 0;
  x.forEach((xi, i) => {
    const r = solveField(
      { n, field: symmetrised(fieldOf(idealised(input.fieldAt(xi))), group), B, C },
      { symmetry },
    );
    if (i === 0) groundS = r.ground.S;
    ground.push(r.ground.label);
    for (const level of r.levels) {
      const s = series.get(level.label) ?? {
        S: level.S,
        energies: new Array<number>(x.length).fill(Number.NaN),
      };
      s.energies[i] = level.energy;
      series.set(level.label, s);
    }
    input.onProgress?.(i + 1, x.length);
  });
  const curves = [...series].map(([label, s]) => ({
    label,
    S: s.S,
    spinAllowed: s.S === groundS,
    energies: s.energies,
  }));
  return { n, B, C, coordinate: input.coordinate, x, group: group.name, ground, curves };
}

/** The sweep as CSV: one row per point, x then each level's energy (cm⁻¹ above the ground). */
export function distortionCsv(sweep: DistortionSweep): string {
  const head = [sweep.coordinate, ...sweep.curves.map((c) => c.label)].map(csvField).join(',');
  const rows = sweep.x.map((x, i) =>
    [x, ...sweep.curves.map((c) => c.energies[i] ?? Number.NaN)]
      .map((v) => (Number.isFinite(v) ? Number(v.toFixed(3)) : ''))
      .join(','),
  );
  return `${[head, ...rows].join('\n')}\n`;
}

function csvField(text: string): string {
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
