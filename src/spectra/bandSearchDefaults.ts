/**
 * The defaults of the band search, in a module of their own so that the command line can show
 * them in its help without loading the search and its numerical libraries.
 */

import type { BaselineKind } from './bandDecomposition.js';

/** Default narrowest FWHM looked for, cm⁻¹. */
export const DEFAULT_MIN_FWHM = 250;
/** Default largest number of bands inside the window. */
export const DEFAULT_MAX_BANDS = 8;
/** Default smallest band height relative to the tallest. */
export const DEFAULT_MIN_RELATIVE_HEIGHT = 0.02;
/** Default significance, in noise standard deviations. */
export const DEFAULT_SIGNIFICANCE = 5;
/** Default baseline. */
export const DEFAULT_BASELINE: BaselineKind = 'linear';
