import { type FieldParameters, solveAt, type Transitions } from '../analysis/bandModel.js';
import type { CubicResult } from '../field/cubic.js';
import type { Geometry } from '../field/labels.js';
import type { ParameterName } from './fitErrors.js';
import { singleTerm } from './ratioScan.js';

/**
 * The band model as the least squares sees it: the free parameters of a fit, the field they
 * stand for, the Jacobian of the band energies, and a small cache of solver calls.
 */

/**
 * Relative forward-difference step for ∂E/∂C: truncation (~h) and rounding (eigenvalues good to
 * ~1e-12 relative, divided by h) both stay near 1e-6 of the derivative or below.
 */
const C_STEP = 1e-5;

/** The free parameters: Dq alone for d¹/d⁹ or with B held, else Dq and B, and C too with `fitC`. */
export function parameterSet(n: number, fixedB: number | undefined, fitC: boolean): ParameterName[] {
  return singleTerm(n) || fixedB !== undefined ? ['dq'] : fitC ? ['dq', 'B', 'C'] : ['dq', 'B'];
}

/** The field of a parameter vector: C at C/B × B unless free; B held at `fixedB` when given. */
export function fieldOf(
  names: readonly ParameterName[],
  p: readonly number[],
  cOverB: number,
  fixedB?: number,
): FieldParameters {
  const dq = p[0] ?? 0;
  if (names.length === 1)
    return fixedB === undefined ? { dq, B: 0, C: 0 } : { dq, B: fixedB, C: cOverB * fixedB };
  const B = p[1] ?? 0;
  return { dq, B, C: names.length === 3 ? (p[2] ?? 0) : cOverB * B };
}

/** The parameter vector of a field, in the order of `names`. */
export function vectorOf(names: readonly ParameterName[], f: FieldParameters): number[] {
  return names.map((name) => (name === 'dq' ? f.dq : name === 'B' ? f.B : f.C));
}

/**
 * The Jacobian ∂E/∂p of the band energies: ∂E/∂Dq exactly from the Hellmann–Feynman slopes
 * ({@link fieldSlope}); ∂E/∂C (when C is free) by a forward difference; and ∂E/∂B from Euler's
 * relation for functions homogeneous of degree one, Dq·∂E/∂Dq + B·∂E/∂B + C·∂E/∂C = E (with C
 * held at C/B the C term is part of the B derivative, and Dq·∂E/∂Dq + B·dE/dB = E). So at fixed
 * C/B the Jacobian costs no solver call beyond the energies themselves.
 */
export function energyJacobian(
  names: readonly ParameterName[],
  p: readonly number[],
  at: Transitions,
  model: (p: readonly number[]) => Transitions,
): number[][] {
  const dq = p[0] ?? 0;
  const B = p[1] ?? 1;
  const C = p[2] ?? 0;
  let dC: number[] | undefined;
  if (names.length === 3) {
    const h = C_STEP * Math.max(C, 1);
    const plus = model([dq, B, C + h]).energies;
    dC = plus.map((e, i) => (e - (at.energies[i] ?? 0)) / h);
  }
  return at.energies.map((e, i) => {
    const dDq = at.slopes[i] ?? 0;
    if (names.length === 1) return [dDq];
    const dCi = dC?.[i] ?? 0;
    const dB = (e - dq * dDq - C * dCi) / B;
    return dC ? [dDq, dB, dCi] : [dDq, dB];
  });
}

/** Solver calls of one refinement, kept by parameter values (the Jacobian reuses the residuals' call). */
export function cachedSolver(n: number, geometry: Geometry): (f: FieldParameters) => CubicResult {
  const cache = new Map<string, CubicResult>();
  return (f) => {
    const key = `${f.dq},${f.B},${f.C}`;
    let result = cache.get(key);
    if (!result) {
      result = solveAt(n, geometry, f);
      if (cache.size >= 8) cache.delete(cache.keys().next().value ?? '');
      cache.set(key, result);
    }
    return result;
  };
}
