/**
 * The correlation (Tanabe–Sugano-style) diagram as a figure: E/B of every level against Δ/B,
 * each curve labelled in the figure with its ²ˢ⁺¹Γ (no legend box), spin-allowed curves strong
 * and spin-forbidden ones light, free-ion terms named where the curves start, and each change of
 * ground state marked with the high-spin and low-spin sides named.
 */

import type { SKRSContext2D } from '@napi-rs/canvas';
import type { Chart, ChartConfiguration, ChartDataset, Plugin, Scale } from 'chart.js';
import type { CorrelationDiagram, DiagramCurve } from '../src/analysis/sweep.js';
import { halfIntegerText } from '../src/atom/terms.js';
import { ensure } from '../src/core/errors.js';
import { drawKey, spinKey } from './key.js';
import { type Box, freeSpot, nearShifts, overlaps, spreadLabels } from './labelLayout.js';
import { type FigureOptions, renderChart } from './render.js';
import { type SampleMark, samplePosition, withSample } from './sampleOverlay.js';
import { axisTitle, STYLE, TICKS } from './style.js';
import {
  captionRuns,
  chartContext,
  drawFrame,
  drawRuns,
  fitted,
  ionMarkup,
  markupRuns,
  measureRuns,
  runsHeight,
  stateRuns,
  type TextRun,
  type TextStyle,
  termRuns,
} from './typeset.js';

/** Options of {@link diagramChart}. */
export interface DiagramChartOptions {
  /**
   * Top of the E/B axis (ignored when `eRange` is given).
   * @default the highest curve, but at most DEFAULT_E_SPAN × the largest Δ/B, rounded up
   */
  readonly eMax?: number;
  /** The Δ/B range drawn, to zoom in around a sample. @default [0, the diagram's largest Δ/B] */
  readonly deltaRange?: readonly [number, number];
  /** The E/B range drawn. @default [0, eMax] */
  readonly eRange?: readonly [number, number];
  /**
   * Draw only this many spin-forbidden curves besides every spin-allowed one: the lowest, by
   * their E/B at the sample's Δ/B (with a sample) or at the right edge. @default all of them
   */
  readonly forbidden?: number;
  /** A sample to mark on the diagram (see {@link withSample}). */
  readonly sample?: SampleMark;
  /** The ion's name for the title, e.g. `Cr3+`. */
  readonly ion?: string;
  /** Receives the labels placed in the figure each time it is drawn (to list or check them). */
  readonly onLabels?: (labels: readonly DiagramLabel[]) => void;
}

/** A label drawn in the figure. */
export interface DiagramLabel {
  /** The curve label (e.g. `4T1g(P)`) or free-ion term (e.g. `a2D`) it names. */
  readonly text: string;
  /**
   * Where it stands: at a curve's end right of the plot, where a curve leaves through the top,
   * beside a curve, on the zero line as a region's ground state, or at Δ/B = 0 as a free-ion term.
   */
  readonly kind: 'end' | 'exit' | 'beside' | 'ground' | 'term';
  /** Its box in CSS pixels. */
  readonly box: Box;
}

/** The automatic top of the E/B axis is at most this many times the largest Δ/B. */
export const DEFAULT_E_SPAN = 2;

/** Room under the x axis title for the line key, px. */
const KEY_ROW = 22;
/** Room right of the plot for the curve labels, px. */
const LABEL_COLUMN = 108;
/** Room above the plot for the title and the strip naming the spin regions, px. */
const HEADER = 66;
/** Room above the plot for the title alone (no change of ground state to name), px. */
const HEADER_PLAIN = 44;
/** Height of the leaders between the plot's top edge and the labels of curves leaving through it, px. */
const EXIT_LEADER = 14;
/** Labels of curves leaving through the top: a little smaller, set upright (rotated a quarter turn). */
const EXIT_LABEL: TextStyle = { size: STYLE.smallSize, color: STYLE.ink };
/** Gap between the plot's right edge and the curve labels (where leader lines run), px. */
const LEADER = 12;

const LABEL: TextStyle = { size: STYLE.labelSize, color: STYLE.ink };

/** The top of the E/B axis when none is given: the highest curve, capped, rounded up to 5 or 10. */
export function automaticEMax(diagram: CorrelationDiagram): number {
  let highest = 0;
  for (const c of diagram.curves) for (const v of c.values) highest = Math.max(highest, v);
  const top = Math.min(DEFAULT_E_SPAN * diagram.maxDeltaOverB, highest * 1.04);
  const step = top > 50 ? 10 : 5;
  return Math.max(step, Math.ceil(top / step) * step);
}

/** Index of the spin region holding Δ/B = x. */
function regionIndex(diagram: CorrelationDiagram, x: number): number {
  const i = diagram.regions.findIndex((r) => x <= r.toDeltaOverB);
  return i < 0 ? diagram.regions.length - 1 : i;
}

/** Colour of the spin-allowed curves of region `r`: one colour without a crossover, else high spin and low spin apart. */
function regionColor(diagram: CorrelationDiagram, r: number): string {
  if (diagram.regions.length < 2) return STYLE.allowed;
  const top = Math.max(...diagram.regions.map((x) => x.S));
  return diagram.regions[r]?.S === top ? STYLE.allowed : STYLE.allowedLowSpin;
}

