/**
 * termsplit: ligand-field analysis of transition-metal ions. The public surface of the library;
 * every name here is documented where it is defined.
 */

// Measured spectra: reading, units, band finding, fit input.
export {
  type AbsorptionOptions,
  type AbsorptionQuantity,
  type AbsorptionSpectrum,
  absorptionSpectrum,
} from './absorptionSpectrum.js';
export { type Complex, gaunt, threeJ, wignerD, wignerSmallD } from './angular.js';
// Band fitting: assignment search, Levenberg–Marquardt, errors and warnings.
export {
  ASSIGNMENT_DEFAULTS,
  type AssignmentCandidate,
  type AssignmentSearch,
  type AssignmentSearchOptions,
  levelKeyOfLabel,
  type SearchBand,
  searchAssignments,
} from './assignment.js';
export type { BaselineKind } from './bandDecomposition.js';
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
} from './bandFinding.js';
export {
  CENTROSYMMETRIC_EPSILON,
  CHARGE_TRANSFER_EPSILON,
  type IntensityRange,
  intensityRange,
  OSCILLATOR_STRENGTH_FACTOR,
  oscillatorStrength,
  SPIN_FORBIDDEN_EPSILON,
} from './bandIntensity.js';
export {
  type FieldParameters,
  fieldSlope,
  levelKeys,
  solveAt,
  type Transitions,
  transitions,
} from './bandModel.js';
export {
  type BandObservation,
  bandObservations,
  ligandFieldBands,
  type ObservationOptions,
  POSITION_WIDTH_FRACTION,
} from './bandObservations.js';
export { type Caution, CHARGE_TRANSFER_ONSET, cubicCautions } from './cautions.js';
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
} from './crossover.js';
export { octahedralFieldMatrix } from './crystalField.js';
export {
  type ConfigurationWeight,
  type CubicInput,
  type CubicLevel,
  type CubicResult,
  solveCubic,
} from './cubic.js';
export { InputError } from './errors.js';
export {
  FIT_DEFAULTS,
  type FitAssignment,
  type FitBand,
  type FitInput,
  type FitResult,
  type FitSolution,
  type FreeIonReference,
  fitBands,
  type PredictedBand,
} from './fit.js';
export {
  type ErrorBasis,
  type ErrorEstimate,
  type ErrorInput,
  type FitErrors,
  type ParameterName,
  standardErrors,
} from './fitErrors.js';
export { FIT_WARNING_LIMITS, type FitWarning, type FitWarningCode } from './fitWarnings.js';
export { type FreeIonTerm, freeIonTerms, freeIonTermsSlater } from './freeIon.js';
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
} from './gaussianBands.js';
export {
  GROUND_MAP_DEFAULTS,
  type GroundMapOptions,
  type GroundStateMap,
  groundStateMap,
  MAP_B,
  type MapRow,
  type MapSegment,
} from './groundMap.js';
export {
  CROSSING_DEFAULTS,
  type CrossingInput,
  type GroundCrossing,
  groundStateCrossings,
} from './groundState.js';
export { DEFAULT_C_OVER_B, FREE_IONS, type FreeIon, findIon, freeIonRatio } from './ions.js';
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
} from './labels.js';
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
} from './leastSquares.js';
export {
  impliedPairingEnergy,
  type OneElectronState,
  type OneElectronStates,
  ORBITAL_ENERGY_DQ,
  oneElectronStates,
  pairingCoefficients,
  pairingEnergy,
} from './lfse.js';
export {
  type MomentEstimate,
  momentEstimate,
  type OrbitalContribution,
  SPIN_ONLY_G,
  spinOnlyMoment,
} from './magnetism.js';
export { binomial, type Microstate, microstates } from './microstates.js';
export {
  type RatioScan,
  ratioScan,
  SCAN_DEFAULTS,
  type ScanLevel,
  type ScanOptions,
  type ScanPoint,
  singleTerm,
} from './ratioScan.js';
export { ensureMonotonicX, pointPlace, type RawSpectrum } from './rawSpectrum.js';
export { type DSlaterIntegrals, slaterFromRacah } from './repulsion.js';
export { brentRoot, DEFAULT_ROOT_TOLERANCE, type RootOptions } from './roots.js';
export { normalRandom, uniformRandom } from './seededRandom.js';
export { isJcamp, parseJcampSpectrum } from './spectrumJcamp.js';
export {
  type ColumnChoice,
  DEFAULT_X_COLUMN,
  DEFAULT_Y_COLUMN,
  parseSpectrumText,
  type SpectrumTextOptions,
} from './spectrumText.js';
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
} from './spectrumUnits.js';
export { branchTerm, CHARACTERS, CUBIC_IRREPS, type CubicIrrep, IRREP_DIMENSION } from './symmetry.js';
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
} from './terms.js';
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
} from './units.js';

// Correlation-diagram data (sweep of Δ/B at fixed C/B).

export { type FitSpinVerdict, fitCorrelation, fitSpinVerdict } from './fitVerdict.js';
export {
  parseSampleSheet,
  type SampleSheet,
  type SampleSpec,
  type SheetFormat,
  type SheetProblem,
  type SpectrumSpec,
  splitCsvLine,
} from './sampleSheet.js';
export { type IonOrder, type SeriesEntry, seriesOrders, seriesTable } from './series.js';
export { type FoundBandFit, type FoundBandFitOptions, fitFoundBands } from './spectrumFit.js';
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
} from './sweep.js';
