/**
 * What the page shows for one set of parameters, worked out by the library itself (no second
 * implementation): the correlation diagram at the current C/B (solved again only when n, the
 * geometry, C/B or the Δ/B range change — E/B does not depend on Dq or B), the levels at the
 * current Dq, B and C, and the spin–orbit levels when ζ > 0. Plain data, no DOM.
 */

import { type CorrelationDiagram, DEFAULT_MAX_DELTA_OVER_B, sweepDiagram } from '../src/analysis/sweep.js';
import { type CubicResult, solveCubic } from '../src/field/cubic.js';
import { type SpinOrbitResult, solveSpinOrbit } from '../src/field/spinOrbitSolver.js';
import type { ExplorerParams } from './data.js';

/** Points of the diagram's Δ/B grid (the crossings are added exactly). */
export const DIAGRAM_POINTS = 200;

/**
 * Scan points of the diagram's search for spin crossovers: a spacing of Δ/B 0.4 over the default
 * range (the library's diagrams use 240). Two changes of spin closer than that would be missed;
 * each change found is then pinned down exactly.
 */
export const CROSSING_SCAN_POINTS = 100;

/** Steps in which the diagram's Δ/B range grows to keep the current point inside. */
const RANGE_STEP = 10;

/** The page's content for one set of parameters. */
export interface ExplorerView {
  readonly params: ExplorerParams;
  readonly C: number;
  /** Δ/B = 10Dq/B of the current point. */
  readonly deltaOverB: number;
  readonly diagram: CorrelationDiagram;
  readonly levels: CubicResult;
  readonly spinOrbit?: SpinOrbitResult;
}

/** The diagram's Δ/B range: the default, widened in steps to hold the current point with room. */
export function diagramRange(deltaOverB: number): number {
  return Math.max(DEFAULT_MAX_DELTA_OVER_B, Math.ceil((deltaOverB * 1.15) / RANGE_STEP) * RANGE_STEP);
}

/** A view computer that keeps the last diagram and solves it again only when it changes. */
export function viewComputer(): (p: ExplorerParams) => ExplorerView {
  let key = '';
  let diagram: CorrelationDiagram | undefined;
  return (params) => {
    const { n, geometry, dq, B, cOverB, zeta } = params;
    const deltaOverB = B > 0 ? (10 * dq) / B : 0;
    const maxDeltaOverB = diagramRange(deltaOverB);
    const k = `${n}:${geometry}:${cOverB}:${maxDeltaOverB}`;
    if (k !== key || !diagram) {
      diagram = sweepDiagram(n, {
        geometry,
        cOverB,
        maxDeltaOverB,
        points: DIAGRAM_POINTS,
        crossingScanPoints: CROSSING_SCAN_POINTS,
      });
      key = k;
    }
    const C = cOverB * B;
    const levels = solveCubic({ n, geometry, dq, B, C });
    const spinOrbit = zeta > 0 ? solveSpinOrbit({ n, geometry, dq, B, C, zeta }) : undefined;
    return { params, C, deltaOverB, diagram, levels, ...(spinOrbit ? { spinOrbit } : {}) };
  };
}
