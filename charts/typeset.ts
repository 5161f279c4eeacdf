/**
 * Typesetting of short scientific labels on a canvas: state symbols ²ˢ⁺¹Γ with a raised
 * multiplicity and lowered irrep index (⁴T₁g is drawn as 4 raised, T, "1g" lowered), free-ion
 * terms (⁴F, a²D) and dⁿ, drawn from runs of text at three levels rather than from Unicode
 * super/subscript characters, which fonts draw small and uneven.
 */

import type { SKRSContext2D } from '@napi-rs/canvas';
import type { Chart } from 'chart.js';
import { parseStateLabel } from '../src/field/labels.js';
import { FONT_FAMILY, STYLE } from './style.js';

/** A piece of text at the baseline, raised or lowered. */
export interface TextRun {
  readonly text: string;
  readonly shift: 'base' | 'sup' | 'sub';
}

/** Look of a typeset label. */
export interface TextStyle {
  /** Font size of base text, CSS px. */
  readonly size: number;
  readonly color: string;
  /** @default false */
  readonly bold?: boolean;
  /** A white outline behind the text so it stays legible over lines. @default false */
  readonly halo?: boolean;
}

/** Size of raised and lowered text relative to the base size. */
const SCRIPT_SCALE = 0.7;
/** Shift of raised text above, and of lowered text below, the baseline, in units of the base size. */
const SUP_RISE = 0.36;
const SUB_DROP = 0.2;

/** The context chart.js draws with: a Skia context from @napi-rs/canvas in every figure here. */
export function chartContext(chart: Chart): SKRSContext2D {
  return chart.ctx as unknown as SKRSContext2D;
}

/** The closed frame of the house style around a chart's plot area. */
export function drawFrame(
  ctx: SKRSContext2D,
  area: { left: number; top: number; right: number; bottom: number },
): void {
  ctx.save();
  ctx.strokeStyle = STYLE.ink;
  ctx.lineWidth = STYLE.frameWidth;
  ctx.strokeRect(area.left, area.top, area.right - area.left, area.bottom - area.top);
  ctx.restore();
}

/** Runs of a state label such as `4T1g(F)`: raised 4, T, lowered 1g, then (F). Other text stays plain. */
export function stateRuns(label: string): TextRun[] {
  const p = parseStateLabel(label);
  if (!p) return [{ text: label, shift: 'base' }];
  const runs: TextRun[] = [
    { text: p.multiplicity, shift: 'sup' },
    { text: p.letter, shift: 'base' },
  ];
  if (p.index + p.parity !== '') runs.push({ text: p.index + p.parity, shift: 'sub' });
  if (p.parent !== '') runs.push({ text: `(${p.parent})`, shift: 'base' });
  return runs;
}

const SLASH: TextRun = { text: '/', shift: 'base' };

/** Runs of a spin–orbit curve's caption `Γ5 3T1g(F)`: Γ with its index lowered, a thin space, then the parent as {@link stateRuns}. */
export function captionRuns(caption: string): TextRun[] {
  const m = /^Γ(\d)\s+(.+)$/.exec(caption);
  if (!m) return stateRuns(caption);
  return [
    { text: 'Γ', shift: 'base' },
    { text: m[1] ?? '', shift: 'sub' },
    { text: '\u2009', shift: 'base' },
    ...stateRuns(m[2] ?? ''),
  ];
}

/** Runs of a free-ion term name such as `4F` or `a2D` (prefix a, b for repeated terms), or a level such as `4F3/2`. */
export function termRuns(name: string): TextRun[] {
  // A level of mixed parentage (intermediate coupling) names its terms joined by a slash: 2P/2H3/2.
  const mixed = name.split(/\/(?=[a-z]?\d[A-Z])/);
  if (mixed.length > 1) return mixed.flatMap((part, i) => [...(i > 0 ? [SLASH] : []), ...termRuns(part)]);
  // A free-ion level (spin–orbit diagrams) carries J after the letter: 4F3/2.
  const m = /^([a-z]?)(\d+)([A-Z])(\d+(?:\/2)?)?$/.exec(name);
  if (!m) return [{ text: name, shift: 'base' }];
  const [, prefix = '', multiplicity = '', letter = '', J = ''] = m;
  const runs: TextRun[] = [];
  if (prefix !== '') runs.push({ text: prefix, shift: 'base' });
  runs.push({ text: multiplicity, shift: 'sup' }, { text: letter, shift: 'base' });
  if (J !== '') runs.push({ text: J, shift: 'sub' });
  return runs;
}

/** Runs of plain text in which `^x` raises and `_x` lowers one character run, e.g. `d^6 in O_h`. */
export function markupRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  const re = /([\^_])([^\s^_,;:()]+)|([^^_]+)/g;
  for (const m of text.matchAll(re)) {
    if (m[3] !== undefined) runs.push({ text: m[3], shift: 'base' });
    else runs.push({ text: m[2] ?? '', shift: m[1] === '^' ? 'sup' : 'sub' });
  }
  return runs;
}

function font(size: number, bold: boolean): string {
  return `${bold ? 'bold ' : ''}${size}px "${FONT_FAMILY}"`;
}

