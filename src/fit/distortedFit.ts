/**
 * Fits the field parameters of a distorted complex (eσ and eπ of each ligand kind, or Dq, Ds, Dt,
 * or Dq, Dσ, Dτ) and Racah B to observed band energies, each band assigned to a level of the
 * point group by its label. The model is the full dⁿ calculation of lowSymmetrySolver.ts; the
 * minimiser is the project's bounded Levenberg–Marquardt. The fit says when the bands cannot
 * fix the free parameters: fewer bands than parameters, as many (no error estimate), or a
 * combination of parameters the bands do not feel (a near-zero singular value of the Jacobian).
 */

import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { ensure } from '../core/errors.js';
import type { BondParameters } from '../field/angularOverlap.js';
import { type FieldSpec, fieldOf, groupOf, idealised, symmetrised } from '../field/distortedComplex.js';
import { type FieldResult, solveField, symmetryContext } from '../field/lowSymmetrySolver.js';
import { inverseNormalMatrix, levenbergMarquardt, type StopReason } from '../numeric/leastSquares.js';

/** One observed band. */
export interface DistortedBand {
  /** Band maximum, cm⁻¹ above the ground state. */
  readonly energy: number;
  /** Standard uncertainty, cm⁻¹. */
  readonly sigma?: number;
  /** The level it is assigned to, as labelled by the solver (`2A1g`, `4Eg(1)`); by order when absent. */
  readonly level?: string;
}

/** Input of {@link fitDistorted}. Energies in cm⁻¹. */
export interface DistortedFitInput {
  readonly n: number;
  /** The field with its starting values. */
  readonly field: FieldSpec;
  /** Starting Racah B. */
  readonly B: number;
  /** Starting Racah C; C/B stays at its starting value unless `C` is free. */
  readonly C: number;
  /** Names of the free parameters (see {@link fitParameterNames}); the others stay fixed. */
  readonly free: readonly string[];
  readonly bands: readonly DistortedBand[];
}

/** A warning about what a distorted-complex fit can tell. */
export interface DistortedFitWarning {
  readonly code:
    | 'underdetermined'
    | 'exact'
    | 'undetermined-combination'
    | 'assigned-by-order'
    | 'ground-changed';
  readonly message: string;
}

/** One band after the fit. */
export interface FittedDistortedBand {
  readonly level: string;
  readonly observed: number;
  readonly calculated: number;
}

/** Outcome of {@link fitDistorted}. */
export interface DistortedFitResult {
  /** Every parameter (free and fixed) at the optimum, by name. */
  readonly parameters: Readonly<Record<string, number>>;
  /** Standard errors of the free parameters; null where the bands do not fix them. */
  readonly errors: Readonly<Record<string, number | null>>;
  readonly free: readonly string[];
  readonly field: FieldSpec;
  readonly B: number;
  readonly C: number;
  readonly bands: readonly FittedDistortedBand[];
  /** Root-mean-square deviation of the band energies, cm⁻¹. */
  readonly rms: number;
  readonly group: string;
  readonly levels: FieldResult;
  readonly converged: boolean;
  readonly reason: StopReason;
  readonly warnings: readonly DistortedFitWarning[];
}

/** Singular values below this fraction of the largest mark a combination the bands do not fix. */
export const UNDETERMINED_RCOND = 1e-6;

/**
 * The names of a field's parameters: `eSigma(kind)` and `ePi(kind)` (or `ePiX(kind)`, `ePiY(kind)`
 * for a kind with π bonding different in its two planes), `eDs`; `dq`, `ds`, `dt`; `dq`, `dSigma`,
 * `dTau`.
 */
export function fitParameterNames(spec: FieldSpec): string[] {
  if (spec.kind === 'tetragonal') return ['dq', 'ds', 'dt'];
  if (spec.kind === 'trigonal') return ['dq', 'dSigma', 'dTau'];
  return [...Object.keys(fieldValues(spec)).filter((k) => k !== 'eDs'), 'eDs'];
}

function fieldValues(spec: FieldSpec): Record<string, number> {
  if (spec.kind === 'tetragonal') return { dq: spec.dq, ds: spec.ds, dt: spec.dt };
  if (spec.kind === 'trigonal') return { dq: spec.dq, dSigma: spec.dSigma, dTau: spec.dTau };
  const out: Record<string, number> = { eDs: spec.eDs ?? 0 };
  for (const [k, p] of Object.entries(spec.parameters)) {
    out[`eSigma(${k})`] = p.eSigma;
    if (p.ePiX !== undefined || p.ePiY !== undefined) {
      out[`ePiX(${k})`] = p.ePiX ?? p.ePi ?? 0;
      out[`ePiY(${k})`] = p.ePiY ?? p.ePi ?? 0;
    } else out[`ePi(${k})`] = p.ePi ?? 0;
  }
  return out;
}

