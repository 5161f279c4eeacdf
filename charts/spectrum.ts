/**
 * The overlay figure of a measured absorption spectrum: the data against wavenumber with a
 * wavelength axis on top, the fitted Gaussian bands (drawn on the baseline) and their sum, and
 * predicted transitions as labelled vertical marks, spin-allowed ones prominent and
 * spin-forbidden ones light.
 */

import type { ChartConfiguration, ChartDataset, Plugin, Scale } from 'chart.js';
import { xyReduce } from 'ml-spectra-processing';
import { cmToNm } from '../src/core/units.js';
import type { AbsorptionQuantity } from '../src/spectra/absorptionSpectrum.js';
import type { FoundBand } from '../src/spectra/bandFinding.js';
import { bandSum, gaussianValue, type LinearBaseline } from '../src/spectra/gaussianBands.js';
import { drawKey, type KeyItem } from './key.js';
import { groupedNumber, tickText } from './numbers.js';
import { type FigureOptions, renderChart } from './render.js';
import { quantityTitle, STYLE } from './style.js';
import { chartContext, drawRuns, measureRuns, runsHeight, stateRuns, type TextStyle } from './typeset.js';

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

const INK = STYLE.ink;
/** Room under the plot for the three rows of the key, px. */
const KEY_ROOM = 62;

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

/** The datasets: measured data (a filled silhouette), fit, each band (d–d and charge transfer) and baseline. */
function spectrumDatasets(
  input: SpectrumFigureInput,
  drawn: XY,
  curves: FitCurves,
): ChartDataset<'scatter'>[] {
  const datasets: ChartDataset<'scatter'>[] = [
    // The data are drawn first, under the fitted curves (a higher order is drawn earlier).
    {
      ...line('measured', points(drawn.x, drawn.y), STYLE.measuredLine, 0.9),
      fill: 'origin',
      backgroundColor: STYLE.measuredFill,
      order: 1,
    },
    line('fit: bands + baseline', points(curves.x, curves.sum), STYLE.allowed, 1.6),
  ];
  const range = Math.max(...curves.sum) - Math.min(0, ...curves.sum);
  for (const band of input.bands) {
    // A band is drawn on the baseline only where it rises visibly above it, so the bands'
    // flat wings do not hide the baseline.
    const ys = curves.x.map((x, i) => {
      const g = gaussianValue(band, x);
      return g > VISIBLE_FRACTION * range ? (curves.baseline[i] as number) + g : Number.NaN;
    });
    datasets.push(
      band.chargeTransfer
        ? line('charge transfer', points(curves.x, ys), STYLE.chargeTransfer, 1.2, [...STYLE.crossoverDash])
        : line('Gaussian bands', points(curves.x, ys), STYLE.component, 1.1),
    );
  }
  if (input.baseline.offset !== 0 || input.baseline.slope !== 0) {
    datasets.push(
      line('baseline', points(curves.x, curves.baseline), STYLE.muted, 1, [...STYLE.baselineDash]),
    );
  }
  return datasets;
}