/** Whether a curve is spin-allowed in region `r` (at Δ/B = x where its parent changes along it, as with ζ). */
function allowedIn(diagram: CorrelationDiagram, curve: DiagramCurve, r: number, x?: number): boolean {
  return diagram.regions[r]?.S === (x === undefined ? curve.S : spinAt(curve, x));
}

/** A curve's spin at Δ/B = x: its parent's there when it carries stretches (with ζ), else its own. */
function spinAt(curve: DiagramCurve, x: number): number {
  let S = curve.S;
  for (const s of curve.stretches ?? []) if (s.fromDeltaOverB <= x) S = s.S;
  return S;
}

/** The runs of a curve's label: its caption (`Γ5 3T1g(F)`) with ζ, else its state label. */
function curveRuns(curve: DiagramCurve): TextRun[] {
  return curve.caption === undefined ? stateRuns(curve.label) : captionRuns(curve.caption);
}

/** Whether a curve is spin-allowed on some side of the diagram (and so must be named). */
function everAllowed(diagram: CorrelationDiagram, curve: DiagramCurve): boolean {
  return diagram.regions.some((r) => r.S === curve.S);
}

/** The part of a diagram a figure shows: its ranges and the curves drawn. */
interface DiagramView {
  readonly xMin: number;
  readonly xMax: number;
  readonly eMin: number;
  readonly eMax: number;
  /** The diagram with only the curves drawn. */
  readonly shown: CorrelationDiagram;
}

function checkedRange(name: string, range: readonly [number, number], lo: number, hi: number) {
  const [a, b] = range;
  ensure(
    Number.isFinite(a) && Number.isFinite(b) && a >= lo && b > a && b <= hi,
    `${name} ${a}:${b}: expected two increasing numbers from ${lo} to ${hi}`,
  );
  return { from: a, to: b };
}

/**
 * Ranges and curves of the figure.
 * @throws InputError for d¹ and d⁹, a bad range or count (see {@link diagramChart}).
 */
function diagramView(diagram: CorrelationDiagram, options: DiagramChartOptions): DiagramView {
  ensure(
    diagram.n !== 1 && diagram.n !== 9,
    `d${diagram.n}: one free-ion term (²D) and no electron repulsion, so its levels do not depend on B and an E/B against Δ/B diagram means nothing; the one splitting is 10Dq between ²T₂g and ²E_g (use the level diagram)`,
  );
  const x = checkedRange(
    'Δ/B range',
    options.deltaRange ?? [0, diagram.maxDeltaOverB],
    0,
    diagram.maxDeltaOverB,
  );
  const eMax = options.eRange?.[1] ?? options.eMax ?? automaticEMax(diagram);
  ensure(Number.isFinite(eMax) && eMax > 0, `top of the E/B axis ${eMax}: expected a positive number`);
  const e = checkedRange('E/B range', options.eRange ?? [0, eMax], 0, Number.POSITIVE_INFINITY);
  const limit = options.forbidden;
  ensure(
    limit === undefined || (Number.isInteger(limit) && limit >= 0),
    `number of spin-forbidden curves ${limit}: expected a whole number, 0 or more`,
  );
  let curves = diagram.curves;
  if (limit !== undefined) {
    const at = options.sample ? samplePosition(options.sample).deltaOverB : x.to;
    const forbidden = curves
      .filter((c) => !everAllowed(diagram, c))
      .sort((a, b) => valueAt(diagram, a, at) - valueAt(diagram, b, at))
      .slice(0, limit);
    curves = curves.filter((c) => everAllowed(diagram, c) || forbidden.includes(c));
  }
  return { xMin: x.from, xMax: x.to, eMin: e.from, eMax: e.to, shown: { ...diagram, curves } };
}

/** Width a state label will take, px, estimated before any canvas exists (an upper bound for DejaVu Sans). */
function estimatedWidth(curve: DiagramCurve, style: TextStyle): number {
  return curveRuns(curve).reduce(
    (w, r) => w + [...r.text].length * 0.64 * style.size * (r.shift === 'base' ? 1 : 0.7),
    0,
  );
}

/** Tick step of an axis spanning `span`: 5 up to 60, 10 up to 120, else chart.js's choice. */
function tickStep(span: number): { stepSize?: number } {
  if (span <= 12) return { stepSize: 1 };
  if (span <= 30) return { stepSize: 2 };
  if (span <= 60) return { stepSize: 5 };
  return span <= 120 ? { stepSize: 10 } : {};
}

/** How a stretch of curve is drawn. */
interface LineStyle {
  readonly color: string;
  readonly width: number;
}

/** A stretch of one curve drawn in one style: sweep points `from` to `to`, both included. */
interface StyleRun extends LineStyle {
  readonly from: number;
  readonly to: number;
}

/** A segment between neighbouring sweep points: Δ/B of its middle, and the spin and strong colour of the region there. */
interface Segment {
  readonly mid: number;
  readonly S: number | undefined;
  readonly color: string;
}

