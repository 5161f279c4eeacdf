import { describe, expect, it } from 'vitest';
import { ORBITAL_ENERGY_DQ, pairingCoefficients } from '../../src/analysis/lfse.js';
import {
  InputError,
  impliedPairingEnergy,
  oneElectronStates,
  pairingEnergy,
  solveCubic,
} from '../../src/index.js';

// The standard LFSE table of inorganic texts (e.g. Housecroft & Sharpe, Inorganic Chemistry;
// Figgis & Hitchman, Ligand Field Theory and its Applications, 2000; values from memory), with
// Π counted per pair beyond the high-spin arrangement: [n, HS Dq, LS Dq, extra pairs].
const OCTAHEDRAL_TABLE: readonly [number, number, number | undefined, number | undefined][] = [
  [1, -4, undefined, undefined],
  [2, -8, undefined, undefined],
  [3, -12, undefined, undefined],
  [4, -6, -16, 1],
  [5, 0, -20, 2],
  [6, -4, -24, 2],
  [7, -8, -18, 1],
  [8, -12, undefined, undefined],
  [9, -6, undefined, undefined],
];

// Tetrahedral, e at −6Dq_t and t₂ at +4Dq_t (same sources, from memory).
const TETRAHEDRAL_TABLE: readonly [number, number, number | undefined, number | undefined][] = [
  [1, -6, undefined, undefined],
  [2, -12, undefined, undefined],
  [3, -8, -18, 1],
  [4, -4, -24, 2],
  [5, 0, -20, 2],
  [6, -6, -16, 1],
  [7, -12, undefined, undefined],
  [8, -8, undefined, undefined],
  [9, -4, undefined, undefined],
];

describe('oneElectronStates', () => {
  it.each(OCTAHEDRAL_TABLE)('octahedral d%i matches the standard LFSE table', (n, hs, ls, pairs) => {
    const s = oneElectronStates(n, 'oct');
    expect(s.highSpin.lfseDq).toBe(hs);
    expect(s.highSpin.extraPairs).toBe(0);
    expect(s.lowSpin?.lfseDq).toBe(ls);
    expect(s.lowSpin?.extraPairs).toBe(pairs);
  });

  it.each(TETRAHEDRAL_TABLE)('tetrahedral d%i matches the standard LFSE table', (n, hs, ls, pairs) => {
    const s = oneElectronStates(n, 'tet');
    expect(s.highSpin.lfseDq).toBe(hs);
    expect(s.lowSpin?.lfseDq).toBe(ls);
    expect(s.lowSpin?.extraPairs).toBe(pairs);
  });

  it('gives octahedral d6 as t2g^4 eg^2 (4 unpaired) and t2g^6 (none), the textbook arrangements', () => {
    const s = oneElectronStates(6, 'oct');
    expect(s.highSpin).toMatchObject({ configuration: 't2g^4 eg^2', unpaired: 4, S: 2, t2: 4, e: 2 });
    expect(s.lowSpin).toMatchObject({ configuration: 't2g^6', unpaired: 0, S: 0 });
  });

  it('has the spin of the high- and low-spin arrangements equal to the full model ground states either side of the crossover', () => {
    const expected: Record<number, [number, number]> = { 4: [2, 1], 5: [2.5, 0.5], 6: [2, 0], 7: [1.5, 0.5] };
    for (const [n, [hs, ls]] of Object.entries(expected)) {
      const s = oneElectronStates(Number(n), 'oct');
      expect([s.highSpin.S, s.lowSpin?.S]).toEqual([hs, ls]);
    }
  });

  it('uses orbital energies whose difference is 10Dq in both geometries, as the solver does for d1', () => {
    for (const geometry of ['oct', 'tet'] as const) {
      const w = ORBITAL_ENERGY_DQ[geometry];
      const lowerIsT2 = geometry === 'oct';
      const split = lowerIsT2 ? w.e - w.t2 : w.t2 - w.e;
      expect(split).toBe(10);
      // Barycentre rule: 3·t₂ + 2·e = 0.
      expect(3 * w.t2 + 2 * w.e).toBe(0);
      const d1 = solveCubic({ n: 1, geometry, dq: 1000, B: 0, C: 0 });
      expect(d1.levels.at(-1)?.energy).toBeCloseTo(split * 1000, 6);
    }
  });

  it('refuses n outside 1…9 and unknown geometries with InputError', () => {
    expect(() => oneElectronStates(0)).toThrow(InputError);
    expect(() => oneElectronStates(10)).toThrow(InputError);
    expect(() => oneElectronStates(2.5)).toThrow(InputError);
    expect(() => oneElectronStates(4, 'cube' as 'oct')).toThrow(InputError);
  });
});

describe('impliedPairingEnergy', () => {
  it('is 10Dq for every dⁿ with a spin choice: Δc = Π by definition of the one-electron rule', () => {
    for (const geometry of ['oct', 'tet'] as const) {
      for (let n = 1; n <= 9; n++) {
        const s = oneElectronStates(n, geometry);
        const pi = impliedPairingEnergy(s, 1234);
        if (s.lowSpin) expect(pi).toBeCloseTo(12340, 9);
        else expect(pi).toBeUndefined();
      }
    }
  });
});

describe('pairingEnergy', () => {
  it('gives d6 2.5B + 4C and d4 6B + 5C (Griffith, The Theory of Transition-Metal Ions, 1961; from memory)', () => {
    expect(pairingEnergy(6, 'oct', 1000, 4000)).toBeCloseTo(2500 + 16000, 9);
    expect(pairingEnergy(4, 'oct', 1000, 4000)).toBeCloseTo(6000 + 20000, 9);
    expect(pairingEnergy(3, 'oct', 1000, 4000)).toBeUndefined();
  });

  it('takes the formula of the octahedral d¹⁰⁻ⁿ for tetrahedral dⁿ (hole equivalence)', () => {
    for (const n of [3, 4, 5, 6])
      expect(pairingCoefficients(n, 'tet')).toEqual(pairingCoefficients(10 - n, 'oct'));
  });

  // Identity: far into the strong field, E(lowest LS) − E(lowest HS) of the full model tends to
  // ΔLFSE·Dq + p·Π with Π the strong-field pairing energy; the remainder falls as 1/Dq, so two
  // large Dq values extrapolate it away (Richardson).
  it.each([
    ['oct', 4],
    ['oct', 5],
    ['oct', 6],
    ['oct', 7],
    ['tet', 3],
    ['tet', 4],
    ['tet', 5],
    ['tet', 6],
  ] as const)('is the strong-field limit of the full model (%s d%i)', (geometry, n) => {
    const B = 1000;
    const C = 4300;
    const s = oneElectronStates(n, geometry);
    const ls = s.lowSpin;
    if (!ls) throw new Error('expected a spin choice');
    const perPair = (dq: number) => {
      const r = solveCubic({ n, geometry, dq, B, C });
      const e = (S: number) => r.levels.find((l) => l.S === S)?.energy ?? Number.NaN;
      return (e(ls.S) - e(s.highSpin.S) - (ls.lfseDq - s.highSpin.lfseDq) * dq) / ls.extraPairs;
    };
    const limit = (10 * perPair(1e6) - perPair(1e5)) / 9;
    const expected = pairingEnergy(n, geometry, B, C) ?? Number.NaN;
    expect(Math.abs(limit - expected)).toBeLessThan(1e-4 * expected);
  });

  it('refuses negative B or C with InputError', () => {
    expect(() => pairingEnergy(6, 'oct', -1, 4000)).toThrow(InputError);
    expect(() => pairingEnergy(6, 'oct', 1000, Number.NaN)).toThrow(InputError);
  });
});
