/**
 * The point group of a set of ligands around a metal: every rotation, reflection and improper
 * rotation that maps each ligand onto a ligand of the same kind, found by testing candidate axes
 * and planes built from the ligand directions; the group's name by the usual flowchart (cubic
 * groups by their threefold axes, then the principal axis, perpendicular twofold axes and mirror
 * planes; Cotton, Chemical Applications of Group Theory, 3rd ed., 1990, §3.14); and a standard
 * frame (principal axis z, reference axis x) in which its classes are told apart.
 */

import type { Ligand } from './angularOverlap.js';
import {
  apply3,
  axisRotation,
  compose3,
  cross,
  dot,
  type Mat3,
  reflection,
  unit,
  type Vec3,
} from './realOrbitals.js';

/** One symmetry operation and what kind of operation it is. */
export interface SymmetryOperation {
  /** The 3×3 orthogonal matrix, row-major. */
  readonly matrix: readonly number[];
  /** +1 for a rotation, −1 for a reflection, inversion or improper rotation. */
  readonly det: number;
  /** The rotation order of its proper part P = det·matrix (1 for E and i, 2 for C₂ and σ, …). */
  readonly order: number;
  /** The unit axis of P (for a reflection, the plane's normal); [0, 0, 1] for E and i. */
  readonly axis: Vec3;
}

/** A detected point group. */
export interface PointGroup {
  /** Schoenflies name, e.g. `D4h`. */
  readonly name: string;
  readonly operations: readonly SymmetryOperation[];
  /** The principal axis (z of the standard frame). */
  readonly zAxis: Vec3;
  /** The reference axis (x of the standard frame), perpendicular to zAxis. */
  readonly xAxis: Vec3;
}

/** Default largest distance between a moved ligand direction and its image (unit vectors). */
export const DEFAULT_SYMMETRY_TOLERANCE = 1e-4;

/** Matrices closer than this many tolerances (entry by entry) are one operation. */
const DUPLICATE_FACTOR = 4;

/** Largest symmetry tolerance accepted: distinct operations differ by at least about 0.3 in some entry. */
export const MAX_SYMMETRY_TOLERANCE = 0.05;

/** Ligand count up to which sums of three directions are tried as axes (their number grows as n³). */
const MAX_TRIPLE_LIGANDS = 12;

/** Rotation orders tried for proper and improper axes. */
const ORDERS = [2, 3, 4, 5, 6, 8] as const;

function same(a: Mat3, b: Mat3, tol: number): boolean {
  for (let k = 0; k < 9; k++) if (Math.abs((a[k] ?? 0) - (b[k] ?? 0)) > tol) return false;
  return true;
}

function det3(m: Mat3): number {
  const [a = 0, b = 0, c = 0, d = 0, e = 0, f = 0, g = 0, h = 0, i = 0] = m;
  return a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
}

/** Does the operation map every ligand onto a ligand of the same kind? */
function isSymmetry(m: Mat3, dirs: readonly Vec3[], kinds: readonly string[], tol: number): boolean {
  return dirs.every((d, i) => {
    const img = apply3(m, d);
    return dirs.some(
      (e, j) => kinds[j] === kinds[i] && Math.hypot(img[0] - e[0], img[1] - e[1], img[2] - e[2]) <= tol,
    );
  });
}

