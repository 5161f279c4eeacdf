/** The small line key of the figures (spin-allowed and spin-forbidden line samples), drawn on the canvas. */

import type { SKRSContext2D } from '@napi-rs/canvas';
import { STYLE } from './style.js';
import { drawRuns, measureRuns, type TextRun, type TextStyle } from './typeset.js';

/** One entry of a line key: short line samples in one or more colours, then a word. */
export interface KeyItem {
  readonly colors: readonly string[];
  readonly width: number;
  readonly text: string;
  /** Dash pattern of the line sample, px. @default solid */
  readonly dash?: readonly number[];
  /** A filled swatch under the line sample (a filled silhouette), instead of a bare line. */
  readonly fill?: string;
}

/**
 * The entries every figure here uses: strong lines spin-allowed, light lines spin-forbidden
 * (left out where nothing is spin-forbidden, as for d¹ and d⁹).
 */
export function spinKey(
  allowedColors: readonly string[],
  anyForbidden = true,
  forbiddenText = 'spin-forbidden',
  allowedText = 'spin-allowed',
): KeyItem[] {
  const allowed = { colors: allowedColors, width: STYLE.allowedWidth, text: allowedText };
  const forbidden = { colors: [STYLE.forbidden], width: STYLE.forbiddenWidth + 0.3, text: forbiddenText };
  return anyForbidden ? [allowed, forbidden] : [allowed];
}

/** Draws a one-line key ending at `right`, vertically centred on `y` (a small key, not a legend box). */
export function drawKey(ctx: SKRSContext2D, items: readonly KeyItem[], right: number, y: number): void {
  const style: TextStyle = { size: STYLE.smallSize, color: STYLE.muted };
  let x = right;
  for (const item of [...items].reverse()) {
    const runs: TextRun[] = [{ text: item.text, shift: 'base' }];
    x -= measureRuns(ctx, runs, style);
    drawRuns(ctx, runs, x, y, style);
    for (const color of [...item.colors].reverse()) {
      x -= 26;
      ctx.save();
      if (item.fill) {
        ctx.fillStyle = item.fill;
        ctx.fillRect(x, y - 5, 20, 10);
      }
      ctx.strokeStyle = color;
      ctx.lineWidth = item.fill ? 1 : item.width;
      ctx.setLineDash([...(item.dash ?? [])]);
      ctx.beginPath();
      ctx.moveTo(x, item.fill ? y - 5 : y);
      ctx.lineTo(x + 20, item.fill ? y - 5 : y);
      ctx.stroke();
      ctx.restore();
    }
    x -= 18;
  }
}
