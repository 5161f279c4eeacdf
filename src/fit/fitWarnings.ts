import { CHARGE_TRANSFER_ONSET, cubicCautions } from '../analysis/cautions.js';
import { type GroundCrossing, groundStateCrossings } from '../analysis/groundState.js';
import { halfIntegerText } from '../atom/terms.js';
import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import type { BandMerge, SpinHypothesis } from './fitTypes.js';

/**
 * Where a band fit can mislead, in words a report can carry. Thresholds marked so are rules of
 * thumb (common practice, no source).
 */

/** Kinds of {@link FitWarning}. */
export type FitWarningCode =
  | 'jahn-teller'
  | 'excited-jahn-teller'
  | 'charge-transfer'
  | 'spin-state'
  | 'beta-above-one'
  | 'beta-very-low'
  | 'range-edge'
  | 'unusual-c-over-b'
  | 'rms-high'
  | 'residuals-exceed-uncertainties'
  | 'not-converged'
  | 'c-held'
  | 'spin-forbidden-band'
  | 'ambiguous'
  | 'jahn-teller-pair'
  | 'ground-without-assignment'
  | 'b-not-determined'
  | 'merged-bands'
  | 'c-fitted'
  | 'spin-without-solution';

/** One warning: a short code for programs and a sentence for people. */
export interface FitWarning {
  readonly code: FitWarningCode;
  readonly message: string;
}

/** Thresholds of the warnings. */
export const FIT_WARNING_LIMITS = {
  /** rms residual above which the fit is called poor, cm⁻¹ (common practice, no source). */
  rms: 500,
  /** χ²/dof above which residuals exceed the given uncertainties (common practice, no source). */
  reducedChiSquare: 3,
  /** C/B outside this range is unusual for 3d complexes (common practice, no source). */
  cOverB: [3, 6] as readonly [number, number],
  /**
   * β below this is implausible for a 3d complex: even the most covalent ligands (sulfides,
   * cyanide) leave β near 0.4–0.5 (common practice, no source).
   */
  lowBeta: 0.4,
} as const;

/** What {@link solutionWarnings} looks at. */
export interface WarningContext {
  readonly result: CubicResult;
  readonly observed: readonly number[];
  /** Labels of the levels assigned to the bands, and whether each is spin-allowed. */
  readonly assigned: readonly { readonly label: string; readonly spinAllowed: boolean }[];
  readonly beta: number | null;
  readonly deltaOverB: number | null;
  readonly scanRange: readonly [number, number];
  readonly cFitted: boolean;
  readonly cHeld: boolean;
  /** Whether the bands fix B (false: B held at a nominal value). */
  readonly bDetermined: boolean;
  /** The element, for advice that holds for one element only; null when unknown. */
  readonly element: string | null;
  readonly rms: number;
  readonly reducedChiSquare: number | null;
  readonly converged: boolean;
  readonly reasonText: string;
}

const crossingMemo = new Map<string, GroundCrossing[]>();

/** Changes of ground-state spin along Δ/B at this C/B (they depend on C/B only). */
function crossingsAt(n: number, geometry: Geometry, cOverB: number, maxDeltaOverB: number): GroundCrossing[] {
  const key = `${n}:${geometry}:${cOverB}:${maxDeltaOverB}`;
  let hit = crossingMemo.get(key);
  if (!hit) {
    // d⁴–d⁷ change spin once at most in this range, so a coarse scan cannot miss a change.
    hit = groundStateCrossings({
      n,
      geometry,
      B: 1,
      C: cOverB,
      maxDeltaOverB,
      scanPoints: 24,
      dqTolerance: 1e-9,
    });
    if (crossingMemo.size >= 64) crossingMemo.delete(crossingMemo.keys().next().value ?? '');
    crossingMemo.set(key, hit);
  }
  return hit;
}

