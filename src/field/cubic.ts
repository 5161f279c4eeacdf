/**
 * The cubic solver: the levels of dⁿ in an octahedral or tetrahedral field by exact
 * diagonalisation of H = B·H_B + C·H_C + Dq·V, block by block in the symmetry-adapted basis
 * (cubicBasis.ts), each level labelled ²ˢ⁺¹Γ with its parent free-ion term and its strong-field
 * make-up (the method of Tanabe & Sugano, J. Phys. Soc. Japan 9, 753, 1954).
 */

import { freeIonTerms } from '../atom/freeIon.js';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { bilinear, column, congruence, type SymmetricEigen, symmetricEigen } from '../numeric/eigen.js';
import { tridiagonalQlValuesInPlace } from '../numeric/tridiagonalQl.js';
import { type AdaptedBlock, adaptedBlocks } from './cubicBasis.js';
import { configurationText, type Geometry, irrepName, stateSymbol } from './labels.js';
import { branchTerm, CUBIC_IRREPS, type CubicIrrep, decomposeCubic, IRREP_DIMENSION } from './symmetry.js';

/** Input of {@link solveCubic}. Energies in cm⁻¹. */
export interface CubicInput {
  /** Number of d electrons, 1…9. */
  readonly n: number;
  /** Octahedral or tetrahedral field. @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  /** Dq ≥ 0 (10Dq = Δo in Oh, Δt in Td). */
  readonly dq: number;
  /** Racah B ≥ 0. */
  readonly B: number;
  /** Racah C ≥ 0. */
  readonly C: number;
}

/** Weight of one strong-field configuration t₂ᵃeᵇ in a level. */
export interface ConfigurationWeight {
  /** Electrons in the t₂ (t₂g) set. */
  readonly t2: number;
  /** Electrons in the e (e_g) set. */
  readonly e: number;
  /** Plain text, e.g. `t2g^2 eg^1`. */
  readonly text: string;
  /** Fraction of the level's eigenvector, 0…1. */
  readonly weight: number;
}

/** One level of dⁿ in a cubic field, degenerate components merged. */
export interface CubicLevel {
  /**
   * Unique label: the state symbol, followed by its parent term in parentheses wherever the
   * symbol occurs more than once (e.g. `4T1g(F)`, `4T1g(P)`), and by an ordinal where even that
   * repeats (`3T1g(H,1)`, `3T1g(H,2)`).
   */
  readonly label: string;
  /** ²ˢ⁺¹Γ, e.g. `4T1g`. */
  readonly symbol: string;
  readonly S: number;
  /** Irrep with parity in Oh (`T1g`), without in Td (`T1`). */
  readonly irrep: string;
  /** The irrep of the rotation group O. */
  readonly cubicIrrep: CubicIrrep;
  /** Energy above the ground state, cm⁻¹. */
  readonly energy: number;
  /** (2S+1) × dim Γ. */
  readonly degeneracy: number;
  /**
   * The free-ion term this level goes to as Dq → 0 (name as in {@link FreeIonTerm.name}).
   * Levels of one symbol never cross as Dq changes, so the i-th lowest level of a symbol comes
   * from the i-th lowest free-ion term containing that irrep.
   */
  readonly parent: string;
  /** Strong-field make-up, largest weight first. */
  readonly configurations: readonly ConfigurationWeight[];
  /** The largest-weight configuration's text. */
  readonly configuration: string;
  /** Same total spin as the ground state (the spin selection rule). */
  readonly spinAllowed: boolean;
}

/** Levels of dⁿ in a cubic field. */
export interface CubicResult {
  readonly n: number;
  readonly geometry: Geometry;
  readonly dq: number;
  readonly B: number;
  readonly C: number;
  /** The lowest level. */
  readonly ground: CubicLevel;
  /** All levels, by energy. */
  readonly levels: readonly CubicLevel[];
}

/**
 * Levels of dⁿ in an octahedral or tetrahedral field by exact diagonalisation of electron
 * repulsion plus crystal field, each labelled ²ˢ⁺¹Γ with parent term and strong-field make-up.
 * @throws InputError for n outside 1…9 or a negative or non-finite Dq, B or C.
 */
export function solveCubic(input: CubicInput): CubicResult {
  checkCubicInput(input);
  const { n, geometry = DEFAULT_GEOMETRY, dq, B, C } = input;
  return cubicLevels(n, geometry === 'oct' ? dq : -dq, B, C, geometry);
}

