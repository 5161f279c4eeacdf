import { resolve } from 'node:path';
import type { Command } from 'commander';
import { renderDiagram } from '../../charts/diagram.js';
import { type FigureFormat, formatOfPath } from '../../charts/render.js';
import {
  cmToNm,
  DEFAULT_MAX_DELTA_OVER_B,
  type FitResult,
  type FitSolution,
  fitBands,
  InputError,
  parseEnergyList,
  parseUnit,
  sweepDiagram,
  unicodeLabel,
} from '../../src/index.js';
import { checkOutputDirectory, writeFileAtomic } from '../files.js';
import { fixed, jsonText, table } from '../format.js';
import { type Io, progress } from '../io.js';
import { geometryOption, ionOrCount, numberOption, ratioChoice } from '../options.js';

/** Options of `termsplit fit`. */
export interface FitOptions {
  ion?: string;
  d?: string;
  bands?: string;
  unit?: string;
  geometry?: string;
  cb?: string;
  fitC?: boolean;
  assign?: string;
  spinForbidden?: boolean;
  spinState?: string;
  B?: string;
  diagram?: string;
  json?: boolean;
}

/**
 * Predicted levels up to this energy are listed in the human output, cm⁻¹ (200 nm, about where
 * UV-vis spectrometers stop: common practice, no source); `--json` lists all.
 */
export const PREDICTION_LIMIT = 50000;

/** `termsplit fit`: Dq, B (and C) from observed band maxima, with the assignment search. */
export function registerFit(program: Command, io: Io): void {
  program
    .command('fit')
    .description('fit Dq and Racah B (and C) to observed d–d band maxima, assigning the bands')
    .option('--ion <name>', 'the metal ion, e.g. Ni2+ (gives n, the free-ion B for β and the default C/B)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option(
      '--bands <list>',
      'band maxima, comma-separated: 8500,13800,25300 (cm⁻¹), 1176nm, 1.05eV, 25.3kK; 25300±300 with an uncertainty',
    )
    .option('--unit <unit>', 'unit of band values given without one: cm-1, nm, eV or kK', 'cm-1')
    .option('--geometry <oct|tet>', 'octahedral or tetrahedral', 'oct')
    .option('--cb <ratio>', 'C/B held in the fit (default: the free-ion ratio of the ion, else 4.5)')
    .option('--fit-c', 'fit C too (needs at least 3 bands, one of which depends on C)')
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
      'hold Racah B at this value and fit Dq alone (for one band, e.g. high-spin d4 or d6)',
    )
    .option(
      '--diagram <file>',
      'draw the correlation diagram at the fitted C/B with the sample on it (.png, .svg, .pdf)',
    )
    .option('--json', 'print one JSON object on stdout')
    .action((opts: FitOptions) => {
      io.out(fitCommand(opts, io));
    });
}

/**
 * Splits a comma-separated list of level labels, keeping commas inside parentheses
 * (`3T1g(H,1)`).
 */
export function splitLabels(text: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let current = '';
  for (const c of text) {
    if (c === '(') depth++;
    if (c === ')') depth = Math.max(0, depth - 1);
    if (c === ',' && depth === 0) {
      out.push(current.trim());
      current = '';
    } else {
      current += c;
    }
  }
  out.push(current.trim());
  return out;
}

