import { xNoiseStandardDeviation, xyEquallySpaced } from 'ml-spectra-processing';
import { describe, expect, it } from 'vitest';
import { resampleEvenly } from '../../src/numeric/evenResampling.js';
import { robustNoiseDeviation } from '../../src/numeric/robustNoise.js';
import { expectClose } from '../helpers.js';

/** A wavy curve on an uneven, increasing x (a fixed recipe, no randomness). */
function curve(n: number): { x: Float64Array; y: Float64Array } {
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let at = 1000;
  for (let i = 0; i < n; i++) {
    at += 3 + 2 * Math.sin(i * 0.7);
    x[i] = at;
    y[i] = Math.exp(-(((at - 1800) / 300) ** 2)) + 0.01 * Math.cos(i * 1.3);
  }
  return { x, y };
}

describe('resampleEvenly', () => {
  it('resampleEvenly gives the numbers of ml-spectra-processing xyEquallySpaced (variant smooth)', () => {
    const { x, y } = curve(400);
    for (const [from, to, count] of [
      [1010, 2900, 300],
      [1500, 1600, 7],
      [1003.5, 2990.25, 1201],
    ] as const) {
      const ours = resampleEvenly(x, y, from, to, count);
      const theirs = xyEquallySpaced({ x, y }, { from, to, numberOfPoints: count, variant: 'smooth' });
      expect(Array.from(ours.x)).toEqual(theirs.x);
      expect(Array.from(ours.y)).toEqual(theirs.y);
    }
  });

  it('resampleEvenly keeps the mean of a straight line: each slot mean is the line at its centre', () => {
    const x = Float64Array.from({ length: 50 }, (_, i) => i);
    const y = x.map((v) => 2 * v + 1);
    const r = resampleEvenly(x, y, 5, 40, 36);
    r.x.forEach((xi, j) => {
      expectClose(r.y[j] as number, 2 * xi + 1, 1e-9);
    });
  });
});

describe('robustNoiseDeviation', () => {
  it('robustNoiseDeviation gives the sd of ml-spectra-processing xNoiseStandardDeviation', () => {
    for (const n of [3, 4, 101, 250]) {
      const v = Array.from({ length: n }, (_, i) => Math.sin(i * 2.1) + 0.1 * Math.cos(i * 0.3));
      expect(robustNoiseDeviation(v)).toBe(xNoiseStandardDeviation(v).sd);
    }
  });

  it('robustNoiseDeviation of −1, 0, 1 (MAD 1) is 1/Φ⁻¹(3/4)', () => {
    expectClose(robustNoiseDeviation([-1, 0, 1]), 1 / 0.6744897501960817, 1e-12);
  });
});
