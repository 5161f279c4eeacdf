/**
 * The irreps of a spin–orbit level of dⁿ in the point group of its complex: the characters of the
 * group's operations, acting on space and spin together, over the level's eigenspace, reduced by
 * the group's character table. Odd n gives spinor irreps of the double group in Bethe's Γ notation
 * (Γ7g, Γ4, Γ5+Γ6, …), even n the single-valued irreps of the total state (B2g, E, …). Each
 * operation is taken as the SU(2) element of its proper part whose rotation angle is at most π
 * (spinorRotation), which is the element the tables of characterTables.ts are written for.
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
  /** One operation of each class over the determinants. */
  readonly operations: readonly SparseOperator[];
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

/**
 * ⟨D′|R|D⟩ over the block for an operation given by its 3×3 matrix: the spinor rotation of its
 * proper part on every electron. rotateDeterminants gives the real part only; the imaginary part
 * is the real part for U·e^{−iπ/2n}, as R scales by e^{−iπ/2} = −i when each of the n electrons
 * gets that phase.
 */
function operationOnDeterminants(block: BasisBlock, n: number, matrix: readonly number[], det: number) {
  const u = spinorRotation(matrix.map((x) => det * x));
  const c = Math.cos(-Math.PI / (2 * n));
  const s = Math.sin(-Math.PI / (2 * n));
  const turned = u.map((row) => row.map((x) => ({ re: x.re * c - x.im * s, im: x.re * s + x.im * c })));
  const size = block.masks.length;
  return sparse(rotateDeterminants(block, u, 10), rotateDeterminants(block, turned, 10), size);
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
  const operations = table.representatives.map((i) => {
    const op = group.operations[i];
    if (!op) throw new Error(`point group ${group.name}: no operation ${i}`);
    return operationOnDeterminants(block, n, op.matrix, op.det);
  });
  return { group: group.name, table, irreps, operations };
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
 * The real characters of the group's classes over the space spanned by orthonormal `vectors`
 * (each entered `copies` times, as the embedded real form of odd n gives each state twice).
 */
export function spaceCharacters(
  symmetry: SpinOrbitSymmetry,
  vectors: readonly ComplexVector[],
  copies = 1,
): number[] {
  return symmetry.operations.map((op) => vectors.reduce((s, z) => s + expectation(op, z), 0) / copies);
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
