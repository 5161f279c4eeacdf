/**
 * The cubic parent of a lower-symmetry field: the cubic field nearest to it (least squares over
 * the 5×5 matrix, among cube orientations suggested by the group's axes and the ligand
 * directions), and, for each level of the distorted ion, the cubic level its eigenvectors lie in
 * most (the descent in symmetry followed by the states themselves, not by a table). For small
 * distortions the weight is near 1; a low weight says the cubic name no longer describes it.
 */

import type { Ligand } from './angularOverlap.js';
import { rotatedCubicField, trigonalFrame } from './axialFields.js';
import { cubicLevels } from './cubic.js';
import type { Geometry } from './labels.js';
import {
  aboveGround,
  type CubicParent,
  type Eigenspace,
  type FieldInput,
  fieldEigenspaces,
} from './lowSymmetrySolver.js';
import type { PointGroup } from './pointGroups.js';
import { cross, dot, type Mat3, transpose3, unit, type Vec3 } from './realOrbitals.js';

/** The nearest cubic field. */
export interface CubicReference {
  /** Dq with the octahedral sign (negative: a tetrahedral-like field, e below t₂). */
  readonly dq: number;
  /** Rows: the cube's x, y, z axes in the frame of the ligands. */
  readonly axes: Mat3;
  /** ‖V − V_cubic‖ / ‖V‖ over the traceless parts: 0 for a cubic field. */
  readonly misfit: number;
  /** The cubic field itself, over the real orbitals. */
  readonly field: Float64Array;
}

function traceless(v: Float64Array): Float64Array {
  const mean = ((v[0] ?? 0) + (v[6] ?? 0) + (v[12] ?? 0) + (v[18] ?? 0) + (v[24] ?? 0)) / 5;
  return v.map((x, k) => (k % 6 === 0 ? x - mean : x));
}

function inner(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < 25; k++) s += (a[k] ?? 0) * (b[k] ?? 0);
  return s;
}

/** An orthonormal frame (rows) with its first two axes along u and (v made perpendicular to u). */
function frameFrom(u: Vec3, v: Vec3): number[] | undefined {
  const e1 = unit(u);
  const along = dot(v, e1);
  const p: Vec3 = [v[0] - along * e1[0], v[1] - along * e1[1], v[2] - along * e1[2]];
  if (Math.hypot(p[0], p[1], p[2]) < 1e-6) return undefined;
  const e2 = unit(p);
  return [...e1, ...e2, ...cross(e1, e2)];
}

function candidateFrames(group: PointGroup | undefined, ligands: readonly Ligand[]): number[][] {
  const out: number[][] = [[1, 0, 0, 0, 1, 0, 0, 0, 1]];
  const push = (f: number[] | undefined) => {
    if (f) out.push(f);
  };
  if (group) {
    const z = group.zAxis;
    const x = group.xAxis;
    const y = cross(z, x);
    push(frameFrom(x, y));
    const s = Math.SQRT1_2;
    push(frameFrom([s * (x[0] + y[0]), s * (x[1] + y[1]), s * (x[2] + y[2])], z));
    // A cube with its [111] along the threefold axis: the trigonal frame's rows in the group frame.
    const t = trigonalFrame();
    for (const sign of [1, -1]) {
      const gx: Vec3 = [sign * x[0], sign * x[1], sign * x[2]];
      const gy = cross(z, gx);
      const rows: number[] = [];
      for (let c = 0; c < 3; c++) {
        // Cube axis c in trigonal coordinates is column c of t; carry it into the group frame.
        const a = t[c] ?? 0;
        const b = t[3 + c] ?? 0;
        const d = t[6 + c] ?? 0;
        rows.push(
          a * gx[0] + b * gy[0] + d * z[0],
          a * gx[1] + b * gy[1] + d * z[1],
          a * gx[2] + b * gy[2] + d * z[2],
        );
      }
      out.push(rows);
    }
  }
  const dirs = ligands.map((l) => unit(l.direction));
  dirs.forEach((a, i) => {
    for (const b of dirs.slice(i + 1)) {
      push(frameFrom(a, b));
      push(frameFrom([a[0] + b[0], a[1] + b[1], a[2] + b[2]], [a[0] - b[0], a[1] - b[1], a[2] - b[2]]));
    }
  });
  return out;
}

/** The cubic field nearest to `field`, over cube orientations from the group and the ligands. */
export function cubicReference(
  field: Float64Array,
  ligands: readonly Ligand[],
  group?: PointGroup,
): CubicReference {
  const target = traceless(field);
  const norm = Math.sqrt(inner(target, target));
  let best: CubicReference | undefined;
  for (const axes of candidateFrames(group, ligands)) {
    // The frame's rows are the cube axes; the field of a cube so turned is T(Rᵀ) V_cubic T(Rᵀ)ᵀ.
    const unitField = rotatedCubicField(1, transpose3(axes));
    const dq = inner(target, unitField) / inner(unitField, unitField);
    const cubic = unitField.map((x) => dq * x);
    const rest = target.map((x, k) => x - (cubic[k] ?? 0));
    const misfit = norm > 0 ? Math.sqrt(inner(rest, rest)) / norm : 0;
    if (!best || misfit < best.misfit - 1e-12) best = { dq, axes, misfit, field: cubic };
  }
  if (!best) throw new Error('cubic parent: no frame to try');
  return best;
}

/** The labelled cubic eigenspaces for the cubic reference at the same B and C. */
function cubicSpaces(input: FieldInput, reference: CubicReference): { space: Eigenspace; label: string }[] {
  const spaces = fieldEigenspaces({ ...input, field: reference.field });
  const geometry: Geometry = reference.dq >= 0 ? 'oct' : 'tet';
  const cubic = cubicLevels(input.n, reference.dq, input.B, input.C, geometry);
  const { above, tol } = aboveGround(spaces.map((s) => s.energy));
  return spaces.map((space, i) => {
    const e = above[i] ?? 0;
    const names = cubic.levels
      .filter((l) => l.S === space.S && Math.abs(l.energy - e) <= tol)
      .map((l) => l.label);
    return { space, label: names.length > 0 ? names.join('+') : '?' };
  });
}

/**
 * The cubic parent of each eigenspace of a distorted field (in the order of
 * {@link fieldEigenspaces}); undefined where the cubic field is too weak to name levels (|Dq| below
 * 1 cm⁻¹).
 */
export function cubicParents(
  input: FieldInput,
  spaces: readonly Eigenspace[],
  reference: CubicReference,
): (CubicParent | undefined)[] {
  if (Math.abs(reference.dq) < 1) return spaces.map(() => undefined);
  const cubic = cubicSpaces(input, reference);
  return spaces.map((space) => {
    let best: CubicParent | undefined;
    for (const c of cubic) {
      if (c.space.S !== space.S) continue;
      let w = 0;
      for (const v of space.vectors) {
        for (const u of c.space.vectors) {
          const x = dot3n(v, u);
          w += x * x;
        }
      }
      w /= space.vectors.length;
      if (!best || w > best.weight) best = { label: c.label, weight: w };
    }
    return best;
  });
}

function dot3n(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] ?? 0) * (b[i] ?? 0);
  return s;
}
