/**
 * `termsplit diagram`: checks the configuration, C/B, Δ/B range, sample and output paths into one
 * diagram job, sweeps the correlation diagram with the library, writes the figure and curve data
 * all or nothing, and prints a summary or the JSON.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import type { DiagramChartOptions } from '../../charts/diagram.js';
import { type FigureFormat, type FigureOptions, formatOfPath } from '../../charts/figureFormat.js';
import { type SampleMark, samplePosition } from '../../charts/sampleOverlay.js';
import { DEFAULT_SWEEP_STEPS } from '../../src/analysis/distortionSweep.js';
import {
  type SpinOrbitDiagram,
  spinOrbitAsCorrelation,
  sweepSpinOrbit,
} from '../../src/analysis/spinOrbitSweep.js';
import {
  type CorrelationDiagram,
  DEFAULT_MAX_DELTA_OVER_B,
  DEFAULT_SWEEP_POINTS,
  diagramCautions,
  diagramCsv,
  diagramJson,
  sweepDiagram,
} from '../../src/analysis/sweep.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import { InputError } from '../../src/core/errors.js';
import type { Geometry } from '../../src/core/geometry.js';
import type { FreeIon } from '../../src/core/ions.js';
import {
  COMPLEX_B_LIMIT,
  DELTA_OVER_B_LIMIT,
  DQ_LIMIT,
  ENERGY_OVER_B_LIMIT,
  LABEL_COUNT_LIMIT,
  POINTS_LIMIT,
  positive,
} from '../../src/core/limits.js';
import { parseEnergyList } from '../../src/core/units.js';
import { DOUBLE_GROUP_NOTATION } from '../../src/field/doubleGroup.js';
import { unicodeLabel, unicodeTerm } from '../../src/field/labels.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import type { DistortionDiagramOptions } from '../distorted.js';
import { addFieldOptions, hasFieldOptions } from '../fieldOptions.js';
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
import { ZETA_FACTOR_HELP, zetaOption } from '../zetaOption.js';

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
  zeta?: string;
  zetaFactor?: string;
  json?: boolean;
}

/** `termsplit diagram`: a correlation diagram as a figure and as data, with a sample on it. */
export function registerDiagram(program: Command, io: Io): void {
  const command = program
    .command('diagram')
    .description(COMMAND_SUMMARIES.diagram.description)
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
    .option(
      '--zeta <cm-1|ion>',
      'spin–orbit ζ, cm⁻¹, or "ion": double-group curves at ζ/B = ζ/(--B, else the free-ion B)',
    )
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option('--json', 'print the curve data as one JSON object on stdout (the figure only with -o)')
    .option(
      '--distort <coordinate>',
      "with a geometry: ratio:KIND (scale that kind's eσ, eπ), angle (the shape angle), or a parameter of --tetragonal/--trigonal (ds, dt, dSigma, dTau, dq); --emax is then in cm⁻¹",
    )
    .option('--from <x>', 'start of the distortion coordinate (ratio: default 1)')
    .option('--to <x>', 'end of the distortion coordinate (ratio: default 0)')
    .option('--steps <n>', 'number of intervals along the distortion', String(DEFAULT_SWEEP_STEPS));
  addFieldOptions(command).action(
    async (configText: string | undefined, opts: DiagramOptions & DistortionDiagramOptions) => {
      if (hasFieldOptions(opts) || opts.distort !== undefined) {
        if (opts.distort === undefined)
          throw new InputError('with a geometry, diagram needs --distort (e.g. ratio:ax or angle)');
        if (!hasFieldOptions(opts))
          throw new InputError('--distort needs a geometry: --shape, --xyz, --tetragonal or --trigonal');
        if (opts.dq !== undefined || opts.bands !== undefined) {
          throw new InputError(
            '--dq and --bands mark a sample on the cubic diagram: leave them out with --distort',
          );
        }
        const { n, ion } = configOrIon(configText, opts.ion);
        const { distortionDiagramCommand } = await import('../distorted.js');
        io.out(await distortionDiagramCommand(n, ion, opts, io));
        return;
      }
      io.out(await diagramCommand(configText, opts, io));
    },
  );
}