/** The kind of a 3×3 orthogonal matrix: det, the order and axis of its proper part. */
export function describeOperation(matrix: Mat3): SymmetryOperation {
  const det = det3(matrix) > 0 ? 1 : -1;
  const p = matrix.map((x) => det * x);
  const trace = (p[0] ?? 0) + (p[4] ?? 0) + (p[8] ?? 0);
  const angle = Math.acos(Math.max(-1, Math.min(1, (trace - 1) / 2)));
  if (angle < 1e-6) return { matrix: [...matrix], det, order: 1, axis: [0, 0, 1] };
  const order = Math.round((2 * Math.PI) / angle);
  let axis: Vec3;
  if (Math.abs(angle - Math.PI) < 1e-6) {
    // P = 2aaᵀ − I: take the largest column of P + I.
    const cols: Vec3[] = [0, 1, 2].map((j) => [
      (p[j] ?? 0) + (j === 0 ? 1 : 0),
      (p[3 + j] ?? 0) + (j === 1 ? 1 : 0),
      (p[6 + j] ?? 0) + (j === 2 ? 1 : 0),
    ]);
    const length = (v: Vec3) => Math.hypot(v[0], v[1], v[2]);
    const best = cols.reduce((a, b) => (length(b) > length(a) ? b : a));
    axis = unit(best);
  } else {
    axis = unit([(p[7] ?? 0) - (p[5] ?? 0), (p[2] ?? 0) - (p[6] ?? 0), (p[3] ?? 0) - (p[1] ?? 0)]);
  }
  return { matrix: [...matrix], det, order, axis };
}

function candidateAxes(dirs: readonly Vec3[]): Vec3[] {
  const raw: Vec3[] = [[0, 0, 1], [1, 0, 0], [0, 1, 0], ...dirs];
  dirs.forEach((a, i) => {
    for (const b of dirs.slice(i + 1)) {
      raw.push([a[0] + b[0], a[1] + b[1], a[2] + b[2]]);
      raw.push([a[0] - b[0], a[1] - b[1], a[2] - b[2]]);
      raw.push(cross(a, b));
    }
  });
  // Threefold axes of a cube or a prism pass through the centre of three ligands.
  if (dirs.length <= MAX_TRIPLE_LIGANDS) {
    dirs.forEach((a, i) => {
      dirs.slice(i + 1).forEach((b, j) => {
        for (const c of dirs.slice(i + j + 2))
          raw.push([a[0] + b[0] + c[0], a[1] + b[1] + c[1], a[2] + b[2] + c[2]]);
      });
    });
  }
  const out: Vec3[] = [];
  for (const v of raw) {
    if (Math.hypot(...v) < 1e-6) continue;
    const u = unit(v);
    if (!out.some((w) => Math.abs(Math.abs(dot(u, w)) - 1) < 1e-9)) out.push(u);
  }
  return out;
}

/**
 * Every symmetry operation of the ligand set (directions from the metal, with kinds).
 * `tolerance` is the largest distance between a moved unit direction and its image.
 */
export function symmetryOperations(
  ligands: readonly Ligand[],
  tolerance = DEFAULT_SYMMETRY_TOLERANCE,
): SymmetryOperation[] {
  const dirs = ligands.map((l) => unit(l.direction));
  const kinds = ligands.map((l) => l.kind);
  const found: number[][] = [[1, 0, 0, 0, 1, 0, 0, 0, 1]];
  // Within a loose tolerance one operation shows up once per nearby candidate axis: keep the first.
  const distinct = Math.max(1e-6, DUPLICATE_FACTOR * tolerance);
  const consider = (m: number[]) => {
    if (isSymmetry(m, dirs, kinds, tolerance) && !found.some((f) => same(f, m, distinct))) found.push(m);
  };
  consider([-1, 0, 0, 0, -1, 0, 0, 0, -1]);
  for (const axis of candidateAxes(dirs)) {
    const mirror = reflection(axis);
    consider(mirror);
    for (const n of ORDERS) {
      for (let k = 1; k < n; k++) {
        const rotation = axisRotation(axis, (2 * Math.PI * k) / n);
        consider(rotation);
        consider(compose3(mirror, rotation));
      }
    }
  }
  return found.map(describeOperation);
}

