/**
 * `termsplit levels`: checks the ion or dⁿ, Dq, B and C into a cubic-field calculation, solves
 * it with the library, prints every level (text or JSON) with the predicted bands and cautions,
 * and draws the energy-level diagram if asked.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { DEFAULT_LEVEL_CEILING, DEFAULT_LEVEL_FORBIDDEN, formatOfPath } from '../../charts/figureFormat.js';
import type { LevelDiagramOptions } from '../../charts/levelDiagram.js';
import { cubicCautions } from '../../src/analysis/cautions.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import { BAND_CEILING } from '../../src/core/defaults.js';
import { elementOfIon, findIon } from '../../src/core/ions.js';
import { ENERGY_LIMIT, LABEL_COUNT_LIMIT } from '../../src/core/limits.js';
import { cmToEv, cmToNm } from '../../src/core/units.js';
import type { CubicLevel } from '../../src/field/cubic.js';
import { unicodeConfiguration, unicodeLabel, unicodeTerm } from '../../src/field/labels.js';
import { type SpinOrbitResult, solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { addFieldOptions, type FieldOptions, hasFieldOptions } from '../fieldOptions.js';
import { writeFileAtomic } from '../files.js';
import { fixed, ionText, jsonText, listSection, table, unicodeIons } from '../format.js';
import type { Io } from '../io.js';
import {
  cbHelp,
  DPI_OPTION,
  figureSizeOptions,
  GEOMETRY_OPTION,
  type LevelOptions,
  levelsFromOptions,
  numberOption,
  SINGLE_ELECTRON_ORIGIN,
  SIZE_OPTION,
  type SolvedLevels,
} from '../options.js';
import { levelJson } from '../present/levelPresent.js';
import { spinOrbitJson, spinOrbitText } from '../present/spinOrbitPresent.js';
import { ZETA_FACTOR_HELP, ZETA_HELP, zetaOption } from '../zetaOption.js';

/** Options of `termsplit levels`. */
export interface LevelsOptions extends LevelOptions {
  emax?: string;
  forbidden?: string;
  size?: string;
  dpi?: string;
  zeta?: string;
  zetaFactor?: string;
  output?: string;
  json?: boolean;
}

/** `termsplit levels`: every level of dⁿ in a cubic field, labelled, with the predicted bands. */
export function registerLevels(program: Command, io: Io): void {
  const command = program
    .command('levels')
    .description(COMMAND_SUMMARIES.levels.description)
    .option('--ion <name>', 'the metal ion, e.g. Cr3+ (gives n and the free-ion C/B)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option('--dq <cm-1>', 'ligand-field parameter Dq (10Dq = Δ), cm⁻¹')
    .option('--B <cm-1>', 'Racah B of the complex, cm⁻¹')
    .option('--C <cm-1>', 'Racah C of the complex, cm⁻¹')
    .option('--cb <ratio>', cbHelp('C/B instead of --C'))
    .option(...GEOMETRY_OPTION)
    .option('--zeta <cm-1|ion>', ZETA_HELP)
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option('-o, --output <file>', 'also draw the energy-level diagram, free ion → field: .png, .svg or .pdf')
    .option(
      '--emax <cm-1>',
      `top of the level diagram, cm⁻¹ above the ground level (default ${DEFAULT_LEVEL_CEILING})`,
    )
    .option(
      '--forbidden <n>',
      `spin-forbidden levels in the diagram, the lowest (default ${DEFAULT_LEVEL_FORBIDDEN})`,
    )
    .option(...SIZE_OPTION)
    .option(...DPI_OPTION)
    .option('--json', 'print one JSON object on stdout');
  addFieldOptions(command).action(async (opts: LevelsOptions & FieldOptions) => {
    if (hasFieldOptions(opts)) {
      const { distortedLevels } = await import('../distorted.js');
      io.out(distortedLevels(opts, io));
      return;
    }
    const figure = opts.output === undefined ? undefined : resolve(io.cwd, opts.output);
    const format = opts.output === undefined ? undefined : formatOfPath(opts.output);
    const solved = levelsFromOptions(opts);
    const spinOrbit = spinOrbitFromOptions(opts, solved);
    if (figure !== undefined && format !== undefined) {
      const { renderLevelDiagram } = await import('../../charts/levelDiagram.js');
      writeFileAtomic(
        figure,
        renderLevelDiagram(solved.result, { format, ...figureSizeOptions(opts) }, levelFigure(opts, solved)),
      );
    }
    io.out(levelsText(opts, solved, figure, spinOrbit));
  });
}

/** The level diagram's options from --emax and --forbidden. */
function levelFigure(opts: LevelsOptions, solved: SolvedLevels): LevelDiagramOptions {
  const eMax = numberOption('--emax', opts.emax, ENERGY_LIMIT);
  const forbidden = numberOption('--forbidden', opts.forbidden, LABEL_COUNT_LIMIT);
  return {
    ...(solved.ion ? { ion: solved.ion } : {}),
    ...(eMax !== undefined ? { eMax } : {}),
    ...(forbidden !== undefined ? { forbidden } : {}),
  };
}

/** The levels with spin–orbit coupling when `--zeta` is given, at the same Dq, B and C. */
function spinOrbitFromOptions(opts: LevelsOptions, solved: SolvedLevels): SpinOrbitResult | undefined {
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, opts.ion === undefined ? undefined : findIon(opts.ion));
  if (zeta === undefined) return undefined;
  const { n, geometry, dq, B, C } = solved.result;
  return solveSpinOrbit({ n, geometry, dq, B, C, zeta });
}

function levelsText(
  opts: LevelsOptions,
  solved: SolvedLevels,
  figure: string | undefined,
  spinOrbit: SpinOrbitResult | undefined,
): string {
  const { result, cOrigin, ion } = solved;
  const cautions = cubicCautions(result, elementOfIon(ion));
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
      ...(spinOrbit ? { spinOrbit: spinOrbitJson(spinOrbit) } : {}),
      ...(figure !== undefined ? { figure } : {}),
    });
  }
  const g = result.ground;
  const lines: string[] = [];
  const geometryName = result.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  lines.push(
    `${ionText(ion, result.n)}, ${geometryName}: Dq = ${fixed(result.dq)} cm⁻¹ (10Dq = ${fixed(10 * result.dq)}), ` +
      `B = ${fixed(result.B)} cm⁻¹, C = ${fixed(result.C)} cm⁻¹ (${cOrigin === SINGLE_ELECTRON_ORIGIN ? cOrigin : `C/B ${fixed(result.C / result.B, 2)}, ${unicodeIons(cOrigin)}`})`,
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
  const shown = bands.filter((l) => l.energy <= BAND_CEILING);
  lines.push('');
  lines.push(`Predicted spin-allowed bands (from ${unicodeLabel(g.label)}):`);
  lines.push(shown.length > 0 ? table(headers, shown.map(row)) : `  none below ${BAND_CEILING} cm⁻¹`);
  if (shown.length < bands.length) {
    lines.push(
      `  (${bands.length - shown.length} more above ${BAND_CEILING} cm⁻¹ (200 nm), in the table below)`,
    );
  }
  lines.push('');
  lines.push('All levels:');
  lines.push(table(headers, result.levels.map(row)));
  lines.push(
    ...listSection(
      'Cautions:',
      cautions.map((c) => c.message),
    ),
  );
  if (spinOrbit) lines.push('', spinOrbitText(spinOrbit));
  lines.push('');
  lines.push('These are model predictions for an ideal cubic field, not measurements.');
  if (figure !== undefined) lines.push(`Level diagram written to ${figure}`);
  return `${lines.join('\n')}\n`;
}
