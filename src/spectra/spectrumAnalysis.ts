/**
 * The whole analysis of one measured spectrum, from its text to its bands: the format is chosen
 * (JCAMP-DX or delimited text), units applied, bands found, the ligand-field bands picked out and
 * fitted (or transitions predicted from given parameters), and the cautions gathered. Options are
 * fully resolved values; reading files and writing output are left to the caller.
 */

import { cubicCautions } from '../analysis/cautions.js';
import { InputError } from '../core/errors.js';
import type { Geometry } from '../core/geometry.js';
import type { FreeIon } from '../core/ions.js';
import { fixed } from '../core/numberText.js';
import type { RatioChoice } from '../core/ratioChoice.js';
import type { CubicResult } from '../field/cubic.js';
import type { FitResult } from '../fit/fitTypes.js';
import { type AbsorptionSpectrum, absorptionSpectrum } from './absorptionSpectrum.js';
import {
  type BandAnalysis,
  type BaselineKind,
  type FoundBand,
  findBands,
  NARROW_BAND_FWHM,
} from './bandFinding.js';
import { CHARGE_TRANSFER_EPSILON } from './bandIntensity.js';
import { type BandObservation, bandObservations, ligandFieldBands } from './bandObservations.js';
import type { RawSpectrum } from './rawSpectrum.js';
import { fitFoundBands } from './spectrumFit.js';
import { isJcamp, parseJcampSpectrum } from './spectrumJcamp.js';
import { type ColumnChoice, parseSpectrumText } from './spectrumText.js';
import type { SpectrumXUnit, SpectrumYUnit } from './spectrumUnits.js';

/** The ligand-field fit asked for: the ion or dⁿ, and how C/B and the spin are handled. */
export interface SpectrumFitRequest {
  readonly n: number;
  readonly geometry: Geometry;
  readonly ion?: FreeIon;
  /** C/B held (or started from) in the fit, and where it came from. */
  readonly ratio: RatioChoice;
  readonly fitC: boolean;
  readonly includeSpinForbidden: boolean;
  readonly spinState?: 'high' | 'low';
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
}

/** The band fit of a spectrum, or why there is none. */
export type SpectrumFit =
  | {
      readonly result: FitResult;
      readonly ion?: string;
      readonly cOrigin: string;
      /** Numbers of the bands fitted and of the narrow ones left out. */
      readonly used: readonly number[];
      readonly leftOut: readonly number[];
    }
  | { readonly failure: string };

/** A transition to mark on the spectrum. */
export interface MarkedTransition {
  readonly label: string;
  /** cm⁻¹ above the ground state. */
  readonly energy: number;
  readonly spinAllowed: boolean;
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
  const analysis = findBands(spectrum, {
    ...(options.range ? { range: options.range } : {}),
    ...(options.maxBands !== undefined ? { maxBands: options.maxBands } : {}),
    ...(options.minFwhm !== undefined ? { minFwhm: options.minFwhm } : {}),
    baseline: options.baseline,
  });
  const choice = { includeChargeTransfer: options.includeChargeTransfer };
  const ligandField = ligandFieldBands(analysis.bands, choice);
  if (ligandField.length === 0) throw noBands(analysis, options.includeChargeTransfer);
  const observations = bandObservations(analysis.bands, choice);
  const fit = options.predicted || !options.fit ? undefined : spectrumFit(ligandField, options.fit);
  const best = fit && 'result' in fit ? fit.result.solutions[0] : undefined;
  const levels = options.predicted ?? best?.levels;
  const cautions = spectrumCautions(analysis, spectrum, levels);
  if (fit && 'failure' in fit) cautions.push(`no ligand-field fit: ${fit.failure}`);
  const transitions: MarkedTransition[] = levels
    ? levels.levels
        .filter((l) => l !== levels.ground)
        .map((l) => ({ label: l.label, energy: l.energy, spinAllowed: l.spinAllowed }))
    : [];
  return {
    raw,
    spectrum,
    analysis,
    ligandField,
    observations,
    ...(fit ? { fit } : {}),
    transitions,
    cautions,
  };
}

