/**
 * The cubic solver: the levels of dⁿ in an octahedral or tetrahedral field by exact
 * diagonalisation of H = B·H_B + C·H_C + Dq·V, block by block in the symmetry-adapted basis
 * (cubicBasis.ts), each level labelled ²ˢ⁺¹Γ with its parent free-ion term and its strong-field
 * make-up (the method of Tanabe & Sugano, J. Phys. Soc. Japan 9, 753, 1954).
 */

import { freeIonTerms } from '../atom/freeIon.js';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { bilinear, clusterSorted, column, type SymmetricEigen, symmetricEigen } from '../numeric/eigen.js';
import { tridiagonalQlValues } from '../numeric/tridiagonalQl.js';
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
  weights: number[];
}

/**
 * The levels for a signed, octahedral-convention Dq (a tetrahedral field is a negative one),
 * named for `geometry`: each symmetry-adapted block (k, S, C₂′ parity) is diagonalised, equal
 * eigenvalues across blocks are gathered into degenerate levels, and each level's irrep is read
 * from how its components fall into the blocks.
 *
 * With `vectors` false (sweeps that need energies and labels alone) the blocks are diagonalised
 * for their eigenvalues only — the very same numbers — and the levels carry no strong-field
 * make-up (`configurations` empty); a block's eigenvectors are then computed only where the C₃
 * trace must settle a label.
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
  const blocks = adaptedBlocks(n);
  const pool: { block: number; j: number; value: number }[] = [];
  const matrices: Float64Array[] = [];
  const eigs: (SymmetricEigen | undefined)[] = blocks.map((block, bi) => {
    const m = block.size;
    const h = blockMatrix(block, dqOct, B, C);
    matrices.push(h);
    const eig = vectors || m < 2 ? symmetricEigen(h, m) : undefined;
    const values = eig ? eig.values : tridiagonalQlValues(h, m);
    values.forEach((value, j) => {
      pool.push({ block: bi, j, value });
    });
    return eig;
  });
  const eigOf = (bi: number): SymmetricEigen | undefined => {
    const h = matrices[bi];
    const block = blocks[bi];
    if (eigs[bi] === undefined && h && block) eigs[bi] = symmetricEigen(h, block.size);
    return eigs[bi];
  };
  pool.sort((a, b) => a.value - b.value);
  const values = pool.map((p) => p.value);
  let scale = 1;
  for (const v of values) scale = Math.max(scale, Math.abs(v));
  const tol = 1e-8 * scale;
  const raw: RawLevel[] = [];
  for (const run of clusterSorted(values, tol)) {
    const energy = run.reduce((s, i) => s + (values[i] ?? 0), 0) / run.length;
    const bySpin = new Map<number, { block: number; j: number }[]>();
    for (const i of run) {
      const item = pool[i];
      const block = item && blocks[item.block];
      if (!item || !block) continue;
      const list = bySpin.get(block.S) ?? [];
      list.push(item);
      bySpin.set(block.S, list);
    }
    for (const [S, items] of bySpin) {
      const perClass = [0, 0, 0];
      for (const it of items) {
        const k = blocks[it.block]?.k ?? 0;
        perClass[k] = (perClass[k] ?? 0) + 1;
      }
      const counts: [number, number, number] = [perClass[0] ?? 0, perClass[1] ?? 0, perClass[2] ?? 0];
      const decomposition = decomposeCubic(
        counts,
        () => items.reduce((sum, it) => sum + (blocks[it.block]?.parity ?? 0), 0),
        () => {
          let trace = 0;
          for (const it of items) {
            const block = blocks[it.block];
            const eig = block?.c3Sum ? eigOf(it.block) : undefined;
            if (!block?.c3Sum || !eig) continue;
            const v = column(eig.vectors, eig.size, it.j);
            trace += bilinear(v, block.c3Sum, v);
          }
          return trace;
        },
      );
      const weights = [0, 0, 0, 0, 0];
      for (const it of vectors ? items : []) {
        const block = blocks[it.block];
        const eig = eigs[it.block];
        if (!block || !eig) continue;
        const m = eig.size;
        for (let r = 0; r < m; r++) {
          const x = eig.vectors[r * m + it.j] ?? 0;
          const b = block.eCount[r] ?? 0;
          weights[b] = (weights[b] ?? 0) + (x * x) / items.length;
        }
      }
      for (const irrep of CUBIC_IRREPS) {
        for (let c = 0; c < decomposition[irrep]; c++) raw.push({ S, irrep, energy, weights });
      }
    }
  }
  return finish(n, dqOct, B, C, geometry, raw);
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

/**
 * The total spin S of the ground state for a signed, octahedral-convention Dq, from the
 * eigenvalues alone (no vectors, no labels): for scans that only watch the ground spin change.
 */
