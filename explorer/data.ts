/**
 * The data an explorer page starts from, written into the page as JSON by the command line and
 * read by the page script: one entry per sample (its ion or dⁿ, geometry, starting parameters,
 * observed bands and spectrum), and the view's parameters with their ranges. Plain data, no DOM.
 */

import type { Geometry } from '../src/core/geometry.js';

/** A measured spectrum as the page draws it: wavenumbers (cm⁻¹, rising) and values. */
export interface ExplorerSpectrum {
  readonly wavenumber: readonly number[];
  readonly value: readonly number[];
  /** What the values are, e.g. `absorbance`. */
  readonly quantity: string;
}

/** One sample (or the one set of parameters given on the command line). */
export interface ExplorerSample {
  readonly name: string;
  /** The ion's name, e.g. `Ni2+`, when one was given. */
  readonly ion?: string;
  readonly n: number;
  readonly geometry: Geometry;
  /** Starting values, cm⁻¹ (C as C/B). */
  readonly dq: number;
  readonly B: number;
  readonly cOverB: number;
  readonly zeta: number;
  /** Observed band maxima, cm⁻¹. */
  readonly bands: readonly number[];
  readonly spectrum?: ExplorerSpectrum;
  /** Where the starting values came from, one line. */
  readonly origin: string;
}

/** Everything the page starts from. */
export interface ExplorerData {
  readonly title: string;
  readonly samples: readonly ExplorerSample[];
}

/** The parameters of the view, as the controls and the permalink hold them. */
export type ExplorerParams = { readonly sample: number } & Pick<
  ExplorerSample,
  'n' | 'geometry' | 'dq' | 'B' | 'cOverB' | 'zeta'
>;

/** One slider's range and step. */
export interface ParamRange {
  readonly min: number;
  readonly max: number;
  readonly step: number;
}

/** Slider ranges, cm⁻¹ except C/B: wide enough for 3d, 4d and 5d complexes (common practice, no source). */
export const PARAM_RANGES = {
  dq: { min: 0, max: 6000, step: 10 },
  B: { min: 50, max: 1500, step: 5 },
  cOverB: { min: 1, max: 10, step: 0.05 },
  zeta: { min: 0, max: 3000, step: 5 },
} as const satisfies Record<string, ParamRange>;

/** The id of the `<script type="application/json">` element holding {@link ExplorerData}. */
export const DATA_ELEMENT_ID = 'explorer-data';
