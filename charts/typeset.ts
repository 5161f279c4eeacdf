import { parseStateLabel } from '../src/index.js';
import { FONT_FAMILY } from './render.js';

/**
 * Text with true superscripts and subscripts on a canvas, for state labels such as ⁵T₂g in
 * figures (Unicode has no subscript g, and raised digits of the font's own size read better).
 */

/** A piece of text and where it sits. */
export interface TextRun {
  readonly text: string;
  readonly script?: 'normal' | 'super' | 'sub';
}

/** Size of a super- or subscript relative to the text. */
const SCRIPT_SCALE = 0.68;

/** The runs of a plain state label: `5T2g(F)` → ⁵ T ₂g (F). Other text is one normal run. */
export function stateLabelRuns(label: string): TextRun[] {
  const p = parseStateLabel(label);
  if (!p) return [{ text: label }];
  const runs: TextRun[] = [{ text: p.multiplicity, script: 'super' }, { text: p.letter }];
  if (p.index + p.parity !== '') runs.push({ text: p.index + p.parity, script: 'sub' });
  if (p.parent) runs.push({ text: `(${p.parent})` });
  return runs;
}

/** The canvas context calls the typesetting needs (chart.js and @napi-rs/canvas both provide them). */
interface TextContext {
  font: string;
  textAlign: string;
  textBaseline: string;
  fillText(text: string, x: number, y: number): void;
  measureText(text: string): { width: number };
}

function fontOf(size: number, bold: boolean): string {
  return `${bold ? 'bold ' : ''}${size}px "${FONT_FAMILY}"`;
}

/** Width of the runs at `size` px. */
export function runsWidth(ctx: TextContext, runs: readonly TextRun[], size: number, bold = false): number {
  let w = 0;
  for (const r of runs) {
    ctx.font = fontOf(r.script && r.script !== 'normal' ? size * SCRIPT_SCALE : size, bold);
    w += ctx.measureText(r.text).width;
  }
  return w;
}

/** Options of {@link drawRuns}. */
export interface RunOptions {
  /** Start the text at x, or centre it on x. @default 'center' */
  readonly align?: 'left' | 'center';
  /** Bold face. @default false */
  readonly bold?: boolean;
}

/**
 * Draws the runs with their vertical centre at `y`, starting at `x` or centred on it. Leaves the
 * context's font and alignment changed.
 */
export function drawRuns(
  ctx: TextContext,
  runs: readonly TextRun[],
  x: number,
  y: number,
  size: number,
  options: RunOptions = {},
): void {
  const bold = options.bold ?? false;
  let cursor = options.align === 'left' ? x : x - runsWidth(ctx, runs, size, bold) / 2;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  for (const r of runs) {
    const script = r.script ?? 'normal';
    const s = script === 'normal' ? size : size * SCRIPT_SCALE;
    ctx.font = fontOf(s, bold);
    const dy = script === 'super' ? -0.38 * size : script === 'sub' ? 0.3 * size : 0;
    ctx.fillText(r.text, cursor, y + dy);
    cursor += ctx.measureText(r.text).width;
  }
}