function runSize(run: TextRun, size: number): number {
  return run.shift === 'base' ? size : size * SCRIPT_SCALE;
}

/** Width of runs in CSS px. */
export function measureRuns(ctx: SKRSContext2D, runs: readonly TextRun[], style: TextStyle): number {
  ctx.save();
  let w = 0;
  for (const run of runs) {
    ctx.font = font(runSize(run, style.size), style.bold ?? false);
    w += ctx.measureText(run.text).width;
  }
  ctx.restore();
  return w;
}

/** Height a line of runs takes (raised and lowered text included), CSS px. */
export function runsHeight(style: TextStyle): number {
  return style.size * 1.35;
}

/**
 * Draws runs with their vertical middle at `y`; `x` is the left edge, centre or right edge by
 * `align`. Returns the drawn width.
 */
export function drawRuns(
  ctx: SKRSContext2D,
  runs: readonly TextRun[],
  x: number,
  y: number,
  style: TextStyle,
  align: 'left' | 'center' | 'right' = 'left',
): number {
  const width = measureRuns(ctx, runs, style);
  let cx = align === 'left' ? x : align === 'center' ? x - width / 2 : x - width;
  // The middle of capital letters sits about 0.36 of the size above the baseline.
  const baseline = y + style.size * 0.36;
  ctx.save();
  const placed = runs.map((run) => {
    const size = runSize(run, style.size);
    const dy = run.shift === 'sup' ? -SUP_RISE * style.size : run.shift === 'sub' ? SUB_DROP * style.size : 0;
    ctx.font = font(size, style.bold ?? false);
    const at = { run, size, x: cx, y: baseline + dy };
    cx += ctx.measureText(run.text).width;
    return at;
  });
  ctx.textAlign = 'left';
  ctx.textBaseline = 'alphabetic';
  // Outlines first, then the letters, so one run's outline never covers the next run's letters.
  if (style.halo) {
    ctx.strokeStyle = 'rgba(255,255,255,0.92)';
    ctx.lineWidth = Math.max(2.5, style.size * 0.28);
    ctx.lineJoin = 'round';
    for (const p of placed) {
      ctx.font = font(p.size, style.bold ?? false);
      ctx.strokeText(p.run.text, p.x, p.y);
    }
  }
  ctx.fillStyle = style.color;
  for (const p of placed) {
    ctx.font = font(p.size, style.bold ?? false);
    ctx.fillText(p.run.text, p.x, p.y);
  }
  ctx.restore();
  return width;
}

/** An ion name in the markup of {@link markupRuns}, its charge raised: `Cr3+` → `Cr^3+`. */
export function ionMarkup(name: string): string {
  return name.replace(/^([A-Z][a-z]?)(\d[+-])$/, '$1^$2');
}

/**
 * Runs of a chemical formula: counts lowered, the charge raised with a true minus sign —
 * `[Ni(ors)6]4-` → [Ni(ors), 6 lowered, ], 4− raised; `Cr3+` → Cr, 3+ raised. Text that does not
 * look like a formula — with spaces, starting with a digit (a state label such as 4T1g), or with
 * neither a square bracket nor a final charge (`sample A1`, `d6`) — stays plain.
 */
export function formulaRuns(text: string): TextRun[] {
  const charge = /^(.*[A-Za-z)\]])(\d*[+-])$/.exec(text);
  const body = charge ? (charge[1] ?? '') : text;
  if (/\s|^\d/.test(text) || (!charge && !text.includes('['))) return [{ text, shift: 'base' }];
  const runs: TextRun[] = [];
  for (const m of body.matchAll(/(?<=[A-Za-z)\]])\d+|[^\d]+|\d+/g)) {
    const isCount = /^\d+$/.test(m[0]) && m.index > 0;
    runs.push({ text: m[0], shift: isCount ? 'sub' : 'base' });
  }
  if (charge) runs.push({ text: (charge[2] ?? '').replace('-', '\u2212'), shift: 'sup' });
  return runs;
}

/** A formula as HTML: counts in <sub>, the charge in <sup> (see {@link formulaRuns}); text escaped. */
export function formulaHtml(text: string): string {
  const escaped = (s: string) =>
    s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
  return formulaRuns(text)
    .map((r) => (r.shift === 'base' ? escaped(r.text) : `<${r.shift}>${escaped(r.text)}</${r.shift}>`))
    .join('');
}

/** Text as HTML with every formula in it typeset (word by word; trailing , ; : . kept outside). */
export function formulaTextHtml(text: string): string {
  return text
    .split(/(\s+)/)
    .map((word) => {
      const m = /^(.*?)([,;:.]*)$/.exec(word);
      return formulaHtml(m?.[1] ?? word) + formulaHtml(m?.[2] ?? '');
    })
    .join('');
}

/**
 * A style whose size is cut, down to 70 %, until `runs` fit in `width` px: titles of narrow
 * (one-column) figures stay whole instead of running off the edge.
 */
export function fitted(
  ctx: SKRSContext2D,
  runs: readonly TextRun[],
  style: TextStyle,
  width: number,
): TextStyle {
  const natural = measureRuns(ctx, runs, style);
  if (natural <= width) return style;
  return { ...style, size: Math.max(0.7 * style.size, (style.size * width) / natural) };
}
