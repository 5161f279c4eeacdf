/**
 * The work on one sample of a report: its bands (given, or found in its spectrum), the band fit,
 * the correlation diagram with the sample on it, the spectrum overlay, and the spin-state
 * verdict for dⁿ with a choice of spin, and μ_eff with spin–orbit coupling where the sheet gives
 * a ζ. The sample's checked values go to the library functions
 * as numbers. Plain data in and out, so it can run in a worker thread.
 */

import { resolve } from 'node:path';
import { crossoverCautions } from '../../src/analysis/crossover.js';
import { spinOnlyMoment } from '../../src/analysis/magnetism.js';
import { susceptibility } from '../../src/analysis/susceptibility.js';
import { InputError } from '../../src/core/errors.js';
import type { Geometry } from '../../src/core/geometry.js';
import { elementOfIon, type FreeIon, findIon } from '../../src/core/ions.js';
import { chooseRatio, type RatioChoice } from '../../src/core/ratioChoice.js';
import { solveCubic } from '../../src/field/cubic.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import { fitBands } from '../../src/fit/fitBands.js';
import type { FitResult, FitSolution } from '../../src/fit/fitTypes.js';
import { fitSpinVerdict } from '../../src/fit/fitVerdict.js';
import { refineFitWithZeta } from '../../src/fit/zetaFit.js';
import type { SampleSpec } from '../../src/sheets/sampleSheet.js';
import type { SeriesEntry } from '../../src/sheets/series.js';
import { DEFAULT_BASELINE } from '../../src/spectra/bandFinding.js';
import { parseRange } from '../../src/spectra/energyRange.js';
import { analyseSpectrum, type SpectrumAnalysis } from '../../src/spectra/spectrumAnalysis.js';
import { parseXUnit, parseYUnit } from '../../src/spectra/spectrumUnits.js';
import { type DistortedSampleReport, distortedSampleFit } from '../distorted.js';
import { readTextFile } from '../files.js';
import { crossingsJson, verdictJson } from '../present/crossoverPresent.js';
import { fitJson, solutionJson } from '../present/fitPresent.js';
import { fittedDiagram } from '../present/fittedDiagram.js';
import { spectrumFigure } from '../present/spectrumFigure.js';

/** One sample to analyse. */
export interface SampleTask {
  readonly sample: SampleSpec;
  /** Directory that the sample's spectrum path is relative to (the sheet's). */
  readonly sheetDir: string;
  /** File-name stem for the sample's tables and figures. */
  readonly slug: string;
}

/** Temperatures at which the report gives μ_eff with spin–orbit coupling, K. */
export const REPORT_TEMPERATURES = [300, 80, 2] as const;

/** μ_eff with spin–orbit coupling at the fitted parameters, beside the spin-only moment of the ground spin. */
export interface MagnetismReport {
  readonly zeta: number;
  /** The fitted ground state without spin–orbit coupling, its S and μ_so. */
  readonly ground: string;
  readonly S: number;
  readonly spinOnly: number;
  /** The ground level with spin–orbit coupling, e.g. `Γ6(1)`. */
  readonly groundSpinOrbit: string;
  readonly temperatures: readonly number[];
  readonly muEff: readonly number[];
}

/** ζ fitted from the resolved components of a split band (sheet field `fitZeta`), or held and why. */
export interface ZetaReport {
  readonly zeta: number;
  readonly error: number | null;
  readonly fitted: boolean;
  readonly zetaOverFreeIon: number | null;
  /** Each resolved component and its spin–orbit level, with the level's largest parents. */
  readonly components: readonly {
    readonly observed: number;
    readonly level: string;
    readonly parentage: readonly { readonly state: string; readonly weight: number }[];
  }[];
  readonly warnings: readonly string[];
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
  readonly geometry: Geometry;
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
  /** μ_eff with spin–orbit coupling beside spin-only, when the sheet gives the sample a ζ. */
  readonly magnetism?: MagnetismReport;
  /** ζ fitted (or held, and why), when the sheet asks for it. */
  readonly zetaFit?: ZetaReport;
  readonly cautions: readonly string[];
  /** The fit with the sample's geometry, when the sheet gives one (`structure`). */
  readonly structure?: DistortedSampleReport;
  /** Figures as SVG text (the HTML report embeds them; files are written beside it). */
  readonly svg: { readonly diagram?: string; readonly spectrum?: string };
}

