import { describe, expect, it } from 'vitest';
import { levelKeys, solveAt } from '../../src/analysis/bandModel.js';
import { searchAssignments } from '../../src/fit/assignment.js';
import { ratioScan } from '../../src/fit/ratioScan.js';

const weight = 1 / 200 ** 2;
const bandsOf = (...energies: number[]) => energies.map((energy) => ({ energy, weight }));
const labelSets = (s: ReturnType<typeof searchAssignments>) =>
  new Set(s.candidates.map((c) => c.labels.join(' ')));

describe('searchAssignments', () => {
  it('gives three d⁸ bands the only order-preserving choice of the three spin-allowed transitions', () => {
    const s = searchAssignments(ratioScan(8, 'oct', 4.5), bandsOf(8500, 13800, 25300));
    expect(s.tried).toBe(1);
    expect([...labelSets(s)]).toEqual(['3T2g 3T1g(F) 3T1g(P)']);
  });

  it('offers two d⁸ bands every increasing pair of the three transitions: C(3,2) = 3', () => {
    const s = searchAssignments(ratioScan(8, 'oct', 4.5), bandsOf(9000, 15000));
    expect(labelSets(s)).toEqual(new Set(['3T2g 3T1g(F)', '3T2g 3T1g(P)', '3T1g(F) 3T1g(P)']));
  });

  it('keeps a fixed assignment and searches only the other bands', () => {
    const scan = ratioScan(8, 'oct', 4.5);
    const mid = scan.points[24];
    const key = mid?.excited.find((l) => l.label === '3T1g(P)')?.key ?? null;
    const s = searchAssignments(scan, bandsOf(9000, 25000), { fixed: [null, key] });
    expect(s.candidates.every((c) => c.labels[1] === '3T1g(P)')).toBe(true);
    expect(labelSets(s)).toEqual(new Set(['3T2g 3T1g(P)', '3T1g(F) 3T1g(P)']));
  });

  it('puts the start of exact bands at the ray and scale they came from (closed-form scale along the ray)', () => {
    const scan = ratioScan(3, 'oct', 4.5);
    const point = scan.points[30];
    if (!point?.deltaOverB) throw new Error('no scan point');
    const B = 700;
    const truth = solveAt(3, 'oct', { dq: (point.deltaOverB * B) / 10, B, C: 4.5 * B });
    const allowed = truth.levels.filter((l) => l.spinAllowed && l !== truth.ground).map((l) => l.energy);
    const s = searchAssignments(scan, bandsOf(...allowed));
    const best = s.candidates[0];
    expect(best?.pointIndex).toBe(30);
    expect(best?.start.B).toBeCloseTo(B, 6);
    expect(best?.chiSquare).toBeLessThan(1e-12);
  });

  it('tries spin-forbidden transitions only when asked, and reports ground states with no assignment', () => {
    const scan = ratioScan(5, 'oct', 3.5);
    const allowedOnly = searchAssignments(scan, bandsOf(18900, 23100));
    expect(allowedOnly.groundsWithout).toEqual(['6A1g']);
    expect(allowedOnly.candidates.every((c) => c.groundLabel !== '6A1g')).toBe(true);
    const withForbidden = searchAssignments(scan, bandsOf(18900, 23100), { includeSpinForbidden: true });
    expect(withForbidden.groundsWithout).toEqual([]);
    expect(withForbidden.candidates.some((c) => c.groundLabel === '6A1g')).toBe(true);
  });

  it('uses identity keys that exist in the solver output at every start', () => {
    const scan = ratioScan(6, 'oct', 4.8);
    const s = searchAssignments(scan, bandsOf(21000, 29500));
    for (const c of s.candidates) {
      const keys = levelKeys(solveAt(6, 'oct', c.start));
      for (const k of [c.groundKey, ...c.keys]) expect(keys).toContain(k);
    }
  });
});
