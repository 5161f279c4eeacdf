/**
 * A sample on a correlation diagram: a vertical line at its Δ/B and its observed band energies,
 * divided by its B, as points on that line, so a reader sees which curves they fall on. Works
 * on any chart whose x axis is Δ/B and y axis E/B (the diagram of charts/diagram.ts).
 */

import type { ChartConfiguration, ChartDataset, Plugin } from 'chart.js';
import { ensure } from '../src/core/errors.js';
import { STYLE } from './style.js';
import { chartContext, drawRuns, runsHeight, type TextStyle } from './typeset.js';

/** A sample to mark. Energies in cm⁻¹. */
export interface SampleMark {
  /** The sample's Dq (Δ = 10Dq). */
  readonly dq: number;
  /** The sample's Racah B. */
  readonly B: number;
  /** Observed band maxima, each drawn at E/B = band/B. @default [] */
  readonly bands?: readonly number[];
  /** Caption beside the line. @default 'sample' */
  readonly label?: string;
}

/** Caption of a sample unless given. */
export const DEFAULT_SAMPLE_LABEL = 'sample';

/** Where a sample sits in diagram units. */
export interface SamplePosition {
  /** Δ/B = 10Dq/B. */
  readonly deltaOverB: number;
  /** Each band's E/B. */
  readonly bandsOverB: readonly number[];
}

/**
 * The diagram coordinates of a sample.
 * @throws InputError for a non-positive or non-finite Dq or B, or a band that is not a positive number.
 */
export function samplePosition(mark: SampleMark): SamplePosition {
  ensure(
    Number.isFinite(mark.dq) && mark.dq > 0,
    `sample Dq = ${mark.dq}: expected a positive number of cm⁻¹`,
  );
  ensure(Number.isFinite(mark.B) && mark.B > 0, `sample B = ${mark.B}: expected a positive number of cm⁻¹`);
  const bands = mark.bands ?? [];
  for (const b of bands) ensure(Number.isFinite(b) && b > 0, `band ${b}: expected a positive number of cm⁻¹`);
  return { deltaOverB: (10 * mark.dq) / mark.B, bandsOverB: bands.map((b) => b / mark.B) };
}

/** Where the sample's caption must keep clear of. */
export interface SampleOverlayOptions {
  /** Δ/B of other vertical lines (the crossovers): the caption goes on a side without one. @default [] */
  readonly clearOf?: readonly number[];
}

/** Headroom above the highest band when the E/B axis must grow to show it. */
const BAND_HEADROOM = 1.08;

/**
 * A copy of a Δ/B–E/B chart configuration with the sample drawn on it: a dashed vertical line
 * at its Δ/B with a caption along it, and the bands as points on the line. The E/B axis is
 * raised where a band lies above its top.
 * @throws InputError when the sample's Δ/B lies outside the chart's Δ/B axis, or for a bad mark
 * (see {@link samplePosition}).
 */
export function withSample(
  config: ChartConfiguration,
  mark: SampleMark,
  options: SampleOverlayOptions = {},
): ChartConfiguration {
  const { deltaOverB, bandsOverB } = samplePosition(mark);
  const scales = config.options?.scales ?? {};
  const xMin = Number(scales.x?.min ?? 0);
  const xMax = Number(scales.x?.max ?? Number.POSITIVE_INFINITY);
  ensure(
    deltaOverB <= xMax,
    `the sample's Δ/B = 10Dq/B = ${deltaOverB.toFixed(2)} lies beyond the diagram's largest Δ/B ${xMax}: draw the diagram to a larger Δ/B`,
  );
  ensure(
    deltaOverB >= xMin,
    `the sample's Δ/B = 10Dq/B = ${deltaOverB.toFixed(2)} lies below the Δ/B range drawn, which starts at ${xMin}`,
  );
  const yMax = Number(scales.y?.max ?? 0);
  const highest = Math.max(0, ...bandsOverB);
  const y = highest > yMax ? { ...scales.y, max: Math.ceil((highest * BAND_HEADROOM) / 5) * 5 } : scales.y;
  const points: ChartDataset<'scatter'> = {
    label: mark.label ?? DEFAULT_SAMPLE_LABEL,
    data: bandsOverB.map((e) => ({ x: deltaOverB, y: e })),
    showLine: false,
    pointRadius: 6,
    pointHoverRadius: 6,
    pointStyle: 'rectRot',
    backgroundColor: '#ffffff',
    borderColor: STYLE.sample,
    borderWidth: 2,
    order: -10,
  };
  return {
    ...config,
    data: { ...config.data, datasets: [...config.data.datasets, points as ChartDataset] },
    options: { ...config.options, scales: { ...scales, ...(y ? { y } : {}) } },
    plugins: [
      ...(config.plugins ?? []),
      sampleLine(deltaOverB, mark.label ?? DEFAULT_SAMPLE_LABEL, options.clearOf ?? []),
    ],
  };
}

/** Gap between the sample's line and its caption, px. */
const CAPTION_GAP = 9;

/**
 * The vertical line, under the curves (so it never hides them), and its caption over them,
 * upright beside the line: left of it unless another vertical line (a crossover) or the plot's
 * edge lies there, then right of it.
 */
function sampleLine(deltaOverB: number, label: string, clearOf: readonly number[]): Plugin {
  const at = (chart: Parameters<NonNullable<Plugin['afterDatasetsDraw']>>[0]) =>
    chart.scales.x?.getPixelForValue(deltaOverB) ?? 0;
  const style: TextStyle = { size: STYLE.smallSize, color: STYLE.sample, bold: true, halo: true };
  return {
    id: 'termsplitSampleLine',
    beforeDatasetsDraw(chart) {
      const ctx = chartContext(chart);
      const { top, bottom } = chart.chartArea;
      const x = at(chart);
      ctx.save();
      ctx.strokeStyle = STYLE.sample;
      ctx.lineWidth = STYLE.markWidth + 0.4;
      ctx.setLineDash([...STYLE.sampleDash]);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, bottom);
      ctx.stroke();
      ctx.restore();
    },
    afterDatasetsDraw(chart) {
      const ctx = chartContext(chart);
      const x = at(chart);
      const h = runsHeight(style);
      const { left, right } = chart.chartArea;
      const lines = clearOf.map((d) => chart.scales.x?.getPixelForValue(d) ?? Number.NaN);
      const free = (mid: number) =>
        mid - h / 2 > left && mid + h / 2 < right && lines.every((l) => Math.abs(l - mid) > h / 2 + 3);
      const mid = [x - CAPTION_GAP - h / 2, x + CAPTION_GAP + h / 2].find(free) ?? x - CAPTION_GAP - h / 2;
      ctx.save();
      ctx.translate(mid, chart.chartArea.bottom - 8);
      ctx.rotate(-Math.PI / 2);
      drawRuns(ctx, [{ text: `${label}, Δ/B = ${deltaOverB.toFixed(1)}`, shift: 'base' }], 0, 0, style);
      ctx.restore();
    },
  };
}
