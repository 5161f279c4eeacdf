/**
 * The report model: the checked sheet, the samples' outcomes, the series, the spectrochemical
 * and nephelauxetic orders, methods, references and cautions — everything the report says, before
 * it is written in any format.
 */

import type { SampleSheet, SheetProblem } from '../../src/sheets/sampleSheet.js';
import type { IonOrder } from '../../src/sheets/series.js';
import { type SeriesEntry, seriesOrders, seriesTable } from '../../src/sheets/series.js';
import type { SampleFailure, SampleOutcome, SampleResult } from './analyse.js';

/** A sample shown only with the fit of its geometry. */
export type StructureOnlySample = SampleFailure & {
  readonly structure: NonNullable<SampleFailure['structure']>;
};

import { methodsParagraph, referencesFor } from './methods.js';

/** Everything a report shows, in the order it shows it. */
export interface ReportModel {
  readonly title: string;
  readonly invented: boolean;
  readonly about?: string;
  readonly version: string;
  readonly date: string;
  readonly sheet: string;
  readonly samples: readonly SampleResult[];
  /** Samples whose cubic analysis failed but whose fit with their geometry worked (also among the problems). */
  readonly structureOnly: readonly StructureOnlySample[];
  /** Samples that failed: in the sheet (per field) or in the analysis. */
  readonly problems: readonly SheetProblem[];
  readonly series: readonly SeriesEntry[];
  readonly orders: readonly IonOrder[];
  readonly methods: string;
  readonly references: readonly string[];
  readonly cautions: readonly string[];
}

/** Model cautions every report carries (see the README's Cautions). */
export const REPORT_CAUTIONS = [
  'Ligand-field parameters here come from an ideal cubic model (electron repulsion in B and C plus a cubic field); spin–orbit coupling, lower symmetry and vibronic effects are left out, and band maxima are taken as vertical transition energies.',
  'Jahn–Teller-active ground states (octahedral high-spin d⁴, d⁹, low-spin d⁷, and more weakly T ground states) split or broaden bands: cubic parameters are averages there.',
  'Bands above about 30 000 cm⁻¹ may be charge-transfer or ligand bands, or hide d–d bands (common practice, no source).',
  'A spin-state verdict places the sample against the crossover of the model at 0 K; which spin state a real compound adopts depends also on entropy, lattice and temperature — magnetometry or Mössbauer spectroscopy decides.',
  'Where several band assignments fit nearly as well, the report lists them: intensities, widths and the trend along the series decide between them, not the positions alone.',
];

/** Builds the report model from the sheet and the outcomes of its samples. */
export function reportModel(
  sheet: SampleSheet,
  sheetPath: string,
  outcomes: readonly SampleOutcome[],
  version: string,
  date: string,
): ReportModel {
  const samples = outcomes.filter((o): o is SampleResult => o.ok);
  const failures: SheetProblem[] = outcomes
    .filter((o) => !o.ok)
    .map((o) => ({
      sample: o.name,
      field: 'analysis',
      message: o.ok
        ? ''
        : `${o.error}${o.structure ? ' (the fit with its geometry is shown under Samples)' : ''}`,
    }));
  const structureOnly = outcomes.filter((o): o is StructureOnlySample => !o.ok && o.structure !== undefined);
  const series = seriesTable(samples.map((s) => s.series));
  return {
    title: sheet.title,
    invented: sheet.invented,
    ...(sheet.about ? { about: sheet.about } : {}),
    version,
    date,
    sheet: sheetPath,
    samples,
    structureOnly,
    problems: [...sheet.problems, ...failures],
    series,
    orders: seriesOrders(series),
    methods: methodsParagraph(
      samples,
      version,
      structureOnly.map((s) => s.name),
    ),
    references: referencesFor(
      samples,
      structureOnly.map((s) => s.name),
    ),
    cautions: REPORT_CAUTIONS,
  };
}
