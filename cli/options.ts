import {
  DEFAULT_C_OVER_B,
  type FreeIon,
  findIon,
  freeIonRatio,
  type Geometry,
  InputError,
} from '../src/index.js';

/** Option parsing shared by the commands: numbers, ions, Racah parameters, geometry. */

/**
 * Parses a number option. `min` is inclusive unless `positive`.
 * @throws InputError `--B "-5": expected a positive number (cm⁻¹)`.
 */
export function numberOption(
  name: string,
  text: string | undefined,
  rule: { positive?: boolean; min?: number; integer?: boolean; what?: string } = {},
): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text.trim());
  const what = rule.what ?? 'a number';
  const fail = (expected: string) => new InputError(`${name} "${text}": expected ${expected}`);
  if (text.trim() === '' || !Number.isFinite(value)) throw fail(what);
  if (rule.integer && !Number.isInteger(value)) throw fail(`a whole number`);
  if (rule.positive && !(value > 0)) throw fail(`a positive ${what.replace(/^an? (positive )?/, '')}`);
  // "non-negative" already says ≥ 0.
  if (rule.min !== undefined && value < rule.min)
    throw fail(rule.min === 0 && /non-negative/.test(what) ? what : `${what} ≥ ${rule.min}`);
  return value;
}

/** Like {@link numberOption} but the option must be present. */
export function requiredNumber(
  name: string,
  text: string | undefined,
  rule: Parameters<typeof numberOption>[2] = {},
): number {
  const v = numberOption(name, text, rule);
  if (v === undefined) throw new InputError(`${name} is required`);
  return v;
}

/** Parses `--geometry`. */
export function geometryOption(text: string | undefined): Geometry {
  const g = (text ?? 'oct').trim().toLowerCase();
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
  const d = numberOption('--d', dText, { integer: true, what: 'a whole number' });
  if (d !== undefined && (d < range.min || d > range.max)) {
    throw new InputError(`--d "${dText}": expected a whole number from ${range.min} to ${range.max}`);
  }
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

/** Racah C and where it came from. */
export interface RatioChoice {
  readonly cOverB: number;
  /** Human-readable origin, e.g. `"given"`, `"free-ion ratio of Cr3+"`, `"default 4.5, no ion named"`. */
  readonly origin: string;
}

/**
 * C/B from `--C` (with B), `--cb`, the ion's free-ion ratio, or the default 4.5 — in that order;
 * `--C` and `--cb` together are refused.
 */
export function ratioChoice(
  B: number | undefined,
  cText: string | undefined,
  cbText: string | undefined,
  ion: FreeIon | undefined,
): RatioChoice {
  if (cText !== undefined && cbText !== undefined) throw new InputError('give --C or --cb, not both');
  const C = numberOption('--C', cText, { min: 0, what: 'a non-negative number of cm⁻¹' });
  if (C !== undefined) {
    if (B === undefined || B === 0) throw new InputError('--C needs a positive --B to go with it');
    return { cOverB: C / B, origin: 'given' };
  }
  const cb = numberOption('--cb', cbText, { positive: true, what: 'a positive number' });
  if (cb !== undefined) return { cOverB: cb, origin: 'given as C/B' };
  const ratio = ion ? freeIonRatio(ion) : undefined;
  if (ion && ratio !== undefined) return { cOverB: ratio, origin: `free-ion ratio of ${ion.ion}` };
  return {
    cOverB: DEFAULT_C_OVER_B,
    origin: ion
      ? `default ${DEFAULT_C_OVER_B}, no free-ion C/B for ${ion.ion}`
      : `default ${DEFAULT_C_OVER_B}, no ion named`,
  };
}
