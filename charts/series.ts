/**
 * Trends across a series of samples: 10Dq or β of each sample, with ±1 standard-error bars,
 * samples grouped by ion (one colour each) and ordered within a group by 10Dq, so that a reader
 * sees the spectrochemical and nephelauxetic orders of the series at a glance.
 */

import type { ChartConfiguration, Plugin, PointStyle } from 'chart.js';
import { drawPoint } from 'chart.js/helpers';
import type { SeriesEntry } from '../src/sheets/series.js';
import { groupedNumber } from './numbers.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE } from './style.js';
import {
  chartContext,
  drawFrame,
  drawRuns,
  formulaRuns,
  ionMarkup,
  markupRuns,
  measureRuns,
  type TextRun,
  type TextStyle,
} from './typeset.js';

/** The quantity a trend figure shows. */
export type TrendQuantity = 'tenDq' | 'beta';

const TITLES: Record<TrendQuantity, { title: string; axis: string }> = {
  tenDq: { title: '10Dq (Δ) across the series', axis: '10Dq / cm⁻¹' },
  beta: { title: 'Nephelauxetic ratio β = B/B(free ion) across the series', axis: 'β' },
};

function trendValue(e: SeriesEntry, q: TrendQuantity): number | null {
  return q === 'tenDq' ? e.tenDq : e.beta;
}

function errorOf(e: SeriesEntry, q: TrendQuantity): number | null {
  return q === 'tenDq' ? e.errors.tenDq : e.errors.beta;
}

/** Key of an ion in a given geometry: one colour and one legend entry each. */
function ionKey(e: SeriesEntry): string {
  return `${e.ion}/${e.geometry}`;
}

function ionColour(k: number): string {
  return STYLE.groups[k % STYLE.groups.length] ?? STYLE.ink;
}

function ionMarker(k: number): PointStyle {
  return STYLE.markers[k % STYLE.markers.length] ?? 'circle';
}

/** The name of an ion group in a key: Ni²⁺ typeset, "(T_d)" for tetrahedral. */
function ionRuns(key: string): TextRun[] {
  const [ion = '', geometry = ''] = key.split('/');
  return markupRuns(`${ionMarkup(ion)}${geometry === 'tet' ? ' (T_d)' : ''}`);
}

/** One dataset per ion, with a value at that ion's samples and gaps elsewhere. */
function trendDatasets(entries: readonly SeriesEntry[], quantity: TrendQuantity, ions: readonly string[]) {
  return ions.map((key, k) => {
    const colour = ionColour(k);
    return {
      label: key,
      data: entries.map((e) => (ionKey(e) === key ? trendValue(e, quantity) : null)),
      borderColor: colour,
      backgroundColor: colour,
      pointStyle: ionMarker(k),
      pointRadius: 6.5,
      pointHoverRadius: 6.5,
      showLine: false,
    };
  });
}

/** ±1 standard-error bars with end caps, in each ion's colour. */
function errorBarsPlugin(
  entries: readonly SeriesEntry[],
  quantity: TrendQuantity,
  ions: readonly string[],
): Plugin {
  return {
    id: 'termsplitErrorBars',
    afterDatasetsDraw(chart) {
      const { ctx, scales } = chart;
      ctx.save();
      ctx.lineWidth = 1.6;
      entries.forEach((e, i) => {
        const v = trendValue(e, quantity);
        const s = errorOf(e, quantity);
        if (v === null || s === null || !(s > 0)) return;
        const x = scales.x?.getPixelForValue(i) ?? 0;
        const y0 = scales.y?.getPixelForValue(v - s) ?? 0;
        const y1 = scales.y?.getPixelForValue(v + s) ?? 0;
        ctx.strokeStyle = ionColour(ions.indexOf(ionKey(e)));
        ctx.beginPath();
        ctx.moveTo(x, y0);
        ctx.lineTo(x, y1);
        ctx.moveTo(x - 6, y0);
        ctx.lineTo(x + 6, y0);
        ctx.moveTo(x - 6, y1);
        ctx.lineTo(x + 6, y1);
        ctx.stroke();
      });
      ctx.restore();
    },
  };
}

