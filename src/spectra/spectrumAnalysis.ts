/**
 * The whole analysis of one measured spectrum, from its text to its bands: the format is chosen
 * (JCAMP-DX or delimited text), units applied, bands found, the ligand-field bands picked out and
 * fitted (or transitions predicted from given parameters), and the cautions gathered. Options are
 * fully resolved values; reading files and writing output are left to the caller.
 */

import { CHARGE_TRANSFER_ONSET, cubicCautions } from '../analysis/cautions.js';
import { InputError } from '../core/errors.js';
import type { Geometry } from '../core/geometry.js';
import type { FreeIon } from '../core/ions.js';
import { fixed } from '../core/numberText.js';
import type { RatioChoice } from '../core/ratioChoice.js';
import type { CubicResult } from '../field/cubic.js';
import { unicodeLabel } from '../field/labels.js';
import { FIT_DEFAULTS, type FitResult } from '../fit/fitTypes.js';
import { type AbsorptionSpectrum, absorptionSpectrum } from './absorptionSpectrum.js';
import { multipletComponents } from './bandClasses.js';
import {
  type BandAnalysis,
  type BaselineKind,
  type FoundBand,
  findBands,
  NARROW_BAND_FWHM,
} from './bandFinding.js';
import { INTENSITY_LIMITS } from './bandIntensity.js';
import {
  type BandObservation,
  bandObservations,
  ligandFieldBands,
  positionSigma,
} from './bandObservations.js';
import type { RawSpectrum } from './rawSpectrum.js';
import { fitFoundBands } from './spectrumFit.js';
import { isJcamp, parseJcampSpectrum } from './spectrumJcamp.js';
import { ALL_COLUMNS, type ColumnChoice, parseSpectrumText, spectrumColumns } from './spectrumText.js';
import type { SpectrumXUnit, SpectrumYUnit } from './spectrumUnits.js';

/** The ligand-field fit asked for: the ion or dⁿ, and how C/B and the spin are handled. */
export interface SpectrumFitRequest {
  readonly n: number;
  readonly geometry: Geometry;
  readonly ion?: FreeIon;
  /** C/B held (or started from) in the fit, and where it came from. */
  readonly ratio: RatioChoice;
  /** Fit C (true), hold it at C/B (false), or let the bands decide (undefined). */
  readonly fitC?: boolean;
  readonly includeSpinForbidden: boolean;
  readonly spinState?: 'high' | 'low';
  /** Merge components closer than a band width at their centroid. @default true */
  readonly merge?: boolean;
  /** Hold Racah B at this value (cm⁻¹) and fit Dq alone. */
  readonly fixedB?: number;
}

/**
 * How the caller names the settings that hints point to: command-line options, sheet fields, or
 * (by default) plain words. A hint whose setting the caller does not have is left out.
 */
export interface SettingNames {
  /** The concentration and path length that turn absorbance into ε. */
  readonly concentrationAndPath: string;
  /** Keeping charge-transfer-like bands among the ligand-field bands. */
  readonly includeChargeTransfer?: string;
  /** Choosing the y column of a file of several spectra. */
  readonly yColumn?: string;
}

/** Plain-word setting names, for callers that name none. */
export const PLAIN_SETTING_NAMES: SettingNames = {
  concentrationAndPath: 'the concentration and the path length',
  yColumn: 'the y column',
};

export { ALL_COLUMNS, isAllColumns } from './spectrumText.js';

/**
 * A band lies at a predicted level when it is within this many standard uncertainties of it:
 * the band's position uncertainty ({@link positionSigma}) and the model's own, the fit's default
 * band precision ({@link FIT_DEFAULTS}), in quadrature (common practice, no source).
 */
export const LEVEL_MATCH_SIGMAS = 3;

/** Whether a band lies at a predicted level's energy (see {@link LEVEL_MATCH_SIGMAS}). */
function liesAt(band: FoundBand, energy: number, model: number = FIT_DEFAULTS.bandPrecision): boolean {
  return Math.abs(energy - band.center) <= LEVEL_MATCH_SIGMAS * Math.hypot(positionSigma(band), model);
}

