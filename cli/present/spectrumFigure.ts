/**
 * The overlay figure of an analysed spectrum — measured data, the Gaussian bands, their sum, the
 * baseline and the marked transitions — shared by the spectrum command and the report.
 */

import type { FigureFormat, FigureOptions } from '../../charts/figureFormat.js';
import { renderSpectrumFigure } from '../../charts/spectrum.js';
import type { SpectrumAnalysis } from '../../src/spectra/spectrumAnalysis.js';

/** The overlay figure of an analysed spectrum, as file bytes. */
export function spectrumFigure(
  report: SpectrumAnalysis,
  title: string,
  format: FigureFormat,
  size: Pick<FigureOptions, 'size' | 'dpi'> = {},
): Buffer {
  const { spectrum, analysis } = report;
  return renderSpectrumFigure(
    {
      measured: { x: spectrum.wavenumber, y: spectrum.value },
      quantity: analysis.quantity,
      window: analysis.window,
      bands: analysis.bands,
      baseline: analysis.baseline,
      transitions: report.transitions,
    },
    { format, title, ...size },
  );
}
