/**
 * Levels of dⁿ in a cubic field with spin–orbit coupling, by exact diagonalisation of
 * repulsion + cubic field + ζ Σ l·s in the M_J blocks of the double group. Each level gets its
 * double-group irrep (from the characters of its eigenspace), its energy and degeneracy, and its
 * parentage: the weights of the spin–orbit-free cubic levels ²ˢ⁺¹Γ in it, so a reader sees
 * which cubic level it comes from.
 */

import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { bilinear, clusterSorted, column, type SymmetricEigen, symmetricEigen } from '../numeric/eigen.js';
import { tridiagonalQlValues } from '../numeric/tridiagonalQl.js';
import { type CubicInput, checkCubicInput, cubicLevels } from './cubic.js';
import {
  c2Character,
  c4Character,
  DOUBLE_IRREP_DIMENSION,
  type DoubleIrrep,
  EVEN_IRREPS,
  ODD_IRREPS,
  reduceCharacters,
} from './doubleGroup.js';
import type { Geometry } from './labels.js';
import { checkZeta } from './spinOrbit.js';
import { blockHamiltonian, type SpinOrbitBlock, spinOrbitBlocks } from './spinOrbitBlocks.js';

/** Input of {@link solveSpinOrbit}. Energies in cm⁻¹. */
export interface SpinOrbitInput extends CubicInput {
  /** One-electron spin–orbit constant ζ, 0…MAX_ZETA. */
  readonly zeta: number;
  /** Work out each level's parentage in the cubic levels (one more diagonalisation). @default true */
  readonly parentage?: boolean;
}

/** Weight of one spin–orbit-free cubic level (or free-ion term, at Dq = 0) in a level. */
export interface ParentWeight {
  /** Cubic level label such as `4T1g(F)`; levels of equal energy joined by `/`; a free-ion term such as `4F` where they all come from it. */
  readonly state: string;
  /** Fraction of the level, 0…1. */
  readonly weight: number;
}

/** One level of dⁿ with spin–orbit coupling. */
export interface SpinOrbitLevel {
  /** Irrep and its rank among the levels of that irrep from below, e.g. `Γ8(2)`: the same state wherever the parameters move. */
  readonly label: string;
  readonly irrep: DoubleIrrep;
  /** Energy above the ground level, cm⁻¹. */
  readonly energy: number;
  /** Dimension of the irrep. */
  readonly degeneracy: number;
  /** Parent cubic levels with weights above {@link PARENT_WEIGHT_FLOOR}, largest first; empty without parentage. */
  readonly parentage: readonly ParentWeight[];
  /** The largest parent, or '' without parentage. */
  readonly parent: string;
}

/** Levels of dⁿ with spin–orbit coupling. */
export interface SpinOrbitResult {
  readonly n: number;
  readonly geometry: Geometry;
  readonly dq: number;
  readonly B: number;
  readonly C: number;
  readonly zeta: number;
  readonly ground: SpinOrbitLevel;
  /** All levels by energy. */
  readonly levels: readonly SpinOrbitLevel[];
}

/** Parent weights below this are left out of a level's list. */
export const PARENT_WEIGHT_FLOOR = 1e-4;

/** The eigen-decomposition of every kept block at one point. */
export interface SpinOrbitStates {
  readonly blocks: readonly SpinOrbitBlock[];
  readonly eigs: readonly SymmetricEigen[];
}

/**
 * Diagonalises every kept M_J block of dⁿ for a signed (octahedral-convention) Dq. The last
 * result is kept: a caller that wants the moments and the named levels at one point (magnetism)
 * asks twice with the same numbers, and the states are read, never changed.
 */
export function spinOrbitStates(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
): SpinOrbitStates {
  const last = lastStates;
  if (last && last.n === n && last.dqOct === dqOct && last.B === B && last.C === C && last.zeta === zeta)
    return last.states;
  const blocks = spinOrbitBlocks(n);
  const eigs = blocks.map((b) => symmetricEigen(blockHamiltonian(b, dqOct, B, C, zeta), b.masks.length));
  const states = { blocks, eigs };
  lastStates = { n, dqOct, B, C, zeta, states };
  return states;
}

let lastStates:
  | { n: number; dqOct: number; B: number; C: number; zeta: number; states: SpinOrbitStates }
  | undefined;

/**
 * Levels of dⁿ in an octahedral or tetrahedral field with spin–orbit coupling, each with its
 * double-group label, degeneracy and parentage.
 * @throws InputError for n outside 1…9, a negative or non-finite Dq, B or C, or a ζ outside
 * 0…MAX_ZETA.
 */
export function solveSpinOrbit(input: SpinOrbitInput): SpinOrbitResult {
  checkCubicInput(input);
  const { n, geometry = DEFAULT_GEOMETRY, dq, B, C, zeta } = input;
  checkZeta(zeta);
  return spinOrbitLevels(n, geometry === 'oct' ? dq : -dq, B, C, zeta, geometry, input.parentage ?? true);
}

