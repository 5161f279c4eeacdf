import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  DEMO_SPECTRA,
  type DemoSpectrum,
  demoBands,
  demoSpectrumText,
  GENERATED_SPECTRA,
} from '../../fixtures/spectra/generate.js';
import {
  absorptionSpectrum,
  type BandAnalysis,
  type FoundBand,
  findBands,
  findIon,
  freeIonRatio,
  parseJcampSpectrum,
  parseSpectrumText,
  solveCubic,
} from '../../src/index.js';
import {
  bandObservations,
  ligandFieldBands,
  POSITION_WIDTH_FRACTION,
} from '../../src/spectra/bandObservations.js';
import { type GaussianBand, syntheticSpectrum } from '../../src/spectra/gaussianBands.js';
import { isJcamp } from '../../src/spectra/spectrumJcamp.js';

/**
 * Tolerance of a recovered band position: four of the fit's own standard uncertainties (the
 * noise moves a centre by about one; four leaves room for testing many bands at once), but at
 * least 1 % of the FWHM for what the noise estimate does not see (the grid, overlapping wings
 * of neighbours). Both are far below the 5 % of FWHM that the ligand-field fit is told.
 */
function positionTolerance(found: FoundBand, fwhm: number): number {
  return Math.max(4 * found.centerSigma, 0.01 * fwhm);
}

function nearest(analysis: BandAnalysis, center: number): FoundBand {
  return analysis.bands.reduce((best, b) =>
    Math.abs(b.center - center) < Math.abs(best.center - center) ? b : best,
  );
}

function expectRecovered(analysis: BandAnalysis, truth: GaussianBand): FoundBand {
  const found = nearest(analysis, truth.center);
  expect(Math.abs(found.center - truth.center)).toBeLessThanOrEqual(positionTolerance(found, truth.fwhm));
  expect(found.fwhm).toBeGreaterThan(0.9 * truth.fwhm);
  expect(found.fwhm).toBeLessThan(1.1 * truth.fwhm);
  return found;
}

function nmGrid(from: number, to: number, step = 1): Float64Array {
  const xs: number[] = [];
  for (let nm = to; nm >= from; nm -= step) xs.push(1e7 / nm);
  return Float64Array.from(xs);
}

function readDemo(file: string) {
  const text = readFileSync(resolve(__dirname, '../../fixtures/spectra', file), 'utf8');
  return absorptionSpectrum(isJcamp(text) ? parseJcampSpectrum(text) : parseSpectrumText(text));
}

describe('the demo spectra (invented data)', () => {
  it('are what the generator makes from the invented parameters, and say they are invented', () => {
    for (const demo of GENERATED_SPECTRA) {
      const text = readFileSync(resolve(__dirname, '../../fixtures/spectra', demo.file), 'utf8');
      expect(text).toBe(demoSpectrumText(demo));
      expect(text).toContain('INVENTED');
    }
  });

  it.each(DEMO_SPECTRA.map((d) => [d.file, d] as const))(
    'findBands recovers the generated bands of %s and sets the edges apart',
    (file, demo) => {
      const spectrum = readDemo(file);
      const analysis = findBands(spectrum);
      const { from, to } = analysis.window;
      const truth = demoBands(demo);
      for (const band of truth) {
        if (band.center > from && band.center < to) {
          const found = expectRecovered(analysis, band);
          expect(found.chargeTransfer).toBe(band.role === 'charge-transfer');
        } else {
          // A band whose maximum lies outside the window is found as an edge beyond that end.
          const found = nearest(analysis, band.center);
          expect(found.flags).toContain(band.center > to ? 'blue-edge' : 'red-edge');
          expect(band.center > to ? found.center >= to : found.center <= from).toBe(true);
        }
      }
      const lf = ligandFieldBands(analysis.bands);
      expect(lf.length).toBe(
        truth.filter((b) => b.role !== 'charge-transfer' && b.center > from && b.center < to).length,
      );
      expect(analysis.residualRms / analysis.noise).toBeLessThan(1.3);
    },
  );

  it('flags the narrow spin-forbidden bands of [Cr(mz)6]3+ and gives ε ranges and oscillator strengths', () => {
    const spectrum = absorptionSpectrum(
      parseSpectrumText(demoSpectrumText(DEMO_SPECTRA[0] as DemoSpectrum)),
      {
        concentration: 0.02,
        pathLength: 1,
      },
    );
    const analysis = findBands(spectrum);
    const narrow = analysis.bands.filter((b) => b.flags.includes('narrow'));
    expect(narrow.map((b) => Math.round(b.center / 100))).toEqual([140, 146]);
    expect(narrow.every((b) => b.intensityRange === 'spin-forbidden')).toBe(true);
    const allowed = nearest(analysis, 19600);
    expect(allowed.intensityRange).toBe('centrosymmetric d–d');
    expect(allowed.height).toBeCloseTo(30, 0);
    expect(allowed.oscillatorStrength).toBeCloseTo(4.32e-9 * allowed.area, 15);
  });
});

