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
  'KUBELKA-MUNK': 'kubelka-munk',
  REFLECTANCE: 'reflectance',
  '%REFLECTANCE': 'reflectance-percent',
  '% REFLECTANCE': 'reflectance-percent',
  'PERCENT REFLECTANCE': 'reflectance-percent',
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
  checkHeader(text, xs, ys);
  // A record runs to the next `##`; only its first line is the unit (the rest is a broken file).
  const xText = firstLine(spectrum.xUnits);
  const yText = firstLine(spectrum.yUnits);
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

function firstLine(value: unknown): string {
  return (String(value ?? '').split(/[\r\n]/)[0] ?? '').trim();
}

function unitOf<U>(
  table: Readonly<Record<string, U>>,
  text: string,
  label: string,
): UnitChoice<U> | undefined {
  const unit = table[text.toUpperCase().replace(/\s+/g, ' ')];
  return unit === undefined ? undefined : { unit, origin: `JCAMP-DX ##${label}=${text}` };
}

/** The labelled records before the first data table, by label without spaces, dashes or slashes. */
function headerRecords(text: string): Map<string, string> {
  const records = new Map<string, string>();
  for (const line of text.split(/\r?\n/)) {
    const m = /^\s*##([^=]+)=(.*)$/.exec(line);
    if (!m) continue;
    const label = (m[1] ?? '').toUpperCase().replace(/[\s\-/_]/g, '');
    if (label === 'XYDATA' || label === 'PEAKTABLE' || label === 'XYPOINTS') {
      records.set(label, text.slice(text.indexOf(line) + line.length).replace(/^\r?\n/, ''));
      break;
    }
    if (!records.has(label)) records.set(label, (m[2] ?? '').trim());
  }
  return records;
}

/** Whether two numbers agree to about one part in 10⁴ of the larger. */
function agree(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-4 * Math.max(Math.abs(a), Math.abs(b), 1e-12);
}

/**
 * Holds the decoded data against the header's ##NPOINTS, ##FIRSTX, ##LASTX, ##XFACTOR,
 * ##FIRSTY and ##YFACTOR, so a wrong header is refused instead of silently rescaling or
 * re-spacing the spectrum.
 * @throws InputError naming the record that disagrees with the data.
 */
function checkHeader(text: string, xs: readonly number[], ys: readonly number[]): void {
  const h = headerRecords(text);
  const num = (label: string): number | undefined => {
    const v = h.get(label);
    if (v === undefined) return undefined;
    const n = Number(v);
    if (v === '' || !Number.isFinite(n)) throw new InputError(`##${label}=${v}: expected a number`);
    return n;
  };
  const npoints = num('NPOINTS');
  if (npoints !== undefined && npoints !== xs.length) {
    throw new InputError(
      `##NPOINTS=${npoints}, but the data hold ${xs.length} points: the header or the data are wrong`,
    );
  }
  const firstX = num('FIRSTX');
  const lastX = num('LASTX');
  if (firstX !== undefined && !agree(xs[0] as number, firstX)) {
    throw new InputError(`##FIRSTX=${firstX}, but the first x of the data is ${xs[0]}`);
  }
  if (lastX !== undefined && !agree(xs[xs.length - 1] as number, lastX)) {
    throw new InputError(`##LASTX=${lastX}, but the last x of the data is ${xs[xs.length - 1]}`);
  }
  const xFactor = num('XFACTOR');
  const firstLine = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)/.exec(h.get('XYDATA') ?? '');
  if (xFactor !== undefined && firstX !== undefined && firstLine) {
    const x0 = Number(firstLine[1]) * xFactor;
    if (!agree(x0, firstX)) {
      throw new InputError(
        `##XFACTOR=${xFactor}: the first x of the data, ${firstLine[1]} × ${xFactor} = ${x0}, is not ##FIRSTX=${firstX}`,
      );
    }
  }
  const firstY = num('FIRSTY');
  if (firstY !== undefined && !agree(ys[0] as number, firstY)) {
    const factor = h.get('YFACTOR');
    throw new InputError(
      `##FIRSTY=${firstY}, but the first y of the data is ${ys[0]}${factor === undefined ? ' (no ##YFACTOR)' : ` after ##YFACTOR=${factor}`}: the factor or the data are wrong`,
    );
  }
}
