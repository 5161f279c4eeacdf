/**
 * `termsplit spectrum <file>`: checks the options into resolved spectrum-analysis options, reads
 * the file, runs the library's spectrum analysis (band finding, ligand-field fit or predicted
 * transitions, cautions), prints the bands and fit as text or JSON and draws the overlay figure.
 */

import { extname, resolve } from 'node:path';
import type { Command } from 'commander';
import { formatOfPath } from '../../charts/figureFormat.js';
import { quantityTitle } from '../../charts/style.js';
import { InputError } from '../../src/core/errors.js';
import type { Geometry } from '../../src/core/geometry.js';
import { elementOfIon } from '../../src/core/ions.js';
import {
  BAND_COUNT_LIMIT,
  BAND_WIDTH_LIMIT,
  COMPLEX_B_LIMIT,
  CONCENTRATION_LIMIT,
  PATH_LENGTH_LIMIT,
  SPECTRUM_ROWS_LIMIT,
} from '../../src/core/limits.js';
import { cmToNm } from '../../src/core/units.js';
import { unicodeLabel } from '../../src/field/labels.js';
import type { BaselineKind } from '../../src/spectra/bandDecomposition.js';
import type { FoundBand } from '../../src/spectra/bandFinding.js';
import { POSITION_WIDTH_FRACTION } from '../../src/spectra/bandObservations.js';
import {
  DEFAULT_BASELINE,
  DEFAULT_MAX_BANDS,
  DEFAULT_MIN_FWHM,
} from '../../src/spectra/bandSearchDefaults.js';
import { parseRange } from '../../src/spectra/energyRange.js';
import type {
  ColumnAnalysis,
  SettingNames,
  SpectrumAnalysis,
  SpectrumAnalysisOptions,
  SpectrumFitRequest,
} from '../../src/spectra/spectrumAnalysis.js';
import {
  ALL_COLUMNS,
  DEFAULT_X_COLUMN,
  DEFAULT_Y_COLUMN,
  isAllColumns,
  spectrumColumns,
} from '../../src/spectra/spectrumText.js';
import {
  parseXUnit,
  parseYUnit,
  X_UNIT_NAMES,
  Y_UNIT_CHOICES,
  Y_UNIT_NAMES,
} from '../../src/spectra/spectrumUnits.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { INPUT_FILE_MAX_TEXT, readTextFile, writeFilesAtomic } from '../files.js';
import { fixed, ionText, jsonText, messageLine, table } from '../format.js';
import { type Io, progress } from '../io.js';
import {
  DPI_OPTION,
  figureSizeOptions,
  GEOMETRY_OPTION,
  geometryOption,
  ionOrCount,
  levelsFromOptions,
  numberOption,
  ratioChoice,
  SIZE_OPTION,
  type SolvedLevels,
  spinStateOption,
} from '../options.js';
import { fitJson, fitText } from '../present/fitPresent.js';
import { levelJson } from '../present/levelPresent.js';

/** Options of `termsplit spectrum`. */
export interface SpectrumOptions {
  ion?: string;
  d?: string;
  geometry?: string;
  range?: string;
  xUnit?: string;
  yUnit?: string;
  xCol?: string;
  yCol?: string;
  conc?: string;
  path?: string;
  dq?: string;
  B?: string;
  C?: string;
  cb?: string;
  includeCt?: boolean;
  spinForbidden?: boolean;
  spinState?: string;
  fitC?: boolean;
  keepBands?: boolean;
  maxBands?: string;
  minWidth?: string;
  baseline?: string;
  listColumns?: boolean;
  output?: string;
  size?: string;
  dpi?: string;
  json?: boolean;
}

