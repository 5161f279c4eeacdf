/**
 * The ground-state map as a figure: regions of each spin state over Δ/B (x) and C/B (y), the
 * exact crossover line, the one-electron rule Δ = Π for comparison, the C/B in use and the sample.
 */

import type { Chart, ChartConfiguration, ChartDataset, Plugin } from 'chart.js';
import type { GroundStateMap, MapRow, MapSegment } from '../src/analysis/groundMap.js';
import { pairingCoefficients } from '../src/analysis/lfse.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE } from './style.js';
import { chartContext, drawRuns, measureRuns, stateRuns, type TextRun } from './typeset.js';

/** What to mark on the map besides the regions. */
export interface GroundMapMarks {
  /** The sample, at its Δ/B and C/B; `sigmaDeltaOverB` draws a horizontal error bar. */
  readonly sample?: {
    readonly deltaOverB: number;
    readonly cOverB: number;
    readonly sigmaDeltaOverB?: number;
    readonly label?: string;
  };
  /** A C/B to mark with a dashed line (the ratio the crossover was computed at). */
  readonly cOverB?: number;
  /** A Δ/B to mark with a vertical line and its legend text, e.g. the largest Δt of real tetrahedral complexes. */
  readonly limit?: { readonly deltaOverB: number; readonly label: string };
  /** Figure title. @default e.g. "d⁶, octahedral: lowest spin state" */
  readonly title?: string;
}

/** Fill colours of the regions by spin role (light, and of different lightness so greyscale prints keep them apart). */
export const REGION_COLOURS = {
  // Light tints of the house colours of each side (high spin blue, low spin rust, as on the
  // correlation diagrams), of different lightness so greyscale prints keep them apart.
  high: '#d5e0ee',
  intermediate: '#e4dcef',
  low: '#f3d9cc',
  only: '#ececec',
} as const;

type SpinRole = keyof typeof REGION_COLOURS;

const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

function roleOf(S: number, map: GroundStateMap): SpinRole {
  const spins = map.states.map((s) => s.S);
  if (spins.length < 2) return 'only';
  if (S === Math.max(...spins)) return 'high';
  if (S === Math.min(...spins)) return 'low';
  return 'intermediate';
}

const ROLE_NAMES: Readonly<Record<SpinRole, string>> = {
  high: 'high spin',
  intermediate: 'intermediate spin',
  low: 'low spin',
  only: 'no spin crossover',
};

/** One entry of the legend drawn under the plot. */
interface LegendEntry {
  readonly text: string;
  readonly kind: 'line' | 'point';
  readonly colour: string;
  readonly fill?: string;
  readonly dash?: readonly number[];
  readonly width: number;
}

const LEGEND_COLUMNS = 2;
const LEGEND_ROW = 26;
const LEGEND_FONT = 15;

function spinText(S: number): string {
  return Number.isInteger(S) ? String(S) : `${Math.round(2 * S)}/2`;
}

/** Rows with the same sequence of states can be joined by polygons; others by steps. */
function sameStructure(a: MapRow, b: MapRow): boolean {
  return (
    a.segments.length === b.segments.length && a.segments.every((s, i) => s.symbol === b.segments[i]?.symbol)
  );
}

/** The C/B range the map spans (a single row gets a band one unit high). */
function yRange(map: GroundStateMap): { first: MapRow; yMin: number; yMax: number } {
  const first = map.rows[0];
  const last = map.rows.at(-1);
  if (!first || !last) throw new Error('a ground-state map has at least one row');
  const yMax = last.cOverB === first.cOverB ? first.cOverB + 1 : last.cOverB;
  return { first, yMin: first.cOverB, yMax };
}

/** The drawn lines and the sample as chart.js datasets, with their legend entries in the same order. */
interface MapLayers {
  readonly datasets: ChartDataset<'scatter'>[];
  readonly legend: LegendEntry[];
}

function lineDataset(
  label: string,
  data: { x: number; y: number }[],
  colour: string,
  width: number,
  dash?: number[],
): ChartDataset<'scatter'> {
  return {
    label,
    data,
    showLine: true,
    borderColor: colour,
    backgroundColor: colour,
    borderWidth: width,
    pointRadius: 0,
    ...(dash ? { borderDash: dash } : {}),
  };
}

