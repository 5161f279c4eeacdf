/**
 * `termsplit magnetism`: checks the ion or dⁿ, field, Racah parameters, ζ, k, g and the
 * temperature range into one job; computes χ, χT and μ_eff against T from all states with
 * spin–orbit coupling; prints the table beside the spin-only moment (text or JSON) and draws
 * μ_eff and χT against T if asked.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { formatOfPath } from '../../charts/figureFormat.js';
import { spinOnlyMoment } from '../../src/analysis/magnetism.js';
import {
  DEFAULT_ORBITAL_REDUCTION,
  DEFAULT_SPIN_G,
  MAX_TEMPERATURE,
  MIN_TEMPERATURE,
  type MomentPoint,
  susceptibility,
} from '../../src/analysis/susceptibility.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import { InputError } from '../../src/core/errors.js';
import { findIon } from '../../src/core/ions.js';
import {
  G_FACTOR_LIMIT,
  ORBITAL_REDUCTION_LIMIT,
  STEPS_LIMIT,
  TEMPERATURE_LIMIT,
} from '../../src/core/limits.js';
import { unicodeIon, unicodeLabel } from '../../src/field/labels.js';
import { spinOrbitLevels } from '../../src/field/spinOrbitSolver.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { writeFileAtomic } from '../files.js';
import { fixed, jsonText } from '../format.js';
import type { Io } from '../io.js';
import { GEOMETRY_OPTION, type LevelOptions, levelsFromOptions, numberOption } from '../options.js';
import { momentsText, parentageText } from '../present/spinOrbitPresent.js';
import { ZETA_FACTOR_HELP, zetaOption } from '../zetaOption.js';

/** Lowest temperature of the table and figure unless given, K. */
export const DEFAULT_T_MIN = 2;
/** Highest temperature unless given, K. */
export const DEFAULT_T_MAX = 300;
/** Temperatures of the printed table unless `--steps` is given (those within the range, with its ends), K. */
export const TABLE_TEMPERATURES = [2, 5, 10, 20, 30, 50, 77, 100, 150, 200, 250, 300, 400, 500] as const;
/** Temperatures drawn in the figure, evenly spaced. */
export const FIGURE_TEMPERATURES = 200;

/** Options of `termsplit magnetism`, as commander hands them over. */
export interface MagnetismOptions extends LevelOptions {
  zeta?: string;
  zetaFactor?: string;
  k?: string;
  g?: string;
  tmin?: string;
  tmax?: string;
  steps?: string;
  output?: string;
  json?: boolean;
}

