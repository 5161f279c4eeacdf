/**
 * Option parsing and option builders shared by the commands: numbers, the ion or configuration,
 * Racah parameters and where C/B comes from, geometry, spin state and level labels, each checked
 * once into typed values; the help texts of shared options are built from the named defaults.
 */

import {
  DEFAULT_PRESET_DPI,
  FIGURE_SIZES,
  type FigureOptions,
  type FigureSize,
} from '../charts/figureFormat.js';
import { parseConfiguration } from '../src/atom/terms.js';
import { DEFAULT_C_OVER_B, DEFAULT_GEOMETRY } from '../src/core/defaults.js';
import { InputError } from '../src/core/errors.js';
import type { Geometry } from '../src/core/geometry.js';
import { type FreeIon, findIon } from '../src/core/ions.js';
import {
  B_LIMIT,
  C_LIMIT,
  C_OVER_B_LIMIT,
  COMPLEX_B_LIMIT,
  checkLimit,
  DELTA_OVER_B_LIMIT,
  DPI_LIMIT,
  DQ_LIMIT,
  type Limit,
  limitText,
  parseDecimal,
  parseWithin,
} from '../src/core/limits.js';
import { chooseRatio, type RatioChoice } from '../src/core/ratioChoice.js';
import { type CubicResult, solveCubic } from '../src/field/cubic.js';

export type { RatioChoice };

/** The `--geometry` option with its default, for `.option(...GEOMETRY_OPTION)`. */
export const GEOMETRY_OPTION = [
  '--geometry <oct|tet>',
  'octahedral or tetrahedral',
  DEFAULT_GEOMETRY,
] as const;

/** Help text of a `--cb` option: what the C/B is for, then where it comes from when not given. */
export function cbHelp(lead: string): string {
  return `${lead} (default: the free-ion ratio of the ion, else ${DEFAULT_C_OVER_B})`;
}

/**
 * Parses a number option: plain decimal digits only (no `0x10`, no empty text), checked against
 * the quantity's range in `src/core/limits.ts`.
 * @throws InputError `--B "1e308": expected a number of cm⁻¹ from 0 to 5000`.
 */
export function numberOption(name: string, text: string | undefined, limit: Limit): number | undefined {
  return text === undefined ? undefined : parseWithin(name, text, limit);
}

/** Like {@link numberOption} but the option must be present. */
export function requiredNumber(name: string, text: string | undefined, limit: Limit): number {
  const v = numberOption(name, text, limit);
  if (v === undefined) throw new InputError(`${name} is required`);
  return v;
}

/**
 * Parses a number option with an optional uncertainty, `2300` or `2300±60` (also `+-`), in
 * cm⁻¹ without a unit: Racah parameters and Dq are not energies of light, so nm or eV would
 * not mean what they seem.
 * @throws InputError naming the option and the text.
 */
export function numberWithSigma(
  name: string,
  text: string | undefined,
  limit: Limit,
): { value: number; sigma?: number } | undefined {
  if (text === undefined) return undefined;
  const [main = '', spread, ...extra] = text.split(/±|\+\/-|\+-/);
  if (extra.length > 0) throw new InputError(`${name} "${text}": expected a number with at most one ±`);
  const value = checkLimit(name, parseDecimal(name, main, limit.what), limit, text.trim());
  if (spread === undefined) return { value };
  const sigma = parseDecimal(`${name} uncertainty`, spread, 'a positive number');
  if (!(sigma >= 1e-3) || !(sigma <= limit.max)) {
    throw new InputError(`${name} "${text}": expected an uncertainty from 0.001 to ${limit.max} after ±`);
  }
  return { value, sigma };
}

/**
 * Checks the Δ/B = 10Dq/B a sample's Dq and B imply, naming both options as given.
 * @throws InputError `--dq "10000" with B = 10 cm⁻¹ gives Δ/B = 10000: expected Δ/B up to 200`.
 */
export function checkSampleRatio(dqText: string | undefined, dq: number, B: number): void {
  const ratio = (10 * dq) / B;
  if (!(ratio <= DELTA_OVER_B_LIMIT.max)) {
    throw new InputError(
      `--dq "${dqText?.trim()}" with B = ${Number(B.toPrecision(4))} cm⁻¹ gives Δ/B = 10Dq/B = ${Number(ratio.toPrecision(4))}: expected Δ/B up to ${DELTA_OVER_B_LIMIT.max}`,
    );
  }
}

