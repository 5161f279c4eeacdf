import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { findIon, freeIonRatio } from '../../src/core/ions.js';
import { CM_PER_EV, cmToEv, cmToNm, parseEnergy, parseEnergyList, parseUnit } from '../../src/core/units.js';
import { parseStateLabel, unicodeConfiguration, unicodeLabel, unicodeTerm } from '../../src/field/labels.js';
import { expectClose } from '../helpers.js';

describe('units', () => {
  it('cmToNm and cmToEv use λ = 10⁷/ν̃ and 1 eV = 8065.544 cm⁻¹ (CODATA 2018)', () => {
    expectClose(cmToNm(25000), 400, 1e-12);
    expectClose(cmToEv(CM_PER_EV), 1, 1e-12);
    expectClose(CM_PER_EV, 8065.544, 1e-7);
  });

  it('parseEnergy reads cm⁻¹, nm, eV and kK and carries ± uncertainties through the conversion', () => {
    expect(parseEnergy('25300')).toEqual({ value: 25300 });
    expectClose(parseEnergy('395nm').value, 1e7 / 395, 1e-12);
    expectClose(parseEnergy('1.05eV').value, 1.05 * CM_PER_EV, 1e-12);
    expectClose(parseEnergy('25.3 kK').value, 25300, 1e-12);
    expect(parseEnergy('25300±300')).toEqual({ value: 25300, sigma: 300 });
    expect(parseEnergy('25300+-300')).toEqual({ value: 25300, sigma: 300 });
    const nm = parseEnergy('400nm±2');
    expectClose(nm.sigma, (1e7 / 400 ** 2) * 2, 1e-12);
    expect(parseEnergy('800', 'nm').value).toBe(12500);
  });

  it('parseEnergyList splits on commas', () => {
    expect(parseEnergyList('8500, 13800,25300').map((e) => e.value)).toEqual([8500, 13800, 25300]);
  });

  it('parseEnergy and parseUnit reject a non-number, a zero, a negative and an unknown unit, naming the text', () => {
    for (const bad of ['abc', '0', '-5', '12 furlongs', '1e999', '5±', '']) {
      expect(() => parseEnergy(bad)).toThrow(InputError);
    }
    expect(() => parseEnergy('12 furlongs')).toThrow(/furlongs/);
    expect(() => parseUnit('Hz')).toThrow(/"Hz"/);
    expect(() => parseEnergyList(' , ')).toThrow(InputError);
  });
});

describe('ions', () => {
  it('findIon accepts Cr3+, cr3+, Cr+3, Cr(III) and Cr III', () => {
    for (const name of ['Cr3+', 'cr3+', 'Cr+3', 'Cr(III)', 'Cr III']) expect(findIon(name).ion).toBe('Cr3+');
  });

  it('findIon gives the d count from the charge: Ni2+ d8, Fe3+ d5, Ti3+ d1', () => {
    expect(findIon('Ni2+').n).toBe(8);
    expect(findIon('Fe3+').n).toBe(5);
    expect(findIon('Ti3+').n).toBe(1);
  });

  it('freeIonRatio of Cr3+ is 3850/918 and is undefined for d¹', () => {
    expectClose(freeIonRatio(findIon('Cr3+')), 3850 / 918, 1e-12);
    expect(freeIonRatio(findIon('Ti3+'))).toBeUndefined();
  });

  it('findIon rejects an unknown ion with the list of known ones', () => {
    expect(() => findIon('Zz2+')).toThrow(/unknown ion "Zz2\+".*Cr3\+/);
  });
});

describe('labels', () => {
  it('unicodeLabel typesets 4T1g(F) as ⁴T₁g(F) and 2Eg as ²Eg', () => {
    expect(unicodeLabel('4T1g(F)')).toBe('⁴T₁g(F)');
    expect(unicodeLabel('2Eg')).toBe('²Eg');
    expect(unicodeLabel('3T1g(H,2)')).toBe('³T₁g(H,2)');
  });

  it('parseStateLabel splits multiplicity, letter, index, parity and parent', () => {
    expect(parseStateLabel('4T1g(F)')).toEqual({
      multiplicity: '4',
      letter: 'T',
      index: '1',
      parity: 'g',
      parent: 'F',
    });
    expect(parseStateLabel('6A1')).toEqual({
      multiplicity: '6',
      letter: 'A',
      index: '1',
      parity: '',
      parent: '',
    });
    expect(parseStateLabel('hello')).toBeUndefined();
  });

  it('unicodeConfiguration and unicodeTerm typeset t2g^2 eg^1 and 4F3/2', () => {
    expect(unicodeConfiguration('t2g^2 eg^1')).toBe('t₂g² eg¹');
    expect(unicodeTerm('4F3/2')).toBe('⁴F₃/₂');
    expect(unicodeTerm('a2D')).toBe('a²D');
  });
});
