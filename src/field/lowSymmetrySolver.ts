/**
 * Levels of dⁿ in a one-electron field of any symmetry: electron repulsion (Racah B, C) plus the
 * field, diagonalised over the real-orbital determinants of the lowest M_S (0 or ½), which hold
 * one component of every spin multiplet because H conserves S² (no spin–orbit coupling here).
 * S is read from S² within each degenerate eigenspace; the space's irreps in the point group
 * come from the characters of the group's operations acting on it.
 */

import { ensure } from '../core/errors.js';
import { column, resolveSubspace, symmetricEigen } from '../numeric/eigen.js';
import { type GroupCharacters, groupCharacters, reduceRepresentation } from './characterTables.js';
import { MAX_PARAMETER } from './cubic.js';
import type { PointGroup } from './pointGroups.js';
import {
  fieldMatrix,
  operationMatrix,
  type RealDeterminantBlock,
  realDeterminantBlock,
} from './realDeterminants.js';
import { orbitalTransform } from './realOrbitals.js';

/** Input of {@link solveField}. Energies in cm⁻¹. */
export interface FieldInput {
  /** Number of d electrons, 1…9. */
  readonly n: number;
  /** The one-electron field over the real d orbitals xy, yz, z², xz, x²−y² (row-major 5×5, symmetric). */
  readonly field: Float64Array;
  /** Racah B ≥ 0. */
  readonly B: number;
  /** Racah C ≥ 0. */
  readonly C: number;
}

/** One level: a degenerate eigenspace of one spin and one irrep. */
export interface FieldLevel {
  /** ²ˢ⁺¹Γ, e.g. `2B1g`; `2?` where the group has no table or the space is not invariant. */
  readonly symbol: string;
  /** The symbol, with its rank among levels of that symbol where it repeats: `3B1g(2)`. */
  readonly label: string;
  readonly S: number;
  /** Irrep of the point group, or undefined when unlabelled. */
  readonly irrep: string | undefined;
  /** Energy above the ground level, cm⁻¹. */
  readonly energy: number;
  /** Orbital dimension (the irrep's dimension). */
  readonly dimension: number;
  /** (2S + 1) × dimension. */
  readonly degeneracy: number;
  /** Same spin as the ground level. */
  readonly spinAllowed: boolean;
  /** The cubic level it comes from, where a cubic reference was given. */
  readonly cubicParent?: CubicParent;
}

/** A level's cubic parent and the weight of its eigenvectors in that cubic level. */
export interface CubicParent {
  /** Label of the cubic level (e.g. `3T1g(F)`, `4T2`). */
  readonly label: string;
  /** Fraction 0…1 of the level in it. */
  readonly weight: number;
}

/** Options of {@link solveField}. */
export interface SolveFieldOptions {
  /** The point group's operations on the determinants (see {@link symmetryContext}); no labels without. */
  readonly symmetry?: SymmetryContext;
  /** The cubic parent of each eigenspace (see cubicParent.ts); none without. */
  readonly parents?: (spaces: readonly Eigenspace[]) => readonly (CubicParent | undefined)[];
}

/** Levels of dⁿ in a field, lowest first. */
export interface FieldResult {
  readonly n: number;
  readonly B: number;
  readonly C: number;
  /** The point group used for the labels, or undefined when none was given. */
  readonly group: string | undefined;
  readonly ground: FieldLevel;
  readonly levels: readonly FieldLevel[];
}

/** A group's operations on the determinants of one dⁿ, prepared once for many solves. */
export interface SymmetryContext {
  readonly group: PointGroup;
  /** The group's character table, or undefined for a group without one here. */
  readonly table: GroupCharacters | undefined;
  /** Matrix of one operation of each class over the block's determinants (row-major). */
  readonly operations: readonly Float64Array[];
}

/** Energies closer than this (cm⁻¹, plus {@link DEGENERACY_RELATIVE} of the largest) are one level. */
export const DEGENERACY_TOLERANCE = 1e-6;
/** Relative part of the degeneracy tolerance. */
export const DEGENERACY_RELATIVE = 1e-10;