/** The exact crossover lines (one per crossing index) and the one-electron rule Δ = Π beside them. */
function crossoverLayers(map: GroundStateMap, yMin: number, yMax: number, layers: MapLayers): void {
  const rows = map.rows;
  const maxCrossings = Math.max(...rows.map((r) => r.crossings.length));
  for (let k = 0; k < maxCrossings; k++) {
    const data = rows.flatMap((r) => {
      const c = r.crossings[k];
      return c ? [{ x: c.deltaOverB, y: r.cOverB }] : [];
    });
    layers.datasets.push(lineDataset('crossover', data, '#111111', 2.5));
  }
  if (maxCrossings === 0) return;
  layers.legend.push({ text: 'crossover, full calculation', kind: 'line', colour: '#111111', width: 2.5 });
  const pairing = pairingCoefficients(map.n, map.geometry);
  if (!pairing) return;
  // Δc = Π = kB·B + kC·C, i.e. Δc/B = kB + kC·(C/B): a straight line on the map.
  const dash = [9, 6];
  const rule = [yMin, yMax].map((y) => ({ x: pairing.B + pairing.C * y, y }));
  layers.datasets.push(lineDataset('one-electron rule', rule, '#444444', 2, dash));
  layers.legend.push({
    text: `one-electron rule Δ = Π, Π = ${pairing.B}B + ${pairing.C}C`,
    kind: 'line',
    colour: '#444444',
    width: 2,
    dash,
  });
}

/** The marks: the C/B in use, a Δ/B limit and the sample point. */
function markLayers(
  map: GroundStateMap,
  marks: GroundMapMarks,
  yMin: number,
  yMax: number,
  layers: MapLayers,
): void {
  if (marks.cOverB !== undefined) {
    const dash = [2, 4];
    const data = [
      { x: 0, y: marks.cOverB },
      { x: map.maxDeltaOverB, y: marks.cOverB },
    ];
    layers.datasets.push(lineDataset('C/B', data, STYLE.muted, 1.6, dash));
    layers.legend.push({
      text: `C/B = ${marks.cOverB.toFixed(2)}`,
      kind: 'line',
      colour: STYLE.muted,
      width: 2,
      dash,
    });
  }
  if (marks.limit) {
    const dash = [12, 4, 2, 4];
    const data = [
      { x: marks.limit.deltaOverB, y: yMin },
      { x: marks.limit.deltaOverB, y: yMax },
    ];
    layers.datasets.push(lineDataset('limit', data, '#8b1a1a', 2, dash));
    layers.legend.push({ text: marks.limit.label, kind: 'line', colour: '#8b1a1a', width: 2, dash });
  }
  const sample = marks.sample;
  if (sample) {
    layers.datasets.push({
      label: 'sample',
      data: [{ x: sample.deltaOverB, y: sample.cOverB }],
      pointStyle: 'rectRot',
      pointRadius: 7,
      pointBorderWidth: 2,
      borderColor: STYLE.sample,
      backgroundColor: '#ffffff',
    });
    const spread = sample.sigmaDeltaOverB ? ` ± ${sample.sigmaDeltaOverB.toFixed(1)}` : '';
    layers.legend.push({
      text: sample.label ?? `sample, Δ/B = ${sample.deltaOverB.toFixed(1)}${spread}`,
      kind: 'point',
      colour: STYLE.sample,
      fill: '#ffffff',
      width: 2,
    });
  }
}

/** Pixel positions of data values on a drawn chart. */
function pixels(chart: Chart<'scatter'>): { px: (x: number) => number; py: (y: number) => number } {
  const { scales } = chart;
  return {
    px: (x: number) => scales.x?.getPixelForValue(x) ?? 0,
    py: (y: number) => scales.y?.getPixelForValue(y) ?? 0,
  };
}

