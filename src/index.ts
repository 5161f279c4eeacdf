/**
 * termsplit: ligand-field analysis of transition-metal ions. The public surface of the library;
 * every name here is documented where it is defined.
 */

export {
  type FieldParameters,
  fieldSlope,
  levelKeys,
  solveAt,
  type Transitions,
  transitions,
} from './analysis/bandModel.js';
export { type Caution, CHARGE_TRANSFER_ONSET, cubicCautions } from './analysis/cautions.js';
export {
  type Crossover,
  type CrossoverAnalysis,
  type CrossoverCaution,
  type CrossoverInput,
  type CrossoverOptions,
  crossoverAnalysis,
  crossoverCautions,
  type Margin,
  NEAR_CROSSOVER_PERCENT,
  type SampleParameters,
  type SampleVerdict,
  SETTLED_SIGMAS,
  type SpinSide,
  sampleVerdict,
  TETRAHEDRAL_DELTA_CEILING,
  TETRAHEDRAL_TO_OCTAHEDRAL,
  type VerdictOptions,
} from './analysis/crossover.js';
export {
  GROUND_MAP_DEFAULTS,
  type GroundMapOptions,
  type GroundStateMap,
  groundStateMap,
  MAP_B,
  type MapRow,
  type MapSegment,
} from './analysis/groundMap.js';
export {
  CROSSING_DEFAULTS,
  type CrossingInput,
  type GroundCrossing,
  groundStateCrossings,
} from './analysis/groundState.js';
export {
  impliedPairingEnergy,
  type OneElectronState,
  type OneElectronStates,
  ORBITAL_ENERGY_DQ,
  oneElectronStates,
  pairingCoefficients,
  pairingEnergy,
} from './analysis/lfse.js';
export {
  type MomentEstimate,
  momentEstimate,
  type OrbitalContribution,
  SPIN_ONLY_G,
  spinOnlyMoment,
} from './analysis/magnetism.js';
export { type Complex, gaunt, threeJ, wignerD, wignerSmallD } from './atom/angular.js';
export { type FreeIonTerm, freeIonTerms, freeIonTermsSlater } from './atom/freeIon.js';
export { binomial, type Microstate, microstates } from './atom/microstates.js';
export { type DSlaterIntegrals, slaterFromRacah } from './atom/repulsion.js';
export {
  type Configuration,
  type GroundLevel,
  halfIntegerText,
  hundGround,
  jLevels,
  type MicrostateTable,
  microstateTable,
  parseConfiguration,
  type Term,
  termSymbol,
  termsOf,
} from './atom/terms.js';
export { InputError } from './core/errors.js';
export { DEFAULT_C_OVER_B, FREE_IONS, type FreeIon, findIon, freeIonRatio } from './core/ions.js';
export {
  CM_PER_EV,
  cmToEv,
  cmToNm,
  type EnergyUnit,
  type ParsedEnergy,
  parseEnergy,
  parseEnergyList,
  parseUnit,
  toWavenumber,
} from './core/units.js';
export { octahedralFieldMatrix } from './field/crystalField.js';
export {
  type ConfigurationWeight,
  type CubicInput,
  type CubicLevel,
  type CubicResult,
  solveCubic,
} from './field/cubic.js';
export {
  configurationText,
  type Geometry,
  irrepName,
  type LabelParts,
  parseStateLabel,
  stateSymbol,
  unicodeConfiguration,
  unicodeIon,
  unicodeLabel,
  unicodeTerm,
} from './field/labels.js';
export { branchTerm, CHARACTERS, CUBIC_IRREPS, type CubicIrrep, IRREP_DIMENSION } from './field/symmetry.js';
// Band fitting: assignment search, Levenberg–Marquardt, errors and warnings.
export {
  ASSIGNMENT_DEFAULTS,
  type AssignmentCandidate,
  type AssignmentSearch,
  type AssignmentSearchOptions,
  levelKeyOfLabel,
  type SearchBand,
  searchAssignments,
} from './fit/assignment.js';
export { fitBands } from './fit/fitBands.js';
export {
  type ErrorBasis,
  type ErrorEstimate,
  type ErrorInput,
  type FitErrors,
  type ParameterName,
  standardErrors,
} from './fit/fitErrors.js';
export {
  FIT_DEFAULTS,
  type FitAssignment,
  type FitBand,
  type FitInput,
  type FitResult,
  type FitSolution,
  type FreeIonReference,
  type PredictedBand,
} from './fit/fitTypes.js';
export { FIT_WARNING_LIMITS, type FitWarning, type FitWarningCode } from './fit/fitWarnings.js';
export {
  type RatioScan,
  ratioScan,
  SCAN_DEFAULTS,
  type ScanLevel,
  type ScanOptions,
  type ScanPoint,
  singleTerm,
} from './fit/ratioScan.js';
export {
  CURVE_FIT_TOLERANCE,
  type CurveFitOptions,
  type CurveFitResult,
  covariance,
  fitCurve,
  type GradientModel,
  inverseNormalMatrix,
  LEAST_SQUARES_DEFAULTS,
  type LeastSquaresOptions,
  type LeastSquaresProblem,
  type LeastSquaresResult,
  levenbergMarquardt,
  STOP_REASON_TEXT,
  type StopReason,
} from './numeric/leastSquares.js';
export { brentRoot, DEFAULT_ROOT_TOLERANCE, type RootOptions } from './numeric/roots.js';
export { normalRandom, uniformRandom } from './numeric/seededRandom.js';
// Measured spectra: reading, units, band finding, fit input.
export {
  type AbsorptionOptions,
  type AbsorptionQuantity,
  type AbsorptionSpectrum,
  absorptionSpectrum,
} from './spectra/absorptionSpectrum.js';
export type { BaselineKind } from './spectra/bandDecomposition.js';
export {
  type BandAnalysis,
  type BandFindingOptions,
  type BandFlag,
  DEFAULT_BASELINE,
  DEFAULT_MAX_BANDS,
  DEFAULT_MIN_FWHM,
  DEFAULT_MIN_RELATIVE_HEIGHT,
  DEFAULT_SIGNIFICANCE,
  type FoundBand,
  findBands,
  MIN_WINDOW_POINTS,
  NARROW_BAND_FWHM,
} from './spectra/bandFinding.js';
export {
  CENTROSYMMETRIC_EPSILON,
  CHARGE_TRANSFER_EPSILON,
  type IntensityRange,
  intensityRange,
  OSCILLATOR_STRENGTH_FACTOR,
  oscillatorStrength,
  SPIN_FORBIDDEN_EPSILON,
} from './spectra/bandIntensity.js';
export {
  type BandObservation,
  bandObservations,
  ligandFieldBands,
  type ObservationOptions,
  POSITION_WIDTH_FRACTION,
} from './spectra/bandObservations.js';
export {
  bandSum,
  baselineValue,
  DEFAULT_SYNTHETIC_SEED,
  FOUR_LN2,
  GAUSSIAN_AREA_FACTOR,
  type GaussianBand,
  gaussianArea,
  gaussianValue,
  type LinearBaseline,
  type SyntheticOptions,
  syntheticSpectrum,
} from './spectra/gaussianBands.js';
export { ensureMonotonicX, pointPlace, type RawSpectrum } from './spectra/rawSpectrum.js';
export { isJcamp, parseJcampSpectrum } from './spectra/spectrumJcamp.js';
export {
  type ColumnChoice,
  DEFAULT_X_COLUMN,
  DEFAULT_Y_COLUMN,
  parseSpectrumText,
  type SpectrumTextOptions,
} from './spectra/spectrumText.js';
export {
  chooseUnit,
  parseXUnit,
  parseYUnit,
  type SpectrumXUnit,
  type SpectrumYUnit,
  type UnitChoice,
  X_UNIT_NAMES,
  xUnitFromLabel,
  Y_UNIT_NAMES,
  yUnitFromLabel,
} from './spectra/spectrumUnits.js';

// Correlation-diagram data (sweep of Δ/B at fixed C/B).

export {
  type CorrelationDiagram,
  CSV_DIGITS,
  DEFAULT_MAX_DELTA_OVER_B,
  DEFAULT_SWEEP_POINTS,
  type DiagramCrossing,
  type DiagramCurve,
  diagramCautions,
  diagramCsv,
  diagramJson,
  MAX_SWEEP_POINTS,
  type SpinRegion,
  SWEEP_B,
  type SweepOptions,
  sweepDiagram,
} from './analysis/sweep.js';
export { type FitSpinVerdict, fitCorrelation, fitSpinVerdict } from './fit/fitVerdict.js';
export {
  parseSampleSheet,
  type SampleSheet,
  type SampleSpec,
  type SheetFormat,
  type SheetProblem,
  type SpectrumSpec,
  splitCsvLine,
} from './sheets/sampleSheet.js';
export { type IonOrder, type SeriesEntry, seriesOrders, seriesTable } from './sheets/series.js';
export { type FoundBandFit, type FoundBandFitOptions, fitFoundBands } from './spectra/spectrumFit.js';
