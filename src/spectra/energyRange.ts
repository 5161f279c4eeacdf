/**
 * A window of energies written as text — two values joined by a hyphen or dash with one unit for
 * both (`330-1300nm`, `8000-30000`, `1.2-3.6 eV`) — read into cm⁻¹.
 */

import { InputError } from '../core/errors.js';
import { parseEnergy, parseUnit } from '../core/units.js';

const RANGE_NUMBER = String.raw`(\d+(?:\.\d*)?|\.\d+)`;
const RANGE_UNIT = String.raw`(nm|cm-1|cm\^-1|cm⁻¹|1/cm|ev|kk)`;
const RANGE = new RegExp(
  String.raw`^\s*${RANGE_NUMBER}\s*${RANGE_UNIT}?\s*[-–—]\s*${RANGE_NUMBER}\s*${RANGE_UNIT}?\s*$`,
  'i',
);

/**
 * Parses a window: two energies joined by a hyphen or dash, with one unit for both
 * (`330-1300nm`, `330nm-1300nm`, `8000-30000`, `1.2-3.6 eV`); bare numbers are cm⁻¹.
 * @returns the window in cm⁻¹, lower end first.
 * @throws InputError (naming the value as `--range`) when the text is not such a window.
 */
export function parseRange(text: string): { from: number; to: number } {
  const m = RANGE.exec(text);
  if (!m) {
    throw new InputError(
      `--range "${text}": expected two energies such as 330-1300nm, 8000-30000 or 1.2-3.6eV`,
    );
  }
  const [, first = '', firstUnit, second = '', secondUnit] = m;
  if (firstUnit && secondUnit && parseUnit(firstUnit) !== parseUnit(secondUnit)) {
    throw new InputError(`--range "${text}": the two ends are in different units`);
  }
  const unitText = secondUnit ?? firstUnit;
  const unit = unitText === undefined ? 'cm-1' : parseUnit(unitText);
  const a = parseEnergy(first, unit).value;
  const b = parseEnergy(second, unit).value;
  if (a === b) throw new InputError(`--range "${text}": the two ends are the same`);
  return { from: Math.min(a, b), to: Math.max(a, b) };
}
