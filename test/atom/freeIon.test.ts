import { describe, expect, it } from 'vitest';
import { type FreeIonTerm, freeIonTerms, freeIonTermsSlater } from '../../src/atom/freeIon.js';
import { slaterFromRacah } from '../../src/atom/repulsion.js';
import { InputError } from '../../src/core/errors.js';
import { fullHamiltonian } from '../../src/field/hamiltonian.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose } from '../helpers.js';

const PARAMETERS: [number, number][] = [
  [918, 3850],
  [1000, 4000],
  [640, 3200],
  [1084, 4831],
];

/** Energies by term name, relative to the first (lowest) term. */
function byName(terms: readonly FreeIonTerm[]): Map<string, number> {
  return new Map(terms.map((t) => [t.name, t.energy]));
}

describe('freeIonTerms', () => {
  // Racah, Phys. Rev. 62, 438 (1942); tabulated in Griffith, The Theory of Transition-Metal Ions, 1961.
  it('freeIonTerms(d²) gives ³F = −8B, ³P = 7B, ¹D = −3B + 2C, ¹G = 4B + 2C, ¹S = 14B + 7C (+A) at several B, C', () => {
    for (const [B, C] of PARAMETERS) {
      const e = byName(freeIonTerms(2, B, C));
      const ground = -8 * B;
      expectClose(e.get('3F'), 0);
      expectClose(e.get('3P'), 7 * B - ground);
      expectClose(e.get('1D'), -3 * B + 2 * C - ground);
      expectClose(e.get('1G'), 4 * B + 2 * C - ground);
      expectClose(e.get('1S'), 14 * B + 7 * C - ground);
    }
  });

  it('freeIonTerms(d³) gives ⁴F = −15B, ⁴P = 0, ²G = −11B + 3C, ²P = ²H = −6B + 3C, ²F = 9B + 3C, ²D = 5B + 5C ± √(193B² + 8BC + 4C²) (+3A)', () => {
    for (const [B, C] of PARAMETERS) {
      const e = byName(freeIonTerms(3, B, C));
      const g = -15 * B;
      const root = Math.sqrt(193 * B * B + 8 * B * C + 4 * C * C);
      expectClose(e.get('4P'), 0 - g);
      expectClose(e.get('2G'), -11 * B + 3 * C - g);
      expectClose(e.get('2P'), -6 * B + 3 * C - g);
      expectClose(e.get('2H'), -6 * B + 3 * C - g);
      expectClose(e.get('2F'), 9 * B + 3 * C - g);
      expectClose(e.get('a2D'), 5 * B + 5 * C - root - g);
      expectClose(e.get('b2D'), 5 * B + 5 * C + root - g);
    }
  });

  it('freeIonTerms(d⁵) gives ⁶S = −35B, ⁴G = −25B + 5C, ⁴P = −28B + 7C, ⁴D = −18B + 5C, ⁴F = −13B + 7C, ²I = −24B + 8C (+10A)', () => {
    for (const [B, C] of PARAMETERS) {
      const e = byName(freeIonTerms(5, B, C));
      const g = -35 * B;
      expectClose(e.get('6S'), 0);
      expectClose(e.get('4G'), -25 * B + 5 * C - g);
      expectClose(e.get('4P'), -28 * B + 7 * C - g);
      expectClose(e.get('4D'), -18 * B + 5 * C - g);
      expectClose(e.get('4F'), -13 * B + 7 * C - g);
      expectClose(e.get('2I'), -24 * B + 8 * C - g);
    }
  });

  it('freeIonTerms(d⁴) gives ⁵D = −21B, ³H = −17B + 4C, ³G = −12B + 4C, ³D = −5B + 4C, ¹I = −15B + 6C, ¹F = 6C (+6A; Griffith 1961, from memory)', () => {
    for (const [B, C] of PARAMETERS) {
      const e = byName(freeIonTerms(4, B, C));
      const g = -21 * B;
      expectClose(e.get('3H'), -17 * B + 4 * C - g);
      expectClose(e.get('3G'), -12 * B + 4 * C - g);
      expectClose(e.get('3D'), -5 * B + 4 * C - g);
      expectClose(e.get('1I'), -15 * B + 6 * C - g);
      expectClose(e.get('1F'), 6 * C - g);
    }
  });

  it('freeIonTerms(dⁿ) equals freeIonTerms(d¹⁰⁻ⁿ) (electron–hole equivalence for repulsion)', () => {
    for (let n = 0; n <= 4; n++) {
      const a = freeIonTerms(n, 900, 3700);
      const b = freeIonTerms(10 - n, 900, 3700);
      expect(a.map((t) => t.name)).toEqual(b.map((t) => t.name));
      a.forEach((t, i) => {
        expectClose(b[i]?.energy, t.energy, 1e-10, 1e-7);
      });
    }
  });

  it('the configuration average of dⁿ is n(n−1)/2 · (−2/63)(F² + F⁴) (Slater, Quantum Theory of Atomic Structure, 1960)', () => {
    for (let n = 2; n <= 8; n++) {
      const [B, C] = [850, 3900];
      const { F2, F4 } = slaterFromRacah(B, C);
      const { size, matrix } = fullHamiltonian(n, 0, B, C);
      let trace = 0;
      for (let i = 0; i < size; i++) trace += matrix[i * size + i] ?? 0;
      expectClose(trace / size, ((n * (n - 1)) / 2) * (-2 / 63) * (F2 + F4), 1e-11, 1e-7);
      // …and the terms' degeneracy-weighted mean, put back on the absolute scale, is that same average.
      const lowest = symmetricEigen(matrix, size).values[0] ?? 0;
      const terms = freeIonTerms(n, B, C);
      const weighted = terms.reduce((s, t) => s + t.degeneracy * (t.energy + lowest), 0) / size;
      expectClose(weighted, trace / size, 1e-10, 1e-6);
    }
  });

  it('freeIonTermsSlater(p²) gives ³P = −5F₂, ¹D = F₂, ¹S = 10F₂ with F₂ = F²/25 (Condon & Shortley 1935)', () => {
    const F2 = 25 * 40;
    const e = byName(freeIonTermsSlater(1, 2, [F2]));
    expectClose(e.get('1D'), 6 * 40);
    expectClose(e.get('1S'), 15 * 40);
  });

  it('freeIonTerms names repeated terms a, b, c from the lowest and gives every term its degeneracy', () => {
    const terms = freeIonTerms(5, 1000, 4000);
    expect(terms.filter((t) => t.term === '2D').map((t) => t.name)).toEqual(['a2D', 'b2D', 'c2D']);
    expect(terms.reduce((s, t) => s + t.degeneracy, 0)).toBe(252);
  });

  it('freeIonTerms rejects negative B and out-of-range n with an InputError naming the value', () => {
    expect(() => freeIonTerms(3, -5, 3000)).toThrow(InputError);
    expect(() => freeIonTerms(3, -5, 3000)).toThrow(/-5/);
    expect(() => freeIonTerms(11, 900, 3000)).toThrow(/11/);
  });
});
