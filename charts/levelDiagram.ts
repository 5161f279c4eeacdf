/**
 * The energy-level diagram at one point, free ion → field: the free-ion terms as bars on the
 * left, the cubic levels as bars on the right, each level joined to the term it comes from,
 * every bar labelled. Both columns share one zero, the ground level in the field: the crystal
 * field moves levels but keeps the centre of gravity of dⁿ (its operator is traceless), so the
 * free-ion terms sit at E(term) − E(ground level) with the ground level's absolute energy taken
 * from the degeneracy-weighted mean of all levels. Shown: every spin-allowed level below a
 * ceiling and the lowest few spin-forbidden ones, with the terms they come from.
 */

import type { SKRSContext2D } from '@napi-rs/canvas';
import type { Chart, ChartConfiguration, Plugin } from 'chart.js';
import { type FreeIonTerm, freeIonTerms } from '../src/atom/freeIon.js';
import { ensure } from '../src/core/errors.js';
import type { CubicLevel, CubicResult } from '../src/field/cubic.js';
import { DEFAULT_LEVEL_CEILING, DEFAULT_LEVEL_FORBIDDEN } from './figureFormat.js';
import { drawKey, spinKey } from './key.js';
import { spreadLabels } from './labelLayout.js';
import { groupedNumber } from './numbers.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE, TICKS } from './style.js';
import {
  chartContext,
  drawRuns,
  fitted,
  ionMarkup,
  markupRuns,
  runsHeight,
  stateRuns,
  type TextRun,
  type TextStyle,
  termRuns,
} from './typeset.js';

/** Options of {@link levelDiagramChart}. */
export interface LevelDiagramOptions {
  /** The ion's name for the title, e.g. `Cr3+`. */
  readonly ion?: string;
  /** Highest energy shown, cm⁻¹ above the ground level. @default DEFAULT_LEVEL_CEILING */
  readonly eMax?: number;
  /** How many of the lowest spin-forbidden levels are shown. @default DEFAULT_LEVEL_FORBIDDEN */
  readonly forbidden?: number;
}

export { DEFAULT_LEVEL_CEILING, DEFAULT_LEVEL_FORBIDDEN } from './figureFormat.js';

/** What a level diagram shows: levels and terms on the common zero, and the axis top. */
export interface LevelView {
  readonly levels: readonly CubicLevel[];
  /** Free-ion terms with `energy` on the diagram's zero (the ground level in the field). */
  readonly terms: readonly FreeIonTerm[];
  readonly top: number;
  /** How many spin-forbidden levels below the ceiling were left out. */
  readonly omitted: number;
}

/**
 * The levels and terms a level diagram shows and the top of its axis.
 * @throws InputError for a non-positive ceiling or a negative or fractional count.
 */
export function levelView(result: CubicResult, options: LevelDiagramOptions = {}): LevelView {
  const ceiling = options.eMax ?? DEFAULT_LEVEL_CEILING;
  const limit = options.forbidden ?? DEFAULT_LEVEL_FORBIDDEN;
  ensure(
    Number.isFinite(ceiling) && ceiling > 0,
    `energy ceiling ${ceiling}: expected a positive number of cm⁻¹`,
  );
  ensure(
    Number.isInteger(limit) && limit >= 0,
    `number of spin-forbidden levels ${limit}: expected a whole number, 0 or more`,
  );
  const below = result.levels.filter((l) => l.energy <= ceiling);
  const forbidden = below.filter((l) => !l.spinAllowed);
  const levels = below.filter((l) => l.spinAllowed || forbidden.indexOf(l) < limit);
  // The ground level's energy above the lowest free-ion term: the field keeps the weighted mean.
  const all = freeIonTerms(result.n, result.B, result.C);
  const weight = all.reduce((w, t) => w + t.degeneracy, 0);
  const freeMean = all.reduce((m, t) => m + t.degeneracy * t.energy, 0) / weight;
  const fieldMean = result.levels.reduce((m, l) => m + l.degeneracy * l.energy, 0) / weight;
  const ground = freeMean - fieldMean;
  const parents = new Set(levels.map((l) => l.parent));
  const lowest = all[0]?.name;
  const terms = all
    .filter((t) => parents.has(t.name) || t.name === lowest)
    .map((t) => ({ ...t, energy: t.energy - ground }));
  // A term above the ceiling is not drawn, but its levels' joins run up out of the plot.
  const highest = Math.max(
    1,
    ...levels.map((l) => l.energy),
    ...terms.filter((t) => t.energy <= ceiling).map((t) => t.energy),
  );
  return {
    levels,
    terms,
    top: Math.min(ceiling, niceTop(highest * 1.04)),
    omitted: forbidden.length - Math.min(limit, forbidden.length),
  };
}

