import { ensure, InputError } from '../core/errors.js';
import { DEFAULT_C_OVER_B, MAX_C_OVER_B } from '../core/ions.js';
import type { Geometry } from '../field/labels.js';
import { levelKeyOfLabel } from './assignment.js';
import { FIT_DEFAULTS, type FitBand, type FitInput } from './fitTypes.js';
import { type RatioScan, ratioScan, singleTerm } from './ratioScan.js';

/**
 * The input checks of a band fit: every value a fit takes is checked here, with one line naming
 * the value and what was expected, and resolved to the settings the later steps use.
 */

/** A checked fit input with its defaults resolved. */
export interface FitSetup {
  readonly n: number;
  readonly geometry: Geometry;
  readonly bands: readonly FitBand[];
  /** Uncertainty of each band: given, or the default precision. */
  readonly sigmas: readonly number[];
  /** Uncertainty assumed for bands given without one, cm⁻¹. */
  readonly bandPrecision: number;
  /** Whether the uncertainties were given with the bands. */
  readonly given: boolean;
  /** C fitted (true), held (false), or decided by the bands (undefined). */
  readonly fitC: boolean | undefined;
  readonly cOverB: number;
  readonly cOverBSource: 'given' | 'free-ion' | 'default';
  readonly freeB: number | null;
  readonly fixedB: number | undefined;
  readonly ambiguityFactor: number;
  readonly maxSolutions: number;
  readonly maxRefined: number;
  /** Display names of the free parameters (`Dq`, `B`, `C`). */
  readonly names: readonly string[];
  /** The Δ/B scan at the starting C/B. */
  readonly scan: RatioScan;
  /** The level key each band is assigned to by the caller, or null where searched. */
  readonly fixed: readonly (string | null)[];
}

/** Checks the electron count, the geometry and the bands with their uncertainties. */
function checkBands(input: FitInput, geometry: Geometry): void {
  const { n, bands } = input;
  ensure(
    Number.isInteger(n) && n >= 1 && n <= 9,
    `d-electron count ${n}: expected a whole number from 1 to 9`,
  );
  ensure(geometry === 'oct' || geometry === 'tet', `geometry "${geometry}": expected oct or tet`);
  ensure(bands.length > 0, 'no bands: give at least one observed band maximum');
  for (const [i, b] of bands.entries()) {
    ensure(
      Number.isFinite(b.energy) && b.energy > 0,
      `band ${i + 1} = ${b.energy}: expected a positive number of cm⁻¹`,
    );
    ensure(
      b.sigma === undefined || (Number.isFinite(b.sigma) && b.sigma > 0),
      `uncertainty of band ${i + 1} = ${b.sigma}: expected a positive number of cm⁻¹`,
    );
    ensure(
      b.epsilon === undefined || (Number.isFinite(b.epsilon) && b.epsilon > 0),
      `ε of band ${i + 1} = ${b.epsilon}: expected a positive number of L mol⁻¹ cm⁻¹`,
    );
    ensure(
      b.width === undefined || (Number.isFinite(b.width) && b.width > 0),
      `width of band ${i + 1} = ${b.width}: expected a positive number of cm⁻¹`,
    );
  }
  const withSigma = bands.filter((b) => b.sigma !== undefined).length;
  ensure(
    withSigma === 0 || withSigma === bands.length,
    `uncertainties given for ${withSigma} of ${bands.length} bands: give one for every band or for none`,
  );
}

/** The C/B held (or started from) and where it comes from. */
function resolveCOverB(input: FitInput): Pick<FitSetup, 'cOverB' | 'cOverBSource'> {
  const freeRatio =
    input.freeIon?.B !== undefined && input.freeIon.C !== undefined
      ? input.freeIon.C / input.freeIon.B
      : undefined;
  const cOverB = input.cOverB ?? freeRatio ?? DEFAULT_C_OVER_B;
  ensure(
    Number.isFinite(cOverB) && cOverB > 0 && cOverB <= MAX_C_OVER_B,
    `C/B = ${cOverB}: expected a positive number up to ${MAX_C_OVER_B}`,
  );
  const cOverBSource =
    input.cOverB !== undefined ? 'given' : freeRatio !== undefined ? 'free-ion' : 'default';
  return { cOverB, cOverBSource };
}

