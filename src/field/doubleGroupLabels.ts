/**
 * The irreps of a spin–orbit level of dⁿ in the point group of its complex: the characters of the
 * group's operations, acting on space and spin together, over the level's eigenspace, reduced by
 * the group's character table. Odd n gives spinor irreps of the double group in Bethe's Γ notation
 * (Γ7g, Γ4, Γ5+Γ6, …), even n the single-valued irreps of the total state (B2g, E, …). Each
 * operation is taken as the SU(2) element of its proper part whose rotation angle is at most π
 * (spinorRotation), which is the element the tables of characterTables.ts are written for.
 * The states are first turned into the group's standard frame (principal axis z, reference axis
 * x), where every operation but the cubic threefold ones maps a determinant onto one determinant
 * (rotations about z are diagonal over |m_l m_s⟩, twofold ones about axes in the xy plane send m
 * to −m), so one dense rotation of the states replaces one per class. Conjugation keeps the trace
 * of the SU(2) element, so the element chosen in the frame is the one chosen outside it.
 */

import { rotateDeterminants } from '../atom/determinantRotation.js';
import type { BasisBlock } from '../atom/operators.js';
import {
  type GroupCharacters,
  type GroupIrrep,
  groupCharacters,
  reduceRepresentation,
} from './characterTables.js';
import { spinorRotation } from './doubleGroup.js';
import type { PointGroup } from './pointGroups.js';
import { cross, dot } from './realOrbitals.js';

/** A state over the determinants: real and imaginary parts of its coefficients. */
export interface ComplexVector {
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/** A sparse complex matrix by rows: the nonzero entries of each row with their columns. */
interface SparseOperator {
  readonly columns: readonly Int32Array[];
  readonly re: readonly Float64Array[];
  readonly im: readonly Float64Array[];
}

/** A point group's operations on all determinants of dⁿ, prepared for labelling many levels. */
export interface SpinOrbitSymmetry {
  /** Schoenflies name of the group. */
  readonly group: string;
  readonly table: GroupCharacters;
  /** The irreps the levels reduce to: spinor irreps for odd n, single-valued ones for even n. */
  readonly irreps: readonly GroupIrrep[];
  /** One operation of each class over the determinants, in the standard frame. */
  readonly operations: readonly SparseOperator[];
  /** The rotation into the standard frame over the determinants (N×N, re and im), or null where the frames agree. */
  readonly frame: { readonly re: Float64Array; readonly im: Float64Array } | null;
}

/** Entries smaller than this are dropped from an operation's matrix (they are rounding). */
const SPARSE_CUTOFF = 1e-13;

function sparse(re: Float64Array, im: Float64Array, size: number): SparseOperator {
  const columns: Int32Array[] = [];
  const res: Float64Array[] = [];
  const ims: Float64Array[] = [];
  for (let i = 0; i < size; i++) {
    const cols: number[] = [];
    for (let j = 0; j < size; j++) {
      const k = i * size + j;
      if (Math.abs(re[k] as number) > SPARSE_CUTOFF || Math.abs(im[k] as number) > SPARSE_CUTOFF)
        cols.push(j);
    }
    columns.push(Int32Array.from(cols));
    res.push(Float64Array.from(cols, (j) => re[i * size + j] as number));
    ims.push(Float64Array.from(cols, (j) => im[i * size + j] as number));
  }
  return { columns, re: res, im: ims };
}

/** Entries of a one-electron matrix smaller than this are rounding of a zero (cos π/2 and the like). */
const ONE_ELECTRON_CUTOFF = 1e-14;

/**
 * ⟨D′|R|D⟩ over the block (re and im, row-major) for a proper rotation given by its 3×3 matrix:
 * its spinor rotation on every electron. rotateDeterminants gives the real part only; the
 * imaginary part is the real part for U·e^{−iπ/2n}, as R scales by e^{−iπ/2} = −i when each of
 * the n electrons gets that phase.
 */
function rotationOnDeterminants(block: BasisBlock, n: number, matrix: readonly number[]) {
  const clean = (x: number) => (Math.abs(x) < ONE_ELECTRON_CUTOFF ? 0 : x);
  const u = spinorRotation(matrix).map((row) => row.map((x) => ({ re: clean(x.re), im: clean(x.im) })));
  const c = Math.cos(-Math.PI / (2 * n));
  const s = Math.sin(-Math.PI / (2 * n));
  const turned = u.map((row) => row.map((x) => ({ re: x.re * c - x.im * s, im: x.re * s + x.im * c })));
  return { re: rotateDeterminants(block, u, 10), im: rotateDeterminants(block, turned, 10) };
}

/** F R Fᵀ for 3×3 row-major matrices. */
function conjugated(f: readonly number[], r: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      let sum = 0;
      for (let a = 0; a < 3; a++)
        for (let b = 0; b < 3; b++) sum += (f[3 * i + a] ?? 0) * (r[3 * a + b] ?? 0) * (f[3 * j + b] ?? 0);
      out.push(sum);
    }
  }
  return out;
}

