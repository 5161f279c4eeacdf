import { CHARGE_TRANSFER_ONSET, cubicCautions } from '../analysis/cautions.js';
import { type GroundCrossing, groundStateCrossings } from '../analysis/groundState.js';
import { halfIntegerText } from '../atom/terms.js';
import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';

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
  | 'ground-without-assignment';

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

const MEASUREMENT_DECIDES =
  'which spin state a real compound adopts depends also on temperature, lattice and entropy — ' +
  'magnetic or Mössbauer measurement decides';

function spinStateWarning(ctx: WarningContext): FitWarning | undefined {
  const { result, deltaOverB } = ctx;
  const { n, geometry } = result;
  if (n < 4 || n > 7 || deltaOverB === null || !(result.B > 0)) return undefined;
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
    message: `d${n} (${geometry === 'oct' ? 'octahedral' : 'tetrahedral'}): ${where}; ${MEASUREMENT_DECIDES}`,
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
  /** Number of bands fitted. */
  readonly bands: number;
  readonly solutions: number;
  readonly ambiguityFactor: number;
  readonly includeSpinForbidden: boolean;
  /** Ground states for which no assignment of all bands existed. */
  readonly groundsWithout: readonly string[];
}

/** Warnings about the fit as a whole (not one solution). */
export function resultWarnings(ctx: ResultWarningContext): FitWarning[] {
  const { n, bands: m } = ctx;
  const warnings: FitWarning[] = [];
  if (ctx.solutions > 1) {
    warnings.push({
      code: 'ambiguous',
      message:
        `${ctx.solutions} assignments fit nearly as well (weighted rms within a factor of ${ctx.ambiguityFactor} of ` +
        'the best, or within the band uncertainties): the band positions alone do not decide; weigh intensities, ' +
        'band widths and β < 1',
    });
  }
  if ([1, 4, 6, 9].includes(n) && m >= 2) {
    warnings.push({
      code: 'jahn-teller-pair',
      message:
        `high-spin d${n} has a single spin-allowed band (${n === 1 || n === 6 ? 'to an E state' : 'from an E ground state'}), ` +
        'which a Jahn–Teller distortion often splits into two components: if two of these bands are such a pair, ' +
        '10Dq is about their mean — fit that one value with B held (--B)',
    });
  }
  for (const label of ctx.groundsWithout) {
    warnings.push({
      code: 'ground-without-assignment',
      message:
        `no assignment of ${m} band${m === 1 ? '' : 's'} to ${ctx.includeSpinForbidden ? '' : 'spin-allowed '}` +
        `transitions from the ground state ${label} exists, so no solution assumes it` +
        (ctx.includeSpinForbidden ? '' : '; include spin-forbidden transitions to consider it'),
    });
  }
  return warnings;
}
