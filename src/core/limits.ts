/**
 * The accepted range of every quantity a caller may give (Dq, B, C, C/B, Δ/B, energies, band
 * widths, point counts, worker threads, …), each written once, and the one check that refuses
 * text that is not a plain decimal number, values that are not finite, denormal values and values
 * outside the range, naming the option as the caller wrote it. The ranges are wide around the
 * values met in 3d chemistry (common practice, no source): they exist so that absurd input is
 * refused at once instead of overflowing, underflowing or running for hours.
 */

import { InputError } from './errors.js';

/** The accepted range of one quantity. */
export interface Limit {
  /** What the quantity is, for messages, e.g. `a number of cm⁻¹`. */
  readonly what: string;
  readonly min: number;
  readonly max: number;
  /** Whether `min` itself is refused (the quantity must be larger). @default false */
  readonly minExclusive?: boolean;
  /** Whether only whole numbers are accepted. @default false */
  readonly integer?: boolean;
}

/** Values this close to zero (but not zero) are refused: they underflow in products and ratios. */
export const DENORMAL_FLOOR = 1e-300;

/** Dq, cm⁻¹: 10Dq of 3d complexes stays below 40 000 cm⁻¹; 10⁴ leaves room for 4d/5d ions. */
export const DQ_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 0, max: 10_000 };

/** Racah B, cm⁻¹: free 3d ions have B ≤ about 1 300 cm⁻¹ (0 only where B plays no part). */
export const B_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 0, max: 5_000 };

/**
 * Racah B of a complex where it sets the scale (levels, diagrams, crossovers), cm⁻¹: complexes
 * of 3d ions have B of a few hundred cm⁻¹; below 10 the energies would be Dq alone.
 */
export const COMPLEX_B_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 10, max: 5_000 };

/** Racah C, cm⁻¹: free 3d ions have C ≤ about 5 500 cm⁻¹. */
export const C_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 0, max: 25_000 };

/** C/B, given or implied by C and B: 3d ions lie near 3.5–5.5, heavier ions up to about 8. */
export const C_OVER_B_LIMIT: Limit = { what: 'a positive number', min: 1, max: 20 };

/** Δ/B = 10Dq/B, the extent of a correlation diagram. */
export const DELTA_OVER_B_LIMIT: Limit = { what: 'a positive number', min: 0, max: 200, minExclusive: true };

/** E/B, the top of a correlation diagram's energy axis. */
export const ENERGY_OVER_B_LIMIT: Limit = { what: 'a positive number', min: 0.1, max: 1_000 };

/** A band energy or spectrum energy, cm⁻¹ (100 µm to 50 nm). */
export const ENERGY_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 100, max: 200_000 };

/** The narrowest band width (FWHM) looked for in a spectrum, cm⁻¹. */
export const BAND_WIDTH_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 1, max: 50_000 };

/** The number of bands fitted in one spectrum window. */
export const BAND_COUNT_LIMIT: Limit = { what: 'a whole number', min: 1, max: 30, integer: true };

/** The number of Δ/B points of a diagram: 5000 take a few seconds; far more only take minutes. */
export const POINTS_LIMIT: Limit = { what: 'a whole number', min: 2, max: 5_000, integer: true };

/** Concentration, mol/L. */
export const CONCENTRATION_LIMIT: Limit = { what: 'a number of mol/L', min: 1e-12, max: 100 };

/** Optical path length, cm. */
export const PATH_LENGTH_LIMIT: Limit = { what: 'a number of cm', min: 1e-6, max: 1_000 };

/**
 * Worker threads; the command line lowers the top to the machine's cores, since more threads
 * than cores only cost memory.
 */
export const JOBS_LIMIT: Limit = { what: 'a whole number', min: 1, max: 64, integer: true };

/** Spin–orbit ζ, cm⁻¹: the heaviest 5d ions have ζ of about 5000 cm⁻¹; 20 000 is already no d ion. */
export const ZETA_LIMIT: Limit = { what: 'a number of cm⁻¹ (or ion)', min: 0, max: 20_000 };

/** A reduction factor on ζ (covalency). */
export const ZETA_FACTOR_LIMIT: Limit = { what: 'a positive number', min: 0, max: 1.5, minExclusive: true };

/** Temperature, K, of a susceptibility table. */
export const TEMPERATURE_LIMIT: Limit = { what: 'a number of K', min: 0.1, max: 10_000 };

/** The number of steps of a temperature table or a distortion sweep. */
export const STEPS_LIMIT: Limit = { what: 'a whole number', min: 1, max: 5_000, integer: true };

