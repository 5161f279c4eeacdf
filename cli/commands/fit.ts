/**
 * `termsplit fit`: checks the options into a fit of band maxima (ion or dⁿ, bands in their unit,
 * geometry, C/B, assignments, spin state, held B, merging), runs the library's band fit with progress on
 * stderr, prints the text or JSON form and draws the correlation diagram if asked.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { formatOfPath } from '../../charts/figureFormat.js';
import { DEFAULT_ENERGY_UNIT } from '../../src/core/defaults.js';
import { InputError } from '../../src/core/errors.js';
import { findIon } from '../../src/core/ions.js';
import { COMPLEX_B_LIMIT } from '../../src/core/limits.js';
import { parseEnergyList, parseUnit } from '../../src/core/units.js';
import { fitBands } from '../../src/fit/fitBands.js';
import type { FitResult } from '../../src/fit/fitTypes.js';
import { refineFitWithZeta, type ZetaFit } from '../../src/fit/zetaFit.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import type { DistortedFitOptions } from '../distorted.js';
import { addFieldOptions, hasFieldOptions } from '../fieldOptions.js';
import { checkOutputDirectory, writeFileAtomic } from '../files.js';
import { jsonText } from '../format.js';
import { type Io, progress } from '../io.js';
import {
  cbHelp,
  DPI_OPTION,
  figureSizeOptions,
  GEOMETRY_OPTION,
  geometryOption,
  ionOrCount,
  numberOption,
  ratioChoice,
  SIZE_OPTION,
  spinStateOption,
  splitLabels,
} from '../options.js';
import { fitJson, fitText } from '../present/fitPresent.js';
import { zetaFitJson, zetaFitText } from '../present/spinOrbitPresent.js';
import { ZETA_FACTOR_HELP, zetaOption } from '../zetaOption.js';

/** Options of `termsplit fit`. */
export interface FitOptions {
  ion?: string;
  d?: string;
  bands?: string;
  unit?: string;
  geometry?: string;
  cb?: string;
  fitC?: boolean;
  keepBands?: boolean;
  assign?: string;
  spinForbidden?: boolean;
  spinState?: string;
  B?: string;
  diagram?: string;
  size?: string;
  dpi?: string;
  zeta?: string;
  zetaFactor?: string;
  fitZeta?: boolean;
  zetaLevels?: string;
  json?: boolean;
}