/** A sample given on the command line, with where it sits on the diagram. */
interface Sample extends SampleMark {
  readonly deltaOverB: number;
  readonly bandsOverB: readonly number[];
}

function sampleFromOptions(opts: DiagramOptions): Sample | undefined {
  const dq = numberOption('--dq', opts.dq, positive(DQ_LIMIT));
  const B = numberOption('--B', opts.B, COMPLEX_B_LIMIT);
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
  /** ζ and ζ/B when the curves include spin–orbit coupling. */
  readonly spinOrbit?: { readonly zeta: number; readonly zetaOverB: number };
}

/** Checks the configuration, C/B, range, sample and output paths. */
function diagramJob(configText: string | undefined, opts: DiagramOptions, io: Io): DiagramJob {
  const { n, ion } = configOrIon(configText, opts.ion);
  const geometry: Geometry = geometryOption(opts.geometry);
  const sample = sampleFromOptions(opts);
  const ratio = ratioChoice(sample?.B, opts.C, opts.cb, ion);
  // One electron or one hole has a single free-ion term: C/B changes nothing.
  const cOrigin = n === 1 || n === 9 ? 'not used (one d electron or hole)' : ratio.origin;
  const maxDeltaOverB = numberOption('--max', opts.max, DELTA_OVER_B_LIMIT) ?? DEFAULT_MAX_DELTA_OVER_B;
  const points = numberOption('--points', opts.points, POINTS_LIMIT) ?? DEFAULT_SWEEP_POINTS;
  const eMax = numberOption('--emax', opts.emax, ENERGY_OVER_B_LIMIT);
  const deltaRange = rangeOption('--db-range', opts.dbRange);
  const eRange = rangeOption('--eb-range', opts.ebRange);
  const forbidden = numberOption('--forbidden', opts.forbidden, LABEL_COUNT_LIMIT);
  if (sample && sample.deltaOverB > maxDeltaOverB) {
    throw new InputError(
      `the sample's Δ/B = 10Dq/B = ${fixed(sample.deltaOverB, 2)} lies beyond --max ${maxDeltaOverB}: raise --max`,
    );
  }
  const spinOrbit = spinOrbitOfJob(opts, ion, sample?.B);
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
    ...(spinOrbit ? { spinOrbit } : {}),
    ...(figurePath !== undefined
      ? { figurePath, figureFormat: formatOfPath(opts.output ?? figurePath) }
      : {}),
    ...(opts.data !== undefined
      ? { dataPath: resolve(io.cwd, opts.data), dataKind: dataFormat(opts.data) }
      : {}),
  };
}

/** ζ and ζ/B from `--zeta`, with B the sample's or else the ion's free-ion B. */
function spinOrbitOfJob(
  opts: DiagramOptions,
  ion: FreeIon | undefined,
  sampleB: number | undefined,
): DiagramJob['spinOrbit'] {
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, ion);
  if (zeta === undefined) return undefined;
  const B = sampleB ?? ion?.B;
  if (B === undefined || !(B > 0)) {
    throw new InputError(
      `--zeta ${opts.zeta}: needs the sample's --B (with --dq), or an --ion with a free-ion B, to set ζ/B`,
    );
  }
  return { zeta, zetaOverB: zeta / B };
}

/** The diagram's sweep: the spin–orbit-free one, or the double-group one with `--zeta`. */
function sweep(
  job: DiagramJob,
  onProgress: (done: number, total: number) => void,
): {
  diagram: CorrelationDiagram;
  spinOrbit?: SpinOrbitDiagram;
} {
  const common = {
    geometry: job.geometry,
    cOverB: job.cOverB,
    maxDeltaOverB: job.maxDeltaOverB,
    points: job.points,
    onProgress,
  };
  if (!job.spinOrbit) return { diagram: sweepDiagram(job.n, common) };
  const spinOrbit = sweepSpinOrbit(job.n, { ...common, zetaOverB: job.spinOrbit.zetaOverB });
  return { diagram: spinOrbitAsCorrelation(spinOrbit), spinOrbit };
}