/** Which measurement settles the spin state: magnetism, and ⁵⁷Fe Mössbauer spectroscopy for iron only. */
function measurementDecides(element: string | null): string {
  return (
    'which spin state a real compound adopts depends also on temperature, lattice and entropy — ' +
    `magnetic measurement${element === 'Fe' ? ' or ⁵⁷Fe Mössbauer spectroscopy' : ''} decides`
  );
}

function spinStateWarning(ctx: WarningContext): FitWarning | undefined {
  const { result, deltaOverB } = ctx;
  const { n, geometry } = result;
  // Tetrahedral d⁴–d⁷ have no spin choice at real fields (Δt ≈ 4/9 Δo; common practice, no source).
  if (n < 4 || n > 7 || geometry === 'tet' || deltaOverB === null || !(result.B > 0)) return undefined;
  const g = result.ground;
  const cOverB = result.C / result.B;
  const range = Math.max(ctx.scanRange[1], deltaOverB);
  const crossing = crossingsAt(n, geometry, cOverB, range)[0];
  const at = `(at C/B ${cOverB.toFixed(2)})`;
  const ground = `the ground state ${g.symbol} (S = ${halfIntegerText(g.S)})`;
  const where = crossing
    ? `the fitted Δ/B = ${deltaOverB.toFixed(1)} lies on the ${deltaOverB < crossing.deltaOverB ? 'high' : 'low'}-spin ` +
      `side of the change of ground-state spin at Δ/B = ${crossing.deltaOverB.toFixed(1)} ${at}, so this solution ` +
      `assumes ${ground}; solutions with the other spin state are searched separately`
    : `the ground-state spin does not change up to Δ/B = ${range.toFixed(0)} ${at}: ${ground} throughout`;
  return {
    code: 'spin-state',
    message: `d${n} (octahedral): ${where}; ${measurementDecides(ctx.element)}`,
  };
}

/** At most `shown` items, then how many more. */
function listSome(items: readonly string[], shown = 3): string {
  const more = items.length - shown;
  return more > 0 ? `${items.slice(0, shown).join(', ')} and ${more} more` : items.join(', ');
}

function chargeTransferWarning(ctx: WarningContext): FitWarning | undefined {
  const observed = ctx.observed.filter((e) => e > CHARGE_TRANSFER_ONSET).map((e) => `${e.toFixed(0)} cm⁻¹`);
  const g = ctx.result.ground;
  const predicted = ctx.result.levels
    .filter((l) => l !== g && l.spinAllowed && l.energy > CHARGE_TRANSFER_ONSET)
    .map((l) => `${l.label} at ${l.energy.toFixed(0)} cm⁻¹`);
  if (observed.length === 0 && predicted.length === 0) return undefined;
  const parts = [
    observed.length > 0 ? `observed ${observed.length > 1 ? 'bands' : 'band'} at ${listSome(observed)}` : '',
    predicted.length > 0
      ? `predicted spin-allowed ${predicted.length > 1 ? 'bands' : 'band'} ${listSome(predicted)}`
      : '',
  ].filter((x) => x !== '');
  return {
    code: 'charge-transfer',
    message:
      `${parts.join('; ')}: above ${CHARGE_TRANSFER_ONSET} cm⁻¹ charge-transfer and ligand bands often lie ` +
      '(common practice, no source) and can hide d–d bands or pass for them',
  };
}

