import { describe, expect, it } from 'vitest';
import { covariance, fitCurve } from '../../src/numeric/leastSquares.js';
import { normalRandom, uniformRandom } from '../../src/numeric/seededRandom.js';
import {
  bandSum,
  GAUSSIAN_AREA_FACTOR,
  gaussianArea,
  gaussianValue,
  syntheticSpectrum,
} from '../../src/spectra/gaussianBands.js';

describe('gaussianValue and gaussianArea', () => {
  const band = { center: 20000, height: 2, fwhm: 3000 };

  it('falls to half height half a FWHM either side of the maximum', () => {
    expect(gaussianValue(band, 20000)).toBe(2);
    expect(gaussianValue(band, 18500)).toBeCloseTo(1, 12);
    expect(gaussianValue(band, 21500)).toBeCloseTo(1, 12);
  });

  it('has the area h·w·√(π/(4 ln 2)) of the numerical integral', () => {
    let sum = 0;
    const dx = 1;
    for (let x = 0; x <= 40000; x += dx) sum += gaussianValue(band, x) * dx;
    expect(gaussianArea(band)).toBeCloseTo(sum, 6);
    expect(GAUSSIAN_AREA_FACTOR).toBeCloseTo(1.0644670194312262, 15);
  });

  it('adds bands and a baseline point by point', () => {
    const b2 = { center: 25000, height: 1, fwhm: 2000 };
    const base = { offset: 0.1, slope: 1e-5, reference: 20000 };
    const [v] = bandSum([band, b2], [21000], base);
    expect(v).toBeCloseTo(gaussianValue(band, 21000) + gaussianValue(b2, 21000) + 0.1 + 0.01, 12);
  });
});

describe('seeded random numbers', () => {
  it('repeat for a seed and differ between seeds', () => {
    const a = uniformRandom(5);
    const b = uniformRandom(5);
    const c = uniformRandom(6);
    const sa = [a(), a(), a()];
    expect([b(), b(), b()]).toEqual(sa);
    expect(c()).not.toBe(sa[0]);
  });

  it('give normal deviates with mean 0 and variance 1 within sampling error', () => {
    const n = 20000;
    const normal = normalRandom(42);
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const v = normal();
      s += v;
      s2 += v * v;
    }
    // Standard errors: of the mean 1/√n ≈ 0.007, of the variance √(2/n) ≈ 0.01.
    expect(Math.abs(s / n)).toBeLessThan(0.03);
    expect(Math.abs(s2 / n - 1)).toBeLessThan(0.04);
  });

  it('add reproducible noise to a synthetic spectrum', () => {
    const x = [1, 2, 3];
    const bands = [{ center: 2, height: 1, fwhm: 1 }];
    expect(Array.from(syntheticSpectrum(bands, x, { noise: 0.1, seed: 3 }))).toEqual(
      Array.from(syntheticSpectrum(bands, x, { noise: 0.1, seed: 3 })),
    );
    expect(Array.from(syntheticSpectrum(bands, x))).toEqual(Array.from(bandSum(bands, x)));
  });
});

describe('fitCurve', () => {
  it('recovers the parameters of a noise-free Gaussian from a poor start', () => {
    const x = Array.from({ length: 101 }, (_, i) => i / 10);
    const truth = { center: 4.2, height: 1.5, fwhm: 2.5 };
    const y = x.map((v) => gaussianValue(truth, v));
    const model = (p: Float64Array, v: number, g: Float64Array) => {
      const band = { center: p[0] as number, height: p[1] as number, fwhm: p[2] as number };
      const e = gaussianValue({ ...band, height: 1 }, v);
      const d = v - band.center;
      const k = 8 * Math.LN2;
      g[0] = (band.height * e * k * d) / band.fwhm ** 2;
      g[1] = e;
      g[2] = (band.height * e * k * d * d) / band.fwhm ** 3;
      return band.height * e;
    };
    const fit = fitCurve(x, y, model, [5, 1, 1.5]);
    expect(fit.p[0]).toBeCloseTo(4.2, 8);
    expect(fit.p[1]).toBeCloseTo(1.5, 8);
    expect(fit.p[2]).toBeCloseTo(2.5, 8);
    expect(fit.chi2).toBeLessThan(1e-16);
  });

  it('gives the closed-form slope variance of a straight line, s² / Σ(x − x̄)² (Press et al., Numerical Recipes, 3rd ed., 2007, §15.2)', () => {
    const x = [0, 1, 2, 3, 4, 5, 6, 7];
    const noise = normalRandom(9);
    const y = x.map((v) => 1 + 0.5 * v + 0.1 * noise());
    const fit = fitCurve(
      x,
      y,
      (p, v, g) => {
        g[0] = 1;
        g[1] = v;
        return (p[0] as number) + (p[1] as number) * v;
      },
      [0, 0],
    );
    const mean = x.reduce((a, b) => a + b, 0) / x.length;
    const sxx = x.reduce((a, v) => a + (v - mean) ** 2, 0);
    const s2 = fit.chi2 / (x.length - 2);
    const cov = covariance(fit.curvature, 2, s2);
    expect(cov?.[3]).toBeCloseTo(s2 / sxx, 12);
    expect(cov?.[0]).toBeCloseTo(s2 * (1 / x.length + (mean * mean) / sxx), 12);
  });

  it('keeps parameters inside their bounds', () => {
    const fit = fitCurve(
      [0, 1, 2],
      [5, 5, 5],
      (p, _v, g) => {
        g[0] = 1;
        return p[0] as number;
      },
      [0],
      { max: [3] },
    );
    expect(fit.p[0]).toBe(3);
  });
});
