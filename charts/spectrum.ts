/**
 * The overlay figure of a measured absorption spectrum: the data against wavenumber with a
 * wavelength axis on top, the fitted Gaussian bands (drawn on the baseline) and their sum, and
 * predicted transitions as labelled vertical marks, spin-allowed ones prominent and
 * spin-forbidden ones light.
 */

import type { ChartConfiguration, ChartDataset, Plugin, Scale } from 'chart.js';
import { xyReduce } from 'ml-spectra-processing';
import { parseStateLabel } from '../src/field/labels.js';
import { cmToNm, type FoundBand } from '../src/index.js';
import type { AbsorptionQuantity } from '../src/spectra/absorptionSpectrum.js';
import { bandSum, gaussianValue, type LinearBaseline } from '../src/spectra/gaussianBands.js';
import { type FigureOptions, FONT_FAMILY, renderChart } from './render.js';

/** A predicted transition from the ground state, to draw as a vertical mark. */
export interface PredictedTransition {
  /** Plain-text state label such as `4T1g(F)`; typeset with super- and subscripts. */
  readonly label: string;
  /** cm⁻¹ above the ground state. */
  readonly energy: number;
  readonly spinAllowed: boolean;
}

/** What the figure shows. */
export interface SpectrumFigureInput {
  /** The measured spectrum, cm⁻¹ rising. */
  readonly measured: { readonly x: ArrayLike<number>; readonly y: ArrayLike<number> };
  readonly quantity: AbsorptionQuantity;
  /** The wavenumber window drawn. */
  readonly window: { readonly from: number; readonly to: number };
  /** Fitted bands (edge bands included; they are drawn as what shows inside the window). */
  readonly bands: readonly FoundBand[];
  readonly baseline: LinearBaseline;
  /** Predicted transitions; those outside the window are left out. @default none */
  readonly transitions?: readonly PredictedTransition[];
}

/** About this many points of the measured curve are drawn; longer spectra are reduced keeping their noise's look. */
const MAX_DRAWN_POINTS = 4000;
/** A band's curve is drawn where it stands more than this fraction of the y range above the baseline. */
const VISIBLE_FRACTION = 0.002;
/** The y scale reaches at most this multiple of the tallest d–d data; a charge-transfer edge may run off it. */
const CT_SCALE_LIMIT = 1.5;
/** Points per fitted curve. */
const CURVE_POINTS = 600;

const INK = '#1a1a1a';
const MEASURED_COLOUR = '#3a3a3a';
const SUM_COLOUR = '#c0392b';
const BAND_COLOUR = '#1f77b4';
const CT_COLOUR = '#7a7a7a';
const BASELINE_COLOUR = '#b0b0b0';
const ALLOWED_COLOUR = '#1b3a6b';
const FORBIDDEN_COLOUR = '#a8b0ba';

/** Axis title of the y quantity. */
export function quantityTitle(quantity: AbsorptionQuantity): string {
  if (quantity === 'epsilon') return 'ε / L mol⁻¹ cm⁻¹';
  if (quantity === 'absorbance') return 'Absorbance';
  return 'Absorption / arb. units';
}

/** A number with thin-space thousands separators, as figures in papers print them: 20 000. */
function grouped(v: number): string {
  const s = String(Math.round(v));
  return s.length <= 4 ? s : s.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
}

