import { resolve } from 'node:path';
import type { Command } from 'commander';
import { renderLevelDiagram } from '../../charts/levelDiagram.js';
import { formatOfPath } from '../../charts/render.js';
import {
  type CubicLevel,
  type CubicResult,
  cmToEv,
  cmToNm,
  cubicCautions,
  halfIntegerText,
  solveCubic,
  unicodeConfiguration,
  unicodeLabel,
  unicodeTerm,
} from '../../src/index.js';
import { writeFileAtomic } from '../files.js';
import { fixed, jsonText, table } from '../format.js';
import type { Io } from '../io.js';
import { geometryOption, ionOrCount, numberOption, ratioChoice, requiredNumber } from '../options.js';

/** Bands above this (cm⁻¹; 200 nm) are left out of the band list, though not out of the level table. */
const BAND_TABLE_LIMIT = 50000;

const SINGLE = 'B and C play no part for one d electron or hole';

/** Options of `termsplit levels`. */
export interface LevelsOptions {
  ion?: string;
  d?: string;
  dq?: string;
  B?: string;
  C?: string;
  cb?: string;
  geometry?: string;
  output?: string;
  json?: boolean;
}

/** `termsplit levels`: every level of dⁿ in a cubic field, labelled, with the predicted bands. */
export function registerLevels(program: Command, io: Io): void {
  program
    .command('levels')
    .description(
      'levels of dⁿ in an octahedral or tetrahedral field, labelled, with predicted band positions',
    )
    .option('--ion <name>', 'the metal ion, e.g. Cr3+ (gives n and the free-ion C/B)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option('--dq <cm-1>', 'ligand-field parameter Dq (10Dq = Δ), cm⁻¹')
    .option('--B <cm-1>', 'Racah B of the complex, cm⁻¹')
    .option('--C <cm-1>', 'Racah C of the complex, cm⁻¹')
    .option('--cb <ratio>', 'C/B instead of --C (default: the free-ion ratio of the ion, else 4.5)')
    .option('--geometry <oct|tet>', 'octahedral or tetrahedral', 'oct')
    .option('-o, --output <file>', 'also draw the energy-level diagram, free ion → field: .png, .svg or .pdf')
    .option('--json', 'print one JSON object on stdout')
    .action((opts: LevelsOptions) => {
      const figure = opts.output === undefined ? undefined : resolve(io.cwd, opts.output);
      const format = opts.output === undefined ? undefined : formatOfPath(opts.output);
      const solved = levelsFromOptions(opts);
      if (figure !== undefined && format !== undefined) {
        const options = solved.ion ? { ion: solved.ion } : {};
        writeFileAtomic(figure, renderLevelDiagram(solved.result, { format }, options));
      }
      io.out(levelsText(opts, solved, figure));
    });
}

/** Solves the levels from the command's options. */
export function levelsFromOptions(opts: LevelsOptions): {
  result: CubicResult;
  cOrigin: string;
  ion?: string;
} {
  const choice = ionOrCount(opts.ion, opts.d);
  const geometry = geometryOption(opts.geometry);
  const dq = requiredNumber('--dq', opts.dq, { min: 0, what: 'a non-negative number of cm⁻¹' });
  const single = choice.n === 1 || choice.n === 9;
  const B = single
    ? (numberOption('--B', opts.B, { min: 0, what: 'a non-negative number of cm⁻¹' }) ?? 0)
    : requiredNumber('--B', opts.B, { positive: true, what: 'a positive number of cm⁻¹' });
  const ratio = ratioChoice(B, opts.C, opts.cb, choice.ion);
  const C = B * ratio.cOverB;
  const result = solveCubic({ n: choice.n, geometry, dq, B, C });
  return {
    result,
    cOrigin: single ? SINGLE : ratio.origin,
    ...(choice.ion ? { ion: choice.ion.ion } : {}),
  };
}

/** JSON form of one level. */
export function levelJson(l: CubicLevel) {
  return {
    label: l.label,
    symbol: l.symbol,
    S: l.S,
    irrep: l.irrep,
    energy: l.energy,
    wavelength: l.energy > 0 ? cmToNm(l.energy) : null,
    eV: cmToEv(l.energy),
    degeneracy: l.degeneracy,
    spinAllowed: l.spinAllowed,
    parent: l.parent,
    configuration: l.configuration,
    configurations: l.configurations.map((c) => ({ configuration: c.text, weight: c.weight })),
  };
}

function levelsText(
  opts: LevelsOptions,
  solved: ReturnType<typeof levelsFromOptions>,
  figure: string | undefined,
): string {
  const { result, cOrigin, ion } = solved;
  const cautions = cubicCautions(result);
  if (opts.json) {
    return jsonText({
      ...(ion ? { ion } : {}),
      n: result.n,
      geometry: result.geometry,
      dq: result.dq,
      tenDq: 10 * result.dq,
      B: result.B,
      C: result.C,
      cOverB: result.B > 0 ? result.C / result.B : null,
      cOrigin,
      ground: result.ground.label,
      levels: result.levels.map(levelJson),
      bands: result.levels.filter((l) => l !== result.ground && l.spinAllowed).map((l) => l.label),
      cautions: cautions.map((c) => c.message),
      ...(figure !== undefined ? { figure } : {}),
    });
  }
  const g = result.ground;
  const lines: string[] = [];
  const geometryName = result.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  lines.push(
    `${ion ? `${ion} ` : ''}d${result.n}, ${geometryName}: Dq = ${fixed(result.dq)} cm⁻¹ (10Dq = ${fixed(10 * result.dq)}), ` +
      `B = ${fixed(result.B)} cm⁻¹, C = ${fixed(result.C)} cm⁻¹ (${cOrigin === SINGLE ? cOrigin : `C/B ${fixed(result.C / result.B, 2)}, ${cOrigin}`})`,
  );
  lines.push(
    `Ground state: ${unicodeLabel(g.label)} (S = ${halfIntegerText(g.S)}), from ${unicodeTerm(g.parent)}, ` +
      `${unicodeConfiguration(g.configuration)} ${fixed(100 * (g.configurations[0]?.weight ?? 0))} %`,
  );
  const row = (l: CubicLevel) => [
    unicodeLabel(l.label),
    fixed(l.energy, 0),
    l.energy > 0 ? fixed(cmToNm(l.energy), 1) : '—',
    fixed(cmToEv(l.energy), 3),
    String(l.degeneracy),
    unicodeTerm(l.parent),
    `${unicodeConfiguration(l.configuration)} ${fixed(100 * (l.configurations[0]?.weight ?? 0))}%`,
    l === g ? 'ground' : l.spinAllowed ? 'allowed' : 'forbidden',
  ];
  const headers = ['level', 'cm⁻¹', 'nm', 'eV', 'degeneracy', 'parent', 'main configuration', 'spin'];
  const bands = result.levels.filter((l) => l !== g && l.spinAllowed);
  const shown = bands.filter((l) => l.energy <= BAND_TABLE_LIMIT);
  lines.push('');
  lines.push(`Predicted spin-allowed bands (from ${unicodeLabel(g.label)}):`);
  lines.push(shown.length > 0 ? table(headers, shown.map(row)) : `  none below ${BAND_TABLE_LIMIT} cm⁻¹`);
  if (shown.length < bands.length) {
    lines.push(
      `  (${bands.length - shown.length} more above ${BAND_TABLE_LIMIT} cm⁻¹ (200 nm), in the table below)`,
    );
  }
  lines.push('');
  lines.push('All levels:');
  lines.push(table(headers, result.levels.map(row)));
  if (cautions.length > 0) {
    lines.push('');
    lines.push('Cautions:');
    for (const c of cautions) lines.push(`  - ${c.message}`);
  }
  lines.push('');
  lines.push('These are model predictions for an ideal cubic field, not measurements.');
  if (figure !== undefined) lines.push(`Level diagram written to ${figure}`);
  return `${lines.join('\n')}\n`;
}