/** Fully resolved options of {@link analyseSpectrum}. */
export interface SpectrumAnalysisOptions {
  /** The file's name, when it has one: a `.jdx`, `.dx` or `.jcamp` extension means JCAMP-DX. */
  readonly fileName?: string;
  readonly xColumn?: ColumnChoice;
  readonly yColumn?: ColumnChoice;
  readonly xUnit?: SpectrumXUnit;
  readonly yUnit?: SpectrumYUnit;
  /** Concentration, mol/L, and path length, cm: together they turn absorbance into ε. */
  readonly concentration?: number;
  readonly pathLength?: number;
  /** Window, cm⁻¹. @default the whole spectrum */
  readonly range?: { readonly from: number; readonly to: number };
  readonly maxBands?: number;
  readonly minFwhm?: number;
  readonly baseline: BaselineKind;
  /** Keep bands that look like charge transfer among the ligand-field bands. */
  readonly includeChargeTransfer: boolean;
  /** Fit Dq and B to the ligand-field bands. */
  readonly fit?: SpectrumFitRequest;
  /** Levels predicted from given Dq, B and C, to mark instead of fitting. */
  readonly predicted?: CubicResult;
  /** The element (such as `Fe`), for advice that holds for one element only. @default unknown */
  readonly element?: string;
  /** Names of the settings in hints. @default {@link PLAIN_SETTING_NAMES} */
  readonly names?: SettingNames;
}

/** The band fit of a spectrum, or why there is none. */
export type SpectrumFit =
  | {
      readonly result: FitResult;
      readonly ion?: string;
      readonly cOrigin: string;
      /** Numbers of the bands fitted and of the narrow ones left out (and matched to levels after the fit). */
      readonly used: readonly number[];
      readonly leftOut: readonly number[];
      /** For each band of `result.bands`, the numbers of the found bands it stands for. */
      readonly members: readonly (readonly number[])[];
      /** Bands above the charge-transfer onset taken in because they match a predicted level. */
      readonly adopted: readonly number[];
    }
  | { readonly failure: string };

/** A transition to mark on the spectrum. */
export interface MarkedTransition {
  readonly label: string;
  /** cm⁻¹ above the ground state. */
  readonly energy: number;
  readonly spinAllowed: boolean;
  /** Numbers of the found bands observed at this level (both levels of a near-degenerate pair get them). */
  readonly bands: readonly number[];
}

/** Everything worked out about one spectrum. */
export interface SpectrumAnalysis {
  readonly raw: RawSpectrum;
  readonly spectrum: AbsorptionSpectrum;
  readonly analysis: BandAnalysis;
  readonly ligandField: readonly FoundBand[];
  readonly observations: readonly BandObservation[];
  readonly fit?: SpectrumFit;
  /** Transitions to mark: from the fit's best solution, or from the predicted levels. */
  readonly transitions: readonly MarkedTransition[];
  readonly cautions: readonly string[];
}

/** Reads the spectrum text in its format: JCAMP-DX when it says so (or the name does), else delimited text. */
export function readSpectrum(
  text: string,
  options: Pick<SpectrumAnalysisOptions, 'fileName' | 'xColumn' | 'yColumn'>,
): RawSpectrum {
  return isJcamp(text) || /\.(jdx|dx|jcamp)$/i.test(options.fileName ?? '')
    ? parseJcampSpectrum(text)
    : parseSpectrumText(text, {
        ...(options.xColumn !== undefined ? { xColumn: options.xColumn } : {}),
        ...(options.yColumn !== undefined ? { yColumn: options.yColumn } : {}),
      });
}

/**
 * Analyses a spectrum: reads it, finds its bands, fits the ligand-field bands (with `fit`) or
 * marks predicted transitions (with `predicted`), and gathers the cautions.
 * @throws InputError when the text cannot be read, the units disagree, or no d–d band is found.
 */