/** A sample that could not be analysed, with the reason in one line. */
export interface SampleFailure {
  readonly ok: false;
  readonly name: string;
  readonly slug: string;
  readonly error: string;
  /** The fit with the sample's geometry, where the sheet gives one and it worked though the cubic analysis did not. */
  readonly structure?: DistortedSampleReport;
}

/** The outcome of one sample. */
export type SampleOutcome = SampleResult | SampleFailure;

/** Analyses one sample; an input problem becomes a {@link SampleFailure}, other errors too (named as internal). */
export function analyseSample(task: SampleTask): SampleOutcome {
  try {
    return analyse(task);
  } catch (e) {
    const message = e instanceof InputError ? e.message : `internal error: ${(e as Error).message}`;
    const structure = e instanceof InputError ? structureOnly(task) : undefined;
    if (typeof structure === 'string') {
      return { ok: false, name: task.sample.name, slug: task.slug, error: `${message}; ${structure}` };
    }
    return {
      ok: false,
      name: task.sample.name,
      slug: task.slug,
      error: message,
      ...(structure ? { structure } : {}),
    };
  }
}

/**
 * The fit with the geometry alone, for a sample whose cubic analysis failed: a distorted
 * complex's bands often fit no cubic model. Only given band maxima are used (a spectrum's bands
 * come from the cubic fit); undefined when there is no geometry, and the reason when it fails too.
 */
function structureOnly(task: SampleTask): DistortedSampleReport | string | undefined {
  const { sample } = task;
  if (!sample.structure || !sample.bands) return undefined;
  try {
    const ion = findIon(sample.ion);
    const bands = sample.bands.map((b) =>
      b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
    );
    return distortedSampleFit(sample.structure, task.sheetDir, {
      n: ion.n,
      ion,
      cOverB: cOverBOf(sample, ion).cOverB,
      bands,
    });
  } catch (e) {
    if (e instanceof InputError) return `the fit with its geometry failed too: ${e.message}`;
    throw e;
  }
}

/** The sample's C/B: given in the sheet, else the ion's free-ion ratio, else the default. */
function cOverBOf(sample: SampleSpec, ion: FreeIon): RatioChoice {
  const given =
    sample.cOverB === undefined ? undefined : { cOverB: sample.cOverB, origin: 'given in the sample sheet' };
  return chooseRatio(given, ion);
}

/** How the sample's bands were fitted, and what its spectrum (if any) added. */
interface SampleFit {
  readonly result: FitResult;
  readonly source: 'bands' | 'spectrum';
  readonly spectrum?: SpectrumAnalysis;
}

