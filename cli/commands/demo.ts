/**
 * `termsplit demo`: runs the whole report on the invented demo sheet shipped with the package and
 * prints its summary (marked as invented) or its JSON.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { packageRoot } from '../files.js';
import { jsonText } from '../format.js';
import type { Io } from '../io.js';

/** The invented demo sheet shipped with the package. */
export function demoSheet(): string {
  return resolve(packageRoot(), 'fixtures/demo/samples.json');
}

/** Default folder of the demo report, in the current directory. */
export const DEFAULT_DEMO_DIR = 'termsplit-demo';

/** `termsplit demo`: the whole job — fits, diagrams, spectra, spin state, report — on the invented demo series. */
export function registerDemo(program: Command, io: Io): void {
  program
    .command('demo')
    .description(COMMAND_SUMMARIES.demo.description)
    .option('-o, --output <dir>', `report folder (default: ./${DEFAULT_DEMO_DIR})`)
    .option('--json', 'print the report as one JSON object on stdout')
    .action(async (opts: { output?: string; json?: boolean }) => {
      // The report draws figures and checks sheets: its modules load only when it runs.
      const { reportJson, runReport } = await import('../report/runReport.js');
      const { reportSummary } = await import('../report/summary.js');
      const run = await runReport(
        demoSheet(),
        // The shipped demo sheet names the shipped spectra beside its folder.
        { output: opts.output ?? DEFAULT_DEMO_DIR, allowOutside: true },
        io,
        'the built-in demo sheet fixtures/demo/samples.json',
      );
      io.out(
        opts.json
          ? jsonText(reportJson(run.model))
          : `termsplit demo — INVENTED data (fixtures/demo/samples.json), for demonstration only.\n\n${reportSummary(run)}`,
      );
    });
}
