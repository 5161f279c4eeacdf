/**
 * The distortion diagram: every level of dⁿ (cm⁻¹ above the ground level) against a distortion
 * coordinate, spin-allowed levels strong and the others light, each curve labelled at its right
 * end with its state symbol in the point group of the path.
 */

import type { ChartConfiguration, Plugin } from 'chart.js';
import type { DistortionSweep } from '../src/analysis/distortionSweep.js';
import { drawKey, spinKey } from './key.js';
import { spreadLabels } from './labelLayout.js';
import { type FigureOptions, renderChart } from './render.js';
import { axisTitle, STYLE, TICKS } from './style.js';
import { chartContext, drawRuns, markupRuns, runsHeight, type TextRun, type TextStyle } from './typeset.js';

/** Room right of the plot for the curve labels, px. */
const LABEL_ROOM = 96;
/** Room above the plot for the title and the key, px. */
const HEADER = 64;

const LABEL: TextStyle = { size: STYLE.labelSize, color: STYLE.ink, halo: true };

/**
 * Runs of a state label of any point group: `3B1g(2)` → raised 3, B, lowered 1g, then (2);
 * `2E"` → raised 2, E, ″. Other text stays plain.
 */
export function groupStateRuns(label: string): TextRun[] {
  const m = /^(\d+)([ABET])(\d?)([gu]?)(['"]?)(\(\d+\))?$/.exec(label);
  if (!m) return [{ text: label, shift: 'base' }];
  const [, mult = '', letter = '', index = '', parity = '', prime = '', rank = ''] = m;
  const runs: TextRun[] = [
    { text: mult, shift: 'sup' },
    { text: letter, shift: 'base' },
  ];
  if (index + parity !== '') runs.push({ text: index + parity, shift: 'sub' });
  if (prime !== '') runs.push({ text: prime === "'" ? '′' : '″', shift: 'base' });
  if (rank !== '') runs.push({ text: rank, shift: 'base' });
  return runs;
}

/** A round top for the energy axis, on the 1-2-5 steps chart.js ticks use. */
function niceTop(x: number): number {
  const magnitude = 10 ** Math.floor(Math.log10(x));
  const step = [1, 2, 5, 10].map((f) => f * magnitude).find((s) => x / s <= 8) ?? 10 * magnitude;
  return Math.ceil(x / step) * step;
}

/** The chart.js configuration of a distortion diagram, up to `eMax` cm⁻¹ (default: all levels). */
export function distortionChart(sweep: DistortionSweep, eMax?: number): ChartConfiguration {
  const highest = Math.max(1, ...sweep.curves.flatMap((c) => c.energies.filter(Number.isFinite)));
  const top = eMax ?? niceTop(highest * 1.02);
  const curves = [...sweep.curves].sort((a, b) => Number(a.spinAllowed) - Number(b.spinAllowed));
  const datasets = curves.map((c) => ({
    label: c.label,
    data: sweep.x.map((x, i) => ({ x, y: c.energies[i] ?? Number.NaN })),
    borderColor: c.spinAllowed ? STYLE.allowed : STYLE.forbidden,
    borderWidth: c.spinAllowed ? STYLE.allowedWidth : STYLE.forbiddenWidth,
    pointRadius: 0,
    showLine: true,
    fill: false,
  }));
  const tick = TICKS;
  const lo = Math.min(sweep.x[0] ?? 0, sweep.x[sweep.x.length - 1] ?? 1);
  const hi = Math.max(sweep.x[0] ?? 0, sweep.x[sweep.x.length - 1] ?? 1);
  return {
    type: 'scatter',
    data: { datasets },
    options: {
      layout: { padding: { top: HEADER, right: LABEL_ROOM, left: 12, bottom: 8 } },
      plugins: { legend: { display: false }, tooltip: { enabled: false }, title: { display: false } },
      scales: {
        x: {
          type: 'linear',
          min: lo,
          max: hi,
          reverse: (sweep.x[0] ?? 0) > (sweep.x[sweep.x.length - 1] ?? 0),
          title: axisTitle(sweep.coordinate),
          ticks: tick,
          grid: { display: false },
          border: { color: STYLE.ink },
        },
        y: {
          type: 'linear',
          min: 0,
          max: top,
          title: axisTitle('E / cm⁻¹'),
          ticks: tick,
          grid: { display: false },
          border: { color: STYLE.ink },
        },
      },
    },
    plugins: [curveLabels(sweep, top)],
  };
}

/** Title, key and the labels at the curves' right ends. */
function curveLabels(sweep: DistortionSweep, top: number): Plugin {
  return {
    id: 'termsplitDistortionLabels',
    afterDraw(chart) {
      const ctx = chartContext(chart);
      const area = chart.chartArea;
      const y = chart.scales.y;
      if (!y) return;
      const last = sweep.x.length - 1;
      const shown = sweep.curves.filter((c) => {
        const e = c.energies[last] ?? Number.NaN;
        return Number.isFinite(e) && e <= top;
      });
      const targets = shown.map((c) => y.getPixelForValue(c.energies[last] ?? 0));
      const places = spreadLabels(targets, runsHeight(LABEL), area.top, area.bottom);
      shown.forEach((c, i) => {
        const style = { ...LABEL, color: c.spinAllowed ? STYLE.ink : STYLE.forbiddenText };
        drawRuns(ctx, groupStateRuns(c.label), area.right + 8, places[i] ?? 0, style);
      });
      const racah =
        sweep.n === 1 || sweep.n === 9 ? '' : `, B = ${Math.round(sweep.B)}, C = ${Math.round(sweep.C)} cm⁻¹`;
      const title = `d^${sweep.n} along a distortion (${sweep.group})${racah}`;
      drawRuns(ctx, markupRuns(title), area.left, 22, { size: STYLE.titleSize, color: STYLE.ink });
      drawKey(
        ctx,
        spinKey(
          [STYLE.allowed],
          sweep.curves.some((c) => !c.spinAllowed),
        ),
        area.right,
        48,
      );
    },
  };
}

/** The bytes of a distortion diagram (PNG, SVG or PDF). */
export function renderDistortionDiagram(
  sweep: DistortionSweep,
  figure: FigureOptions,
  eMax?: number,
): Buffer {
  return renderChart(distortionChart(sweep, eMax), {
    title: `d${sweep.n} distortion diagram (${sweep.group})`,
    ...figure,
  });
}