/** The segments of the sweep, each with the spin region of its middle. */
function sweepSegments(diagram: CorrelationDiagram): Segment[] {
  const xs = diagram.deltaOverB;
  const colors = diagram.regions.map((_, r) => regionColor(diagram, r));
  return xs.slice(1).map((x, i) => {
    const mid = ((xs[i] ?? 0) + x) / 2;
    const r = regionIndex(diagram, mid);
    return { mid, S: diagram.regions[r]?.S, color: colors[r] ?? STYLE.allowed };
  });
}

/**
 * A curve cut into runs of one style, each segment strong where the curve is spin-allowed in
 * the region of its middle; neighbouring runs share their end point, so the line stays unbroken.
 */
function styleRuns(curve: DiagramCurve, segments: readonly Segment[]): StyleRun[] {
  const style = (i: number): LineStyle => {
    const s = segments[i];
    return s !== undefined && s.S === spinAt(curve, s.mid)
      ? { color: s.color, width: STYLE.allowedWidth }
      : { color: STYLE.forbidden, width: STYLE.forbiddenWidth };
  };
  const runs: StyleRun[] = [];
  let from = 0;
  let current = style(0);
  for (let i = 1; i < segments.length; i++) {
    const next = style(i);
    if (next.color === current.color && next.width === current.width) continue;
    runs.push({ ...current, from, to: i });
    from = i;
    current = next;
  }
  runs.push({ ...current, from, to: Math.max(from + 1, segments.length) });
  return runs;
}

/**
 * The curves as chart.js datasets: one per run of one style (a curve changes style where it
 * turns spin-allowed or forbidden), with fixed colours and widths, since chart.js styling each
 * segment by a function costs more than drawing the whole figure.
 */
function curveDatasets(diagram: CorrelationDiagram): ChartDataset[] {
  const xs = diagram.deltaOverB;
  const segments = sweepSegments(diagram);
  // chart.js draws the first dataset on top: the spin-allowed curves go first.
  const curves = [...diagram.curves].sort(
    (a, b) => Number(everAllowed(diagram, b)) - Number(everAllowed(diagram, a)),
  );
  return curves.flatMap((curve) =>
    styleRuns(curve, segments)
      .map(
        (run) =>
          ({
            label: curve.label,
            data: xs
              .slice(run.from, run.to + 1)
              .map((x, k) => ({ x, y: curve.values[run.from + k] ?? Number.NaN })),
            showLine: true,
            pointRadius: 0,
            pointHoverRadius: 0,
            borderColor: run.color,
            borderWidth: run.width,
            borderCapStyle: 'round',
            borderJoinStyle: 'round',
            tension: 0,
          }) as ChartDataset<'scatter'>,
      )
      // Within a curve, too, later datasets are drawn first: reversed, its runs are drawn from left to right.
      .reverse(),
  );
}

/**
 * The chart.js configuration of a correlation diagram (type `scatter` with lines, x = Δ/B,
 * y = E/B), with the in-figure labels as a plugin and the sample, if given, drawn on it.
 * Labels: every spin-allowed curve is named, at its right end (spread apart, with leaders) or,
 * where it leaves through the top, upright above the plot with a leader to its exit; a
 * spin-forbidden curve is named at its right end only where its label fits within about one
 * line of the end without displacing another label (the stated thinning rule), and not where it
 * leaves through the top.
 * @throws InputError for d¹ and d⁹ (no B dependence: the diagram means nothing), a non-positive
 * `eMax`, a range outside the diagram, a negative or fractional `forbidden`, or a sample that
 * does not fit (see {@link withSample}).
 */
export function diagramChart(
  diagram: CorrelationDiagram,
  options: DiagramChartOptions = {},
): ChartConfiguration {
  const view = diagramView(diagram, options);
  const { shown } = view;
  const exits = allowedExits(shown, view.eMax, view.xMin, view.xMax);
  const band =
    exits.length === 0
      ? 0
      : EXIT_LEADER + 6 + Math.max(...exits.map((e) => estimatedWidth(e.curve, EXIT_LABEL)));
  const tick = TICKS;
  const config: ChartConfiguration = {
    type: 'scatter',
    data: { datasets: curveDatasets(shown) },
    options: {
      parsing: false,
      normalized: true,
      layout: {
        padding: {
          top: (shown.crossings.length > 0 ? HEADER : HEADER_PLAIN) + band,
          right: LABEL_COLUMN,
          left: 12,
          bottom: KEY_ROW,
        },
      },
      plugins: { legend: { display: false }, tooltip: { enabled: false }, title: { display: false } },
      scales: {
        x: {
          type: 'linear',
          min: view.xMin,
          max: view.xMax,
          title: axisTitle('Δ/B'),
          ticks: { ...tick, ...tickStep(view.xMax - view.xMin), maxRotation: 0, autoSkipPadding: 6 },
          grid: { display: false },
          border: { color: STYLE.ink },
        },
        y: {
          type: 'linear',
          min: view.eMin,
          max: view.eMax,
          title: axisTitle('E/B'),
          ticks: { ...tick, ...tickStep(view.eMax - view.eMin) },
          grid: { display: false },
          border: { color: STYLE.ink },
        },
      },
    },
    plugins: [
      regionBackdrop(shown),
      diagramLabels(shown, {
        ion: options.ion,
        band,
        onLabels: options.onLabels,
        allForbidden: options.forbidden === undefined,
      }),
    ],
  };
  return options.sample
    ? withSample(config, options.sample, { clearOf: shown.crossings.map((c) => c.deltaOverB) })
    : config;
}

