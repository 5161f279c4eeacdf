import { describe, expect, it } from 'vitest';
import { fieldSlope, levelKeys, solveAt } from '../../src/analysis/bandModel.js';
import { ratioScan } from '../../src/fit/ratioScan.js';
import { transitions } from '../../src/index.js';

const GEOMETRIES = ['oct', 'tet'] as const;

describe('fieldSlope', () => {
  it('equals the central difference of every level energy in Dq (Hellmann–Feynman theorem, Feynman 1939)', () => {
    for (const geometry of GEOMETRIES) {
      for (let n = 1; n <= 9; n++) {
        const p = { dq: 1300, B: 780, C: 3500 };
        const h = 1e-2;
        const at = solveAt(n, geometry, p);
        const up = solveAt(n, geometry, { ...p, dq: p.dq + h });
        const down = solveAt(n, geometry, { ...p, dq: p.dq - h });
        at.levels.forEach((level, i) => {
          const numeric = ((up.levels[i]?.energy ?? 0) - (down.levels[i]?.energy ?? 0)) / (2 * h);
          const exact = fieldSlope(level, geometry) - fieldSlope(at.ground, geometry);
          expect(Math.abs(exact - numeric)).toBeLessThan(1e-5 + 1e-8 * Math.abs(exact));
        });
      }
    }
  });
});

describe('transitions', () => {
  it('is homogeneous of degree one, and obeys Euler’s relation Dq·∂E/∂Dq + B·∂E/∂B + C·∂E/∂C = E', () => {
    for (const geometry of GEOMETRIES) {
      for (const n of [2, 3, 5, 7]) {
        const p = { dq: 900, B: 700, C: 3000 };
        const base = solveAt(n, geometry, p);
        const keys = levelKeys(base);
        const ground = keys[0] ?? '';
        const excited = keys.slice(1);
        const at = (q: typeof p) => transitions(solveAt(n, geometry, q), ground, excited).energies;
        const t = transitions(base, ground, excited);
        const scaled = at({ dq: 2.5 * p.dq, B: 2.5 * p.B, C: 2.5 * p.C });
        const h = 1e-2;
        const dB = at({ ...p, B: p.B + h }).map((e, i) => (e - (at({ ...p, B: p.B - h })[i] ?? 0)) / (2 * h));
        const dC = at({ ...p, C: p.C + h }).map((e, i) => (e - (at({ ...p, C: p.C - h })[i] ?? 0)) / (2 * h));
        t.energies.forEach((e, i) => {
          expect(Math.abs((scaled[i] ?? 0) - 2.5 * e)).toBeLessThan(1e-7 * (1 + e));
          const euler = p.dq * (t.slopes[i] ?? 0) + p.B * (dB[i] ?? 0) + p.C * (dC[i] ?? 0);
          expect(Math.abs(euler - e)).toBeLessThan(1e-4 + 1e-8 * e);
        });
      }
    }
  });

  it('follows a level by symbol and rank, so that its label stays the same as Dq grows at fixed B and C', () => {
    for (const n of [3, 4, 6]) {
      const labelsOf = (dq: number) => {
        const r = solveAt(n, 'oct', { dq, B: 800, C: 3600 });
        const keys = levelKeys(r);
        return new Map(r.levels.map((l, i) => [keys[i], l.label]));
      };
      const a = labelsOf(400);
      const b = labelsOf(2600);
      for (const [key, label] of a) expect(b.get(key)).toBe(label);
    }
  });
});

describe('ratioScan', () => {
  it('stores band profiles per unit B: solving at B times a ray gives B times the stored energies', () => {
    const scan = ratioScan(3, 'oct', 4.2);
    const point = scan.points[20];
    expect(point).toBeDefined();
    if (!point) return;
    const B = 731;
    const d = point.direction;
    const r = solveAt(3, 'oct', { dq: B * d.dq, B: B * d.B, C: B * d.C });
    const keys = levelKeys(r);
    for (const level of point.excited) {
      const i = keys.indexOf(level.key);
      expect(r.levels[i]?.energy ?? 0).toBeCloseTo(B * level.energy, 6);
    }
  });

  it('spaces its points evenly in log(Δ/B) over the range and keeps d¹ and d⁹ to one ray in Dq', () => {
    const scan = ratioScan(8, 'oct', 4.5, { minDeltaOverB: 1, maxDeltaOverB: 64, points: 7 });
    expect(scan.points.map((p) => p.deltaOverB)).toEqual(
      [1, 2, 4, 8, 16, 32, 64].map((x) => expect.closeTo(x, 10)),
    );
    const single = ratioScan(9, 'tet', 4.5);
    expect(single.scale).toBe('dq');
    expect(single.points).toHaveLength(1);
    expect(single.points[0]?.excited[0]?.energy).toBeCloseTo(10, 12);
  });
});
