/**
 * Finding the absorption bands of a spectrum. The window is resampled onto an even wavenumber
 * grid (bands are Gaussian in energy, not in wavelength) and decomposed into Gaussian bands
 * plus a straight baseline (bandDecomposition.ts); each band is reported with its maximum,
 * FWHM, height and area, their uncertainties from the fit, and flags for bands that look like
 * charge transfer or need care.
 *
 * The baseline is fitted with the bands rather than removed first: baseline-estimation methods
 * (airPLS, rolling ball) treat anything broad as baseline, and d–d bands of 2000–4000 cm⁻¹ FWHM
 * are a large part of a UV-vis-NIR window. A band whose maximum lies beyond either end of the
 * window (the rising edge of a charge-transfer band at the blue end, the wing of a near-infrared
 * band at the red end) is fitted as a Gaussian centred outside the window and reported as such.
 * Smoothing is used only to pick candidates; the fit is to the data points themselves.
 */

import { CHARGE_TRANSFER_ONSET } from '../analysis/cautions.js';
import { ensure, InputError } from '../core/errors.js';
import type { Geometry } from '../core/geometry.js';
import { resampleEvenly } from '../numeric/evenResampling.js';
import { robustNoiseDeviation } from '../numeric/robustNoise.js';
import type { AbsorptionQuantity } from './absorptionSpectrum.js';
import {
  type BaselineKind,
  type Box,
  type ComponentKind,
  decompose,
  type FitContext,
  type FitState,
  CM_PER_KK as KK,
  parameterCount,
  stateCovariance,
} from './bandDecomposition.js';
import {
  INTENSITY_LIMITS,
  type IntensityRange,
  intensityRange,
  oscillatorStrength,
} from './bandIntensity.js';
import {
  DEFAULT_BASELINE,
  DEFAULT_MAX_BANDS,
  DEFAULT_MIN_FWHM,
  DEFAULT_MIN_RELATIVE_HEIGHT,
  DEFAULT_SIGNIFICANCE,
} from './bandSearchDefaults.js';
import { GAUSSIAN_AREA_FACTOR, type GaussianBand, type LinearBaseline } from './gaussianBands.js';

export type { BaselineKind } from './bandDecomposition.js';

/** Options of {@link findBands}. */
export interface BandFindingOptions {
  /** Wavenumber window, cm⁻¹ (`from` < `to`). @default the whole spectrum */
  readonly range?: { readonly from: number; readonly to: number };
  /** The narrowest band looked for (FWHM, cm⁻¹); sets the grid step and the fine detection scale. @default 250 */
  readonly minFwhm?: number;
  /** The most bands fitted inside the window (edges not counted). @default 8 */
  readonly maxBands?: number;
  /** A band must be at least this fraction of the tallest band overlapping it. @default 0.02 */
  readonly minRelativeHeight?: number;
  /** A band's height must exceed this many noise standard deviations. @default 5 */
  readonly significance?: number;
  /** The baseline fitted with the bands. @default 'linear' */
  readonly baseline?: BaselineKind;
  /**
   * The complex's geometry, when known: the ε ranges of its bands (and the charge-transfer cut)
   * are those of {@link INTENSITY_LIMITS} for it. @default unknown (the octahedral limits)
   */
  readonly geometry?: Geometry;
}

export {
  DEFAULT_BASELINE,
  DEFAULT_MAX_BANDS,
  DEFAULT_MIN_FWHM,
  DEFAULT_MIN_RELATIVE_HEIGHT,
  DEFAULT_SIGNIFICANCE,
} from './bandSearchDefaults.js';

/**
 * Bands narrower than this (FWHM, cm⁻¹) are flagged as possibly spin-forbidden: transitions
 * within one strong-field configuration (²E_g of Cr³⁺, for one) barely displace the excited
 * state and give sharp bands (common practice, no source).
 */
export const NARROW_BAND_FWHM = 1000;

/** Grid points per narrowest FWHM. */
const POINTS_PER_MIN_FWHM = 8;
/** The grid never has more points than this. */
const MAX_GRID_POINTS = 4000;
/** Windows with more data points than this are fitted on the averaged grid. */
const MAX_FIT_POINTS = 4000;
/** The noise is taken as at least this fraction of the largest |y|: data are seldom recorded more finely. */
const NOISE_FLOOR = 1e-4;
/** Fewest data points a window must hold. */
export const MIN_WINDOW_POINTS = 20;

