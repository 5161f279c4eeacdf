import { resolve } from 'node:path';
import type { Command } from 'commander';
import { renderDiagram } from '../../charts/diagram.js';
import { formatOfPath } from '../../charts/render.js';
import { type SampleMark, samplePosition } from '../../charts/sampleOverlay.js';
import {
  type CorrelationDiagram,
  DEFAULT_MAX_DELTA_OVER_B,
  DEFAULT_SWEEP_POINTS,
  diagramCautions,
  diagramCsv,
  diagramJson,
  findIon,
  type Geometry,
  halfIntegerText,
  InputError,
  MAX_SWEEP_POINTS,
  parseConfiguration,
  parseEnergyList,
  sweepDiagram,
  unicodeLabel,
} from '../../src/index.js';
import { writeFilesAtomic } from '../files.js';
import { fixed, jsonText } from '../format.js';
import { type Io, progress } from '../io.js';
import { geometryOption, numberOption, ratioChoice } from '../options.js';

/** Options of `termsplit diagram`, as commander hands them over. */
export interface DiagramOptions {
  ion?: string;
  geometry?: string;
  cb?: string;
  C?: string;
  max?: string;
  points?: string;
  emax?: string;
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
    .option('--geometry <oct|tet>', 'octahedral or tetrahedral', 'oct')
    .option('--cb <ratio>', 'C/B of the diagram (default: the free-ion ratio of the ion, else 4.5)')
    .option('--C <cm-1>', "the sample's Racah C instead of --cb (with --B)")
    .option('--max <Δ/B>', 'largest Δ/B', String(DEFAULT_MAX_DELTA_OVER_B))
    .option('--points <n>', 'number of Δ/B values from 0 to --max', String(DEFAULT_SWEEP_POINTS))
    .option('--emax <E/B>', 'top of the E/B axis (default: fitted to the curves, at most 2 × --max)')
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

/** The d-electron count and ion from the configuration argument and/or --ion. */
function countFromArguments(configText: string | undefined, ionText: string | undefined) {
  const ion = ionText === undefined ? undefined : findIon(ionText);
  if (configText === undefined) {
    if (!ion) throw new InputError('give the configuration (e.g. d6) or the ion (--ion Fe2+)');
    return { n: ion.n, ion };
  }
  const config = parseConfiguration(/^\d$/.test(configText.trim()) ? `d${configText.trim()}` : configText);
  if (config.l !== 2)
    throw new InputError(`configuration ${config.text}: expected a d configuration such as d6`);
  if (config.n < 1 || config.n > 9) throw new InputError(`configuration ${config.text}: expected d1 to d9`);
  if (ion && ion.n !== config.n) {
    throw new InputError(`configuration ${config.text} disagrees with --ion ${ion.ion}, which is d${ion.n}`);
  }
  return ion ? { n: config.n, ion } : { n: config.n };
}

function dataFormat(path: string): 'csv' | 'json' {
  const ext = /\.([^./\\]+)$/.exec(path)?.[1]?.toLowerCase();
  if (ext === 'csv' || ext === 'json') return ext;
  throw new InputError(`--data "${path}": expected a .csv or .json extension`);
}

/**
 * Runs the command and returns what goes on stdout; files are written only once everything has
 * been computed, and removed again if a later one cannot be written, so bad input leaves none.
 */
export function diagramCommand(configText: string | undefined, opts: DiagramOptions, io: Io): string {
  const { n, ion } = countFromArguments(configText, opts.ion);
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
  const figureFormat = figurePath === undefined ? undefined : formatOfPath(opts.output ?? figurePath);
  const dataPath = opts.data === undefined ? undefined : resolve(io.cwd, opts.data);
  const dataKind = opts.data === undefined ? undefined : dataFormat(opts.data);

  const bar = progress(io, `d${n} ${geometry}: sweeping Δ/B`);
  let diagram: CorrelationDiagram;
  try {
    diagram = sweepDiagram(n, {
      geometry,
      cOverB: ratio.cOverB,
      maxDeltaOverB,
      points,
      onProgress: (done, total) => bar.update(done, total),
    });
  } finally {
    bar.end();
  }
  const outputs: { path: string; data: string | Uint8Array }[] = [];
  if (figurePath !== undefined && figureFormat !== undefined) {
    const options = {
      ...(ion ? { ion: ion.ion } : {}),
      ...(eMax !== undefined ? { eMax } : {}),
      ...(sample ? { sample: { dq: sample.dq, B: sample.B, bands: sample.bands ?? [] } } : {}),
    };
    outputs.push({ path: figurePath, data: renderDiagram(diagram, { format: figureFormat }, options) });
  }
  if (dataPath !== undefined) {
    outputs.push({
      path: dataPath,
      data: dataKind === 'csv' ? diagramCsv(diagram) : jsonText(diagramJson(diagram)),
    });
  }
  writeFilesAtomic(outputs);

  const cautions = diagramCautions(diagram).map((c) => c.message);
  if (sample) {
    cautions.push(
      `the sample is drawn on curves for C/B = ${fixed(diagram.cOverB, 2)}; its bands fall on them only as far as its own C/B is close to that`,
    );
  }
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
