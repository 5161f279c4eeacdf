import { describe, expect, it } from 'vitest';
import { parseRange } from '../../src/spectra/energyRange.js';

// 1 eV = 8065.543937 cm⁻¹ (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010, 2021).
describe('parseRange', () => {
  it('reads two ends with one unit, in either order, as a cm⁻¹ window', () => {
    const a = parseRange('330-1300nm');
    expect(a.from).toBeCloseTo(1e7 / 1300, 9);
    expect(a.to).toBeCloseTo(1e7 / 330, 9);
    expect(parseRange('8000-30000')).toEqual({ from: 8000, to: 30000 });
    expect(parseRange('30000 – 8000 cm-1')).toEqual({ from: 8000, to: 30000 });
    expect(parseRange('330nm-1300nm')).toEqual(a);
    expect(parseRange('1-2eV').to).toBeCloseTo(2 * 8065.543937, 6);
  });

  it('refuses what is not a range', () => {
    expect(() => parseRange('330')).toThrow(/expected two energies/);
    expect(() => parseRange('330nm-1300eV')).toThrow(/different units/);
    expect(() => parseRange('500-500')).toThrow(/same/);
  });
});