/** Name and frame of the group of `operations` (see {@link PointGroup}). */
export function identifyGroup(
  operations: readonly SymmetryOperation[],
  ligands: readonly Ligand[],
): PointGroup {
  const dirs = ligands.map((l) => unit(l.direction));
  const proper = operations.filter((o) => o.det === 1);
  const hasInversion = operations.some((o) => o.det === -1 && o.order === 1);
  const c3Count = proper.filter((o) => o.order === 3).length;
  const base = { operations };
  if (c3Count >= 8) {
    const name =
      operations.length === 48
        ? 'Oh'
        : operations.length === 24
          ? hasInversion
            ? 'Th'
            : proper.length === 24
              ? 'O'
              : 'Td'
          : 'T';
    return { ...base, name, ...cubicFrame(operations) };
  }
  const zAxis = principalAxis(operations, dirs);
  const n = Math.max(1, ...proper.filter((o) => parallel(o.axis, zAxis)).map((o) => o.order));
  const perpendicularC2 = proper.filter((o) => o.order === 2 && perpendicular(o.axis, zAxis)).length;
  const mirrors = operations.filter((o) => o.det === -1 && o.order === 2);
  const sigmaH = mirrors.some((o) => parallel(o.axis, zAxis));
  const sigmaV = mirrors.some((o) => perpendicular(o.axis, zAxis));
  let name: string;
  if (n === 1) name = mirrors.length > 0 ? 'Cs' : hasInversion ? 'Ci' : 'C1';
  else if (perpendicularC2 >= n) name = sigmaH ? `D${n}h` : sigmaV ? `D${n}d` : `D${n}`;
  else if (sigmaH) name = `C${n}h`;
  else if (sigmaV) name = `C${n}v`;
  else if (operations.length === 2 * n) name = `S${2 * n}`;
  else name = `C${n}`;
  return { ...base, name, zAxis, xAxis: referenceAxis(operations, dirs, zAxis) };
}

/** Rounds of averaging in {@link idealisedLigands}; each roughly squares the remaining asymmetry. */
const IDEALISE_ROUNDS = 8;

/**
 * The ligands moved onto the nearest arrangement with the symmetry found within `tolerance`:
 * each direction replaced by the average of its images carried back by every operation found,
 * (1/|G|) Σ_g g⁻¹ d_{g(i)}, repeated until the operations found are exact. Measured coordinates
 * then get the group they nearly have, with exact degeneracies and labels.
 */
export function idealisedLigands(ligands: readonly Ligand[], tolerance: number): Ligand[] {
  let current = ligands.map((l) => ({ ...l }));
  for (let round = 0; round < IDEALISE_ROUNDS; round++) {
    const ops = symmetryOperations(current, tolerance);
    if (ops.length === 1) return current;
    const dirs = current.map((l) => l.direction);
    let change = 0;
    const next = current.map((l, i) => {
      const sum = [0, 0, 0];
      for (const op of ops) {
        const image = apply3(op.matrix, dirs[i] ?? [0, 0, 1]);
        let best = i;
        let bestDistance = Number.POSITIVE_INFINITY;
        dirs.forEach((d, j) => {
          if (current[j]?.kind !== l.kind) return;
          const dist = Math.hypot(image[0] - d[0], image[1] - d[1], image[2] - d[2]);
          if (dist < bestDistance) {
            bestDistance = dist;
            best = j;
          }
        });
        // gᵀ = g⁻¹ carries the partner's direction back to ligand i.
        const back = apply3(transpose(op.matrix), dirs[best] ?? [0, 0, 1]);
        for (let k = 0; k < 3; k++) sum[k] = (sum[k] ?? 0) + (back[k] ?? 0) / ops.length;
      }
      const d: Vec3 = [sum[0] ?? 0, sum[1] ?? 0, sum[2] ?? 0];
      change = Math.max(
        change,
        Math.hypot(d[0] - l.direction[0], d[1] - l.direction[1], d[2] - l.direction[2]),
      );
      return { ...l, direction: d };
    });
    current = next;
    if (change < 1e-14) break;
  }
  return current;
}

function transpose(m: Mat3): number[] {
  return [0, 3, 6, 1, 4, 7, 2, 5, 8].map((k) => m[k] ?? 0);
}

