import { describe, expect, it } from 'vitest';
import { renderSpectrumFigure, spectrumChart } from '../../charts/spectrum.js';
import { quantityTitle } from '../../charts/style.js';
import { findBands } from '../../src/index.js';
import { syntheticSpectrum } from '../../src/spectra/gaussianBands.js';

const x = Float64Array.from({ length: 6001 }, (_, i) => 10000 + i * 3);
const bands = [
  { center: 15000, height: 0.5, fwhm: 2500 },
  { center: 22000, height: 0.4, fwhm: 3000 },
];
const y = syntheticSpectrum(bands, x, { noise: 0.002, seed: 5 });
const analysis = findBands({ wavenumber: x, value: y, quantity: 'absorbance' });
const input = {
  measured: { x, y },
  quantity: analysis.quantity,
  window: analysis.window,
  bands: analysis.bands,
  baseline: analysis.baseline,
  transitions: [
    { label: '4T2g', energy: 15100, spinAllowed: true },
    { label: '2Eg(G)', energy: 14000, spinAllowed: false },
    { label: '4T1g(P)', energy: 40000, spinAllowed: true },
  ],
};

describe('spectrumChart', () => {
  it('draws the data (reduced to about 4000 points) as a filled silhouette, the fit, each band and the baseline', () => {
    const config = spectrumChart(input);
    const labels = config.data.datasets.map((d) => d.label);
    expect(labels).toEqual([
      'measured',
      'fit: bands + baseline',
      'Gaussian bands',
      'Gaussian bands',
      'baseline',
    ]);
    expect((config.data.datasets[0] as { fill?: unknown }).fill).toBe('origin');
    // xyReduce keeps both end points besides the 4000 it is asked for.
    expect(config.data.datasets[0]?.data.length).toBeLessThanOrEqual(4001);
  });

  it('puts a wavelength axis on top over the same wavenumber range', () => {
    const scales = spectrumChart(input).options?.scales as Record<
      string,
      { min?: number; max?: number; position?: string }
    >;
    expect(scales.xTop?.position).toBe('top');
    expect(scales.xTop?.min).toBe(scales.x?.min);
    expect(scales.xTop?.max).toBe(scales.x?.max);
  });

  it('names the y quantity with its unit', () => {
    expect(quantityTitle('epsilon')).toBe('ε / L mol⁻¹ cm⁻¹');
    expect(quantityTitle('absorbance')).toBe('Absorbance');
  });
});

describe('renderSpectrumFigure', () => {
  it('writes valid PNG, SVG and PDF files', () => {
    const png = renderSpectrumFigure(input, { format: 'png', pngScale: 1 });
    expect(png.subarray(1, 4).toString()).toBe('PNG');
    const svg = renderSpectrumFigure(input, { format: 'svg' }).toString('utf8');
    expect(svg).toContain('<svg');
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    const pdf = renderSpectrumFigure(input, { format: 'pdf' });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.subarray(-8).toString()).toContain('%%EOF');
  });
});
