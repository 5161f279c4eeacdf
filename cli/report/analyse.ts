import { dirname, resolve } from 'node:path';
import {
  crossoverCautions,
  DEFAULT_C_OVER_B,
  type FitResult,
  type FitSolution,
  findIon,
  fitBands,
  fitSpinVerdict,
  freeIonRatio,
  InputError,
  type SampleSpec,
  type SeriesEntry,
} from '../../src/index.js';
import { crossingsJson, verdictJson } from '../commands/crossover.js';
import { fitJson, fittedDiagram, solutionJson } from '../commands/fit.js';
import { analyseSpectrum, spectrumFigure } from '../commands/spectrum.js';
import { memoryIo } from '../io.js';

/**
 * The work on one sample of a report: its bands (given, or found in its spectrum), the band fit,
 * the correlation diagram with the sample on it, the spectrum overlay, and the spin-state
 * verdict for dⁿ with a choice of spin. Plain data in and out, so it can run in a worker thread.
 */

/** One sample to analyse. */
export interface SampleTask {
  readonly sample: SampleSpec;
  /** Directory that the sample's spectrum path is relative to (the sheet's). */
  readonly sheetDir: string;
  /** File-name stem for the sample's tables and figures. */
  readonly slug: string;
}

/** The spin-state verdict of a sample, as reported: the crossings, the sample's side and margin, cautions. */
export type SpinReport = ReturnType<typeof verdictJson> & {
  readonly statement: string;
  readonly crossings: ReturnType<typeof crossingsJson>;
  readonly cautions: readonly string[];
};

/** A sample that was analysed. */
export interface SampleResult {
  readonly ok: true;
  readonly name: string;
  readonly slug: string;
  readonly ion: string;
  readonly n: number;
  readonly geometry: 'oct' | 'tet';
  readonly source: 'bands' | 'spectrum';
  readonly spectrumFile?: string;
  /** The band maxima fitted, cm⁻¹, with their uncertainties (null where none was given). */
  readonly observed: readonly { energy: number; sigma: number | null }[];
  /** Bands found in the spectrum (number, centre, FWHM, flags), when there is one. */
  readonly spectrumBands?: readonly {
    number: number;
    center: number;
    fwhm: number;
    flags: readonly string[];
  }[];
  readonly fit: ReturnType<typeof fitJson>;
  readonly best: ReturnType<typeof solutionJson>;
  readonly series: SeriesEntry;
  readonly spin?: SpinReport;
  readonly cautions: readonly string[];
  /** Figures as SVG text (the HTML report embeds them; files are written beside it). */
  readonly svg: { readonly diagram?: string; readonly spectrum?: string };
}

/** A sample that could not be analysed, with the reason in one line. */
export interface SampleFailure {
  readonly ok: false;
  readonly name: string;
  readonly slug: string;
  readonly error: string;
}

/** The outcome of one sample. */
export type SampleOutcome = SampleResult | SampleFailure;

/** Analyses one sample; an input problem becomes a {@link SampleFailure}, other errors too (named as internal). */
export function analyseSample(task: SampleTask): SampleOutcome {
  try {
    return analyse(task);
  } catch (e) {
    const message = e instanceof InputError ? e.message : `internal error: ${(e as Error).message}`;
    return { ok: false, name: task.sample.name, slug: task.slug, error: message };
  }
}

function cOverBOf(sample: SampleSpec): { cOverB: number; origin: string } {
  if (sample.cOverB !== undefined) return { cOverB: sample.cOverB, origin: 'given in the sample sheet' };
  const ratio = freeIonRatio(findIon(sample.ion));
  return ratio !== undefined
    ? { cOverB: ratio, origin: `free-ion ratio of ${sample.ion}` }
    : { cOverB: DEFAULT_C_OVER_B, origin: `default ${DEFAULT_C_OVER_B}` };
}

