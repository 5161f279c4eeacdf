/**
 * The high-spin/low-spin crossover of dⁿ in a cubic field and where a sample lies relative to it.
 *
 * The crossover Dq is a root of E(lowest state of one spin) − E(lowest of the other) with the
 * full solver ({@link groundStateCrossings}). Every energy of H = B·H_B + C·H_C + Dq·V is
 * homogeneous of degree one in (B, C, Dq), so at fixed C/B the crossover is Dq_c = x(C/B)·B:
 * Δc/B depends on C/B alone and Dq_c scales linearly with B.
 */

import { halfIntegerText } from '../atom/terms.js';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { ensure } from '../core/errors.js';
import { solveCubic } from '../field/cubic.js';
import { type Geometry, unicodeLabel } from '../field/labels.js';
import { CROSSING_DEFAULTS, type GroundCrossing, groundStateCrossings } from './groundState.js';

/**
 * Largest Δt of ordinary tetrahedral 3d complexes, cm⁻¹ (common practice, no source; Δt ≈ 4/9 Δo
 * for the same ligands in the point-charge model, Figgis & Hitchman, Ligand Field Theory and its
 * Applications, 2000). A tetrahedral crossover above it is flagged as out of reach of real ions.
 */
export const TETRAHEDRAL_DELTA_CEILING = 10000;

/** Ratio Δt/Δo for the same ligands at the same distance (point-charge model; Figgis & Hitchman 2000). */
export const TETRAHEDRAL_TO_OCTAHEDRAL = 4 / 9;

/** A sample is on a settled side when its margin exceeds this many standard uncertainties (common practice, no source). */
export const SETTLED_SIGMAS = 2;

/** A sample within this percentage of Δc is called close to the crossover (rule of thumb, no source). */
export const NEAR_CROSSOVER_PERCENT = 10;

/** Input of {@link crossoverAnalysis}: the ion's dⁿ, geometry and Racah parameters (cm⁻¹). */
export interface CrossoverInput {
  readonly n: number;
  /** @default DEFAULT_GEOMETRY ('oct') */
  readonly geometry?: Geometry;
  readonly B: number;
  readonly C: number;
}

/** Options of {@link crossoverAnalysis}. */
export interface CrossoverOptions {
  /** Largest Δ/B searched. @default 60 ({@link CROSSING_DEFAULTS}) */
  readonly maxDeltaOverB?: number;
}

/** One change of ground-state spin, with 10Dq. */
export interface Crossover extends GroundCrossing {
  /** 10Dq at the crossover (Δc), cm⁻¹. */
  readonly tenDq: number;
}

/** The spin-state crossovers of dⁿ at given B and C. */
export interface CrossoverAnalysis {
  readonly n: number;
  readonly geometry: Geometry;
  readonly B: number;
  readonly C: number;
  /** C/B (NaN for d¹ and d⁹ with B = 0). */
  readonly cOverB: number;
  /** The largest Δ/B searched. */
  readonly maxDeltaOverB: number;
  /** Changes of ground-state spin by increasing Dq; empty when the spin never changes. */
  readonly crossings: readonly Crossover[];
  /** Ground-state spin below the first crossing (weak field). */
  readonly weakFieldS: number;
  /** One sentence: where the ground state changes spin, or that it does not. */
  readonly statement: string;
  /**
   * Tetrahedral only: set when a crossover needs Δt above {@link TETRAHEDRAL_DELTA_CEILING},
   * saying so in words.
   */
  readonly outOfReach?: string;
}

/**
 * The crossovers of dⁿ: Dq, 10Dq and Δ/B of every change of ground-state spin, with the ground
 * states on either side, for 0 < Δ/B ≤ maxDeltaOverB.
 * d¹ and d⁹ have one spin state whatever B is, and take B = 0.
 * @throws InputError for n outside 1…9, an unknown geometry, B ≤ 0 (n = 2…8) or C < 0.
 */
