import { describe, expect, it } from 'vitest';
import { findIon, fitBands, InputError } from '../../src/index.js';

// [Mn(H2O)6]2+: the weak spin-forbidden bands of high-spin d5 near 18900 (4T1g(G)), 23100
// (4T2g(G)), 24950 (4A1g, 4Eg(G)), 27950 (4T2g(D)) and 29700 (4Eg(D)) cm⁻¹ (Lever, Inorganic
// Electronic Spectroscopy, 1984; from memory). The complex is high-spin (μ ≈ 5.9 μB).
const MN_AQUA = [18900, 23100, 24950, 27950, 29700].map((energy) => ({ energy }));

/** The [Mn(H2O)6]2+ fit with C free and no spin state given, computed once for the tests that read it. */
let mnFit: ReturnType<typeof fitBands> | undefined;
function unrestrictedMnFit(): ReturnType<typeof fitBands> {
  mnFit ??= fitBands({
    n: 5,
    bands: MN_AQUA,
    freeIon: findIon('Mn2+'),
    fitC: true,
    includeSpinForbidden: true,
  });
  return mnFit;
}

describe('fitBands and the ground-state spin', () => {
  it('fits [Mn(H2O)6]2+ as high-spin with spinState high: Dq near 800, B near 700, C/B near 5', () => {
    const ion = findIon('Mn2+');
    const r = fitBands({
      n: 5,
      bands: MN_AQUA,
      freeIon: ion,
      fitC: true,
      includeSpinForbidden: true,
      spinState: 'high',
    });
    const best = r.solutions[0];
    expect(best?.levels.ground.symbol).toBe('6A1g');
    expect(best?.dq).toBeGreaterThan(700);
    expect(best?.dq).toBeLessThan(950);
    expect(best?.B).toBeGreaterThan(600);
    expect(best?.B).toBeLessThan(800);
    expect(best?.assignments.map((a) => a.label.replace(/\(.*\)$/, ''))).toEqual([
      '4T1g',
      '4T2g',
      '4A1g',
      '4T2g',
      '4Eg',
    ]);
  });

  it('lists the best high-spin and the best low-spin solution of [Mn(H2O)6]2+ without spinState, and calls it ambiguous', () => {
    const r = unrestrictedMnFit();
    expect(r.solutions.some((s) => s.levels.ground.symbol === '6A1g')).toBe(true);
    expect(r.solutions.some((s) => s.levels.ground.S === 0.5)).toBe(true);
    expect(r.warnings.map((w) => w.code)).toContain('ambiguous');
  });

  it('ranks solutions with an implausible β (< 0.4) after the plausible ones and warns about them', () => {
    const r = unrestrictedMnFit();
    const betas = r.solutions.map((s) => s.beta ?? 1);
    const firstLow = betas.findIndex((b) => b < 0.4);
    expect(firstLow).toBeGreaterThan(0);
    expect(betas.slice(firstLow).every((b) => b < 0.4 || b > 1)).toBe(true);
    expect(r.solutions[firstLow]?.warnings.map((w) => w.code)).toContain('beta-very-low');
  });
});

describe('fitBands with B held', () => {
  // [Fe(H2O)6]2+: one spin-allowed band, 5T2g → 5Eg, near 10400 cm⁻¹ (Lever 1984; from memory);
  // for high-spin d6 that band lies at exactly 10Dq whatever B is.
  it('fits one band of high-spin d6 with B held: Dq = ν/10 exactly', () => {
    const r = fitBands({
      n: 6,
      bands: [{ energy: 10400 }],
      freeIon: findIon('Fe2+'),
      fixedB: 800,
      spinState: 'high',
    });
    const best = r.solutions[0];
    expect(best?.dq).toBeCloseTo(1040, 6);
    expect(best?.B).toBe(800);
    expect(best?.bHeld).toBe(true);
    expect(best?.beta).toBeCloseTo(800 / 1058, 9);
  });

  it('fits one band of high-spin d6 without B: Dq = ν/10, B not determined, no β', () => {
    const r = fitBands({ n: 6, bands: [{ energy: 10400 }], freeIon: findIon('Fe2+') });
    const best = r.solutions[0];
    expect(best?.ground).toBe('5T2g');
    expect(best?.dq).toBeCloseTo(1040, 6);
    expect(best?.bDetermined).toBe(false);
    expect(best?.beta).toBeNull();
    expect(best?.warnings.map((w) => w.code)).toContain('b-not-determined');
  });

  it('asks for B held when one band cannot fix Dq and B (d2: every band depends on B)', () => {
    expect(() => fitBands({ n: 2, bands: [{ energy: 17800 }] })).toThrow(InputError);
    expect(() => fitBands({ n: 2, bands: [{ energy: 17800 }] })).toThrow(/hold B at a known value \(--B\)/);
  });

  it('merges a Jahn–Teller pair of high-spin d6 (8302±110, 10401±125) and fits Dq from the centroid, also with spinState high', () => {
    for (const spinState of [undefined, 'high'] as const) {
      const r = fitBands({
        n: 6,
        bands: [
          { energy: 8302, sigma: 110 },
          { energy: 10401, sigma: 125 },
        ],
        freeIon: findIon('Fe2+'),
        ...(spinState ? { spinState } : {}),
      });
      expect(r.merges[0]?.members).toEqual([0, 1]);
      expect(r.merges[0]?.reason).toMatch(/Jahn–Teller pair/);
      expect(r.solutions[0]?.ground).toBe('5T2g');
      expect(r.solutions[0]?.dq).toBeCloseTo((8302 + 10401) / 20, 6);
      expect(r.warnings.map((w) => w.code)).toContain('merged-bands');
    }
  });

  it('refuses in one line when the bands cannot belong to the spin state asked for', () => {
    const fit = () =>
      fitBands({ n: 6, bands: [{ energy: 8302 }, { energy: 10401 }], merge: false, spinState: 'high' });
    expect(fit).toThrow(InputError);
    expect(fit).toThrow(/^2 bands: cannot belong to high-spin d6 \(octahedral\) \(ground state 5T2g\)/);
  });

  it('warns that two bands of high-spin d4/d6 may be one Jahn–Teller-split band when kept apart', () => {
    const r = fitBands({
      n: 6,
      bands: [{ energy: 8300 }, { energy: 10400 }],
      merge: false,
      freeIon: findIon('Fe2+'),
      fixedB: 800,
      spinState: 'high',
      includeSpinForbidden: true,
    });
    expect(r.warnings.map((w) => w.code)).toContain('jahn-teller-pair');
  });
});
