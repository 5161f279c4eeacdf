import { describe, expect, it } from 'vitest';
import { FREE_IONS, findIon } from '../../src/core/ions.js';

describe('FREE_IONS: 4d and 5d ions', () => {
  it('findIon finds Ru3+, Rh3+, Pd2+, Mo3+, Os4+, Ir3+, Pt2+ and Pt4+ with B, C, ζ and a source marked from memory', () => {
    for (const name of ['Ru3+', 'Rh(III)', 'Pd2+', 'Mo3+', 'Os4+', 'Ir3+', 'Pt2+', 'Pt4+']) {
      const ion = findIon(name);
      expect(ion.B).toBeGreaterThan(0);
      expect(ion.C).toBeGreaterThan(0);
      expect(ion.source).toMatch(/from memory/);
      // ζ of 4d ions is about 1000–2000 cm⁻¹, of 5d ions 3000–5000 (common practice, no source).
      expect(ion.zeta).toBeGreaterThan(ion.element === 'Mo' ? 500 : 1000);
    }
  });

  it('FREE_IONS keeps one entry per element and charge', () => {
    const keys = FREE_IONS.map((i) => `${i.element}${i.charge}`);
    expect(new Set(keys).size).toBe(keys.length);
  });
});
