/**
 * Which dⁿ ions can change their ground-state spin as the ligand field grows: the rule that
 * decides whether a spin-crossover question has an answer at all.
 */

import type { Geometry } from '../core/geometry.js';

/**
 * Whether the ground state of dⁿ can change spin as Δ grows: d⁴–d⁷ in Oh, d³–d⁶ in Td (the
 * one-electron filling of t₂g/e_g, resp. e/t₂, offers two arrangements only there).
 */
export function hasSpinChoice(n: number, geometry: Geometry): boolean {
  return geometry === 'oct' ? n >= 4 && n <= 7 : n >= 3 && n <= 6;
}