describe('findBands on textbook spectra entered as Gaussian bands', () => {
  it('finds the two visible bands of [Cr(H2O)6]3+ and the solver puts 4T2g and 4T1g(F) on them', () => {
    // Band maxima 17 400 and 24 600 cm⁻¹, ε ≈ 13 and 15 L mol⁻¹ cm⁻¹, and Dq = 1740, B = 725 cm⁻¹
    // (Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984; from memory). Widths of
    // 3000–3500 cm⁻¹ are typical of such bands (common practice, no source).
    const bands = [
      { center: 17400, height: 13, fwhm: 3000 },
      { center: 24600, height: 15, fwhm: 3500 },
    ];
    const x = nmGrid(300, 800);
    const y = syntheticSpectrum(bands, x, { noise: 0.08, seed: 21 });
    const analysis = findBands({ wavenumber: x, value: y, quantity: 'epsilon' });
    for (const b of bands) expectRecovered(analysis, b);
    const obs = bandObservations(analysis.bands);
    expect(obs.length).toBe(2);
    const cr = findIon('Cr3+');
    const levels = solveCubic({
      n: 3,
      geometry: 'oct',
      dq: 1740,
      B: 725,
      C: 725 * (freeIonRatio(cr) ?? 0),
    }).levels;
    const e = (label: string) => levels.find((l) => l.label === label)?.energy ?? Number.NaN;
    // Band maxima and the model's vertical energies agree to about 1 % for this textbook case.
    expect(Math.abs(e('4T2g') - (obs[0]?.energy ?? 0))).toBeLessThan(0.01 * 17400);
    expect(Math.abs(e('4T1g(F)') - (obs[1]?.energy ?? 0))).toBeLessThan(0.01 * 24600);
  });

  it('finds the bands of [Ni(H2O)6]2+, the near-infrared one by the red end and the 1Eg shoulder', () => {
    // Band maxima 8500, 13 800 and 25 300 cm⁻¹, with the shoulder near 15 400 cm⁻¹ that ¹E_g
    // gives the middle band (Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984; from memory);
    // ε of a few L mol⁻¹ cm⁻¹, widths typical (common practice, no source).
    const bands = [
      { center: 8500, height: 2, fwhm: 2800 },
      { center: 13800, height: 2, fwhm: 2800 },
      { center: 15400, height: 0.8, fwhm: 1500 },
      { center: 25300, height: 5, fwhm: 3000 },
    ];
    const x = nmGrid(300, 1300);
    const y = syntheticSpectrum(bands, x, {
      noise: 0.02,
      seed: 22,
      baseline: { offset: 0.1, slope: 0, reference: 0 },
    });
    const analysis = findBands({ wavenumber: x, value: y, quantity: 'epsilon' });
    for (const b of bands) expectRecovered(analysis, b);
    expect(ligandFieldBands(analysis.bands).length).toBe(4);
  });
});

