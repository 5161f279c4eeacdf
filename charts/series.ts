/**
 * Trends across a series of samples: 10Dq or β of each sample, with ±1 standard-error bars,
 * samples grouped by ion (one colour each) and ordered within a group by 10Dq, so that a reader
 * sees the spectrochemical and nephelauxetic orders of the series at a glance.
 */

import type { ChartConfiguration, Plugin } from 'chart.js';
import { unicodeIon } from '../src/field/labels.js';
import type { SeriesEntry } from '../src/index.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE } from './style.js';

/** The quantity a trend figure shows. */
export type TrendQuantity = 'tenDq' | 'beta';

const ION_COLOURS = ['#1d4e89', '#a4431c', '#1b8a5a', '#7a3e9d', '#8a6d1b', '#2a7f8f'];

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
  return ION_COLOURS[k % ION_COLOURS.length] ?? STYLE.ink;
}

/** One dataset per ion, with a value at that ion's samples and gaps elsewhere. */
function trendDatasets(entries: readonly SeriesEntry[], quantity: TrendQuantity, ions: readonly string[]) {
  return ions.map((key, k) => {
    const colour = ionColour(k);
    const [ion = '', geometry = ''] = key.split('/');
    return {
      label: `${unicodeIon(ion)}${geometry === 'tet' ? ' (Td)' : ''}`,
      data: entries.map((e) => (ionKey(e) === key ? trendValue(e, quantity) : null)),
      borderColor: colour,
      backgroundColor: colour,
      pointRadius: 6,
      pointHoverRadius: 6,
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
    ticks: { font: { size: STYLE.tickSize } },
    grid: { display: false },
  };
}

/** The chart.js configuration of a trend figure over `entries` in the order given. */
export function trendChart(entries: readonly SeriesEntry[], quantity: TrendQuantity): ChartConfiguration {
  const ions = [...new Set(entries.map(ionKey))];
  return {
    type: 'line',
    data: { labels: entries.map((e) => e.name), datasets: trendDatasets(entries, quantity, ions) },
    options: {
      layout: { padding: { left: 8, right: 24, top: 8, bottom: 8 } },
      plugins: {
        title: {
          display: true,
          text: TITLES[quantity].title,
          font: { size: STYLE.titleSize, weight: 'bold' },
        },
        legend: {
          display: true,
          position: 'bottom',
          labels: { font: { size: STYLE.labelSize }, usePointStyle: true },
        },
        tooltip: { enabled: false },
      },
      scales: {
        x: {
          type: 'category',
          offset: true,
          ticks: { font: { size: STYLE.tickSize }, maxRotation: 30, minRotation: 0, autoSkip: false },
          grid: { display: false },
        },
        y: trendYAxis(entries, quantity),
      },
    },
    plugins: [errorBarsPlugin(entries, quantity, ions)],
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