/**
 * The bytes of a correlation-diagram figure (PNG, SVG or PDF).
 * @throws InputError as {@link diagramChart}.
 */
export function renderDiagram(
  diagram: CorrelationDiagram,
  figure: FigureOptions,
  options: DiagramChartOptions = {},
): Buffer {
  return renderChart(diagramChart(diagram, options), {
    title: diagramTitleText(diagram, options.ion),
    ...figure,
  });
}

const GEOMETRY_NAME = { oct: 'an octahedral (O_h)', tet: 'a tetrahedral (T_d)' } as const;

/** The figure title in the `^`/`_` markup of {@link markupRuns}; C/B is left out for d¹ and d⁹, where it plays no part. */
function diagramTitleMarkup(diagram: CorrelationDiagram, ion: string | undefined): string {
  const who = `${ion === undefined ? '' : `${ionMarkup(ion)}, `}d^${diagram.n}`;
  const ratio = diagram.n === 1 || diagram.n === 9 ? '' : `, C/B = ${diagram.cOverB.toFixed(2)}`;
  const zeta = diagram.zetaOverB === undefined ? '' : `, ζ/B = ${diagram.zetaOverB.toFixed(2)}`;
  return `${who} in ${GEOMETRY_NAME[diagram.geometry]} field${ratio}${zeta}`;
}

/** The figure title as plain text (the PDF document title). */
export function diagramTitleText(diagram: CorrelationDiagram, ion?: string): string {
  return diagramTitleMarkup(diagram, ion).replace(/[\^_]/g, '');
}

/** A faint tint over the low-spin side(s), and the dashed lines at each change of ground state, under the curves. */
function regionBackdrop(diagram: CorrelationDiagram): Plugin {
  return {
    id: 'termsplitRegions',
    beforeDatasetsDraw(chart) {
      const ctx = chartContext(chart);
      const { top, bottom, left, right } = chart.chartArea;
      const px = (x: number) => Math.max(left, Math.min(right, chart.scales.x?.getPixelForValue(x) ?? 0));
      ctx.save();
      diagram.regions.forEach((region, r) => {
        if (regionColor(diagram, r) !== STYLE.allowedLowSpin) return;
        ctx.fillStyle = STYLE.lowSpinTint;
        ctx.fillRect(
          px(region.fromDeltaOverB),
          top,
          px(region.toDeltaOverB) - px(region.fromDeltaOverB),
          bottom - top,
        );
      });
      ctx.strokeStyle = STYLE.crossover;
      ctx.lineWidth = STYLE.markWidth;
      ctx.setLineDash([...STYLE.crossoverDash]);
      for (const c of diagram.crossings) {
        const x = chart.scales.x?.getPixelForValue(c.deltaOverB) ?? 0;
        if (x < left || x > right) continue;
        ctx.beginPath();
        ctx.moveTo(x, top);
        ctx.lineTo(x, bottom);
        ctx.stroke();
      }
      ctx.restore();
    },
  };
}

/** A label waiting to be drawn. */
interface Placed extends DiagramLabel {
  runs: TextRun[];
  style: TextStyle;
  box: Box;
  /** Where the leader line starts (the curve's end), if the label moved away from it. */
  leaderFrom?: { x: number; y: number };
  /** Where the leader ends. @default the middle of the label's left edge */
  leaderTo?: { x: number; y: number };
}

/** What the label plugin needs besides the diagram. */
interface LabelSetting {
  readonly ion: string | undefined;
  /** Height of the band above the plot for upright exit labels, px (0 without any). */
  readonly band: number;
  readonly onLabels: ((labels: readonly DiagramLabel[]) => void) | undefined;
  /** Whether every spin-forbidden curve is drawn (else the key says only the lowest are). */
  readonly allForbidden: boolean;
}

/** Everything drawn over the plot: frame, title, region names, and the labels of curves and terms. */
function diagramLabels(diagram: CorrelationDiagram, setting: LabelSetting): Plugin {
  return {
    id: 'termsplitDiagramLabels',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      const area = chart.chartArea;
      drawFrame(ctx, area);
      drawHeader(ctx, chart, diagram, setting);
      const placed = layoutLabels(ctx, chart, diagram);
      for (const p of placed) drawLabel(ctx, p);
      const colors = diagram.regions.length > 1 ? [STYLE.allowed, STYLE.allowedLowSpin] : [STYLE.allowed];
      const anyForbidden = diagram.curves.some((c) =>
        [c.S, ...(c.stretches ?? []).map((x) => x.S)].some((S) => diagram.regions.some((r) => r.S !== S)),
      );
      // With spin–orbit coupling spin is no good label: lines are styled by their parent's spin.
      const so = diagram.zetaOverB !== undefined;
      const forbiddenText = `${so ? 'from spin-forbidden ²ˢ⁺¹Γ' : 'spin-forbidden'}${setting.allForbidden ? '' : ', lowest only'}`;
      const key = spinKey(colors, anyForbidden, forbiddenText, so ? 'from spin-allowed ²ˢ⁺¹Γ' : undefined);
      drawKey(ctx, key, chart.width - 8, chart.height - 11);
      setting.onLabels?.(placed.map((p) => ({ text: p.text, kind: p.kind, box: p.box })));
    },
  };
}

