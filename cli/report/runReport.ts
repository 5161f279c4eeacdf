/**
 * A whole report run: reads and checks the sample sheet, analyses the samples (in worker threads
 * where that helps), builds the report model and writes the folder — HTML, Markdown, CSV tables,
 * JSON and figures — all or nothing. Shared by the report and demo commands.
 */

import { existsSync } from 'node:fs';
import { dirname, extname, isAbsolute, relative, resolve } from 'node:path';
import { renderTrend } from '../../charts/series.js';
import { InputError } from '../../src/core/errors.js';
import type { SampleSpec, SheetFormat, SheetProblem } from '../../src/sheets/sampleSheet.js';
import { parseSampleSheet, type SampleSheet } from '../../src/sheets/sampleSheet.js';
import { isAllColumns } from '../../src/spectra/spectrumAnalysis.js';
import { spectrumColumns } from '../../src/spectra/spectrumText.js';
import { explorerHtml } from '../explorerPage.js';
import { sampleOfResult, spectrumOfFile } from '../explorerSamples.js';
import { readTextFile } from '../files.js';
import { jsonText, messageLine } from '../format.js';
import type { Io } from '../io.js';
import { VERSION } from '../version.js';
import type { SampleOutcome, SampleTask } from './analyse.js';
import { reportBlocks, SERIES_FILES, sampleFiles } from './document.js';
import { toCsv, toHtml, toMarkdown } from './formats.js';
import { type ReportModel, reportModel } from './model.js';
import { runSamples } from './run.js';
import { abandonReportFolder, commitReportFolder, REPORT_GENERATOR, reserveReportFolder } from './write.js';

/** A checked report job: where to write, and how many worker threads (default: the cores, at most 4). */
export interface ReportJob {
  readonly output: string;
  readonly jobs?: number;
  /** Let the sheet name spectrum files outside its own folder and the working folder. @default false */
  readonly allowOutside?: boolean;
}

/** The format of a sheet file: by extension, else by its first character. */
function sheetFormat(path: string, text: string): SheetFormat {
  const ext = extname(path).toLowerCase();
  if (ext === '.json') return 'json';
  if (ext === '.csv') return 'csv';
  return text.trimStart().startsWith('{') ? 'json' : 'csv';
}

/** File-name stems of the samples: lower-case letters and digits, unique. */
export function slugs(names: readonly string[]): string[] {
  const used = new Set<string>();
  return names.map((name) => {
    const base =
      name
        .toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-+|-+$/g, '') || 'sample';
    let slug = base;
    for (let k = 2; used.has(slug); k++) slug = `${base}-${k}`;
    used.add(slug);
    return slug;
  });
}

/**
 * The checks a sheet needs from the file system: each spectrum file must exist and, unless
 * `allowOutside`, lie inside the sheet's folder or the working folder (a sheet from elsewhere
 * must not make the report read, and quote, files such as /etc/passwd).
 */
function checkSpectra(
  sheet: SampleSheet,
  dir: string,
  cwd: string,
  allowOutside: boolean,
): { sheet: SampleSheet; problems: SheetProblem[] } {
  const problems: SheetProblem[] = [];
  const samples = sheet.samples.filter((s) => {
    if (!s.spectrum) return true;
    const path = resolve(dir, s.spectrum.file);
    const fail = (message: string) => {
      problems.push({ sample: s.name, field: 'spectrum.file', message });
      return false;
    };
    if (!allowOutside && !isInside(path, dir) && !isInside(path, cwd)) {
      return fail(
        `${s.spectrum.file} lies outside the sheet's folder and the working folder (give --allow-outside-files to read it)`,
      );
    }
    return existsSync(path) ? true : fail(`no such file: ${s.spectrum.file}`);
  });
  return { sheet: { ...sheet, samples: samples.flatMap((s) => everyColumn(s, dir, problems)) }, problems };
}

/**
 * A sample whose spectrum's yColumn is "all" becomes one sample per y column of its file, named
 * `name (column header)`, each read from its column; other samples stay as they are.
 */
function everyColumn(sample: SampleSpec, dir: string, problems: SheetProblem[]): SampleSpec[] {
  const spec = sample.spectrum;
  if (!spec || !isAllColumns(spec.yColumn)) return [sample];
  try {
    const layout = spectrumColumns(readTextFile(resolve(dir, spec.file)), spec.xColumn);
    const ys = layout.columns.filter((c) => c.number !== layout.x);
    const repeated = (label: string) => ys.filter((c) => c.label === label).length > 1;
    return ys.map((c) => ({
      ...sample,
      name: `${sample.name} (${repeated(c.label) ? `${c.label}, column ${c.number}` : c.label})`,
      spectrum: { ...spec, xColumn: String(layout.x), yColumn: String(c.number) },
    }));
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    problems.push({ sample: sample.name, field: 'spectrum.yColumn', message: `${spec.file}: ${e.message}` });
    return [];
  }
}

/** Whether `path` lies inside `dir` (both absolute, compared after resolving `..`). */
function isInside(path: string, dir: string): boolean {
  const r = relative(dir, path);
  return r !== '' && !r.startsWith('..') && !isAbsolute(r);
}

/** A sample sheet read and checked: its valid samples, the problems, and the folder its paths are relative to. */
export interface CheckedSheet {
  readonly sheet: SampleSheet;
  readonly problems: SheetProblem[];
  readonly sheetDir: string;
}

/**
 * Reads a sample sheet (JSON or CSV) and sets aside samples whose spectrum file is missing or,
 * unless `allowOutside`, lies outside the sheet's folder and `cwd`.
 * @throws InputError when the sheet cannot be read or parsed.
 */
