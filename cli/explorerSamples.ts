/**
 * The samples of an explorer page: from the command's options (an ion or dⁿ, with Dq and B
 * given, fitted to `--bands`, or a plain starting point), and from an analysed sample of a
 * sheet or report (its best fit). Spectra are read here and go into the page as numbers.
 */

import type { ExplorerSample, ExplorerSpectrum } from '../explorer/data.js';
import { DEFAULT_C_OVER_B } from '../src/core/defaults.js';
import type { Geometry } from '../src/core/geometry.js';
import type { FreeIon } from '../src/core/ions.js';
import { fitBands } from '../src/fit/fitBands.js';
import { absorptionSpectrum } from '../src/spectra/absorptionSpectrum.js';
import { readSpectrum } from '../src/spectra/spectrumAnalysis.js';
import { readTextFile } from './files.js';
import type { SampleResult } from './report/analyse.js';

/** Dq and B of the page when neither is given nor fitted, cm⁻¹: a mid-range starting point only. */
export const START_DQ = 1500;
export const START_B = 800;

/** Most spectrum points put into a page; a longer scan is thinned evenly. */
export const MAX_SPECTRUM_POINTS = 4000;

/** A spectrum file read into the page's form (wavenumbers rising). */
export function spectrumOfFile(path: string): ExplorerSpectrum {
  const s = absorptionSpectrum(readSpectrum(readTextFile(path), { fileName: path }));
  const every = Math.max(1, Math.ceil(s.wavenumber.length / MAX_SPECTRUM_POINTS));
  const wavenumber: number[] = [];
  const value: number[] = [];
  for (let i = 0; i < s.wavenumber.length; i += every) {
    wavenumber.push(s.wavenumber[i] as number);
    value.push(s.value[i] as number);
  }
  return { wavenumber, value, quantity: s.quantity };
}

/** What the command line gives for one sample. */
export interface OptionSample {
  readonly n: number;
  readonly ion?: FreeIon;
  readonly geometry: Geometry;
  readonly dq?: number;
  readonly B?: number;
  readonly cOverB: number;
  /** C/B was given (held in a fit), not the ion's or the default ratio (fitted where the bands fix it). */
  readonly cOverBGiven: boolean;
  readonly zeta?: number;
  readonly bands: readonly number[];
  readonly spectrum?: ExplorerSpectrum;
}

/** The page's sample from the options: Dq and B as given, else fitted to the bands, else a starting point. */
export function sampleOfOptions(o: OptionSample): ExplorerSample {
  const name = o.ion ? `${o.ion.ion}, ${o.geometry}` : `d${o.n}, ${o.geometry}`;
  let dq = o.dq;
  let B = o.B;
  let cOverB = o.cOverB;
  let origin = 'Dq and B as given';
  if ((dq === undefined || B === undefined) && o.bands.length > 0) {
    const best = fitBands({
      n: o.n,
      geometry: o.geometry,
      bands: o.bands.map((energy) => ({ energy })),
      ...(o.ion ? { freeIon: o.ion } : {}),
      cOverB: o.cOverB,
      ...(o.cOverBGiven ? { fitC: false } : {}),
    }).solutions[0];
    if (best) {
      dq ??= best.dq;
      B ??= best.bDetermined ? best.B : undefined;
      if (best.cFitted && best.cOverB !== null) cOverB = best.cOverB;
      origin = 'the best fit of the bands';
    }
  }
  if (dq === undefined || B === undefined) origin = 'a starting point (Dq and B not given)';
  return {
    name,
    ...(o.ion ? { ion: o.ion.ion } : {}),
    n: o.n,
    geometry: o.geometry,
    dq: round(dq ?? START_DQ),
    B: round(B ?? START_B),
    cOverB: Math.round(cOverB * 1e4) / 1e4,
    zeta: o.zeta ?? 0,
    bands: o.bands,
    ...(o.spectrum ? { spectrum: o.spectrum } : {}),
    origin,
  };
}

/** Starting values to 0.1 cm⁻¹: the sliders' steps are coarser, and the permalink stays short. */
function round(v: number): number {
  return Math.round(v * 10) / 10;
}

/** The page's sample from an analysed sample: its best fit, its observed bands and spectrum. */
export function sampleOfResult(r: SampleResult, spectrum?: ExplorerSpectrum): ExplorerSample {
  const B = r.best.B ?? START_B;
  const cOverB = r.best.C !== null && r.best.B ? r.best.C / r.best.B : (r.best.cOverB ?? DEFAULT_C_OVER_B);
  return {
    name: r.name,
    ion: r.ion,
    n: r.n,
    geometry: r.geometry,
    dq: round(r.best.dq),
    B: round(B),
    cOverB: Math.round(cOverB * 1000) / 1000,
    zeta: r.magnetism?.zeta ?? 0,
    bands: r.observed.map((o) => o.energy),
    ...(spectrum ? { spectrum } : {}),
    origin:
      r.best.B === null
        ? 'the best fit (B not fixed by the bands: a starting value)'
        : 'the best fit of the report',
  };
}