/** The figure and data files of the diagram, as bytes to write. */
async function diagramFiles(
  job: DiagramJob,
  diagram: CorrelationDiagram,
): Promise<{ path: string; data: string | Uint8Array }[]> {
  const { ion, eMax, sample } = job;
  const outputs: { path: string; data: string | Uint8Array }[] = [];
  if (job.figurePath !== undefined && job.figureFormat !== undefined) {
    const options = {
      ...(ion ? { ion: ion.ion } : {}),
      ...(eMax !== undefined ? { eMax } : {}),
      ...job.view,
      ...(sample ? { sample: { dq: sample.dq, B: sample.B, bands: sample.bands ?? [] } } : {}),
    };
    const { renderDiagram } = await import('../../charts/diagram.js');
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
export async function diagramCommand(
  configText: string | undefined,
  opts: DiagramOptions,
  io: Io,
): Promise<string> {
  const job = diagramJob(configText, opts, io);
  const { n, ion, geometry, sample, figurePath, dataPath } = job;
  const bar = progress(io, `d${n} ${geometry}: sweeping Δ/B`);
  let swept: ReturnType<typeof sweep>;
  try {
    swept = sweep(job, (done, total) => bar.update(done, total));
  } finally {
    bar.end();
  }
  const { diagram, spinOrbit } = swept;
  writeFilesAtomic(await diagramFiles(job, diagram));

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
      ...(spinOrbit && job.spinOrbit
        ? {
            zeta: job.spinOrbit.zeta,
            zetaOverB: spinOrbit.zetaOverB,
            notation: DOUBLE_GROUP_NOTATION,
            units: 'x is Δ/B = 10Dq/B; values are E/B above the ground level, with spin–orbit coupling',
            regions: [],
            curves: spinOrbit.curves,
          }
        : {}),
      cautions,
    });
  }
  if (spinOrbit && job.spinOrbit)
    return spinOrbitSummary(spinOrbit, job, diagram.crossings, { figurePath, dataPath, cautions });
  return summaryText(diagram, { ion: ion?.ion, cOrigin, sample, figurePath, dataPath, cautions });
}

function spinOrbitSummary(
  d: SpinOrbitDiagram,
  job: DiagramJob,
  crossings: CorrelationDiagram['crossings'],
  files: { figurePath?: string | undefined; dataPath?: string | undefined; cautions: readonly string[] },
): string {
  const { figurePath, dataPath, cautions } = files;
  const geometryName = d.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const groundAt = (i: number) => d.curves.find((c) => c.values[i] === 0);
  const first = groundAt(0);
  const last = groundAt(d.deltaOverB.length - 1);
  const lines = [
    `${job.ion ? `${job.ion.ion}, ` : ''}d${d.n} ${geometryName}, C/B = ${fixed(d.cOverB, 2)} (${job.cOrigin}), ` +
      `ζ = ${fixed(job.spinOrbit?.zeta ?? 0)} cm⁻¹, ζ/B = ${fixed(d.zetaOverB, 3)}: Δ/B from 0 to ${d.maxDeltaOverB} in ` +
      `${d.deltaOverB.length} points, ${d.curves.length} double-group levels (E/B above the ground level).`,
    `Labels in ${DOUBLE_GROUP_NOTATION}; levels of one irrep do not cross.`,
    `Ground level: ${first?.irrep ?? '?'} from ${unicodeTerm(first?.freeIon ?? '')} at Δ/B = 0; ` +
      `${last?.irrep ?? '?'} (mainly ${unicodeLabel(last?.strongField ?? '')}) at Δ/B = ${d.maxDeltaOverB}.`,
    ...crossings.map(
      (c) =>
        `The ground level's parent changes spin near Δ/B = ${fixed(c.deltaOverB, 2)}: ${unicodeLabel(c.from)} ` +
        `(S = ${halfIntegerText(c.fromS)}) below, ${unicodeLabel(c.to)} (S = ${halfIntegerText(c.toS)}) above.`,
    ),
    'The figure draws curves of spin-allowed parentage (from a ²ˢ⁺¹Γ of the ground level’s spin) strong, the others light.',
  ];
  if (figurePath) lines.push(`Figure written to ${figurePath}`);
  if (dataPath) lines.push(`Curve data written to ${dataPath}`);
  if (cautions.length > 0) lines.push('', 'Cautions:', ...cautions.map((c) => `  - ${c}`));
  return `${lines.join('\n')}\n`;
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
