/** Reading the text of an SVG figure back: each <text> as its plain string, style and box. */

import { createCanvas } from '@napi-rs/canvas';
import type { Box } from '../../charts/labelLayout.js';
import { FONT_FAMILY } from '../../charts/style.js';

/** One <text> element of an SVG. */
export interface SvgText {
  /** The text with tags removed (a typeset ⁴T₁g reads `4T1g`). */
  readonly text: string;
  readonly fill: string;
  /** A white outline drawn under a label (fill none), not a label of its own. */
  readonly halo: boolean;
  /** Whether the element is rotated or moved by a transform (axis titles, ticks). */
  readonly transformed: boolean;
  /** Its box in px, from its position and the widths of its runs in the figures' font. */
  readonly box: Box;
}

const measurer = createCanvas(4, 4).getContext('2d');

function attribute(tag: string, name: string): string | undefined {
  return new RegExp(`\\s${name}="([^"]*)"`).exec(tag)?.[1];
}

function decode(s: string): string {
  return s.replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>');
}

/** The bounding box of `box` under an SVG `translate(e f)` or `matrix(a b c d e f)` transform. */
function transformed(box: Box, transform: string): Box {
  const values = (/\(([^)]*)\)/.exec(transform)?.[1] ?? '').split(/[\s,]+/).map(Number);
  const [a, b, c, d, e, f] = transform.startsWith('translate')
    ? [1, 0, 0, 1, values[0] ?? 0, values[1] ?? 0]
    : [values[0] ?? 1, values[1] ?? 0, values[2] ?? 0, values[3] ?? 1, values[4] ?? 0, values[5] ?? 0];
  const corners = [
    [box.left, box.top],
    [box.right, box.top],
    [box.left, box.bottom],
    [box.right, box.bottom],
  ].map(([x = 0, y = 0]) => [a * x + c * y + e, b * x + d * y + f] as const);
  const xs = corners.map((p) => p[0]);
  const ys = corners.map((p) => p[1]);
  return { left: Math.min(...xs), right: Math.max(...xs), top: Math.min(...ys), bottom: Math.max(...ys) };
}

/** Every <text> of an SVG document. */
export function svgTexts(svg: string): SvgText[] {
  return [...svg.matchAll(/<text\b([^>]*)>(.*?)<\/text>/gs)].map((m) => {
    const tag = m[1] ?? '';
    const body = m[2] ?? '';
    const size = Number(attribute(tag, 'font-size'));
    const bold = Number(attribute(tag, 'font-weight') ?? 400) >= 600;
    const x = Number(attribute(tag, 'x'));
    const y = Number(attribute(tag, 'y'));
    // Runs: the leading text at the element's size, then each tspan (and the text after it).
    let width = 0;
    let top = y - size * 0.8;
    let bottom = y + size * 0.25;
    let runY = y;
    for (const part of body.matchAll(/<tspan([^>]*)>([^<]*)<\/tspan>|([^<]+)/g)) {
      if (part[3] !== undefined) {
        // Text between tspans is at the element's own size.
        measurer.font = `${bold ? 'bold ' : ''}${size}px "${FONT_FAMILY}"`;
        width += measurer.measureText(decode(part[3])).width;
        continue;
      }
      const runSize = Number(attribute(part[1] ?? '', 'font-size') ?? size);
      runY += Number(attribute(part[1] ?? '', 'dy') ?? 0);
      measurer.font = `${bold ? 'bold ' : ''}${runSize}px "${FONT_FAMILY}"`;
      width += measurer.measureText(decode(part[2] ?? '')).width;
      top = Math.min(top, runY - runSize * 0.8);
      bottom = Math.max(bottom, runY + runSize * 0.25);
    }
    const local = { left: x, right: x + width, top, bottom };
    const transform = attribute(tag, 'transform');
    return {
      text: decode(body.replace(/<[^>]+>/g, '')),
      fill: attribute(tag, 'fill') ?? '',
      halo: attribute(tag, 'fill') === 'none',
      transformed: transform !== undefined,
      box: transform === undefined ? local : transformed(local, transform),
    };
  });
}
