/**
 * Every default value of the library and the command line, each one named constant written
 * once, so options, help texts and reports cannot drift apart.
 */

import type { Geometry } from './geometry.js';

/** The ligand field assumed when none is named: octahedral, the common case for 3d complexes. */
export const DEFAULT_GEOMETRY: Geometry = 'oct';

/**
 * The C/B used when neither C nor C/B is given and the ion has no free-ion ratio: 4.5, a usual
 * middle value for 3d ions (common practice, no source).
 */
export const DEFAULT_C_OVER_B = 4.5;

/**
 * Predicted bands are listed in human output up to this energy, cm⁻¹ (200 nm, about where UV-vis
 * spectrometers stop: common practice, no source); JSON and full level tables list all.
 */
export const BAND_CEILING = 50000;

/**
 * Racah B used where none is given and none is needed — dⁿ without a choice of spin, where only
 * the one-electron picture uses it — cm⁻¹ (a round value within the range of 3d complexes).
 */
export const NOMINAL_B = 1000;

/** The unit of energies given without one on the command line. */
export const DEFAULT_ENERGY_UNIT = 'cm-1';