/** A placed label with its leader: upright above the plot for an exit, else level. */
function drawLabel(ctx: SKRSContext2D, p: Placed): void {
  if (p.leaderFrom) {
    const to = p.leaderTo ?? { x: p.box.left - 3, y: (p.box.top + p.box.bottom) / 2 };
    ctx.save();
    ctx.strokeStyle = p.style.color;
    ctx.globalAlpha = 0.75;
    ctx.lineWidth = STYLE.leaderWidth;
    ctx.beginPath();
    ctx.moveTo(p.leaderFrom.x, p.leaderFrom.y);
    ctx.lineTo(to.x, to.y);
    ctx.stroke();
    ctx.restore();
  }
  if (p.kind !== 'exit') {
    drawRuns(ctx, p.runs, p.box.left, (p.box.top + p.box.bottom) / 2, p.style);
    return;
  }
  ctx.save();
  ctx.translate((p.box.left + p.box.right) / 2, p.box.bottom);
  ctx.rotate(-Math.PI / 2);
  drawRuns(ctx, p.runs, 0, 0, p.style);
  ctx.restore();
}

/** The title, and the strip under it naming the spin regions and the Δ/B of each crossover. */
function drawHeader(
  ctx: SKRSContext2D,
  chart: Chart,
  diagram: CorrelationDiagram,
  setting: LabelSetting,
): void {
  const { ion, band } = setting;
  const area = chart.chartArea;
  const px = (x: number) => chart.scales.x?.getPixelForValue(x) ?? 0;
  const title: TextStyle = { size: STYLE.titleSize, color: STYLE.ink, bold: true };
  const titleRuns = markupRuns(diagramTitleMarkup(diagram, ion));
  const wide = chart.width > 2 * measureRuns(ctx, titleRuns, title);
  const centre = wide ? (area.left + area.right) / 2 : chart.width / 2;
  drawRuns(ctx, titleRuns, centre, 18, fitted(ctx, titleRuns, title, chart.width - 20), 'center');
  if (diagram.crossings.length === 0) return;
  const y = area.top - band - 14;
  const strip: TextStyle = { size: STYLE.smallSize, color: STYLE.crossover };
  const taken: Box[] = [];
  for (const c of diagram.crossings) {
    if (px(c.deltaOverB) < area.left || px(c.deltaOverB) > area.right) continue;
    const runs = markupRuns(`Δ/B = ${c.deltaOverB.toFixed(2)}`);
    const w = measureRuns(ctx, runs, strip);
    drawRuns(ctx, runs, px(c.deltaOverB), y, strip, 'center');
    taken.push({
      left: px(c.deltaOverB) - w / 2 - 22,
      right: px(c.deltaOverB) + w / 2 + 22,
      top: 0,
      bottom: 1,
    });
  }
  const top = Math.max(...diagram.regions.map((r) => r.S));
  diagram.regions.forEach((region, r) => {
    const name = `${region.S === top ? 'high spin' : 'low spin'} (S = ${halfIntegerText(region.S)})`;
    const style: TextStyle = { size: STYLE.smallSize + 1, color: regionColor(diagram, r), bold: true };
    const runs = markupRuns(name);
    const w = measureRuns(ctx, runs, style);
    const lo = Math.max(area.left, px(region.fromDeltaOverB));
    const hi = Math.min(area.right, px(region.toDeltaOverB));
    // Centred over the region, then slid away from the crossover captions if it meets one.
    let left = (lo + hi) / 2 - w / 2;
    for (const t of taken) {
      const box = { left, right: left + w, top: 0, bottom: 1 };
      if (!overlaps(box, t)) continue;
      left = left + w / 2 < (t.left + t.right) / 2 ? t.left - w : t.right;
    }
    if (left >= lo - 2 && left + w <= hi + 2) drawRuns(ctx, runs, left, y, style);
  });
}

/** What the label placers share while laying out one figure. */
interface Layout {
  readonly ctx: SKRSContext2D;
  readonly chart: Chart;
  readonly diagram: CorrelationDiagram;
  readonly x: Scale;
  readonly y: Scale;
  /** Top and bottom of the E/B axis. */
  readonly eMax: number;
  readonly eMin: number;
  /** The Δ/B range shown. */
  readonly xMin: number;
  readonly xMax: number;
  /** Height of one label, px. */
  readonly h: number;
  /** The plot area, where labels inside the plot must stay. */
  readonly inside: Box;
  /** Left edge of the label column right of the plot. */
  readonly columnLeft: number;
  readonly out: Placed[];
  /** Boxes already taken (with their clearance). */
  readonly taken: Box[];
  /** Curves already named. */
  readonly labelled: Set<string>;
}