export function analyseSpectrum(text: string, options: SpectrumAnalysisOptions): SpectrumAnalysis {
  const raw = readSpectrum(text, options);
  const { concentration, pathLength } = options;
  const spectrum = absorptionSpectrum(raw, {
    ...(options.xUnit ? { xUnit: options.xUnit } : {}),
    ...(options.yUnit ? { yUnit: options.yUnit } : {}),
    ...(concentration !== undefined && pathLength !== undefined ? { concentration, pathLength } : {}),
  });
  const geometry = options.fit?.geometry ?? options.predicted?.geometry;
  const analysis = findBands(spectrum, {
    ...(options.range ? { range: options.range } : {}),
    ...(options.maxBands !== undefined ? { maxBands: options.maxBands } : {}),
    ...(options.minFwhm !== undefined ? { minFwhm: options.minFwhm } : {}),
    ...(geometry ? { geometry } : {}),
    baseline: options.baseline,
  });
  const names = options.names ?? PLAIN_SETTING_NAMES;
  const columnNote = columnCaution(raw, options.yColumn, names);
  const choice = { includeChargeTransfer: options.includeChargeTransfer };
  const found = ligandFieldBands(analysis.bands, choice);
  if (found.length === 0) throw noBands(analysis, names);
  const fitted =
    options.predicted || !options.fit
      ? undefined
      : adoptMatchedBands(analysis, found, options.fit, spectrum.quantity, options.includeChargeTransfer);
  const fit = fitted?.fit;
  const ligandField = fitted?.ligandField ?? found;
  const best = fit && 'result' in fit ? fit.result.solutions[0] : undefined;
  const levels = options.predicted ?? best?.levels;
  const cautions = [
    ...columnNote,
    ...spectrumCautions(analysis, spectrum, names, geometry, levels, options.element),
  ];
  if (fit && 'failure' in fit) cautions.push(`no ligand-field fit: ${fit.failure}`);
  if (fit && 'result' in fit) cautions.push(...adoptionCautions(analysis, fit, names));
  const transitions = levels ? markedTransitions(levels, ligandField, fit) : [];
  return {
    raw,
    spectrum,
    analysis,
    ligandField,
    observations: bandObservations(ligandField, { includeChargeTransfer: true }),
    ...(fit ? { fit } : {}),
    transitions,
    cautions,
  };
}

/** A caution when a file of several columns was read from its default y column without a word. */
function columnCaution(raw: RawSpectrum, yColumn: ColumnChoice | undefined, names: SettingNames): string[] {
  const { columns } = raw;
  if (!columns || columns.count <= 2 || yColumn !== undefined) return [];
  return [
    `the file has ${columns.count} columns; column ${columns.y} ("${raw.yLabel}") was read as y by default` +
      (names.yColumn ? `: ${names.yColumn} chooses another column, or ${ALL_COLUMNS} of them` : ''),
  ];
}

/** One spectrum of a file of several: its column, and its analysis or why there is none. */
export type ColumnAnalysis =
  | { readonly column: number; readonly label: string; readonly analysis: SpectrumAnalysis }
  | { readonly column: number; readonly label: string; readonly failure: string };

/**
 * Analyses every y column of a delimited-text file against its x column, each as a spectrum of
 * its own ({@link analyseSpectrum}); a column whose analysis fails is reported with its reason
 * and the others go on. `onColumn` hears of each column before its analysis (for progress).
 * @throws InputError when the file cannot be read as delimited text, has no column besides x,
 *   or no column could be analysed.
 */
export function analyseEveryColumn(
  text: string,
  options: SpectrumAnalysisOptions,
  onColumn: (done: number, total: number) => void = () => {},
): ColumnAnalysis[] {
  if (isJcamp(text) || /\.(jdx|dx|jcamp)$/i.test(options.fileName ?? '')) {
    throw new InputError(
      `y column "${ALL_COLUMNS}" applies to delimited text; a JCAMP-DX file is read as one spectrum`,
    );
  }
  const layout = spectrumColumns(text, options.xColumn);
  const ys = layout.columns.filter((c) => c.number !== layout.x);
  if (ys.length === 0) throw new InputError('the file has no column besides x to read as a spectrum');
  const out: ColumnAnalysis[] = ys.map((c, i) => {
    onColumn(i, ys.length);
    try {
      const analysis = analyseSpectrum(text, { ...options, xColumn: layout.x, yColumn: c.number });
      return { column: c.number, label: c.label, analysis };
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      return { column: c.number, label: c.label, failure: e.message };
    }
  });
  const failed = out.filter((r) => 'failure' in r);
  if (failed.length === out.length) {
    const f = failed[0] as Extract<ColumnAnalysis, { failure: string }>;
    throw new InputError(`no column could be analysed; column ${f.column} ("${f.label}"): ${f.failure}`);
  }
  return out;
}

/**
 * The fit, with bands that look like charge transfer only by their place (above the onset, no ε
 * to judge by) taken in when they lie at a spin-allowed level the fit of the other bands
 * predicts ({@link LEVEL_MATCH_SIGMAS}); the fit is then made again with them.
 */
