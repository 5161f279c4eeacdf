/**
 * termsplit: ligand-field analysis of transition-metal ions. The public surface of the library:
 * task-level functions, their options and results, and the defaults a caller may want to show.
 * Everything here is documented where it is defined; internals are imported by module path
 * inside the repository and are not part of this surface.
 */

/** Analyses over the solver: correlation diagrams, predicted transitions, spin-state crossover, ground-state maps, LFSE and pairing, moments, cautions. */
export { type FieldParameters, type Transitions, transitions } from './analysis/bandModel.js';
export { type Caution, cubicCautions } from './analysis/cautions.js';
export {
  type Crossover,
  type CrossoverAnalysis,
  type CrossoverInput,
  type CrossoverOptions,
  crossoverAnalysis,
  type Margin,
  type SampleParameters,
  type SampleVerdict,
  type SpinSide,
  sampleVerdict,
  type VerdictOptions,
} from './analysis/crossover.js';
export { type DistortedCaution, distortedCautions } from './analysis/distortedCautions.js';
export {
  type DistortionCurve,
  type DistortionSweep,
  type DistortionSweepInput,
  distortionCsv,
  distortionSweep,
} from './analysis/distortionSweep.js';
export { type FittedSample, type FittedSampleInput, fittedSample } from './analysis/fittedSample.js';
export { type GroundMapOptions, type GroundStateMap, groundStateMap } from './analysis/groundMap.js';
export { type CrossingInput, type GroundCrossing, groundStateCrossings } from './analysis/groundState.js';
export {
  impliedPairingEnergy,
  type OneElectronState,
  type OneElectronStates,
  oneElectronStates,
  pairingEnergy,
} from './analysis/lfse.js';
export { type MomentEstimate, momentEstimate, spinOnlyMoment } from './analysis/magnetism.js';
export { hasSpinChoice } from './analysis/spinChoice.js';
export {
  type SpinOrbitCurve,
  type SpinOrbitDiagram,
  type SpinOrbitSweepOptions,
  sweepSpinOrbit,
} from './analysis/spinOrbitSweep.js';
export {
  type MomentPoint,
  type SusceptibilityInput,
  susceptibility,
} from './analysis/susceptibility.js';
export {
  type CorrelationDiagram,
  type DiagramCrossing,
  type DiagramCurve,
  diagramCsv,
  diagramJson,
  type SpinRegion,
  type SweepOptions,
  sweepDiagram,
} from './analysis/sweep.js';
/** The free ion: microstates, terms, Hund's rules, J levels, term energies in Racah B and C. */
export { type FreeIonTerm, freeIonTerms } from './atom/freeIon.js';
export { type FreeIonLevel, freeIonLevels } from './atom/jLevels.js';
export { type Microstate, microstates } from './atom/microstates.js';
export {
  type Configuration,
  type GroundLevel,
  hundGround,
  jLevels,
  parseConfiguration,
  type Term,
  termsOf,
} from './atom/terms.js';
/** Shared ground: errors, ions and their free-ion parameters, defaults, geometry, energy units. */
export { BAND_CEILING, DEFAULT_C_OVER_B, DEFAULT_GEOMETRY } from './core/defaults.js';
export { InputError } from './core/errors.js';
export type { Geometry } from './core/geometry.js';
export { FREE_IONS, type FreeIon, findIon, freeIonRatio } from './core/ions.js';
export {
  CM_PER_EV,
  cmToEv,
  cmToNm,
  type EnergyUnit,
  type ParsedEnergy,
  parseEnergy,
  parseEnergyList,
  toWavenumber,
} from './core/units.js';
/** Complexes of lower symmetry: angular overlap and tetragonal/trigonal fields, point groups, labelled levels. */
export type { BondParameters, Ligand } from './field/angularOverlap.js';
export { trigonalFromSplitting } from './field/axialFields.js';
/** The ion in a cubic field: the exact solver with labelled levels. */
export {
  type ConfigurationWeight,
  type CubicInput,
  type CubicLevel,
  type CubicResult,
  solveCubic,
} from './field/cubic.js';
export {
  type DistortedInput,
  type DistortedResult,
  type DistortedSpinOrbitResult,
  type FieldSpec,
  type OrbitalLevel,
  solveDistorted,
  solveDistortedSpinOrbit,
} from './field/distortedComplex.js';
/** The ion in a cubic field with spin–orbit coupling: double-group levels with parentage. */
export type { DoubleIrrep } from './field/doubleGroup.js';
export type {
  FieldSpinOrbitLevel,
  FieldSpinOrbitResult,
  SpinOrbitParent,
} from './field/fieldSpinOrbit.js';
export { GEOMETRY_PRESETS, type GeometryPreset, presetLigands } from './field/geometries.js';
export { unicodeLabel } from './field/labels.js';
export type { CubicParent, FieldLevel } from './field/lowSymmetrySolver.js';
export { type PointGroup, pointGroup } from './field/pointGroups.js';
export {
  type ParentWeight,
  type SpinOrbitInput,
  type SpinOrbitLevel,
  type SpinOrbitResult,
  solveSpinOrbit,
} from './field/spinOrbitSolver.js';
export {
  type DistortedBand,
  type DistortedFitInput,
  type DistortedFitResult,
  type DistortedFitWarning,
  fitDistorted,
  fitParameterNames,
} from './fit/distortedFit.js';

/** Fitting Dq, B (and C) to observed band maxima. */
export { fitBands } from './fit/fitBands.js';
export {
  type BandMerge,
  FIT_DEFAULTS,
  type FitAssignment,
  type FitBand,
  type FitInput,
  type FitResult,
  type FitScore,
  type FitSolution,
  type PredictedBand,
  type SharpMatch,
  type SpinHypothesis,
} from './fit/fitTypes.js';
export { type FitSpinVerdict, fitSpinVerdict } from './fit/fitVerdict.js';
export type { FitWarning } from './fit/fitWarnings.js';
export {
  type AssignedBand,
  type RefinedBand,
  refineWithSpinOrbit,
  type SpinOrbitRefineInput,
  type SpinOrbitRefinement,
} from './fit/spinOrbitRefinement.js';
export { refineFitWithZeta, type ZetaBand, type ZetaFit, type ZetaFitOptions } from './fit/zetaFit.js';
/** Sample sheets and series of samples. */
export { parseSampleSheet, type SampleSheet, type SampleSpec } from './sheets/sampleSheet.js';
export { type SeriesEntry, seriesOrders, seriesTable } from './sheets/series.js';
export { type CoordinationSphere, coordinationSphere, parseXyz, type XyzStructure } from './sheets/xyz.js';
/** Measured spectra: reading, band finding, and the whole spectrum analysis. */
export { type AbsorptionSpectrum, absorptionSpectrum, kubelkaMunk } from './spectra/absorptionSpectrum.js';
export { type BandAnalysis, type FoundBand, findBands } from './spectra/bandFinding.js';
export type { RawSpectrum } from './spectra/rawSpectrum.js';
export {
  analyseEveryColumn,
  analyseSpectrum,
  type ColumnAnalysis,
  type MarkedTransition,
  readSpectrum,
  type SettingNames,
  type SpectrumAnalysis,
  type SpectrumAnalysisOptions,
  type SpectrumFit,
  type SpectrumFitRequest,
} from './spectra/spectrumAnalysis.js';
export { fitFoundBands } from './spectra/spectrumFit.js';
export { parseJcampSpectrum } from './spectra/spectrumJcamp.js';
export { parseSpectrumText, type SpectrumLayout, spectrumColumns } from './spectra/spectrumText.js';