/** Rows x, y = z × x, z of the group's standard frame: lab coordinates to the frame's, a proper rotation. */
export function standardFrame(group: PointGroup): number[] {
  return [...group.xAxis, ...cross(group.zAxis, group.xAxis), ...group.zAxis];
}

/** The order of the group's highest rotation about z, counting the proper parts of S_n and σh. */
export function principalOrder(group: PointGroup): number {
  let order = 1;
  for (const op of group.operations) {
    if (Math.abs(dot(op.axis, group.zAxis)) > 1 - 1e-6) order = Math.max(order, op.order);
  }
  return order;
}

/**
 * The operations of a point group on all determinants of dⁿ (the `block`), or undefined where the
 * group has no table here (for odd n: no spinor table).
 */
export function spinOrbitSymmetry(
  block: BasisBlock,
  n: number,
  group: PointGroup,
): SpinOrbitSymmetry | undefined {
  const table = groupCharacters(group);
  if (!table) return undefined;
  const irreps = n % 2 === 1 ? table.spinors : table.irreps;
  if (irreps.length === 0) return undefined;
  const f = standardFrame(group);
  const size = block.masks.length;
  const operations = table.representatives.map((i) => {
    const op = group.operations[i];
    if (!op) throw new Error(`point group ${group.name}: no operation ${i}`);
    const m = rotationOnDeterminants(
      block,
      n,
      conjugated(
        f,
        op.matrix.map((x) => op.det * x),
      ),
    );
    return sparse(m.re, m.im, size);
  });
  const identity = f.every((x, k) => Math.abs(x - (k % 4 === 0 ? 1 : 0)) < 1e-12);
  const frame = identity ? null : rotationOnDeterminants(block, n, f);
  return { group: group.name, table, irreps, operations, frame };
}

/** The state turned into the standard frame: w = D(F) z. */
function inFrame(symmetry: SpinOrbitSymmetry, z: ComplexVector): ComplexVector {
  const { frame } = symmetry;
  if (!frame) return z;
  const size = z.re.length;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  for (let i = 0; i < size; i++) {
    let wr = 0;
    let wi = 0;
    const offset = i * size;
    for (let j = 0; j < size; j++) {
      const fr = frame.re[offset + j] as number;
      const fi = frame.im[offset + j] as number;
      const xr = z.re[j] as number;
      const xi = z.im[j] as number;
      wr += fr * xr - fi * xi;
      wi += fr * xi + fi * xr;
    }
    re[i] = wr;
    im[i] = wi;
  }
  return { re, im };
}

/** Re⟨z|R|z⟩ for a sparse R. */
function expectation(op: SparseOperator, z: ComplexVector): number {
  let sum = 0;
  op.columns.forEach((cols, i) => {
    const zr = z.re[i] as number;
    const zi = z.im[i] as number;
    if (zr === 0 && zi === 0) return;
    const re = op.re[i] as Float64Array;
    const im = op.im[i] as Float64Array;
    let wr = 0;
    let wi = 0;
    for (let k = 0; k < cols.length; k++) {
      const j = cols[k] as number;
      const xr = z.re[j] as number;
      const xi = z.im[j] as number;
      wr += (re[k] as number) * xr - (im[k] as number) * xi;
      wi += (re[k] as number) * xi + (im[k] as number) * xr;
    }
    sum += zr * wr + zi * wi;
  });
  return sum;
}

/**
 * The real characters of the group's classes over the space spanned by orthonormal `vectors`,
 * given over the lab frame's determinants or (`standard`) already over the group's frame's.
 */
export function spaceCharacters(
  symmetry: SpinOrbitSymmetry,
  vectors: readonly ComplexVector[],
  frame: 'lab' | 'standard' = 'lab',
): number[] {
  const turned = frame === 'lab' ? vectors.map((z) => inFrame(symmetry, z)) : vectors;
  return symmetry.operations.map((op) => turned.reduce((s, w) => s + expectation(op, w), 0));
}

/**
 * The label of a level from its characters: its irreps joined by `+` (`Γ7g`; `Γ6+Γ7` where two
 * levels fall together; a repeated irrep written `2Γ6`), or `?` where the characters are not a sum
 * of irreps (an eigenspace that is not invariant, e.g. an accidental near-degeneracy).
 */
export function levelLabel(symmetry: SpinOrbitSymmetry, chi: readonly number[]): string {
  const counts = reduceRepresentation({ ...symmetry.table, irreps: symmetry.irreps }, chi);
  if (!counts || counts.size === 0) return '?';
  return [...counts].map(([name, count]) => (count > 1 ? `${count}${name}` : name)).join('+');
}
