/**
 * JCAMP-DX spectra (the IUPAC exchange format: McDonald & Wilks, Appl. Spectrosc. 42, 151,
 * 1988), decoded by the jcampconverter package, which handles the compressed data forms.
 * The first block with XY data is read; its ##XUNITS and ##YUNITS give the units.
 */

import { convert } from 'jcampconverter';
import { InputError } from '../core/errors.js';
import type { RawSpectrum } from './rawSpectrum.js';
import type { SpectrumXUnit, SpectrumYUnit, UnitChoice } from './spectrumUnits.js';

/** Whether text looks like JCAMP-DX: its first labelled record is `##TITLE=`. */
export function isJcamp(text: string): boolean {
  return /^\uFEFF?\s*##TITLE\s*=/i.test(text);
}

const X_UNITS: Readonly<Record<string, SpectrumXUnit>> = {
  NANOMETERS: 'nm',
  NANOMETER: 'nm',
  NM: 'nm',
  '1/CM': 'cm-1',
  'CM-1': 'cm-1',
  'CM^-1': 'cm-1',
  WAVENUMBERS: 'cm-1',
  EV: 'eV',
};

/*
 * In JCAMP-DX, YUNITS=TRANSMITTANCE holds fractions (0–1); per cent is written out
 * (McDonald & Wilks 1988, from memory).
 */
const Y_UNITS: Readonly<Record<string, SpectrumYUnit>> = {
  ABSORBANCE: 'absorbance',
  TRANSMITTANCE: 'transmittance',
  '%TRANSMITTANCE': 'transmittance-percent',
  'PERCENT TRANSMITTANCE': 'transmittance-percent',
  '% TRANSMITTANCE': 'transmittance-percent',
  'MOLAR ABSORPTIVITY': 'epsilon',
  'L MOL-1 CM-1': 'epsilon',
  'M-1 CM-1': 'epsilon',
  'KUBELKA-MUNK': 'arbitrary',
};

/**
 * Reads the first XY spectrum of a JCAMP-DX text.
 * @throws InputError when there is no XY data, or the data are not finite numbers.
 */
export function parseJcampSpectrum(text: string): RawSpectrum {
  let entries: ReturnType<typeof convert>['flatten'];
  try {
    entries = convert(text).flatten;
  } catch (e) {
    throw new InputError(`not readable as JCAMP-DX: ${e instanceof Error ? e.message : String(e)}`);
  }
  const spectrum = entries.flatMap((e) => e.spectra).find((s) => s.data.x && s.data.y);
  if (!spectrum) throw new InputError('no XY data (##XYDATA or ##PEAK TABLE) found in the JCAMP-DX text');
  const xs = spectrum.data.x as number[];
  const ys = spectrum.data.y as number[];
  if (xs.length < 2)
    throw new InputError(`only ${xs.length} point in the JCAMP-DX data: a spectrum needs more`);
  for (let i = 0; i < xs.length; i++) {
    for (const [axis, v] of [
      ['x', xs[i]],
      ['y', ys[i]],
    ] as const) {
      if (v === undefined || !Number.isFinite(v)) {
        throw new InputError(
          `point ${i + 1} of the JCAMP-DX data: ${axis} value ${String(v)} is not a number`,
        );
      }
    }
  }
  const xText = String(spectrum.xUnits ?? '').trim();
  const yText = String(spectrum.yUnits ?? '').trim();
  const xUnit = unitOf(X_UNITS, xText, 'XUNITS');
  const yUnit = unitOf(Y_UNITS, yText, 'YUNITS');
  return {
    x: Float64Array.from(xs),
    y: Float64Array.from(ys),
    xLabel: xText || 'x',
    yLabel: yText || 'y',
    ...(xUnit ? { xUnit } : {}),
    ...(yUnit ? { yUnit } : {}),
    format: 'JCAMP-DX',
  };
}

function unitOf<U>(
  table: Readonly<Record<string, U>>,
  text: string,
  label: string,
): UnitChoice<U> | undefined {
  const unit = table[text.toUpperCase().replace(/\s+/g, ' ')];
  return unit === undefined ? undefined : { unit, origin: `JCAMP-DX ##${label}=${text}` };
}
