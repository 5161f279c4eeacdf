import { describe, expect, it } from 'vitest';
import { InputError, momentEstimate, solveCubic, spinOnlyMoment } from '../../src/index.js';

describe('spinOnlyMoment', () => {
  // The spin-only table of inorganic texts, μ_so = √(n(n+2)) μ_B for n unpaired electrons
  // (e.g. Figgis, Introduction to Ligand Fields, 1966; Housecroft & Sharpe, Inorganic Chemistry; from memory).
  it.each([
    [0.5, 1.73],
    [1, 2.83],
    [1.5, 3.87],
    [2, 4.9],
    [2.5, 5.92],
  ])('gives S = %s → %s μ_B as in the spin-only table', (S, mu) => {
    expect(spinOnlyMoment(S)).toBeCloseTo(mu, 2);
  });

  it('equals √(n(n+2)) for n = 2S unpaired electrons and is 0 for S = 0', () => {
    for (let n = 0; n <= 5; n++) expect(spinOnlyMoment(n / 2)).toBeCloseTo(Math.sqrt(n * (n + 2)), 12);
  });

  it('refuses a spin that is not a multiple of 1/2 with InputError', () => {
    expect(() => spinOnlyMoment(0.3)).toThrow(InputError);
    expect(() => spinOnlyMoment(-1)).toThrow(InputError);
  });
});

describe('momentEstimate', () => {
  it('flags the T ground term of octahedral high-spin Co²⁺ (⁴T₁g) as first-order orbital (Figgis & Lewis 1964)', () => {
    const g = solveCubic({ n: 7, dq: 900, B: 900, C: 3600 }).ground;
    expect(g.symbol).toBe('4T1g');
    const m = momentEstimate(g, 7);
    expect(m.orbital).toBe('first-order');
    expect(m.spinOnly).toBeCloseTo(3.87, 2);
    expect(m.note).toMatch(/spin-only/);
  });

  it('gives the ⁶A₁g of high-spin d⁵ no orbital contribution and 5.92 μ_B', () => {
    const g = solveCubic({ n: 5, dq: 800, B: 800, C: 3200 }).ground;
    const m = momentEstimate(g, 5);
    expect([g.symbol, m.orbital]).toEqual(['6A1g', 'none']);
    expect(m.spinOnly).toBeCloseTo(5.92, 2);
  });

  it('gives A₂ and E ground terms a second-order note (octahedral Cr³⁺ ⁴A₂g, Cu²⁺ ²Eg)', () => {
    const cr = solveCubic({ n: 3, dq: 1700, B: 700, C: 2900 }).ground;
    const cu = solveCubic({ n: 9, dq: 1200, B: 0, C: 0 }).ground;
    expect(momentEstimate(cr, 3).orbital).toBe('second-order');
    expect(momentEstimate(cu, 9).orbital).toBe('second-order');
    expect(momentEstimate(cr, 3).note).toMatch(/4λ/);
    expect(momentEstimate(cu, 9).note).toMatch(/2λ/);
    // Cr³⁺ (d³, λ > 0) lies below spin-only, Cu²⁺ (d⁹, λ < 0) above (Figgis 1966, from memory).
    expect(momentEstimate(cr, 3).note).toMatch(/below spin-only/);
    expect(momentEstimate(cu, 9).note).toMatch(/above spin-only/);
  });

  it('calls low-spin d⁶ (¹A₁g) diamagnetic', () => {
    const g = solveCubic({ n: 6, dq: 3000, B: 700, C: 3300 }).ground;
    const m = momentEstimate(g, 6);
    expect([g.symbol, m.spinOnly, m.orbital]).toEqual(['1A1g', 0, 'none']);
    expect(m.note).toMatch(/diamagnetic/);
  });
});
