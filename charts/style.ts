/**
 * termsplit's house style, shared by every figure so they read as one family (written down in
 * DEVELOPERS.md, "Figures"): what the model predicts is blue (rust on the low-spin side of a
 * crossover), what was measured is a warm grey silhouette, a sample is violet with open
 * diamonds, spin-forbidden is light blue-grey; no grid and no legend box, a closed frame, labels
 * in the figure beside what they name; one type family at a few fixed sizes.
 */

import type { AbsorptionQuantity } from '../src/spectra/absorptionSpectrum.js';

/** The font family every figure is drawn in (shipped with the package, so the same everywhere). */
export const FONT_FAMILY = 'DejaVu Sans';

export const STYLE = {
  /** Spin-allowed curves and levels (the ground state's spin), the high-spin side of a crossover, predicted bands, the fit. */
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
  /** The change of ground state. */
  crossover: '#3a3a3a',
  /** The tint over the low-spin side of a diagram. */
  lowSpinTint: 'rgba(164, 67, 28, 0.045)',
  /** A sample: its line on a diagram, its observed bands, its point on a map. */
  sample: '#6a3d9a',
  /** A measured spectrum: a silhouette filled in this tint, outlined in `measuredLine`. */
  measuredFill: 'rgba(120, 110, 98, 0.16)',
  measuredLine: '#5e564c',
  /** Fitted Gaussian components of a spectrum (the fitted sum is `allowed`). */
  component: '#b07d1a',
  /** Charge-transfer bands and edges. */
  chargeTransfer: '#8c8c8c',
  /** Colours of groups (ions in a series), in order; each group also gets its own marker shape. */
  groups: ['#1d4e89', '#a4431c', '#6a3d9a', '#2f7d6d', '#b07d1a', '#555d66'],
  /** Marker shapes of groups, in chart.js's names: diamond, square, triangle, circle, star, cross. */
  markers: ['rectRot', 'rect', 'triangle', 'circle', 'star', 'crossRot'],
  allowedWidth: 2.2,
  forbiddenWidth: 0.9,
  /** Frame and axes. */
  frameWidth: 1,
  /** Marks across a plot: crossovers, a sample's line. */
  markWidth: 1.2,
  /** Leaders from labels to what they name. */
  leaderWidth: 0.7,
  /** Dash patterns, px: the change of ground state; a sample's line; a spin-forbidden mark; a baseline. */
  crossoverDash: [5, 4],
  sampleDash: [8, 3, 2, 3],
  forbiddenDash: [4, 3],
  baselineDash: [1, 3],
  titleSize: 17,
  axisTitleSize: 15,
  tickSize: 13,
  labelSize: 13,
  smallSize: 12,
} as const;

/** Tick labels in the house style. */
export const TICKS = { font: { size: STYLE.tickSize }, color: STYLE.ink };

/** An axis title in the house style. */
export function axisTitle(text: string) {
  return { display: true, text, font: { size: STYLE.axisTitleSize }, color: STYLE.ink };
}

/** Axis title of a spectrum's y quantity (also the heading of the band table in text output). */
export function quantityTitle(quantity: AbsorptionQuantity): string {
  if (quantity === 'epsilon') return 'ε / L mol⁻¹ cm⁻¹';
  if (quantity === 'absorbance') return 'Absorbance';
  if (quantity === 'kubelka-munk') return 'F(R) (Kubelka–Munk)';
  return 'Absorption / arb. units';
}