function analyse(task: SampleTask): SampleResult {
  const { sample } = task;
  const ion = findIon(sample.ion);
  const ratio = cOverBOf(sample);
  let result: FitResult;
  let source: 'bands' | 'spectrum';
  let spectrumSvg: string | undefined;
  let spectrumBands: SampleResult['spectrumBands'];
  const cautions: string[] = [];
  if (sample.bands) {
    source = 'bands';
    result = fitBands({
      n: ion.n,
      geometry: sample.geometry,
      bands: sample.bands.map((b) =>
        b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
      ),
      freeIon: ion,
      cOverB: ratio.cOverB,
      fitC: sample.fitC,
      includeSpinForbidden: sample.spinForbidden,
      ...(sample.spinState ? { spinState: sample.spinState } : {}),
      ...(sample.assign ? { assignments: sample.assign } : {}),
    });
  } else if (sample.spectrum) {
    source = 'spectrum';
    const spec = sample.spectrum;
    const report = analyseSpectrum(
      resolve(task.sheetDir, spec.file),
      {
        ion: ion.ion,
        geometry: sample.geometry,
        ...(spec.range !== undefined ? { range: spec.range } : {}),
        ...(spec.xUnit !== undefined ? { xUnit: spec.xUnit } : {}),
        ...(spec.yUnit !== undefined ? { yUnit: spec.yUnit } : {}),
        ...(spec.xColumn !== undefined ? { xCol: spec.xColumn } : {}),
        ...(spec.yColumn !== undefined ? { yCol: spec.yColumn } : {}),
        ...(spec.conc !== undefined ? { conc: String(spec.conc) } : {}),
        ...(spec.path !== undefined ? { path: String(spec.path) } : {}),
        ...(sample.cOverB !== undefined ? { cb: String(sample.cOverB) } : {}),
        spinForbidden: sample.spinForbidden,
        ...(sample.spinState ? { spinState: sample.spinState } : {}),
        fitC: sample.fitC,
      },
      memoryIo(dirname(resolve(task.sheetDir, spec.file))),
    );
    if (!report.fit || !('result' in report.fit)) {
      throw new InputError(
        `spectrum ${spec.file}: ${report.fit && 'failure' in report.fit ? report.fit.failure : 'no fit'}`,
      );
    }
    result = report.fit.result;
    spectrumSvg = spectrumFigure(report, 'svg').toString('utf8');
    spectrumBands = report.analysis.bands.map((b) => ({
      number: b.number,
      center: b.center,
      fwhm: b.fwhm,
      flags: b.flags,
    }));
    cautions.push(...report.cautions);
  } else {
    throw new InputError(`sample "${sample.name}": no bands and no spectrum`);
  }
  const best = result.solutions[0];
  if (!best) throw new InputError(`sample "${sample.name}": the fit found no solution`);
  cautions.push(...result.warnings.map((w) => w.message), ...best.warnings.map((w) => w.message));
  const diagram =
    best.deltaOverB === null ? undefined : fittedDiagram(result, best, 'svg', ion.ion).toString('utf8');
  const spin = spinReport(ion.n, sample.geometry, best);
  return {
    ok: true,
    name: sample.name,
    slug: task.slug,
    ion: ion.ion,
    n: ion.n,
    geometry: sample.geometry,
    source,
    ...(sample.spectrum ? { spectrumFile: sample.spectrum.file } : {}),
    observed: result.bands.map((b) => ({ energy: b.energy, sigma: b.sigma ?? null })),
    ...(spectrumBands ? { spectrumBands } : {}),
    fit: fitJson(result, ion.ion, ratio.origin),
    best: solutionJson(best),
    series: seriesEntry(sample, ion.ion, best, spin),
    ...(spin ? { spin } : {}),
    cautions: [...new Set(cautions)],
    svg: { ...(diagram ? { diagram } : {}), ...(spectrumSvg ? { spectrum: spectrumSvg } : {}) },
  };
}

function spinReport(n: number, geometry: 'oct' | 'tet', best: FitSolution): SpinReport | undefined {
  if (best.deltaOverB === null) return undefined;
  const { analysis, verdict } = fitSpinVerdict(n, geometry, best);
  if (analysis.crossings.length === 0) return undefined;
  return {
    ...verdictJson(verdict),
    statement: analysis.statement,
    crossings: crossingsJson(analysis),
    cautions: crossoverCautions(analysis).map((c) => c.message),
  };
}

function seriesEntry(
  sample: SampleSpec,
  ion: string,
  best: FitSolution,
  spin: SpinReport | undefined,
): SeriesEntry {
  const noB = best.deltaOverB === null;
  return {
    name: sample.name,
    ion,
    geometry: sample.geometry,
    dq: best.dq,
    tenDq: best.tenDq,
    B: noB ? null : best.B,
    C: noB ? null : best.C,
    beta: best.beta,
    deltaOverB: best.deltaOverB,
    rms: best.rms,
    errors: { dq: best.errors.dq, tenDq: best.errors.tenDq, B: best.errors.B, beta: best.errors.beta },
    ...(spin ? { spin: spin.side } : {}),
  };
}