/** Parses `--geometry`. */
export function geometryOption(text: string | undefined): Geometry {
  const g = (text ?? DEFAULT_GEOMETRY).trim().toLowerCase();
  if (g === 'oct' || g === 'oh' || g === 'octahedral') return 'oct';
  if (g === 'tet' || g === 'td' || g === 'tetrahedral') return 'tet';
  throw new InputError(`--geometry "${text}": expected oct or tet`);
}

/** The ion (if named) and the d-electron count, from `--ion` and/or `--d`. */
export interface IonChoice {
  readonly n: number;
  readonly ion?: FreeIon;
}

/** Resolves `--ion` / `--d`, checking they agree. */
export function ionOrCount(
  ionText: string | undefined,
  dText: string | undefined,
  range = { min: 1, max: 9 },
): IonChoice {
  const ion = ionText === undefined ? undefined : findIon(ionText);
  const d = numberOption('--d', dText, {
    what: 'a whole number',
    min: range.min,
    max: range.max,
    integer: true,
  });
  if (ion && d !== undefined && ion.n !== d) {
    throw new InputError(`--d ${d} disagrees with --ion ${ion.ion}, which is d${ion.n}`);
  }
  const n = ion?.n ?? d;
  if (n === undefined) throw new InputError('give the ion (--ion Cr3+) or the d-electron count (--d 3)');
  if (n < range.min || n > range.max) {
    throw new InputError(`${ion?.ion ?? `d${n}`} has d${n}: expected d${range.min} to d${range.max} here`);
  }
  return ion ? { n, ion } : { n };
}

/**
 * n and the ion from a configuration argument (`d6`, or a bare `6`) and/or `--ion`, checked
 * against each other.
 */
export function configOrIon(configText: string | undefined, ionText: string | undefined): IonChoice {
  const ion = ionText === undefined ? undefined : findIon(ionText);
  if (configText === undefined) {
    if (!ion) throw new InputError('give the configuration (e.g. d6) or the ion (--ion Co3+)');
    return { n: ion.n, ion };
  }
  const config = parseConfiguration(/^\d$/.test(configText.trim()) ? `d${configText.trim()}` : configText);
  if (config.l !== 2) {
    throw new InputError(`configuration ${config.text}: expected a d configuration (expected d1 to d9)`);
  }
  if (config.n < 1 || config.n > 9) throw new InputError(`configuration ${config.text}: expected d1 to d9`);
  if (ion && ion.n !== config.n) {
    throw new InputError(`configuration ${config.text} disagrees with --ion ${ion.ion}, which is d${ion.n}`);
  }
  return ion ? { n: config.n, ion } : { n: config.n };
}

/**
 * C/B from `--C` (with B), `--cb`, the ion's free-ion ratio, or the default — in that order;
 * `--C` and `--cb` together are refused.
 */
export function ratioChoice(
  B: number | undefined,
  cText: string | undefined,
  cbText: string | undefined,
  ion: FreeIon | undefined,
): RatioChoice {
  if (cText !== undefined && cbText !== undefined) throw new InputError('give --C or --cb, not both');
  const C = numberOption('--C', cText, C_LIMIT);
  if (C !== undefined) {
    if (B === undefined || B === 0) throw new InputError('--C needs a positive --B to go with it');
    const cOverB = C / B;
    if (!(cOverB >= C_OVER_B_LIMIT.min && cOverB <= C_OVER_B_LIMIT.max)) {
      throw new InputError(
        `--C "${cText?.trim()}" with B = ${B} cm⁻¹ gives C/B = ${Number(cOverB.toPrecision(3))}: expected C/B ${limitText(C_OVER_B_LIMIT).replace(/^a positive number /, '')}`,
      );
    }
    return { cOverB, origin: 'given' };
  }
  const cb = numberOption('--cb', cbText, C_OVER_B_LIMIT);
  return chooseRatio(cb === undefined ? undefined : { cOverB: cb, origin: 'given as C/B' }, ion);
}