function analyse(task: SampleTask): SampleResult {
  const { sample } = task;
  const ion = findIon(sample.ion);
  const ratio = cOverBOf(sample, ion);
  const fit = sampleFit(task, ion, ratio);
  const { result } = fit;
  const best = result.solutions[0];
  if (!best) throw new InputError(`sample "${sample.name}": the fit found no solution`);
  const cautions = [
    ...(fit.spectrum?.cautions ?? []),
    ...result.warnings.map((w) => w.message),
    ...best.warnings.map((w) => w.message),
  ];
  const diagram =
    best.deltaOverB === null ? undefined : fittedDiagram(result, best, 'svg', ion.ion).toString('utf8');
  const spectrumSvg = fit.spectrum
    ? spectrumFigure(fit.spectrum, `termsplit spectrum ${spectrumPath(task)}`, 'svg').toString('utf8')
    : undefined;
  const spin = spinReport(ion.n, sample.geometry, best);
  const structure = structureFit(task, ion, ratio, result.bands, cautions);
  const zetaFit =
    sample.fitZeta && sample.zeta !== undefined ? zetaReport(result, best, sample.zeta, ion) : undefined;
  // The moments use the fitted ζ where there is one.
  const zeta = zetaFit?.zeta ?? sample.zeta;
  const magnetism = zeta === undefined ? undefined : magnetismReport(ion.n, sample.geometry, best, zeta);
  return {
    ok: true,
    name: sample.name,
    slug: task.slug,
    ion: ion.ion,
    n: ion.n,
    geometry: sample.geometry,
    source: fit.source,
    ...(sample.spectrum ? { spectrumFile: sample.spectrum.file } : {}),
    observed: result.bands.map((b) => ({ energy: b.energy, sigma: b.sigma ?? null })),
    ...(fit.spectrum ? { spectrumBands: spectrumBands(fit.spectrum) } : {}),
    fit: fitJson(result, ion.ion, ratio.origin),
    best: solutionJson(best),
    series: seriesEntry(sample, ion.ion, best, spin),
    ...(spin ? { spin } : {}),
    ...(magnetism ? { magnetism } : {}),
    ...(zetaFit ? { zetaFit } : {}),
    cautions: [...new Set(cautions)],
    ...(structure ? { structure } : {}),
    svg: { ...(diagram ? { diagram } : {}), ...(spectrumSvg ? { spectrum: spectrumSvg } : {}) },
  };
}

/**
 * The fit with the sample's geometry; a problem with the geometry becomes a caution, so the cubic
 * analysis still stands.
 */
function structureFit(
  task: SampleTask,
  ion: FreeIon,
  ratio: RatioChoice,
  bands: readonly { energy: number; sigma?: number }[],
  cautions: string[],
): DistortedSampleReport | undefined {
  const { structure } = task.sample;
  if (!structure) return undefined;
  try {
    return distortedSampleFit(structure, task.sheetDir, { n: ion.n, ion, cOverB: ratio.cOverB, bands });
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    cautions.push(`structure: ${e.message}; no fit with the geometry`);
    return undefined;
  }
}

/** The fit of the sample's given bands, or of the bands found in its spectrum. */
function sampleFit(task: SampleTask, ion: FreeIon, ratio: RatioChoice): SampleFit {
  const { sample } = task;
  if (sample.bands) {
    if (sample.assign && sample.assign.length !== sample.bands.length) {
      throw new InputError(
        `field "assign": ${sample.assign.length} labels for ${sample.bands.length} bands: expected one per band, in band order (? leaves a band free)`,
      );
    }
    const result = fitBands({
      n: ion.n,
      geometry: sample.geometry,
      bands: sample.bands.map((b) =>
        b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
      ),
      freeIon: ion,
      cOverB: ratio.cOverB,
      ...(sample.fitC !== undefined ? { fitC: sample.fitC } : {}),
      merge: !sample.keepBands,
      includeSpinForbidden: sample.spinForbidden,
      ...(sample.spinState ? { spinState: sample.spinState } : {}),
      ...(sample.assign ? { assignments: sample.assign } : {}),
    });
    return { result, source: 'bands' };
  }
  if (!sample.spectrum) throw new InputError(`sample "${sample.name}": no bands and no spectrum`);
  const spectrum = sampleSpectrum(task, ion, sample.geometry, ratio);
  if (!spectrum.fit || !('result' in spectrum.fit)) {
    throw new InputError(
      `spectrum ${sample.spectrum.file}: ${spectrum.fit && 'failure' in spectrum.fit ? spectrum.fit.failure : 'no fit'}`,
    );
  }
  return { result: spectrum.fit.result, source: 'spectrum', spectrum };
}

/** The full path of the sample's spectrum file (relative paths are the sheet's). */
function spectrumPath(task: SampleTask): string {
  return resolve(task.sheetDir, task.sample.spectrum?.file ?? '');
}