/** `termsplit spectrum <file>`: bands of a measured UV-vis-NIR spectrum, with an overlay figure. */
export function registerSpectrum(program: Command, io: Io): void {
  program
    .command('spectrum')
    .description(COMMAND_SUMMARIES.spectrum.description)
    .argument(
      '<file>',
      `the spectrum: delimited text (x and y columns) or JCAMP-DX (.jdx, .dx); at most ${SPECTRUM_ROWS_LIMIT} rows and ${INPUT_FILE_MAX_TEXT}`,
    )
    .option('--ion <name>', 'the metal ion, e.g. Cr3+ (with --dq and --B: predicted transitions)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option(...GEOMETRY_OPTION)
    .option('--range <from-to>', 'window, e.g. 330-1300nm, 8000-30000 (cm⁻¹) or 1.2-3.6eV')
    .option('--x-unit <unit>', 'x unit when the file does not say: nm, cm-1 or eV')
    .option('--y-unit <unit>', `y quantity when the file does not say: ${Y_UNIT_CHOICES}`)
    .option('--x-col <column>', `x column, by number (from 1) or header name (default: ${DEFAULT_X_COLUMN})`)
    .option(
      '--y-col <column>',
      `y column, by number (from 1) or header name, or "${ALL_COLUMNS}": every column but x, each a spectrum of its own (default: ${DEFAULT_Y_COLUMN})`,
    )
    .option('--list-columns', 'list the columns and metadata lines of the file, and stop')
    .option('--conc <mol/L>', 'concentration of the metal complex; with --path turns absorbance into ε')
    .option('--path <cm>', 'optical path length; with --conc turns absorbance into ε')
    .option('--dq <cm-1>', 'Dq for predicted transitions (10Dq = Δ)')
    .option('--B <cm-1>', 'Racah B: with --dq for predicted transitions, alone held in the fit (Dq fitted)')
    .option('--C <cm-1>', 'Racah C, with --B (default: the ion’s free-ion C/B × B)')
    .option('--cb <ratio>', 'C/B instead of --C')
    .option('--include-ct', 'keep bands that look like charge transfer among the ligand-field bands')
    .option('--spin-forbidden', 'let the fit assign any band (narrow ones too) to spin-forbidden transitions')
    .option(
      '--fit-c',
      'fit C as well as Dq and B (by default C is fitted when the bands fix it, held with --cb)',
    )
    .option('--keep-bands', 'fit components closer than a band width as separate transitions (no merging)')
    .option('--spin-state <high|low>', 'the ground-state spin when it is known: fit only that')
    .option('--max-bands <n>', 'most bands fitted inside the window', String(DEFAULT_MAX_BANDS))
    .option('--min-width <cm-1>', 'narrowest band (FWHM) looked for', String(DEFAULT_MIN_FWHM))
    .option('--baseline <kind>', 'baseline fitted with the bands: none, constant or linear', DEFAULT_BASELINE)
    .option('-o, --output <file>', 'write the overlay figure (.png, .svg or .pdf)')
    .option(...SIZE_OPTION)
    .option(...DPI_OPTION)
    .option('--json', 'print one JSON object on stdout')
    .action(async (file: string, opts: SpectrumOptions) => {
      io.out(await spectrumCommand(file, opts, io));
    });
}

/** Everything the command works out, before it is written as text or JSON. */
export interface SpectrumReport extends SpectrumAnalysis {
  readonly file: string;
  /** The column, when the file's columns were read one by one (`--y-col all`). */
  readonly column?: { readonly number: number; readonly label: string };
  readonly predicted?: SolvedLevels;
  readonly figure?: string;
}

/** Runs the command and returns its stdout text; the figure, if asked for, is written first. */
export async function spectrumCommand(file: string, opts: SpectrumOptions, io: Io): Promise<string> {
  if (opts.listColumns) return columnsCommand(file, opts, io);
  const job = spectrumJob(opts);
  const bar = progress(io, `spectrum: ${messageLine(file)}`);
  bar.update(0, 1);
  try {
    const text = readTextFile(resolve(io.cwd, file));
    return isAllColumns(opts.yCol)
      ? await everyColumnCommand(file, text, job, opts, io, bar)
      : await oneSpectrumCommand(file, text, job, opts, io);
  } finally {
    bar.end();
  }
}

/** One spectrum: its analysis, figure, and text or JSON. */
async function oneSpectrumCommand(
  file: string,
  text: string,
  job: ReturnType<typeof spectrumJob>,
  opts: SpectrumOptions,
  io: Io,
): Promise<string> {
  const { analyseSpectrum } = await import('../../src/spectra/spectrumAnalysis.js');
  const report: SpectrumReport = {
    file,
    ...inFile(file, () => analyseSpectrum(text, { ...job.options, fileName: file })),
    ...(job.predicted ? { predicted: job.predicted } : {}),
    ...(opts.output !== undefined ? { figure: opts.output } : {}),
  };
  await writeFigures([report], file, opts, io);
  return opts.json ? jsonText(reportJson(report)) : reportText(report, opts);
}

/** Writes the overlay figure of each report that names one, all or none. */
async function writeFigures(
  reports: readonly SpectrumReport[],
  file: string,
  opts: SpectrumOptions,
  io: Io,
): Promise<void> {
  if (opts.output === undefined) return;
  const { spectrumFigure } = await import('../present/spectrumFigure.js');
  const format = formatOfPath(resolve(io.cwd, opts.output));
  const size = figureSizeOptions(opts);
  writeFilesAtomic(
    reports.flatMap((r) =>
      r.figure === undefined
        ? []
        : [
            {
              path: resolve(io.cwd, r.figure),
              data: spectrumFigure(
                r,
                `termsplit spectrum ${file}${r.column ? ` (${r.column.label})` : ''}`,
                format,
                size,
              ),
            },
          ],
    ),
  );
}

/** The figure path of one column of several: `out.png` → `out-col3.png`. */
function columnFigure(output: string, column: number): string {
  const ext = extname(output);
  return `${output.slice(0, output.length - ext.length)}-col${column}${ext}`;
}

/** `--y-col all`: one analysis per y column, each with its own text, JSON entry and figure. */
async function everyColumnCommand(
  file: string,
  text: string,
  job: ReturnType<typeof spectrumJob>,
  opts: SpectrumOptions,
  io: Io,
  bar: ReturnType<typeof progress>,
): Promise<string> {
  const { analyseEveryColumn } = await import('../../src/spectra/spectrumAnalysis.js');
  const results = inFile(file, () =>
    analyseEveryColumn(text, { ...job.options, fileName: file }, (done, total) => bar.update(done, total)),
  );
  const reports = results.map((c): SpectrumReport | Extract<ColumnAnalysis, { failure: string }> =>
    'failure' in c
      ? c
      : ({
          file,
          ...c.analysis,
          column: { number: c.column, label: c.label },
          ...(job.predicted ? { predicted: job.predicted } : {}),
          ...(opts.output !== undefined ? { figure: columnFigure(opts.output, c.column) } : {}),
        } satisfies SpectrumReport),
  );
  await writeFigures(
    reports.filter((r): r is SpectrumReport => 'raw' in r),
    file,
    opts,
    io,
  );
  if (opts.json) {
    return jsonText({
      file,
      spectra: reports.map((r) =>
        'raw' in r
          ? { column: r.column?.number, label: r.column?.label, ...reportJson(r) }
          : { column: r.column, label: r.label, failure: r.failure },
      ),
    });
  }
  return reports
    .map((r) =>
      'raw' in r
        ? `── column ${r.column?.number} ("${r.column?.label}") ──\n${reportText(r, opts)}`
        : `── column ${r.column} ("${r.label}") ──\nnot analysed: ${r.failure}\n`,
    )
    .join('\n');
}

/** `--list-columns`: the file's columns and metadata lines, nothing analysed. */
function columnsCommand(file: string, opts: SpectrumOptions, io: Io): string {
  const text = readTextFile(resolve(io.cwd, file));
  const layout = inFile(file, () => spectrumColumns(text, opts.xCol));
  if (opts.json) return jsonText({ file, ...layout });
  const lines = [
    `termsplit spectrum — ${file}: ${layout.rows} rows of numbers (${layout.format}), ${layout.columns.length} columns`,
    table(
      ['column', 'header', 'read as'],
      layout.columns.map((c) => [String(c.number), c.label, c.number === layout.x ? 'x' : 'y (a spectrum)']),
    ),
  ];
  if (layout.metadata.length > 0) {
    lines.push('Metadata lines:');
    for (const m of layout.metadata) lines.push(`  line ${m.line}: ${m.key} = ${m.value}`);
  }
  lines.push(`--y-col picks a column by number or header; --y-col ${ALL_COLUMNS} analyses each.`);
  return `${lines.join('\n')}\n`;
}

/** Runs library work on a file's text, naming the file in any input error. */
function inFile<T>(file: string, work: () => T): T {
  try {
    return work();
  } catch (e) {
    if (e instanceof InputError) throw new InputError(`${file}: ${e.message}`);
    throw e;
  }
}

/** The command's options checked into resolved analysis options (and predicted levels, with --dq). */
function spectrumJob(opts: SpectrumOptions): {
  options: SpectrumAnalysisOptions;
  predicted?: SolvedLevels;
} {
  const xUnit = opts.xUnit === undefined ? undefined : parseXUnit(opts.xUnit);
  const yUnit = opts.yUnit === undefined ? undefined : parseYUnit(opts.yUnit);
  const conc = numberOption('--conc', opts.conc, CONCENTRATION_LIMIT);
  const path = numberOption('--path', opts.path, PATH_LENGTH_LIMIT);
  if ((conc === undefined) !== (path === undefined)) {
    throw new InputError('give both --conc (mol/L) and --path (cm) to turn absorbance into ε');
  }
  const maxBands = numberOption('--max-bands', opts.maxBands, BAND_COUNT_LIMIT);
  const minFwhm = numberOption('--min-width', opts.minWidth, BAND_WIDTH_LIMIT);
  const reading = {
    ...(opts.xCol !== undefined ? { xColumn: opts.xCol } : {}),
    ...(opts.yCol !== undefined ? { yColumn: opts.yCol } : {}),
    ...(xUnit ? { xUnit } : {}),
    ...(yUnit ? { yUnit } : {}),
    ...(conc !== undefined && path !== undefined ? { concentration: conc, pathLength: path } : {}),
  };
  const search = {
    ...(opts.range !== undefined ? { range: parseRange(opts.range) } : {}),
    ...(maxBands !== undefined ? { maxBands } : {}),
    ...(minFwhm !== undefined ? { minFwhm } : {}),
    baseline: baselineOption(opts.baseline),
    includeChargeTransfer: opts.includeCt === true,
  };
  const geometry = geometryOption(opts.geometry);
  const choice = opts.ion !== undefined || opts.d !== undefined ? ionOrCount(opts.ion, opts.d) : undefined;
  const predicted = opts.dq === undefined ? undefined : levelsFromOptions(opts);
  checkFitOnly(opts, predicted !== undefined, choice !== undefined);
  // Checked whether or not a fit follows, so a bad value is refused rather than ignored.
  if (opts.spinState !== undefined) spinStateOption(opts.spinState);
  if (predicted) ratioChoice(undefined, undefined, opts.cb, choice?.ion);
  const fit: SpectrumFitRequest | undefined =
    predicted || !choice ? undefined : fitRequest(opts, choice, geometry);
  const element = elementOfIon(choice?.ion?.ion ?? predicted?.ion);
  const options: SpectrumAnalysisOptions = {
    ...reading,
    ...search,
    names: OPTION_NAMES,
    ...(element ? { element } : {}),
    ...(fit ? { fit } : {}),
    ...(predicted ? { predicted: predicted.result } : {}),
  };
  return predicted ? { options, predicted } : { options };
}

/** How hints name the settings: by this command's options. */
const OPTION_NAMES: SettingNames = {
  concentrationAndPath: '--conc and --path',
  includeChargeTransfer: '--include-ct',
  yColumn: '--y-col (--list-columns lists them)',
};

/** Refuses fit options that would be silently ignored: with --dq (predicted levels) or without an ion. */
function checkFitOnly(opts: SpectrumOptions, predicted: boolean, ion: boolean): void {
  const fitOnly = [
    opts.spinState !== undefined ? '--spin-state' : undefined,
    opts.fitC ? '--fit-c' : undefined,
    opts.keepBands ? '--keep-bands' : undefined,
    opts.spinForbidden ? '--spin-forbidden' : undefined,
  ].filter((o): o is string => o !== undefined);
  if (fitOnly.length > 0 && predicted) {
    throw new InputError(
      `${fitOnly.join(', ')}: ${fitOnly.length > 1 ? 'these apply' : 'this applies'} to the fit, and --dq with --B gives ` +
        'predicted levels instead (leave out --dq to fit)',
    );
  }
  if ((fitOnly.length > 0 || opts.B !== undefined) && !ion) {
    const given = opts.B !== undefined ? [...fitOnly, '--B'] : fitOnly;
    throw new InputError(`${given.join(', ')}: give --ion (or --d) so that the bands are fitted`);
  }
  if (!predicted && opts.C !== undefined && opts.B === undefined) {
    throw new InputError('--C is held in the fit only together with --B (or give --cb to hold C/B)');
  }
}

/** The fit asked for: C/B, held B (--B without --dq), spin state, merging. */
function fitRequest(
  opts: SpectrumOptions,
  choice: ReturnType<typeof ionOrCount>,
  geometry: Geometry,
): SpectrumFitRequest {
  const fixedB = numberOption('--B', opts.B, COMPLEX_B_LIMIT);
  const ratio = ratioChoice(fixedB, opts.C, opts.cb, choice.ion);
  const held = opts.cb !== undefined || opts.C !== undefined || fixedB !== undefined;
  return {
    n: choice.n,
    geometry,
    ...(choice.ion ? { ion: choice.ion } : {}),
    ratio,
    ...(opts.fitC ? { fitC: true } : held ? { fitC: false } : {}),
    includeSpinForbidden: opts.spinForbidden === true,
    merge: opts.keepBands !== true,
    ...(fixedB !== undefined ? { fixedB } : {}),
    ...(opts.spinState !== undefined ? { spinState: spinStateOption(opts.spinState) } : {}),
  };
}

function baselineOption(text: string | undefined): BaselineKind {
  const t = (text ?? DEFAULT_BASELINE).trim().toLowerCase();
  if (t === 'none' || t === 'constant' || t === 'linear') return t;
  throw new InputError(`--baseline "${text}": expected none, constant or linear`);
}

const FLAG_TEXT: Readonly<Record<FoundBand['flags'][number], string>> = {
  intense: 'intense: charge transfer?',
  'high-energy': 'high energy: charge transfer?',
  'blue-edge': 'maximum beyond the blue end (rising edge)',
  'red-edge': 'maximum below the red end (wing only)',
  narrow: 'narrow: spin-forbidden?',
};

function reportText(r: SpectrumReport, opts: SpectrumOptions): string {
  const lines = [
    ...readingLines(r),
    ...bandLines(r),
    ...observationLines(r, opts),
    ...predictedLines(r),
    ...fitLines(r),
  ];
  if (!r.predicted && !r.fit) {
    lines.push('');
    lines.push(
      'Give --ion (or --d) to fit Dq and B to these bands, or --dq and --B for predicted transitions.',
    );
  }
  lines.push('');
  lines.push('Cautions:');
  for (const c of r.cautions) lines.push(`  - ${c}`);
  if (r.figure) {
    lines.push('');
    lines.push(`Figure written to ${r.figure}.`);
  }
  return `${lines.join('\n')}\n`;
}

/** What was read, the units, the window, noise and baseline. */
function readingLines(r: SpectrumReport): string[] {
  const { raw, spectrum, analysis } = r;
  const lines: string[] = [];
  const { from, to } = analysis.window;
  lines.push(`termsplit spectrum — ${r.file}`);
  lines.push(
    `Read ${raw.x.length} points (${raw.format})${raw.columns ? `: columns ${raw.columns.x} (x) and ${raw.columns.y} (y) of ${raw.columns.count}` : ''}.`,
  );
  for (const m of raw.metadata ?? []) lines.push(`  metadata (line ${m.line}): ${m.key} = ${m.value}`);
  lines.push(
    `  x: "${raw.xLabel}" in ${X_UNIT_NAMES[spectrum.xUnit.unit]} (${originText(spectrum.xUnit.origin)})`,
  );
  lines.push(
    `  y: "${raw.yLabel}" as ${Y_UNIT_NAMES[spectrum.yUnit.unit]} (${originText(spectrum.yUnit.origin)})`,
  );
  for (const c of spectrum.conversions) lines.push(`  converted: ${c}`);
  lines.push(
    `Window ${fixed(from)}–${fixed(to)} cm⁻¹ (${fixed(cmToNm(to))}–${fixed(cmToNm(from))} nm), ${analysis.points} points; ` +
      `noise σ = ${sig(analysis.noise)}, fit residual ${sig(analysis.residualRms)} (${fixed(analysis.residualRms / analysis.noise, 1)} × noise).`,
  );
  const b = analysis.baseline;
  lines.push(
    analysis.baselineKind === 'none'
      ? 'Baseline: none fitted.'
      : `Baseline (${analysis.baselineKind}, fitted with the bands): ${sig(b.offset)}${analysis.baselineKind === 'linear' ? ` ${b.slope < 0 ? '−' : '+'} ${sig(Math.abs(b.slope))} × (ν̃ − ${fixed(b.reference)} cm⁻¹)` : ''}.`,
  );
  return lines;
}

const UNIT_SYMBOLS: Readonly<Record<SpectrumAnalysis['spectrum']['quantity'], string>> = {
  epsilon: 'ε',
  absorbance: 'A',
  'kubelka-munk': 'F(R)',
  arbitrary: 'y',
};

/** The table of the bands found. */
function bandLines(r: SpectrumReport): string[] {
  const { spectrum, analysis } = r;
  const lines: string[] = [];
  lines.push('');
  const unit = UNIT_SYMBOLS[spectrum.quantity];
  lines.push(`Bands (Gaussian components; ${quantityTitle(spectrum.quantity)}):`);
  const fitNotes = narrowBandNotes(r);
  const rows = analysis.bands.map((band) => {
    const edge = band.flags.includes('blue-edge') || band.flags.includes('red-edge');
    return [
      String(band.number),
      edge ? `(${fixed(band.center)})` : fixed(band.center),
      edge || !Number.isFinite(band.centerSigma) ? '—' : fixed(band.centerSigma),
      edge ? '—' : fixed(cmToNm(band.center), 1),
      fixed(band.fwhm),
      sig(band.height),
      sig(band.area),
      band.oscillatorStrength === undefined ? '—' : band.oscillatorStrength.toExponential(1),
      band.intensityRange ?? '—',
      [
        ...band.flags.map((f) =>
          f === 'narrow' ? (fitNotes.get(band.number) ?? FLAG_TEXT[f]) : FLAG_TEXT[f],
        ),
        r.ligandField.includes(band) ? '' : 'not a ligand-field band',
      ]
        .filter((t) => t !== '')
        .join('; '),
    ];
  });
  lines.push(
    table(
      [
        '#',
        'max / cm⁻¹',
        '± fit',
        'nm',
        'FWHM / cm⁻¹',
        `height (${unit})`,
        `area (${unit}·cm⁻¹)`,
        'f',
        'usual ε range of',
        'notes',
      ],
      rows,
    ),
  );
  return lines;
}

/** What the fit made of each narrow band: merged with its neighbours, or matched to a level as a sharp band. */
function narrowBandNotes(r: SpectrumReport): Map<number, string> {
  const notes = new Map<number, string>();
  if (!r.fit || !('result' in r.fit)) return notes;
  const { members, result } = r.fit;
  for (const group of members) {
    if (group.length > 1)
      for (const k of group) notes.set(k, `narrow: component of one band (${group.join('+')}), merged`);
  }
  for (const a of result.solutions[0]?.assignments ?? []) {
    const group = members[a.band] ?? [];
    if (group.length === 1) notes.set(group[0] as number, `narrow: fitted as ${unicodeLabel(a.label)}`);
  }
  for (const m of result.solutions[0]?.sharp ?? []) {
    for (const k of members[m.band] ?? []) notes.set(k, `sharp: matched to ${unicodeLabel(m.label)}`);
  }
  return notes;
}

/** The ligand-field bands as observations for a fit. */
function observationLines(r: SpectrumReport, opts: SpectrumOptions): string[] {
  const lines: string[] = [];
  lines.push('');
  lines.push(
    `Ligand-field bands for a fit of Dq and B (σ = fit ⊕ ${fixed(100 * POSITION_WIDTH_FRACTION)} % of FWHM${opts.includeCt ? '; charge-transfer-like bands kept' : ''}):`,
  );
  lines.push(`  ${r.observations.map((o) => `${fixed(o.energy)}±${fixed(o.sigma)}`).join(', ')} cm⁻¹`);
  return lines;
}

/** The transitions predicted from --dq and --B inside the window. */
function predictedLines(r: SpectrumReport): string[] {
  const { from, to } = r.analysis.window;
  const lines: string[] = [];
  if (r.predicted) {
    const { result, cOrigin, ion } = r.predicted;
    lines.push('');
    lines.push(
      `Predicted transitions, ${ionText(ion, result.n)} ${result.geometry === 'oct' ? 'octahedral' : 'tetrahedral'}, ` +
        `Dq = ${fixed(result.dq)}, B = ${fixed(result.B)}, C = ${fixed(result.C)} cm⁻¹ (C: ${cOrigin}), ` +
        `from ${unicodeLabel(result.ground.label)}, inside the window:`,
    );
    const inside = result.levels.filter((l) => l !== result.ground && l.energy >= from && l.energy <= to);
    lines.push(
      inside.length === 0
        ? '  none'
        : table(
            ['level', 'cm⁻¹', 'nm', 'spin', 'observed'],
            inside.map((l) => {
              const seen = r.transitions.find((t) => t.label === l.label)?.bands ?? [];
              return [
                unicodeLabel(l.label),
                fixed(l.energy),
                fixed(cmToNm(l.energy), 1),
                l.spinAllowed ? 'allowed' : 'forbidden',
                seen.length === 0 ? '' : `band ${seen.join('+')}`,
              ];
            }),
          ),
    );
  }
  return lines;
}

/** The ligand-field fit of the bands: which bands went in, merged or matched, and the fit. */
function fitLines(r: SpectrumReport): string[] {
  const lines: string[] = [];
  if (r.fit && 'result' in r.fit) {
    const { result, ion, cOrigin, used, leftOut, members } = r.fit;
    const plural = (k: readonly number[]) => (k.length > 1 ? 's' : '');
    lines.push('');
    lines.push(
      `Ligand-field fit of band${plural(used)} ${used.join(', ')}` +
        (leftOut.length > 0
          ? ` (sharp band${plural(leftOut)} ${leftOut.join(', ')} not fitted but matched to predicted spin-forbidden levels; --spin-forbidden fits them)`
          : '') +
        ':',
    );
    for (const m of result.merges) {
      const numbers = members[m.band] ?? [];
      lines.push(
        `  bands ${numbers.join(', ')} merged into fit band ${m.band + 1} at their ε-weighted centroid ${fixed(m.centroid)} cm⁻¹ ` +
          `(closer than a band width): ${m.reason}; --keep-bands fits them apart`,
      );
    }
    const renumbered = members.some((m, i) => m.length !== 1 || m[0] !== used[i]);
    if (renumbered) {
      lines.push(
        `  fit bands (numbered as in the fit below) → spectrum bands: ${members.map((m, i) => `${i + 1} = ${m.join('+')}`).join(', ')}`,
      );
    }
    for (const m of result.solutions[0]?.sharp ?? []) {
      lines.push(
        `  sharp band ${(members[m.band] ?? []).join('+')} at ${fixed(m.observed)} cm⁻¹ matched to ${unicodeLabel(m.label)} ` +
          `(calculated ${fixed(m.calculated)}, obs − calc ${fixed(m.difference)})`,
      );
    }
    lines.push(fitText(result, ion, cOrigin).trimEnd());
  }
  return lines;
}

function originText(origin: string): string {
  return origin.startsWith('--') ? `given by ${origin}` : `from the ${origin}`;
}

/** Three significant figures, for values of any size (powers of ten outside 10⁻³ … 10⁶). */
function sig(v: number): string {
  if (!Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const a = Math.abs(v);
  return a >= 1e6 || a < 1e-3 ? v.toExponential(2) : String(Number(v.toPrecision(3)));
}

function reportJson(r: SpectrumReport) {
  const { raw, spectrum, analysis } = r;
  return {
    file: r.file,
    format: raw.format,
    points: raw.x.length,
    x: {
      label: raw.xLabel,
      ...(raw.columns ? { column: raw.columns.x } : {}),
      unit: spectrum.xUnit.unit,
      origin: spectrum.xUnit.origin,
    },
    y: {
      label: raw.yLabel,
      ...(raw.columns ? { column: raw.columns.y } : {}),
      unit: spectrum.yUnit.unit,
      origin: spectrum.yUnit.origin,
    },
    ...(raw.columns ? { columns: raw.columns.count } : {}),
    ...(raw.metadata ? { metadata: raw.metadata } : {}),
    conversions: spectrum.conversions,
    quantity: analysis.quantity,
    window: { from: analysis.window.from, to: analysis.window.to, clipped: analysis.clipped },
    windowPoints: analysis.points,
    noise: analysis.noise,
    residualRms: analysis.residualRms,
    baseline: { kind: analysis.baselineKind, ...analysis.baseline },
    bands: analysis.bands.map((b) => ({
      number: b.number,
      center: b.center,
      centerSigma: Number.isFinite(b.centerSigma) ? b.centerSigma : null,
      wavelength: cmToNm(b.center),
      fwhm: b.fwhm,
      fwhmSigma: Number.isFinite(b.fwhmSigma) ? b.fwhmSigma : null,
      height: b.height,
      heightSigma: Number.isFinite(b.heightSigma) ? b.heightSigma : null,
      area: b.area,
      areaSigma: Number.isFinite(b.areaSigma) ? b.areaSigma : null,
      oscillatorStrength: b.oscillatorStrength ?? null,
      intensityRange: b.intensityRange ?? null,
      flags: b.flags,
      chargeTransfer: b.chargeTransfer,
      ligandField: r.ligandField.includes(b),
    })),
    observations: r.observations,
    ...(r.predicted
      ? {
          predicted: {
            ...(r.predicted.ion ? { ion: r.predicted.ion } : {}),
            n: r.predicted.result.n,
            geometry: r.predicted.result.geometry,
            dq: r.predicted.result.dq,
            B: r.predicted.result.B,
            C: r.predicted.result.C,
            cOrigin: r.predicted.cOrigin,
            ground: r.predicted.result.ground.label,
            levels: r.predicted.result.levels.map(levelJson),
          },
        }
      : {}),
    ...(r.fit
      ? 'result' in r.fit
        ? {
            fit: {
              ...fitJson(r.fit.result, r.fit.ion, r.fit.cOrigin),
              usedBands: r.fit.used,
              leftOutBands: r.fit.leftOut,
              fitBandMembers: r.fit.members,
              mergedBands: r.fit.result.merges.map((m) => ({
                bands: r.fit && 'result' in r.fit ? (r.fit.members[m.band] ?? []) : [],
                centroid: m.centroid,
                reason: m.reason,
              })),
              sharpBands: (r.fit.result.solutions[0]?.sharp ?? []).map((m) => ({
                bands: r.fit && 'result' in r.fit ? (r.fit.members[m.band] ?? []) : [],
                observed: m.observed,
                label: m.label,
                calculated: m.calculated,
                difference: m.difference,
              })),
              adoptedBands: r.fit.adopted,
            },
          }
        : { fit: { failure: r.fit.failure } }
      : {}),
    transitions: r.transitions,
    cautions: r.cautions,
    figure: r.figure ?? null,
  };
}