/** Why a band is set apart from the ligand-field bands, or needs care. */
export type BandFlag =
  /** ε at the maximum is in the charge-transfer range of the geometry ({@link INTENSITY_LIMITS}). */
  | 'intense'
  /**
   * The maximum lies above {@link CHARGE_TRANSFER_ONSET}. It makes the band look like charge
   * transfer only when its ε is not known; a known ε in the d–d range keeps it a d–d band.
   */
  | 'high-energy'
  /** The maximum lies beyond the blue end of the window: the rising edge of a (charge-transfer) band. */
  | 'blue-edge'
  /** The maximum lies beyond the red end of the window: only the wing of the band is seen. */
  | 'red-edge'
  /** Narrower than {@link NARROW_BAND_FWHM}: possibly spin-forbidden. */
  | 'narrow';

/** One band found in a spectrum. */
export interface FoundBand extends GaussianBand {
  /** 1-based, in order of rising energy. */
  readonly number: number;
  /** Standard uncertainty of the maximum from the fit alone, cm⁻¹ (Infinity when undetermined). */
  readonly centerSigma: number;
  /** Standard uncertainty of the FWHM from the fit alone, cm⁻¹. */
  readonly fwhmSigma: number;
  /** Standard uncertainty of the height from the fit alone, y units. */
  readonly heightSigma: number;
  /** Integrated intensity ∫y dν̃ (y units × cm⁻¹). */
  readonly area: number;
  /** Standard uncertainty of the area from the fit alone. */
  readonly areaSigma: number;
  /** Why the band needs care; see {@link BandFlag}. */
  readonly flags: readonly BandFlag[];
  /**
   * Looks like charge transfer: intense for the geometry, a rising edge at the blue end, or high
   * in energy with no ε to tell.
   */
  readonly chargeTransfer: boolean;
  /** The usual intensity range of its maximum ε (when y is ε). */
  readonly intensityRange?: IntensityRange;
  /** Oscillator strength from the area (when y is ε). */
  readonly oscillatorStrength?: number;
}

/** The outcome of {@link findBands}. */
export interface BandAnalysis {
  readonly quantity: AbsorptionQuantity;
  /** The window used, cm⁻¹. */
  readonly window: { readonly from: number; readonly to: number };
  /** Whether the requested range reached beyond the data and was cut to it. */
  readonly clipped: boolean;
  /** The data resampled on an even wavenumber grid (the detection grid; also what figures draw). */
  readonly grid: { readonly x: Float64Array; readonly y: Float64Array; readonly step: number };
  /** Data points of the spectrum inside the window. */
  readonly points: number;
  /** Standard deviation of the point-to-point noise of the data, y units. */
  readonly noise: number;
  /** Root-mean-square residual of the fit, y units; much above `noise`, the bands are not Gaussian. */
  readonly residualRms: number;
  readonly baselineKind: BaselineKind;
  readonly baseline: LinearBaseline;
  /** All bands, by rising energy, edges included. */
  readonly bands: readonly FoundBand[];
}

/**
 * Finds the Gaussian bands of an absorption spectrum on a wavenumber axis.
 * @param spectrum wavenumbers (cm⁻¹, strictly rising) and values.
 * @throws InputError when the range is empty or lies outside the data, or the window holds
 *   fewer than {@link MIN_WINDOW_POINTS} points.
 */
