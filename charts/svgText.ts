/**
 * Editable SVG text. Skia writes each word of each fillText call as its own `<text>`, with every
 * glyph's x listed and the bare family name. Here the pieces of one line are joined again: words
 * of one call become one string (spaces put back where the gap between them is a space wide),
 * raised and lowered runs drawn next to each other (⁴T₁g is drawn as 4, T, 1g) become `<tspan>`s
 * of one `<text>` with relative shifts. The white outline drawn under a label over lines stays a
 * separate copy (`fill="none"`) just before it: `paint-order` would fold the two into one, but
 * several vector editors ignore it and would paint the outline over the letters. Only the first
 * glyph keeps its x, so a label re-fonted in a vector editor flows as text; the family names
 * fallbacks; coordinates keep two decimals.
 */

import { createCanvas, type SKRSContext2D } from '@napi-rs/canvas';
import { FONT_FAMILY } from './style.js';

/** The font-family written into SVG text: the font the figures are drawn with, then common fallbacks. */
export const SVG_FONT_FAMILY = `'${FONT_FAMILY}', Arial, Helvetica, sans-serif`;

/** One `<text>` element as Skia wrote it: attributes, first-glyph position, decoded text. */
interface Piece {
  /** The attributes other than x, y and font-size, in their written order (the identity of the style). */
  readonly style: string;
  readonly size: number;
  readonly x: number;
  /** x of the last glyph. */
  readonly lastX: number;
  readonly y: number;
  readonly text: string;
  readonly bold: boolean;
  readonly italic: boolean;
}

/** A run of pieces on one line, to be written as one `<text>`. */
interface Line {
  readonly first: Piece;
  readonly parts: { piece: Piece; spaces: number }[];
}

let measurer: SKRSContext2D | undefined;

/** Width of `text` in the figures' font, px. */
function advance(text: string, size: number, bold: boolean, italic: boolean): number {
  measurer ??= createCanvas(4, 4).getContext('2d');
  measurer.font = `${italic ? 'italic ' : ''}${bold ? 'bold ' : ''}${size}px "${FONT_FAMILY}"`;
  return measurer.measureText(text).width;
}

const ENTITIES: Readonly<Record<string, string>> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/** The Latin ligatures Skia may write, spelled out (NFKC would also flatten ² and ⁻¹). */
const LIGATURES: Readonly<Record<string, string>> = {
  '\uFB00': 'ff',
  '\uFB01': 'fi',
  '\uFB02': 'fl',
  '\uFB03': 'ffi',
  '\uFB04': 'ffl',
};

function decode(s: string): string {
  return s.replace(/&(#x[0-9a-f]+|#\d+|\w+);/gi, (m, e: string) => {
    if (e.startsWith('#x') || e.startsWith('#X'))
      return String.fromCodePoint(Number.parseInt(e.slice(2), 16));
    if (e.startsWith('#')) return String.fromCodePoint(Number(e.slice(1)));
    return ENTITIES[e] ?? m;
  });
}

function encode(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Reads one `<text>` element, or undefined for an empty one (Skia writes one per space). */
function readPiece(attributes: string, content: string): Piece | undefined {
  const attrs = [...attributes.matchAll(/([\w:-]+)="([^"]*)"/g)].map(
    (m) => [m[1] ?? '', m[2] ?? ''] as const,
  );
  const get = (name: string) => attrs.find(([k]) => k === name)?.[1] ?? '';
  const xs = get('x')
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '')
    .map(Number);
  const y = Number(get('y').split(',')[0]);
  // Skia writes ligature glyphs (ﬁ) as their own characters; a reader searching for "field" wants letters.
  const text = decode(content).replace(/[\uFB00-\uFB04]/g, (c) => LIGATURES[c] ?? c);
  if (xs.length === 0 || text === '' || !Number.isFinite(y)) return undefined;
  const style = attrs
    .filter(([k]) => k !== 'x' && k !== 'y' && k !== 'font-size')
    .map(([k, v]) => `${k}="${v}"`)
    .join(' ');
  const weight = Number(get('font-weight') || 400);
  return {
    style,
    size: Number(get('font-size')),
    x: xs[0] ?? 0,
    lastX: xs.at(-1) ?? 0,
    y,
    text,
    bold: weight >= 600,
    italic: get('font-style') === 'italic',
  };
}

/** Spaces between two pieces of one line (0 or more), or undefined when `b` does not continue `a`. */
function spacesBetween(a: Piece, b: Piece): number | undefined {
  if (a.style !== b.style) return undefined;
  if (Math.abs(b.y - a.y) > 0.6 * Math.max(a.size, b.size)) return undefined;
  const lastChar = [...a.text].at(-1) ?? '';
  const gap = b.x - (a.lastX + advance(lastChar, a.size, a.bold, a.italic));
  for (const size of [a.size, b.size]) {
    const space = advance(' ', size, a.bold, a.italic);
    for (let k = 0; k <= 3; k++) if (Math.abs(gap - k * space) < 0.6) return k;
  }
  return undefined;
}

const round = (v: number) => String(Math.round(v * 100) / 100);

/** The `<text>` of a line: the first piece plain, later ones as tspans where their size or height differs. */
function writeLine(line: Line): string {
  const { first } = line;
  const style = first.style.replace(/font-family="[^"]*"/, `font-family="${SVG_FONT_FAMILY}"`);
  let body = encode(first.text);
  let y = first.y;
  for (const { piece, spaces } of line.parts) {
    const text = ' '.repeat(spaces) + encode(piece.text);
    if (piece.size === first.size && Math.abs(piece.y - y) < 0.01) {
      body += text;
      continue;
    }
    const size = piece.size === first.size ? '' : ` font-size="${round(piece.size)}"`;
    const dy = Math.abs(piece.y - y) < 0.01 ? '' : ` dy="${round(piece.y - y)}"`;
    body += `<tspan${size}${dy}>${text}</tspan>`;
    y = piece.y;
  }
  return `<text ${style} font-size="${round(first.size)}" x="${round(first.x)}" y="${round(first.y)}" xml:space="preserve">${body}</text>`;
}

/**
 * An SVG from the Skia canvas with its text made editable (see the module comment) and numbers in
 * tags cut to two decimals.
 */
export function editableSvg(svg: string): string {
  const out: string[] = [];
  let line: Line | undefined;
  const flush = () => {
    if (!line) return;
    out.push(writeLine(line));
    line = undefined;
  };
  let last = 0;
  for (const m of svg.matchAll(/<text ([^>]*)>([^<]*)<\/text>/g)) {
    const between = svg.slice(last, m.index);
    last = (m.index ?? 0) + m[0].length;
    if (between.trim() !== '') {
      flush();
      out.push(between);
    }
    const piece = readPiece(m[1] ?? '', m[2] ?? '');
    if (!piece) continue;
    const tail = line?.parts.at(-1)?.piece ?? line?.first;
    const spaces = tail ? spacesBetween(tail, piece) : undefined;
    if (line && spaces !== undefined) line.parts.push({ piece, spaces });
    else {
      flush();
      line = { first: piece, parts: [] };
    }
  }
  flush();
  out.push(svg.slice(last));
  return out.join('').replace(/<[^>]+>/g, (tag) => tag.replace(/(\d\.\d\d)\d+/g, '$1'));
}