/** Parses `--spin-state`. */
export function spinStateOption(text: string): 'high' | 'low' {
  const t = text.trim().toLowerCase();
  if (t === 'high' || t === 'hs' || t === 'high-spin') return 'high';
  if (t === 'low' || t === 'ls' || t === 'low-spin') return 'low';
  throw new InputError(`--spin-state "${text}": expected high or low`);
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
  const unit = parseUnit(opts.unit ?? 'cm-1');
  const bands = parseEnergyList(opts.bands, unit).map((b) =>
    b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
  );
  const single = choice.n === 1 || choice.n === 9;
  const heldB = numberOption('--B', opts.B, { positive: true, what: 'a positive number of cm⁻¹' });
  const ratio = ratioChoice(undefined, undefined, opts.cb, choice.ion);
  const assignments =
    opts.assign === undefined
      ? undefined
      : splitLabels(opts.assign).map((a) => (a === '?' || a === '' ? null : a));
  const result = fitBands({
    n: choice.n,
    geometry,
    bands,
    ...(choice.ion ? { freeIon: choice.ion } : {}),
    cOverB: ratio.cOverB,
    fitC: Boolean(opts.fitC),
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

/**
 * The correlation diagram at the best solution's C/B, wide enough to hold the sample, with the
 * sample at its fitted Δ/B and its observed bands as points.
 */
export function fittedDiagram(
  result: FitResult,
  best: FitSolution,
  format: FigureFormat,
  ion?: string,
): Buffer {
  if (best.deltaOverB === null || best.cOverB === null) {
    throw new InputError(`--diagram: a diagram in units of B needs d2 to d8; d${result.n} has no Racah B`);
  }
  const maxDeltaOverB = Math.max(DEFAULT_MAX_DELTA_OVER_B, Math.ceil((1.25 * best.deltaOverB) / 10) * 10);
  const diagram = sweepDiagram(result.n, { geometry: result.geometry, cOverB: best.cOverB, maxDeltaOverB });
  return renderDiagram(
    diagram,
    { format },
    {
      sample: { dq: best.dq, B: best.B, bands: result.bands.map((b) => b.energy), label: 'fitted sample' },
      ...(ion ? { ion } : {}),
    },
  );
}

/** Whether only Dq was fitted (d¹, d⁹). */
function single(s: FitSolution): boolean {
  return s.parameters.length === 1 && !s.bHeld;
}

/** JSON form of one solution (the solver's full levels left out). */
export function solutionJson(s: FitSolution) {
  return {
    rank: s.rank,
    dq: s.dq,
    tenDq: s.tenDq,
    B: single(s) ? null : s.B,
    C: single(s) ? null : s.C,
    cOverB: s.cOverB,
    cFitted: s.cFitted,
    bHeld: s.bHeld,
    deltaOverB: s.deltaOverB,
    beta: s.beta,
    rms: s.rms,
    weightedRms: s.weightedRms,
    chiSquare: s.chiSquare,
    dof: s.dof,
    converged: s.converged,
    reason: s.reason,
    reasonText: s.reasonText,
    iterations: s.iterations,
    errors: s.errors,
    errorBasis: s.errorBasis,
    errorNote: s.errorNote,
    parameters: s.parameters,
    covariance: s.covariance,
    ground: s.ground,
    assignments: s.assignments.map((a) => ({
      band: a.band,
      observed: a.observed,
      sigma: a.sigma,
      calculated: a.calculated,
      difference: a.difference,
      label: a.label,
      spinAllowed: a.spinAllowed,
    })),
    predicted: s.predicted.map((p) => ({
      label: p.label,
      energy: p.energy,
      wavelength: p.energy > 0 ? cmToNm(p.energy) : null,
      spinAllowed: p.spinAllowed,
      band: p.band,
    })),
    warnings: s.warnings,
  };
}

/** A value with its standard error, both to two significant digits of the error. */
export function withError(value: number, error: number | null, digits = 0): string {
  if (error === null || !(error > 0)) return fixed(value, digits);
  const d = Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(error))));
  return `${fixed(value, d)} ± ${fixed(error, d)}`;
}

function solutionSummary(s: FitSolution): string {
  const beta = s.beta === null ? '' : `, β ${fixed(s.beta, 2)}`;
  const assigned = s.assignments
    .map((a) => `${fixed(a.observed)} → ${unicodeLabel(a.label)}${a.spinAllowed ? '' : ' (spin-forbidden)'}`)
    .join(', ');
  const flags = s.warnings
    .filter((w) => w.code === 'beta-above-one' || w.code === 'range-edge' || w.code === 'not-converged')
    .map((w) => w.code);
  return (
    `#${s.rank}  Dq ${fixed(s.dq)}, 10Dq ${fixed(s.tenDq)}${single(s) ? '' : `, B ${fixed(s.B)}`}${beta}, ` +
    `rms ${fixed(s.rms)} cm⁻¹: ${assigned}${flags.length > 0 ? `  [${flags.join(', ')}]` : ''}`
  );
}