interface RawLevel {
  irrep: DoubleIrrep;
  energy: number;
  parentage: ParentWeight[];
}

/**
 * The irreps of a degenerate run whose kept components fall one per class in the pattern of a
 * single irrep (odd n: 2M_J ≡ 1 → Γ6, 3 → Γ7, both → Γ8; even n: 0 → Γ1, 4 → Γ2, 0 + 4 → Γ3,
 * 0 + 2 → Γ4, 2 + 4 → Γ5), or null where the pattern could hide a coincidence of several.
 */
function irrepByPattern(odd: boolean, kept: ReadonlySet<number>, size: number): DoubleIrrep | null {
  const key = [...kept].sort().join(',');
  if (kept.size !== size) return null;
  const table: Record<string, DoubleIrrep> = odd
    ? { '1': 'Γ6', '3': 'Γ7', '1,3': 'Γ8' }
    : { '0': 'Γ1', '4': 'Γ2', '0,4': 'Γ3', '0,2': 'Γ4', '2,4': 'Γ5' };
  return table[key] ?? null;
}

/** Irrep and energy above the ground level of every level, without eigenvectors. */
export interface LevelEnergy {
  readonly irrep: DoubleIrrep;
  readonly energy: number;
}

/**
 * Energies and irreps of every level from eigenvalues alone, for sweeps: each block's spectrum
 * (no eigenvectors), each degenerate run named by {@link irrepByPattern}. Returns null where a
 * run's pattern leaves the name open (at ζ = 0, Dq = 0 or a coincidence); the caller then uses
 * {@link spinOrbitLevels}.
 */
export function spinOrbitEnergies(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
): LevelEnergy[] | null {
  const blocks = spinOrbitBlocks(n);
  const pool: { cls: number; value: number }[] = [];
  let scale = 1;
  for (const b of blocks) {
    for (const value of tridiagonalQlValues(blockHamiltonian(b, dqOct, B, C, zeta), b.masks.length)) {
      pool.push({ cls: b.cls, value });
      scale = Math.max(scale, Math.abs(value));
    }
  }
  pool.sort((a, b) => a.value - b.value);
  const values = pool.map((p) => p.value);
  const zero = values[0] ?? 0;
  const out: LevelEnergy[] = [];
  for (const run of clusterSorted(values, 1e-9 * scale)) {
    const kept = new Set(run.map((i) => pool[i]?.cls ?? -1));
    const irrep = irrepByPattern(n % 2 === 1, kept, run.length);
    if (!irrep) return null;
    out.push({ irrep, energy: (values[run[0] ?? 0] ?? 0) - zero });
  }
  return out;
}

/** The levels for a signed Dq (checks left to the caller), named for `geometry`. */
export function spinOrbitLevels(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  zeta: number,
  geometry: Geometry,
  withParentage = true,
): SpinOrbitResult {
  const states = spinOrbitStates(n, dqOct, B, C, zeta);
  const parents = withParentage ? parentWeights(n, dqOct, B, C, geometry, states) : null;
  const raw: RawLevel[] = [];
  for (const cluster of clusters(states)) {
    const irreps = nameCluster(n % 2 === 1, states, cluster.items);
    const parentage = parents ? clusterParentage(states, parents, cluster.items) : [];
    for (const irrep of irreps) raw.push({ irrep, energy: cluster.energy, parentage });
  }
  raw.sort((a, b) => a.energy - b.energy);
  const zero = raw[0]?.energy ?? 0;
  const rank = new Map<DoubleIrrep, number>();
  const levels = raw.map((r) => {
    const k = (rank.get(r.irrep) ?? 0) + 1;
    rank.set(r.irrep, k);
    return {
      label: `${r.irrep}(${k})`,
      irrep: r.irrep,
      energy: r.energy - zero,
      degeneracy: DOUBLE_IRREP_DIMENSION[r.irrep],
      parentage: r.parentage,
      parent: r.parentage[0]?.state ?? '',
    };
  });
  const ground = levels[0];
  if (!ground) throw new Error(`no levels for d${n}`);
  return { n, geometry, dq: Math.abs(dqOct), B, C, zeta, ground, levels };
}

/** One eigenvector: block index and column. */
interface Item {
  readonly block: number;
  readonly j: number;
}

/** Eigenvalues of all blocks gathered into degenerate runs. */
function clusters(states: SpinOrbitStates): { energy: number; items: Item[] }[] {
  const pool: (Item & { value: number })[] = [];
  states.eigs.forEach((eig, block) => {
    eig.values.forEach((value, j) => {
      pool.push({ block, j, value });
    });
  });
  pool.sort((a, b) => a.value - b.value);
  const values = pool.map((p) => p.value);
  let scale = 1;
  for (const v of values) scale = Math.max(scale, Math.abs(v));
  return clusterSorted(values, 1e-9 * scale).map((run) => ({
    energy: run.reduce((s, i) => s + (values[i] ?? 0), 0) / run.length,
    items: run.map((i) => pool[i] as Item),
  }));
}

