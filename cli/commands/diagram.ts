/**
 * `termsplit diagram`: checks the configuration, C/B, Δ/B range, sample and output paths into one
 * diagram job, sweeps the correlation diagram with the library, writes the figure and curve data
 * all or nothing, and prints a summary or the JSON.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { type DiagramChartOptions, renderDiagram } from '../../charts/diagram.js';
import { type FigureFormat, type FigureOptions, formatOfPath } from '../../charts/render.js';
import { type SampleMark, samplePosition } from '../../charts/sampleOverlay.js';
import {
  DEFAULT_MAX_DELTA_OVER_B,
  DEFAULT_SWEEP_POINTS,
  diagramCautions,
  MAX_SWEEP_POINTS,
} from '../../src/analysis/sweep.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import {
  type CorrelationDiagram,
  diagramCsv,
  diagramJson,
  type FreeIon,
  type Geometry,
  InputError,
  parseEnergyList,
  sweepDiagram,
  unicodeLabel,
} from '../../src/index.js';
import { writeFilesAtomic } from '../files.js';
import { fixed, jsonText } from '../format.js';
import { type Io, progress } from '../io.js';
import {
  cbHelp,
  configOrIon,
  DPI_OPTION,
  figureSizeOptions,
  GEOMETRY_OPTION,
  geometryOption,
  numberOption,
  rangeOption,
  ratioChoice,
  SIZE_OPTION,
} from '../options.js';

/** Options of `termsplit diagram`, as commander hands them over. */
export interface DiagramOptions {
  ion?: string;
  geometry?: string;
  cb?: string;
  C?: string;
  max?: string;
  points?: string;
  emax?: string;
  dbRange?: string;
  ebRange?: string;
  forbidden?: string;
  size?: string;
  dpi?: string;
  output?: string;
  data?: string;
  dq?: string;
  B?: string;
  bands?: string;
  json?: boolean;
}

/** `termsplit diagram`: a correlation diagram as a figure and as data, with a sample on it. */
export function registerDiagram(program: Command, io: Io): void {
  program
    .command('diagram')
    .description('correlation (Tanabe–Sugano-style) diagram of dⁿ at a chosen C/B: figure and curve data')
    .argument('[config]', 'the d configuration, e.g. d6 (optional with --ion)')
    .option('--ion <name>', 'the metal ion, e.g. Fe2+ (gives n and the free-ion C/B)')
    .option(...GEOMETRY_OPTION)
    .option('--cb <ratio>', cbHelp('C/B of the diagram'))
    .option('--C <cm-1>', "the sample's Racah C instead of --cb (with --B)")
    .option('--max <Δ/B>', 'largest Δ/B', String(DEFAULT_MAX_DELTA_OVER_B))
    .option('--points <n>', 'number of Δ/B values from 0 to --max', String(DEFAULT_SWEEP_POINTS))
    .option('--emax <E/B>', 'top of the E/B axis (default: fitted to the curves, at most 2 × --max)')
    .option('--db-range <from:to>', 'draw only this Δ/B range, e.g. 15:25 to zoom in around a sample')
    .option('--eb-range <from:to>', 'draw only this E/B range (instead of --emax)')
    .option(
      '--forbidden <n>',
      'draw only the n lowest spin-forbidden curves (at the sample, else the right edge)',
    )
    .option(...SIZE_OPTION)
    .option(...DPI_OPTION)
    .option('-o, --output <file>', 'figure file, .png, .svg or .pdf (default: d<n>-<geometry>.png here)')
    .option('--data <file>', 'also write the curves as .csv or .json')
    .option('--dq <cm-1>', 'mark a sample: its Dq (10Dq = Δ), with --B')
    .option('--B <cm-1>', "the sample's Racah B, with --dq")
    .option('--bands <list>', 'observed band maxima of the sample, e.g. 16500,23000 or 606nm,435nm')
    .option('--json', 'print the curve data as one JSON object on stdout (the figure only with -o)')
    .action((configText: string | undefined, opts: DiagramOptions) => {
      io.out(diagramCommand(configText, opts, io));
    });
}

/** A sample given on the command line, with where it sits on the diagram. */
interface Sample extends SampleMark {
  readonly deltaOverB: number;
  readonly bandsOverB: readonly number[];
}

function sampleFromOptions(opts: DiagramOptions): Sample | undefined {
  const dq = numberOption('--dq', opts.dq, { positive: true, what: 'a positive number of cm⁻¹' });
  const B = numberOption('--B', opts.B, { positive: true, what: 'a positive number of cm⁻¹' });
  if (opts.bands !== undefined && (dq === undefined || B === undefined)) {
    throw new InputError("--bands needs the sample's --dq and --B to place the bands on the diagram");
  }
  if ((dq === undefined) !== (B === undefined)) {
    throw new InputError('--dq and --B go together: they mark the sample at Δ/B = 10Dq/B');
  }
  if (dq === undefined || B === undefined) return undefined;
  const bands = opts.bands === undefined ? [] : parseEnergyList(opts.bands).map((e) => e.value);
  const mark = { dq, B, bands };
  return { ...mark, ...samplePosition(mark) };
}

