/**
 * Free-ion parameters of the common 3d ions (Racah B and C, spin–orbit ζ), each with its source,
 * and finding an ion by name in the notations chemists write (`Cr3+`, `Cr(III)`, …).
 */

import { InputError } from './errors.js';
import { HEAVY_FREE_IONS } from './heavyIons.js';

/** Free-ion parameters of one transition-metal ion. Energies in cm⁻¹. */
export interface FreeIon {
  /** Canonical name, e.g. `Cr3+`. */
  readonly ion: string;
  readonly element: string;
  readonly charge: number;
  /** Number of d electrons (3d, 4d or 5d by the element). */
  readonly n: number;
  /** Racah B of the free ion; absent for d¹ and d⁹, which have a single term. */
  readonly B?: number;
  /** Racah C of the free ion; absent for d¹ and d⁹. */
  readonly C?: number;
  /** One-electron spin–orbit coupling constant ζ_nd. */
  readonly zeta?: number;
  /** Where the values come from. */
  readonly source: string;
}

const COMMON =
  'values as commonly tabulated for 3d free ions (e.g. Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984; ' +
  'Figgis & Hitchman, Ligand Field Theory and its Applications, 2000); entered from memory — check before citing';

/**
 * Free-ion Racah parameters and spin–orbit constants of the common 3d ions, then the 4d and 5d
 * ions of heavyIons.ts. B and C come from fits to atomic spectra; tables differ by a few per
 * cent (far more for 5d ions), so β = B/B(free ion) carries that uncertainty too.
 */
export const FREE_IONS: readonly FreeIon[] = [
  { ion: 'Ti3+', element: 'Ti', charge: 3, n: 1, zeta: 154, source: COMMON },
  { ion: 'V4+', element: 'V', charge: 4, n: 1, zeta: 248, source: COMMON },
  { ion: 'Ti2+', element: 'Ti', charge: 2, n: 2, B: 718, C: 2629, zeta: 121, source: COMMON },
  { ion: 'V3+', element: 'V', charge: 3, n: 2, B: 861, C: 4165, zeta: 209, source: COMMON },
  { ion: 'V2+', element: 'V', charge: 2, n: 3, B: 766, C: 2855, zeta: 167, source: COMMON },
  { ion: 'Cr3+', element: 'Cr', charge: 3, n: 3, B: 918, C: 3850, zeta: 273, source: COMMON },
  {
    ion: 'Mn4+',
    element: 'Mn',
    charge: 4,
    n: 3,
    B: 1160,
    C: 4303,
    zeta: 415,
    source:
      'B and C as used in the Mn⁴⁺ phosphor literature (e.g. Brik & Srivastava, ECS J. Solid State Sci. ' +
      'Technol. 2, R148, 2013); ζ estimated; entered from memory — check before citing',
  },
  { ion: 'Cr2+', element: 'Cr', charge: 2, n: 4, B: 830, C: 3430, zeta: 230, source: COMMON },
  { ion: 'Mn3+', element: 'Mn', charge: 3, n: 4, B: 1140, C: 3675, zeta: 352, source: COMMON },
  { ion: 'Mn2+', element: 'Mn', charge: 2, n: 5, B: 960, C: 3325, zeta: 347, source: COMMON },
  { ion: 'Fe3+', element: 'Fe', charge: 3, n: 5, B: 1015, C: 4800, zeta: 460, source: COMMON },
  { ion: 'Fe2+', element: 'Fe', charge: 2, n: 6, B: 1058, C: 3901, zeta: 410, source: COMMON },
  { ion: 'Co3+', element: 'Co', charge: 3, n: 6, B: 1065, C: 5120, zeta: 580, source: COMMON },
  { ion: 'Co2+', element: 'Co', charge: 2, n: 7, B: 1115, C: 4366, zeta: 533, source: COMMON },
  { ion: 'Ni2+', element: 'Ni', charge: 2, n: 8, B: 1084, C: 4831, zeta: 649, source: COMMON },
  { ion: 'Cu2+', element: 'Cu', charge: 2, n: 9, zeta: 829, source: COMMON },
  ...HEAVY_FREE_IONS,
];

const ROMAN = ['', 'I', 'II', 'III', 'IV', 'V', 'VI'];

/**
 * Finds an ion by name: `Cr3+`, `cr3+`, `Cr+3`, `Cr(III)` or `Cr III`.
 * @throws InputError naming the text and listing the known ions.
 */
export function findIon(name: string): FreeIon {
  const text = name.trim();
  const m =
    /^([A-Za-z]{1,2})\s*(?:(\d)\+|\+(\d)|\(\s*([IVX]+)\s*\)|\s([IVX]+))$/.exec(text) ??
    /^([A-Za-z]{1,2})(\d)$/.exec(text);
  if (m) {
    const element = (m[1] ?? '').charAt(0).toUpperCase() + (m[1] ?? '').slice(1).toLowerCase();
    const roman = m[4] ?? m[5];
    const charge = roman ? ROMAN.indexOf(roman.toUpperCase()) : Number(m[2] ?? m[3]);
    const found = FREE_IONS.find((i) => i.element === element && i.charge === charge);
    if (found) return found;
  }
  throw new InputError(`unknown ion "${name}": expected one of ${FREE_IONS.map((i) => i.ion).join(', ')}`);
}

/** The default C/B when none is given and the ion has no free-ion ratio (see core/defaults). */
export { DEFAULT_C_OVER_B } from './defaults.js';

/** Largest C/B accepted anywhere: 3d ions have 3–6; beyond 100 nothing is physical. */
export const MAX_C_OVER_B = 100;

/** C/B of an ion's free-ion parameters, or undefined where B and C are not defined. */
export function freeIonRatio(ion: FreeIon): number | undefined {
  return ion.B !== undefined && ion.C !== undefined ? ion.C / ion.B : undefined;
}
