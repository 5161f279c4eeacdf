/**
 * The magnetism figure: μ_eff (left axis, μ_B) and χT (right axis, cm³ K mol⁻¹) against
 * temperature, computed from all states with spin–orbit coupling, with the spin-only moment of
 * the ground spin as a dashed line for comparison.
 */
import type { ChartConfiguration, ChartDataset } from 'chart.js';
import type { MomentPoint } from '../src/analysis/susceptibility.js';
import { type FigureOptions, renderChart } from './render.js';
import { STYLE, TICKS } from './style.js';

/** What the magnetism figure shows. */
export interface MomentFigureData {
  /** Plain-text title, e.g. `Co2+ d7, Oh: Dq = 930, B = 970, ζ = 533 cm⁻¹, k = 1`. */
  readonly title: string;
  readonly points: readonly MomentPoint[];
  /** The spin-only moment of the ground spin, μ_B; null where the ground has S = 0 or none is meant. */
  readonly spinOnly: number | null;
}

const CHI_T_COLOUR = '#a4431c';

/** The chart.js configuration of the magnetism figure. */
export function momentChart(data: MomentFigureData): ChartConfiguration {
  const xs = data.points.map((p) => p.T);
  const tMin = Math.min(...xs);
  const tMax = Math.max(...xs);
  const muMax = Math.max(...data.points.map((p) => p.muEff), data.spinOnly ?? 0);
  const chiTMax = Math.max(...data.points.map((p) => p.chiT));
  const line = (colour: string, axis: string, values: { x: number; y: number }[], dashed = false) =>
    ({
      data: values,
      yAxisID: axis,
      showLine: true,
      pointRadius: 0,
      borderColor: colour,
      backgroundColor: colour,
      borderWidth: dashed ? 1.4 : STYLE.allowedWidth,
      borderDash: dashed ? [6, 5] : [],
      tension: 0,
    }) as ChartDataset<'scatter'>;
  const datasets: ChartDataset<'scatter'>[] = [
    {
      ...line(
        STYLE.allowed,
        'mu',
        data.points.map((p) => ({ x: p.T, y: p.muEff })),
      ),
      label: 'μ_eff / μ_B (left)',
    },
    {
      ...line(
        CHI_T_COLOUR,
        'chiT',
        data.points.map((p) => ({ x: p.T, y: p.chiT })),
      ),
      label: 'χT / cm³ K mol⁻¹ (right)',
    },
  ];
  if (data.spinOnly !== null) {
    datasets.push({
      ...line(
        STYLE.muted,
        'mu',
        [
          { x: tMin, y: data.spinOnly },
          { x: tMax, y: data.spinOnly },
        ],
        true,
      ),
      label: `spin-only ${data.spinOnly.toFixed(2)} μ_B (left)`,
    });
  }
  const tick = TICKS;
  const title = (text: string, color: string = STYLE.ink) => ({
    display: true,
    text,
    font: { size: STYLE.axisTitleSize },
    color,
  });
  return {
    type: 'scatter',
    data: { datasets: datasets as ChartDataset[] },
    options: {
      parsing: false,
      layout: { padding: { top: 8, right: 16, left: 8, bottom: 8 } },
      plugins: {
        title: { display: true, text: data.title, font: { size: STYLE.titleSize, weight: 'bold' } },
        legend: { display: true, position: 'bottom', labels: { font: { size: STYLE.labelSize } } },
        tooltip: { enabled: false },
      },
      scales: {
        x: {
          type: 'linear',
          min: 0,
          max: tMax,
          title: title('T / K'),
          ticks: tick,
          grid: { display: false },
        },
        mu: {
          type: 'linear',
          position: 'left',
          min: 0,
          suggestedMax: muMax * 1.1,
          title: title('μ_eff / μ_B', STYLE.allowed),
          ticks: tick,
          grid: { display: false },
        },
        chiT: {
          type: 'linear',
          position: 'right',
          min: 0,
          suggestedMax: chiTMax * 1.1,
          title: title('χT / cm³ K mol⁻¹', CHI_T_COLOUR),
          ticks: tick,
          grid: { drawOnChartArea: false },
        },
      },
    },
  };
}

/** Renders the magnetism figure (PNG, SVG or PDF by `figure.format`). */
export function renderMoments(data: MomentFigureData, figure: FigureOptions): Buffer {
  return renderChart(momentChart(data), { width: 900, height: 560, title: data.title, ...figure });
}
