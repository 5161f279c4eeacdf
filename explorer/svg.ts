/**
 * Small SVG-text helpers for the explorer's figures: escaping, numbers, a plot frame with ticks
 * and axis titles, and labels pushed apart so they do not overlap. Styles are written as
 * attributes (not CSS) so that an exported figure looks the same outside the page.
 */

import { STYLE } from '../charts/style.js';

/** The figures' type: the house font where installed, else the reader's sans-serif. */
export const FIGURE_FONT = "'DejaVu Sans', Verdana, sans-serif";

/** A plot area inside a figure, px. */
export interface Plot {
  readonly width: number;
  readonly height: number;
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** A linear axis: data range and where it lies on the page. */
export interface Axis {
  readonly min: number;
  readonly max: number;
  readonly from: number;
  readonly to: number;
}

/** Text escaped for SVG and HTML. */
export function esc(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A coordinate with one decimal (enough at screen resolution, and keeps the text short). */
export function px(v: number): string {
  return (Math.round(v * 10) / 10).toString();
}

/** Data value → page coordinate. */
export function at(axis: Axis, v: number): number {
  return axis.from + ((v - axis.min) / (axis.max - axis.min)) * (axis.to - axis.from);
}

/** A tick step of 1, 2 or 5 × 10ᵏ giving about `count` ticks over `span`. */
export function tickStep(span: number, count: number): number {
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}

/** Tick values of an axis, multiples of the step inside the range. */
export function ticks(axis: Axis, count: number): number[] {
  const step = tickStep(axis.max - axis.min, count);
  const out: number[] = [];
  for (let v = Math.ceil(axis.min / step - 1e-9) * step; v <= axis.max + 1e-9 * step; v += step) {
    out.push(Math.abs(v) < 1e-12 ? 0 : v);
  }
  return out;
}

function tickText(v: number): string {
  return Number(v.toPrecision(10)).toString();
}

/** The opening of a figure: the `<svg>` element with its size and a white background. */
export function svgOpen(plot: Plot, title: string): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${plot.width} ${plot.height}" ` +
    `width="${plot.width}" height="${plot.height}" font-family="${FIGURE_FONT}" role="img" aria-label="${esc(title)}">` +
    `<title>${esc(title)}</title><rect width="${plot.width}" height="${plot.height}" fill="#ffffff"/>`
  );
}

/** The closed frame, the ticks with their numbers and the two axis titles. */
export function frame(plot: Plot, x: Axis, y: Axis, xTitle: string, yTitle: string): string {
  const { left, right, top, bottom } = plot;
  const ink = STYLE.ink;
  const parts = [
    `<rect x="${left}" y="${top}" width="${right - left}" height="${bottom - top}" fill="none" stroke="${ink}" stroke-width="${STYLE.frameWidth}"/>`,
  ];
  for (const v of ticks(x, 8)) {
    const p = px(at(x, v));
    parts.push(
      `<line x1="${p}" x2="${p}" y1="${bottom}" y2="${bottom + 5}" stroke="${ink}"/>`,
      `<text x="${p}" y="${bottom + 19}" text-anchor="middle" font-size="${STYLE.tickSize}" fill="${ink}">${tickText(v)}</text>`,
    );
  }
  for (const v of ticks(y, 7)) {
    const p = px(at(y, v));
    parts.push(
      `<line x1="${left - 5}" x2="${left}" y1="${p}" y2="${p}" stroke="${ink}"/>`,
      `<text x="${left - 8}" y="${p}" dy="0.35em" text-anchor="end" font-size="${STYLE.tickSize}" fill="${ink}">${tickText(v)}</text>`,
    );
  }
  parts.push(
    `<text x="${px((left + right) / 2)}" y="${bottom + 42}" text-anchor="middle" font-size="${STYLE.axisTitleSize}" fill="${ink}">${esc(xTitle)}</text>`,
    `<text transform="translate(${left - 46} ${px((top + bottom) / 2)}) rotate(-90)" text-anchor="middle" font-size="${STYLE.axisTitleSize}" fill="${ink}">${esc(yTitle)}</text>`,
  );
  return parts.join('');
}

/**
 * Label positions pushed apart to at least `gap` px, in order, kept inside [lo, hi]: a forward
 * pass pushes down, a backward pass pulls back up from the bottom.
 */
export function spreadLabels(wanted: readonly number[], gap: number, lo: number, hi: number): number[] {
  const order = wanted.map((v, i) => ({ v, i })).sort((a, b) => a.v - b.v);
  const placed = order.map((o) => o.v);
  for (let k = 0; k < placed.length; k++) {
    placed[k] = Math.max(placed[k] as number, lo, k > 0 ? (placed[k - 1] as number) + gap : lo);
  }
  for (let k = placed.length - 1; k >= 0; k--) {
    placed[k] = Math.min(placed[k] as number, k < placed.length - 1 ? (placed[k + 1] as number) - gap : hi);
  }
  const out = new Array<number>(wanted.length);
  order.forEach((o, k) => {
    out[o.i] = placed[k] as number;
  });
  return out;
}
