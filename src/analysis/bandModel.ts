/**
 * Band energies as smooth functions of (Dq, B, C). A level is followed by its identity — its
 * state symbol ²ˢ⁺¹Γ and its rank among the levels of that symbol — not by its index in the
 * energy order: levels of one symbol never cross as the parameters change (von Neumann &
 * Wigner, Phys. Z. 30, 467, 1929), so the k-th ⁴T₁g stays the k-th ⁴T₁g, while levels of
 * different symbols cross freely. The identity is also what the solver's labels are built from
 * (the k-th lowest level of a symbol gets the k-th lowest parent term), but it does not depend
 * on the free-ion term order, which changes with C/B.
 */

import { type CubicLevel, type CubicResult, cubicLevels } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';

/** Dq, Racah B and C of a cubic complex, cm⁻¹ (Dq ≥ 0 in either geometry). */
export interface FieldParameters {
  readonly dq: number;
  readonly B: number;
  readonly C: number;
}

/** The levels of dⁿ at the given parameters (the full solver). */
export function solveAt(n: number, geometry: Geometry, p: FieldParameters): CubicResult {
  return cubicLevels(n, geometry === 'oct' ? p.dq : -p.dq, p.B, p.C, geometry);
}

/** Identity keys of `result.levels`, in the same order, e.g. `4T1g#1` for the second ⁴T₁g. */
export function levelKeys(result: CubicResult): string[] {
  const seen = new Map<string, number>();
  return result.levels.map((level) => {
    const rank = seen.get(level.symbol) ?? 0;
    seen.set(level.symbol, rank + 1);
    return `${level.symbol}#${rank}`;
  });
}

/**
 * ∂E/∂Dq of a level, exactly, by the Hellmann–Feynman theorem (Feynman, Phys. Rev. 56, 340,
 * 1939): ∂E/∂Dq = ⟨ψ|V|ψ⟩, and the cubic field V is diagonal in the strong-field configurations
 * t₂ᵃeᵇ (−4 per t₂ electron, +6 per e electron in Oh; the opposite in Td, where Dq enters with
 * the other sign), so ⟨ψ|V|ψ⟩ = Σ weight(t₂ᵃeᵇ)·(6b − 4a). The configuration weights of a
 * degenerate level are the average over its components, which share ⟨V⟩ by symmetry.
 */
export function fieldSlope(level: CubicLevel, geometry: Geometry): number {
  const sign = geometry === 'oct' ? 1 : -1;
  return sign * level.configurations.reduce((s, c) => s + c.weight * (6 * c.e - 4 * c.t2), 0);
}

/** Band energies and their slopes ∂E/∂Dq, in the order of the keys asked for. */
export interface Transitions {
  /** Energy of each level above the reference level, cm⁻¹. */
  readonly energies: number[];
  /** ∂(energy)/∂Dq of each. */
  readonly slopes: number[];
}

/**
 * Energies of the levels `keys` above the level `groundKey` (the band positions when
 * `groundKey` is the ground state), with their Dq slopes. Differences of two smooth
 * eigenvalues, so smooth in (Dq, B, C) even where the lowest level changes.
 * @throws Error when a key does not exist for this dⁿ (a caller's bug, not bad input).
 */
export function transitions(result: CubicResult, groundKey: string, keys: readonly string[]): Transitions {
  const byKey = new Map<string, CubicLevel>();
  levelKeys(result).forEach((k, i) => {
    const level = result.levels[i];
    if (level) byKey.set(k, level);
  });
  const of = (key: string) => {
    const level = byKey.get(key);
    if (!level) throw new Error(`no level ${key} for d${result.n}`);
    return level;
  };
  const ground = of(groundKey);
  const groundSlope = fieldSlope(ground, result.geometry);
  const levels = keys.map(of);
  return {
    energies: levels.map((l) => l.energy - ground.energy),
    slopes: levels.map((l) => fieldSlope(l, result.geometry) - groundSlope),
  };
}