/** The smallest round number (1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6 or 8 × 10ᵏ) at or above v, where the y axis ends. */
function niceCeiling(v: number): number {
  if (!(v > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(v));
  const m = [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10].find((k) => k * p >= v * (1 - 1e-12)) ?? 10;
  return m * p;
}

/** Wavenumber ticks for the bottom axis: multiples of a round step, five to ten of them. */
function wavenumberTicks(from: number, to: number): number[] {
  const step = [500, 1000, 2000, 2500, 5000, 10000].find((s) => (to - from) / s <= 9) ?? 20000;
  const out: number[] = [];
  for (let v = Math.ceil(from / step) * step; v <= to; v += step) out.push(v);
  return out;
}

/** Wavelengths (nm) for the top axis: round values, spaced so their labels do not touch. */
function wavelengthTicks(from: number, to: number): number[] {
  const nice = [
    200, 225, 250, 275, 300, 325, 350, 375, 400, 450, 500, 550, 600, 650, 700, 800, 900, 1000, 1100, 1200,
    1400, 1600, 1800, 2000, 2500, 3000, 4000, 5000,
  ];
  const inside = nice.filter((nm) => 1e7 / nm >= from && 1e7 / nm <= to);
  // Keep ticks at least 6 % of the axis apart, preferring the rounder values.
  const minGap = 0.06 * (to - from);
  const rank = (nm: number) => (nm % 500 === 0 ? 0 : nm % 100 === 0 ? 1 : nm % 50 === 0 ? 2 : 3);
  const kept: number[] = [];
  for (const nm of [...inside].sort((a, b) => rank(a) - rank(b))) {
    if (kept.every((k) => Math.abs(1e7 / k - 1e7 / nm) >= minGap)) kept.push(nm);
  }
  return kept.sort((a, b) => b - a);
}

type XY = { x: ArrayLike<number>; y: ArrayLike<number> };

/** The measured points inside the window, reduced to about {@link MAX_DRAWN_POINTS}. */
function drawnPoints(input: SpectrumFigureInput): XY {
  const { from, to } = input.window;
  const inWindow = { x: [] as number[], y: [] as number[] };
  for (let i = 0; i < input.measured.x.length; i++) {
    const x = input.measured.x[i] as number;
    if (x >= from && x <= to) {
      inWindow.x.push(x);
      inWindow.y.push(input.measured.y[i] as number);
    }
  }
  return inWindow.x.length > MAX_DRAWN_POINTS ? xyReduce(inWindow, { nbPoints: MAX_DRAWN_POINTS }) : inWindow;
}

/** The fitted curves on an even grid over the window: the baseline and bands + baseline. */
interface FitCurves {
  readonly x: number[];
  readonly baseline: number[];
  readonly sum: ArrayLike<number> & Iterable<number>;
}

function fitCurves(input: SpectrumFigureInput): FitCurves {
  const { from, to } = input.window;
  const x = Array.from({ length: CURVE_POINTS }, (_, i) => from + ((to - from) * i) / (CURVE_POINTS - 1));
  const baseline = x.map(
    (v) => input.baseline.offset + input.baseline.slope * (v - input.baseline.reference),
  );
  return { x, baseline, sum: bandSum(input.bands, x, input.baseline) };
}

function points(xs: ArrayLike<number>, ys: ArrayLike<number>): { x: number; y: number }[] {
  return Array.from(xs, (x, i) => ({ x, y: ys[i] as number }));
}

/** The datasets: measured data, fit, each band (d–d and charge transfer), baseline, and legend entries of the marks. */
function spectrumDatasets(
  input: SpectrumFigureInput,
  drawn: XY,
  curves: FitCurves,
  transitions: readonly PredictedTransition[],
): ChartDataset<'scatter'>[] {
  const datasets: ChartDataset<'scatter'>[] = [
    // The data are drawn first, under the fitted curves (a higher order is drawn earlier).
    { ...line('Measured', points(drawn.x, drawn.y), MEASURED_COLOUR, 1.1), order: 1 },
    line('Fit: bands + baseline', points(curves.x, curves.sum), SUM_COLOUR, 1.6, [6, 3]),
  ];
  let firstBand = true;
  let firstCt = true;
  const range = Math.max(...curves.sum) - Math.min(0, ...curves.sum);
  for (const band of input.bands) {
    // A band is drawn on the baseline only where it rises visibly above it, so the bands'
    // flat wings do not hide the baseline.
    const ys = curves.x.map((x, i) => {
      const g = gaussianValue(band, x);
      return g > VISIBLE_FRACTION * range ? (curves.baseline[i] as number) + g : Number.NaN;
    });
    if (band.chargeTransfer) {
      datasets.push(
        line(firstCt ? 'Charge-transfer band or edge' : '', points(curves.x, ys), CT_COLOUR, 1.2, [5, 3]),
      );
      firstCt = false;
    } else {
      datasets.push(line(firstBand ? 'Fitted Gaussian bands' : '', points(curves.x, ys), BAND_COLOUR, 1.2));
      firstBand = false;
    }
  }
  if (input.baseline.offset !== 0 || input.baseline.slope !== 0) {
    datasets.push(line('Baseline', points(curves.x, curves.baseline), BASELINE_COLOUR, 1, [1, 3]));
  }
  if (transitions.some((t) => t.spinAllowed))
    datasets.push(line('Predicted, spin-allowed', [], ALLOWED_COLOUR, 1.4));
  if (transitions.some((t) => !t.spinAllowed)) {
    datasets.push(line('Predicted, spin-forbidden', [], FORBIDDEN_COLOUR, 1, [4, 3]));
  }
  return datasets;
}

/**
 * The y range. The scale is set by the d–d region: where charge-transfer bands make up most of
 * the fit, the data may run off the top (a steep edge would otherwise flatten every d–d band).
 */
function yRange(input: SpectrumFigureInput, drawn: XY, curves: FitCurves, labelRows: boolean) {
  const ct = bandSum(
    input.bands.filter((b) => b.chargeTransfer),
    drawn.x,
  );
  const model = bandSum(input.bands, drawn.x, input.baseline);
  const drawnY = Array.from(drawn.y);
  const ddY = drawnY.filter((_, i) => (ct[i] as number) < 0.5 * Math.abs(model[i] as number));
  const yMin = Math.min(0, ...drawnY, ...curves.sum);
  const allTop = Math.max(...drawnY, ...curves.sum);
  const ddTop = ddY.length > 0 ? Math.max(...ddY) : allTop;
  const yTop = Math.min(allTop, CT_SCALE_LIMIT * ddTop);
  // Room at the top for the rows of transition labels.
  const headroom = labelRows ? 0.22 : 0.06;
  return { yMin, yMax: niceCeiling(yTop + (yTop - yMin) * headroom) };
}

/** Where the numbers of the d–d bands go: at each maximum inside the window, on the baseline. */
function bandNumbers(input: SpectrumFigureInput): { number: number; x: number; y: number }[] {
  const { from, to } = input.window;
  return input.bands
    .filter((b) => !b.chargeTransfer && b.center >= from && b.center <= to)
    .map((b) => ({
      number: b.number,
      x: b.center,
      y: b.height + input.baseline.offset + input.baseline.slope * (b.center - input.baseline.reference),
    }));
}

/** Axes (wavenumber below, wavelength on top, the quantity up the side) and the legend below. */
function spectrumOptions(
  input: SpectrumFigureInput,
  y: { yMin: number; yMax: number },
): ChartConfiguration<'scatter'>['options'] {
  const { from, to } = input.window;
  return {
    layout: { padding: { left: 8, right: 18, top: 8, bottom: 4 } },
    scales: {
      x: {
        type: 'linear',
        position: 'bottom',
        min: from,
        max: to,
        title: { display: true, text: 'Wavenumber / cm⁻¹', font: { size: 15 } },
        afterBuildTicks: (axis: Scale) => {
          axis.ticks = wavenumberTicks(from, to).map((value) => ({ value }));
        },
        ticks: { font: { size: 13 }, callback: (v) => grouped(Number(v)), maxRotation: 0 },
        grid: { color: '#ececec' },
        border: { color: INK },
      },
      xTop: {
        type: 'linear',
        position: 'top',
        min: from,
        max: to,
        title: { display: true, text: 'Wavelength / nm', font: { size: 15 } },
        afterBuildTicks: (axis: Scale) => {
          axis.ticks = wavelengthTicks(from, to).map((nm) => ({ value: 1e7 / nm }));
        },
        ticks: {
          font: { size: 13 },
          callback: (v) => String(Math.round(cmToNm(Number(v)))),
          maxRotation: 0,
        },
        grid: { drawOnChartArea: false, color: INK },
        border: { color: INK },
      },
      y: {
        min: y.yMin,
        max: y.yMax,
        title: { display: true, text: quantityTitle(input.quantity), font: { size: 15 } },
        ticks: { font: { size: 13 } },
        grid: { color: '#ececec' },
        border: { color: INK },
      },
    },
    plugins: {
      legend: {
        position: 'bottom',
        labels: {
          font: { size: 12 },
          boxWidth: 26,
          boxHeight: 0,
          filter: (item) => item.text !== '',
          sort: (a, b) => (a.datasetIndex ?? 0) - (b.datasetIndex ?? 0),
        },
      },
      tooltip: { enabled: false },
    },
  };
}

/** The chart.js configuration of the overlay figure: data, fitted curves, y range, axes, then the marks plugin. */
export function spectrumChart(input: SpectrumFigureInput): ChartConfiguration {
  const { from, to } = input.window;
  const drawn = drawnPoints(input);
  const curves = fitCurves(input);
  const transitions = (input.transitions ?? []).filter((t) => t.energy >= from && t.energy <= to);
  return {
    type: 'scatter',
    data: { datasets: spectrumDatasets(input, drawn, curves, transitions) },
    options: spectrumOptions(input, yRange(input, drawn, curves, transitions.length > 0)),
    plugins: [marksPlugin(transitions, bandNumbers(input))],
  };
}

function line(
  label: string,
  data: { x: number; y: number }[],
  colour: string,
  width: number,
  dash: number[] = [],
): ChartDataset<'scatter'> {
  return {
    label,
    data,
    showLine: true,
    pointRadius: 0,
    borderColor: colour,
    backgroundColor: colour,
    borderWidth: width,
    borderDash: dash,
    tension: 0,
  };
}

interface LabelRun {
  readonly text: string;
  readonly size: number;
  /** Vertical shift in px: negative raises (superscript), positive lowers (subscript). */
  readonly shift: number;
}

/** The typeset pieces of a state label: ⁴T₁g(F) as 4 raised, T, 1g lowered, (F). */
function labelRuns(label: string, size: number): LabelRun[] {
  const p = parseStateLabel(label);
  if (!p) return [{ text: label, size, shift: 0 }];
  const small = Math.round(size * 0.7);
  const runs: LabelRun[] = [
    { text: p.multiplicity, size: small, shift: -size * 0.38 },
    { text: p.letter, size, shift: 0 },
  ];
  if (p.index + p.parity !== '') runs.push({ text: p.index + p.parity, size: small, shift: size * 0.25 });
  if (p.parent !== '') runs.push({ text: `(${p.parent})`, size: Math.round(size * 0.85), shift: 0 });
  return runs;
}

/**
 * Draws the predicted transitions (vertical marks with typeset labels in rows at the top,
 * spin-allowed first, a label dropped when no row has room) and the numbers of the fitted
 * bands at their maxima.
 */
function marksPlugin(
  transitions: readonly PredictedTransition[],
  numbers: readonly { number: number; x: number; y: number }[],
): Plugin {
  return {
    id: 'termsplitSpectrumMarks',
    afterDatasetsDraw(chart) {
      const { ctx, chartArea } = chart;
      const xs = chart.scales.x as Scale;
      const ys = chart.scales.y as Scale;
      ctx.save();
      ctx.textBaseline = 'alphabetic';
      const ordered = [...transitions].sort((a, b) => Number(b.spinAllowed) - Number(a.spinAllowed));
      for (const t of ordered) {
        const x = xs.getPixelForValue(t.energy);
        ctx.beginPath();
        ctx.strokeStyle = t.spinAllowed ? ALLOWED_COLOUR : FORBIDDEN_COLOUR;
        ctx.lineWidth = t.spinAllowed ? 1.4 : 1;
        ctx.setLineDash(t.spinAllowed ? [] : [4, 3]);
        ctx.moveTo(x, chartArea.top + 4);
        ctx.lineTo(x, chartArea.bottom);
        ctx.stroke();
      }
      ctx.setLineDash([]);
      const rowHeight = 19;
      const taken: { row: number; left: number; right: number }[] = [];
      for (const t of ordered) {
        const size = t.spinAllowed ? 14 : 11;
        const runs = labelRuns(t.label, size);
        const width = runs.reduce((w, r) => {
          ctx.font = `${r.size}px "${FONT_FAMILY}"`;
          return w + ctx.measureText(r.text).width;
        }, 0);
        const x = xs.getPixelForValue(t.energy);
        const left = Math.max(chartArea.left + 2, Math.min(chartArea.right - width - 2, x - width / 2));
        const rows = t.spinAllowed ? [0, 1, 2] : [1, 2, 3];
        const row = rows.find((r) =>
          taken.every((o) => o.row !== r || left > o.right + 5 || left + width < o.left - 5),
        );
        if (row === undefined) continue;
        taken.push({ row, left, right: left + width });
        const base = chartArea.top + 6 + rowHeight * (row + 1) - 4;
        ctx.fillStyle = 'rgba(255,255,255,0.9)';
        ctx.fillRect(left - 2, base - rowHeight + 5, width + 4, rowHeight - 1);
        ctx.fillStyle = t.spinAllowed ? ALLOWED_COLOUR : '#6f7780';
        let cursor = left;
        for (const r of runs) {
          ctx.font = `${r.size}px "${FONT_FAMILY}"`;
          ctx.fillText(r.text, cursor, base + r.shift);
          cursor += ctx.measureText(r.text).width;
        }
      }
      ctx.fillStyle = INK;
      ctx.font = `bold 12px "${FONT_FAMILY}"`;
      ctx.textAlign = 'center';
      const marks = transitions.map((t) => xs.getPixelForValue(t.energy));
      for (const n of numbers) {
        const x = xs.getPixelForValue(n.x);
        // Beside a transition mark that runs through the maximum, the number moves right of it.
        const shift = marks.some((m) => Math.abs(m - x) < 8) ? 10 : 0;
        ctx.fillText(String(n.number), x + shift, ys.getPixelForValue(n.y) - 6);
      }
      ctx.restore();
    },
  };
}

/** Renders the overlay figure to PNG, SVG or PDF bytes. */
export function renderSpectrumFigure(input: SpectrumFigureInput, options: FigureOptions): Buffer {
  return renderChart(spectrumChart(input), { width: 900, height: 600, ...options });
}
