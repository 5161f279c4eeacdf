/**
 * termsplit: ligand-field analysis of transition-metal ions. The public surface of the library;
 * every name here is documented where it is defined.
 */
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
export {
  type FieldParameters,
  fieldSlope,
  levelKeys,
  solveAt,
  type Transitions,
  transitions,
} from './bandModel.js';
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
  unicodeLabel,
  unicodeTerm,
} from './labels.js';
export {
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
export { type DSlaterIntegrals, slaterFromRacah } from './repulsion.js';
export { brentRoot, DEFAULT_ROOT_TOLERANCE, type RootOptions } from './roots.js';
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