export function groundSpin(n: number, dqOct: number, B: number, C: number): number {
  checkMagnitudes(dqOct, B, C);
  let lowest = Number.POSITIVE_INFINITY;
  let S = 0;
  for (const block of adaptedBlocks(n)) {
    const v = tridiagonalQlValues(blockMatrix(block, dqOct, B, C), block.size)[0];
    if (v !== undefined && v < lowest) {
      lowest = v;
      S = block.S;
    }
  }
  return S;
}

/** The label, symbol and parent of the i-th lowest level of one (S, irrep). */
interface PlannedLabel {
  readonly label: string;
  readonly symbol: string;
  readonly parent: string;
}

const planCache = new Map<string, Map<string, PlannedLabel[]>>();
const PLAN_CACHE_SIZE = 64;

/**
 * Labels of every level of dⁿ, by (S, irrep) and rank in energy: the i-th lowest level of a
 * symbol comes from the i-th lowest free-ion component of it (levels of one symbol never cross);
 * a symbol that occurs more than once gets its parent term letter, and one that still repeats an
 * ordinal. Only the order of the free-ion terms matters, and it depends on C/B alone, so the plan
 * is computed once per (n, geometry, C/B); terms degenerate in the free ion are ordered by L then
 * S, so that the plan does not depend on rounding.
 */
function labelPlan(n: number, B: number, C: number, geometry: Geometry): Map<string, PlannedLabel[]> {
  const ratio = B > 0 ? C / B : Number.NaN;
  const key = `${n}:${geometry}:${Number.isNaN(ratio) ? 'none' : ratio.toPrecision(12)}`;
  const cached = planCache.get(key);
  if (cached) return cached;
  const terms = freeIonTerms(n, B > 0 ? 1000 : 0, B > 0 ? 1000 * ratio : 0)
    .map((t) => ({ t, e: Math.round(t.energy * 1e3) }))
    .sort((a, b) => a.e - b.e || a.t.L - b.t.L || a.t.S - b.t.S)
    .map((x) => x.t);
  const entries: { key: string; symbol: string; parent: string }[] = [];
  for (const term of terms) {
    const branches = branchTerm(term.L);
    for (const irrep of CUBIC_IRREPS) {
      for (let c = 0; c < branches[irrep]; c++) {
        entries.push({
          key: `${term.S}:${irrep}`,
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
  const plan = new Map<string, PlannedLabel[]>();
  entries.forEach((e, i) => {
    let label = withParent[i] ?? e.symbol;
    if ((labelCount.get(label) ?? 0) > 1) {
      const k = (ordinal.get(label) ?? 0) + 1;
      ordinal.set(label, k);
      label = `${label.slice(0, -1)},${k})`;
    }
    plan.set(e.key, [...(plan.get(e.key) ?? []), { label, symbol: e.symbol, parent: e.parent }]);
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
  const rank = new Map<string, number>();
  const levels: CubicLevel[] = raw.map((p) => {
    const key = `${p.S}:${p.irrep}`;
    const i = rank.get(key) ?? 0;
    rank.set(key, i + 1);
    const planned = plan.get(key)?.[i];
    if (!planned)
      throw new Error(`cubic labelling: no free-ion parent for level ${i + 1} of ${key} in d${n}`);
    const configurations: ConfigurationWeight[] = [];
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
      irrep: irrepName(p.irrep, geometry),
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
