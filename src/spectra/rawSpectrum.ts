/**
 * A spectrum as read from a file, before any unit is applied: the chosen x and y columns in
 * file order, where each point came from, and what the file itself says about units; and the
 * check that x runs one way.
 */

import { InputError } from '../core/errors.js';
import type { SpectrumXUnit, SpectrumYUnit, UnitChoice } from './spectrumUnits.js';

/** A `key: value` or `key=value` line of the file's header (instrument, date, settings). */
export interface RawMetadata {
  /** 1-based line number. */
  readonly line: number;
  readonly key: string;
  readonly value: string;
}

/** The spectrum as read. */
export interface RawSpectrum {
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** The 1-based line of each point in a text file; absent when points have no lines. */
  readonly lines?: Uint32Array;
  /** Header text of the x column, or `column 1` when there is none. */
  readonly xLabel: string;
  /** Header text of the y column, or `column 2` when there is none. */
  readonly yLabel: string;
  /** The x unit the file names, if it names one. */
  readonly xUnit?: UnitChoice<SpectrumXUnit>;
  /** The y quantity the file names, if it names one. */
  readonly yUnit?: UnitChoice<SpectrumYUnit>;
  /** Which columns were read (1-based) of how many, in a text file. */
  readonly columns?: { readonly x: number; readonly y: number; readonly count: number };
  /** Metadata lines of the header, in file order (absent when there are none). */
  readonly metadata?: readonly RawMetadata[];
  /** How the file was read, e.g. `semicolon-delimited, decimal comma` or `JCAMP-DX`. */
  readonly format: string;
}

/** Where point `i` came from, for messages: `line 57` in a text file, else `point 12`. */
export function pointPlace(raw: Pick<RawSpectrum, 'lines'>, i: number): string {
  const line = raw.lines?.[i];
  return line === undefined ? `point ${i + 1}` : `line ${line}`;
}

/**
 * Checks that x runs one way (strictly up or strictly down) through the file: a repeated x or
 * a change of direction (two scans in one file, a pasted block) is refused at the point where
 * it happens.
 * @throws InputError naming the line (or point) and the values.
 */
export function ensureMonotonicX(raw: RawSpectrum): void {
  const { x } = raw;
  let direction = 0;
  for (let i = 1; i < x.length; i++) {
    const step = (x[i] as number) - (x[i - 1] as number);
    if (step === 0) {
      throw new InputError(
        `${pointPlace(raw, i)}: x = ${x[i]} repeats the x of ${pointPlace(raw, i - 1)}: expected each x once`,
      );
    }
    const sign = Math.sign(step);
    if (direction === 0) direction = sign;
    else if (sign !== direction) {
      throw new InputError(
        `${pointPlace(raw, i)}: x = ${x[i]} after ${x[i - 1]} breaks the ${direction > 0 ? 'rising' : 'falling'} ` +
          'order of x: expected one monotonic scan per file',
      );
    }
  }
}