function adoptMatchedBands(
  analysis: BandAnalysis,
  found: readonly FoundBand[],
  request: SpectrumFitRequest,
  quantity: AbsorptionSpectrum['quantity'],
  includeChargeTransfer: boolean,
): { fit: SpectrumFit; ligandField: readonly FoundBand[] } {
  const first = spectrumFit(found, request, quantity, []);
  const best = 'result' in first ? first.result.solutions[0] : undefined;
  if (!best || includeChargeTransfer) return { fit: first, ligandField: found };
  const allowed = best.levels.levels.filter((l) => l.spinAllowed && l !== best.levels.ground);
  const byPlace = analysis.bands.filter(
    (b) =>
      b.chargeTransfer &&
      b.flags.includes('high-energy') &&
      !b.flags.includes('intense') &&
      !b.flags.includes('blue-edge') &&
      allowed.some((l) => liesAt(b, l.energy)),
  );
  if (byPlace.length === 0) return { fit: first, ligandField: found };
  const ligandField = [...found, ...byPlace].sort((a, b) => a.number - b.number);
  const again = spectrumFit(
    ligandField,
    request,
    quantity,
    byPlace.map((b) => b.number),
  );
  return 'result' in again ? { fit: again, ligandField } : { fit: first, ligandField: found };
}

/** A near-degenerate partner of a level lies within this many cm⁻¹ of it, or within the band's position uncertainty. */
const NEAR_DEGENERATE = 100;

/**
 * The transitions to mark, each with the bands observed at it: the fit's assigned and matched
 * bands (traced to found bands), and any level within a band's position uncertainty of a level
 * that band explains with the same spin (the other member of a near-degenerate pair); with
 * predicted levels only, every level within {@link LEVEL_MATCH_SIGMAS} position uncertainties of a
 * band — spin-forbidden levels only of narrow bands, since a broad band is a spin-allowed one.
 */
function markedTransitions(
  levels: CubicResult,
  ligandField: readonly FoundBand[],
  fit: SpectrumFit | undefined,
): MarkedTransition[] {
  const excited = levels.levels.filter((l) => l !== levels.ground);
  const sigmaOf = new Map(ligandField.map((b) => [b.number, positionSigma(b)]));
  const seen = new Map<number, number[]>();
  const best = fit && 'result' in fit ? fit.result.solutions[0] : undefined;
  if (fit && 'result' in fit && best) {
    for (const p of best.predicted) {
      if (p.band === null) continue;
      const i = excited.findIndex((l) => l.label === p.label);
      if (i >= 0) seen.set(i, [...(fit.members[p.band] ?? [])]);
    }
    for (const [i, numbers] of [...seen]) {
      const e = excited[i]?.energy ?? 0;
      const width = Math.max(NEAR_DEGENERATE, ...numbers.map((k) => sigmaOf.get(k) ?? 0));
      const allowed = excited[i]?.spinAllowed;
      excited.forEach((l, j) => {
        if (!seen.has(j) && l.spinAllowed === allowed && Math.abs(l.energy - e) <= width)
          seen.set(j, numbers);
      });
    }
  } else {
    excited.forEach((l, j) => {
      const near = ligandField.filter(
        (b) => (l.spinAllowed || b.flags.includes('narrow')) && liesAt(b, l.energy, 0),
      );
      if (near.length > 0)
        seen.set(
          j,
          near.map((b) => b.number),
        );
    });
  }
  return excited.map((l, j) => ({
    label: l.label,
    energy: l.energy,
    spinAllowed: l.spinAllowed,
    bands: seen.get(j) ?? [],
  }));
}

