/**
 * The `--zeta` and `--zeta-factor` options: the spin–orbit constant ζ as a number of cm⁻¹ or as
 * the named ion's free-ion value, times a reduction factor for covalency, checked into one ζ.
 */

import { InputError } from '../src/core/errors.js';
import type { FreeIon } from '../src/core/ions.js';
import { ZETA_FACTOR_LIMIT, ZETA_LIMIT } from '../src/core/limits.js';
import { checkZeta } from '../src/field/spinOrbit.js';
import { numberOption } from './options.js';

/** Help of `--zeta`. */
export const ZETA_HELP =
  'spin–orbit ζ, cm⁻¹, or "ion" for the free-ion value of --ion (adds the spin–orbit levels)';

/** Help of `--zeta-factor`. */
export const ZETA_FACTOR_HELP = 'multiply ζ by this reduction factor (covalency), 0–1.5';

/** Largest `--zeta-factor`: ζ in a complex is below the free-ion value; a little above allows for table error. */
export const MAX_ZETA_FACTOR = 1.5;

/**
 * ζ from `--zeta` (a number or `ion`) and `--zeta-factor`, or undefined when `--zeta` is absent.
 * @throws InputError naming the option and what was expected.
 */
export function zetaOption(
  zetaText: string | undefined,
  factorText: string | undefined,
  ion: FreeIon | undefined,
): number | undefined {
  if (zetaText === undefined) {
    if (factorText !== undefined)
      throw new InputError('--zeta-factor needs --zeta (a number of cm⁻¹, or ion)');
    return undefined;
  }
  let zeta: number;
  if (/^\s*(ion|free)\s*$/i.test(zetaText)) {
    if (!ion) throw new InputError(`--zeta "${zetaText}": needs --ion to take the free-ion value from`);
    if (ion.zeta === undefined)
      throw new InputError(`--zeta "${zetaText}": no free-ion ζ is tabulated for ${ion.ion}`);
    zeta = ion.zeta;
  } else {
    zeta = numberOption('--zeta', zetaText, ZETA_LIMIT) ?? 0;
  }
  const factor = numberOption('--zeta-factor', factorText, ZETA_FACTOR_LIMIT) ?? 1;
  if (factor > MAX_ZETA_FACTOR) {
    throw new InputError(
      `--zeta-factor "${factorText}": expected a positive number up to ${MAX_ZETA_FACTOR}`,
    );
  }
  try {
    checkZeta(zeta * factor);
  } catch (e) {
    throw new InputError(`--zeta "${zetaText}": ${(e as Error).message}`);
  }
  return zeta * factor;
}
