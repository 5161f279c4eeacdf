/**
 * Text and JSON of the levels of a distorted complex: the geometry used, the point group, the
 * d orbital energies, the nearest cubic field, every level with its cubic parent, the predicted
 * spin-allowed bands, the levels with spin–orbit coupling when ζ was given, and the cautions.
 */

import { type DistortedCaution, distortedCautions } from '../../src/analysis/distortedCautions.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import { cmToEv, cmToNm } from '../../src/core/units.js';
import type { Ligand } from '../../src/field/angularOverlap.js';
import type { DistortedResult, DistortedSpinOrbitResult } from '../../src/field/distortedComplex.js';
import type { FieldSpinOrbitLevel } from '../../src/field/fieldSpinOrbit.js';
import { SUBSCRIPT, SUPERSCRIPT, unicodeLabel } from '../../src/field/labels.js';
import type { FieldLevel } from '../../src/field/lowSymmetrySolver.js';
import type { GeometryUsed } from '../fieldOptions.js';
import { fixed, table } from '../format.js';

/** Unicode form of a state label of any point group: `3B1g(2)` → `³B₁g(2)`, `2E"` → `²E″`. */
export function unicodeGroupLabel(label: string): string {
  const m = /^(\d+)([ABET])(\d?)([gu]?)(['"]?)(.*)$/.exec(label);
  if (!m) return unicodeLabel(label);
  const [, mult = '', letter = '', index = '', parity = '', prime = '', rest = ''] = m;
  const primes = prime === "'" ? '′' : prime === '"' ? '″' : '';
  return `${[...mult].map((c) => SUPERSCRIPT[c] ?? c).join('')}${letter}${SUBSCRIPT[index] ?? index}${parity}${primes}${rest}`;
}

/** A short line describing the geometry used. */
export function geometryLine(geometry: GeometryUsed, group: string): string {
  if (geometry.source === 'tetragonal' || geometry.source === 'trigonal') {
    const values = Object.entries(geometry.parameters)
      .map(([k, v]) => `${k} = ${fixed(v as number)}`)
      .join(', ');
    return `${geometry.source} field (${group}): ${values} cm⁻¹`;
  }
  const kinds = new Map<string, number>();
  for (const l of geometry.ligands ?? []) kinds.set(l.kind, (kinds.get(l.kind) ?? 0) + 1);
  const bonds = Object.entries(geometry.parameters)
    .map(([k, p]) => {
      if (typeof p === 'number') return `${k} ${fixed(p)}`;
      const b = p as { eSigma: number; ePi?: number; ePiX?: number; ePiY?: number };
      const pi =
        b.ePiX !== undefined || b.ePiY !== undefined
          ? `eπ(z plane) ${fixed(b.ePiX ?? 0)}, eπ(across) ${fixed(b.ePiY ?? 0)}`
          : `eπ ${fixed(b.ePi ?? 0)}`;
      return `${kinds.get(k) ?? 0}× ${k} eσ ${fixed(b.eSigma)}, ${pi}`;
    })
    .join('; ');
  const where = geometry.source === 'xyz' ? `coordinates from ${geometry.name}` : geometry.name;
  return `${where}${geometry.angle !== undefined ? ` (angle ${fixed(geometry.angle, 2)}°)` : ''}, ${group}: ${bonds} cm⁻¹`;
}

function parentText(l: FieldLevel): string {
  return l.cubicParent ? `${unicodeLabel(l.cubicParent.label)} ${fixed(100 * l.cubicParent.weight)}%` : '—';
}

/** The caution list of a result. */
export function cautionsOf(result: DistortedResult, geometry: GeometryUsed): DistortedCaution[] {
  const ligands: Ligand[] | undefined = geometry.ligands?.map((l) => ({
    kind: l.kind,
    direction: [l.direction[0] ?? 0, l.direction[1] ?? 0, l.direction[2] ?? 0],
  }));
  const eDs = geometry.parameters.eDs;
  return distortedCautions(result, ligands, typeof eDs === 'number' ? eDs : 0);
}

function spinOrbitOf(result: DistortedResult): DistortedSpinOrbitResult['spinOrbit'] | undefined {
  return 'spinOrbit' in result ? (result as DistortedSpinOrbitResult).spinOrbit : undefined;
}

/** The JSON of the levels with ζ, or nothing without. */
function spinOrbitJson(result: DistortedResult): Record<string, unknown> {
  const so = spinOrbitOf(result);
  if (!so) return {};
  return {
    spinOrbit: {
      zeta: so.zeta,
      kramers: so.kramers,
      pointGroup: so.pointGroup ?? null,
      levels: so.levels.map((l) => ({
        index: l.index,
        energy: l.energy,
        degeneracy: l.degeneracy,
        pointGroupLabel: l.pointGroupLabel ?? null,
        parent: l.parent ?? null,
        cubicParent: l.cubicParent ?? null,
      })),
    },
  };
}

/** The text lines of the levels with ζ, or none without. */
function spinOrbitLines(result: DistortedResult): string[] {
  const so = spinOrbitOf(result);
  if (!so) return [];
  const weight = (p: { label: string; weight: number } | undefined, name: (s: string) => string) =>
    p ? `${p.label.split('/').map(name).join('/')} ${fixed(100 * p.weight)}%` : '—';
  const group = so.pointGroup;
  const row = (l: FieldSpinOrbitLevel) => [
    String(l.index),
    fixed(l.energy, 0),
    String(l.degeneracy),
    ...(group ? [l.pointGroupLabel ?? '?'] : []),
    weight(l.parent, unicodeGroupLabel),
    weight(l.cubicParent, (s) => s),
  ];
  const headers = [
    '#',
    'cm⁻¹',
    'degeneracy',
    ...(group ? [`in ${group}`] : []),
    'level without ζ',
    'cubic parent with ζ',
  ];
  const pairs = so.levels.some((l) => /Γ5g?\+Γ6/.test(l.pointGroupLabel ?? ''));
  const notation = !group
    ? []
    : so.kramers
      ? [
          `Levels in ${group}: spinor irreps of the double group ${group}* in Bethe's Γ notation (Koster et al. 1963)${pairs ? '; Γ5+Γ6 is a pair of complex-conjugate irreps kept degenerate by time reversal' : ''}.`,
        ]
      : [`Levels in ${group}: irreps of the total (orbital × spin) state.`];
  return [
    '',
    `With spin–orbit coupling, ζ = ${fixed(so.zeta)} cm⁻¹${so.kramers ? ' (odd electron count: every level a Kramers doublet at least)' : ''}:`,
    table(headers, so.levels.map(row)),
    ...notation,
  ];
}

/** The JSON object of a distorted result. */
export function distortedJson(
  result: DistortedResult,
  geometry: GeometryUsed,
  extra: Record<string, unknown> = {},
): unknown {
  return {
    ...extra,
    n: result.n,
    B: result.B,
    C: result.C,
    geometry,
    group: result.group,
    cubic: { dq: result.cubic.dq, tenDq: 10 * result.cubic.dq, misfit: result.cubic.misfit },
    orbitals: result.orbitals,
    ground: result.ground.label,
    levels: result.levels.map((l) => ({
      label: l.label,
      symbol: l.symbol,
      S: l.S,
      irrep: l.irrep ?? null,
      energy: l.energy,
      degeneracy: l.degeneracy,
      spinAllowed: l.spinAllowed,
      cubicParent: l.cubicParent ?? null,
    })),
    bands: result.levels.filter((l) => l !== result.ground && l.spinAllowed).map((l) => l.label),
    ...spinOrbitJson(result),
    cautions: cautionsOf(result, geometry).map((c) => c.message),
  };
}

/** The text of a distorted result, `title` naming the ion or dⁿ. */
export function distortedText(result: DistortedResult, geometry: GeometryUsed, title: string): string {
  const g = result.ground;
  const lines = [
    result.n === 1 || result.n === 9
      ? `${title}: one d electron or hole, so B and C play no part`
      : `${title}: B = ${fixed(result.B)} cm⁻¹, C = ${fixed(result.C)} cm⁻¹`,
    `Geometry: ${geometryLine(geometry, result.group)}`,
    `d orbitals (cm⁻¹ from their barycentre): ${result.orbitals.map((o) => `${o.irrep} ${fixed(o.energy)}`).join(', ')}`,
    `Nearest cubic field: Dq = ${fixed(result.cubic.dq)} cm⁻¹ (${result.cubic.dq >= 0 ? 'octahedral' : 'tetrahedral'} sense), misfit ${fixed(100 * result.cubic.misfit)}% of the field`,
    `Ground state: ${unicodeGroupLabel(g.label)} (S = ${halfIntegerText(g.S)})${g.cubicParent ? `, from cubic ${unicodeLabel(g.cubicParent.label)}` : ''}`,
  ];
  const headers = ['level', 'cm⁻¹', 'nm', 'eV', 'degeneracy', 'cubic parent', 'spin'];
  const row = (l: FieldLevel) => [
    unicodeGroupLabel(l.label),
    fixed(l.energy, 0),
    l.energy > 0 ? fixed(cmToNm(l.energy), 1) : '—',
    fixed(cmToEv(l.energy), 3),
    String(l.degeneracy),
    parentText(l),
    l === g ? 'ground' : l.spinAllowed ? 'allowed' : 'forbidden',
  ];
  const bands = result.levels.filter((l) => l !== g && l.spinAllowed);
  lines.push('', `Predicted spin-allowed bands (from ${unicodeGroupLabel(g.label)}):`);
  lines.push(bands.length > 0 ? table(headers, bands.map(row)) : '  none');
  lines.push('', 'All levels:', table(headers, result.levels.map(row)));
  lines.push(...spinOrbitLines(result));
  const cautions = cautionsOf(result, geometry);
  if (cautions.length > 0) lines.push('', 'Cautions:', ...cautions.map((c) => `  - ${c.message}`));
  lines.push('', 'These are model predictions for the geometry and parameters given, not measurements.');
  return `${lines.join('\n')}\n`;
}