/** Fills the spin-state regions, row to row: polygons where neighbouring rows match, steps where not. */
function drawRegions(chart: Chart<'scatter'>, map: GroundStateMap): void {
  const { ctx, chartArea } = chart;
  const { px, py } = pixels(chart);
  const { first, yMin, yMax } = yRange(map);
  const rows = map.rows;
  ctx.save();
  ctx.beginPath();
  ctx.rect(chartArea.left, chartArea.top, chartArea.right - chartArea.left, chartArea.bottom - chartArea.top);
  ctx.clip();
  const fill = (s: MapSegment, points: readonly [number, number][]) => {
    ctx.fillStyle = REGION_COLOURS[roleOf(s.S, map)];
    ctx.beginPath();
    points.forEach(([x, y], i) => {
      if (i === 0) ctx.moveTo(px(x), py(y));
      else ctx.lineTo(px(x), py(y));
    });
    ctx.closePath();
    ctx.fill();
    // A hairline of the same colour closes the seams antialiasing leaves between polygons.
    ctx.strokeStyle = ctx.fillStyle;
    ctx.lineWidth = 1;
    ctx.stroke();
  };
  const band = (row: MapRow, y0: number, y1: number) => {
    for (const s of row.segments) {
      fill(s, [
        [s.from, y0],
        [s.to, y0],
        [s.to, y1],
        [s.from, y1],
      ]);
    }
  };
  if (rows.length === 1) band(first, yMin, yMax);
  for (let i = 0; i + 1 < rows.length; i++) {
    const a = rows[i];
    const b = rows[i + 1];
    if (!a || !b) continue;
    if (sameStructure(a, b)) {
      a.segments.forEach((s, j) => {
        const t = b.segments[j];
        if (!t) return;
        fill(s, [
          [s.from, a.cOverB],
          [s.to, a.cOverB],
          [t.to, b.cOverB],
          [t.from, b.cOverB],
        ]);
      });
    } else {
      const mid = (a.cOverB + b.cOverB) / 2;
      band(a, a.cOverB, mid);
      band(b, mid, b.cOverB);
    }
  }
  ctx.restore();
}

/** Region names and states, in the upper part of the map, clear of the C/B line and sample in the middle. */
function drawRegionLabels(chart: Chart<'scatter'>, map: GroundStateMap): void {
  const ctx = chartContext(chart);
  const { px, py } = pixels(chart);
  const rows = map.rows;
  const labelRow = rows[Math.round(0.8 * (rows.length - 1))] ?? yRange(map).first;
  ctx.save();
  for (const s of labelRow.segments) {
    const x = px((s.from + s.to) / 2);
    const y = py(labelRow.cOverB);
    const name = ROLE_NAMES[roleOf(s.S, map)];
    const state: TextRun[] = [...stateRuns(s.symbol), { text: `,  S = ${spinText(s.S)}`, shift: 'base' }];
    const nameRuns: TextRun[] = [{ text: name, shift: 'base' }];
    const stateStyle = { size: 17, color: '#111111' };
    const nameStyle = { size: 18, color: '#111111', bold: true };
    // A patch of the region's own colour behind the text keeps lines from running through it.
    const w =
      Math.max(measureRuns(ctx, state, stateStyle), name ? measureRuns(ctx, nameRuns, nameStyle) : 0) + 16;
    ctx.fillStyle = REGION_COLOURS[roleOf(s.S, map)];
    ctx.fillRect(x - w / 2, y - (name ? 28 : 14), w, name ? 56 : 28);
    if (name) drawRuns(ctx, nameRuns, x, y - 13, nameStyle, 'center');
    drawRuns(ctx, state, x, name ? y + 13 : y, stateStyle, 'center');
  }
  ctx.restore();
}

/** The sample's horizontal error bar in Δ/B, with end ticks. */
function drawSampleErrorBar(chart: Chart<'scatter'>, sample: GroundMapMarks['sample']): void {
  if (!sample?.sigmaDeltaOverB) return;
  const ctx = chartContext(chart);
  const { px, py } = pixels(chart);
  const y = py(sample.cOverB);
  const x0 = px(sample.deltaOverB - sample.sigmaDeltaOverB);
  const x1 = px(sample.deltaOverB + sample.sigmaDeltaOverB);
  ctx.save();
  ctx.strokeStyle = '#000000';
  ctx.lineWidth = 1.8;
  ctx.beginPath();
  ctx.moveTo(x0, y);
  ctx.lineTo(x1, y);
  for (const x of [x0, x1]) {
    ctx.moveTo(x, y - 6);
    ctx.lineTo(x, y + 6);
  }
  ctx.stroke();
  ctx.restore();
}