export function crossoverAnalysis(input: CrossoverInput, options: CrossoverOptions = {}): CrossoverAnalysis {
  const { n, geometry = DEFAULT_GEOMETRY, B, C } = input;
  const maxDeltaOverB = options.maxDeltaOverB ?? CROSSING_DEFAULTS.maxDeltaOverB;
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  const where = geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  if (n === 1 || n === 9) {
    // One electron or one hole: a single term, so a single spin whatever B, C and Dq are.
    ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
    ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
    return {
      n,
      geometry,
      B,
      C,
      cOverB: B > 0 ? C / B : Number.NaN,
      maxDeltaOverB,
      crossings: [],
      weakFieldS: 0.5,
      statement: `d${n}, ${where}: one d ${n === 1 ? 'electron' : 'hole'}, so a single spin state (S = 1/2) at every Δ — no spin crossover`,
    };
  }
  const found = groundStateCrossings({ n, geometry, B, C, maxDeltaOverB });
  const crossings = found.map((c) => ({ ...c, tenDq: 10 * c.dq }));
  let statement: string;
  let weakFieldS: number;
  const first = crossings[0];
  if (first) {
    weakFieldS = first.fromS;
    statement = `d${n}, ${where}: ${crossings
      .map(
        (c) =>
          `${unicodeLabel(c.fromSymbol)} (S = ${halfIntegerText(c.fromS)}) → ${unicodeLabel(c.toSymbol)} ` +
          `(S = ${halfIntegerText(c.toS)}) at Δ/B = ${c.deltaOverB.toFixed(2)}`,
      )
      .join('; ')}`;
  } else {
    // No change of spin: any Dq in the range shows the one ground spin.
    const ground = solveCubic({ n, geometry, dq: (maxDeltaOverB * B) / 20, B, C }).ground;
    weakFieldS = ground.S;
    statement =
      `d${n}, ${where}: no spin crossover — the ground state keeps S = ${halfIntegerText(ground.S)} ` +
      `(${unicodeLabel(ground.symbol)}) for every Δ/B up to ${maxDeltaOverB}`;
  }
  const beyond = geometry === 'tet' ? crossings.find((c) => c.tenDq > TETRAHEDRAL_DELTA_CEILING) : undefined;
  const outOfReach = beyond
    ? `tetrahedral d${n} changes spin only at Δt = ${beyond.tenDq.toFixed(0)} cm⁻¹ (Δ/B = ` +
      `${beyond.deltaOverB.toFixed(1)}); ordinary tetrahedral 3d complexes have Δt below about ` +
      `${TETRAHEDRAL_DELTA_CEILING} cm⁻¹ (Δt ≈ 4/9 Δo, so this is like Δo ≈ ` +
      `${(beyond.tenDq / TETRAHEDRAL_TO_OCTAHEDRAL).toFixed(0)} cm⁻¹ for the same ligands in an octahedron): ` +
      'real tetrahedral complexes of this ion are expected to be high-spin, low-spin ones being rare exceptions'
    : undefined;
  return {
    n,
    geometry,
    B,
    C,
    cOverB: C / B,
    maxDeltaOverB,
    crossings,
    weakFieldS,
    statement,
    ...(outOfReach ? { outOfReach } : {}),
  };
}

/**
 * A sample's ligand-field parameters, to place against the crossover. Its B and C are those the
 * analysis was made with (build the analysis from the sample's own fitted B and C); the
 * uncertainties may come from a fit.
 */
export interface SampleParameters {
  /** Dq of the sample, cm⁻¹. */
  readonly dq: number;
  /** Standard uncertainty of Dq, cm⁻¹. */
  readonly sigmaDq?: number;
  /** Standard uncertainty of B, cm⁻¹ (C moves with B: C/B is held fixed). */
  readonly sigmaB?: number;
  /** Correlation coefficient of Dq and B, e.g. from a fit's covariance matrix. @default 0 */
  readonly correlation?: number;
}

/** Options of {@link sampleVerdict}. */
export interface VerdictOptions {
  /** Margin, in standard uncertainties, beyond which the side counts as settled. @default 2 ({@link SETTLED_SIGMAS}) */
  readonly settledSigmas?: number;
  /** |margin| below this percentage of Δc counts as close to the crossover. @default 10 ({@link NEAR_CROSSOVER_PERCENT}) */
  readonly nearPercent?: number;
}