/** What the fit did with bands: taken in by their match, merged, sharp ones matched. */
function adoptionCautions(
  analysis: BandAnalysis,
  fit: Extract<SpectrumFit, { result: FitResult }>,
  names: SettingNames,
): string[] {
  const out: string[] = [];
  const best = fit.result.solutions[0];
  const allowed = best ? best.levels.levels.filter((l) => l.spinAllowed && l !== best.levels.ground) : [];
  for (const b of analysis.bands.filter((x) => x.flags.includes('intense') && !fit.used.includes(x.number))) {
    const level = allowed.find((l) => liesAt(b, l.energy));
    if (!level) continue;
    out.push(
      `band ${b.number} (${fixed(b.center)} cm⁻¹) has the ε of a charge-transfer band but lies at ${unicodeLabel(level.label)}, ` +
        `predicted at ${fixed(level.energy)} cm⁻¹: if it is that d–d band (intensity borrowed from a nearby ` +
        `charge-transfer band)${names.includeChargeTransfer ? `, ${names.includeChargeTransfer} fits it` : ', it can be fitted with the charge-transfer-like bands kept'}`,
    );
  }
  for (const k of fit.adopted) {
    const b = analysis.bands.find((x) => x.number === k);
    if (!b) continue;
    out.push(
      `band ${k} (${fixed(b.center)} cm⁻¹) lies above ${fixed(CHARGE_TRANSFER_ONSET)} cm⁻¹, where charge transfer often starts, and its ε ` +
        'is not known; it lies at a spin-allowed level predicted from the other bands, so it is fitted as a d–d band — ' +
        'check its intensity',
    );
  }
  return out;
}

/** The error when no d–d band is left: what was found instead, and what would keep it. */
function noBands(analysis: BandAnalysis, names: SettingNames): InputError {
  const { from, to } = analysis.window;
  const count = analysis.bands.length;
  return new InputError(
    `no d–d bands found in ${fixed(from)}–${fixed(to)} cm⁻¹` +
      (count > 0
        ? ` (only ${count === 1 ? 'a band that looks' : `${count} bands that look`} like charge transfer or lie beyond the window${names.includeChargeTransfer ? `; ${names.includeChargeTransfer} keeps intense or high-energy ones` : ''})`
        : ` (noise σ = ${analysis.noise.toPrecision(2)}: nothing stands out above it)`),
  );
}

/**
 * The fit of the ligand-field bands (see {@link fitFoundBands}). A fit that cannot be made (too
 * few bands for the parameters) is reported, not an error: the bands stand on their own.
 */
function spectrumFit(
  ligandField: readonly FoundBand[],
  request: SpectrumFitRequest,
  quantity: AbsorptionSpectrum['quantity'],
  adopted: readonly number[],
): SpectrumFit {
  try {
    const fit = fitFoundBands(ligandField, {
      quantity,
      n: request.n,
      geometry: request.geometry,
      ...(request.ion ? { freeIon: request.ion } : {}),
      cOverB: request.ratio.cOverB,
      ...(request.fitC !== undefined ? { fitC: request.fitC } : {}),
      ...(request.merge !== undefined ? { merge: request.merge } : {}),
      ...(request.fixedB !== undefined ? { fixedB: request.fixedB } : {}),
      includeSpinForbidden: request.includeSpinForbidden,
      ...(request.spinState !== undefined ? { spinState: request.spinState } : {}),
    });
    return {
      ...fit,
      ...(request.ion ? { ion: request.ion.ion } : {}),
      cOrigin: request.ratio.origin,
      adopted,
    };
  } catch (e) {
    if (e instanceof InputError) return { failure: e.message };
    throw e;
  }
}

/**
 * What a reflectance spectrum can and cannot say (Kubelka and Munk 1931 for F(R) = K/S; the
 * limits of the model are common practice, no source).
 */
export const KUBELKA_MUNK_CAUTION =
  'diffuse reflectance converted to F(R) = (1 − R)²/2R (Kubelka & Munk 1931): the band maxima of F(R) are what is fitted, ' +
  'and ε is not known (F(R) is absorption over scattering, K/S), so bands are told apart by their relative heights only, ' +
  'never by the usual ε ranges; F(R) follows absorption only for an optically thick, diluted powder — strong bands ' +
  'saturate (R near 0) and flatten, and specular reflection or a changing particle size distorts heights';

/** Sentences about where the result could mislead. */
function spectrumCautions(
  analysis: BandAnalysis,
  spectrum: AbsorptionSpectrum,
  names: SettingNames,
  geometry: Geometry | undefined,
  predicted?: CubicResult,
  element?: string,
): string[] {
  const out = [...signCautions(spectrum), ...windowCautions(analysis), ...bandCautions(analysis, geometry)];
  if (spectrum.quantity === 'kubelka-munk') out.push(KUBELKA_MUNK_CAUTION);
  else if (spectrum.quantity !== 'epsilon') {
    out.push(
      spectrum.quantity === 'absorbance'
        ? `intensities are absorbances: give ${names.concentrationAndPath} to compare ε with the usual ranges`
        : 'intensities are in arbitrary units: no comparison with the usual ε ranges',
    );
  }
  out.push(
    'band positions are centres of Gaussian components (vertical transitions); a ligand-field fit to band maxima ' +
      'ignores vibronic structure and the Stokes shift, so Dq and B carry that approximation',
  );
  if (predicted) out.push(...cubicCautions(predicted, element).map((c) => c.message));
  return out;
}

