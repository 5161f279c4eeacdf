/**
 * `termsplit explore`: writes the explorer page — one self-contained HTML file in which Dq, B,
 * C/B and ζ move on sliders and the correlation diagram, the levels and the sample's bands and
 * spectrum follow, computed in the browser by the same library — for an ion or dⁿ, or for every
 * sample of a sheet; with `--serve` it also serves the page on localhost.
 */

import { createServer, type Server } from 'node:http';
import { basename, resolve } from 'node:path';
import type { Command } from 'commander';
import type { ExplorerData, ExplorerSample } from '../../explorer/data.js';
import { DEFAULT_ENERGY_UNIT } from '../../src/core/defaults.js';
import { InputError } from '../../src/core/errors.js';
import { B_LIMIT, DQ_LIMIT } from '../../src/core/limits.js';
import { parseEnergyList, parseUnit } from '../../src/core/units.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { writeFileAtomic } from '../files.js';
import { jsonText, messageLine } from '../format.js';
import type { Io } from '../io.js';
import {
  cbHelp,
  GEOMETRY_OPTION,
  geometryOption,
  ionOrCount,
  numberOption,
  ratioChoice,
} from '../options.js';
import { ZETA_FACTOR_HELP, ZETA_HELP, zetaOption } from '../zetaOption.js';

/** The page's file name unless `-o` gives one. */
export const DEFAULT_EXPLORER_FILE = 'termsplit-explorer.html';

/** Ports `--serve` accepts (unprivileged). */
const PORT_LIMIT = { what: 'a port number', min: 1024, max: 65_535, integer: true } as const;

/** Options of `termsplit explore`. */
export interface ExploreOptions {
  ion?: string;
  d?: string;
  geometry?: string;
  dq?: string;
  B?: string;
  cb?: string;
  zeta?: string;
  zetaFactor?: string;
  bands?: string;
  unit?: string;
  spectrum?: string;
  sheet?: string;
  allowOutsideFiles?: boolean;
  output?: string;
  serve?: string;
  json?: boolean;
}

/** `termsplit explore`: the interactive page for an ion, dⁿ or a sheet of samples. */
export function registerExplore(program: Command, io: Io): void {
  program
    .command('explore')
    .description(COMMAND_SUMMARIES.explore.description)
    .option('--ion <name>', 'the metal ion, e.g. Ni2+ (gives n and the free-ion C/B)')
    .option('--d <n>', 'number of d electrons, 1–9, instead of --ion')
    .option(...GEOMETRY_OPTION)
    .option('--dq <cm-1>', 'starting Dq, cm⁻¹ (default: fitted to --bands, else a mid-range value)')
    .option('--B <cm-1>', 'starting Racah B, cm⁻¹ (default: fitted to --bands, else a mid-range value)')
    .option('--cb <ratio>', cbHelp('starting C/B'))
    .option('--zeta <cm-1|ion>', ZETA_HELP)
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option('--bands <list>', 'observed band maxima, e.g. 8500,13800,25300 (unit: --unit)')
    .option('--unit <unit>', `unit of --bands: cm-1, nm, eV or kK (default ${DEFAULT_ENERGY_UNIT})`)
    .option('--spectrum <file>', 'a measured spectrum to draw with the predicted transitions')
    .option('--sheet <file>', 'a sample sheet (.json or .csv): one entry per sample, from its fit')
    .option(
      '--allow-outside-files',
      'let the sheet name spectrum files outside its folder and the working folder',
    )
    .option('-o, --output <file>', `the page (default ./${DEFAULT_EXPLORER_FILE})`)
    .option('--serve <port>', 'also serve the page on http://127.0.0.1:<port>/ until interrupted')
    .option('--json', 'print one JSON object on stdout')
    .action(async (opts: ExploreOptions) => {
      const port = numberOption('--serve', opts.serve, PORT_LIMIT);
      const samples =
        opts.sheet === undefined ? [await optionSample(opts, io.cwd)] : await sheetSamples(opts, io);
      const data: ExplorerData = { title: pageTitle(opts, samples), samples };
      const { explorerHtml } = await import('../explorerPage.js');
      const html = explorerHtml(data);
      const path = resolve(io.cwd, opts.output ?? DEFAULT_EXPLORER_FILE);
      writeFileAtomic(path, html);
      const url = port === undefined ? undefined : `http://127.0.0.1:${port}/`;
      io.out(
        opts.json
          ? jsonText({
              file: path,
              bytes: Buffer.byteLength(html),
              ...(url ? { url } : {}),
              samples: samples.map(({ spectrum, ...s }) => ({
                ...s,
                spectrumPoints: spectrum?.wavenumber.length ?? 0,
              })),
            })
          : `wrote ${path} (${samples.length} sample${samples.length === 1 ? '' : 's'}); open it in a browser\n`,
      );
      if (port !== undefined && url !== undefined) {
        const server = await serveHtml(html, port);
        io.err(`serving ${url} — press Ctrl-C to stop\n`);
        await new Promise<void>((done) => server.on('close', done));
      }
    });
}