/** Warnings about one fitted solution, most important first. */
export function solutionWarnings(ctx: WarningContext): FitWarning[] {
  const out: FitWarning[] = [];
  if (!ctx.converged) {
    out.push({ code: 'not-converged', message: `the fit did not converge: ${ctx.reasonText}` });
  }
  if (ctx.rms > FIT_WARNING_LIMITS.rms) {
    out.push({
      code: 'rms-high',
      message:
        `rms residual ${ctx.rms.toFixed(0)} cm⁻¹ is far above the few hundred cm⁻¹ usual for d–d band fits ` +
        '(common practice, no source): the assignment or the cubic model may be wrong',
    });
  }
  if (ctx.reducedChiSquare !== null && ctx.reducedChiSquare > FIT_WARNING_LIMITS.reducedChiSquare) {
    out.push({
      code: 'residuals-exceed-uncertainties',
      message:
        `the residuals exceed the given band uncertainties (χ²/dof = ${ctx.reducedChiSquare.toFixed(1)}): ` +
        'the errors quoted from those uncertainties understate the real spread',
    });
  }
  if (ctx.beta !== null && ctx.beta > 1) {
    out.push({
      code: 'beta-above-one',
      message:
        `β = ${ctx.beta.toFixed(2)} > 1: B above the free-ion value is unphysical for a complex (the nephelauxetic ` +
        'effect lowers B); this assignment is unlikely',
    });
  }
  if (ctx.beta !== null && ctx.beta < FIT_WARNING_LIMITS.lowBeta) {
    out.push({
      code: 'beta-very-low',
      message:
        `β = ${ctx.beta.toFixed(2)} < ${FIT_WARNING_LIMITS.lowBeta}: a B this far below the free-ion value is implausible ` +
        'for a 3d complex (common practice, no source); this assignment is unlikely',
    });
  }
  const [lo, hi] = ctx.scanRange;
  if (ctx.deltaOverB !== null && (ctx.deltaOverB <= lo || ctx.deltaOverB >= hi)) {
    out.push({
      code: 'range-edge',
      message: `Δ/B = ${ctx.deltaOverB.toFixed(1)} is at or beyond the edge of the scanned range ${lo}–${hi}`,
    });
  }
  if (ctx.cFitted && ctx.result.B > 0) {
    const cb = ctx.result.C / ctx.result.B;
    const [cLo, cHi] = FIT_WARNING_LIMITS.cOverB;
    if (cb < cLo || cb > cHi) {
      out.push({
        code: 'unusual-c-over-b',
        message: `fitted C/B = ${cb.toFixed(2)} is outside the usual ${cLo}–${cHi} for 3d complexes (common practice, no source)`,
      });
    }
  }
  if (!ctx.bDetermined) {
    out.push({
      code: 'b-not-determined',
      message:
        `no assigned band depends on Racah B (the band lies at a multiple of Dq whatever B is): Dq is fixed by the ` +
        `bands, B is not — it is held at ${ctx.result.B.toFixed(0)} cm⁻¹ only to place the other levels, and no β is ` +
        'given; a spin-forbidden band or B held at a known value (--B) would fix it',
    });
  }
  if (ctx.cHeld) {
    out.push({
      code: 'c-held',
      message:
        'C was to be fitted, but none of the assigned bands depends on it (transitions within the ground ' +
        'state’s spin often involve only Dq and B): C is held at the starting C/B',
    });
  }
  const forbidden = ctx.assigned
    .map((a, i) => ({ ...a, energy: ctx.observed[i] ?? 0 }))
    .filter((a) => !a.spinAllowed);
  if (forbidden.length > 0) {
    out.push({
      code: 'spin-forbidden-band',
      message:
        `${forbidden.map((a) => `${a.energy.toFixed(0)} cm⁻¹ → ${a.label}`).join(', ')} assigned to spin-forbidden ` +
        'transitions: such bands are usually much weaker and often sharper; check the intensity',
    });
  }
  const transfer = chargeTransferWarning(ctx);
  if (transfer) out.push(transfer);
  const spin = spinStateWarning(ctx);
  if (spin) out.push(spin);
  // Spin state and charge transfer are said above with the fit's own figures.
  for (const c of cubicCautions(ctx.result))
    if (c.code !== 'spin-state' && c.code !== 'charge-transfer') out.push(c);
  return out;
}

