import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import type { FitAssignment, FitBand, FitScore, PredictedBand, SharpMatch } from './fitTypes.js';

/**
 * The ranking score of a fitted solution: how well it fits and how plausible it is as
 * chemistry, in one number whose parts are reported (see {@link scoreSolution}).
 */

/** Weights and windows of the score. */
export const SCORE_DEFAULTS = {
  /**
   * β = B/B(free ion) of 3d complexes lies between about 0.6 (the softest ligands: bromide,
   * iodide, sulfur donors) and 1 (the nephelauxetic series; Jørgensen, Prog. Inorg. Chem. 4, 73,
   * 1962, and Lever 1984, §6; from memory): outside, the score grows with the square of the
   * distance in units of `betaScale` below and `betaScaleAbove` above.
   */
  betaWindow: [0.6, 1] as readonly [number, number],
  betaScale: 0.1,
  betaScaleAbove: 0.05,
  /** Per band assigned to a two-electron transition (weak by the one-electron rule). */
  twoElectron: 1,
  /** Per predicted strong transition inside the observed range with no band. */
  unobserved: 4,
  /** A predicted band this close to an observed one may hide under it, cm⁻¹ (common practice, no source). */
  hiddenWithin: 1500,
  /**
   * Below this, a band would be outside a UV-vis-NIR spectrometer's range (about 2000 nm), so
   * a predicted band there is not missed, cm⁻¹ (common practice, no source).
   */
  rangeFloor: 5000,
  /** Per band whose intensity class contradicts its assignment (ε, sharpness). */
  intensity: 2,
  /**
   * ε below which a band is spin-forbidden-like, L mol⁻¹ cm⁻¹: octahedral spin-allowed d–d
   * bands have ε ≈ 5–100, spin-forbidden ones below about 1; tetrahedral ones are stronger,
   * 50–1000 and below about 10 (Lever 1984, ch. 6; from memory).
   */
  forbiddenEpsilon: { oct: 1, tet: 10 } as Readonly<Record<Geometry, number>>,
  /** A band this much weaker than the strongest counts as weak (two-electron jumps are). */
  weakRatio: 0.3,
  /** Mismatch of a sharp band with its level that costs one unit, cm⁻¹ (C/B is often only estimated). */
  sharpTolerance: 1000,
  /** Largest cost of one sharp band. */
  sharpCap: 4,
} as const;

/** What {@link scoreSolution} looks at. */
export interface ScoreInput {
  readonly geometry: Geometry;
  readonly levels: CubicResult;
  /** The fitted bands, with their intensity classes where given. */
  readonly bands: readonly FitBand[];
  readonly assignments: readonly FitAssignment[];
  readonly predicted: readonly PredictedBand[];
  readonly sharp: readonly SharpMatch[];
  /** Sharp bands given (matched or not). */
  readonly sharpCount: number;
  readonly weightedRms: number;
  /** β, or null where there is none (d¹, d⁹, B not determined). */
  readonly beta: number | null;
}

function betaPart(beta: number | null): number {
  if (beta === null) return 0;
  const [lo, hi] = SCORE_DEFAULTS.betaWindow;
  if (beta < lo) return ((lo - beta) / SCORE_DEFAULTS.betaScale) ** 2;
  if (beta > hi) return ((beta - hi) / SCORE_DEFAULTS.betaScaleAbove) ** 2;
  return 0;
}

/** Predicted spin-allowed one-electron transitions within the observed range that have no band near them. */
function unobservedPart(input: ScoreInput): number {
  const observed = input.assignments.map((a) => a.observed);
  if (observed.length === 0) return 0;
  const top = Math.max(...observed);
  const missed = input.predicted.filter(
    (p) =>
      p.spinAllowed &&
      !p.twoElectron &&
      p.band === null &&
      p.energy >= SCORE_DEFAULTS.rangeFloor &&
      p.energy < top &&
      observed.every((o) => Math.abs(o - p.energy) > SCORE_DEFAULTS.hiddenWithin),
  );
  return SCORE_DEFAULTS.unobserved * missed.length;
}

/** Two-electron assignments, and intensity classes that contradict the assignment. */
function classParts(input: ScoreInput): { twoElectron: number; intensity: number } {
  const { bands, assignments, predicted } = input;
  const strongest = Math.max(0, ...bands.map((b) => b.epsilon ?? 0));
  const forbiddenEpsilon = SCORE_DEFAULTS.forbiddenEpsilon[input.geometry];
  let twoElectron = 0;
  let intensity = 0;
  for (const a of assignments) {
    const band = bands[a.band];
    const level = predicted.find((p) => p.label === a.label);
    const epsilon = band?.epsilon;
    const weak = epsilon !== undefined && strongest > 0 && epsilon < SCORE_DEFAULTS.weakRatio * strongest;
    if (level?.twoElectron && !weak) twoElectron += SCORE_DEFAULTS.twoElectron;
    if (epsilon !== undefined) {
      if (a.spinAllowed && epsilon < forbiddenEpsilon) intensity += SCORE_DEFAULTS.intensity;
      if (!a.spinAllowed && epsilon >= 5 * forbiddenEpsilon) intensity += SCORE_DEFAULTS.intensity;
    }
  }
  const sharpCost = input.sharp.reduce(
    (s, m) => s + Math.min((m.difference / SCORE_DEFAULTS.sharpTolerance) ** 2, SCORE_DEFAULTS.sharpCap),
    0,
  );
  intensity += sharpCost + SCORE_DEFAULTS.sharpCap * (input.sharpCount - input.sharp.length);
  return { twoElectron, intensity };
}

/**
 * The ranking score of a solution, lower is better, as a sum of parts:
 * - residual: max(weighted rms, 1)² − 1, zero while the residuals are within the band
 *   uncertainties (given, or the default precision of 200 cm⁻¹);
 * - beta: ((0.6 − β)/0.1)² below the plausibility window 0.6 ≤ β ≤ 1, ((β − 1)/0.05)² above
 *   (nephelauxetic series; {@link SCORE_DEFAULTS});
 * - twoElectron: 1 per band assigned to a two-electron transition (weak by the one-electron
 *   rule), waived when the band's ε shows it weak;
 * - unobserved: 4 per predicted spin-allowed one-electron transition between 5000 cm⁻¹ and the
 *   highest band with no band within 1500 cm⁻¹ of it (a strong band the spectrum should show);
 * - intensity: 2 per band whose ε contradicts its assignment (a spin-allowed band with the ε of
 *   a spin-forbidden one, or the reverse), plus the mismatch of each sharp band with the
 *   intra-configurational level it is matched to (1 per 1000 cm⁻¹, squared, at most 4).
 */
export function scoreSolution(input: ScoreInput): FitScore {
  const residual = Math.max(input.weightedRms, 1) ** 2 - 1;
  const beta = betaPart(input.beta);
  const unobserved = unobservedPart(input);
  const { twoElectron, intensity } = classParts(input);
  return {
    total: residual + beta + twoElectron + unobserved + intensity,
    residual,
    beta,
    twoElectron,
    unobserved,
    intensity,
  };
}