/** `termsplit fit`: Dq, B (and C) from observed band maxima, with the assignment search. */
export function registerFit(program: Command, io: Io): void {
  const command = program
    .command('fit')
    .description(COMMAND_SUMMARIES.fit.description)
    .option('--ion <name>', 'the metal ion, e.g. Ni2+ (gives n, the free-ion B for β and the default C/B)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option(
      '--bands <list>',
      'band maxima, comma-separated: 8500,13800,25300 (cm⁻¹), 1176nm, 1.05eV, 25.3kK; 25300±300 with an uncertainty',
    )
    .option('--unit <unit>', 'unit of band values given without one: cm-1, nm, eV or kK', DEFAULT_ENERGY_UNIT)
    .option(...GEOMETRY_OPTION)
    .option('--cb <ratio>', cbHelp('C/B held in the fit'))
    .option(
      '--fit-c',
      'fit C too (needs at least 3 bands, one of which depends on C); without it, C is fitted where the bands fix it unless --cb is given',
    )
    .option(
      '--keep-bands',
      'fit bands closer than a band width as separate transitions (by default they are merged at their centroid)',
    )
    .option(
      '--assign <labels>',
      'level for each band in order, e.g. 3T2g,3T1g(F),3T1g(P); ? leaves one to the search',
    )
    .option('--spin-forbidden', 'let the search assign bands to spin-forbidden transitions too')
    .option(
      '--spin-state <high|low>',
      'the ground-state spin when it is known (e.g. from magnetism): fit only that',
    )
    .option(
      '--B <cm-1>',
      'hold Racah B at this value and fit Dq alone (one band at 10Dq, as of high-spin d4 or d6, fixes Dq without it)',
    )
    .option(
      '--diagram <file>',
      'draw the correlation diagram at the fitted C/B with the sample on it (.png, .svg, .pdf)',
    )
    .option(
      '--free <names>',
      'with a geometry: the parameters to fit, e.g. "eSigma(eq),ePi(eq),B" (default: all and B)',
    )
    .option('--start-B <cm-1>', 'with a geometry: starting Racah B (default: 0.75 × the free-ion B)')
    .option(
      '--zeta <cm-1|ion>',
      'then refine the best solution with spin–orbit coupling, ζ held (cm⁻¹, or "ion" for the free-ion value)',
    )
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option(
      '--fit-zeta',
      'fit ζ too, from the resolved components of a split band (give each component; ζ starts at --zeta, else the free-ion value of --ion); held, with a warning, where the bands do not determine it',
    )
    .option(
      '--zeta-levels <labels>',
      'with --fit-zeta: the spin–orbit level of each resolved component, lowest first, e.g. Γ3(2),Γ3(3) (default: chosen by energy)',
    )
    .option(...SIZE_OPTION)
    .option(...DPI_OPTION)
    .option('--json', 'print one JSON object on stdout');
  addFieldOptions(command).action(async (opts: FitOptions & DistortedFitOptions) => {
    if (hasFieldOptions(opts)) {
      for (const [flag, given] of [
        ['--fit-c', opts.fitC],
        ['--spin-forbidden', opts.spinForbidden],
        ['--spin-state', opts.spinState],
        ['--diagram', opts.diagram],
        ['--zeta', opts.zeta],
        ['--fit-zeta', opts.fitZeta],
        ['--zeta-levels', opts.zetaLevels],
      ] as const) {
        if (given !== undefined)
          throw new InputError(`${flag} is for cubic fits: leave it out with a geometry`);
      }
      const { distortedFitCommand } = await import('../distorted.js');
      io.out(distortedFitCommand(opts, io));
      return;
    }
    io.out(await fitCommand(opts, io));
  });
}

/** The fit from the command's options, with the ion's name and the origin of C/B. */
export function fitFromOptions(
  opts: FitOptions,
  onProgress?: (done: number, total: number) => void,
): { result: FitResult; ion?: string; cOrigin: string } {
  const choice = ionOrCount(opts.ion, opts.d);
  const geometry = geometryOption(opts.geometry);
  if (opts.bands === undefined) {
    throw new InputError('--bands is required: give the observed band maxima, e.g. --bands 8500,13800,25300');
  }
  const unit = parseUnit(opts.unit ?? DEFAULT_ENERGY_UNIT);
  const bands = parseEnergyList(opts.bands, unit).map((b) =>
    b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
  );
  const single = choice.n === 1 || choice.n === 9;
  const heldB = numberOption('--B', opts.B, COMPLEX_B_LIMIT);
  const ratio = ratioChoice(undefined, undefined, opts.cb, choice.ion);
  const assignments =
    opts.assign === undefined
      ? undefined
      : splitLabels(opts.assign).map((a) => (a === '?' || a === '' ? null : a));
  // Fewer labels than bands would leave the last bands free without saying so.
  if (assignments && assignments.length !== bands.length) {
    throw new InputError(
      `--assign "${opts.assign}": ${assignments.length} label${assignments.length === 1 ? '' : 's'} for ${bands.length} band${bands.length === 1 ? '' : 's'}: expected one per band, in band order (? leaves a band free)`,
    );
  }
  // C is fitted when asked, held when C/B is given, and otherwise fitted where the bands fix it.
  const fitC = opts.fitC ? true : opts.cb !== undefined ? false : undefined;
  const result = fitBands({
    n: choice.n,
    geometry,
    bands,
    ...(choice.ion ? { freeIon: choice.ion } : {}),
    cOverB: ratio.cOverB,
    ...(fitC !== undefined ? { fitC } : {}),
    merge: !opts.keepBands,
    includeSpinForbidden: Boolean(opts.spinForbidden),
    ...(opts.spinState !== undefined ? { spinState: spinStateOption(opts.spinState) } : {}),
    ...(heldB !== undefined ? { fixedB: heldB } : {}),
    ...(assignments ? { assignments } : {}),
    ...(onProgress ? { onProgress } : {}),
  });
  return {
    result,
    ...(choice.ion ? { ion: choice.ion.ion } : {}),
    cOrigin: single ? 'not used (one d electron or hole)' : ratio.origin,
  };
}

