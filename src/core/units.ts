/**
 * Energy units at the edges of the program. Inside, every energy is a wavenumber in cm⁻¹.
 */

import { InputError } from './errors.js';
import { ENERGY_LIMIT } from './limits.js';

/** cm⁻¹ per eV: 1 eV / (h c) = 8065.543937… cm⁻¹ (CODATA 2018). */
export const CM_PER_EV = 8065.543937;

/** Units an energy may be given in. */
export type EnergyUnit = 'cm-1' | 'nm' | 'eV' | 'kK';

/** Wavelength in nm of a wavenumber in cm⁻¹ (λ = 10⁷ / ν̃). */
export function cmToNm(cm: number): number {
  return 1e7 / cm;
}

/** Energy in eV of a wavenumber in cm⁻¹. */
export function cmToEv(cm: number): number {
  return cm / CM_PER_EV;
}

/** A value in `unit` converted to cm⁻¹. */
export function toWavenumber(value: number, unit: EnergyUnit): number {
  switch (unit) {
    case 'cm-1':
      return value;
    case 'nm':
      return 1e7 / value;
    case 'eV':
      return value * CM_PER_EV;
    case 'kK':
      return value * 1000;
  }
}

const UNIT_ALIASES: Readonly<Record<string, EnergyUnit>> = {
  'cm-1': 'cm-1',
  'cm^-1': 'cm-1',
  'cm⁻¹': 'cm-1',
  '/cm': 'cm-1',
  wavenumber: 'cm-1',
  nm: 'nm',
  ev: 'eV',
  kk: 'kK',
};

/**
 * Parses a unit name (`cm-1`, `cm^-1`, `nm`, `eV`, `kK`; case-insensitive).
 * @throws InputError naming the text.
 */
export function parseUnit(text: string): EnergyUnit {
  const unit = text.trim() === '' ? undefined : UNIT_ALIASES[text.trim().toLowerCase()];
  if (!unit) {
    throw new InputError(`unit "${text}": expected cm-1, nm, eV or kK`);
  }
  return unit;
}

/** An energy read from text, in cm⁻¹, with its uncertainty when one was given. */
export interface ParsedEnergy {
  readonly value: number;
  readonly sigma?: number;
}

/**
 * Parses one energy such as `25300`, `25.3kK`, `395nm`, `1.05 eV`, `25300±300`, `25300+-300` or
 * `395nm±5` (the uncertainty in the value's unit, carried through the conversion to cm⁻¹).
 * A bare number takes `defaultUnit`.
 * @throws InputError naming the text when it is not a positive number with a known unit.
 */
export function parseEnergy(text: string, defaultUnit: EnergyUnit = 'cm-1'): ParsedEnergy {
  const [main = '', spread, ...extra] = text.split(/±|\+-|\+\/-/);
  const value = splitNumber(main, text);
  if (extra.length > 0 || value === undefined) {
    throw new InputError(
      `energy "${text}": expected a positive number with an optional unit (cm-1, nm, eV, kK)`,
    );
  }
  const sigmaPart = spread === undefined ? undefined : splitNumber(spread, text);
  if (spread !== undefined && sigmaPart === undefined) {
    throw new InputError(`uncertainty in "${text}": expected a positive number after ±`);
  }
  const unitText = value.unit !== '' ? value.unit : (sigmaPart?.unit ?? '');
  const unit = unitText === '' ? defaultUnit : parseUnit(unitText);
  if (sigmaPart && sigmaPart.unit !== '' && parseUnit(sigmaPart.unit) !== unit) {
    throw new InputError(`energy "${text}": the value and its uncertainty must be in the same unit`);
  }
  if (!(value.number > 0)) throw new InputError(`energy "${text}": expected a positive number`);
  const cm = toWavenumber(value.number, unit);
  if (!(cm >= ENERGY_LIMIT.min && cm <= ENERGY_LIMIT.max)) {
    throw new InputError(
      `energy "${text}": expected ${ENERGY_LIMIT.min} to ${ENERGY_LIMIT.max} cm⁻¹ (${1e7 / ENERGY_LIMIT.max} to ${1e7 / ENERGY_LIMIT.min} nm)`,
    );
  }
  if (!sigmaPart) return { value: cm };
  if (!(sigmaPart.number > 0)) throw new InputError(`uncertainty in "${text}": expected a positive number`);
  // Through the conversion: σ(ν̃) = |dν̃/dx| σ(x).
  const sigma =
    unit === 'nm' ? (1e7 / value.number ** 2) * sigmaPart.number : toWavenumber(sigmaPart.number, unit);
  if (!(sigma >= 1e-3 && sigma <= cm)) {
    throw new InputError(
      `uncertainty in "${text}": expected at least 0.001 cm⁻¹ and less than the energy itself`,
    );
  }
  return { value: cm, sigma };
}

function splitNumber(part: string, whole: string): { number: number; unit: string } | undefined {
  const m = /^\s*(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(\S*)\s*$/.exec(part);
  if (!m) return undefined;
  const number = Number(`${m[1]}${m[2] !== undefined ? `e${m[2]}` : ''}`);
  if (!Number.isFinite(number)) throw new InputError(`energy "${whole}": number out of range`);
  return { number, unit: m[3] ?? '' };
}

/** Parses a comma-separated list of energies (see {@link parseEnergy}). */
export function parseEnergyList(text: string, defaultUnit: EnergyUnit = 'cm-1'): ParsedEnergy[] {
  const items = text.split(/[,;]/).map((s) => s.trim());
  if (items.every((s) => s === ''))
    throw new InputError(`energy list "${text}": expected one or more values`);
  const empty = items.indexOf('');
  if (empty >= 0) throw new InputError(`energy list "${text}": item ${empty + 1} is empty`);
  return items.map((s) => parseEnergy(s, defaultUnit));
}
