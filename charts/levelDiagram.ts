/**
 * The energy-level diagram at one point, free ion → field: the free-ion terms as bars on the
 * left, the cubic levels as bars on the right, each level joined to the term it comes from,
 * every bar labelled. Energies in cm⁻¹ above the lowest term and the ground level.
 */

import type { SKRSContext2D } from '@napi-rs/canvas';
import type { Chart, ChartConfiguration, Plugin } from 'chart.js';
import { type CubicResult, type FreeIonTerm, freeIonTerms } from '../src/index.js';
import { drawKey, spinKey } from './key.js';
import { spreadLabels } from './labelLayout.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE } from './style.js';
import {
  chartContext,
  drawRuns,
  ionMarkup,
  markupRuns,
  runsHeight,
  stateRuns,
  type TextStyle,
  termRuns,
} from './typeset.js';

/** Options of {@link levelDiagramChart}. */
export interface LevelDiagramOptions {
  /** The ion's name for the title, e.g. `Cr3+`. */
  readonly ion?: string;
}

/** Extent of the two columns on the hidden 0…1 x axis. */
const FREE_ION = { from: 0.16, to: 0.36 } as const;
const FIELD = { from: 0.62, to: 0.82 } as const;
/** Room above the plot for the title lines, px. */
const HEADER = 64;

const LABEL: TextStyle = { size: STYLE.labelSize, color: STYLE.ink };

/** Figure height that leaves each level label its own line: at least the default 650 px. */
export function levelDiagramHeight(result: CubicResult): number {
  return Math.max(650, Math.ceil(result.levels.length * runsHeight(LABEL) * 1.15) + HEADER + 110);
}

/** The chart.js configuration of the level diagram; bars, joins and labels are drawn by a plugin over chart.js's E axis. */
export function levelDiagramChart(
  result: CubicResult,
  options: LevelDiagramOptions = {},
): ChartConfiguration {
  const terms = freeIonTerms(result.n, result.B, result.C);
  const highest = Math.max(1, ...result.levels.map((l) => l.energy), ...terms.map((t) => t.energy));
  const tick = { font: { size: STYLE.tickSize }, color: STYLE.ink };
  return {
    type: 'scatter',
    data: { datasets: [] },
    options: {
      layout: { padding: { top: HEADER, right: 16, left: 12, bottom: 52 } },
      plugins: { legend: { display: false }, tooltip: { enabled: false }, title: { display: false } },
      scales: {
        x: { type: 'linear', min: 0, max: 1, display: false },
        y: {
          type: 'linear',
          min: 0,
          max: niceTop(highest * 1.04),
          title: { display: true, text: 'E / cm⁻¹', font: { size: STYLE.axisTitleSize }, color: STYLE.ink },
          ticks: tick,
          grid: { display: false },
          border: { color: STYLE.ink },
        },
      },
    },
    plugins: [levelBars(result, terms, options)],
  };
}

/** The bytes of a level-diagram figure (PNG, SVG or PDF); the height grows with the number of levels unless given. */
export function renderLevelDiagram(
  result: CubicResult,
  figure: FigureOptions,
  options: LevelDiagramOptions = {},
): Buffer {
  return renderChart(levelDiagramChart(result, options), {
    title: levelTitleText(result, options),
    height: levelDiagramHeight(result),
    ...figure,
  });
}

function levelTitleMarkup(result: CubicResult, options: LevelDiagramOptions): string {
  const field = result.geometry === 'oct' ? 'octahedral (O_h)' : 'tetrahedral (T_d)';
  const ion = options.ion === undefined ? undefined : ionMarkup(options.ion);
  return `${ion ? `${ion}, ` : ''}d^${result.n}: free ion → ${field} field`;
}

/** The title as plain text (the PDF document title). */
export function levelTitleText(result: CubicResult, options: LevelDiagramOptions = {}): string {
  return levelTitleMarkup(result, options).replace(/[\^_]/g, '');
}

function levelBars(result: CubicResult, terms: readonly FreeIonTerm[], options: LevelDiagramOptions): Plugin {
  return {
    id: 'termsplitLevelBars',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      drawLevels(ctx, chart, result, terms, options);
    },
  };
}

/** The canvas of the plot and where values land on it. */
interface LevelCanvas {
  readonly ctx: SKRSContext2D;
  readonly chart: Chart;
  readonly px: (x: number) => number;
  readonly py: (e: number) => number;
  /** Spin of the ground state: levels of this spin are drawn strong. */
  readonly groundS: number;
}

/** The title, the parameters, bars with joins, their labels, the column captions and the key. */
function drawLevels(
  ctx: SKRSContext2D,
  chart: Chart,
  result: CubicResult,
  terms: readonly FreeIonTerm[],
  options: LevelDiagramOptions,
): void {
  const canvas: LevelCanvas = {
    ctx,
    chart,
    px: (x: number) => chart.scales.x?.getPixelForValue(x) ?? 0,
    py: (e: number) => chart.scales.y?.getPixelForValue(e) ?? 0,
    groundS: result.ground.S,
  };
  drawHeader(canvas, result, options);
  drawBars(canvas, result, terms);
  drawBarLabels(canvas, result, terms);
  drawCaptions(canvas, result);
}

