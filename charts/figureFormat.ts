/**
 * What a figure is asked to be, without drawing it: the output formats, sizes and size presets,
 * the format of an output path, and the defaults of what a level diagram shows. Kept apart from
 * the drawing code so that commands can check their options and print their help without
 * loading chart.js and the canvas.
 */

import { BAND_CEILING } from '../src/core/defaults.js';
import { InputError } from '../src/core/errors.js';

/** Output formats, chosen by file extension. */
export type FigureFormat = 'png' | 'svg' | 'pdf';

/** Size and format of a figure. */
export interface FigureOptions {
  readonly format: FigureFormat;
  /** Width in CSS pixels (1/96 in). @default 900 */
  readonly width?: number;
  /** Height in CSS pixels. @default 650 */
  readonly height?: number;
  /** PNG pixels per CSS pixel (ignored when `dpi` is given). @default 2 */
  readonly pngScale?: number;
  /**
   * A journal column width: the figure is laid out at the preset's design width (height in
   * proportion) and printed at the column's physical width, text at about 7 pt. @default none
   */
  readonly size?: FigureSize;
  /** PNG pixels per inch of the printed figure (with a size preset) or per 96 CSS px (without). */
  readonly dpi?: number;
  /** PDF document title. */
  readonly title?: string;
}

/** The journal column widths figures can be made for. */
export type FigureSize = keyof typeof FIGURE_SIZES;

/**
 * Column widths (mm) of one- and two-column figures, as many journals set them (common
 * practice, no source), and the width (CSS px) each is laid out at: the figures' 13 px labels
 * then print at about 7 pt, the usual smallest size asked for.
 */
export const FIGURE_SIZES = {
  'one-column': { mm: 85, designWidth: 440, aspect: 1.35 },
  'two-column': { mm: 175, designWidth: 900, aspect: 1 },
} as const;

/** PNG resolution of a size preset unless given, pixels per inch (what journals usually ask for line art with text). */
export const DEFAULT_PRESET_DPI = 300;

/**
 * The format of an output path from its extension.
 * @throws InputError for an extension other than .png, .svg or .pdf.
 */
export function formatOfPath(path: string): FigureFormat {
  const ext = /\.([^./\\]+)$/.exec(path)?.[1]?.toLowerCase();
  if (ext === 'png' || ext === 'svg' || ext === 'pdf') return ext;
  throw new InputError(`output file "${path}": expected a .png, .svg or .pdf extension`);
}

/** The level diagram's default ceiling, cm⁻¹: the band ceiling of the text output (200 nm, where UV-vis spectra end). */
export const DEFAULT_LEVEL_CEILING = BAND_CEILING;
/** The default number of spin-forbidden levels shown (the lowest). */
export const DEFAULT_LEVEL_FORBIDDEN = 4;
