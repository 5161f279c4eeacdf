/**
 * Where the C/B of a calculation comes from, worked out in one place: a value given by the user
 * (with its own wording of the origin), else the free ion's own ratio, else the default.
 */

import { DEFAULT_C_OVER_B } from './defaults.js';
import { type FreeIon, freeIonRatio } from './ions.js';

/** A C/B and a human-readable note of where it came from. */
export interface RatioChoice {
  readonly cOverB: number;
  /** E.g. `"given"`, `"free-ion ratio of Cr3+"`, `"default 4.5, no ion named"`. */
  readonly origin: string;
}

/**
 * The C/B to use: `given` when there is one, else the free-ion ratio of `ion`, else
 * {@link DEFAULT_C_OVER_B} with a note of why.
 */
export function chooseRatio(given: RatioChoice | undefined, ion: FreeIon | undefined): RatioChoice {
  if (given) return given;
  const ratio = ion ? freeIonRatio(ion) : undefined;
  if (ion && ratio !== undefined) return { cOverB: ratio, origin: `free-ion ratio of ${ion.ion}` };
  return {
    cOverB: DEFAULT_C_OVER_B,
    origin: ion
      ? `default ${DEFAULT_C_OVER_B}, no free-ion C/B for ${ion.ion}`
      : `default ${DEFAULT_C_OVER_B}, no ion named`,
  };
}