/** The point group of a ligand set. */
export function pointGroup(ligands: readonly Ligand[], tolerance = DEFAULT_SYMMETRY_TOLERANCE): PointGroup {
  return identifyGroup(symmetryOperations(ligands, tolerance), ligands);
}

function parallel(a: Vec3, b: Vec3): boolean {
  return Math.abs(Math.abs(dot(a, b)) - 1) < 1e-6;
}

function perpendicular(a: Vec3, b: Vec3): boolean {
  return Math.abs(dot(a, b)) < 1e-6;
}

/** Ligands lying on a line through the metal along `axis`. */
function onAxis(axis: Vec3, dirs: readonly Vec3[]): number {
  return dirs.filter((d) => parallel(d, axis)).length;
}

/** Ligands lying in the plane through the metal with normal `normal`. */
function inPlane(normal: Vec3, dirs: readonly Vec3[]): number {
  return dirs.filter((d) => Math.abs(dot(d, normal)) < 1e-6).length;
}

/**
 * The principal axis: that of the highest-order proper part, proper operations first (so the C₂
 * of C2v wins over the axes of its mirrors' proper parts, and S₄ fixes the axis of D2d), then the
 * axis through the most ligands; for Cs the mirror's normal.
 */
function principalAxis(operations: readonly SymmetryOperation[], dirs: readonly Vec3[]): Vec3 {
  const candidates = operations.filter((o) => o.order > 1);
  if (candidates.length === 0) return [0, 0, 1];
  const score = (o: SymmetryOperation) => o.order * 100 + (o.det === 1 ? 50 : 0) + onAxis(o.axis, dirs);
  const best = candidates.reduce((a, b) => (score(b) > score(a) ? b : a));
  return canonicalSign(best.axis);
}

/** The sign of a direction made definite: first non-zero component positive. */
function canonicalSign(v: Vec3): Vec3 {
  const first = v.find((x) => Math.abs(x) > 1e-9) ?? 1;
  return first < 0 ? [-v[0], -v[1], -v[2]] : v;
}

/**
 * The reference axis x ⊥ z: along a perpendicular twofold axis through the most ligands, or, with
 * none, in the vertical mirror plane holding the most ligands, or towards the first ligand off z.
 */
function referenceAxis(operations: readonly SymmetryOperation[], dirs: readonly Vec3[], z: Vec3): Vec3 {
  const twofold = operations.filter((o) => o.det === 1 && o.order === 2 && perpendicular(o.axis, z));
  if (twofold.length > 0) {
    const best = twofold.reduce((a, b) => (onAxis(b.axis, dirs) > onAxis(a.axis, dirs) ? b : a));
    return canonicalSign(best.axis);
  }
  const vertical = operations.filter((o) => o.det === -1 && o.order === 2 && perpendicular(o.axis, z));
  if (vertical.length > 0) {
    const best = vertical.reduce((a, b) => (inPlane(b.axis, dirs) > inPlane(a.axis, dirs) ? b : a));
    return canonicalSign(unit(cross(best.axis, z)));
  }
  for (const d of dirs) {
    const p: Vec3 = [d[0] - dot(d, z) * z[0], d[1] - dot(d, z) * z[1], d[2] - dot(d, z) * z[2]];
    if (Math.hypot(...p) > 1e-6) return unit(p);
  }
  return unit(Math.abs(z[0]) < 0.9 ? cross(z, [1, 0, 0]) : cross(z, [0, 1, 0]));
}

/** The frame of a cubic group: z and x along two perpendicular fourfold (S₄ or C₄) axes. */
function cubicFrame(operations: readonly SymmetryOperation[]): { zAxis: Vec3; xAxis: Vec3 } {
  const fourfold = operations.filter((o) => o.order === 4).map((o) => canonicalSign(o.axis));
  const z = fourfold[0] ?? [0, 0, 1];
  const x = fourfold.find((a) => perpendicular(a, z)) ?? [1, 0, 0];
  return { zAxis: z, xAxis: x };
}