/**
 * Refuses n outside 1…9, an unknown geometry, or a negative, non-finite or too large Dq, B or C.
 * @throws InputError naming the value.
 */
export function checkCubicInput(input: CubicInput): void {
  const { n, geometry = DEFAULT_GEOMETRY, dq, B, C } = input;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  ensure(Number.isFinite(dq) && dq >= 0, `Dq = ${dq}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  checkMagnitudes(dq, B, C);
}

/**
 * Largest Dq, B or C accepted, cm⁻¹: far above any ion (Dq of 3d complexes stays below about
 * 5000, B below 1300), yet small enough that the eigenvalues stay accurate.
 */
export const MAX_PARAMETER = 1e6;

/** Refuses a Dq, B or C beyond {@link MAX_PARAMETER}. */
export function checkMagnitudes(dq: number, B: number, C: number): void {
  // Checked at every point of a sweep: the common case returns before building the messages.
  if (Math.abs(dq) <= MAX_PARAMETER && Math.abs(B) <= MAX_PARAMETER && Math.abs(C) <= MAX_PARAMETER) return;
  for (const [name, v] of [
    ['Dq', dq],
    ['Racah B', B],
    ['Racah C', C],
  ] as const) {
    ensure(Math.abs(v) <= MAX_PARAMETER, `${name} = ${v}: expected at most ${MAX_PARAMETER} cm⁻¹`);
  }
}

interface RawLevel {
  S: number;
  irrep: CubicIrrep;
  energy: number;
  weights: readonly number[];
}

/**
 * The levels for a signed, octahedral-convention Dq (a tetrahedral field is a negative one),
 * named for `geometry`: each symmetry-adapted block (k, S, C₂′ parity) is diagonalised, equal
 * eigenvalues across blocks are gathered into degenerate levels, and each level's irrep is read
 * from how its components fall into the blocks.
 *
 * With `vectors` false (sweeps that need energies and labels alone) the blocks are diagonalised
 * for their eigenvalues only — the very same numbers — and the levels carry no strong-field
 * make-up (`configurations` empty); where the C₃ trace must settle a label, it is read from the
 * block's parts of one C₃ eigenvalue (eigenvalues again, no vectors; see {@link c3TraceByParts}).
 */
export function cubicLevels(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  geometry: Geometry,
  vectors = true,
): CubicResult {
  checkMagnitudes(dqOct, B, C);
  const ws = workspaceOf(n);
  const { blocks, values, blockOf, jOf, order } = ws;
  const eigs: (SymmetricEigen | undefined)[] = blocks.map((block, bi) => {
    const m = block.size;
    const own = ws.blockValues[bi] as Float64Array;
    if (vectors || m < 2) {
      const eig = symmetricEigen(blockMatrix(block, dqOct, B, C), m);
      own.set(eig.values);
      return eig;
    }
    const vt = ws.scratch[bi] as Float64Array;
    blockMatrixTransposed(block, dqOct, B, C, vt);
    tridiagonalQlValuesInPlace(vt, m, own, ws.e);
    return undefined;
  });
  ws.call++;
  sortByValue(values, order);
  let scale = 1;
  for (let i = 0; i < values.length; i++) scale = Math.max(scale, Math.abs(values[i] as number));
  const tol = 1e-8 * scale;
  const raw: RawLevel[] = [];
  const total = order.length;
  for (let start = 0; start < total; ) {
    // One run of values within tol of their neighbours: a degenerate level (or several spins).
    let end = start + 1;
    while (
      end < total &&
      (values[order[end] as number] as number) - (values[order[end - 1] as number] as number) <= tol
    )
      end++;
    let sum = 0;
    for (let r = start; r < end; r++) sum += values[order[r] as number] as number;
    const energy = sum / (end - start);
    for (const S of spinsOf(blocks, blockOf, order, start, end)) {
      const items: number[] = [];
      for (let r = start; r < end; r++) {
        const i = order[r] as number;
        if ((blocks[blockOf[i] as number] as AdaptedBlock).S === S) items.push(i);
      }
      const counts: [number, number, number] = [0, 0, 0];
      for (const i of items) {
        const k = (blocks[blockOf[i] as number] as AdaptedBlock).k;
        counts[k] = (counts[k] as number) + 1;
      }
      const decomposition = decomposeCubic(
        counts,
        () => items.reduce((p, i) => p + (blocks[blockOf[i] as number] as AdaptedBlock).parity, 0),
        () => (vectors ? c3TraceByVectors(items, ws, eigs) : c3TraceByParts(items, ws, dqOct, B, C)),
      );
      const weights = vectors ? configurationWeights(items, blocks, blockOf, jOf, eigs) : NO_WEIGHTS;
      for (const irrep of CUBIC_IRREPS) {
        for (let c = 0; c < decomposition[irrep]; c++) raw.push({ S, irrep, energy, weights });
      }
    }
    start = end;
  }
  return finish(n, dqOct, B, C, geometry, raw);
}

/** Trace of the C₃ class sum over the k = 0 components of one cluster, from the blocks' eigenvectors. */
function c3TraceByVectors(
  items: readonly number[],
  ws: Workspace,
  eigs: readonly (SymmetricEigen | undefined)[],
): number {
  let trace = 0;
  for (const i of items) {
    const bi = ws.blockOf[i] as number;
    const block = ws.blocks[bi];
    const eig = eigs[bi];
    if (!block?.c3Sum || !eig) continue;
    const v = column(eig.vectors, eig.size, ws.jOf[i] as number);
    trace += bilinear(v, block.c3Sum, v);
  }
  return trace;
}

/**
 * The same trace without eigenvectors. The C₃ class sum commutes with H and keeps each k = 0
 * block, acting there as 8 on A1, −4 on E and 0 on T1 components; so the block's spectrum is the
 * union of the spectra of H on the three eigenspaces of the class sum (its parts, built once per
 * n). Merging the parts' eigenvalues in ascending order gives the class-sum eigenvalue of the
 * j-th lowest level of the block (rounding can swap two ranks only within one cluster, which
 * leaves the cluster's trace unchanged).
 */
function c3TraceByParts(
  items: readonly number[],
  ws: Workspace,
  dqOct: number,
  B: number,
  C: number,
): number {
  let trace = 0;
  for (const i of items) {
    const bi = ws.blockOf[i] as number;
    const tags = c3TagsOf(ws, bi, dqOct, B, C);
    if (tags) trace += tags[ws.jOf[i] as number] as number;
  }
  return trace;
}

/** The class-sum eigenvalue of each level of block `bi` by rank, computed once per call; undefined off k = 0. */
function c3TagsOf(ws: Workspace, bi: number, dqOct: number, B: number, C: number): Float64Array | undefined {
  const parts = ws.c3Parts[bi];
  const tags = ws.c3Tags[bi];
  if (!parts || !tags) return undefined;
  if (ws.c3Stamp[bi] === ws.call) return tags;
  for (const part of parts) {
    const mc = part.size;
    const h = ws.scratch[bi] as Float64Array;
    for (let x = 0; x < mc * mc; x++)
      h[x] =
        B * (part.partB[x] as number) + C * (part.partC[x] as number) + dqOct * (part.field[x] as number);
    tridiagonalQlValuesInPlace(h, mc, part.values, ws.e);
  }
  const next = new Int32Array(parts.length);
  for (let j = 0; j < tags.length; j++) {
    let best = -1;
    parts.forEach((part, p) => {
      const k = next[p] as number;
      const bestPart = parts[best];
      if (
        k < part.size &&
        (!bestPart || (part.values[k] as number) < (bestPart.values[next[best] as number] as number))
      )
        best = p;
    });
    const chosen = parts[best] as C3Part;
    tags[j] = chosen.value;
    next[best] = (next[best] as number) + 1;
  }
  ws.c3Stamp[bi] = ws.call;
  return tags;
}

/** H of one k = 0 block restricted to one eigenspace of the C₃ class sum. */
interface C3Part {
  /** The class sum's eigenvalue there: 8 (A1), −4 (E) or 0 (T1). */
  readonly value: number;
  readonly size: number;
  readonly partB: Float64Array;
  readonly partC: Float64Array;
  /** ∂H/∂Dq there, full (the part's basis does not keep one configuration per vector). */
  readonly field: Float64Array;
  /** Eigenvalues at the current point (scratch). */
  readonly values: Float64Array;
}

/** A k = 0 block split by the eigenvalue of its C₃ class sum; undefined for other blocks. */
function c3PartsOf(block: AdaptedBlock): C3Part[] | undefined {
  const { c3Sum, size: m } = block;
  if (!c3Sum) return undefined;
  const eig = symmetricEigen(c3Sum, m);
  const columns = new Map<number, number[]>();
  eig.values.forEach((v, j) => {
    const value = Math.round(v);
    columns.set(value, [...(columns.get(value) ?? []), j]);
  });
  const field = new Float64Array(m * m);
  for (let i = 0; i < m; i++) field[i * m + i] = block.fieldDiagonal[i] as number;
  return [...columns].map(([value, cols]) => {
    const mc = cols.length;
    const w = new Float64Array(m * mc);
    cols.forEach((j, c) => {
      for (let i = 0; i < m; i++) w[i * mc + c] = eig.vectors[i * m + j] as number;
    });
    return {
      value,
      size: mc,
      partB: congruence(w, block.partB, m, mc),
      partC: congruence(w, block.partC, m, mc),
      field: congruence(w, field, m, mc),
      values: new Float64Array(mc),
    };
  });
}

const NO_WEIGHTS: readonly number[] = [0, 0, 0, 0, 0];

/** Strong-field make-up of one level: the squared components of its eigenvectors by e-count, averaged. */
function configurationWeights(
  items: readonly number[],
  blocks: readonly AdaptedBlock[],
  blockOf: Int32Array,
  jOf: Int32Array,
  eigs: readonly (SymmetricEigen | undefined)[],
): number[] {
  const weights = [0, 0, 0, 0, 0];
  for (const i of items) {
    const block = blocks[blockOf[i] as number];
    const eig = eigs[blockOf[i] as number];
    if (!block || !eig) continue;
    const m = eig.size;
    const j = jOf[i] as number;
    for (let r = 0; r < m; r++) {
      const x = eig.vectors[r * m + j] ?? 0;
      const b = block.eCount[r] ?? 0;
      weights[b] = (weights[b] ?? 0) + (x * x) / items.length;
    }
  }
  return weights;
}

/** The distinct S among order[start…end−1], in order of first appearance. */
function spinsOf(
  blocks: readonly AdaptedBlock[],
  blockOf: Int32Array,
  order: Int32Array,
  start: number,
  end: number,
): number[] {
  const spins: number[] = [];
  for (let r = start; r < end; r++) {
    const S = (blocks[blockOf[order[r] as number] as number] as AdaptedBlock).S;
    if (!spins.includes(S)) spins.push(S);
  }
  return spins;
}

/**
 * Storage reused by every {@link cubicLevels} call for one n (a sweep solves the same blocks at
 * thousands of points): each block's eigenvalues side by side in `values` (block by block, each
 * block's ascending), which block and which index each entry is, the sort order, and per block a
 * scratch matrix for the eigenvalue routine.
 */
interface Workspace {
  readonly blocks: readonly AdaptedBlock[];
  readonly values: Float64Array;
  readonly blockValues: readonly Float64Array[];
  readonly blockOf: Int32Array;
  readonly jOf: Int32Array;
  readonly order: Int32Array;
  readonly scratch: readonly Float64Array[];
  readonly e: Float64Array;
  /** Calls so far, to know whether a block's C₃ tags belong to the current point. */
  call: number;
  readonly c3Parts: readonly (C3Part[] | undefined)[];
  readonly c3Tags: readonly (Float64Array | undefined)[];
  readonly c3Stamp: Float64Array;
}

const workspaces = new Map<number, Workspace>();

function workspaceOf(n: number): Workspace {
  const cached = workspaces.get(n);
  if (cached) return cached;
  const blocks = adaptedBlocks(n);
  const total = blocks.reduce((s, b) => s + b.size, 0);
  const values = new Float64Array(total);
  const blockOf = new Int32Array(total);
  const jOf = new Int32Array(total);
  const blockValues: Float64Array[] = [];
  let offset = 0;
  blocks.forEach((b, bi) => {
    blockValues.push(values.subarray(offset, offset + b.size));
    for (let j = 0; j < b.size; j++) {
      blockOf[offset + j] = bi;
      jOf[offset + j] = j;
    }
    offset += b.size;
  });
  const ws: Workspace = {
    blocks,
    values,
    blockValues,
    blockOf,
    jOf,
    order: new Int32Array(total),
    scratch: blocks.map((b) => new Float64Array(b.size * b.size)),
    e: new Float64Array(Math.max(1, ...blocks.map((b) => b.size))),
    call: 0,
    c3Parts: blocks.map(c3PartsOf),
    c3Tags: blocks.map((b) => (b.c3Sum ? new Float64Array(b.size) : undefined)),
    c3Stamp: new Float64Array(blocks.length).fill(-1),
  };
  workspaces.set(n, ws);
  return ws;
}

/**
 * Indices of `values` in ascending order of value, ties in index order (a stable sort): insertion
 * sort, quick here because each block's values arrive already ascending.
 */
function sortByValue(values: Float64Array, order: Int32Array): void {
  for (let i = 0; i < order.length; i++) {
    const v = values[i] as number;
    let k = i;
    while (k > 0 && (values[order[k - 1] as number] as number) > v) {
      order[k] = order[k - 1] as number;
      k--;
    }
    order[k] = i;
  }
}

/** H of one symmetry-adapted block, row-major. */
function blockMatrix(block: AdaptedBlock, dqOct: number, B: number, C: number): Float64Array {
  const m = block.size;
  const h = new Float64Array(m * m);
  const { partB, partC, fieldDiagonal } = block;
  // Hot loop: typed-array reads are in range by construction.
  for (let i = 0; i < h.length; i++) h[i] = B * (partB[i] as number) + C * (partC[i] as number);
  for (let i = 0; i < m; i++) h[i * m + i] = (h[i * m + i] as number) + dqOct * (fieldDiagonal[i] as number);
  return h;
}

/** Hᵀ of one block into `out` (the input {@link tridiagonalQlValuesInPlace} takes); each entry computed as in {@link blockMatrix}. */
function blockMatrixTransposed(
  block: AdaptedBlock,
  dqOct: number,
  B: number,
  C: number,
  out: Float64Array,
): void {
  const m = block.size;
  const { partB, partC, fieldDiagonal } = block;
  // Hot loop: typed-array reads are in range by construction.
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++)
      out[j * m + i] = B * (partB[i * m + j] as number) + C * (partC[i * m + j] as number);
  }
  for (let i = 0; i < m; i++)
    out[i * m + i] = (out[i * m + i] as number) + dqOct * (fieldDiagonal[i] as number);
}

/**
 * The total spin S of the ground state for a signed, octahedral-convention Dq, from the
 * eigenvalues alone (no vectors, no labels): for scans that only watch the ground spin change.
 */
export function groundSpin(n: number, dqOct: number, B: number, C: number): number {
  return lowestBySpin(n, dqOct, B, C);
}

/**
 * {@link groundSpin}, and the lowest energy of each spin written to `out[2S]` when given (+∞ for
 * a spin dⁿ lacks; `out` needs length 6). With `spins`, only the blocks of those spins are solved
 * (the others read +∞, and the spin returned is the lower of those): the same numbers for them.
 */
export function lowestBySpin(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  out?: Float64Array,
  spins?: readonly number[],
): number {
  checkMagnitudes(dqOct, B, C);
  let lowest = Number.POSITIVE_INFINITY;
  let S = 0;
  out?.fill(Number.POSITIVE_INFINITY);
  const ws = workspaceOf(n);
  ws.blocks.forEach((block, bi) => {
    // Every irrep of O has a component with k = 0 (A1, E, T1) or k = 2 (A2, E, T2), so the k = 1
    // blocks hold no level the others lack: the lowest eigenvalue, and its S, is found without them.
    if (block.k === 1 || (spins && !spins.includes(block.S))) return;
    const own = ws.blockValues[bi] as Float64Array;
    const vt = ws.scratch[bi] as Float64Array;
    blockMatrixTransposed(block, dqOct, B, C, vt);
    tridiagonalQlValuesInPlace(vt, block.size, own, ws.e);
    const v = own[0];
    if (v === undefined) return;
    if (out && v < (out[2 * block.S] as number)) out[2 * block.S] = v;
    if (v < lowest) {
      lowest = v;
      S = block.S;
    }
  });
  return S;
}

/** One level of {@link cubicCurves}: its names and its energy above the ground state at each Dq. */
export interface CubicCurve {
  /** As {@link CubicLevel.label}. */
  readonly label: string;
  readonly symbol: string;
  readonly S: number;
  /** Irrep with parity in Oh (`T1g`), without in Td (`T1`). */
  readonly irrep: string;
  readonly parent: string;
  /** Energy above the ground state at each Dq asked for, cm⁻¹. */
  readonly energies: Float64Array;
}

/**
 * The energy of every level of dⁿ, by label, at each signed, octahedral-convention Dq of
 * `dqOcts` (B, C fixed): the numbers {@link cubicLevels} gives there (to rounding), for sweeps of
 * many points. H is diagonalised on one component of each (S, Γ) only — A1, E and T1 from the C₃
 * parts of the k = 0 blocks, T2 from the k = 2 block that holds nothing else, A2 from the other
 * k = 2 block with E's values taken out — so every eigenvalue belongs to one (S, Γ) and, since
 * levels of one ²ˢ⁺¹Γ never cross, its rank names it: no clustering, no vectors, and the k = 1
 * blocks not at all. The curves come grouped by (S, Γ), those of one ²ˢ⁺¹Γ lowest first.
 * @throws InputError for a Dq, B or C beyond {@link MAX_PARAMETER}.
 */
export function cubicCurves(
  n: number,
  dqOcts: readonly number[],
  B: number,
  C: number,
  geometry: Geometry,
  onProgress?: (done: number, total: number) => void,
): CubicCurve[] {
  const ws = workspaceOf(n);
  const sources = irrepSourcesOf(ws);
  const plan = labelPlan(n, B, C, geometry);
  const curves = sources.map((source) =>
    (plan[planSlot(source.S, source.irrep)] ?? []).map((p) => ({
      ...p,
      S: source.S,
      energies: new Float64Array(dqOcts.length),
    })),
  );
  const values = sources.map(() => [] as number[]);
  dqOcts.forEach((dq, i) => {
    checkMagnitudes(dq, B, C);
    let ground = Number.POSITIVE_INFINITY;
    sources.forEach((source, s) => {
      const own = sourceValues(source, dq, B, C, ws.e, values);
      values[s] = own;
      if (own.length !== curves[s]?.length)
        throw new Error(
          `d${n}: ${own.length} levels of ${source.S}:${source.irrep}, ${curves[s]?.length} labels`,
        );
      if ((own[0] ?? ground) < ground) ground = own[0] as number;
    });
    curves.forEach((list, s) => {
      const own = values[s] as number[];
      list.forEach((c, r) => {
        c.energies[i] = (own[r] as number) - ground;
      });
    });
    onProgress?.(i + 1, dqOcts.length);
  });
  return curves.flat();
}

/** H restricted to a subspace that H keeps: its ∂H/∂B, ∂H/∂C and ∂H/∂Dq, full, and scratch. */
interface Restriction {
  readonly size: number;
  readonly partB: Float64Array;
  readonly partC: Float64Array;
  readonly field: Float64Array;
  readonly scratch: Float64Array;
  readonly values: Float64Array;
}

/** Where the levels of one (S, Γ) are read: the restrictions whose eigenvalues are exactly those levels. */
interface IrrepSource {
  readonly S: number;
  readonly irrep: CubicIrrep;
  readonly parts: readonly Restriction[];
  /** A2's k = 2 block also holds one component of every E level of its S: index of that E source. */
  readonly minus: number | undefined;
}

const IRREP_OF_C3_VALUE: ReadonlyMap<number, CubicIrrep> = new Map([
  [8, 'A1'],
  [-4, 'E'],
  [0, 'T1'],
]);

const sourceCache = new WeakMap<Workspace, IrrepSource[]>();

/** The (S, Γ) sources of one n, built once. */
function irrepSourcesOf(ws: Workspace): IrrepSource[] {
  const cached = sourceCache.get(ws);
  if (cached) return cached;
  const found = new Map<string, { S: number; irrep: CubicIrrep; parts: Restriction[] }>();
  const add = (S: number, irrep: CubicIrrep, part: Restriction) => {
    const k = `${S}:${irrep}`;
    const entry = found.get(k) ?? { S, irrep, parts: [] };
    entry.parts.push(part);
    found.set(k, entry);
  };
  ws.blocks.forEach((block, bi) => {
    if (block.k === 0) {
      for (const part of ws.c3Parts[bi] ?? []) {
        const irrep = IRREP_OF_C3_VALUE.get(part.value);
        if (!irrep) throw new Error(`C3 class sum value ${part.value} in a k = 0 block`);
        add(block.S, irrep, restriction(part.size, part.partB, part.partC, part.field));
      }
    } else if (block.k === 2) {
      const field = new Float64Array(block.size * block.size);
      for (let i = 0; i < block.size; i++) field[i * block.size + i] = block.fieldDiagonal[i] as number;
      const whole = restriction(block.size, block.partB, block.partC, field);
      add(block.S, onlyT2(ws, bi) ? 'T2' : 'A2', whole);
    }
  });
  // E before A2, so that A2's E values are known when it is read.
  const order = (irrep: CubicIrrep) => (irrep === 'A2' ? 1 : 0);
  const list = [...found.values()].sort((a, b) => order(a.irrep) - order(b.irrep));
  const sources: IrrepSource[] = list.map((entry) => {
    const e = list.findIndex((x) => x.S === entry.S && x.irrep === 'E');
    return { ...entry, minus: entry.irrep === 'A2' && e >= 0 ? e : undefined };
  });
  sourceCache.set(ws, sources);
  return sources;
}

function restriction(
  size: number,
  partB: Float64Array,
  partC: Float64Array,
  field: Float64Array,
): Restriction {
  return {
    size,
    partB,
    partC,
    field,
    scratch: new Float64Array(size * size),
    values: new Float64Array(size),
  };
}

/**
 * Whether k = 2 block `bi` holds T2 components only: its spectrum then lies within that of the
 * k = 1 block of its S (which holds one component of each T1 and T2 level), while an A2 or E
 * level never does; checked at one point of no special Dq, B or C/B.
 */
function onlyT2(ws: Workspace, bi: number): boolean {
  const block = ws.blocks[bi] as AdaptedBlock;
  const other = ws.blocks.findIndex((b) => b.k === 1 && b.S === block.S);
  if (other < 0) return false;
  const at = (b: AdaptedBlock) => symmetricEigen(blockMatrix(b, 1234.5, 1000, 4271.3), b.size).values;
  const own = at(block);
  const t = at(ws.blocks[other] as AdaptedBlock);
  return own.every((v) => t.some((w) => Math.abs(v - w) <= 1e-7 * (Math.abs(v) + 1)));
}

/** The eigenvalues of one (S, Γ) at one point, ascending. */
function sourceValues(
  source: IrrepSource,
  dq: number,
  B: number,
  C: number,
  e: Float64Array,
  known: readonly (readonly number[])[],
): number[] {
  const out: number[] = [];
  for (const part of source.parts) {
    const { size: m, partB, partC, field, scratch: h, values } = part;
    for (let x = 0; x < m * m; x++)
      h[x] = B * (partB[x] as number) + C * (partC[x] as number) + dq * (field[x] as number);
    tridiagonalQlValuesInPlace(h, m, values, e);
    for (let j = 0; j < m; j++) out.push(values[j] as number);
  }
  out.sort((a, b) => a - b);
  if (source.minus === undefined) return out;
  // Each E value is in A2's block too: remove its nearest match (both are exact to rounding).
  for (const v of known[source.minus] ?? []) {
    let best = 0;
    for (let j = 1; j < out.length; j++)
      if (Math.abs((out[j] as number) - v) < Math.abs((out[best] as number) - v)) best = j;
    out.splice(best, 1);
  }
  return out;
}

/** The label, symbol, irrep name and parent of the i-th lowest level of one (S, irrep). */
interface PlannedLabel {
  readonly label: string;
  readonly symbol: string;
  readonly irrep: string;
  readonly parent: string;
}

/** Planned labels by {@link planSlot} of (S, irrep), then by rank in energy. */
type LabelPlan = PlannedLabel[][];

/** Index of (S, irrep) in a {@link LabelPlan}. */
function planSlot(S: number, irrep: CubicIrrep): number {
  return Math.round(2 * S) * CUBIC_IRREPS.length + CUBIC_IRREPS.indexOf(irrep);
}

const planCache = new Map<string, LabelPlan>();
const PLAN_CACHE_SIZE = 64;

/**
 * Labels of every level of dⁿ, by (S, irrep) and rank in energy: the i-th lowest level of a
 * symbol comes from the i-th lowest free-ion component of it (levels of one symbol never cross);
 * a symbol that occurs more than once gets its parent term letter, and one that still repeats an
 * ordinal. Only the order of the free-ion terms matters, and it depends on C/B alone, so the plan
 * is computed once per (n, geometry, C/B); terms degenerate in the free ion are ordered by L then
 * S, so that the plan does not depend on rounding.
 */
function labelPlan(n: number, B: number, C: number, geometry: Geometry): LabelPlan {
  // A sweep asks again and again with the same n, geometry, B and C: skip the key text then.
  const last = lastPlan;
  if (last && last.n === n && last.B === B && last.C === C && last.geometry === geometry) return last.plan;
  const plan = labelPlanByRatio(n, B, C, geometry);
  lastPlan = { n, B, C, geometry, plan };
  return plan;
}

let lastPlan: { n: number; B: number; C: number; geometry: Geometry; plan: LabelPlan } | undefined;

function labelPlanByRatio(n: number, B: number, C: number, geometry: Geometry): LabelPlan {
  const ratio = B > 0 ? C / B : Number.NaN;
  const key = `${n}:${geometry}:${Number.isNaN(ratio) ? 'none' : ratio.toPrecision(12)}`;
  const cached = planCache.get(key);
  if (cached) return cached;
  const terms = freeIonTerms(n, B > 0 ? 1000 : 0, B > 0 ? 1000 * ratio : 0)
    .map((t) => ({ t, e: Math.round(t.energy * 1e3) }))
    .sort((a, b) => a.e - b.e || a.t.L - b.t.L || a.t.S - b.t.S)
    .map((x) => x.t);
  const entries: { slot: number; irrep: CubicIrrep; symbol: string; parent: string }[] = [];
  for (const term of terms) {
    const branches = branchTerm(term.L);
    for (const irrep of CUBIC_IRREPS) {
      for (let c = 0; c < branches[irrep]; c++) {
        entries.push({
          slot: planSlot(term.S, irrep),
          irrep,
          symbol: stateSymbol(term.S, irrep, geometry),
          parent: term.name,
        });
      }
    }
  }
  const symbolCount = countBy(entries.map((e) => e.symbol));
  const withParent = entries.map((e) =>
    (symbolCount.get(e.symbol) ?? 0) > 1 ? `${e.symbol}(${e.parent.replace(/\d+/, '')})` : e.symbol,
  );
  const labelCount = countBy(withParent);
  const ordinal = new Map<string, number>();
  const plan: LabelPlan = [];
  entries.forEach((e, i) => {
    let label = withParent[i] ?? e.symbol;
    if ((labelCount.get(label) ?? 0) > 1) {
      const k = (ordinal.get(label) ?? 0) + 1;
      ordinal.set(label, k);
      label = `${label.slice(0, -1)},${k})`;
    }
    const irrep = irrepName(e.irrep, geometry);
    plan[e.slot] = [...(plan[e.slot] ?? []), { label, symbol: e.symbol, irrep, parent: e.parent }];
  });
  if (planCache.size >= PLAN_CACHE_SIZE) planCache.clear();
  planCache.set(key, plan);
  return plan;
}

const configurationTexts = new Map<string, string>();

function configurationTextOf(t2: number, e: number, geometry: Geometry): string {
  const key = `${t2}:${e}:${geometry}`;
  let text = configurationTexts.get(key);
  if (text === undefined) {
    text = configurationText(t2, e, geometry);
    configurationTexts.set(key, text);
  }
  return text;
}

function finish(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  geometry: Geometry,
  raw: RawLevel[],
): CubicResult {
  raw.sort((a, b) => a.energy - b.energy);
  const groundRaw = raw[0];
  if (!groundRaw) throw new Error(`no levels for d${n}`);
  const plan = labelPlan(n, B, C, geometry);
  const rank: number[] = [];
  const levels: CubicLevel[] = raw.map((p) => {
    const slot = planSlot(p.S, p.irrep);
    const i = rank[slot] ?? 0;
    rank[slot] = i + 1;
    const planned = plan[slot]?.[i];
    if (!planned)
      throw new Error(`cubic labelling: no free-ion parent for level ${i + 1} of ${p.S}:${p.irrep} in d${n}`);
    const configurations: ConfigurationWeight[] = [];
    if (p.weights !== NO_WEIGHTS)
      p.weights.forEach((weight, e) => {
        const t2 = n - e;
        if (t2 >= 0 && t2 <= 6 && weight > 1e-12) {
          configurations.push({ t2, e, text: configurationTextOf(t2, e, geometry), weight });
        }
      });
    configurations.sort((a, b) => b.weight - a.weight);
    return {
      label: planned.label,
      symbol: planned.symbol,
      S: p.S,
      irrep: planned.irrep,
      cubicIrrep: p.irrep,
      energy: p.energy - groundRaw.energy,
      degeneracy: Math.round((2 * p.S + 1) * IRREP_DIMENSION[p.irrep]),
      parent: planned.parent,
      configurations,
      configuration: configurations[0]?.text ?? '',
      spinAllowed: p.S === groundRaw.S,
    };
  });
  const ground = levels[0];
  if (!ground) throw new Error(`no levels for d${n}`);
  return { n, geometry, dq: Math.abs(dqOct), B, C, ground, levels };
}

function countBy(items: readonly string[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const x of items) m.set(x, (m.get(x) ?? 0) + 1);
  return m;
}