function strokeLine(
  ctx: SKRSContext2D,
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  stroke: string,
  width: number,
  dash: number[] = [],
): void {
  ctx.save();
  ctx.strokeStyle = stroke;
  ctx.lineWidth = width;
  ctx.setLineDash(dash);
  ctx.lineCap = 'butt';
  ctx.beginPath();
  ctx.moveTo(x0, y0);
  ctx.lineTo(x1, y1);
  ctx.stroke();
  ctx.restore();
}

/** Title and the Dq, B, C line above the plot. */
function drawHeader({ ctx, chart }: LevelCanvas, result: CubicResult, options: LevelDiagramOptions): void {
  const area = chart.chartArea;
  const title: TextStyle = { size: STYLE.titleSize, color: STYLE.ink, bold: true };
  const mid = (area.left + area.right) / 2;
  drawRuns(ctx, markupRuns(levelTitleMarkup(result, options)), mid, 18, title, 'center');
  const sub = `Dq = ${result.dq.toFixed(0)} cm⁻¹ (10Dq = ${(10 * result.dq).toFixed(0)}), B = ${result.B.toFixed(0)} cm⁻¹, C = ${result.C.toFixed(0)} cm⁻¹`;
  drawRuns(
    ctx,
    [{ text: sub, shift: 'base' }],
    mid,
    42,
    { size: STYLE.smallSize + 1, color: STYLE.muted },
    'center',
  );
}

/** Term and level bars, and, first so they lie under the bars, the joins of each level to its parent term. */
function drawBars(
  { ctx, px, py, groundS }: LevelCanvas,
  result: CubicResult,
  terms: readonly FreeIonTerm[],
): void {
  const color = (S: number) => (S === groundS ? STYLE.allowed : STYLE.forbidden);
  const termEnergy = new Map(terms.map((t) => [t.name, t.energy]));
  for (const l of result.levels) {
    const e = termEnergy.get(l.parent);
    if (e === undefined) continue;
    const allowed = l.S === groundS;
    strokeLine(
      ctx,
      px(FREE_ION.to),
      py(e),
      px(FIELD.from),
      py(l.energy),
      allowed ? STYLE.allowed : STYLE.forbidden,
      0.8,
      [3, 3],
    );
  }
  for (const t of terms)
    strokeLine(
      ctx,
      px(FREE_ION.from),
      py(t.energy),
      px(FREE_ION.to),
      py(t.energy),
      color(t.S),
      t.S === groundS ? 3 : 2,
    );
  for (const l of result.levels)
    strokeLine(
      ctx,
      px(FIELD.from),
      py(l.energy),
      px(FIELD.to),
      py(l.energy),
      color(l.S),
      l.S === groundS ? 3 : 2,
    );
}

/** Term labels left of their bars, level labels right of theirs; spread apart, with leaders where moved. */
function drawBarLabels(
  { ctx, chart, px, py, groundS }: LevelCanvas,
  result: CubicResult,
  terms: readonly FreeIonTerm[],
): void {
  const area = chart.chartArea;
  const textColor = (S: number) => (S === groundS ? STYLE.allowed : STYLE.forbiddenText);
  const h = runsHeight(LABEL) * 1.05;
  const columns = [
    {
      items: terms.map((t) => ({ runs: termRuns(t.name), S: t.S, y: py(t.energy) })),
      barEdge: px(FREE_ION.from),
      side: -1,
    },
    {
      items: result.levels.map((l) => ({ runs: stateRuns(l.label), S: l.S, y: py(l.energy) })),
      barEdge: px(FIELD.to),
      side: 1,
    },
  ];
  for (const column of columns) {
    const spread = spreadLabels(
      column.items.map((i) => i.y),
      h,
      area.top,
      area.bottom + h / 2,
    );
    column.items.forEach((item, i) => {
      const y = spread[i] ?? item.y;
      const x = column.barEdge + column.side * 30;
      strokeLine(
        ctx,
        column.barEdge + column.side * 3,
        item.y,
        x - column.side * 3,
        y,
        textColor(item.S),
        0.7,
      );
      drawRuns(
        ctx,
        item.runs,
        x,
        y,
        { ...LABEL, color: textColor(item.S) },
        column.side < 0 ? 'right' : 'left',
      );
    });
  }
}

/** "free ion" and "O_h field" under the columns, and the line key. */
function drawCaptions({ ctx, chart, px }: LevelCanvas, result: CubicResult): void {
  const area = chart.chartArea;
  const caption: TextStyle = { size: STYLE.smallSize + 1, color: STYLE.muted, bold: true };
  const captionY = area.bottom + 22;
  drawRuns(
    ctx,
    [{ text: 'free ion', shift: 'base' }],
    px((FREE_ION.from + FREE_ION.to) / 2),
    captionY,
    caption,
    'center',
  );
  drawRuns(
    ctx,
    markupRuns(result.geometry === 'oct' ? 'O_h field' : 'T_d field'),
    px((FIELD.from + FIELD.to) / 2),
    captionY,
    caption,
    'center',
  );
  drawKey(
    ctx,
    spinKey(
      [STYLE.allowed],
      result.levels.some((l) => !l.spinAllowed),
    ),
    area.right,
    chart.height - 14,
  );
}

/** `x` rounded up to a multiple of half its power of ten (78 000 → 80 000, 43 000 → 45 000), for a tidy axis end. */
function niceTop(x: number): number {
  const step = 10 ** Math.floor(Math.log10(x)) / 2;
  return Math.ceil(x / step) * step;
}
