/**
 * The level tables of the page as HTML text: every cubic level at the current parameters (label,
 * parent term, strong-field make-up, energy in cm⁻¹, nm and eV, spin-allowed flag) and, with
 * ζ > 0, the spin–orbit levels with their parentage. Each cubic row carries its label and exact
 * energy as data attributes, for hover and for checking.
 */

import { cmToEv, cmToNm } from '../src/core/units.js';
import type { CubicLevel } from '../src/field/cubic.js';
import { unicodeConfiguration, unicodeLabel, unicodeTerm } from '../src/field/labels.js';
import type { SpinOrbitResult } from '../src/field/spinOrbitSolver.js';
import { esc } from './svg.js';

/** Configurations below this weight are left out of the make-up text. */
const MAKEUP_FLOOR = 0.02;

/** Parents below this weight are left out of a spin–orbit level's list (they would show as 0 %). */
const PARENT_FLOOR = 0.005;

/** The strong-field make-up of a level, e.g. `t₂g⁵ eg¹ 97 %, t₂g⁴ eg² 3 %`. */
export function makeUp(level: CubicLevel): string {
  return level.configurations
    .filter((c) => c.weight >= MAKEUP_FLOOR)
    .map((c) => `${unicodeConfiguration(c.text)} ${Math.round(100 * c.weight)} %`)
    .join(', ');
}

function energyCells(energy: number): string {
  const nm = energy > 0 ? cmToNm(energy).toFixed(1) : '—';
  return `<td class="num">${energy.toFixed(1)}</td><td class="num">${nm}</td><td class="num">${cmToEv(energy).toFixed(3)}</td>`;
}

const ENERGY_HEADS = '<th scope="col">E / cm⁻¹</th><th scope="col">λ / nm</th><th scope="col">E / eV</th>';

/** Rows of the cubic levels, ground first. */
export function levelTable(levels: readonly CubicLevel[]): string {
  const rows = levels.map(
    (l) =>
      `<tr tabindex="0" data-label="${esc(l.label)}" data-energy="${l.energy}" class="${l.spinAllowed ? 'allowed' : 'forbidden'}">` +
      `<th scope="row">${esc(unicodeLabel(l.label))}</th><td>${esc(unicodeTerm(l.parent))}</td><td>${esc(makeUp(l))}</td>` +
      `${energyCells(l.energy)}<td>${l.spinAllowed ? 'yes' : 'no'}</td></tr>`,
  );
  return (
    `<table id="level-table"><caption>Levels at the current parameters (no spin–orbit coupling)</caption>` +
    `<thead><tr><th scope="col">Level</th><th scope="col">Parent term</th><th scope="col">Strong-field make-up</th>${ENERGY_HEADS}<th scope="col">Spin-allowed</th></tr></thead>` +
    `<tbody>${rows.join('')}</tbody></table>`
  );
}

/** Rows of the spin–orbit levels with their largest parents. */
export function spinOrbitTable(result: SpinOrbitResult): string {
  const rows = result.levels.map(
    (l) =>
      `<tr data-energy="${l.energy}"><th scope="row">${esc(l.label)}</th><td class="num">${l.degeneracy}</td>${energyCells(l.energy)}` +
      `<td>${esc(
        l.parentage
          .filter((p) => p.weight >= PARENT_FLOOR)
          .slice(0, 3)
          .map((p) => `${unicodeLabel(p.state)} ${Math.round(100 * p.weight)} %`)
          .join(', '),
      )}</td></tr>`,
  );
  return (
    `<table id="spin-orbit-table"><caption>Levels with spin–orbit coupling, ζ = ${result.zeta} cm⁻¹</caption>` +
    `<thead><tr><th scope="col">Level</th><th scope="col">Degeneracy</th>${ENERGY_HEADS}<th scope="col">Parents</th></tr></thead>` +
    `<tbody>${rows.join('')}</tbody></table>`
  );
}