/** Which spin state a sample's ground state has, relative to the crossovers of its dⁿ. */
export type SpinSide = 'high-spin' | 'low-spin' | 'intermediate-spin' | 'no-crossover';

/** A margin from the crossover in three forms. */
export interface Margin {
  /** In Dq, cm⁻¹. */
  readonly dq: number;
  /** In 10Dq (Δ), cm⁻¹. */
  readonly tenDq: number;
  /** As a percentage of Δc. */
  readonly percent: number;
}

/** Where a sample lies relative to the crossover. */
export interface SampleVerdict {
  readonly dq: number;
  readonly tenDq: number;
  /** Δ/B of the sample (NaN for d¹ and d⁹ with B = 0). */
  readonly deltaOverB: number;
  /** Ground-state label at the sample's Dq, e.g. `1A1g(I)`. */
  readonly ground: string;
  /** Its plain ²ˢ⁺¹Γ, e.g. `1A1g`. */
  readonly groundSymbol: string;
  readonly S: number;
  readonly side: SpinSide;
  /** The crossover nearest the sample (absent without one). */
  readonly crossing?: Crossover;
  /** Dq − Dq_c (and in 10Dq and % of Δc): positive on the strong-field side of the nearest crossover. */
  readonly margin?: Margin;
  /** Standard uncertainty of the margin, when σ(Dq) or σ(B) is given (first-order propagation). */
  readonly sigma?: Margin;
  /** Standard uncertainty of the sample's Δ/B, (10/B)·√(σ²(Dq) + (Dq/B)²σ²(B) − 2(Dq/B)ρσ(Dq)σ(B)). */
  readonly sigmaDeltaOverB?: number;
  /** Standard uncertainty of the crossover Dq itself from σ(B): x·σ(B), cm⁻¹. */
  readonly crossingSigmaDq?: number;
  /** |margin| / σ. */
  readonly sigmas?: number;
  /** Whether |margin| exceeds the settled number of σ (absent without uncertainties). */
  readonly settled?: boolean;
  /** Whether |margin| is below the near percentage of Δc. */
  readonly near?: boolean;
  /** The lowest state of the spin across the nearest crossover (label). */
  readonly other?: string;
  /** Its energy above the ground state at the sample's Dq, cm⁻¹. */
  readonly gap?: number;
}

/**
 * Which side of the crossover a sample is on, by how much, and how sure that is.
 *
 * With x = Dq_c/B fixed by C/B, the margin m = Dq − x·B. First-order propagation for correlated
 * inputs (JCGM 100:2008, Guide to the Expression of Uncertainty in Measurement, §5.2) gives
 * σ²(m) = σ²(Dq) + x²σ²(B) − 2xρσ(Dq)σ(B); for the percentage P = 100(Dq/Dq_c − 1),
 * σ(P) = (100/Dq_c)·√(σ²(Dq) + (Dq/B)²σ²(B) − 2(Dq/B)ρσ(Dq)σ(B)). An uncertainty of C/B is not
 * included.
 * @throws InputError for a negative Dq or uncertainty, or a correlation outside [−1, 1].
 */