/**
 * Positions of every label, in order of precedence: curve ends in the column right of the plot
 * (every spin-allowed curve, spread apart with leader lines), the ground state of each region
 * but the last, spin-allowed curves leaving through the top, spin-allowed curves still unnamed
 * (beside the curve), the free-ion terms at Δ/B = 0, and the other curve ends where there is room.
 */
function layoutLabels(ctx: SKRSContext2D, chart: Chart, diagram: CorrelationDiagram): Placed[] {
  const { x, y } = chart.scales;
  if (!x || !y) return [];
  const area = chart.chartArea;
  const layout: Layout = {
    ctx,
    chart,
    diagram,
    x,
    y,
    eMax: y.max,
    eMin: y.min,
    xMin: x.min,
    xMax: x.max,
    h: runsHeight(LABEL),
    inside: { left: area.left, right: area.right, top: area.top, bottom: area.bottom },
    columnLeft: area.right + LEADER,
    out: [],
    taken: [],
    labelled: new Set(),
  };
  const ends = diagram.curves
    .map((curve) => ({ curve, value: valueAt(diagram, curve, layout.xMax) }))
    .filter((e) => e.value >= layout.eMin && e.value <= layout.eMax);
  labelAllowedEnds(
    layout,
    ends.filter((e) => everAllowed(diagram, e.curve)),
  );
  if (layout.eMin <= 0) labelRegionGrounds(layout);
  labelTopExits(layout);
  labelBeside(layout);
  if (layout.xMin <= 0) labelTerms(layout);
  labelOtherEnds(
    layout,
    ends.filter((e) => !everAllowed(diagram, e.curve)),
  );
  return layout.out;
}

/** A label's box of width `w` with its left edge at `left` and its middle at `cy`. */
function boxAt(layout: Layout, left: number, cy: number, w: number): Box {
  return { left, right: left + w, top: cy - layout.h / 2, bottom: cy + layout.h / 2 };
}

/** Colour of a curve's label in region `r`: the region's strong colour where allowed, else where it is allowed anywhere, else light. */
function curveStyle(diagram: CorrelationDiagram, curve: DiagramCurve, r: number): TextStyle {
  if (allowedIn(diagram, curve, r)) return { ...LABEL, color: regionColor(diagram, r) };
  const k = diagram.regions.findIndex((region) => region.S === curve.S);
  return { ...LABEL, color: k >= 0 ? regionColor(diagram, k) : STYLE.forbiddenText };
}

/** Records a label; a leader line is drawn when it had to move more than a pixel and a half from `target`. */
function place(layout: Layout, label: Placed, clearance: Box, target?: number): void {
  layout.taken.push(clearance);
  layout.labelled.add(label.text);
  const cy = (label.box.top + label.box.bottom) / 2;
  const moved = target !== undefined && Math.abs(cy - target) > 1.5;
  layout.out.push(moved ? { ...label, leaderFrom: { x: layout.inside.right + 2, y: target } } : label);
}

type CurveEnd = { curve: DiagramCurve; value: number };

function labelAllowedEnds(layout: Layout, ends: readonly CurveEnd[]): void {
  const { diagram, inside } = layout;
  const targets = ends.map((e) => layout.y.getPixelForValue(e.value));
  const spread = spreadLabels(targets, layout.h + 1, inside.top - 4, inside.bottom + 8);
  ends.forEach((e, i) => {
    const runs = curveRuns(e.curve);
    const style = curveStyle(diagram, e.curve, diagram.regions.length - 1);
    const box = boxAt(layout, layout.columnLeft, spread[i] ?? 0, measureRuns(layout.ctx, runs, style));
    place(layout, { text: e.curve.label, kind: 'end', runs, style, box }, box, targets[i]);
  });
}

/** The ground state of each region but the last, on the zero line (the last one's is named at the right end). */
function labelRegionGrounds(layout: Layout): void {
  const { diagram, inside } = layout;
  diagram.regions.slice(0, -1).forEach((region, r) => {
    const runs = stateRuns(region.ground);
    const style = { ...LABEL, color: regionColor(diagram, r), halo: true };
    const w = measureRuns(layout.ctx, runs, style);
    const from = Math.max(layout.xMin, region.fromDeltaOverB);
    const to = Math.min(layout.xMax, region.toDeltaOverB);
    if (to - from < 0.1 * (layout.xMax - layout.xMin)) return;
    const mid = layout.x.getPixelForValue((from + to) / 2);
    const box = boxAt(layout, mid - w / 2, inside.bottom - layout.h / 2 - 3, w);
    layout.taken.push(box);
    layout.out.push({ text: region.ground, kind: 'ground', runs, style, box });
  });
}

/** A spin-allowed curve leaving through the top of the plot, at Δ/B = x. */
type Exit = { curve: DiagramCurve; x: number };

