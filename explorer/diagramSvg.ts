/**
 * The correlation diagram (E/B against Δ/B at the current C/B) as SVG text in the house style:
 * spin-allowed curves blue (rust on the low-spin side of a crossover), spin-forbidden light
 * blue-grey, the crossovers dashed, the current Δ/B as the sample's dashed violet line with the
 * current levels on it and the observed bands as open diamonds. Every curve carries a wide
 * transparent copy with `data-curve` for pointer hover.
 */

import { STYLE } from '../charts/style.js';
import { unicodeLabel } from '../src/field/labels.js';
import { type Axis, at, esc, frame, type Plot, px, spreadLabels, svgOpen } from './svg.js';
import type { ExplorerView } from './view.js';

/** The diagram's size, px (the page scales it to its column). */
const PLOT: Plot = { width: 760, height: 540, left: 64, right: 650, top: 16, bottom: 478 };

/** The E/B shown at most, unless an observed band or the current point needs more. */
const DEFAULT_TOP = 80;

/** Width kept for a label at the top of the plot, px (a label that does not fit is left out). */
const EXIT_LABEL_ROOM = 80;

/** Least vertical distance between two curve labels, px. */
const LABEL_GAP = 14;

/** The diagram of this view, with `bands` (observed, cm⁻¹) on the current line. */
export function diagramSvg(view: ExplorerView, bands: readonly number[]): string {
  const { diagram, params } = view;
  const x: Axis = { min: 0, max: diagram.maxDeltaOverB, from: PLOT.left, to: PLOT.right };
  const observed = params.B > 0 ? bands.map((e) => e / params.B) : [];
  const y: Axis = { min: 0, max: topOf(view, observed), from: PLOT.bottom, to: PLOT.top };
  const title = `Correlation diagram of d${params.n}, ${params.geometry === 'oct' ? 'octahedral' : 'tetrahedral'}, C/B = ${params.cOverB}`;
  return [
    svgOpen(PLOT, title),
    `<defs><clipPath id="plot-area"><rect x="${PLOT.left}" y="${PLOT.top}" width="${PLOT.right - PLOT.left}" height="${PLOT.bottom - PLOT.top}"/></clipPath></defs>`,
    `<g clip-path="url(#plot-area)">`,
    lowSpinTint(view, x),
    curves(view, x, y),
    currentPoint(view, x, y, observed),
    `</g>`,
    curveLabels(view, x, y),
    frame(PLOT, x, y, 'Δ/B', 'E/B'),
    `</svg>`,
  ].join('');
}

function topOf(view: ExplorerView, observed: readonly number[]): number {
  let top = 0;
  for (const c of view.diagram.curves) for (const v of c.values) top = Math.max(top, v);
  top = Math.min(top, DEFAULT_TOP);
  for (const o of observed) top = Math.max(top, o * 1.08);
  return Math.max(10, Math.ceil(top / 10) * 10);
}

function isLowSpin(view: ExplorerView, S: number): boolean {
  const first = view.diagram.regions[0];
  return first !== undefined && S < first.S;
}

function lowSpinTint(view: ExplorerView, x: Axis): string {
  return view.diagram.regions
    .filter((r) => isLowSpin(view, r.S))
    .map((r) => {
      const a = at(x, r.fromDeltaOverB);
      return `<rect x="${px(a)}" y="${PLOT.top}" width="${px(at(x, r.toDeltaOverB) - a)}" height="${PLOT.bottom - PLOT.top}" fill="${STYLE.lowSpinTint}"/>`;
    })
    .join('');
}

/** Each curve drawn region by region, coloured by whether it is spin-allowed there. */
function curves(view: ExplorerView, x: Axis, y: Axis): string {
  const { deltaOverB: xs, curves: all, regions, crossings } = view.diagram;
  const parts: string[] = [];
  for (const c of crossings) {
    const p = px(at(x, c.deltaOverB));
    parts.push(
      `<line x1="${p}" x2="${p}" y1="${PLOT.top}" y2="${PLOT.bottom}" stroke="${STYLE.crossover}" stroke-width="${STYLE.markWidth}" stroke-dasharray="${STYLE.crossoverDash.join(' ')}"/>`,
    );
  }
  const forbidden: string[] = [];
  const allowed: string[] = [];
  const hits: string[] = [];
  all.forEach((curve, i) => {
    const whole: string[] = [];
    for (const r of regions) {
      const pts: string[] = [];
      xs.forEach((v, k) => {
        if (v >= r.fromDeltaOverB - 1e-9 && v <= r.toDeltaOverB + 1e-9) {
          pts.push(`${px(at(x, v))},${px(at(y, curve.values[k] ?? 0))}`);
        }
      });
      if (pts.length < 2) continue;
      whole.push(...pts);
      const on = curve.S === r.S;
      const colour = on ? (isLowSpin(view, r.S) ? STYLE.allowedLowSpin : STYLE.allowed) : STYLE.forbidden;
      (on ? allowed : forbidden).push(
        `<polyline points="${pts.join(' ')}" fill="none" stroke="${colour}" stroke-width="${on ? STYLE.allowedWidth : STYLE.forbiddenWidth}" data-line="${i}"/>`,
      );
    }
    hits.push(
      `<polyline points="${whole.join(' ')}" fill="none" stroke="transparent" stroke-width="9" data-curve="${i}"/>`,
    );
  });
  return [...parts, ...forbidden, ...allowed, `<g class="hits">`, ...hits, `</g>`].join('');
}