/** Parses `--spin-state`. */
export function spinStateOption(text: string): 'high' | 'low' {
  const t = text.trim().toLowerCase();
  if (t === 'high' || t === 'hs' || t === 'high-spin') return 'high';
  if (t === 'low' || t === 'ls' || t === 'low-spin') return 'low';
  throw new InputError(`--spin-state "${text}": expected high or low`);
}

/**
 * Splits a comma-separated list of level labels, keeping commas inside parentheses
 * (`3T1g(H,1)`).
 */
export function splitLabels(text: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let current = '';
  for (const c of text) {
    if (c === '(') depth++;
    if (c === ')') depth = Math.max(0, depth - 1);
    if (c === ',' && depth === 0) {
      out.push(current.trim());
      current = '';
    } else {
      current += c;
    }
  }
  out.push(current.trim());
  return out;
}

/** Where C comes from for one d electron or hole, where B and C play no part. */
export const SINGLE_ELECTRON_ORIGIN = 'B and C play no part for one d electron or hole';

/** The options that give levels of dⁿ: the ion or n, geometry, Dq, B and C or C/B. */
export interface LevelOptions {
  ion?: string;
  d?: string;
  dq?: string;
  B?: string;
  C?: string;
  cb?: string;
  geometry?: string;
}

/** Levels solved from options, with where C came from and the ion's name. */
export interface SolvedLevels {
  readonly result: CubicResult;
  readonly cOrigin: string;
  readonly ion?: string;
}

/** Checks the level options and solves the levels. */
export function levelsFromOptions(opts: LevelOptions): SolvedLevels {
  const choice = ionOrCount(opts.ion, opts.d);
  const geometry = geometryOption(opts.geometry);
  const dq = requiredNumber('--dq', opts.dq, DQ_LIMIT);
  const single = choice.n === 1 || choice.n === 9;
  const B = single
    ? (numberOption('--B', opts.B, B_LIMIT) ?? 0)
    : requiredNumber('--B', opts.B, COMPLEX_B_LIMIT);
  const ratio = ratioChoice(B, opts.C, opts.cb, choice.ion);
  const result = solveCubic({ n: choice.n, geometry, dq, B, C: B * ratio.cOverB });
  return {
    result,
    cOrigin: single ? SINGLE_ELECTRON_ORIGIN : ratio.origin,
    ...(choice.ion ? { ion: choice.ion.ion } : {}),
  };
}

/** `--size`: a figure for one or two journal columns. */
export const SIZE_OPTION = [
  '--size <columns>',
  'figure width for a journal: one-column (85 mm) or two-column (175 mm)',
] as const;

/** `--dpi`: resolution of a PNG figure. */
export const DPI_OPTION = [
  '--dpi <n>',
  `PNG resolution in pixels per inch (default ${DEFAULT_PRESET_DPI} with --size, else 192)`,
] as const;

/** The size preset and PNG resolution of `--size` and `--dpi`. */
export function figureSizeOptions(opts: {
  size?: string;
  dpi?: string;
}): Pick<FigureOptions, 'size' | 'dpi'> {
  const size = opts.size?.trim();
  if (size !== undefined && !(size in FIGURE_SIZES)) {
    throw new InputError(`--size "${opts.size}": expected ${Object.keys(FIGURE_SIZES).join(' or ')}`);
  }
  const dpi = numberOption('--dpi', opts.dpi, DPI_LIMIT);
  return {
    ...(size !== undefined ? { size: size as FigureSize } : {}),
    ...(dpi !== undefined ? { dpi } : {}),
  };
}

/** A range `from:to` of two increasing numbers (for zooming a figure), or undefined. */
export function rangeOption(name: string, text: string | undefined): readonly [number, number] | undefined {
  if (text === undefined) return undefined;
  const parts = text.split(':').map((p) => Number(p.trim()));
  const [from, to] = parts;
  if (
    parts.length !== 2 ||
    from === undefined ||
    to === undefined ||
    !(Number.isFinite(from) && Number.isFinite(to)) ||
    !(to > from) ||
    from < 0
  )
    throw new InputError(`${name} "${text}": expected from:to, two increasing numbers ≥ 0, e.g. 10:30`);
  return [from, to];
}
