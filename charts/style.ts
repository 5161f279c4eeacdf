/**
 * The look shared by termsplit's figures: colours, line widths and text sizes, so that the
 * correlation diagram, the energy-level diagram and the sample overlay read as one family.
 */

/** The font family every figure is drawn in (shipped with the package, so the same everywhere). */
export const FONT_FAMILY = 'DejaVu Sans';

export const STYLE = {
  /** Spin-allowed curves and levels (the ground state's spin), and the high-spin side of a crossover. */
  allowed: '#1d4e89',
  /** Spin-allowed curves on the low-spin side of a crossover. */
  allowedLowSpin: '#a4431c',
  /** Spin-forbidden curves and levels. */
  forbidden: '#9aa7b4',
  /** Labels of spin-forbidden curves (a little darker than the curves, to stay legible). */
  forbiddenText: '#6b7885',
  /** Axes, frame and ordinary text. */
  ink: '#222222',
  /** Secondary text: captions, keys. */
  muted: '#555d66',
  /** Grid lines. */
  grid: '#e8ebee',
  /** The change of ground state. */
  crossover: '#3a3a3a',
  /** The sample's line and observed bands. */
  sample: '#1b8a5a',
  allowedWidth: 2.2,
  forbiddenWidth: 0.9,
  titleSize: 17,
  axisTitleSize: 15,
  tickSize: 13,
  labelSize: 13,
  smallSize: 12,
} as const;