export function findBands(
  spectrum: {
    readonly wavenumber: Float64Array;
    readonly value: Float64Array;
    readonly quantity: AbsorptionQuantity;
  },
  options: BandFindingOptions = {},
): BandAnalysis {
  const settings = checkedSettings(options);
  const { wavenumber: wn, value } = spectrum;
  const window = analysisWindow(wn, options.range);
  const { lo, hi, inside } = window;
  const { gx, gy, step } = evenGrid(wn, value, lo, hi, settings.minFwhm);
  const yScale = Math.max(...gy.map(Math.abs)) || 1;
  const noise = Math.max(noiseLevel(wn, value, lo, hi), NOISE_FLOOR * yScale);
  const sigma = noise / yScale;
  const span = hi - lo;
  const box: Box = {
    lo: lo / KK,
    hi: hi / KK,
    span: span / KK,
    minW: settings.minFwhm / KK,
    step: step / KK,
  };
  const detect = { x: gx.map((v) => v / KK), y: gy.map((v) => v / yScale) };
  // The fit uses the data points themselves (their noise is independent, and interpolation
  // would add nothing); a window with very many points is fitted on the averaged grid instead.
  const fitData =
    inside <= MAX_FIT_POINTS ? windowPoints(wn, value, lo, hi, yScale) : { x: detect.x, y: detect.y };
  const baselineKind = settings.baselineKind;
  const context: FitContext = { ...fitData, box, baselineKind, xMid: (box.lo + box.hi) / 2 };
  const { significance, minRelative, maxBands } = settings;
  const state = decompose(context, detect, { sigma, significance, minRelative, maxBands });
  const bands = bandsOfFit(context, state, yScale).map(
    (band, i): FoundBand => describeBand(band, i + 1, spectrum.quantity, options.geometry),
  );
  const rms = Math.sqrt(state.chi2 / context.x.length) * yScale;
  return {
    quantity: spectrum.quantity,
    window: { from: lo, to: hi },
    clipped: window.clipped,
    grid: { x: gx, y: gy, step },
    points: inside,
    noise,
    residualRms: rms,
    baselineKind,
    baseline: {
      offset: state.b0 * yScale,
      slope: (state.b1 * yScale) / KK,
      reference: context.xMid * KK,
    },
    bands,
  };
}

/** The options of {@link findBands} with their defaults, checked. */
function checkedSettings(options: BandFindingOptions) {
  const minFwhm = options.minFwhm ?? DEFAULT_MIN_FWHM;
  const maxBands = options.maxBands ?? DEFAULT_MAX_BANDS;
  const minRelative = options.minRelativeHeight ?? DEFAULT_MIN_RELATIVE_HEIGHT;
  const significance = options.significance ?? DEFAULT_SIGNIFICANCE;
  const baselineKind = options.baseline ?? DEFAULT_BASELINE;
  ensure(minFwhm > 0, `minimum FWHM ${minFwhm}: expected a positive number of cm⁻¹`);
  ensure(
    Number.isInteger(maxBands) && maxBands >= 1,
    `maximum number of bands ${maxBands}: expected a whole number ≥ 1`,
  );
  ensure(
    minRelative >= 0 && minRelative < 1,
    `minimum relative height ${minRelative}: expected 0 ≤ value < 1`,
  );
  ensure(significance > 0, `significance ${significance}: expected a positive number`);
  return { minFwhm, maxBands, minRelative, significance, baselineKind };
}

/** The window analysed: the range asked for, clipped to the data, with enough points in it. */
function analysisWindow(wn: Float64Array, range: BandFindingOptions['range']) {
  const first = wn[0] as number;
  const last = wn[wn.length - 1] as number;
  const from = range?.from ?? first;
  const to = range?.to ?? last;
  ensure(from < to, `range ${round(from)}–${round(to)} cm⁻¹: expected a lower and a higher end`);
  if (to <= first || from >= last) {
    throw new InputError(
      `range ${round(from)}–${round(to)} cm⁻¹ lies outside the data (${round(first)}–${round(last)} cm⁻¹)`,
    );
  }
  const lo = Math.max(from, first);
  const hi = Math.min(to, last);
  const inside = countInside(wn, lo, hi);
  if (inside < MIN_WINDOW_POINTS) {
    throw new InputError(
      `only ${inside} data points in ${round(lo)}–${round(hi)} cm⁻¹: expected at least ${MIN_WINDOW_POINTS}`,
    );
  }
  return { lo, hi, inside, clipped: from < first || to > last };
}

/**
 * The window on an even grid fine enough for the narrowest band allowed. Each grid value is the
 * mean of the data over its slot of one step; the first and last slots start and end at the
 * window's ends, so no slot reaches past the data.
 */
function evenGrid(wn: Float64Array, value: Float64Array, lo: number, hi: number, minFwhm: number) {
  const span = hi - lo;
  const gridPoints = Math.max(
    MIN_WINDOW_POINTS,
    Math.min(MAX_GRID_POINTS, Math.floor((span * POINTS_PER_MIN_FWHM) / minFwhm)),
  );
  const step = span / gridPoints;
  const grid = resampleEvenly(wn, value, lo + step / 2, hi - step / 2, gridPoints);
  return { gx: grid.x, gy: grid.y, step };
}