/** The orbital reduction factor k. */
export const ORBITAL_REDUCTION_LIMIT: Limit = { what: 'a number', min: 0, max: 1 };

/** The spin g factor of the Zeeman term. */
export const G_FACTOR_LIMIT: Limit = { what: 'a positive number', min: 0.1, max: 10 };

/** Angular-overlap parameters (eσ, eπ, e_ds) and the general ligand-field parameters, cm⁻¹. */
export const AOM_LIMIT: Limit = { what: 'a number of cm⁻¹', min: -50_000, max: 50_000 };

/** A non-negative angular-overlap parameter such as e_ds, cm⁻¹. */
export const AOM_POSITIVE_LIMIT: Limit = { what: 'a number of cm⁻¹', min: 0, max: 50_000 };

/** A shape angle, degrees. */
export const ANGLE_LIMIT: Limit = { what: 'a number of degrees', min: 0, max: 180, minExclusive: true };

/** A distance, Å (coordination cut-off). */
export const DISTANCE_LIMIT: Limit = { what: 'a distance in Å', min: 0, max: 100, minExclusive: true };

/** A relative symmetry tolerance. */
export const TOLERANCE_LIMIT: Limit = { what: 'a positive number', min: 0, max: 1, minExclusive: true };

/** A distortion coordinate (ratio, angle or parameter, by the path). */
export const COORDINATE_LIMIT: Limit = { what: 'a number', min: -50_000, max: 50_000 };

/** How many spin-forbidden curves or levels a figure names. */
export const LABEL_COUNT_LIMIT: Limit = { what: 'a whole number', min: 0, max: 1_000, integer: true };

/** Resolution of a PNG figure, dots per inch. */
export const DPI_LIMIT: Limit = { what: 'a number of dots per inch', min: 30, max: 2_400 };

/**
 * Rows of numbers in one spectrum file. A 10⁶-row file is read and analysed in about 7 s with a
 * peak of about 340 MB (DEVELOPERS.md, big inputs); twice that is the most accepted, so memory
 * stays bounded. Finer data can be binned first: bands are found on a grid of about a tenth of
 * the narrowest band anyway.
 */
export const SPECTRUM_ROWS_LIMIT = 2_000_000;

/** Samples in one sample sheet: a report of 500 samples takes minutes; more is refused at once. */
export const SHEET_SAMPLES_LIMIT = 2_000;

/** A plain decimal number: optional sign, digits with an optional point, optional exponent. */
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** The range of `limit` in words, e.g. `a number of cm⁻¹ from 0 to 10000`. */
export function limitText(limit: Limit): string {
  if (limit.minExclusive && limit.min === 0) return `${limit.what} up to ${limit.max}`;
  const low = limit.minExclusive ? `above ${limit.min}` : `from ${limit.min}`;
  return `${limit.what} ${low} to ${limit.max}`;
}

/**
 * Checks a number against `limit`.
 * @param name the option or field as the caller wrote it, e.g. `--B`.
 * @param shown the value as the caller wrote it, for the message. @default String(value)
 * @throws InputError `--B "1e308": expected a number of cm⁻¹ from 0 to 5000`.
 */
export function checkLimit(name: string, value: number, limit: Limit, shown = String(value)): number {
  const fail = (why = '') => new InputError(`${name} "${shown}": expected ${limitText(limit)}${why}`);
  if (!Number.isFinite(value)) throw fail();
  if (value !== 0 && Math.abs(value) < DENORMAL_FLOOR) throw fail(' (the value is too close to zero)');
  if (limit.integer && !Number.isInteger(value)) throw fail();
  if (value < limit.min || (limit.minExclusive && value === limit.min) || value > limit.max) throw fail();
  return value;
}

/**
 * Reads a plain decimal number (`1740`, `-3.5`, `2.5e3`); hexadecimal, binary, `Infinity`,
 * empty text and anything else are refused.
 * @throws InputError naming `name` and the text.
 */
export function parseDecimal(name: string, text: string, what = 'a number'): number {
  const t = text.trim();
  if (!DECIMAL.test(t)) throw new InputError(`${name} "${text}": expected ${what} (plain decimal digits)`);
  return Number(t);
}

/** `limit` with its lower end refused too: zero is not accepted where the quantity must be positive. */
export function positive(limit: Limit): Limit {
  return { ...limit, minExclusive: true, what: limit.what.replace(/^an? /, 'a positive ') };
}

/** Reads a plain decimal number and checks it against `limit`. */
export function parseWithin(name: string, text: string, limit: Limit): number {
  return checkLimit(name, parseDecimal(name, text, limit.what), limit, text.trim());
}