export function readSheet(sheetPath: string, cwd: string, allowOutside: boolean): CheckedSheet {
  const full = resolve(cwd, sheetPath);
  const text = readTextFile(full);
  const parsed = parseSampleSheet(text, sheetFormat(full, text));
  const sheetDir = dirname(full);
  return { ...checkSpectra(parsed, sheetDir, cwd, allowOutside), sheetDir };
}

/** The report's outcome: the model, where it was written, and the exit code. */
export interface ReportRun {
  readonly model: ReportModel;
  readonly dir: string;
  readonly files: readonly string[];
}

/**
 * Runs the report: reads and checks the sheet, analyses the samples (in parallel where that
 * helps), and writes the folder. Exit code rule: 0 when at least one sample was reported (the
 * others are listed as problems, on stderr and in the report); an InputError (exit 2) when the
 * sheet is unreadable or no sample could be reported — then nothing is written. `sheetLabel`
 * names the sheet in the report.
 */
export async function runReport(
  sheetPath: string,
  job: ReportJob,
  io: Io,
  sheetLabel: string = sheetPath,
): Promise<ReportRun> {
  const { jobs } = job;
  const { sheet, problems, sheetDir } = readSheet(sheetPath, io.cwd, job.allowOutside === true);
  const dir = resolve(io.cwd, job.output);
  // Reserved before the work, so a folder that cannot take the report is refused at once.
  const folder = reserveReportFolder(dir);
  try {
    const model = await reportOf(sheet, problems, sheetDir, sheetLabel, jobs, io);
    if (model.samples.length === 0 && model.structureOnly.length === 0) {
      throw new InputError(
        `no sample of ${sheetPath} could be reported (${model.problems.length} problem${model.problems.length === 1 ? '' : 's'}, listed above)`,
      );
    }
    const files = reportFiles(model, sheetDir);
    commitReportFolder(folder, files);
    return { model, dir, files: [...files.keys()] };
  } finally {
    abandonReportFolder(folder);
  }
}

/** Analyses the samples and builds the report's model; the problems go to stderr as they are. */
async function reportOf(
  sheet: SampleSheet,
  problems: readonly SheetProblem[],
  sheetDir: string,
  sheetLabel: string,
  jobs: number | undefined,
  io: Io,
): Promise<ReportModel> {
  const names = sheet.samples.map((s) => s.name);
  const stems = slugs(names);
  const tasks: SampleTask[] = sheet.samples.map((sample, i) => ({
    sample,
    sheetDir,
    slug: stems[i] ?? `sample-${i + 1}`,
  }));
  const outcomes: SampleOutcome[] = tasks.length > 0 ? await runSamples(tasks, io, jobs ? { jobs } : {}) : [];
  const model = reportModel(
    { ...sheet, problems: [...sheet.problems, ...problems] },
    sheetLabel,
    outcomes,
    VERSION,
    new Date().toISOString().slice(0, 10),
  );
  for (const p of model.problems)
    io.err(
      `termsplit: ${messageLine(`sample "${p.sample}": ${p.field === 'analysis' ? '' : `field "${p.field}": `}${p.message}`)}\n`,
    );
  return model;
}

/** Every file of the report folder, by relative path. */
function reportFiles(model: ReportModel, sheetDir: string): Map<string, string> {
  const trends =
    model.series.length >= 2
      ? {
          tenDq: renderTrend(model.series, 'tenDq', { format: 'svg' }).toString('utf8'),
          beta: renderTrend(model.series, 'beta', { format: 'svg' }).toString('utf8'),
        }
      : undefined;
  const blocks = reportBlocks(model, trends);
  const files = new Map<string, string>();
  files.set('report.md', toMarkdown(blocks));
  files.set('report.html', toHtml(blocks, model.title));
  for (const b of blocks) {
    if (b.kind === 'table') files.set(b.csv, toCsv(b));
    if (b.kind === 'figure') files.set(b.path, b.svg);
  }
  files.set('report.json', jsonText(reportJson(model)));
  for (const s of model.samples) {
    const spectrum =
      s.spectrumFile === undefined ? undefined : spectrumOfFile(resolve(sheetDir, s.spectrumFile));
    const title = `termsplit explorer — ${s.name}`;
    files.set(sampleFiles(s.slug).explorer, explorerHtml({ title, samples: [sampleOfResult(s, spectrum)] }));
  }
  return files;
}

/** The JSON of the report: everything but the figures' SVG text, which are files. */
export function reportJson(model: ReportModel) {
  return {
    generator: REPORT_GENERATOR,
    version: model.version,
    date: model.date,
    title: model.title,
    invented: model.invented,
    ...(model.about ? { about: model.about } : {}),
    sheet: model.sheet,
    series: model.series,
    orders: model.orders,
    samples: model.samples.map(({ svg, ...rest }) => ({
      ...rest,
      figures: {
        ...(svg.diagram ? { diagram: sampleFiles(rest.slug).diagram } : {}),
        ...(svg.spectrum ? { spectrum: sampleFiles(rest.slug).spectrum } : {}),
      },
    })),
    ...(model.structureOnly.length > 0 ? { structureOnly: model.structureOnly } : {}),
    problems: model.problems,
    methods: model.methods,
    references: model.references,
    cautions: model.cautions,
    ...(model.series.length >= 2 ? { figures: { tenDq: SERIES_FILES.tenDq, beta: SERIES_FILES.beta } } : {}),
  };
}