/** The curves that leave through the top within the Δ/B range while spin-allowed there, left to right. */
function allowedExits(diagram: CorrelationDiagram, eMax: number, xMin: number, xMax: number): Exit[] {
  return diagram.curves
    .map((curve) => ({ curve, x: topExit(diagram, curve, eMax, xMin, xMax) }))
    .filter((e): e is Exit => e.x !== undefined)
    .filter((e) => allowedIn(diagram, e.curve, regionIndex(diagram, e.x), e.x))
    .sort((a, b) => a.x - b.x);
}

/**
 * Spin-allowed curves that leave through the top: named upright in the band above the plot,
 * spread apart along it in the order of their exits (so no two leaders cross), each joined to
 * its exit by a leader.
 */
function labelTopExits(layout: Layout): void {
  const { diagram, inside } = layout;
  const exits = allowedExits(diagram, layout.eMax, layout.xMin, layout.xMax);
  const h = runsHeight(EXIT_LABEL);
  const targets = exits.map((e) => layout.x.getPixelForValue(e.x));
  const spread = spreadLabels(targets, h + 1, inside.left + h / 2, layout.chart.width - h / 2 - 2);
  const bottom = inside.top - EXIT_LEADER;
  exits.forEach((e, i) => {
    const runs = curveRuns(e.curve);
    const style = { ...curveStyle(diagram, e.curve, regionIndex(diagram, e.x)), size: EXIT_LABEL.size };
    const w = measureRuns(layout.ctx, runs, style);
    const cx = spread[i] ?? 0;
    const box = { left: cx - h / 2, right: cx + h / 2, top: bottom - w, bottom };
    layout.taken.push(box);
    layout.labelled.add(e.curve.label);
    layout.out.push({
      text: e.curve.label,
      kind: 'exit',
      runs,
      style,
      box,
      leaderFrom: { x: targets[i] ?? cx, y: inside.top - 1 },
      leaderTo: { x: cx, y: bottom + 2 },
    });
  });
}

/**
 * Curves spin-allowed before a crossover and still unnamed: named beside the curve there. (In
 * the last region the ends and exits carry the labels; a curve lost in the bundle that leaves
 * through the top is better unnamed than named ambiguously.)
 */
function labelBeside(layout: Layout): void {
  const { diagram, eMax, h } = layout;
  // Candidate points along the region, nearest its middle first.
  const fractions = Array.from({ length: 16 }, (_, k) => 0.15 + 0.05 * k).sort(
    (a, b) => Math.abs(a - 0.55) - Math.abs(b - 0.55),
  );
  diagram.regions.slice(0, -1).forEach((region, r) => {
    const strong = diagram.curves.filter((c) => allowedIn(diagram, c, r));
    for (const curve of strong) {
      if (layout.labelled.has(curve.label)) continue;
      const runs = curveRuns(curve);
      const style = { ...curveStyle(diagram, curve, r), halo: true };
      const w = measureRuns(layout.ctx, runs, style);
      for (const f of fractions) {
        const x = region.fromDeltaOverB + f * (region.toDeltaOverB - region.fromDeltaOverB);
        const y = valueAt(diagram, curve, x);
        if (!(y > 0.03 * eMax && y < 0.95 * eMax)) continue;
        // Above the curve on the side where it is lower, or below it on the other side; never
        // through a strong curve of the region (its own included).
        const rising = valueAt(diagram, curve, x + 1e-3 * diagram.maxDeltaOverB) >= y;
        const px = layout.x.getPixelForValue(x);
        const py = layout.y.getPixelForValue(y);
        const above = boxAt(layout, rising ? px - 3 - w : px + 3, py - 3 - h / 2, w);
        const below = boxAt(layout, rising ? px + 3 : px - 3 - w, py + 3 + h / 2, w);
        const box = [above, below].find(
          (b) =>
            freeSpot(pad(b), layout.taken, [0], layout.inside) &&
            !strong.some((c) => crosses(b, c, diagram, layout.chart)),
        );
        if (!box) continue;
        place(layout, { text: curve.label, kind: 'beside', runs, style, box }, pad(box));
        break;
      }
    }
  });
}

/**
 * Free-ion terms where the curves start, just inside the left edge; those of the ground spin
 * first. Terms at the same height (within half a line, as ²P and ²H of d³) share one label, "²P, ²H".
 */