function dataFormat(path: string): 'csv' | 'json' {
  const ext = /\.([^./\\]+)$/.exec(path)?.[1]?.toLowerCase();
  if (ext === 'csv' || ext === 'json') return ext;
  throw new InputError(`--data "${path}": expected a .csv or .json extension`);
}

/** The command's options checked into one diagram job. */
interface DiagramJob {
  readonly n: number;
  readonly ion?: FreeIon;
  readonly geometry: Geometry;
  readonly cOverB: number;
  readonly cOrigin: string;
  readonly maxDeltaOverB: number;
  readonly points: number;
  readonly eMax?: number;
  /** What the figure draws: ranges, spin-forbidden curves, size. */
  readonly view: Pick<DiagramChartOptions, 'deltaRange' | 'eRange' | 'forbidden'>;
  readonly figureSize: Pick<FigureOptions, 'size' | 'dpi'>;
  readonly sample?: Sample;
  readonly figurePath?: string;
  readonly figureFormat?: FigureFormat;
  readonly dataPath?: string;
  readonly dataKind?: 'csv' | 'json';
}

/** Checks the configuration, C/B, range, sample and output paths. */
function diagramJob(configText: string | undefined, opts: DiagramOptions, io: Io): DiagramJob {
  const { n, ion } = configOrIon(configText, opts.ion);
  const geometry: Geometry = geometryOption(opts.geometry);
  const sample = sampleFromOptions(opts);
  const ratio = ratioChoice(sample?.B, opts.C, opts.cb, ion);
  // One electron or one hole has a single free-ion term: C/B changes nothing.
  const cOrigin = n === 1 || n === 9 ? 'not used (one d electron or hole)' : ratio.origin;
  const maxDeltaOverB =
    numberOption('--max', opts.max, { positive: true, what: 'a positive number' }) ??
    DEFAULT_MAX_DELTA_OVER_B;
  const points =
    numberOption('--points', opts.points, { integer: true, min: 2, what: 'a whole number' }) ??
    DEFAULT_SWEEP_POINTS;
  if (points > MAX_SWEEP_POINTS) {
    throw new InputError(`--points "${opts.points}": expected a whole number from 2 to ${MAX_SWEEP_POINTS}`);
  }
  const eMax = numberOption('--emax', opts.emax, { positive: true, what: 'a positive number' });
  const deltaRange = rangeOption('--db-range', opts.dbRange);
  const eRange = rangeOption('--eb-range', opts.ebRange);
  const forbidden = numberOption('--forbidden', opts.forbidden, {
    integer: true,
    min: 0,
    what: 'a whole number',
  });
  if (sample && sample.deltaOverB > maxDeltaOverB) {
    throw new InputError(
      `the sample's Δ/B = 10Dq/B = ${fixed(sample.deltaOverB, 2)} lies beyond --max ${maxDeltaOverB}: raise --max`,
    );
  }
  const figurePath =
    opts.output !== undefined
      ? resolve(io.cwd, opts.output)
      : opts.json
        ? undefined
        : resolve(io.cwd, `d${n}-${geometry}.png`);
  return {
    n,
    ...(ion ? { ion } : {}),
    geometry,
    cOverB: ratio.cOverB,
    cOrigin,
    maxDeltaOverB,
    points,
    ...(eMax !== undefined ? { eMax } : {}),
    view: {
      ...(deltaRange ? { deltaRange } : {}),
      ...(eRange ? { eRange } : {}),
      ...(forbidden !== undefined ? { forbidden } : {}),
    },
    figureSize: figureSizeOptions(opts),
    ...(sample ? { sample } : {}),
    ...(figurePath !== undefined
      ? { figurePath, figureFormat: formatOfPath(opts.output ?? figurePath) }
      : {}),
    ...(opts.data !== undefined
      ? { dataPath: resolve(io.cwd, opts.data), dataKind: dataFormat(opts.data) }
      : {}),
  };
}

/** The figure and data files of the diagram, as bytes to write. */
function diagramFiles(
  job: DiagramJob,
  diagram: CorrelationDiagram,
): { path: string; data: string | Uint8Array }[] {
  const { ion, eMax, sample } = job;
  const outputs: { path: string; data: string | Uint8Array }[] = [];
  if (job.figurePath !== undefined && job.figureFormat !== undefined) {
    const options = {
      ...(ion ? { ion: ion.ion } : {}),
      ...(eMax !== undefined ? { eMax } : {}),
      ...job.view,
      ...(sample ? { sample: { dq: sample.dq, B: sample.B, bands: sample.bands ?? [] } } : {}),
    };
    outputs.push({
      path: job.figurePath,
      data: renderDiagram(diagram, { format: job.figureFormat, ...job.figureSize }, options),
    });
  }
  if (job.dataPath !== undefined) {
    outputs.push({
      path: job.dataPath,
      data: job.dataKind === 'csv' ? diagramCsv(diagram) : jsonText(diagramJson(diagram)),
    });
  }
  return outputs;
}

