import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import type { LeastSquaresOptions, StopReason } from '../numeric/leastSquares.js';
import type { ErrorBasis, FitErrors } from './fitErrors.js';
import type { FitWarning } from './fitWarnings.js';
import type { ScanOptions } from './ratioScan.js';

/** The data of a band fit: its input with documented defaults, its solutions and its result. */

/** One observed band maximum. */
export interface FitBand {
  /** Band maximum, cm⁻¹. */
  readonly energy: number;
  /** Standard uncertainty of the maximum, cm⁻¹ (give it for every band or for none). */
  readonly sigma?: number;
}

/** The free ion a complex is compared with, for β = B/B(free ion). A `FreeIon` of ions.ts fits. */
export interface FreeIonReference {
  readonly ion?: string;
  readonly B?: number;
  readonly C?: number;
  /** Where the free-ion values come from. */
  readonly source?: string;
}

/** Defaults of {@link FitInput}. */
export const FIT_DEFAULTS = {
  geometry: 'oct',
  fitC: false,
  includeSpinForbidden: false,
  /**
   * Uncertainty of a band maximum assumed for ranking when none is given, cm⁻¹: cubic-model
   * fits usually leave residuals of a few hundred cm⁻¹ on broad d–d maxima (common practice,
   * no source), so fits closer than this are not told apart by their residuals.
   */
  bandPrecision: 200,
  /** Alternatives are kept while their weighted rms is within this factor of the best. */
  ambiguityFactor: 2,
  /** Scan fits within this factor of the best scan fit are refined (looser: the scan is coarse). */
  refineFactor: 3,
  maxRefined: 16,
  maxSolutions: 8,
  /** C/B values scanned besides the starting one when C is fitted (the usual range for 3d complexes). */
  cOverBScan: [3, 4, 5, 6] as readonly number[],
} as const;

/** Input of {@link fitBands}. Energies in cm⁻¹. */
export interface FitInput {
  /** Number of d electrons, 1…9. */
  readonly n: number;
  /** @default 'oct' */
  readonly geometry?: Geometry;
  /** The observed band maxima (in any order). */
  readonly bands: readonly FitBand[];
  /** The free ion, for β and the default C/B. */
  readonly freeIon?: FreeIonReference;
  /** C/B held during the fit (or the starting C/B with `fitC`). @default the free ion's C/B, else {@link DEFAULT_C_OVER_B} */
  readonly cOverB?: number;
  /** Fit C as a third parameter. @default false */
  readonly fitC?: boolean;
  /**
   * Level label for each band, in the bands' order (e.g. `3T2g`, `3T1g(F)`, or Unicode `³T₁g(F)`),
   * read as labelled at `cOverB` (see {@link levelKeyOfLabel}); null, `?` or missing entries are
   * searched. @default all searched
   */
  readonly assignments?: readonly (string | null)[];
  /** Let the search assign bands to spin-forbidden transitions too. @default false */
  readonly includeSpinForbidden?: boolean;
  /**
   * Hold Racah B at this value (cm⁻¹; C at C/B times it) and fit Dq alone: for spectra with one
   * band, such as high-spin d⁴ and d⁶ (one spin-allowed band, at exactly 10Dq). β is then not a
   * result but follows from the value given. @default undefined (B fitted)
   */
  readonly fixedB?: number;
  /**
   * The ground state's spin when it is known (from magnetic measurement, say): `high` keeps only
   * assignments from the ground states of the largest S met on the scan, `low` those of the
   * smallest. @default undefined (both)
   */
  readonly spinState?: 'high' | 'low';
  /**
   * Transitions offered beyond the number of searched bands (see {@link searchAssignments}).
   * @default 2, or 8 with spin-forbidden transitions ({@link ASSIGNMENT_DEFAULTS})
   */
  readonly extraCandidates?: number;
  /**
   * Start every least-squares fit here instead of at its assignment's best scan point (C
   * defaults to C/B × B). @default the scan's starting values
   */
  readonly start?: { readonly dq: number; readonly B?: number; readonly C?: number };
  /** The Δ/B scan for assignments and starting values. @default {@link SCAN_DEFAULTS} */
  readonly scan?: ScanOptions;
  /** Tolerances and limits of the least squares. @default {@link LEAST_SQUARES_DEFAULTS} */
  readonly leastSquares?: LeastSquaresOptions;
  /** @default 200 cm⁻¹ (see {@link FIT_DEFAULTS}) */
  readonly bandPrecision?: number;
  /** @default 2 */
  readonly ambiguityFactor?: number;
  /** Most assignments refined by least squares. @default 16 */
  readonly maxRefined?: number;
  /** Most solutions returned. @default 8 */
  readonly maxSolutions?: number;
  /**
   * Called as the work proceeds, with the steps done and the steps expected (the scans, then
   * the refinements; the total is revised once the scans have shown how many to refine).
   * @default none
   */
  readonly onProgress?: (done: number, total: number) => void;
}