/** Extent of the two columns on the hidden 0…1 x axis. */
const FREE_ION = { from: 0.2, to: 0.42 } as const;
const FIELD = { from: 0.66, to: 1 } as const;
/** Room right of the plot for the level labels, px. */
const LABEL_ROOM = 112;
/** Room above the plot for the title lines, px. */
const HEADER = 74;

const LABEL: TextStyle = { size: STYLE.labelSize, color: STYLE.ink };

/** Figure height that leaves each level label its own line: at least the default 650 px. */
export function levelDiagramHeight(result: CubicResult, options: LevelDiagramOptions = {}): number {
  const { levels } = levelView(result, options);
  return Math.max(650, Math.ceil(levels.length * runsHeight(LABEL) * 1.15) + HEADER + 110);
}

/** The chart.js configuration of the level diagram; bars, joins and labels are drawn by a plugin over chart.js's E axis. */
export function levelDiagramChart(
  result: CubicResult,
  options: LevelDiagramOptions = {},
): ChartConfiguration {
  const view = levelView(result, options);
  const tick = TICKS;
  return {
    type: 'scatter',
    data: { datasets: [] },
    options: {
      layout: { padding: { top: HEADER, right: LABEL_ROOM, left: 12, bottom: 52 } },
      plugins: { legend: { display: false }, tooltip: { enabled: false }, title: { display: false } },
      scales: {
        x: { type: 'linear', min: 0, max: 1, display: false },
        y: {
          type: 'linear',
          min: 0,
          max: view.top,
          title: {
            display: true,
            text: 'E / cm⁻¹ above the ground level',
            font: { size: STYLE.axisTitleSize },
            color: STYLE.ink,
          },
          ticks: { ...tick, callback: (v: string | number) => groupedNumber(Number(v)) },
          grid: { display: false },
          border: { color: STYLE.ink },
        },
      },
    },
    plugins: [levelBars(result, view, options)],
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
    height: levelDiagramHeight(result, options),
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

function levelBars(result: CubicResult, view: LevelView, options: LevelDiagramOptions): Plugin {
  return {
    id: 'termsplitLevelBars',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      drawLevels(ctx, chart, result, view, options);
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
  view: LevelView,
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
  const area = chart.chartArea;
  ctx.save();
  ctx.beginPath();
  ctx.rect(area.left, area.top - 2, area.right - area.left, area.bottom - area.top + 4);
  ctx.clip();
  drawBars(canvas, view);
  ctx.restore();
  drawBarLabels(canvas, view);
  drawCaptions(canvas, result, view);
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
  const title: TextStyle = { size: STYLE.titleSize, color: STYLE.ink, bold: true };
  const titleRuns = markupRuns(levelTitleMarkup(result, options));
  drawRuns(ctx, titleRuns, chart.width / 2, 18, fitted(ctx, titleRuns, title, chart.width - 8), 'center');
  const sub = `Dq = ${result.dq.toFixed(0)} cm⁻¹ (10Dq = ${(10 * result.dq).toFixed(0)}), B = ${result.B.toFixed(0)} cm⁻¹, C = ${result.C.toFixed(0)} cm⁻¹`;
  const zero: TextRun[] = [
    { text: 'E = 0 at the ground level ', shift: 'base' },
    ...stateRuns(result.ground.label),
    { text: ' in both columns', shift: 'base' },
  ];
  const subStyle = { size: STYLE.smallSize + 1, color: STYLE.muted };
  for (const [runs, y] of [
    [[{ text: sub, shift: 'base' }], 40],
    [zero, 58],
  ] as const)
    drawRuns(ctx, runs, chart.width / 2, y, fitted(ctx, runs, subStyle, chart.width - 8), 'center');
}

/** Term and level bars, and, first so they lie under the bars, the joins of each level to its parent term. */
function drawBars({ ctx, px, py, groundS }: LevelCanvas, view: LevelView): void {
  const color = (S: number) => (S === groundS ? STYLE.allowed : STYLE.forbidden);
  const termEnergy = new Map(view.terms.map((t) => [t.name, t.energy]));
  for (const l of view.levels) {
    const e = termEnergy.get(l.parent);
    if (e === undefined) continue;
    strokeLine(ctx, px(FREE_ION.to), py(e), px(FIELD.from), py(l.energy), color(l.S), 0.8, [3, 3]);
  }
  for (const t of view.terms)
    strokeLine(
      ctx,
      px(FREE_ION.from),
      py(t.energy),
      px(FREE_ION.to),
      py(t.energy),
      color(t.S),
      t.S === groundS ? 3 : 2,
    );
  for (const l of view.levels)
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

/** One label of a column: its runs, spin, and the height of its bar. */
interface ColumnItem {
  readonly runs: TextRun[];
  readonly text: string;
  readonly S: number;
  readonly y: number;
}

/** Free-ion terms inside the plot, those at the same height (within half a line) sharing one label, "²P, ²H". */
function termItems(
  view: LevelView,
  py: (e: number) => number,
  top: number,
  groundS: number,
  h: number,
): ColumnItem[] {
  const items: { names: string[]; S: number; y: number }[] = [];
  for (const t of [...view.terms].sort((a, b) => a.energy - b.energy)) {
    const y = py(t.energy);
    if (y < top - 1) continue;
    const last = items.at(-1);
    if (last && Math.abs(last.y - y) < h / 2) {
      last.names.push(t.name);
      if (t.S === groundS) last.S = groundS;
    } else items.push({ names: [t.name], S: t.S, y });
  }
  return items.map((g) => ({
    runs: g.names.flatMap((name, k) => [
      ...(k > 0 ? [{ text: ', ', shift: 'base' as const }] : []),
      ...termRuns(name),
    ]),
    text: g.names.join(', '),
    S: g.S,
    y: g.y,
  }));
}

/**
 * Term labels left of their bars, level labels right of theirs, each joined to its bar by a
 * short leader. Labels keep the order of their bars and are spread to one line each, so no two
 * labels overlap and no two leaders cross.
 */
function drawBarLabels({ ctx, chart, px, py, groundS }: LevelCanvas, view: LevelView): void {
  const area = chart.chartArea;
  const textColor = (S: number) => (S === groundS ? STYLE.allowed : STYLE.forbiddenText);
  const h = runsHeight(LABEL) * 1.05;
  const columns = [
    { items: termItems(view, py, area.top, groundS, h), barEdge: px(FREE_ION.from), side: -1 },
    {
      items: view.levels.map((l) => ({ runs: stateRuns(l.label), text: l.label, S: l.S, y: py(l.energy) })),
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
        STYLE.leaderWidth,
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
function drawCaptions({ ctx, chart, px }: LevelCanvas, result: CubicResult, view: LevelView): void {
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
  const shownForbidden = view.levels.filter((l) => !l.spinAllowed).length;
  const forbiddenText =
    view.omitted > 0
      ? `spin-forbidden (lowest ${shownForbidden} of ${shownForbidden + view.omitted})`
      : 'spin-forbidden';
  drawKey(
    ctx,
    spinKey([STYLE.allowed], shownForbidden > 0, forbiddenText),
    chart.width - 8,
    chart.height - 14,
  );
}

/** `x` rounded up to a multiple of half its power of ten (78 000 → 80 000, 43 000 → 45 000), for a tidy axis end. */
function niceTop(x: number): number {
  const step = 10 ** Math.floor(Math.log10(x)) / 2;
  return Math.ceil(x / step) * step;
}