/**
 * A caution when no absorbance (or ε) is above zero: an absorption spectrum has positive bands,
 * so the blank was subtracted the wrong way round or the column is not absorbance, and bands
 * fitted to it mean nothing.
 */
function signCautions(spectrum: AbsorptionSpectrum): string[] {
  if (spectrum.quantity === 'arbitrary' || spectrum.quantity === 'kubelka-munk') return [];
  if (spectrum.value.some((v) => v > 0)) return [];
  const what = spectrum.quantity === 'epsilon' ? 'ε' : 'absorbance';
  return [
    `every ${what} value is zero or negative: the blank may have been subtracted the wrong way round, or the y column is not ${what}; the bands below are not to be trusted`,
  ];
}

/** Cautions about the window: cut to the data, or a band's maximum beyond either end. */
function windowCautions(analysis: BandAnalysis): string[] {
  const out: string[] = [];
  const { from, to } = analysis.window;
  if (analysis.clipped) {
    out.push(
      `the range asked for reaches beyond the data; the window used is ${fixed(from)}–${fixed(to)} cm⁻¹`,
    );
  }
  const blue = analysis.bands.find((b) => b.flags.includes('blue-edge'));
  if (blue) {
    out.push(
      `band ${blue.number} rises at the blue end of the window (maximum beyond ${fixed(to)} cm⁻¹): if it is a ` +
        'charge-transfer or ligand band, it can hide or distort d–d bands near the edge; if a d–d band, widen the window',
    );
  }
  const red = analysis.bands.find((b) => b.flags.includes('red-edge'));
  if (red) {
    out.push(
      `band ${red.number} is the wing of a band whose maximum lies below ${fixed(from)} cm⁻¹: record further into the ` +
        'near infrared to measure it; it is not used as a ligand-field band',
    );
  }
  return out;
}

/** Cautions about single bands (intense, narrow) and about the band shapes as a whole. */
function bandCautions(analysis: BandAnalysis, geometry: Geometry | undefined): string[] {
  const out: string[] = [];
  const limit = INTENSITY_LIMITS[geometry ?? 'oct'].chargeTransfer;
  const where =
    geometry === 'tet'
      ? ' for a tetrahedral complex'
      : geometry === 'oct'
        ? ' for an octahedral complex'
        : '';
  for (const b of analysis.bands.filter((b) => b.flags.includes('intense'))) {
    out.push(
      `band ${b.number} has ε ≈ ${fixed(b.height)} L mol⁻¹ cm⁻¹, in the charge-transfer range${where} (≥ ${limit}; Lever 1984, from memory)`,
    );
  }
  const parts = multipletComponents(analysis.bands);
  const narrow = analysis.bands.filter(
    (b) => b.flags.includes('narrow') && !b.chargeTransfer && !parts.has(b),
  );
  if (narrow.length > 0) {
    out.push(
      `band${narrow.length > 1 ? 's' : ''} ${narrow.map((b) => b.number).join(', ')} narrower than ${NARROW_BAND_FWHM} cm⁻¹: ` +
        'sharp bands are most often spin-forbidden transitions within one configuration: a fit matches them to the ' +
        'predicted levels afterwards rather than fitting them (high-spin d⁵ excepted, whose bands are all spin-forbidden)',
    );
  }
  if (parts.size > 0) {
    const numbers = [...parts].map((b) => b.number).sort((a, b) => a - b);
    out.push(
      `bands ${numbers.join(', ')} are narrow components overlapping into a broad band (a spin–orbit multiplet, a ` +
        'low-symmetry splitting or a shoulder): a fit takes them at their centroid unless asked to keep them apart',
    );
  }
  const ratio = analysis.residualRms / analysis.noise;
  if (ratio > 2) {
    out.push(
      `the fit leaves ${fixed(ratio, 1)} × the noise: the bands are not all Gaussian (asymmetric, structured or ` +
        'Jahn–Teller split), so some components may model shape rather than separate transitions',
    );
  }
  return out;
}
