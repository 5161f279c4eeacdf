import type { SKRSContext2D } from '@napi-rs/canvas';
import type { Chart, ChartConfiguration, ChartDataset, Plugin } from 'chart.js';
import { ensure } from '../src/errors.js';
import { type CorrelationDiagram, type DiagramCurve, halfIntegerText } from '../src/index.js';
import { drawKey, spinKey } from './key.js';
import { type Box, freeSpot, nearShifts, overlaps, spreadLabels } from './labelLayout.js';
import { type FigureOptions, renderChart } from './render.js';
import { type SampleMark, withSample } from './sampleOverlay.js';
import { STYLE } from './style.js';
import {
  chartContext,
  drawRuns,
  markupRuns,
  measureRuns,
  runsHeight,
  stateRuns,
  type TextRun,
  type TextStyle,
  termRuns,
} from './typeset.js';

/**
 * The correlation (Tanabe–Sugano-style) diagram as a figure: E/B of every level against Δ/B,
 * each curve labelled in the figure with its ²ˢ⁺¹Γ (no legend box), spin-allowed curves strong
 * and spin-forbidden ones light, free-ion terms named where the curves start, and each change of
 * ground state marked with the high-spin and low-spin sides named.
 */

/** Options of {@link diagramChart}. */
export interface DiagramChartOptions {
  /**
   * Top of the E/B axis.
   * @default the highest curve, but at most DEFAULT_E_SPAN × the largest Δ/B, rounded up
   */
  readonly eMax?: number;
  /** A sample to mark on the diagram (see {@link withSample}). */
  readonly sample?: SampleMark;
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

/** Room right of the plot for the curve labels, px. */
const LABEL_COLUMN = 108;
/** Room above the plot for the title and the strip naming the spin regions, px. */
const HEADER = 66;
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

function allowedIn(diagram: CorrelationDiagram, curve: DiagramCurve, r: number): boolean {
  return diagram.regions[r]?.S === curve.S;
}

/**
 * The chart.js configuration of a correlation diagram (type `scatter` with lines, x = Δ/B,
 * y = E/B), with the in-figure labels as a plugin and the sample, if given, drawn on it.
 * @throws InputError for a non-positive `eMax`, or a sample that does not fit (see {@link withSample}).
 */
export function diagramChart(
  diagram: CorrelationDiagram,
  options: DiagramChartOptions = {},
): ChartConfiguration {
  const eMax = options.eMax ?? automaticEMax(diagram);
  ensure(Number.isFinite(eMax) && eMax > 0, `top of the E/B axis ${eMax}: expected a positive number`);
  const xs = diagram.deltaOverB;
  // Segment i runs from point i to i + 1; its style follows the spin region of its middle.
  const segmentRegion = xs.slice(1).map((x, i) => regionIndex(diagram, ((xs[i] ?? 0) + x) / 2));
  const everAllowed = (c: DiagramCurve) => diagram.regions.some((_, r) => allowedIn(diagram, c, r));
  // chart.js draws the first dataset on top: the spin-allowed curves go first.
  const curves = [...diagram.curves].sort((a, b) => Number(everAllowed(b)) - Number(everAllowed(a)));
  const datasets = curves.map((curve) => {
    const style = (i: number) => {
      const r = segmentRegion[i] ?? 0;
      return allowedIn(diagram, curve, r)
        ? { color: regionColor(diagram, r), width: STYLE.allowedWidth }
        : { color: STYLE.forbidden, width: STYLE.forbiddenWidth };
    };
    return {
      label: curve.label,
      data: xs.map((x, i) => ({ x, y: curve.values[i] ?? Number.NaN })),
      showLine: true,
      pointRadius: 0,
      pointHoverRadius: 0,
      borderColor: style(0).color,
      borderWidth: style(0).width,
      borderCapStyle: 'round',
      borderJoinStyle: 'round',
      tension: 0,
      segment: {
        borderColor: (ctx: { p0DataIndex: number }) => style(ctx.p0DataIndex).color,
        borderWidth: (ctx: { p0DataIndex: number }) => style(ctx.p0DataIndex).width,
      },
    } as ChartDataset<'scatter'>;
  });
  const tick = { font: { size: STYLE.tickSize }, color: STYLE.ink };
  const axisTitle = (text: string) => ({
    display: true,
    text,
    font: { size: STYLE.axisTitleSize },
    color: STYLE.ink,
  });
  const config: ChartConfiguration = {
    type: 'scatter',
    data: { datasets: datasets as ChartDataset[] },
    options: {
      parsing: false,
      normalized: true,
      layout: { padding: { top: HEADER, right: LABEL_COLUMN, left: 12, bottom: 6 } },
      plugins: { legend: { display: false }, tooltip: { enabled: false }, title: { display: false } },
      scales: {
        x: {
          type: 'linear',
          min: 0,
          max: diagram.maxDeltaOverB,
          title: axisTitle('Δ/B'),
          ticks: { ...tick, ...(diagram.maxDeltaOverB <= 60 ? { stepSize: 5 } : {}) },
          grid: { color: STYLE.grid },
          border: { color: STYLE.ink },
        },
        y: {
          type: 'linear',
          min: 0,
          max: eMax,
          title: axisTitle('E/B'),
          ticks: { ...tick, ...(eMax <= 120 ? { stepSize: 10 } : {}) },
          grid: { color: STYLE.grid },
          border: { color: STYLE.ink },
        },
      },
    },
    plugins: [regionBackdrop(diagram), diagramLabels(diagram, options.onLabels)],
  };
  return options.sample ? withSample(config, options.sample) : config;
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
  return renderChart(diagramChart(diagram, options), { title: diagramTitleText(diagram), ...figure });
}

const GEOMETRY_NAME = { oct: 'an octahedral (O_h)', tet: 'a tetrahedral (T_d)' } as const;

/** The figure title in the `^`/`_` markup of {@link markupRuns}. */
function diagramTitleMarkup(diagram: CorrelationDiagram): string {
  return `d^${diagram.n} in ${GEOMETRY_NAME[diagram.geometry]} field, C/B = ${diagram.cOverB.toFixed(2)}`;
}

/** The figure title as plain text (the PDF document title). */
export function diagramTitleText(diagram: CorrelationDiagram): string {
  return diagramTitleMarkup(diagram).replace(/[\^_]/g, '');
}

/** A faint tint over the low-spin side(s), and the dashed lines at each change of ground state, under the curves. */
function regionBackdrop(diagram: CorrelationDiagram): Plugin {
  return {
    id: 'termsplitRegions',
    beforeDatasetsDraw(chart) {
      const ctx = chartContext(chart);
      const { top, bottom } = chart.chartArea;
      const px = (x: number) => chart.scales.x?.getPixelForValue(x) ?? 0;
      ctx.save();
      diagram.regions.forEach((region, r) => {
        if (regionColor(diagram, r) !== STYLE.allowedLowSpin) return;
        ctx.fillStyle = 'rgba(164, 67, 28, 0.045)';
        ctx.fillRect(
          px(region.fromDeltaOverB),
          top,
          px(region.toDeltaOverB) - px(region.fromDeltaOverB),
          bottom - top,
        );
      });
      ctx.strokeStyle = STYLE.crossover;
      ctx.lineWidth = 1.2;
      ctx.setLineDash([5, 4]);
      for (const c of diagram.crossings) {
        ctx.beginPath();
        ctx.moveTo(px(c.deltaOverB), top);
        ctx.lineTo(px(c.deltaOverB), bottom);
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
}

/** Everything drawn over the plot: frame, title, region names, and the labels of curves and terms. */
function diagramLabels(
  diagram: CorrelationDiagram,
  onLabels: ((labels: readonly DiagramLabel[]) => void) | undefined,
): Plugin {
  return {
    id: 'termsplitDiagramLabels',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      const area = chart.chartArea;
      ctx.save();
      ctx.strokeStyle = STYLE.ink;
      ctx.lineWidth = 1;
      ctx.strokeRect(area.left, area.top, area.right - area.left, area.bottom - area.top);
      ctx.restore();
      drawHeader(ctx, chart, diagram);
      const placed = layoutLabels(ctx, chart, diagram);
      for (const p of placed) {
        if (p.leaderFrom) {
          ctx.save();
          ctx.strokeStyle = p.style.color;
          ctx.globalAlpha = 0.7;
          ctx.lineWidth = 0.7;
          ctx.beginPath();
          ctx.moveTo(p.leaderFrom.x, p.leaderFrom.y);
          ctx.lineTo(p.box.left - 3, (p.box.top + p.box.bottom) / 2);
          ctx.stroke();
          ctx.restore();
        }
        drawRuns(ctx, p.runs, p.box.left, (p.box.top + p.box.bottom) / 2, p.style);
      }
      const colors = diagram.regions.length > 1 ? [STYLE.allowed, STYLE.allowedLowSpin] : [STYLE.allowed];
      drawKey(ctx, spinKey(colors), chart.chartArea.right, chart.height - 16);
      onLabels?.(placed.map((p) => ({ text: p.text, kind: p.kind, box: p.box })));
    },
  };
}

/** The title, and the strip under it naming the spin regions and the Δ/B of each crossover. */
function drawHeader(ctx: SKRSContext2D, chart: Chart, diagram: CorrelationDiagram): void {
  const area = chart.chartArea;
  const px = (x: number) => chart.scales.x?.getPixelForValue(x) ?? 0;
  const title: TextStyle = { size: STYLE.titleSize, color: STYLE.ink, bold: true };
  drawRuns(ctx, markupRuns(diagramTitleMarkup(diagram)), (area.left + area.right) / 2, 18, title, 'center');
  if (diagram.crossings.length === 0) return;
  const y = area.top - 14;
  const strip: TextStyle = { size: STYLE.smallSize, color: STYLE.crossover };
  const taken: Box[] = [];
  for (const c of diagram.crossings) {
    const runs = markupRuns(`Δ/B = ${c.deltaOverB.toFixed(2)}`);
    const w = measureRuns(ctx, runs, strip);
    drawRuns(ctx, runs, px(c.deltaOverB), y, strip, 'center');
    taken.push({
      left: px(c.deltaOverB) - w / 2 - 14,
      right: px(c.deltaOverB) + w / 2 + 14,
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
    const lo = px(region.fromDeltaOverB);
    const hi = px(region.toDeltaOverB);
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

/**
 * Positions of every label: curve ends in the column right of the plot (all spin-allowed
 * curves, spread apart with leader lines; others only where there is room), curves leaving
 * through the top while spin-allowed, the ground state of each region but the last, and the
 * free-ion terms at Δ/B = 0.
 */
function layoutLabels(ctx: SKRSContext2D, chart: Chart, diagram: CorrelationDiagram): Placed[] {
  const area = chart.chartArea;
  const xScale = chart.scales.x;
  const yScale = chart.scales.y;
  if (!xScale || !yScale) return [];
  const eMax = yScale.max;
  const h = runsHeight(LABEL);
  const last = diagram.deltaOverB.length - 1;
  const lastRegion = diagram.regions.length - 1;
  const out: Placed[] = [];
  const taken: Box[] = [];
  const labelled = new Set<string>();
  const boxAt = (left: number, cy: number, w: number): Box => ({
    left,
    right: left + w,
    top: cy - h / 2,
    bottom: cy + h / 2,
  });
  const curveStyle = (curve: DiagramCurve, r: number): TextStyle =>
    allowedIn(diagram, curve, r)
      ? { ...LABEL, color: regionColor(diagram, r) }
      : diagram.regions.some((_, k) => allowedIn(diagram, curve, k))
        ? {
            ...LABEL,
            color: regionColor(
              diagram,
              diagram.regions.findIndex((_, k) => allowedIn(diagram, curve, k)),
            ),
          }
        : { ...LABEL, color: STYLE.forbiddenText };
  const everAllowed = (c: DiagramCurve) => diagram.regions.some((_, r) => allowedIn(diagram, c, r));

  // Right-hand column.
  const ends = diagram.curves
    .map((curve) => ({ curve, value: curve.values[last] ?? Number.NaN }))
    .filter((e) => e.value >= 0 && e.value <= eMax);
  const must = ends.filter((e) => everAllowed(e.curve));
  const columnLeft = area.right + LEADER;
  const targets = must.map((e) => yScale.getPixelForValue(e.value));
  const spread = spreadLabels(targets, h + 1, area.top - 4, area.bottom + 8);
  must.forEach((e, i) => {
    const runs = stateRuns(e.curve.label);
    const style = curveStyle(e.curve, lastRegion);
    const cy = spread[i] ?? 0;
    const box = boxAt(columnLeft, cy, measureRuns(ctx, runs, style));
    taken.push(box);
    labelled.add(e.curve.label);
    const target = targets[i] ?? 0;
    out.push({
      text: e.curve.label,
      kind: 'end',
      runs,
      style,
      box,
      ...(Math.abs(cy - target) > 1.5 ? { leaderFrom: { x: area.right + 2, y: target } } : {}),
    });
  });

  // The ground state of each region but the last, on the zero line.
  diagram.regions.slice(0, -1).forEach((region, r) => {
    const runs = stateRuns(region.ground);
    const style = { ...LABEL, color: regionColor(diagram, r), halo: true };
    const w = measureRuns(ctx, runs, style);
    const mid = xScale.getPixelForValue((region.fromDeltaOverB + region.toDeltaOverB) / 2);
    const box = boxAt(mid - w / 2, area.bottom - h / 2 - 3, w);
    taken.push(box);
    out.push({ text: region.ground, kind: 'ground', runs, style, box });
  });

  // Spin-allowed curves that leave through the top: named just inside, beside the exit.
  const inside: Box = { left: area.left, right: area.right, top: area.top, bottom: area.bottom };
  const exits = diagram.curves
    .map((curve) => ({ curve, x: topExit(diagram, curve, eMax) }))
    .filter((e): e is { curve: DiagramCurve; x: number } => e.x !== undefined)
    .filter((e) => allowedIn(diagram, e.curve, regionIndex(diagram, e.x)))
    .sort((a, b) => a.x - b.x);
  for (const e of exits) {
    const runs = stateRuns(e.curve.label);
    const style = { ...curveStyle(e.curve, regionIndex(diagram, e.x)), halo: true };
    const w = measureRuns(ctx, runs, style);
    const px = xScale.getPixelForValue(e.x);
    const left = px + 4 + w <= area.right - 2 ? px + 4 : px - 4 - w;
    const spot = freeSpot(boxAt(left, area.top + h / 2 + 2, w), taken, [0], inside);
    if (!spot) continue;
    taken.push(spot);
    labelled.add(e.curve.label);
    out.push({ text: e.curve.label, kind: 'exit', runs, style, box: spot });
  }

  // Curves spin-allowed before a crossover and still without a label: named beside the curve
  // there. (In the last region the ends and exits carry the labels; a curve lost in the bundle
  // that leaves through the top is better unnamed than named ambiguously.)
  for (const curve of diagram.curves) {
    if (labelled.has(curve.label)) continue;
    diagram.regions.slice(0, -1).forEach((region, r) => {
      if (labelled.has(curve.label) || !allowedIn(diagram, curve, r)) return;
      const runs = stateRuns(curve.label);
      const style = { ...curveStyle(curve, r), halo: true };
      const w = measureRuns(ctx, runs, style);
      for (const f of [0.55, 0.7, 0.4, 0.85, 0.25]) {
        const x = region.fromDeltaOverB + f * (region.toDeltaOverB - region.fromDeltaOverB);
        const y = valueAt(diagram, curve, x);
        const y2 = valueAt(diagram, curve, x + 1e-3 * diagram.maxDeltaOverB);
        if (!(y > 0.03 * eMax && y < 0.95 * eMax)) continue;
        const px = xScale.getPixelForValue(x);
        const py = yScale.getPixelForValue(y);
        // Above the curve on the side where it is lower, so the label does not sit on it.
        const left = y2 >= y ? px - 3 - w : px + 3;
        const spot = freeSpot(boxAt(left, py - 3 - h / 2, w), taken, [0], inside);
        if (!spot) continue;
        taken.push(spot);
        labelled.add(curve.label);
        out.push({ text: curve.label, kind: 'beside', runs, style, box: spot });
        return;
      }
    });
  }

  // Free-ion terms where the curves start, just inside the left edge, lowest spin-allowed first.
  const terms = new Map<string, { S: number; value: number }>();
  for (const c of diagram.curves)
    if (!terms.has(c.parent)) terms.set(c.parent, { S: c.S, value: c.values[0] ?? 0 });
  const groundS = diagram.regions[0]?.S;
  const termList = [...terms.entries()]
    .filter(([, t]) => t.value <= eMax)
    .sort((a, b) => Number(b[1].S === groundS) - Number(a[1].S === groundS) || a[1].value - b[1].value);
  for (const [name, t] of termList) {
    const runs = termRuns(name);
    const allowed = t.S === groundS;
    const style: TextStyle = {
      ...LABEL,
      color: allowed ? regionColor(diagram, 0) : STYLE.forbiddenText,
      halo: true,
    };
    const w = measureRuns(ctx, runs, style);
    const cy = Math.min(yScale.getPixelForValue(t.value) - h / 2, area.bottom - h / 2 - 2);
    const spot = freeSpot(boxAt(area.left + 5, cy, w), taken, nearShifts(h * 0.6, 2), inside);
    if (!spot) continue;
    taken.push(spot);
    out.push({ text: name, kind: 'term', runs, style, box: spot });
  }

  // Other curve ends in the column where a place is free near their end.
  const column: Box = { left: area.right, right: chart.width, top: area.top - 12, bottom: area.bottom + 12 };
  for (const e of ends.filter((x) => !everAllowed(x.curve)).sort((a, b) => a.value - b.value)) {
    const runs = stateRuns(e.curve.label);
    const style = curveStyle(e.curve, lastRegion);
    const target = yScale.getPixelForValue(e.value);
    const spot = freeSpot(
      boxAt(columnLeft, target, measureRuns(ctx, runs, style)),
      taken,
      nearShifts(h * 1.1),
      column,
    );
    if (!spot) continue;
    taken.push(spot);
    const cy = (spot.top + spot.bottom) / 2;
    out.push({
      text: e.curve.label,
      kind: 'end',
      runs,
      style,
      box: spot,
      ...(Math.abs(cy - target) > 1.5 ? { leaderFrom: { x: area.right + 2, y: target } } : {}),
    });
  }
  return out;
}

/** Δ/B where a curve that ends above the top of the axis last crosses it, or undefined if it is never below it. */
function topExit(diagram: CorrelationDiagram, curve: DiagramCurve, eMax: number): number | undefined {
  const xs = diagram.deltaOverB;
  const v = curve.values;
  const last = v.length - 1;
  if (!((v[last] ?? 0) > eMax)) return undefined;
  for (let i = last - 1; i >= 0; i--) {
    const a = v[i] ?? 0;
    if (a <= eMax) {
      const b = v[i + 1] ?? 0;
      const x0 = xs[i] ?? 0;
      const x1 = xs[i + 1] ?? 0;
      return x0 + ((eMax - a) / (b - a)) * (x1 - x0);
    }
  }
  return undefined;
}

/** A curve's E/B at Δ/B = x, by linear interpolation between the sweep's points. */
function valueAt(diagram: CorrelationDiagram, curve: DiagramCurve, x: number): number {
  const xs = diagram.deltaOverB;
  let i = 0;
  while (i + 2 < xs.length && (xs[i + 1] ?? 0) < x) i++;
  const x0 = xs[i] ?? 0;
  const x1 = xs[i + 1] ?? x0;
  const a = curve.values[i] ?? 0;
  const b = curve.values[i + 1] ?? a;
  return x1 === x0 ? a : a + ((x - x0) / (x1 - x0)) * (b - a);
}