/** A level matches a reference level whose energy lies within this fraction of the span (≥ 1 cm⁻¹). */
const REFERENCE_MATCH_RELATIVE = 1e-6;

/**
 * Each energy above the first (the ground) and the tolerance within which one matches a level of
 * a reference solve: {@link REFERENCE_MATCH_RELATIVE} of the span of the energies, at least of 1 cm⁻¹.
 */
export function aboveGround(energies: readonly number[]): { readonly above: number[]; readonly tol: number } {
  const ground = energies[0] ?? 0;
  let scale = 1;
  for (const e of energies) scale = Math.max(scale, Math.abs(e - ground));
  return { above: energies.map((e) => e - ground), tol: REFERENCE_MATCH_RELATIVE * scale };
}

/** Refuses n outside 1…9, a bad B or C, or a field that is not a finite symmetric 5×5 matrix. */
export function checkFieldInput(input: FieldInput): void {
  const { n, field, B, C } = input;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  ensure(field.length === 25, `field: expected a 5×5 matrix, got ${field.length} entries`);
  for (let i = 0; i < 5; i++) {
    for (let j = 0; j < 5; j++) {
      const a = field[5 * i + j] ?? 0;
      ensure(
        Number.isFinite(a) && Math.abs(a) <= 10 * MAX_PARAMETER,
        `field entry ${a}: expected a finite number of cm⁻¹`,
      );
      ensure(
        Math.abs(a - (field[5 * j + i] ?? 0)) <= 1e-9 * (1 + Math.abs(a)),
        'field: expected a symmetric matrix',
      );
    }
  }
}

/** The block of dⁿ that holds every spin multiplet once: M_S = 0 or ½. */
export function lowestSpinBlock(n: number): RealDeterminantBlock {
  return realDeterminantBlock(n, n % 2);
}

/** Prepares the operations of a point group on the determinants of dⁿ. */
export function symmetryContext(n: number, group: PointGroup): SymmetryContext {
  const block = lowestSpinBlock(n);
  const table = groupCharacters(group);
  const operations = (table?.representatives ?? []).map((i) => {
    const op = group.operations[i];
    if (!op) throw new Error(`point group ${group.name}: no operation ${i}`);
    return operationMatrix(block, orbitalTransform(op.matrix));
  });
  return { group, table, operations };
}

/** H = B·H_B + C·H_C + V over the lowest-M_S block. */
export function fieldHamiltonian(input: FieldInput): { block: RealDeterminantBlock; matrix: Float64Array } {
  const block = lowestSpinBlock(input.n);
  const matrix = fieldMatrix(block, input.field);
  for (let i = 0; i < matrix.length; i++) {
    matrix[i] = (matrix[i] ?? 0) + input.B * (block.partB[i] ?? 0) + input.C * (block.partC[i] ?? 0);
  }
  return { block, matrix };
}

/** A degenerate eigenspace of one spin, with its vectors over the block. */
export interface Eigenspace {
  readonly energy: number;
  readonly S: number;
  readonly vectors: readonly Float64Array[];
}

/** The eigenspaces of H over the lowest-M_S block, lowest first, each of one S. */
export function fieldEigenspaces(input: FieldInput): Eigenspace[] {
  checkFieldInput(input);
  const { block, matrix } = fieldHamiltonian(input);
  const size = block.masks.length;
  const eig = symmetricEigen(matrix, size);
  let scale = 1;
  for (const v of eig.values) scale = Math.max(scale, Math.abs(v));
  const tol = DEGENERACY_TOLERANCE + DEGENERACY_RELATIVE * scale;
  const out: Eigenspace[] = [];
  let start = 0;
  while (start < size) {
    let end = start + 1;
    while (end < size && (eig.values[end] ?? 0) - (eig.values[end - 1] ?? 0) <= tol) end++;
    const vectors: Float64Array[] = [];
    let sum = 0;
    for (let j = start; j < end; j++) {
      vectors.push(column(eig.vectors, size, j));
      sum += eig.values[j] ?? 0;
    }
    const energy = sum / (end - start);
    for (const part of resolveSubspace(vectors, block.spinSquared, 0.25)) {
      const S = Math.round(((-1 + Math.sqrt(1 + 4 * Math.max(0, part.value))) / 2) * 2) / 2;
      out.push({ energy, S, vectors: part.vectors });
    }
    start = end;
  }
  return out;
}

