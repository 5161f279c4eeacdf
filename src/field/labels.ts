/**
 * Names of cubic states and strong-field configurations, as plain text (`4T1g(F)`,
 * `t2g^2 eg^1`) and in Unicode for human output (`⁴T₁g(F)`, `t₂g² eg¹`).
 */

import type { Geometry } from '../core/geometry.js';
import type { CubicIrrep } from './symmetry.js';

export type { Geometry };

/** Irrep name in the geometry: `T2g` in Oh (d functions are gerade), `T2` in Td. */
export function irrepName(irrep: CubicIrrep, geometry: Geometry): string {
  return geometry === 'oct' ? `${irrep}g` : irrep;
}

/** Plain-text state symbol ²ˢ⁺¹Γ, e.g. `4T2g`. */
export function stateSymbol(S: number, irrep: CubicIrrep, geometry: Geometry): string {
  return `${Math.round(2 * S + 1)}${irrepName(irrep, geometry)}`;
}

/**
 * Plain-text strong-field configuration: the lower orbital set first (t₂g in Oh, e in Td),
 * empty sets left out, e.g. `t2g^3`, `t2g^2 eg^1`, `e^2 t2^1`.
 */
export function configurationText(t2: number, e: number, geometry: Geometry): string {
  const parts =
    geometry === 'oct'
      ? [
          ['t2g', t2],
          ['eg', e],
        ]
      : [
          ['e', e],
          ['t2', t2],
        ];
  const text = parts
    .filter(([, count]) => (count as number) > 0)
    .map(([name, count]) => `${name}^${count}`)
    .join(' ');
  return text === '' ? '(empty)' : text;
}

/** Superscript digits. */
export const SUPERSCRIPT: Readonly<Record<string, string>> = {
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};
/** Subscript digits. */
export const SUBSCRIPT: Readonly<Record<string, string>> = {
  '0': '₀',
  '1': '₁',
  '2': '₂',
  '3': '₃',
  '4': '₄',
  '5': '₅',
  '6': '₆',
  '7': '₇',
  '8': '₈',
  '9': '₉',
};

/** The parts of a state label, for typesetting: `4T1g(F)` → 4, "T", "1", "g", "F". */
export interface LabelParts {
  readonly multiplicity: string;
  readonly letter: string;
  readonly index: string;
  readonly parity: string;
  /** What follows in parentheses (the parent term), or empty. */
  readonly parent: string;
}

/** Splits a plain-text state label; returns undefined when it is not one. */
export function parseStateLabel(label: string): LabelParts | undefined {
  const m = /^(\d+)([AET])([12]?)([gu]?)(?:\((.+)\))?$/.exec(label);
  if (!m) return undefined;
  const [, multiplicity = '', letter = '', index = '', parity = '', parent = ''] = m;
  return { multiplicity, letter, index, parity, parent };
}

/** Unicode rendering of a state label, e.g. `4T1g(F)` → `⁴T₁g(F)`; other text is returned as is. */
export function unicodeLabel(label: string): string {
  const p = parseStateLabel(label);
  if (!p) return label;
  const sup = [...p.multiplicity].map((c) => SUPERSCRIPT[c] ?? c).join('');
  const sub = [...p.index].map((c) => SUBSCRIPT[c] ?? c).join('');
  return `${sup}${p.letter}${sub}${p.parity}${p.parent ? `(${p.parent})` : ''}`;
}

/** Unicode rendering of a configuration text, e.g. `t2g^2 eg^1` → `t₂g² eg¹`. */
export function unicodeConfiguration(text: string): string {
  return text
    .split(' ')
    .map((part) => {
      const [name = '', count = ''] = part.split('^');
      const orbital = name.replace('t2', 't₂');
      return `${orbital}${[...count].map((c) => SUPERSCRIPT[c] ?? c).join('')}`;
    })
    .join(' ');
}

/** Unicode rendering of a term symbol such as `4F`, `a2D` or `4F3/2`. */
export function unicodeTerm(term: string): string {
  const m = /^([a-z]?)(\d+)([A-Z])(.*)$/.exec(term);
  if (!m) return term;
  const [, prefix = '', mult = '', letter = '', j = ''] = m;
  const sup = [...mult].map((c) => SUPERSCRIPT[c] ?? c).join('');
  const sub = [...j].map((c) => SUBSCRIPT[c] ?? c).join('');
  return `${prefix}${sup}${letter}${sub}`;
}

/** Unicode rendering of an ion name, e.g. `Cr3+` → `Cr³⁺`. */
export function unicodeIon(name: string): string {
  const m = /^([A-Z][a-z]?)(\d*)([+-])$/.exec(name);
  if (!m) return name;
  const [, element = '', charge = '', sign = ''] = m;
  return `${element}${[...charge].map((c) => SUPERSCRIPT[c] ?? c).join('')}${sign === '+' ? '⁺' : '⁻'}`;
}