async function fitCommand(opts: FitOptions, io: Io): Promise<string> {
  const diagramPath = opts.diagram === undefined ? undefined : resolve(io.cwd, opts.diagram);
  const diagramFormat = opts.diagram === undefined ? undefined : formatOfPath(opts.diagram);
  if (diagramPath !== undefined) checkOutputDirectory(diagramPath);
  const size = figureSizeOptions(opts);
  const bar = progress(io, 'fitting');
  let fitted: ReturnType<typeof fitFromOptions>;
  try {
    fitted = fitFromOptions(opts, (done, total) => bar.update(done, total));
  } finally {
    bar.end();
  }
  const { result, ion, cOrigin } = fitted;
  const best = result.solutions[0];
  const spinOrbit = best ? spinOrbitRefinement(opts, result, best) : undefined;
  if (diagramPath !== undefined && diagramFormat !== undefined && best) {
    const { fittedDiagram } = await import('../present/fittedDiagram.js');
    writeFileAtomic(diagramPath, fittedDiagram(result, best, diagramFormat, ion, size));
  }
  const figureNote =
    diagramPath !== undefined && best
      ? `Correlation diagram with the sample written to ${opts.diagram}\n`
      : '';
  if (!opts.json) {
    return fitText(result, ion, cOrigin) + (spinOrbit ? `\n${zetaFitText(spinOrbit)}` : '') + figureNote;
  }
  return jsonText({
    ...(diagramPath !== undefined ? { diagram: best ? opts.diagram : null } : {}),
    ...fitJson(result, ion, cOrigin),
    ...(spinOrbit ? { spinOrbit: zetaFitJson(spinOrbit) } : {}),
  });
}

/**
 * With `--zeta` or `--fit-zeta`: the best solution refined with spin–orbit coupling, ζ held (each
 * band on the centroid of its level's components) or fitted from resolved components.
 */
function spinOrbitRefinement(
  opts: FitOptions,
  result: FitResult,
  best: FitResult['solutions'][number],
): ZetaFit | undefined {
  const ion = opts.ion === undefined ? undefined : findIon(opts.ion);
  const fitZeta = Boolean(opts.fitZeta);
  // With --fit-zeta alone, ζ starts at the ion's free-ion value.
  const zetaText = opts.zeta ?? (fitZeta && ion?.zeta !== undefined ? 'ion' : undefined);
  if (fitZeta && zetaText === undefined) {
    throw new InputError(
      '--fit-zeta needs a starting ζ: give --zeta (cm⁻¹), or an --ion with a tabulated free-ion ζ',
    );
  }
  if (opts.zetaLevels !== undefined && !fitZeta)
    throw new InputError('--zeta-levels goes with --fit-zeta: it assigns the components ζ is fitted to');
  const zeta = zetaOption(zetaText, opts.zetaFactor, ion);
  if (zeta === undefined) return undefined;
  // Γ may be typed as G where the keyboard has no Greek.
  const components =
    opts.zetaLevels === undefined ? undefined : splitLabels(opts.zetaLevels.replace(/G(?=\d)/g, 'Γ'));
  return refineFitWithZeta(result, best, {
    zeta,
    fitZeta,
    ...(components ? { components } : {}),
    ...(ion?.zeta !== undefined ? { freeIonZeta: ion.zeta } : {}),
  });
}