/** The library's spectrum analysis of the sample's spectrum, fitted at the sample's C/B. */
function sampleSpectrum(
  task: SampleTask,
  ion: FreeIon,
  geometry: Geometry,
  ratio: RatioChoice,
): SpectrumAnalysis {
  const { sample } = task;
  const spec = sample.spectrum;
  if (!spec) throw new InputError(`sample "${sample.name}": no spectrum`);
  const xUnit = spec.xUnit === undefined ? undefined : parseXUnit(spec.xUnit);
  const yUnit = spec.yUnit === undefined ? undefined : parseYUnit(spec.yUnit);
  if ((spec.conc === undefined) !== (spec.path === undefined)) {
    throw new InputError('give both spectrum fields conc (mol/L) and path (cm) to turn absorbance into ε');
  }
  const range = spec.range === undefined ? undefined : parseRange(spec.range);
  const file = spectrumPath(task);
  const text = readTextFile(file);
  try {
    return analyseSpectrum(text, {
      fileName: file,
      ...(spec.xColumn !== undefined ? { xColumn: spec.xColumn } : {}),
      ...(spec.yColumn !== undefined ? { yColumn: spec.yColumn } : {}),
      ...(xUnit ? { xUnit } : {}),
      ...(yUnit ? { yUnit } : {}),
      ...(spec.conc !== undefined && spec.path !== undefined
        ? { concentration: spec.conc, pathLength: spec.path }
        : {}),
      ...(range ? { range } : {}),
      baseline: DEFAULT_BASELINE,
      includeChargeTransfer: false,
      names: {
        concentrationAndPath: 'the spectrum fields conc and path in the sample sheet',
        yColumn: 'the spectrum field yColumn in the sample sheet (a number, a header, or "all")',
      },
      ...(elementOfIon(ion.ion) ? { element: elementOfIon(ion.ion) } : {}),
      fit: {
        n: ion.n,
        geometry,
        ion,
        ratio,
        // Spectra keep C held unless the sheet asks for it.
        fitC: sample.fitC ?? false,
        includeSpinForbidden: sample.spinForbidden,
        ...(sample.spinState ? { spinState: sample.spinState } : {}),
      },
    });
  } catch (e) {
    if (e instanceof InputError) throw new InputError(`${file}: ${e.message}`);
    throw e;
  }
}

/** The bands found in a spectrum, as the report lists them. */
function spectrumBands(spectrum: SpectrumAnalysis): SampleResult['spectrumBands'] {
  return spectrum.analysis.bands.map((b) => ({
    number: b.number,
    center: b.center,
    fwhm: b.fwhm,
    flags: b.flags,
  }));
}

function zetaReport(result: FitResult, best: FitSolution, zeta: number, ion: FreeIon): ZetaReport {
  const z = refineFitWithZeta(result, best, {
    zeta,
    fitZeta: true,
    ...(ion.zeta !== undefined ? { freeIonZeta: ion.zeta } : {}),
  });
  const r = z.refinement;
  return {
    zeta: r.zeta,
    error: r.errors?.zeta ?? null,
    fitted: z.zetaFitted,
    zetaOverFreeIon: z.zetaRatio,
    components: r.bands.flatMap((b) => {
      const label = b.components?.[0];
      if (label === undefined) return [];
      const level = r.levels.levels.find((l) => l.label === label);
      return [{ observed: b.observed, level: label, parentage: level?.parentage.slice(0, 2) ?? [] }];
    }),
    warnings: z.warnings,
  };
}

function magnetismReport(n: number, geometry: Geometry, best: FitSolution, zeta: number): MagnetismReport {
  const { dq, B, C } = best;
  const cubic = solveCubic({ n, geometry, dq, B, C }).ground;
  const temperatures = [...REPORT_TEMPERATURES];
  return {
    zeta,
    ground: cubic.label,
    S: cubic.S,
    spinOnly: spinOnlyMoment(cubic.S),
    groundSpinOrbit: solveSpinOrbit({ n, geometry, dq, B, C, zeta, parentage: false }).ground.label,
    temperatures,
    muEff: susceptibility({ n, geometry, dq, B, C, zeta, temperatures }).map((p) => p.muEff),
  };
}

function spinReport(n: number, geometry: Geometry, best: FitSolution): SpinReport | undefined {
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