/** The JSON form of a fit result (solutions best first). */
export function fitJson(result: FitResult, ion: string | undefined, cOrigin: string) {
  return {
    ...(ion ? { ion } : {}),
    n: result.n,
    geometry: result.geometry,
    cOverB: result.cOverB,
    cOrigin,
    fitC: result.fitC,
    freeIon: result.freeIon,
    bands: result.bands.map((b) => ({ energy: b.energy, sigma: b.sigma ?? null })),
    weighting: result.weighting,
    tried: result.tried,
    refined: result.refined,
    omitted: result.omitted,
    solutions: result.solutions.map(solutionJson),
    warnings: result.warnings,
  };
}

/** The human form of a fit result. */
export function fitText(result: FitResult, ion: string | undefined, cOrigin: string): string {
  const best = result.solutions[0];
  if (!best) throw new Error('fit returned no solution');
  const geometryName = result.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const lines: string[] = [];
  const bandList = result.bands
    .map((b) => `${fixed(b.energy)}${b.sigma === undefined ? '' : `±${fixed(b.sigma)}`}`)
    .join(', ');
  lines.push(
    `Fit of ${ion ? `${ion} (d${result.n})` : `d${result.n}`}, ${geometryName}, to ${result.bands.length} band${result.bands.length === 1 ? '' : 's'}: ${bandList} cm⁻¹`,
  );
  const cLine = single(best)
    ? 'only Dq enters (one d electron or hole)'
    : best.bHeld
      ? `B held at ${fixed(best.B)} cm⁻¹ (given) and C/B at ${fixed(result.cOverB, 2)} (${cOrigin}); only Dq fitted`
      : result.fitC && best.cFitted
        ? `C fitted, starting from C/B ${fixed(result.cOverB, 2)} (${cOrigin})`
        : result.fitC
          ? `C asked to be fitted, but no assigned band depends on it: held at C/B ${fixed(result.cOverB, 2)} (${cOrigin})`
          : `C/B held at ${fixed(result.cOverB, 2)} (${cOrigin})`;
  lines.push(
    `${cLine}; bands weighted ${result.weighting === 'given' ? 'by their given uncertainties' : 'equally (no uncertainties given)'}`,
  );
  lines.push(
    `${result.tried} assignment${result.tried === 1 ? '' : 's'} tried on the Δ/B scan, ${result.refined} starting point${result.refined === 1 ? '' : 's'} refined by least squares, ` +
      `${result.solutions.length} solution${result.solutions.length === 1 ? '' : 's'} shown` +
      `${result.omitted > 0 ? ` (and ${result.omitted} more that fit nearly as well)` : ''}.`,
  );
  lines.push('');
  lines.push(`Best solution${result.solutions.length > 1 ? ` (1 of ${result.solutions.length})` : ''}:`);
  const e = best.errors;
  lines.push(
    `  Dq   = ${withError(best.dq, e.dq, 1)} cm⁻¹   (10Dq = Δ = ${withError(best.tenDq, e.tenDq)} cm⁻¹)`,
  );
  if (!single(best)) {
    lines.push(`  B    = ${withError(best.B, e.B)} cm⁻¹${best.bHeld ? '   (held)' : ''}`);
    lines.push(
      best.cFitted
        ? `  C    = ${withError(best.C, e.C)} cm⁻¹   (C/B = ${withError(best.cOverB ?? 0, e.cOverB, 2)})`
        : `  C    = ${fixed(best.C)} cm⁻¹   (held at C/B ${fixed(best.cOverB ?? 0, 2)})`,
    );
    if (best.beta !== null && result.freeIon) {
      lines.push(
        `  β    = ${withError(best.beta, e.beta, 3)}   (B / free-ion B = ${fixed(result.freeIon.B)} cm⁻¹ of ${ion ?? 'the ion'})`,
      );
      if (result.freeIon.source) lines.push(`         free-ion B: ${result.freeIon.source}`);
    }
    lines.push(`  Δ/B  = ${withError(best.deltaOverB ?? 0, e.deltaOverB, 2)}`);
  }
  lines.push(
    `  rms  = ${fixed(best.rms)} cm⁻¹ (${result.bands.length} band${result.bands.length === 1 ? '' : 's'}, ` +
      `${best.dof} degree${best.dof === 1 ? '' : 's'} of freedom)`,
  );
  lines.push(`  errors: ${best.errorNote}`);
  lines.push(
    `  ${best.converged ? 'converged' : 'NOT converged'}: ${best.reasonText} (${best.iterations} iteration${best.iterations === 1 ? '' : 's'})`,
  );
  lines.push('');
  lines.push(
    table(
      ['band', 'observed cm⁻¹', 'nm', 'calculated cm⁻¹', 'obs − calc', 'assigned to', 'spin'],
      best.assignments.map((a) => [
        String(a.band + 1),
        a.sigma === null ? fixed(a.observed) : `${fixed(a.observed)}±${fixed(a.sigma)}`,
        fixed(cmToNm(a.observed), 1),
        fixed(a.calculated),
        fixed(Math.abs(a.difference) < 0.5 ? 0 : a.difference),
        unicodeLabel(a.label),
        a.spinAllowed ? 'allowed' : 'forbidden',
      ]),
    ),
  );
  lines.push('');
  const alternatives = result.solutions.slice(1);
  if (alternatives.length === 0) {
    lines.push(
      result.tried === 1
        ? 'Alternatives: none (this was the only assignment to try).'
        : 'Alternatives: none fits nearly as well.',
    );
  } else {
    lines.push('Alternatives that fit nearly as well:');
    for (const s of alternatives) lines.push(`  ${solutionSummary(s)}`);
    if (result.omitted > 0) lines.push(`  … and ${result.omitted} more that fit nearly as well (not shown)`);
  }
  lines.push('');
  const shown = best.predicted.filter((p) => p.energy <= PREDICTION_LIMIT);
  lines.push(
    `Predicted bands of the best solution (from the ground state ${unicodeLabel(best.ground)}, up to ${PREDICTION_LIMIT} cm⁻¹):`,
  );
  lines.push(
    table(
      ['level', 'cm⁻¹', 'nm', 'spin', 'observed'],
      shown.map((p) => [
        unicodeLabel(p.label),
        fixed(p.energy),
        fixed(cmToNm(p.energy), 1),
        p.spinAllowed ? 'allowed' : 'forbidden',
        p.band === null ? '' : `band ${p.band + 1}`,
      ]),
    ),
  );
  const warnings = [...best.warnings, ...result.warnings];
  if (warnings.length > 0) {
    lines.push('');
    lines.push('Warnings and cautions:');
    for (const w of warnings) lines.push(`  - ${w.message}`);
  }
  lines.push('');
  lines.push('These are model results for an ideal cubic field; the spectrum and other measurements decide.');
  return `${lines.join('\n')}\n`;
}

function fitCommand(opts: FitOptions, io: Io): string {
  const diagramPath = opts.diagram === undefined ? undefined : resolve(io.cwd, opts.diagram);
  const diagramFormat = opts.diagram === undefined ? undefined : formatOfPath(opts.diagram);
  if (diagramPath !== undefined) checkOutputDirectory(diagramPath);
  const bar = progress(io, 'fitting');
  let fitted: ReturnType<typeof fitFromOptions>;
  try {
    fitted = fitFromOptions(opts, (done, total) => bar.update(done, total));
  } finally {
    bar.end();
  }
  const { result, ion, cOrigin } = fitted;
  const best = result.solutions[0];
  if (diagramPath !== undefined && diagramFormat !== undefined && best) {
    writeFileAtomic(diagramPath, fittedDiagram(result, best, diagramFormat, ion));
  }
  const figureNote =
    diagramPath !== undefined && best
      ? `Correlation diagram with the sample written to ${opts.diagram}\n`
      : '';
  if (!opts.json) return fitText(result, ion, cOrigin) + figureNote;
  return jsonText({
    ...(diagramPath !== undefined ? { diagram: best ? opts.diagram : null } : {}),
    ...fitJson(result, ion, cOrigin),
  });
}