/** The error when no d–d band is left: what was found instead, and what would keep it. */
function noBands(analysis: BandAnalysis, includeChargeTransfer: boolean): InputError {
  const { from, to } = analysis.window;
  const count = analysis.bands.length;
  return new InputError(
    `no d–d bands found in ${fixed(from)}–${fixed(to)} cm⁻¹` +
      (count > 0
        ? ` (only ${count === 1 ? 'a band that looks' : `${count} bands that look`} like charge transfer or lie beyond the window${includeChargeTransfer ? '' : '; --include-ct keeps intense or high-energy ones'})`
        : ` (noise σ = ${analysis.noise.toPrecision(2)}: nothing stands out above it)`),
  );
}

/**
 * The fit of the ligand-field bands (see {@link fitFoundBands}). A fit that cannot be made (too
 * few bands for the parameters) is reported, not an error: the bands stand on their own.
 */
function spectrumFit(ligandField: readonly FoundBand[], request: SpectrumFitRequest): SpectrumFit {
  try {
    const fit = fitFoundBands(ligandField, {
      n: request.n,
      geometry: request.geometry,
      ...(request.ion ? { freeIon: request.ion } : {}),
      cOverB: request.ratio.cOverB,
      fitC: request.fitC,
      includeSpinForbidden: request.includeSpinForbidden,
      ...(request.spinState !== undefined ? { spinState: request.spinState } : {}),
    });
    return { ...fit, ...(request.ion ? { ion: request.ion.ion } : {}), cOrigin: request.ratio.origin };
  } catch (e) {
    if (e instanceof InputError) return { failure: e.message };
    throw e;
  }
}

/** Sentences about where the result could mislead. */
function spectrumCautions(
  analysis: BandAnalysis,
  spectrum: AbsorptionSpectrum,
  predicted?: CubicResult,
): string[] {
  const out = [...signCautions(spectrum), ...windowCautions(analysis), ...bandCautions(analysis)];
  if (spectrum.quantity !== 'epsilon') {
    out.push(
      spectrum.quantity === 'absorbance'
        ? 'intensities are absorbances: give --conc and --path to compare ε with the usual ranges'
        : 'intensities are in arbitrary units: no comparison with the usual ε ranges',
    );
  }
  out.push(
    'band positions are centres of Gaussian components (vertical transitions); a ligand-field fit to band maxima ' +
      'ignores vibronic structure and the Stokes shift, so Dq and B carry that approximation',
  );
  if (predicted) out.push(...cubicCautions(predicted).map((c) => c.message));
  return out;
}

/**
 * A caution when no absorbance (or ε) is above zero: an absorption spectrum has positive bands,
 * so the blank was subtracted the wrong way round or the column is not absorbance, and bands
 * fitted to it mean nothing.
 */
function signCautions(spectrum: AbsorptionSpectrum): string[] {
  if (spectrum.quantity === 'arbitrary' || spectrum.value.some((v) => v > 0)) return [];
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
function bandCautions(analysis: BandAnalysis): string[] {
  const out: string[] = [];
  for (const b of analysis.bands.filter((b) => b.flags.includes('intense'))) {
    out.push(
      `band ${b.number} has ε ≈ ${fixed(b.height)} L mol⁻¹ cm⁻¹, in the charge-transfer range (≥ ${CHARGE_TRANSFER_EPSILON}; common practice, no source)`,
    );
  }
  const narrow = analysis.bands.filter((b) => b.flags.includes('narrow') && !b.chargeTransfer);
  if (narrow.length > 0) {
    out.push(
      `band${narrow.length > 1 ? 's' : ''} ${narrow.map((b) => b.number).join(', ')} narrower than ${NARROW_BAND_FWHM} cm⁻¹: ` +
        'possibly spin-forbidden (sharp intraconfigurational bands); assign before fitting',
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