/** `termsplit magnetism`: μ_eff and χT against temperature with spin–orbit coupling. */
export function registerMagnetism(program: Command, io: Io): void {
  program
    .command('magnetism')
    .description(COMMAND_SUMMARIES.magnetism.description)
    .option('--ion <name>', 'the metal ion, e.g. Co2+ (gives n, the free-ion C/B and ζ)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option('--dq <cm-1>', 'ligand-field parameter Dq (10Dq = Δ), cm⁻¹')
    .option('--B <cm-1>', 'Racah B of the complex, cm⁻¹')
    .option('--C <cm-1>', 'Racah C of the complex, cm⁻¹')
    .option('--cb <ratio>', 'C/B instead of --C (default: the free-ion ratio of the ion, else 4.5)')
    .option(...GEOMETRY_OPTION)
    .option(
      '--zeta <cm-1|ion>',
      'spin–orbit ζ, cm⁻¹, or "ion" for the free-ion value (default: ion, with --ion)',
    )
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option(
      '--k <factor>',
      'orbital reduction factor k on L in the Zeeman term, 0–1',
      String(DEFAULT_ORBITAL_REDUCTION),
    )
    .option('--g <value>', 'spin g factor of the Zeeman term', String(DEFAULT_SPIN_G))
    .option('--tmin <K>', 'lowest temperature, K', String(DEFAULT_T_MIN))
    .option('--tmax <K>', 'highest temperature, K', String(DEFAULT_T_MAX))
    .option(
      '--steps <n>',
      `table at n + 1 evenly spaced temperatures (default: ${TABLE_TEMPERATURES.join(', ')} K within the range)`,
    )
    .option('-o, --output <file>', 'also draw μ_eff and χT against T: .png, .svg or .pdf')
    .option('--json', 'print one JSON object on stdout')
    .action(async (opts: MagnetismOptions) => {
      io.out(await magnetismCommand(opts, io));
    });
}

/** Evenly spaced temperatures from `lo` to `hi`, both included. */
function temperatureGrid(lo: number, hi: number, steps: number): number[] {
  return Array.from({ length: steps + 1 }, (_, i) => lo + ((hi - lo) * i) / steps);
}

/** The table's temperatures: the usual ones within [lo, hi] with both ends. */
function tableTemperatures(lo: number, hi: number): number[] {
  return [...new Set([lo, ...TABLE_TEMPERATURES.filter((t) => t > lo && t < hi), hi])];
}

function temperatureRange(opts: MagnetismOptions): { tmin: number; tmax: number; steps: number | undefined } {
  const what = `a number of K from ${MIN_TEMPERATURE} to ${MAX_TEMPERATURE}`;
  const tmin = numberOption('--tmin', opts.tmin, TEMPERATURE_LIMIT) ?? DEFAULT_T_MIN;
  const tmax = numberOption('--tmax', opts.tmax, TEMPERATURE_LIMIT) ?? DEFAULT_T_MAX;
  if (tmax > MAX_TEMPERATURE) throw new InputError(`--tmax "${opts.tmax}": expected ${what}`);
  if (!(tmax > tmin)) throw new InputError(`--tmax "${opts.tmax}": expected more than --tmin ${tmin}`);
  const steps = numberOption('--steps', opts.steps, STEPS_LIMIT);
  if (steps !== undefined && steps > 1000)
    throw new InputError(`--steps "${opts.steps}": expected a whole number from 1 to 1000`);
  return { tmin, tmax, steps };
}

async function magnetismCommand(opts: MagnetismOptions, io: Io): Promise<string> {
  const solved = levelsFromOptions(opts);
  const { result } = solved;
  const ion = opts.ion === undefined ? undefined : findIon(opts.ion);
  const zeta = zetaOption(opts.zeta ?? (ion ? 'ion' : undefined), opts.zetaFactor, ion);
  if (zeta === undefined) throw new InputError('--zeta is required without --ion (a number of cm⁻¹)');
  const k = numberOption('--k', opts.k, ORBITAL_REDUCTION_LIMIT) ?? DEFAULT_ORBITAL_REDUCTION;
  const g = numberOption('--g', opts.g, G_FACTOR_LIMIT) ?? DEFAULT_SPIN_G;
  const { tmin, tmax, steps } = temperatureRange(opts);
  const base = {
    n: result.n,
    geometry: result.geometry,
    dq: result.dq,
    B: result.B,
    C: result.C,
    zeta,
    k,
    g,
  };
  const temperatures =
    steps === undefined ? tableTemperatures(tmin, tmax) : temperatureGrid(tmin, tmax, steps);
  const points = susceptibility({ ...base, temperatures });
  const ground = result.ground;
  const spinOnly = ground.S > 0 ? spinOnlyMoment(ground.S) : null;
  // The JSON names the ground level only; its parentage (a projection on every cubic level) is for the text.
  const soGround = spinOrbitLevels(
    result.n,
    result.geometry === 'oct' ? result.dq : -result.dq,
    result.B,
    result.C,
    zeta,
    result.geometry,
    !opts.json,
  ).ground;
  let figure: string | undefined;
  if (opts.output !== undefined) {
    figure = resolve(io.cwd, opts.output);
    const curve = susceptibility({
      ...base,
      temperatures: temperatureGrid(tmin, tmax, FIGURE_TEMPERATURES - 1),
    });
    const who =
      `${solved.ion ? unicodeIon(solved.ion) : ''} d${result.n} ${result.geometry === 'oct' ? 'Oh' : 'Td'}`.trim();
    const title = `${who}: Dq = ${fixed(result.dq)}, B = ${fixed(result.B)}, ζ = ${fixed(zeta)} cm⁻¹, k = ${k}`;
    const { renderMoments } = await import('../../charts/moments.js');
    writeFileAtomic(
      figure,
      renderMoments({ title, points: curve, spinOnly }, { format: formatOfPath(opts.output) }),
    );
  }
  const caution =
    'ideal cubic single ion: distortion (Jahn–Teller, lower symmetry), exchange between ions and covalency beyond k ' +
    'change real moments, most of all at low temperature; measured data decide';
  if (opts.json) {
    return jsonText({
      ...(solved.ion ? { ion: solved.ion } : {}),
      ...base,
      tenDq: 10 * result.dq,
      ground: { withoutSpinOrbit: ground.label, S: ground.S, spinOnly, withSpinOrbit: soGround.label },
      units: { T: 'K', chi: 'cm³ mol⁻¹ (cgs-emu)', chiT: 'cm³ K mol⁻¹', muEff: 'μ_B' },
      points,
      cautions: [caution],
      ...(figure !== undefined ? { figure } : {}),
    });
  }
  return magnetismText(solved.ion, result, { zeta, k, g }, points, spinOnly, soGround, figure, caution);
}

function magnetismText(
  ion: string | undefined,
  result: ReturnType<typeof levelsFromOptions>['result'],
  model: { zeta: number; k: number; g: number },
  points: readonly MomentPoint[],
  spinOnly: number | null,
  soGround: ReturnType<typeof spinOrbitLevels>['ground'],
  figure: string | undefined,
  caution: string,
): string {
  const g = result.ground;
  const lines = [
    `${ion ? `${ion} ` : ''}d${result.n}, ${result.geometry === 'oct' ? 'octahedral' : 'tetrahedral'}: Dq = ${fixed(result.dq)} cm⁻¹, ` +
      `B = ${fixed(result.B)} cm⁻¹, C = ${fixed(result.C)} cm⁻¹; ζ = ${fixed(model.zeta)} cm⁻¹, k = ${model.k}, g = ${model.g}`,
    `Ground term ${unicodeLabel(g.label)} (S = ${halfIntegerText(g.S)}, spin-only ${spinOnly === null ? '0' : fixed(spinOnly, 3)} μ_B); ` +
      `with spin–orbit coupling the ground level is ${soGround.irrep} (${parentageText(soGround.parentage, 2)})`,
    '',
    momentsText(points, spinOnly),
    '',
    'χ and μ_eff from every state by Van Vleck’s formula (Zeeman term μ_B(kL + gS)); χ includes the temperature-independent part.',
    `Caution: ${caution}.`,
  ];
  if (figure !== undefined) lines.push('', `Figure: ${figure}`);
  return `${lines.join('\n')}\n`;
}