/** The fitted components back in cm⁻¹ and the spectrum's y, with standard errors from the fit's covariance; by rising centre. */
function bandsOfFit(context: FitContext, state: FitState, yScale: number) {
  const cov = stateCovariance(context, state);
  const P = parameterCount(state.components.length, context.baselineKind);
  const offset = parameterCount(0, context.baselineKind);
  return state.components
    .map((comp, j) => {
      const k = offset + 3 * j;
      const sd = (m: number) => (cov ? Math.sqrt(Math.max(0, cov[m * P + m] as number)) : Infinity);
      const cv = (a: number, b: number) => (cov ? (cov[a * P + b] as number) : Infinity);
      const area = comp.h * comp.w * GAUSSIAN_AREA_FACTOR;
      const areaVar =
        GAUSSIAN_AREA_FACTOR ** 2 *
        (comp.w ** 2 * sd(k + 1) ** 2 +
          comp.h ** 2 * sd(k + 2) ** 2 +
          2 * comp.h * comp.w * cv(k + 1, k + 2));
      return {
        kind: comp.kind,
        center: comp.c * KK,
        height: comp.h * yScale,
        fwhm: comp.w * KK,
        centerSigma: sd(k) * KK,
        heightSigma: sd(k + 1) * yScale,
        fwhmSigma: sd(k + 2) * KK,
        area: area * KK * yScale,
        areaSigma: Math.sqrt(Math.max(0, areaVar)) * KK * yScale,
      };
    })
    .sort((a, b) => a.center - b.center);
}

/** The data points inside the window, in kK and scaled y. */
function windowPoints(
  x: Float64Array,
  y: Float64Array,
  lo: number,
  hi: number,
  yScale: number,
): { x: Float64Array; y: Float64Array } {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < x.length; i++) {
    const v = x[i] as number;
    if (v >= lo && v <= hi) {
      xs.push(v / KK);
      ys.push((y[i] as number) / yScale);
    }
  }
  return { x: Float64Array.from(xs), y: Float64Array.from(ys) };
}

/**
 * Flags and intensity figures of a band. For an edge band the maximum lies outside the window
 * and its height is an extrapolation, so it gets no intensity range; a blue edge counts as
 * charge transfer by its place alone. A band above the charge-transfer onset counts as charge
 * transfer only without ε: with ε, its intensity decides (a d–d band may lie there).
 */
function describeBand(
  b: Omit<FoundBand, 'number' | 'flags' | 'chargeTransfer'> & { kind: ComponentKind },
  number: number,
  quantity: AbsorptionQuantity,
  geometry: Geometry | undefined,
): FoundBand {
  const { kind, ...band } = b;
  const flags: BandFlag[] = [];
  const inside = kind === 'inside';
  const measured = inside && quantity === 'epsilon';
  const limits = INTENSITY_LIMITS[geometry ?? 'oct'];
  if (measured && band.height >= limits.chargeTransfer) flags.push('intense');
  if (inside && band.center > CHARGE_TRANSFER_ONSET) flags.push('high-energy');
  if (kind === 'blue-edge') flags.push('blue-edge');
  if (kind === 'red-edge') flags.push('red-edge');
  if (band.fwhm < NARROW_BAND_FWHM) flags.push('narrow');
  const chargeTransfer = flags.some(
    (f) => f === 'intense' || f === 'blue-edge' || (f === 'high-energy' && !measured),
  );
  return {
    ...band,
    number,
    flags,
    chargeTransfer,
    ...(measured
      ? {
          intensityRange: intensityRange(band.height, geometry),
          oscillatorStrength: oscillatorStrength(band.area),
        }
      : {}),
  };
}

function round(v: number): string {
  return String(Math.round(v));
}

function countInside(x: Float64Array, lo: number, hi: number): number {
  let n = 0;
  for (const v of x) if (v >= lo && v <= hi) n++;
  return n;
}

/**
 * Noise of the data points in the window from their second differences, robustly: for white
 * noise of variance σ², y[i−1] − 2y[i] + y[i+1] has variance 6σ², while a band much wider than
 * the point spacing contributes almost nothing to it.
 */
function noiseLevel(x: Float64Array, y: Float64Array, lo: number, hi: number): number {
  const d2: number[] = [];
  for (let i = 1; i + 1 < x.length; i++) {
    if ((x[i] as number) < lo || (x[i] as number) > hi) continue;
    d2.push((y[i - 1] as number) - 2 * (y[i] as number) + (y[i + 1] as number));
  }
  return d2.length >= 3 ? robustNoiseDeviation(d2) / Math.sqrt(6) : 0;
}
