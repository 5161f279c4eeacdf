/**
 * The JSON form of a spin-crossover analysis — its crossings, and a sample's verdict — shared by
 * the crossover command and the report.
 */

import type { CrossoverAnalysis, SampleVerdict } from '../../src/analysis/crossover.js';

/** JSON form of the crossings of an analysis. */
export function crossingsJson(analysis: CrossoverAnalysis) {
  return analysis.crossings.map((c) => ({
    dq: c.dq,
    tenDq: c.tenDq,
    deltaOverB: c.deltaOverB,
    from: c.from,
    to: c.to,
    fromSymbol: c.fromSymbol,
    toSymbol: c.toSymbol,
    fromS: c.fromS,
    toS: c.toS,
  }));
}

/** JSON form of a sample's verdict (missing values as null). */
export function verdictJson(verdict: SampleVerdict) {
  return {
    dq: verdict.dq,
    tenDq: verdict.tenDq,
    deltaOverB: verdict.deltaOverB,
    ground: verdict.ground,
    groundSymbol: verdict.groundSymbol,
    S: verdict.S,
    side: verdict.side,
    margin: verdict.margin ?? null,
    sigma: verdict.sigma ?? null,
    sigmas: verdict.sigmas ?? null,
    settled: verdict.settled ?? null,
    near: verdict.near ?? null,
    other: verdict.other ?? null,
    gap: verdict.gap ?? null,
  };
}