function labelTerms(layout: Layout): void {
  const { diagram, inside, h } = layout;
  const terms = new Map<string, { S: number; value: number }>();
  for (const c of diagram.curves)
    if (!terms.has(c.parent)) terms.set(c.parent, { S: spinAt(c, 0), value: c.values[0] ?? 0 });
  const groundS = diagram.regions[0]?.S;
  const sorted = [...terms.entries()]
    .filter(([, t]) => t.value <= layout.eMax && t.value >= layout.eMin)
    .sort((a, b) => a[1].value - b[1].value);
  const groups: { names: string[]; ground: boolean; value: number }[] = [];
  for (const [name, t] of sorted) {
    const last = groups.at(-1);
    const py = layout.y.getPixelForValue(t.value);
    if (last && Math.abs(layout.y.getPixelForValue(last.value) - py) < h / 2) {
      last.names.push(name);
      last.ground ||= t.S === groundS;
    } else groups.push({ names: [name], ground: t.S === groundS, value: t.value });
  }
  groups.sort((a, b) => Number(b.ground) - Number(a.ground) || a.value - b.value);
  for (const g of groups) {
    const runs = g.names.flatMap((name, k) => [
      ...(k > 0 ? [{ text: ', ', shift: 'base' as const }] : []),
      ...termRuns(name),
    ]);
    const color = g.ground ? regionColor(diagram, 0) : STYLE.forbiddenText;
    const style: TextStyle = { ...LABEL, color, halo: true };
    const w = measureRuns(layout.ctx, runs, style);
    const cy = Math.min(layout.y.getPixelForValue(g.value) - h / 2, inside.bottom - h / 2 - 2);
    const spot = freeSpot(
      boxAt(layout, inside.left + 5, cy, w),
      layout.taken,
      nearShifts(h * 0.6, 2),
      inside,
    );
    if (!spot) continue;
    layout.taken.push(spot);
    layout.out.push({ text: g.names.join(', '), kind: 'term', runs, style, box: spot });
  }
}

/** Spin-forbidden curve ends in the column, each only where a place is free near its end. */
function labelOtherEnds(layout: Layout, ends: readonly CurveEnd[]): void {
  const { diagram, inside, h } = layout;
  const column: Box = {
    left: inside.right,
    right: layout.chart.width,
    top: inside.top - 12,
    bottom: inside.bottom + 12,
  };
  for (const e of [...ends].sort((a, b) => a.value - b.value)) {
    const runs = curveRuns(e.curve);
    const style = curveStyle(diagram, e.curve, diagram.regions.length - 1);
    const target = layout.y.getPixelForValue(e.value);
    const box = boxAt(layout, layout.columnLeft, target, measureRuns(layout.ctx, runs, style));
    const spot = freeSpot(box, layout.taken, nearShifts(h * 1.1), column);
    if (spot) place(layout, { text: e.curve.label, kind: 'end', runs, style, box: spot }, spot, target);
  }
}

/**
 * Δ/B where a curve that is above the top of the axis at the right edge (`xMax`) last rises
 * through it, or undefined if it is below the top there or above it across the whole range.
 */
function topExit(
  diagram: CorrelationDiagram,
  curve: DiagramCurve,
  eMax: number,
  xMin: number,
  xMax: number,
): number | undefined {
  if (!(valueAt(diagram, curve, xMax) > eMax)) return undefined;
  const xs = [xMin, ...diagram.deltaOverB.filter((x) => x > xMin && x < xMax), xMax];
  for (let i = xs.length - 2; i >= 0; i--) {
    const x0 = xs[i] ?? 0;
    const a = valueAt(diagram, curve, x0);
    if (a <= eMax) {
      const x1 = xs[i + 1] ?? 0;
      const b = valueAt(diagram, curve, x1);
      return x0 + ((eMax - a) / (b - a)) * (x1 - x0);
    }
  }
  return undefined;
}

/** A curve's E/B at Δ/B = x, by linear interpolation between the sweep's points. */
function valueAt(diagram: CorrelationDiagram, curve: DiagramCurve, x: number): number {
  const xs = diagram.deltaOverB;
  // The first interval whose right end reaches x (else the last), by bisection: the label
  // layout asks for thousands of values.
  let i = 0;
  let last = Math.max(0, xs.length - 2);
  while (i < last) {
    const mid = (i + last) >> 1;
    if ((xs[mid + 1] ?? 0) < x) i = mid + 1;
    else last = mid;
  }
  const x0 = xs[i] ?? 0;
  const x1 = xs[i + 1] ?? x0;
  const a = curve.values[i] ?? 0;
  const b = curve.values[i + 1] ?? a;
  return x1 === x0 ? a : a + ((x - x0) / (x1 - x0)) * (b - a);
}

/** Room kept clear on either side of a label placed among others, px. */
const LABEL_PAD = 4;

/** A box widened on both sides by `dx` (narrowed for negative `dx`). */
function pad(box: Box, dx = LABEL_PAD): Box {
  return { ...box, left: box.left - dx, right: box.right + dx };
}

/** Whether a curve passes through a box (pixels), judged at the box edges and every sweep point between. */
function crosses(box: Box, curve: DiagramCurve, diagram: CorrelationDiagram, chart: Chart): boolean {
  const xScale = chart.scales.x;
  const yScale = chart.scales.y;
  if (!xScale || !yScale) return false;
  const x0 = xScale.getValueForPixel(box.left) ?? 0;
  const x1 = xScale.getValueForPixel(box.right) ?? 0;
  const xs = [x0, ...diagram.deltaOverB.filter((x) => x > x0 && x < x1), x1];
  const ys = xs.map((x) => yScale.getPixelForValue(valueAt(diagram, curve, x)));
  // Inside at a sample point, or passing from above the box to below it between two.
  return ys.some(
    (y, i) =>
      (y > box.top && y < box.bottom) ||
      (i > 0 && Math.min(y, ys[i - 1] ?? y) <= box.top && Math.max(y, ys[i - 1] ?? y) >= box.bottom),
  );
}