/** The legend under the plot, in LEGEND_COLUMNS columns. */
function drawLegend(chart: Chart<'scatter'>, legend: readonly LegendEntry[]): void {
  if (legend.length === 0) return;
  const { chartArea, height } = chart;
  const ctx = chartContext(chart);
  ctx.save();
  const columnWidth = (chartArea.right - chartArea.left) / LEGEND_COLUMNS;
  const top = height - legendRows(legend) * LEGEND_ROW - 6;
  legend.forEach((entry, i) => {
    const x = chartArea.left + (i % LEGEND_COLUMNS) * columnWidth + 8;
    const y = top + Math.floor(i / LEGEND_COLUMNS) * LEGEND_ROW + LEGEND_ROW / 2;
    ctx.strokeStyle = entry.colour;
    ctx.lineWidth = entry.width;
    ctx.setLineDash(entry.dash ? [...entry.dash] : []);
    ctx.beginPath();
    if (entry.kind === 'line') {
      ctx.moveTo(x, y);
      ctx.lineTo(x + 44, y);
      ctx.stroke();
    } else {
      // The sample's open diamond, as on the plot.
      ctx.fillStyle = entry.fill ?? entry.colour;
      ctx.moveTo(x + 22, y - 7);
      ctx.lineTo(x + 29, y);
      ctx.lineTo(x + 22, y + 7);
      ctx.lineTo(x + 15, y);
      ctx.closePath();
      ctx.fill();
      ctx.stroke();
    }
    ctx.setLineDash([]);
    drawRuns(
      ctx,
      [{ text: entry.text, shift: 'base' }],
      x + 54,
      y,
      { size: LEGEND_FONT, color: '#111111' },
      'left',
    );
  });
  ctx.restore();
}

function legendRows(legend: readonly LegendEntry[]): number {
  return Math.ceil(legend.length / LEGEND_COLUMNS);
}

/** Axes, title and room under the plot for the legend. */
function mapOptions(
  map: GroundStateMap,
  marks: GroundMapMarks,
  legend: readonly LegendEntry[],
): ChartConfiguration<'scatter'>['options'] {
  const { yMin, yMax } = yRange(map);
  const where = map.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const dn = `d${[...String(map.n)].map((c) => SUPERSCRIPT_DIGITS[Number(c)]).join('')}`;
  const axis = (text: string) => ({ display: true, text, font: { size: 17 } });
  return {
    layout: { padding: { left: 8, right: 24, top: 4, bottom: 8 + legendRows(legend) * LEGEND_ROW } },
    scales: {
      x: {
        type: 'linear',
        min: 0,
        max: map.maxDeltaOverB,
        title: axis('Δ/B   (Δ = 10Dq)'),
        ticks: { font: { size: 15 } },
        grid: { display: false },
      },
      y: {
        type: 'linear',
        min: yMin,
        max: yMax,
        title: axis('C/B'),
        ticks: { font: { size: 15 } },
        grid: { display: false },
      },
    },
    plugins: {
      title: {
        display: true,
        text: marks.title ?? `${dn}, ${where}: lowest spin state`,
        font: { size: 19, weight: 'bold' },
      },
      legend: { display: false },
      tooltip: { enabled: false },
    },
  };
}

/** The chart.js configuration of a ground-state map: lines and marks as datasets, regions, labels and legend drawn by a plugin. */
export function groundMapChart(map: GroundStateMap, marks: GroundMapMarks = {}): ChartConfiguration {
  const { yMin, yMax } = yRange(map);
  const layers: MapLayers = { datasets: [], legend: [] };
  crossoverLayers(map, yMin, yMax, layers);
  markLayers(map, marks, yMin, yMax, layers);
  const painter: Plugin<'scatter'> = {
    id: 'termsplitGroundRegions',
    // Before the grid (scales are laid out by then), so grid lines show over the fills.
    beforeDraw: (chart) => drawRegions(chart, map),
    afterDatasetsDraw: (chart) => {
      drawRegionLabels(chart, map);
      drawSampleErrorBar(chart, marks.sample);
    },
    afterDraw: (chart) => drawLegend(chart, layers.legend),
  };
  return {
    type: 'scatter',
    data: { datasets: layers.datasets },
    options: mapOptions(map, marks, layers.legend),
    plugins: [painter],
  };
}

/** The map rendered to PNG, SVG or PDF bytes. */
export function renderGroundMap(
  map: GroundStateMap,
  figure: FigureOptions,
  marks: GroundMapMarks = {},
): Buffer {
  return renderChart(groundMapChart(map, marks) as ChartConfiguration, {
    ...figure,
    title: figure.title ?? marks.title ?? `termsplit ground-state map, d${map.n} ${map.geometry}`,
  });
}