/** What {@link resultWarnings} looks at. */
export interface ResultWarningContext {
  readonly n: number;
  readonly geometry: Geometry;
  /** Number of bands fitted. */
  readonly bands: number;
  readonly solutions: number;
  readonly ambiguityFactor: number;
  readonly includeSpinForbidden: boolean;
  /** Ground states for which no assignment of all bands existed. */
  readonly groundsWithout: readonly string[];
  /** Input bands merged, with why. */
  readonly merges: readonly BandMerge[];
  /** Whether merging was asked for. */
  readonly merge: boolean;
  /** Ground spin of the best solution, and the largest the ion can have. */
  readonly bestSpin: number;
  readonly highestSpin: number;
  /** Whether C was fitted because the bands determine it, and of how many bands. */
  readonly cAuto: boolean;
  /** Hypotheses with no solution, with why. */
  readonly hypotheses: readonly SpinHypothesis[];
}

/** Whether the single spin-allowed band of this ground can be a Jahn–Teller pair (d¹, d⁹, high-spin d⁴ and d⁶). */
function jahnTellerBand(ctx: ResultWarningContext): boolean {
  const { n } = ctx;
  return n === 1 || n === 9 || ((n === 4 || n === 6) && ctx.bestSpin === ctx.highestSpin);
}

/** Warnings about the fit as a whole (not one solution). */
export function resultWarnings(ctx: ResultWarningContext): FitWarning[] {
  const { n, bands: m } = ctx;
  const warnings: FitWarning[] = [];
  for (const merge of ctx.merges) {
    warnings.push({
      code: 'merged-bands',
      message:
        `bands ${merge.energies.map((e) => e.toFixed(0)).join(', ')} cm⁻¹ merged into one at ${merge.centroid.toFixed(0)} cm⁻¹ ` +
        `(closer than a band width): ${merge.reason}; to fit them apart, give --keep-bands (fit command) or keep_bands in the sample sheet`,
    });
  }
  if (ctx.cAuto) {
    warnings.push({
      code: 'c-fitted',
      message: `C fitted as well: the ${m} bands depend on C and fix it (to hold C/B instead, give --cb, or cb in the sample sheet)`,
    });
  }
  if (ctx.solutions > 1) {
    warnings.push({
      code: 'ambiguous',
      message:
        `${ctx.solutions} assignments are listed (the best of each ground spin, and those with weighted rms within a ` +
        `factor of ${ctx.ambiguityFactor} of the best): the band positions alone do not decide; the ranking weighs β, ` +
        'two-electron transitions, unobserved bands and band intensities — check the score of each',
    });
  }
  if (jahnTellerBand(ctx) && m >= 2 && !ctx.merge) {
    warnings.push({
      code: 'jahn-teller-pair',
      message:
        `${n === 4 || n === 6 ? 'high-spin ' : ''}d${n} has a single spin-allowed band (${n === 1 || n === 6 ? 'to an E state' : 'from an E ground state'}), ` +
        'which a Jahn–Teller distortion often splits into two components: if two of these bands are such a pair, ' +
        '10Dq is about their centroid — let them be merged (without --keep-bands or keep_bands)',
    });
  }
  for (const h of ctx.hypotheses) {
    if (h.bestRank === null && h.note !== null) {
      warnings.push({ code: 'spin-without-solution', message: h.note });
    }
  }
  // A ground state whose hypothesis has already said why it has no solution is not named twice.
  const explained = new Set(ctx.hypotheses.filter((h) => h.note !== null).map((h) => h.ground));
  for (const label of ctx.groundsWithout.filter((g) => !explained.has(g))) {
    warnings.push({
      code: 'ground-without-assignment',
      message:
        `no assignment of ${m} band${m === 1 ? '' : 's'} to ${ctx.includeSpinForbidden ? '' : 'spin-allowed '}` +
        `transitions from the ground state ${label} exists, so no solution assumes it` +
        (ctx.includeSpinForbidden
          ? ''
          : '; include spin-forbidden transitions to consider it (--spin-forbidden, or spin_forbidden in the sample sheet)'),
    });
  }
  return warnings;
}