/** The key under the plot, in rows narrow enough for a one-column figure: data and fit, the fit's parts, the predictions. */
function keyRows(input: SpectrumFigureInput, transitions: readonly PredictedTransition[]): KeyItem[][] {
  const data: KeyItem[] = [
    { colors: [STYLE.measuredLine], width: 1, text: 'measured', fill: STYLE.measuredFill },
    { colors: [STYLE.allowed], width: 1.6, text: 'fit: bands + baseline' },
  ];
  const parts: KeyItem[] = [{ colors: [STYLE.component], width: 1.1, text: 'Gaussian bands' }];
  if (input.bands.some((b) => b.chargeTransfer))
    parts.push({
      colors: [STYLE.chargeTransfer],
      width: 1.2,
      text: 'charge transfer',
      dash: STYLE.crossoverDash,
    });
  if (input.baseline.offset !== 0 || input.baseline.slope !== 0)
    parts.push({ colors: [STYLE.muted], width: 1, text: 'baseline', dash: STYLE.baselineDash });
  const predicted: KeyItem[] = [];
  if (transitions.some((t) => t.spinAllowed))
    predicted.push({ colors: [STYLE.allowed], width: 1.4, text: 'predicted, spin-allowed' });
  if (transitions.some((t) => !t.spinAllowed))
    predicted.push({
      colors: [STYLE.forbidden],
      width: 1,
      text: 'predicted, spin-forbidden',
      dash: STYLE.forbiddenDash,
    });
  return [data, parts, predicted].filter((row) => row.length > 0);
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

/** Axes (wavenumber below, wavelength on top, the quantity up the side), room for the key below. */
function spectrumOptions(
  input: SpectrumFigureInput,
  y: { yMin: number; yMax: number },
): ChartConfiguration<'scatter'>['options'] {
  const { from, to } = input.window;
  return {
    layout: { padding: { left: 8, right: 18, top: 8, bottom: KEY_ROOM } },
    scales: {
      x: {
        type: 'linear',
        position: 'bottom',
        min: from,
        max: to,
        title: { display: true, text: 'Wavenumber / cm⁻¹', font: { size: STYLE.axisTitleSize } },
        afterBuildTicks: (axis: Scale) => {
          axis.ticks = wavenumberTicks(from, to).map((value) => ({ value }));
        },
        ticks: { font: { size: STYLE.tickSize }, callback: (v) => groupedNumber(Number(v)), maxRotation: 0 },
        grid: { display: false },
        border: { color: INK },
      },
      xTop: {
        type: 'linear',
        position: 'top',
        min: from,
        max: to,
        title: { display: true, text: 'Wavelength / nm', font: { size: STYLE.axisTitleSize } },
        afterBuildTicks: (axis: Scale) => {
          axis.ticks = wavelengthTicks(from, to).map((nm) => ({ value: 1e7 / nm }));
        },
        ticks: {
          font: { size: STYLE.tickSize },
          callback: (v) => String(Math.round(cmToNm(Number(v)))),
          maxRotation: 0,
        },
        grid: { drawOnChartArea: false, color: INK },
        border: { color: INK },
      },
      y: {
        min: y.yMin,
        max: y.yMax,
        title: { display: true, text: quantityTitle(input.quantity), font: { size: STYLE.axisTitleSize } },
        ticks: {
          font: { size: STYLE.tickSize },
          callback(v) {
            return tickText(Number(v), this.chart.scales.y?.ticks ?? []);
          },
        },
        grid: { display: false },
        border: { color: INK },
      },
    },
    plugins: { legend: { display: false }, tooltip: { enabled: false } },
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
    data: { datasets: spectrumDatasets(input, drawn, curves) },
    options: spectrumOptions(input, yRange(input, drawn, curves, transitions.length > 0)),
    plugins: [marksPlugin(transitions, bandNumbers(input)), keyPlugin(keyRows(input, transitions))],
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

/** Labels of the predicted transitions: spin-allowed at the labels' size, spin-forbidden smaller. */
const ALLOWED_MARK: TextStyle = { size: STYLE.labelSize, color: STYLE.allowed };
const FORBIDDEN_MARK: TextStyle = { size: STYLE.smallSize - 1, color: STYLE.forbiddenText };

/**
 * Draws the predicted transitions and the numbers of the fitted bands at their maxima. Each
 * label goes in the first of the rows at the top where it has room (spin-allowed first, in rows
 * 0–2; spin-forbidden in rows 1–3), or is dropped; each mark's line starts under its own label
 * (or under the rows, if the label was dropped), so no line runs through a label.
 */
function marksPlugin(
  transitions: readonly PredictedTransition[],
  numbers: readonly { number: number; x: number; y: number }[],
): Plugin {
  return {
    id: 'termsplitSpectrumMarks',
    afterDatasetsDraw(chart) {
      const ctx = chartContext(chart);
      const { chartArea } = chart;
      const xs = chart.scales.x as Scale;
      const ys = chart.scales.y as Scale;
      const rowHeight = runsHeight(ALLOWED_MARK) + 2;
      const ordered = [...transitions].sort((a, b) => Number(b.spinAllowed) - Number(a.spinAllowed));
      const taken: { row: number; left: number; right: number }[] = [];
      const labelled = ordered.map((t) => {
        const style = t.spinAllowed ? ALLOWED_MARK : FORBIDDEN_MARK;
        const runs = stateRuns(t.label);
        const width = measureRuns(ctx, runs, style);
        const x = xs.getPixelForValue(t.energy);
        const left = Math.max(chartArea.left + 2, Math.min(chartArea.right - width - 2, x - width / 2));
        const rows = t.spinAllowed ? [0, 1, 2] : [1, 2, 3];
        const row = rows.find((r) =>
          taken.every((o) => o.row !== r || left > o.right + 5 || left + width < o.left - 5),
        );
        if (row !== undefined) taken.push({ row, left, right: left + width });
        const middle = chartArea.top + 4 + rowHeight * (row ?? 0) + rowHeight / 2;
        return { t, x, runs, style, left, row, middle };
      });
      const rowsBottom = chartArea.top + 4 + rowHeight * (Math.max(-1, ...taken.map((o) => o.row)) + 1);
      ctx.save();
      for (const m of labelled) {
        ctx.beginPath();
        ctx.strokeStyle = m.t.spinAllowed ? STYLE.allowed : STYLE.forbidden;
        ctx.lineWidth = m.t.spinAllowed ? 1.4 : 1;
        ctx.setLineDash(m.t.spinAllowed ? [] : [...STYLE.forbiddenDash]);
        ctx.moveTo(m.x, m.row === undefined ? rowsBottom : m.middle + rowHeight / 2 - 1);
        ctx.lineTo(m.x, chartArea.bottom);
        ctx.stroke();
      }
      ctx.restore();
      ctx.save();
      // The frame: chart.js draws only the axes' own edges.
      ctx.strokeStyle = STYLE.ink;
      ctx.lineWidth = STYLE.frameWidth;
      ctx.strokeRect(
        chartArea.left,
        chartArea.top,
        chartArea.right - chartArea.left,
        chartArea.bottom - chartArea.top,
      );
      // A white ground under each label hides the lines of the marks next to it.
      ctx.fillStyle = '#ffffff';
      for (const m of labelled) {
        if (m.row === undefined) continue;
        const w = measureRuns(ctx, m.runs, m.style);
        ctx.fillRect(m.left - 2, m.middle - rowHeight / 2 + 1, w + 4, rowHeight - 2);
      }
      ctx.restore();
      for (const m of labelled) if (m.row !== undefined) drawRuns(ctx, m.runs, m.left, m.middle, m.style);
      const marks = labelled.map((m) => m.x);
      const numberStyle: TextStyle = { size: STYLE.smallSize, color: STYLE.ink, bold: true, halo: true };
      for (const n of numbers) {
        const x = xs.getPixelForValue(n.x);
        // Beside a transition mark that runs through the maximum, the number moves right of it.
        const shift = marks.some((m) => Math.abs(m - x) < 8) ? 10 : 0;
        drawRuns(
          ctx,
          [{ text: String(n.number), shift: 'base' }],
          x + shift,
          ys.getPixelForValue(n.y) - 12,
          numberStyle,
          'center',
        );
      }
    },
  };
}

/** The key, in rows under the plot, right-aligned with it. */
function keyPlugin(rows: readonly (readonly KeyItem[])[]): Plugin {
  return {
    id: 'termsplitSpectrumKey',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      rows.forEach((row, k) => {
        drawKey(ctx, row, chart.chartArea.right, chart.height - KEY_ROOM + 10 + 18 * k);
      });
    },
  };
}

/** Renders the overlay figure to PNG, SVG or PDF bytes. */
export function renderSpectrumFigure(input: SpectrumFigureInput, options: FigureOptions): Buffer {
  return renderChart(spectrumChart(input), { width: 900, height: 600, ...options });
}