function withValues(spec: FieldSpec, v: Readonly<Record<string, number>>): FieldSpec {
  const at = (name: string) => v[name] ?? 0;
  if (spec.kind === 'tetragonal') return { ...spec, dq: at('dq'), ds: at('ds'), dt: at('dt') };
  if (spec.kind === 'trigonal') return { ...spec, dq: at('dq'), dSigma: at('dSigma'), dTau: at('dTau') };
  const parameters: Record<string, BondParameters> = {};
  for (const [k, p] of Object.entries(spec.parameters)) {
    const anisotropic = p.ePiX !== undefined || p.ePiY !== undefined;
    parameters[k] = anisotropic
      ? { eSigma: at(`eSigma(${k})`), ePiX: at(`ePiX(${k})`), ePiY: at(`ePiY(${k})`) }
      : { eSigma: at(`eSigma(${k})`), ePi: at(`ePi(${k})`) };
  }
  return { ...spec, parameters, eDs: at('eDs') };
}

function checkFitInput(input: DistortedFitInput, names: readonly string[]): void {
  ensure(input.bands.length > 0, 'bands: expected at least one band to fit');
  ensure(input.free.length > 0, 'free parameters: expected at least one');
  for (const f of input.free) {
    ensure(names.includes(f), `free parameter "${f}": expected one of ${names.join(', ')}`);
  }
  for (const b of input.bands) {
    ensure(Number.isFinite(b.energy) && b.energy > 0, `band ${b.energy}: expected a positive energy in cm⁻¹`);
    ensure(
      b.sigma === undefined || (Number.isFinite(b.sigma) && b.sigma > 0),
      `band uncertainty ${b.sigma}: expected a positive number of cm⁻¹`,
    );
  }
}

/**
 * Fits the free parameters of a distorted complex to its bands.
 * @throws InputError for no bands, an unknown free parameter, a band label that names no level,
 * or bad starting values.
 */
export function fitDistorted(input: DistortedFitInput): DistortedFitResult {
  const { n, bands } = input;
  const spec = idealised(input.field);
  const names = [...fitParameterNames(spec), 'B', 'C'];
  checkFitInput(input, names);
  const group = groupOf(spec);
  const symmetry = symmetryContext(n, group);
  const ratio = input.B > 0 ? input.C / input.B : 0;
  const start: Record<string, number> = { ...fieldValues(spec), B: input.B, C: input.C };
  const free = [...input.free];
  const valuesOf = (p: readonly number[]): Record<string, number> => {
    const v = { ...start };
    free.forEach((name, j) => {
      v[name] = p[j] ?? 0;
    });
    if (!free.includes('C')) v.C = ratio * (v.B ?? 0);
    return v;
  };
  const solve = (v: Readonly<Record<string, number>>) =>
    solveField(
      { n, field: symmetrised(fieldOf(withValues(spec, v)), group), B: v.B ?? 0, C: v.C ?? 0 },
      { symmetry },
    );
  const first = solve(start);
  const warnings: DistortedFitWarning[] = [];
  const assigned = assignLevels(first, bands, warnings);
  const groundLabel = first.ground.label;
  const sigmas = bands.map((b) => b.sigma ?? 1);
  const model = (r: FieldResult) => {
    const byLabel = new Map(r.levels.map((l) => [l.label, l.energy]));
    const ground = byLabel.get(groundLabel) ?? 0;
    return assigned.map((label) => (byLabel.get(label) ?? Number.NaN) - ground);
  };
  const residuals = (p: readonly number[]) => {
    const calc = model(solve(valuesOf(p)));
    return calc.map((c, i) => (c - (bands[i]?.energy ?? 0)) / (sigmas[i] ?? 1));
  };
  const lower = free.map((name) => (name === 'B' || name === 'C' ? 0 : Number.NEGATIVE_INFINITY));
  const lm = levenbergMarquardt({ residuals, start: free.map((f) => start[f] ?? 0), lower });
  const best = valuesOf(lm.parameters);
  const levels = solve(best);
  const calculated = model(levels);
  if (levels.ground.label !== groundLabel) {
    warnings.push({
      code: 'ground-changed',
      message: `the ground level is ${levels.ground.label} at the fitted values, not ${groundLabel} as at the start: the bands are measured from ${groundLabel}`,
    });
  }
  warnings.push(...determinacyWarnings(free, bands.length, lm.jacobian));
  const errors = standardErrorsOf(free, lm.jacobian, lm.sumOfSquares, bands);
  const rms = Math.sqrt(
    calculated.reduce((s, c, i) => s + (c - (bands[i]?.energy ?? 0)) ** 2, 0) / bands.length,
  );
  return {
    parameters: best,
    errors,
    free,
    field: withValues(spec, best),
    B: best.B ?? 0,
    C: best.C ?? 0,
    bands: bands.map((b, i) => ({
      level: assigned[i] ?? '?',
      observed: b.energy,
      calculated: calculated[i] ?? Number.NaN,
    })),
    rms,
    group: group.name,
    levels,
    converged: lm.converged,
    reason: lm.reason,
    warnings,
  };
}

