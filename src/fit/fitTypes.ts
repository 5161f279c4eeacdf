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
  /** Molar absorption coefficient at the maximum, L mol⁻¹ cm⁻¹, where a spectrum gives it. */
  readonly epsilon?: number;
  /** Full width at half maximum, cm⁻¹, where a spectrum gives it. */
  readonly width?: number;
  /**
   * A narrow band (much narrower than the broad d–d bands): an intra-configurational,
   * field-independent transition such as ²Eg of Cr(III) or ¹Eg of Ni(II). Sharp bands are not
   * used to fit Dq and B; they are matched to the predicted levels afterwards.
   */
  readonly sharp?: boolean;
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
  includeSpinForbidden: false,
  merge: true,
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
  /**
   * Fit C as a third parameter: true, false, or undefined to fit it when the bands can fix it
   * (at least three bands, of a dⁿ and ground spin whose assigned levels depend on C — such as
   * the quartet bands of high-spin d⁵ with the field-independent ⁴A₁g/⁴Eg band); C is held at
   * C/B otherwise. @default undefined (decided by the bands)
   */
  readonly fitC?: boolean;
  /**
   * Merge components closer than about one band width (Jahn–Teller pairs, spin–orbit
   * multiplets, shoulders) into one band at their intensity-weighted centroid before fitting
   * (see {@link mergeBands}). @default true
   */
  readonly merge?: boolean;
  /**
   * Level label for each band, in the bands' order (e.g. `3T2g`, `3T1g(F)`, or Unicode `³T₁g(F)`),
   * read as labelled at `cOverB` (see {@link levelKeyOfLabel}); null, `?` or missing entries are
   * searched. @default all searched
   */
  readonly assignments?: readonly (string | null)[];
  /**
   * Let the search assign bands to spin-forbidden transitions too. Without it, a ground spin with
   * no spin-allowed transitions (high-spin d⁵) still gets its ΔS = 1 bands. @default false
   */
  readonly includeSpinForbidden?: boolean;
  /**
   * Hold Racah B at this value (cm⁻¹; C at C/B times it) and fit Dq alone: for spectra with one
   * band, such as high-spin d⁴ and d⁶ (one spin-allowed band, at exactly 10Dq). β is then not a
   * result but follows from the value given. @default undefined (B fitted)
   */
  readonly fixedB?: number;
  /**
   * The ground state's spin when it is known (from magnetic measurement, say): `high` fits only
   * ground states of the largest S the ion can have, `low` those of the smallest; the fit is
   * refused when the bands cannot belong to that spin state. @default undefined (every spin
   * the ion can have; tetrahedral d⁴–d⁷ high-spin only, since Δt is too small for low spin)
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
  /** Index of the band in the result's `bands` (the input bands after merging). */
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
  /**
   * Index (in the result's `bands`) of the observed band assigned or matched to it, or null. Both
   * levels of an exactly degenerate pair (⁴A₁g and ⁴Eg(G) of d⁵) get the band.
   */
  readonly band: number | null;
  /** Whether the transition moves two electrons between t₂ and e: weak by the one-electron rule. */
  readonly twoElectron: boolean;
}

/** A sharp band matched, after the fit, to a predicted level. */
export interface SharpMatch {
  /** Index of the band in the result's `bands`. */
  readonly band: number;
  readonly observed: number;
  readonly label: string;
  readonly calculated: number;
  readonly difference: number;
}

/** The parts of a solution's ranking score (see {@link rankSolutions}); lower is better. */
export interface FitScore {
  readonly total: number;
  /** max(weighted rms, 1)² − 1: zero while the residuals are within the band uncertainties. */
  readonly residual: number;
  /** Distance of β outside its plausibility window. */
  readonly beta: number;
  /** Bands assigned to two-electron (weak) transitions. */
  readonly twoElectron: number;
  /** Predicted strong transitions inside the observed range with no band. */
  readonly unobserved: number;
  /** Disagreement of the bands' intensity classes (ε, sharpness) with their assignments. */
  readonly intensity: number;
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
  /**
   * Whether the assigned bands fix B. False when none depends on it (one band of high-spin d⁶ at
   * exactly 10Dq, say): B is then held at a nominal value only to place the other levels.
   */
  readonly bDetermined: boolean;
  /** Ground-state spin S of this solution. */
  readonly spin: number;
  /** The ranking score and its parts. */
  readonly score: FitScore;
  /** Sharp bands matched to predicted levels after the fit. */
  readonly sharp: readonly SharpMatch[];
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
  /** The bands fitted: the input bands after merging, sharp bands last. */
  readonly bands: readonly FitBand[];
  /** Input bands merged into one (empty when none were). */
  readonly merges: readonly BandMerge[];
  /** How it was decided whether C is fitted. */
  readonly cChoice: 'given' | 'bands-determine-it' | 'held';
  /** The ground-spin hypotheses tried, each with its best solution's rank or why it has none. */
  readonly hypotheses: readonly SpinHypothesis[];
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

/** Input bands merged into one band at their intensity-weighted centroid. */
export interface BandMerge {
  /** Index of the merged band in the result's `bands`. */
  readonly band: number;
  /** Indices of the input bands merged. */
  readonly members: readonly number[];
  readonly energies: readonly number[];
  readonly centroid: number;
  /** Why they were merged, in words. */
  readonly reason: string;
}

/** One ground-spin hypothesis of a fit. */
export interface SpinHypothesis {
  /** Ground-state spin S. */
  readonly spin: number;
  /** `high` or `low` where the ion has a choice, else `only`. */
  readonly kind: 'high' | 'low' | 'only';
  /** Label of the ground state of this spin met on the scan. */
  readonly ground: string;
  /** Which transitions were offered: spin-allowed, or ΔS = 1 bands where there are no allowed ones. */
  readonly transitions: 'spin-allowed' | 'spin-forbidden' | 'both';
  /** Rank of its best solution, or null. */
  readonly bestRank: number | null;
  /** Why it has no solution, when it has none. */
  readonly note: string | null;
}
