/**
 * The correlation diagram drawn for a fitted sample: curves at the fit's C/B, wide enough to hold
 * the sample, with the sample and its observed bands on them. Used by the fit command and the report.
 */

import { renderDiagram } from '../../charts/diagram.js';
import type { FigureFormat, FigureOptions } from '../../charts/figureFormat.js';
import { DEFAULT_MAX_DELTA_OVER_B, sweepDiagram } from '../../src/analysis/sweep.js';
import { InputError } from '../../src/core/errors.js';
import type { FitResult, FitSolution } from '../../src/fit/fitTypes.js';

/**
 * The correlation diagram at the best solution's C/B, wide enough to hold the sample, with the
 * sample at its fitted Δ/B and its observed bands as points.
 */
export function fittedDiagram(
  result: FitResult,
  best: FitSolution,
  format: FigureFormat,
  ion?: string,
  size: Pick<FigureOptions, 'size' | 'dpi'> = {},
): Buffer {
  if (best.deltaOverB === null || best.cOverB === null) {
    throw new InputError(`--diagram: a diagram in units of B needs d2 to d8; d${result.n} has no Racah B`);
  }
  const maxDeltaOverB = Math.max(DEFAULT_MAX_DELTA_OVER_B, Math.ceil((1.25 * best.deltaOverB) / 10) * 10);
  const diagram = sweepDiagram(result.n, { geometry: result.geometry, cOverB: best.cOverB, maxDeltaOverB });
  return renderDiagram(
    diagram,
    { format, ...size },
    {
      sample: { dq: best.dq, B: best.B, bands: result.bands.map((b) => b.energy), label: 'fitted sample' },
      ...(ion ? { ion } : {}),
    },
  );
}