/** The current Δ/B: the sample's line, the levels on it, the observed bands as open diamonds. */
function currentPoint(view: ExplorerView, x: Axis, y: Axis, observed: readonly number[]): string {
  const { B } = view.params;
  const cx = at(x, view.deltaOverB);
  const p = px(cx);
  const parts = [
    `<line x1="${p}" x2="${p}" y1="${PLOT.top}" y2="${PLOT.bottom}" stroke="${STYLE.sample}" stroke-width="${STYLE.markWidth}" stroke-dasharray="${STYLE.sampleDash.join(' ')}" data-current="${view.deltaOverB}"/>`,
  ];
  if (B > 0) {
    const allowed = isLowSpin(view, view.levels.ground.S) ? STYLE.allowedLowSpin : STYLE.allowed;
    for (const l of view.levels.levels) {
      const colour = l.spinAllowed ? allowed : STYLE.forbidden;
      parts.push(
        `<circle cx="${p}" cy="${px(at(y, l.energy / B))}" r="3" fill="${colour}" data-level="${esc(l.label)}"/>`,
      );
    }
  }
  for (const o of observed) {
    const cy = at(y, o);
    const d = 6;
    parts.push(
      `<path d="M${px(cx)} ${px(cy - d)}L${px(cx + d)} ${px(cy)}L${px(cx)} ${px(cy + d)}L${px(cx - d)} ${px(cy)}Z" fill="#ffffff" stroke="${STYLE.sample}" stroke-width="1.6" data-observed="${px(o)}"/>`,
    );
  }
  return parts.join('');
}

/** Labels of the spin-allowed curves (at the right end), pushed apart, beside the frame. */
function curveLabels(view: ExplorerView, x: Axis, y: Axis): string {
  const { curves: all, regions } = view.diagram;
  const last = regions[regions.length - 1];
  if (!last) return '';
  const shown = all
    .map((c) => ({ c, v: c.values[c.values.length - 1] ?? 0 }))
    .filter(({ c, v }) => c.S === last.S && v <= y.max);
  const ys = spreadLabels(
    shown.map(({ v }) => at(y, v)),
    LABEL_GAP,
    PLOT.top + 6,
    PLOT.bottom - 4,
  );
  const colour = isLowSpin(view, last.S) ? STYLE.allowedLowSpin : STYLE.allowed;
  return (
    shown
      .map(({ c, v }, i) => {
        const ly = ys[i] ?? 0;
        return (
          `<line x1="${PLOT.right}" y1="${px(at(y, v))}" x2="${PLOT.right + 8}" y2="${px(ly)}" stroke="${colour}" stroke-width="${STYLE.leaderWidth}"/>` +
          `<text x="${PLOT.right + 11}" y="${px(ly)}" dy="0.35em" font-size="${STYLE.labelSize}" fill="${colour}">${esc(unicodeLabel(c.label))}</text>`
        );
      })
      .join('') + exitLabels(view, x, y, last.fromDeltaOverB, last.S, colour)
  );
}

/** Labels of the spin-allowed curves that leave through the top of the plot, just below where they leave. */
function exitLabels(view: ExplorerView, x: Axis, y: Axis, from: number, S: number, colour: string): string {
  const { curves: all, deltaOverB: xs } = view.diagram;
  const exits: { at: number; label: string; anchor: 'start' | 'end' }[] = [];
  for (const c of all) {
    if (c.S !== S || (c.values[c.values.length - 1] ?? 0) <= y.max) continue;
    const exit = xs[c.values.findIndex((v) => v > y.max)];
    // Only where the curve is spin-allowed (the last region), and with room for the text.
    if (exit === undefined || exit < from) continue;
    // Right of the exit where the text fits, else ending just left of it.
    const p = at(x, exit) + 5;
    const fits = p <= PLOT.right - EXIT_LABEL_ROOM;
    exits.push({ at: fits ? p : p - 10 - EXIT_LABEL_ROOM, label: c.label, anchor: fits ? 'start' : 'end' });
  }
  exits.sort((a, b) => a.at - b.at);
  let next = Number.NEGATIVE_INFINITY;
  const parts: string[] = [];
  for (const e of exits) {
    if (e.at < next) continue;
    next = e.at + EXIT_LABEL_ROOM;
    const tx = e.anchor === 'start' ? e.at : e.at + EXIT_LABEL_ROOM;
    parts.push(
      `<text x="${px(tx)}" y="${PLOT.top + 14}" text-anchor="${e.anchor}" font-size="${STYLE.labelSize}" fill="${colour}">${esc(unicodeLabel(e.label))}</text>`,
    );
  }
  return parts.join('');
}