/** vᵀAv for a row-major square A; the hot loop of the labelling, so reads are unchecked. */
function quadraticForm(v: Float64Array, a: Float64Array): number {
  const n = v.length;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const vi = v[i] as number;
    if (vi === 0) continue;
    const offset = i * n;
    let row = 0;
    for (let j = 0; j < n; j++) row += (a[offset + j] as number) * (v[j] as number);
    sum += vi * row;
  }
  return sum;
}

/** Irreps of one eigenspace from the characters of the group's operations on it. */
function eigenspaceIrreps(
  space: Eigenspace,
  symmetry: SymmetryContext | undefined,
): Map<string, number> | undefined {
  if (!symmetry?.table) return undefined;
  const chi = symmetry.operations.map((op) => space.vectors.reduce((s, v) => s + quadraticForm(v, op), 0));
  return reduceRepresentation(symmetry.table, chi);
}

/**
 * Levels of dⁿ in a general one-electron field, labelled in the point group of `symmetry` when
 * given (prepare it once with {@link symmetryContext} for many solves).
 * @throws InputError for n outside 1…9, a negative or non-finite B or C, or a field that is not
 * a finite symmetric 5×5 matrix.
 */
export function solveField(input: FieldInput, options: SolveFieldOptions = {}): FieldResult {
  const { symmetry } = options;
  const spaces = fieldEigenspaces(input);
  const parents = options.parents?.(spaces) ?? [];
  const dims = new Map((symmetry?.table?.irreps ?? []).map((g) => [g.name, g.dimension]));
  const raw: Omit<FieldLevel, 'label' | 'energy' | 'spinAllowed'>[] = [];
  const energies: number[] = [];
  spaces.forEach((space, si) => {
    const parent = parents[si];
    const extra = parent ? { cubicParent: parent } : {};
    const mult = Math.round(2 * space.S + 1);
    const irreps = eigenspaceIrreps(space, symmetry);
    if (irreps && irreps.size > 0) {
      for (const [irrep, count] of irreps) {
        const dimension = dims.get(irrep) ?? 1;
        for (let c = 0; c < count; c++) {
          raw.push({
            symbol: `${mult}${irrep}`,
            S: space.S,
            irrep,
            dimension,
            degeneracy: mult * dimension,
            ...extra,
          });
          energies.push(space.energy);
        }
      }
    } else {
      const dimension = space.vectors.length;
      raw.push({
        symbol: `${mult}?`,
        S: space.S,
        irrep: undefined,
        dimension,
        degeneracy: mult * dimension,
        ...extra,
      });
      energies.push(space.energy);
    }
  });
  const ground = energies[0] ?? 0;
  const total = new Map<string, number>();
  for (const r of raw) total.set(r.symbol, (total.get(r.symbol) ?? 0) + 1);
  const seen = new Map<string, number>();
  const groundS = raw[0]?.S ?? 0;
  const levels: FieldLevel[] = raw.map((r, i) => {
    const k = (seen.get(r.symbol) ?? 0) + 1;
    seen.set(r.symbol, k);
    const label = (total.get(r.symbol) ?? 0) > 1 ? `${r.symbol}(${k})` : r.symbol;
    return { ...r, label, energy: (energies[i] ?? 0) - ground, spinAllowed: r.S === groundS };
  });
  const first = levels[0];
  if (!first) throw new Error(`no levels for d${input.n}`);
  return { n: input.n, B: input.B, C: input.C, group: symmetry?.group.name, ground: first, levels };
}