describe('findBands behaviour', () => {
  const bands = [
    { center: 15000, height: 0.4, fwhm: 2500 },
    { center: 21000, height: 0.3, fwhm: 3000 },
  ];

  it('finds the same bands on a wavelength grid as on a wavenumber grid (absorbance needs no Jacobian)', () => {
    const fromNm = nmGrid(350, 1000);
    const fromCm = Float64Array.from({ length: 1901 }, (_, i) => 10000 + i * 10);
    const a = findBands({
      wavenumber: fromNm,
      value: syntheticSpectrum(bands, fromNm),
      quantity: 'absorbance',
    });
    const b = findBands({
      wavenumber: fromCm,
      value: syntheticSpectrum(bands, fromCm),
      quantity: 'absorbance',
    });
    for (const truth of bands) {
      expect(nearest(a, truth.center).center).toBeCloseTo(truth.center, 3);
      expect(nearest(b, truth.center).center).toBeCloseTo(truth.center, 3);
      expect(nearest(a, truth.center).area).toBeCloseTo(nearest(b, truth.center).area, 3);
    }
  });

  it('limits the window to the range, and reports a range cut to the data', () => {
    const x = Float64Array.from({ length: 2001 }, (_, i) => 10000 + i * 10);
    const y = syntheticSpectrum(bands, x, { noise: 0.001, seed: 2 });
    const only = findBands(
      { wavenumber: x, value: y, quantity: 'absorbance' },
      { range: { from: 10000, to: 18000 } },
    );
    expect(only.window).toEqual({ from: 10000, to: 18000 });
    expect(only.clipped).toBe(false);
    expect(ligandFieldBands(only.bands).map((b) => Math.round(b.center / 100))).toEqual([150]);
    const cut = findBands(
      { wavenumber: x, value: y, quantity: 'absorbance' },
      { range: { from: 5000, to: 40000 } },
    );
    expect(cut.clipped).toBe(true);
    expect(cut.window).toEqual({ from: 10000, to: 30000 });
  });

  it('flags a band above 30 000 cm⁻¹ and an intense one as charge transfer, and keeps them out of the fit input unless asked', () => {
    const x = Float64Array.from({ length: 2501 }, (_, i) => 10000 + i * 10);
    const withCt = [...bands, { center: 31000, height: 1200, fwhm: 3000 }].map((b, i) =>
      i < 2 ? { ...b, height: b.height * 100 } : b,
    );
    const analysis = findBands({ wavenumber: x, value: syntheticSpectrum(withCt, x), quantity: 'epsilon' });
    const ct = nearest(analysis, 31000);
    expect(ct.flags).toEqual(expect.arrayContaining(['intense', 'high-energy']));
    expect(ct.intensityRange).toBe('charge transfer');
    expect(ligandFieldBands(analysis.bands).length).toBe(2);
    expect(ligandFieldBands(analysis.bands, { includeChargeTransfer: true }).length).toBe(3);
  });

  it('turns bands into fit observations with σ = fit ⊕ 5 % of FWHM', () => {
    const x = Float64Array.from({ length: 2001 }, (_, i) => 10000 + i * 10);
    const analysis = findBands({
      wavenumber: x,
      value: syntheticSpectrum(bands, x, { noise: 0.002, seed: 4 }),
      quantity: 'absorbance',
    });
    const obs = bandObservations(analysis.bands);
    analysis.bands.forEach((b, i) => {
      expect(obs[i]?.energy).toBe(b.center);
      expect(obs[i]?.sigma).toBeCloseTo(Math.hypot(b.centerSigma, POSITION_WIDTH_FRACTION * b.fwhm), 9);
    });
    expect(bandObservations(analysis.bands, { widthFraction: 0 })[0]?.sigma).toBeCloseTo(
      analysis.bands[0]?.centerSigma ?? 0,
      12,
    );
  });

  it('fits no baseline when asked, and a constant one', () => {
    const x = Float64Array.from({ length: 2001 }, (_, i) => 10000 + i * 10);
    const y = syntheticSpectrum(bands, x, { baseline: { offset: 0.05, slope: 0, reference: 0 } });
    const constant = findBands({ wavenumber: x, value: y, quantity: 'absorbance' }, { baseline: 'constant' });
    expect(constant.baseline.offset).toBeCloseTo(0.05, 6);
    expect(constant.baseline.slope).toBe(0);
    const none = findBands(
      { wavenumber: x, value: syntheticSpectrum(bands, x), quantity: 'absorbance' },
      { baseline: 'none' },
    );
    expect(none.baseline.offset).toBe(0);
    expect(ligandFieldBands(none.bands).length).toBe(2);
  });

  it('finds nothing in pure noise', () => {
    const x = Float64Array.from({ length: 1001 }, (_, i) => 10000 + i * 10);
    const analysis = findBands({
      wavenumber: x,
      value: syntheticSpectrum([], x, { noise: 0.01, seed: 8 }),
      quantity: 'absorbance',
    });
    expect(analysis.bands).toEqual([]);
  });
});

describe('findBands bad input', () => {
  const x = Float64Array.from({ length: 101 }, (_, i) => 10000 + i * 100);
  const spectrum = {
    wavenumber: x,
    value: syntheticSpectrum([{ center: 15000, height: 1, fwhm: 2000 }], x),
    quantity: 'absorbance' as const,
  };

  it('refuses a range outside the data', () => {
    expect(() => findBands(spectrum, { range: { from: 30000, to: 40000 } })).toThrow(
      'range 30000–40000 cm⁻¹ lies outside the data (10000–20000 cm⁻¹)',
    );
  });

  it('refuses a window with too few points and an empty range', () => {
    expect(() => findBands(spectrum, { range: { from: 10000, to: 11000 } })).toThrow(/only 11 data points/);
    expect(() => findBands(spectrum, { range: { from: 15000, to: 15000 } })).toThrow(
      /lower and a higher end/,
    );
  });

  it('refuses bad options', () => {
    expect(() => findBands(spectrum, { minFwhm: 0 })).toThrow(/minimum FWHM/);
    expect(() => findBands(spectrum, { maxBands: 0 })).toThrow(/maximum number of bands/);
    expect(() => findBands(spectrum, { minRelativeHeight: 1 })).toThrow(/relative height/);
  });
});