/** Each band's level label: as given, or by order among the excited levels of the ground spin. */
function assignLevels(
  first: FieldResult,
  bands: readonly DistortedBand[],
  warnings: DistortedFitWarning[],
): string[] {
  const labels = new Set(first.levels.map((l) => l.label));
  const allowed = first.levels.filter((l) => l.spinAllowed && l !== first.ground).map((l) => l.label);
  const unassigned = bands
    .map((b, i) => ({ b, i }))
    .filter((x) => x.b.level === undefined)
    .sort((a, c) => a.b.energy - c.b.energy);
  const taken = new Set(bands.flatMap((b) => (b.level ? [b.level] : [])));
  const free = allowed.filter((l) => !taken.has(l));
  const out = bands.map((b) => b.level ?? '');
  unassigned.forEach((x, k) => {
    out[x.i] = free[k] ?? '';
  });
  out.forEach((label, i) => {
    ensure(
      labels.has(label),
      `band ${bands[i]?.energy} cm⁻¹ assigned to "${label}": expected a level of ${first.group ?? 'the field'} (${[...labels].slice(0, 12).join(', ')}, …)`,
    );
  });
  if (unassigned.length > 0) {
    warnings.push({
      code: 'assigned-by-order',
      message: `${unassigned.length} band(s) assigned by order to the lowest excited levels of the ground spin at the starting values (${unassigned.map((x) => out[x.i]).join(', ')}): check the assignment against polarisation or band shape`,
    });
  }
  return out;
}

/** Warnings when the bands cannot fix the free parameters. */
function determinacyWarnings(
  free: readonly string[],
  m: number,
  jacobian: readonly (readonly number[])[],
): DistortedFitWarning[] {
  const p = free.length;
  if (p > m) {
    return [
      {
        code: 'underdetermined',
        message: `${p} free parameters (${free.join(', ')}) from ${m} band(s): the bands cannot fix them all; fix ${p - m} of them or add bands`,
      },
    ];
  }
  const out: DistortedFitWarning[] = [];
  if (p === m) {
    out.push({
      code: 'exact',
      message: `${p} free parameters from ${m} bands: the fit is exact and the bands leave no scatter to estimate errors from`,
    });
  }
  const svd = new SingularValueDecomposition(new Matrix(jacobian.map((r) => [...r])), {
    autoTranspose: true,
  });
  const s = svd.diagonal;
  const smax = Math.max(...s);
  s.forEach((x, k) => {
    if (smax > 0 && x < UNDETERMINED_RCOND * smax) {
      const v = svd.rightSingularVectors;
      const combo = free
        .map((name, j) => ({ name, c: v.get(j, k) }))
        .filter((t) => Math.abs(t.c) > 0.05)
        .map((t) => `${t.c.toFixed(2)}·${t.name}`)
        .join(' + ');
      out.push({
        code: 'undetermined-combination',
        message: `the bands do not depend on ${combo}: that combination is not determined; fix one of its parameters`,
      });
    }
  });
  return out;
}

/** Standard errors from the weighted Jacobian: (JᵀJ)⁻¹, scaled by χ²/(m − p) when the bands carry no σ. */
function standardErrorsOf(
  free: readonly string[],
  jacobian: readonly (readonly number[])[],
  chiSquare: number,
  bands: readonly DistortedBand[],
): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  const m = bands.length;
  const p = free.length;
  const given = bands.every((b) => b.sigma !== undefined);
  const inv = p <= m ? inverseNormalMatrix(jacobian) : null;
  const scale = given ? 1 : m > p ? chiSquare / (m - p) : Number.NaN;
  free.forEach((name, j) => {
    const v = inv?.[j]?.[j];
    out[name] = v !== undefined && Number.isFinite(scale) ? Math.sqrt(v * scale) : null;
  });
  return out;
}