/** The y axis: 10Dq from zero, so that ratios read off the figure; β around its values, which lie near 1. */
function trendYAxis(entries: readonly SeriesEntry[], quantity: TrendQuantity) {
  const values = entries.flatMap((e) => {
    const v = trendValue(e, quantity);
    const s = errorOf(e, quantity) ?? 0;
    return v === null ? [] : [v - s, v + s];
  });
  const lo = quantity === 'tenDq' ? 0 : Math.min(...values);
  const hi = Math.max(...values);
  const pad = (hi - lo) * 0.1 || Math.abs(hi) * 0.05 || 1;
  return {
    ...(quantity === 'tenDq' ? { min: 0 } : { suggestedMin: lo - pad }),
    suggestedMax: hi + pad,
    title: { display: true, text: TITLES[quantity].axis, font: { size: STYLE.axisTitleSize } },
    ticks: {
      font: { size: STYLE.tickSize },
      callback: (v: string | number) =>
        quantity === 'tenDq' ? groupedNumber(Number(v)) : Number(v).toFixed(2).replace('-', '\u2212'),
    },
    grid: { display: false },
    border: { color: STYLE.ink },
  };
}

/** Room under the plot for the sample names, px. */
const NAME_ROOM = 64;

/**
 * The frame, the sample names under the plot typeset as formulae ([Ni(ors)₆]⁴⁻), level where
 * they fit and slanted where they do not, and the key of ions: marker shape, colour, typeset name.
 */
function namesAndKey(entries: readonly SeriesEntry[], ions: readonly string[]): Plugin {
  return {
    id: 'termsplitSeriesNames',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      const area = chart.chartArea;
      drawFrame(ctx, area);
      const style: TextStyle = { size: STYLE.tickSize, color: STYLE.ink };
      const names = entries.map((e) => formulaRuns(e.name));
      const widths = names.map((runs) => measureRuns(ctx, runs, style));
      const spacing = (area.right - area.left) / Math.max(1, entries.length);
      const slanted = Math.max(...widths) > spacing - 8;
      names.forEach((runs, i) => {
        const x = chart.scales.x?.getPixelForValue(i) ?? 0;
        if (!slanted) {
          drawRuns(ctx, runs, x, area.bottom + 16, style, 'center');
          return;
        }
        ctx.save();
        ctx.translate(x + 4, area.bottom + 10);
        ctx.rotate(-Math.PI / 6);
        drawRuns(ctx, runs, 0, 0, style, 'right');
        ctx.restore();
      });
      drawIonKey(ctx, ions, area.right, chart.height - 14);
    },
  };
}

/** The key of ion groups, ending at `right`: marker, then the ion's name, for each. */
function drawIonKey(
  ctx: ReturnType<typeof chartContext>,
  ions: readonly string[],
  right: number,
  y: number,
): void {
  const style: TextStyle = { size: STYLE.labelSize, color: STYLE.ink };
  let x = right;
  for (let k = ions.length - 1; k >= 0; k--) {
    const runs = ionRuns(ions[k] ?? '');
    x -= measureRuns(ctx, runs, style);
    drawRuns(ctx, runs, x, y, style);
    x -= 14;
    ctx.save();
    ctx.fillStyle = ionColour(k);
    ctx.strokeStyle = ionColour(k);
    ctx.lineWidth = 1;
    drawPoint(
      ctx as unknown as Parameters<typeof drawPoint>[0],
      { pointStyle: ionMarker(k), radius: 6, borderWidth: 1, rotation: 0 },
      x,
      y,
    );
    ctx.restore();
    x -= 24;
  }
}

/** The chart.js configuration of a trend figure over `entries` in the order given. */
export function trendChart(entries: readonly SeriesEntry[], quantity: TrendQuantity): ChartConfiguration {
  const ions = [...new Set(entries.map(ionKey))];
  return {
    type: 'line',
    data: { labels: entries.map((e) => e.name), datasets: trendDatasets(entries, quantity, ions) },
    options: {
      layout: { padding: { left: 8, right: 24, top: 8, bottom: NAME_ROOM + 26 } },
      plugins: {
        title: {
          display: true,
          text: TITLES[quantity].title,
          font: { size: STYLE.titleSize, weight: 'bold' },
          color: STYLE.ink,
        },
        legend: { display: false },
        tooltip: { enabled: false },
      },
      scales: {
        x: {
          type: 'category',
          offset: true,
          // The sample names are typeset as formulae by the plugin below.
          ticks: { display: false },
          grid: { display: false },
          border: { color: STYLE.ink },
        },
        y: trendYAxis(entries, quantity),
      },
    },
    plugins: [errorBarsPlugin(entries, quantity, ions), namesAndKey(entries, ions)],
  };
}

/** Renders a trend figure. */
export function renderTrend(
  entries: readonly SeriesEntry[],
  quantity: TrendQuantity,
  figure: FigureOptions,
): Buffer {
  return renderChart(trendChart(entries, quantity), {
    width: 900,
    height: 520,
    title: TITLES[quantity].title,
    ...figure,
  });
}