/**
 * The irreps of one degenerate run from its characters: E, C4 and C2 from how its components
 * fall into the M_J classes, C3 and C2′ from the rotations' traces over its eigenvectors (only
 * where the classes leave a choice).
 */
function nameCluster(odd: boolean, states: SpinOrbitStates, items: readonly Item[]): DoubleIrrep[] {
  const byClass = new Array<number>(8).fill(0);
  for (const it of items) {
    const b = states.blocks[it.block];
    if (b) byClass[b.cls] = (byClass[b.cls] ?? 0) + b.weight;
  }
  const dim = byClass.reduce((s, x) => s + x, 0);
  const trace = (pick: (b: SpinOrbitBlock) => Float64Array | null, classWeight: boolean) => {
    let sum = 0;
    for (const it of items) {
      const b = states.blocks[it.block];
      const eig = states.eigs[it.block];
      const op = b && pick(b);
      if (!b || !eig || !op) continue;
      const v = column(eig.vectors, eig.size, it.j);
      sum += (classWeight ? b.weight : 1) * bilinear(v, op, v);
    }
    return sum;
  };
  const lone = odd ? (byClass[1] ?? 0) === 0 || (byClass[3] ?? 0) === 0 : dim === 1;
  const chi = {
    E: dim,
    C4: c4Character(byClass),
    C2: c2Character(byClass),
    // Where the classes settle the name (one class only), any C3, C2′ consistent with it will do.
    C3: lone ? (odd ? dim / 2 : dim) : trace((b) => b.c3, true),
    C2p: lone || odd ? (odd ? 0 : dim * (byClass[0] ? 1 : -1)) : trace((b) => b.c2p, false),
  };
  const counts = reduceCharacters(odd, chi);
  const out: DoubleIrrep[] = [];
  for (const irrep of odd ? ODD_IRREPS : EVEN_IRREPS) {
    for (let c = 0; c < (counts[irrep] ?? 0); c++) out.push(irrep);
  }
  return out;
}

/** Per block, per spin–orbit eigenvector: weight of each parent label. */
type Parents = Map<string, number>[][];

/**
 * Projects every eigenvector on the eigenspaces of the same block without spin–orbit coupling,
 * each named by the cubic level of its energy (or free-ion term, where several cubic levels of
 * one term coincide).
 */
function parentWeights(
  n: number,
  dqOct: number,
  B: number,
  C: number,
  geometry: Geometry,
  states: SpinOrbitStates,
): Parents {
  const cubic = cubicLevels(n, dqOct, B, C, geometry);
  const eig0 = states.blocks.map((b) => symmetricEigen(blockHamiltonian(b, dqOct, B, C, 0), b.masks.length));
  let zero = Number.POSITIVE_INFINITY;
  let scale = 1;
  for (const e of eig0) {
    zero = Math.min(zero, e.values[0] ?? zero);
    for (const v of e.values) scale = Math.max(scale, Math.abs(v));
  }
  const tol = 1e-7 * scale;
  const nameOf = (energy: number): string => {
    const matches = cubic.levels.filter((l) => Math.abs(l.energy - energy) <= tol);
    if (matches.length === 0) throw new Error(`d${n}: no cubic level at ${energy} cm⁻¹`);
    if (matches.length === 1) return matches[0]?.label ?? '';
    const terms = new Set(matches.map((l) => l.parent));
    return terms.size === 1 ? ([...terms][0] ?? '') : matches.map((l) => l.label).join('/');
  };
  return states.blocks.map((b, bi) => {
    const e0 = eig0[bi] as SymmetricEigen;
    const eig = states.eigs[bi] as SymmetricEigen;
    const m = b.masks.length;
    const names = Array.from(e0.values, (v) => nameOf(v - zero));
    const out: Map<string, number>[] = [];
    for (let k = 0; k < m; k++) {
      const weights = new Map<string, number>();
      for (let j = 0; j < m; j++) {
        let dot = 0;
        for (let i = 0; i < m; i++)
          dot += (e0.vectors[i * m + j] as number) * (eig.vectors[i * m + k] as number);
        const name = names[j] as string;
        weights.set(name, (weights.get(name) ?? 0) + dot * dot);
      }
      out.push(weights);
    }
    return out;
  });
}

function clusterParentage(states: SpinOrbitStates, parents: Parents, items: readonly Item[]): ParentWeight[] {
  const sum = new Map<string, number>();
  let total = 0;
  for (const it of items) {
    const w = states.blocks[it.block]?.weight ?? 1;
    total += w;
    for (const [name, x] of parents[it.block]?.[it.j] ?? []) sum.set(name, (sum.get(name) ?? 0) + w * x);
  }
  return [...sum]
    .map(([state, x]) => ({ state, weight: x / total }))
    .filter((p) => p.weight >= PARENT_WEIGHT_FLOOR)
    .sort((a, b) => b.weight - a.weight);
}