/** Checks the ranking and search limits. */
function checkLimits(input: FitInput): Pick<FitSetup, 'ambiguityFactor' | 'maxSolutions' | 'maxRefined'> & {
  bandPrecision: number;
} {
  const bandPrecision = input.bandPrecision ?? FIT_DEFAULTS.bandPrecision;
  const ambiguityFactor = input.ambiguityFactor ?? FIT_DEFAULTS.ambiguityFactor;
  const maxSolutions = input.maxSolutions ?? FIT_DEFAULTS.maxSolutions;
  const maxRefined = input.maxRefined ?? FIT_DEFAULTS.maxRefined;
  ensure(bandPrecision > 0, `band precision ${bandPrecision}: expected a positive number of cm⁻¹`);
  ensure(ambiguityFactor >= 1, `ambiguity factor ${ambiguityFactor}: expected a number ≥ 1`);
  ensure(
    Number.isInteger(maxSolutions) && maxSolutions >= 1,
    `most solutions ${maxSolutions}: expected a whole number ≥ 1`,
  );
  ensure(
    Number.isInteger(maxRefined) && maxRefined >= 1,
    `most refined ${maxRefined}: expected a whole number ≥ 1`,
  );
  return { bandPrecision, ambiguityFactor, maxSolutions, maxRefined };
}

/**
 * Checks the free parameters against the number of bands; returns their display names. Fewer
 * bands than Dq and B are left to the fit: one band can fix Dq when it lies at a multiple of Dq
 * whatever B is (the ⁵Eg band of high-spin d⁶), and B is then reported as not determined.
 */
function checkParameters(input: FitInput, fitC: boolean): string[] {
  const { n, bands, fixedB } = input;
  const single = singleTerm(n);
  ensure(
    fixedB === undefined || (Number.isFinite(fixedB) && fixedB > 0),
    `held B = ${fixedB}: expected a positive number of cm⁻¹`,
  );
  ensure(!(fixedB !== undefined && single), `holding B: d${n} has a single free-ion term and no B`);
  ensure(!(fixedB !== undefined && fitC), 'holding B and fitting C: fit C only with B free');
  const names = single || fixedB !== undefined ? ['Dq'] : fitC ? ['Dq', 'B', 'C'] : ['Dq', 'B'];
  ensure(
    !fitC || bands.length >= names.length,
    `${bands.length} band${bands.length === 1 ? '' : 's'} for ${names.length} free parameters (${names.join(', ')}): ` +
      `give at least ${names.length} bands, or hold C/B fixed`,
  );
  return names;
}

/** The level keys of the caller's assignments (null where searched), checked against the scan. */
function checkAssignments(input: FitInput, scan: RatioScan): (string | null)[] {
  const { n, bands } = input;
  const assignments = input.assignments ?? [];
  ensure(
    assignments.length <= bands.length,
    `${assignments.length} assignments for ${bands.length} band${bands.length === 1 ? '' : 's'}: expected at most one per band`,
  );
  const fixed = bands.map((_, i) => {
    const label = assignments[i];
    return label === null || label === undefined || label.trim() === '?' || label.trim() === ''
      ? null
      : levelKeyOfLabel(scan, label);
  });
  const fixedKeys = fixed.filter((k): k is string => k !== null);
  ensure(
    new Set(fixedKeys).size === fixedKeys.length,
    `assignments ${assignments.filter((a) => a).join(', ')}: each level can take only one band`,
  );
  const alwaysGround = fixedKeys.find((k) => scan.points.every((pt) => pt.ground.key === k));
  if (alwaysGround) {
    const label = scan.points[0]?.ground.label ?? alwaysGround;
    throw new InputError(
      `assignment "${label}" is the ground state of d${n}: assign bands to excited levels`,
    );
  }
  return fixed;
}

/**
 * Checks a fit input and resolves its defaults.
 * @throws InputError naming the first bad value.
 */
export function checkFitInput(input: FitInput): FitSetup {
  const { n, bands } = input;
  const geometry = input.geometry ?? FIT_DEFAULTS.geometry;
  checkBands(input, geometry);
  const fitC = input.fitC;
  ensure(!(fitC && singleTerm(n)), `fitting C: d${n} has a single free-ion term, so only Dq can be fitted`);
  const { cOverB, cOverBSource } = resolveCOverB(input);
  const { bandPrecision, ...limits } = checkLimits(input);
  const names = checkParameters(input, fitC === true);
  const scan = ratioScan(n, geometry, cOverB, input.scan);
  const fixed = checkAssignments(input, scan);
  const given = bands.some((b) => b.sigma !== undefined);
  return {
    n,
    geometry,
    bands,
    sigmas: bands.map((b) => b.sigma ?? bandPrecision),
    bandPrecision,
    given,
    fitC,
    cOverB,
    cOverBSource,
    freeB: input.freeIon?.B ?? null,
    fixedB: input.fixedB,
    ...limits,
    names,
    scan,
    fixed,
  };
}
