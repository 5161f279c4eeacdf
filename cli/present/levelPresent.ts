/**
 * The JSON form of one level of dⁿ in a cubic field, shared by the levels and spectrum commands.
 */

import { cmToEv, cmToNm } from '../../src/core/units.js';
import type { CubicLevel } from '../../src/field/cubic.js';

/** JSON form of one level. */
export function levelJson(l: CubicLevel) {
  return {
    label: l.label,
    symbol: l.symbol,
    S: l.S,
    irrep: l.irrep,
    energy: l.energy,
    wavelength: l.energy > 0 ? cmToNm(l.energy) : null,
    eV: cmToEv(l.energy),
    degeneracy: l.degeneracy,
    spinAllowed: l.spinAllowed,
    parent: l.parent,
    configuration: l.configuration,
    configurations: l.configurations.map((c) => ({ configuration: c.text, weight: c.weight })),
  };
}
