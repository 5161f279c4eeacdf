/**
 * `termsplit report <sheet>`: checks the options into a report job, runs the report over the
 * sample sheet and prints its summary or its JSON.
 */

import type { Command } from 'commander';
import { JOBS_LIMIT, SHEET_SAMPLES_LIMIT } from '../../src/core/limits.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { INPUT_FILE_MAX_TEXT } from '../files.js';
import { jsonText } from '../format.js';
import type { Io } from '../io.js';
import { numberOption } from '../options.js';

/** Options of `termsplit report`. */
export interface ReportOptions {
  output?: string;
  jobs?: string;
  allowOutsideFiles?: boolean;
  json?: boolean;
}

/** Default report folder, in the current directory. */
export const DEFAULT_REPORT_DIR = 'termsplit-report';

/** `termsplit report <sheet>`: a report folder for every sample of a sample sheet. */
export function registerReport(program: Command, io: Io): void {
  program
    .command('report')
    .description(COMMAND_SUMMARIES.report.description)
    .argument(
      '<sheet>',
      `sample sheet: .json (full form) or .csv (one sample a row); at most ${SHEET_SAMPLES_LIMIT} samples and ${INPUT_FILE_MAX_TEXT} per file`,
    )
    .option('-o, --output <dir>', `report folder (default: ./${DEFAULT_REPORT_DIR})`)
    .option(
      '--jobs <n>',
      'worker threads for the samples (default: the cores, at most 4; never more than the cores)',
    )
    .option(
      '--allow-outside-files',
      'let the sheet name spectrum files outside its own folder and the working folder (only for sheets you trust)',
    )
    .option('--json', 'print the report as one JSON object on stdout')
    .action(async (sheetPath: string, opts: ReportOptions) => {
      const jobs = numberOption('--jobs', opts.jobs, JOBS_LIMIT);
      const job = {
        output: opts.output ?? DEFAULT_REPORT_DIR,
        ...(jobs !== undefined ? { jobs } : {}),
        allowOutside: opts.allowOutsideFiles === true,
      };
      // The report draws figures and checks sheets: its modules load only when it runs.
      const { reportJson, runReport } = await import('../report/runReport.js');
      const { reportSummary } = await import('../report/summary.js');
      const run = await runReport(sheetPath, job, io);
      io.out(opts.json ? jsonText(reportJson(run.model)) : reportSummary(run));
    });
}