export function sampleVerdict(
  analysis: CrossoverAnalysis,
  sample: SampleParameters,
  options: VerdictOptions = {},
): SampleVerdict {
  const { dq, sigmaDq, sigmaB, correlation = 0 } = sample;
  const settledSigmas = options.settledSigmas ?? SETTLED_SIGMAS;
  const nearPercent = options.nearPercent ?? NEAR_CROSSOVER_PERCENT;
  ensure(Number.isFinite(dq) && dq >= 0, `Dq = ${dq}: expected a non-negative number of cm⁻¹`);
  for (const [name, s] of [
    ['σ(Dq)', sigmaDq],
    ['σ(B)', sigmaB],
  ] as const) {
    ensure(
      s === undefined || (Number.isFinite(s) && s >= 0),
      `${name} = ${s}: expected a non-negative number of cm⁻¹`,
    );
  }
  ensure(
    Number.isFinite(correlation) && Math.abs(correlation) <= 1,
    `correlation ${correlation}: expected a number from −1 to 1`,
  );
  const { n, geometry, B, C, crossings } = analysis;
  const result = solveCubic({ n, geometry, dq, B, C });
  const g = result.ground;
  const base = {
    dq,
    tenDq: 10 * dq,
    deltaOverB: B > 0 ? (10 * dq) / B : Number.NaN,
    ground: g.label,
    groundSymbol: g.symbol,
    S: g.S,
  };
  let nearest: Crossover | undefined;
  for (const c of crossings) if (!nearest || Math.abs(dq - c.dq) < Math.abs(dq - nearest.dq)) nearest = c;
  if (!nearest) return { ...base, side: 'no-crossover' };
  const spins = crossings.flatMap((c) => [c.fromS, c.toS]);
  const side: SpinSide =
    g.S === Math.max(...spins) ? 'high-spin' : g.S === Math.min(...spins) ? 'low-spin' : 'intermediate-spin';
  const dqC = nearest.dq;
  const m = dq - dqC;
  const margin = { dq: m, tenDq: 10 * m, percent: (100 * m) / dqC };
  const otherS = g.S === nearest.fromS ? nearest.toS : nearest.fromS;
  const other = result.levels.find((l) => l.S === otherS);
  const out = {
    ...base,
    side,
    crossing: nearest,
    margin,
    near: Math.abs(margin.percent) < nearPercent,
    ...(other ? { other: other.label, gap: other.energy } : {}),
  };
  if (sigmaDq === undefined && sigmaB === undefined) return out;
  const sDq = sigmaDq ?? 0;
  const sB = sigmaB ?? 0;
  // σ of Dq − a·B for a fixed factor a (first order, correlated): a = x for the margin,
  // a = Dq/B for Δ/B and for the percentage.
  const sigmaOf = (a: number) =>
    Math.sqrt(Math.max(0, sDq ** 2 + (a * sB) ** 2 - 2 * a * correlation * sDq * sB));
  const x = dqC / B;
  const sigmaM = sigmaOf(x);
  const sigmaRatio = sigmaOf(dq / B);
  const sigmas = sigmaM > 0 ? Math.abs(m) / sigmaM : Number.POSITIVE_INFINITY;
  return {
    ...out,
    sigma: { dq: sigmaM, tenDq: 10 * sigmaM, percent: (100 / dqC) * sigmaRatio },
    sigmaDeltaOverB: (10 / B) * sigmaRatio,
    crossingSigmaDq: x * sB,
    sigmas,
    settled: sigmas > settledSigmas,
  };
}

/** A caution about a spin-state prediction, in words a report can carry. */
export interface CrossoverCaution {
  readonly code: 'spin-state' | 'bond-length' | 'tetrahedral' | 'jahn-teller';
  readonly message: string;
}

/** What the crossover model leaves out, for the output and reports. */
export function crossoverCautions(analysis: CrossoverAnalysis): CrossoverCaution[] {
  const out: CrossoverCaution[] = [];
  if (analysis.crossings.length === 0) return out;
  out.push({
    code: 'spin-state',
    message:
      'the model places the crossover for a rigid ion at 0 K; which spin state a real compound adopts depends ' +
      'also on entropy (spin and vibrational), lattice and temperature — magnetometry or Mössbauer spectroscopy decides',
  });
  out.push({
    code: 'bond-length',
    message:
      'metal–ligand bonds are longer in the high-spin state, so Δ differs between the two states: a Δ from the bands ' +
      'belongs to the state the sample is in, and spin-crossover compounds have Δ(HS) below and Δ(LS) above Δc ' +
      '(Hauser, Top. Curr. Chem. 233, 49, 2004, from memory)',
  });
  if (analysis.outOfReach) out.push({ code: 'tetrahedral', message: analysis.outOfReach });
  const eStates = [
    ...new Set(analysis.crossings.flatMap((c) => [c.fromSymbol, c.toSymbol]).filter((s) => /E/.test(s))),
  ];
  if (eStates.length > 0) {
    out.push({
      code: 'jahn-teller',
      message:
        `${eStates.map(unicodeLabel).join(' and ')} ${eStates.length > 1 ? 'are' : 'is'} orbitally degenerate (E) ` +
        'and Jahn–Teller active: the distortion lowers it and moves the real crossover away from the cubic value',
    });
  }
  return out;
}
