import { describe, expect, it } from 'vitest';
import { type CurveModel, covariance, fitCurve, levenbergMarquardt } from '../../src/numeric/leastSquares.js';
import { normalRandom, uniformRandom } from '../../src/numeric/seededRandom.js';
import { bandsModel } from '../../src/spectra/bandDecomposition.js';
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

/** A curve model from a model of one point that returns its value and fills its gradient `g`. */
function pointByPoint(model: (p: Float64Array, v: number, g: Float64Array) => number): CurveModel {
  return (p, x, values, gradients) => {
    const g = new Float64Array(p.length);
    for (let i = 0; i < x.length; i++) {
      values[i] = model(p, x[i] as number, g);
      g.forEach((v, k) => {
        gradients[k * x.length + i] = v;
      });
    }
  };
}

/** A sum of Gaussians (centre, height, FWHM per band) with its gradient, point by point. */
const gaussians = pointByPoint((p, v, g) => {
  let sum = 0;
  for (let j = 0; j < p.length; j += 3) {
    const [c, h, w] = [p[j] as number, p[j + 1] as number, p[j + 2] as number];
    const e = gaussianValue({ center: c, height: 1, fwhm: w }, v);
    const k = 8 * Math.LN2;
    g[j] = (h * e * k * (v - c)) / w ** 2;
    g[j + 1] = e;
    g[j + 2] = (h * e * k * (v - c) ** 2) / w ** 3;
    sum += h * e;
  }
  return sum;
});

describe('fitCurve', () => {
  it('recovers the parameters of a noise-free Gaussian from a poor start', () => {
    const x = Array.from({ length: 101 }, (_, i) => i / 10);
    const truth = { center: 4.2, height: 1.5, fwhm: 2.5 };
    const y = x.map((v) => gaussianValue(truth, v));
    const model = pointByPoint((p: Float64Array, v: number, g: Float64Array) => {
      const band = { center: p[0] as number, height: p[1] as number, fwhm: p[2] as number };
      const e = gaussianValue({ ...band, height: 1 }, v);
      const d = v - band.center;
      const k = 8 * Math.LN2;
      g[0] = (band.height * e * k * d) / band.fwhm ** 2;
      g[1] = e;
      g[2] = (band.height * e * k * d * d) / band.fwhm ** 3;
      return band.height * e;
    });
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
      pointByPoint((p, v, g) => {
        g[0] = 1;
        g[1] = v;
        return (p[0] as number) + (p[1] as number) * v;
      }),
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
      pointByPoint((p, _v, g) => {
        g[0] = 1;
        return p[0] as number;
      }),
      [0],
      { max: [3] },
    );
    expect(fit.p[0]).toBe(3);
  });

  it('fitCurve takes the same steps as levenbergMarquardt on the rows of its Jacobian, to the last bit', () => {
    // Two overlapping bands in noise, one width pushed against its bound: the flat Jacobian and
    // the column-wise normal equations of fitCurve against the obvious row-wise path.
    const x = Array.from({ length: 240 }, (_, i) => 10 + i / 12);
    const noise = normalRandom(4);
    const truth = [17, 1, 3.2, 21, 0.6, 4];
    const model = gaussians;
    const clean = new Float64Array(x.length);
    model(Float64Array.from(truth), x, clean, new Float64Array(x.length * truth.length));
    const y = Array.from(clean, (v) => v + 0.01 * noise());
    const start = [16, 0.8, 2, 22, 0.5, 3];
    const min = [10, 0, 0.5, 10, 0, 0.5];
    const max = [30, 9, 3, 30, 9, 9];
    const limits = { maxIterations: 60, relativeTolerance: 1e-12, holdAtBounds: true };
    const flat = fitCurve(x, y, model, start, { min, max, ...limits });
    const curve = (p: readonly number[]) => {
      const values = new Float64Array(x.length);
      const gradients = new Float64Array(x.length * p.length);
      model(Float64Array.from(p), x, values, gradients);
      return { values, gradients };
    };
    const rows = levenbergMarquardt(
      {
        start,
        lower: min,
        upper: max,
        residuals: (p) => Array.from(curve(p).values, (v, i) => (y[i] as number) - v),
        jacobian: (p) => {
          const { gradients } = curve(p);
          return x.map((_, i) => p.map((_, k) => -(gradients[k * x.length + i] as number)));
        },
      },
      { maxIterations: 60, reductionTolerance: 1e-12, holdAtBounds: true },
    );
    expect(Array.from(flat.p)).toEqual(rows.parameters);
    expect(flat.chi2).toBe(rows.sumOfSquares);
    expect(flat.iterations).toBe(rows.iterations);
    expect(flat.p[2]).toBe(3);
  });
});

describe('bandsModel', () => {
  it('bandsModel gives each band value and the gradient of central differences, with a sloped baseline', () => {
    const model = bandsModel(2, 18);
    const p = Float64Array.from([0.1, -0.02, 17, 1, 3.2, 21, 0.6, 4]);
    const x = [12, 16.5, 17, 19.3, 25];
    const values = new Float64Array(x.length);
    const gradients = new Float64Array(x.length * p.length);
    model(p, x, values, gradients);
    x.forEach((v, i) => {
      const bands = [
        { center: 17, height: 1, fwhm: 3.2 },
        { center: 21, height: 0.6, fwhm: 4 },
      ];
      expect(values[i]).toBeCloseTo(0.1 - 0.02 * (v - 18) + (bandSum(bands, [v])[0] as number), 12);
    });
    const h = 1e-6;
    const up = new Float64Array(x.length);
    const down = new Float64Array(x.length);
    const scratch = new Float64Array(x.length * p.length);
    for (let k = 0; k < p.length; k++) {
      model(
        p.map((v, j) => (j === k ? v + h : v)),
        x,
        up,
        scratch,
      );
      model(
        p.map((v, j) => (j === k ? v - h : v)),
        x,
        down,
        scratch,
      );
      x.forEach((_, i) => {
        expect(gradients[k * x.length + i]).toBeCloseTo(
          ((up[i] as number) - (down[i] as number)) / (2 * h),
          7,
        );
      });
    }
  });
});