/**
 * Runs the command and returns what goes on stdout; files are written only once everything has
 * been computed, and removed again if a later one cannot be written, so bad input leaves none.
 */
export function diagramCommand(configText: string | undefined, opts: DiagramOptions, io: Io): string {
  const job = diagramJob(configText, opts, io);
  const { n, ion, geometry, sample, figurePath, dataPath } = job;
  const bar = progress(io, `d${n} ${geometry}: sweeping Δ/B`);
  let diagram: CorrelationDiagram;
  try {
    diagram = sweepDiagram(n, {
      geometry,
      cOverB: job.cOverB,
      maxDeltaOverB: job.maxDeltaOverB,
      points: job.points,
      onProgress: (done, total) => bar.update(done, total),
    });
  } finally {
    bar.end();
  }
  writeFilesAtomic(diagramFiles(job, diagram));

  const cautions = diagramCautions(diagram).map((c) => c.message);
  if (sample) {
    cautions.push(
      `the sample is drawn on curves for C/B = ${fixed(diagram.cOverB, 2)}; its bands fall on them only as far as its own C/B is close to that`,
    );
  }
  const { cOrigin } = job;
  if (opts.json) {
    return jsonText({
      ...(ion ? { ion: ion.ion } : {}),
      cOrigin,
      figure: figurePath ?? null,
      data: dataPath ?? null,
      ...(sample
        ? {
            sample: {
              dq: sample.dq,
              B: sample.B,
              deltaOverB: sample.deltaOverB,
              bands: sample.bands,
              bandsOverB: sample.bandsOverB,
            },
          }
        : {}),
      ...diagramJson(diagram),
      cautions,
    });
  }
  return summaryText(diagram, { ion: ion?.ion, cOrigin, sample, figurePath, dataPath, cautions });
}

function summaryText(
  diagram: CorrelationDiagram,
  info: {
    ion: string | undefined;
    cOrigin: string;
    sample: Sample | undefined;
    figurePath: string | undefined;
    dataPath: string | undefined;
    cautions: readonly string[];
  },
): string {
  const geometryName = diagram.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const ratio =
    diagram.n === 1 || diagram.n === 9
      ? 'C/B plays no part (one d electron or hole)'
      : `C/B = ${fixed(diagram.cOverB, 2)} (${info.cOrigin})`;
  const lines = [
    `${info.ion ? `${info.ion}, ` : ''}d${diagram.n} ${geometryName}, ${ratio}: ` +
      `Δ/B from 0 to ${diagram.maxDeltaOverB} in ${diagram.points} points, ${diagram.curves.length} curves (E/B above the ground state).`,
  ];
  if (diagram.crossings.length === 0) {
    lines.push(
      `Ground state ${unicodeLabel(diagram.regions[0]?.ground ?? '')} throughout; no change of spin.`,
    );
  }
  for (const c of diagram.crossings) {
    lines.push(
      `Ground state changes at Δ/B = ${fixed(c.deltaOverB, 3)}: ${unicodeLabel(c.from)} (S = ${halfIntegerText(c.fromS)}) below, ` +
        `${unicodeLabel(c.to)} (S = ${halfIntegerText(c.toS)}) above.`,
    );
  }
  const s = info.sample;
  if (s) {
    const region = diagram.regions.find((r) => s.deltaOverB <= r.toDeltaOverB) ?? diagram.regions.at(-1);
    const side =
      diagram.crossings.length > 0 && region
        ? ` (on the ${unicodeLabel(region.ground)} side of the crossover in this model)`
        : '';
    lines.push(
      `Sample: Dq = ${fixed(s.dq)} cm⁻¹, B = ${fixed(s.B)} cm⁻¹ → Δ/B = ${fixed(s.deltaOverB, 2)}${side}` +
        (s.bandsOverB.length > 0
          ? `; bands at E/B ${s.bandsOverB.map((e) => fixed(e, 2)).join(', ')}.`
          : '.'),
    );
  }
  if (info.figurePath) lines.push(`Figure written to ${info.figurePath}`);
  if (info.dataPath) lines.push(`Curve data written to ${info.dataPath}`);
  if (info.cautions.length > 0) {
    lines.push('', 'Cautions:');
    for (const c of info.cautions) lines.push(`  - ${c}`);
  }
  return `${lines.join('\n')}\n`;
}
