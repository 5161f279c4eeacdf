/**
 * The short terminal summary of a written report: one row per sample with 10Dq, B, β, rms and
 * spin state, and the files written.
 */

import { unicodeIon } from '../../src/field/labels.js';
import { fixed, table } from '../format.js';
import { withError } from '../present/fitPresent.js';
import type { SampleResult } from './analyse.js';
import type { ReportRun } from './runReport.js';

/** A short summary of a written report, for the terminal. */
export function reportSummary(run: ReportRun): string {
  const { model, dir } = run;
  const lines = [
    `${model.title}${model.invented && !/invented/i.test(model.title) ? ' (invented data)' : ''}: ${model.samples.length} sample${model.samples.length === 1 ? '' : 's'} reported` +
      (model.problems.length > 0
        ? `, ${new Set(model.problems.map((p) => p.sample)).size} with problems (see above)`
        : ''),
    '',
    table(
      ['sample', 'ion', '10Dq / cm⁻¹', 'B / cm⁻¹', 'β', 'rms / cm⁻¹', 'spin state'],
      model.series.map((e) => {
        const s = model.samples.find((x) => x.name === e.name) as SampleResult | undefined;
        return [
          e.name,
          `${unicodeIon(e.ion)}${e.geometry === 'tet' ? ' Td' : ''}`,
          withError(e.tenDq, e.errors.tenDq),
          e.B === null ? '—' : withError(e.B, e.errors.B),
          e.beta === null ? '—' : withError(e.beta, e.errors.beta, 3),
          fixed(e.rms),
          s?.spin ? `${s.spin.side}${s.spin.near ? ' (close)' : ''}` : '—',
        ];
      }),
    ),
    '',
    `Report written to ${dir}/`,
    '  report.html  — one page with every table and figure; open it in a browser',
    '  report.md    — the same in Markdown (figures in figures/)',
    '  report.json  — everything, for programs',
    '  tables/*.csv — every table',
    '  figures/*.svg — correlation diagrams, spectra and series trends',
  ];
  return `${lines.join('\n')}\n`;
}
