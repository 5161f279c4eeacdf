/**
 * Free-ion parameters of the common 4d and 5d ions. Their free-ion spectra are far less complete
 * than those of the 3d ions, so B and C are rougher, and ζ (1000–5000 cm⁻¹) is comparable to
 * the ligand field: these ions want `--zeta`. Every value here is approximate.
 */
import type { FreeIon } from './ions.js';

const FOUR_D =
  'approximate free-ion values of the order tabulated for 4d ions (Griffith, The Theory of Transition-Metal Ions, ' +
  '1961, appendix 6; Figgis & Hitchman, Ligand Field Theory and its Applications, 2000, ch. 9); C taken as about 4B ' +
  '(common practice, no source); entered from memory — check before citing';

const FIVE_D =
  'approximate free-ion values of the order tabulated for 5d ions (Griffith 1961, appendix 6; Figgis & Hitchman ' +
  '2000, ch. 9); B and C of 5d free ions are poorly known, C taken as about 4B (common practice, no source); ' +
  'entered from memory — check before citing';

/** The 4d and 5d ions: Mo³⁺, Ru³⁺, Rh³⁺, Pd²⁺, Os⁴⁺, Ir³⁺, Ir⁴⁺, Pt²⁺, Pt⁴⁺. */
export const HEAVY_FREE_IONS: readonly FreeIon[] = [
  { ion: 'Mo3+', element: 'Mo', charge: 3, n: 3, B: 610, C: 2440, zeta: 800, source: FOUR_D },
  { ion: 'Ru3+', element: 'Ru', charge: 3, n: 5, B: 630, C: 2520, zeta: 1180, source: FOUR_D },
  { ion: 'Rh3+', element: 'Rh', charge: 3, n: 6, B: 720, C: 2880, zeta: 1570, source: FOUR_D },
  { ion: 'Pd2+', element: 'Pd', charge: 2, n: 8, B: 830, C: 3320, zeta: 1600, source: FOUR_D },
  { ion: 'Os4+', element: 'Os', charge: 4, n: 4, B: 700, C: 2800, zeta: 3400, source: FIVE_D },
  { ion: 'Ir3+', element: 'Ir', charge: 3, n: 6, B: 660, C: 2640, zeta: 3900, source: FIVE_D },
  { ion: 'Ir4+', element: 'Ir', charge: 4, n: 5, B: 720, C: 2880, zeta: 4300, source: FIVE_D },
  { ion: 'Pt2+', element: 'Pt', charge: 2, n: 8, B: 600, C: 2400, zeta: 3400, source: FIVE_D },
  { ion: 'Pt4+', element: 'Pt', charge: 4, n: 6, B: 720, C: 2880, zeta: 4500, source: FIVE_D },
];