/** One band's place in a solution. */
export interface FitAssignment {
  /** Index of the band in the input. */
  readonly band: number;
  readonly observed: number;
  readonly sigma: number | null;
  readonly calculated: number;
  /** Observed − calculated, cm⁻¹. */
  readonly difference: number;
  readonly label: string;
  readonly spinAllowed: boolean;
}

/** A predicted transition of a solution. */
export interface PredictedBand {
  readonly label: string;
  readonly symbol: string;
  /** Energy above the ground state, cm⁻¹. */
  readonly energy: number;
  readonly spinAllowed: boolean;
  /** Index of the observed band assigned to it, or null. */
  readonly band: number | null;
}

/** One solution of the fit. */
export interface FitSolution {
  /** 1 = best. */
  readonly rank: number;
  readonly dq: number;
  /** 10Dq = Δ. */
  readonly tenDq: number;
  /** Racah B; 0 for d¹ and d⁹, which have none. */
  readonly B: number;
  readonly C: number;
  readonly cOverB: number | null;
  readonly deltaOverB: number | null;
  /** B / B(free ion), or null without a free-ion B. */
  readonly beta: number | null;
  /** Whether C was a free parameter of this solution (false when held at C/B). */
  readonly cFitted: boolean;
  /** Whether B was held at a given value (only Dq fitted). */
  readonly bHeld: boolean;
  /** Names of the free parameters, in the order of `covariance`. */
  readonly parameters: readonly ('dq' | 'B' | 'C')[];
  readonly errors: FitErrors;
  readonly errorBasis: ErrorBasis | null;
  /** How the errors were obtained, or why there are none. */
  readonly errorNote: string;
  readonly covariance: number[][] | null;
  /** rms of observed − calculated, cm⁻¹. */
  readonly rms: number;
  /** rms of the residuals in units of the band uncertainties (given, or the default precision). */
  readonly weightedRms: number;
  /** Σ ((obs − calc)/σ)², with σ given or the default precision. */
  readonly chiSquare: number;
  /** Bands minus free parameters. */
  readonly dof: number;
  readonly assignments: readonly FitAssignment[];
  /** Ground-state label. */
  readonly ground: string;
  /** Every excited level, by energy. */
  readonly predicted: readonly PredictedBand[];
  readonly converged: boolean;
  readonly reason: StopReason;
  readonly reasonText: string;
  readonly iterations: number;
  readonly warnings: readonly FitWarning[];
  /** The solver's full output at the optimum. */
  readonly levels: CubicResult;
}

/** Outcome of {@link fitBands}. */
export interface FitResult {
  readonly n: number;
  readonly geometry: Geometry;
  /** C/B held (or started from, with `fitC`). */
  readonly cOverB: number;
  readonly cOverBSource: 'given' | 'free-ion' | 'default';
  /** The free-ion B that β refers to, and its source; null without one. */
  readonly freeIon: { readonly B: number; readonly source: string | null } | null;
  readonly fitC: boolean;
  readonly bands: readonly FitBand[];
  /** Whether the residuals were weighted by given uncertainties or equally. */
  readonly weighting: 'given' | 'equal';
  /** Best first: those within the ambiguity factor of the best. */
  readonly solutions: readonly FitSolution[];
  /** Solutions within the factor left out by `maxSolutions`. */
  readonly omitted: number;
  /** Distinct assignments tried on the scan. */
  readonly tried: number;
  /** Assignments refined by least squares. */
  readonly refined: number;
  readonly warnings: readonly FitWarning[];
}