function pageTitle(opts: ExploreOptions, samples: readonly ExplorerSample[]): string {
  if (opts.sheet !== undefined) return `termsplit explorer — ${basename(opts.sheet)}`;
  return `termsplit explorer — ${samples[0]?.name ?? ''}`;
}

/** The one sample of the options (the fit and spectrum readers load here, not at start-up). */
async function optionSample(opts: ExploreOptions, cwd: string): Promise<ExplorerSample> {
  const { sampleOfOptions, spectrumOfFile } = await import('../explorerSamples.js');
  const choice = ionOrCount(opts.ion, opts.d);
  const geometry = geometryOption(opts.geometry);
  const dq = numberOption('--dq', opts.dq, DQ_LIMIT);
  const B = numberOption('--B', opts.B, B_LIMIT);
  const ratio = ratioChoice(undefined, undefined, opts.cb, choice.ion);
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, choice.ion);
  const bands =
    opts.bands === undefined
      ? []
      : parseEnergyList(opts.bands, parseUnit(opts.unit ?? DEFAULT_ENERGY_UNIT)).map((b) => b.value);
  const spectrum = opts.spectrum === undefined ? undefined : spectrumOfFile(resolve(cwd, opts.spectrum));
  return sampleOfOptions({
    n: choice.n,
    ...(choice.ion ? { ion: choice.ion } : {}),
    geometry,
    ...(dq !== undefined ? { dq } : {}),
    ...(B !== undefined ? { B } : {}),
    cOverB: ratio.cOverB,
    cOverBGiven: opts.cb !== undefined,
    ...(zeta !== undefined ? { zeta } : {}),
    bands,
    ...(spectrum ? { spectrum } : {}),
  });
}

/**
 * Every sample of the sheet that could be fitted (the others are named on stderr). The sheet
 * schema, the figure stack of the analysis and the readers load here, not at start-up.
 */
async function sheetSamples(opts: ExploreOptions, io: Io): Promise<ExplorerSample[]> {
  for (const o of ['ion', 'd', 'dq', 'B', 'cb', 'zeta', 'bands', 'spectrum'] as const) {
    if (opts[o] !== undefined)
      throw new InputError(`--${o} goes with a single sample: leave it out with --sheet`);
  }
  const [{ sampleOfResult, spectrumOfFile }, { analyseSample }, { readSheet, slugs }] = await Promise.all([
    import('../explorerSamples.js'),
    import('../report/analyse.js'),
    import('../report/runReport.js'),
  ]);
  const { sheet, problems, sheetDir } = readSheet(opts.sheet ?? '', io.cwd, opts.allowOutsideFiles === true);
  const names = slugs(sheet.samples.map((s) => s.name));
  const samples: ExplorerSample[] = [];
  sheet.samples.forEach((sample, i) => {
    const r = analyseSample({ sample, sheetDir, slug: names[i] ?? String(i) });
    if (!r.ok) {
      problems.push({ sample: r.name, field: 'analysis', message: r.error });
      return;
    }
    const file = r.spectrumFile;
    samples.push(sampleOfResult(r, file === undefined ? undefined : spectrumOfFile(resolve(sheetDir, file))));
  });
  for (const p of problems) io.err(`termsplit: ${messageLine(`sample "${p.sample}": ${p.message}`)}\n`);
  if (samples.length === 0) throw new InputError(`no sample of ${opts.sheet} could be fitted`);
  return samples;
}

/**
 * Serves `html` at every path of http://127.0.0.1:`port`/ (loopback only: the page needs no
 * other host). Resolves once listening.
 * @throws InputError when the port is taken.
 */
export function serveHtml(html: string, port: number): Promise<Server> {
  const server = createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
    res.end(html);
  });
  return new Promise((done, fail) => {
    server.once('error', (e) => fail(new InputError(`--serve ${port}: ${e.message}`)));
    server.listen(port, '127.0.0.1', () => done(server));
  });
}
