/**
 * The sample's spectrum as SVG text in the house style — the measured curve as a warm grey
 * silhouette — with the levels at the current parameters as sticks: spin-allowed blue and
 * labelled, spin-forbidden short and light; the observed band maxima as violet open diamonds.
 */

import { STYLE } from '../charts/style.js';
import { unicodeLabel } from '../src/field/labels.js';
import type { ExplorerSpectrum } from './data.js';
import { type Axis, at, esc, frame, type Plot, px, spreadLabels, svgOpen } from './svg.js';
import type { ExplorerView } from './view.js';

const PLOT: Plot = { width: 760, height: 330, left: 64, right: 736, top: 40, bottom: 268 };

/** The y-axis title of each quantity of the library's absorption spectra. */
const QUANTITY_TITLES: Readonly<Record<string, string>> = {
  absorbance: 'absorbance',
  epsilon: 'ε / L mol⁻¹ cm⁻¹',
  arbitrary: 'intensity (arbitrary units)',
};

/** Most points drawn: a long scan is thinned evenly (the figure is a few hundred px wide). */
const MAX_POINTS = 1500;

/** The spectrum with this view's transitions as sticks and `bands` (cm⁻¹) as diamonds. */
export function spectrumSvg(
  view: ExplorerView,
  spectrum: ExplorerSpectrum,
  bands: readonly number[],
): string {
  const w = spectrum.wavenumber;
  const lo = w[0] ?? 0;
  const hi = w[w.length - 1] ?? 1;
  let top = 0;
  for (const v of spectrum.value) top = Math.max(top, v);
  const x: Axis = { min: lo, max: hi, from: PLOT.left, to: PLOT.right };
  const y: Axis = { min: 0, max: top > 0 ? top * 1.05 : 1, from: PLOT.bottom, to: PLOT.top };
  return [
    svgOpen(PLOT, `Spectrum with the transitions at Dq = ${view.params.dq}, B = ${view.params.B} cm⁻¹`),
    silhouette(spectrum, x, y),
    sticks(view, x),
    diamonds(bands, x),
    frame(PLOT, x, y, 'wavenumber / cm⁻¹', QUANTITY_TITLES[spectrum.quantity] ?? spectrum.quantity),
    `</svg>`,
  ].join('');
}

function silhouette(spectrum: ExplorerSpectrum, x: Axis, y: Axis): string {
  const n = spectrum.wavenumber.length;
  const every = Math.max(1, Math.ceil(n / MAX_POINTS));
  const pts: string[] = [];
  for (let i = 0; i < n; i += every) {
    const v = Math.max(0, spectrum.value[i] ?? 0);
    pts.push(`${px(at(x, spectrum.wavenumber[i] ?? 0))},${px(at(y, v))}`);
  }
  const base = px(PLOT.bottom);
  const first = pts[0]?.split(',')[0] ?? PLOT.left;
  const last = pts[pts.length - 1]?.split(',')[0] ?? PLOT.right;
  return (
    `<polygon points="${first},${base} ${pts.join(' ')} ${last},${base}" fill="${STYLE.measuredFill}" stroke="none"/>` +
    `<polyline points="${pts.join(' ')}" fill="none" stroke="${STYLE.measuredLine}" stroke-width="1.3" data-spectrum="${n}"/>`
  );
}

function sticks(view: ExplorerView, x: Axis): string {
  const inside = view.levels.levels.filter((l) => l.energy > 0 && l.energy >= x.min && l.energy <= x.max);
  const parts: string[] = [];
  const allowed = inside.filter((l) => l.spinAllowed);
  for (const l of inside.filter((k) => !k.spinAllowed)) {
    const p = px(at(x, l.energy));
    parts.push(
      `<line x1="${p}" x2="${p}" y1="${PLOT.bottom}" y2="${PLOT.bottom - 40}" stroke="${STYLE.forbidden}" stroke-width="${STYLE.forbiddenWidth}" stroke-dasharray="${STYLE.forbiddenDash.join(' ')}" data-stick="${esc(l.label)}"/>`,
    );
  }
  const xs = spreadLabels(
    allowed.map((l) => at(x, l.energy)),
    52,
    PLOT.left + 20,
    PLOT.right - 20,
  );
  allowed.forEach((l, i) => {
    const p = px(at(x, l.energy));
    parts.push(
      `<line x1="${p}" x2="${p}" y1="${PLOT.bottom}" y2="${PLOT.top + 6}" stroke="${STYLE.allowed}" stroke-width="${STYLE.markWidth}" data-stick="${esc(l.label)}"/>`,
      `<text x="${px(xs[i] ?? 0)}" y="${PLOT.top - 8}" text-anchor="middle" font-size="${STYLE.smallSize}" fill="${STYLE.allowed}">${esc(unicodeLabel(l.label))}</text>`,
    );
  });
  return parts.join('');
}

function diamonds(bands: readonly number[], x: Axis): string {
  const cy = PLOT.bottom - 8;
  const d = 5;
  return bands
    .filter((b) => b >= x.min && b <= x.max)
    .map((b) => {
      const cx = at(x, b);
      return `<path d="M${px(cx)} ${px(cy - d)}L${px(cx + d)} ${px(cy)}L${px(cx)} ${px(cy + d)}L${px(cx - d)} ${px(cy)}Z" fill="#ffffff" stroke="${STYLE.sample}" stroke-width="1.5"/>`;
    })
    .join('');
}
