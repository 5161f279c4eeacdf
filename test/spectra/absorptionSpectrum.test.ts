import { describe, expect, it } from 'vitest';
import { absorptionSpectrum, CM_PER_EV, parseSpectrumText, type RawSpectrum } from '../../src/index.js';
import {
  chooseUnit,
  parseXUnit,
  parseYUnit,
  xUnitFromLabel,
  yUnitFromLabel,
} from '../../src/spectra/spectrumUnits.js';

describe('xUnitFromLabel and yUnitFromLabel', () => {
  it.each([
    ['Wavelength (nm)', 'nm'],
    ['nm', 'nm'],
    ['Wavenumber', 'cm-1'],
    ['Wavenumber / cm⁻¹', 'cm-1'],
    ['cm^-1', 'cm-1'],
    ['1/cm', 'cm-1'],
    ['Energy (eV)', 'eV'],
  ])('reads the x unit of "%s" as %s', (label, unit) => {
    expect(xUnitFromLabel(label)).toBe(unit);
  });

  it('finds no x unit where the header names none, so none is guessed', () => {
    expect(xUnitFromLabel('Wavelength')).toBeUndefined();
    expect(xUnitFromLabel('x')).toBeUndefined();
  });

  it('refuses x units it does not read and headers naming two', () => {
    expect(() => xUnitFromLabel('Wavelength (µm)')).toThrow(/not read/);
    expect(() => xUnitFromLabel('nm / cm-1')).toThrow(/more than one unit/);
  });

  it.each([
    ['Abs', 'absorbance'],
    ['Absorbance', 'absorbance'],
    ['A', 'absorbance'],
    ['%T', 'transmittance-percent'],
    ['T (%)', 'transmittance-percent'],
    ['Transmittance (%)', 'transmittance-percent'],
    ['ε', 'epsilon'],
    ['epsilon (L mol-1 cm-1)', 'epsilon'],
    ['Molar absorptivity', 'epsilon'],
    ['ε / M⁻¹ cm⁻¹', 'epsilon'],
  ])('reads the y quantity of "%s" as %s', (label, unit) => {
    expect(yUnitFromLabel(label)).toBe(unit);
  });

  it('asks whether a bare transmittance is per cent or a fraction', () => {
    expect(() => yUnitFromLabel('Transmittance')).toThrow(/per cent or a fraction/);
  });

  it('asks whether a bare Reflectance is per cent, and refuses emission as absorption, pointing to --y-unit arb', () => {
    expect(() => yUnitFromLabel('Reflectance')).toThrow(/--y-unit %R or --y-unit R/);
    expect(() => yUnitFromLabel('Intensity (counts)')).toThrow(/--y-unit arb/);
  });
});

describe('parseXUnit, parseYUnit and chooseUnit', () => {
  it('parses the option spellings', () => {
    expect(parseXUnit('cm^-1')).toBe('cm-1');
    expect(parseXUnit('EV')).toBe('eV');
    expect(parseYUnit('%T')).toBe('transmittance-percent');
    expect(parseYUnit('T')).toBe('transmittance');
    expect(parseYUnit('epsilon')).toBe('epsilon');
    expect(() => parseXUnit('um')).toThrow(/expected nm, cm-1 or eV/);
    expect(() => parseYUnit('OD')).toThrow(/expected A, epsilon/);
  });

  it('takes the file’s unit, or the given one, and refuses a disagreement or neither', () => {
    const file = { unit: 'nm' as const, origin: 'header "Wavelength (nm)"' };
    expect(chooseUnit('x', 'Wavelength (nm)', file, undefined)).toEqual(file);
    expect(chooseUnit('x', 'Wavelength (nm)', file, 'nm')).toEqual(file);
    expect(chooseUnit('x', 'x', undefined, 'cm-1')).toEqual({ unit: 'cm-1', origin: '--x-unit' });
    expect(() => chooseUnit('x', 'Wavelength (nm)', file, 'cm-1')).toThrow(/disagrees with the file/);
    expect(() => chooseUnit('x', 'Wavelength', undefined, undefined)).toThrow(
      'x column "Wavelength" does not say whether x is in nm, cm-1 or eV: give --x-unit nm, cm-1 or eV',
    );
    expect(() => chooseUnit('y', 'Signal', undefined, undefined)).toThrow(/--y-unit A/);
  });
});

function raw(x: number[], y: number[], lines?: number[]): RawSpectrum {
  return {
    x: Float64Array.from(x),
    y: Float64Array.from(y),
    ...(lines ? { lines: Uint32Array.from(lines) } : {}),
    xLabel: 'x',
    yLabel: 'y',
    format: 'test',
  };
}

describe('absorptionSpectrum conversions', () => {
  it('turns falling nm into rising cm⁻¹ by ν̃ = 10⁷/λ and keeps absorbance as it is (no Jacobian)', () => {
    const s = absorptionSpectrum(raw([800, 500, 400], [0.1, 0.2, 0.3]), { xUnit: 'nm', yUnit: 'absorbance' });
    expect(Array.from(s.wavenumber)).toEqual([12500, 20000, 25000]);
    expect(Array.from(s.value)).toEqual([0.1, 0.2, 0.3]);
    expect(s.quantity).toBe('absorbance');
  });

  it('turns eV into cm⁻¹ with the CODATA 2018 factor', () => {
    const s = absorptionSpectrum(raw([2, 3], [0.1, 0.2]), { xUnit: 'eV', yUnit: 'absorbance' });
    expect(s.wavenumber[0]).toBeCloseTo(2 * CM_PER_EV, 6);
  });

  it('turns transmittance into absorbance: %T 100, 10, 1 give A 0, 1, 2; a fraction T gives −log₁₀ T', () => {
    const pct = absorptionSpectrum(raw([1, 2, 3], [100, 10, 1]), {
      xUnit: 'cm-1',
      yUnit: 'transmittance-percent',
    });
    expect(Array.from(pct.value).map((v) => Number(v.toFixed(12)))).toEqual([0, 1, 2]);
    expect(pct.conversions).toEqual(['A = 2 − log₁₀(%T)']);
    const frac = absorptionSpectrum(raw([1, 2, 3], [1, 0.1, 0.5]), { xUnit: 'cm-1', yUnit: 'transmittance' });
    expect(frac.value[2]).toBeCloseTo(Math.log10(2), 12);
    // The two forms agree: A(%T = 100·T) = A(T).
    const same = absorptionSpectrum(raw([1, 2], [50, 3]), { xUnit: 'cm-1', yUnit: 'transmittance-percent' });
    expect(same.value[0]).toBeCloseTo(frac.value[2] as number, 12);
  });

  it('turns absorbance into ε = A / (c·l) (Beer–Lambert)', () => {
    const s = absorptionSpectrum(raw([1, 2], [0.5, 1]), {
      xUnit: 'cm-1',
      yUnit: 'absorbance',
      concentration: 0.01,
      pathLength: 0.5,
    });
    expect(Array.from(s.value)).toEqual([100, 200]);
    expect(s.quantity).toBe('epsilon');
  });

  it('reads the units from a CSV header', () => {
    const text = 'Wavenumber (cm-1),%T\n10000,50\n10010,40\n';
    const s = absorptionSpectrum(parseSpectrumText(text));
    expect(s.xUnit.unit).toBe('cm-1');
    expect(s.yUnit.origin).toBe('header "%T"');
    expect(s.value[1]).toBeCloseTo(2 - Math.log10(40), 12);
  });
});

describe('absorptionSpectrum bad input', () => {
  const units = { xUnit: 'nm' as const, yUnit: 'absorbance' as const };

  it('refuses a repeated x, naming both lines', () => {
    expect(() => absorptionSpectrum(raw([400, 401, 401], [1, 2, 3], [5, 6, 7]), units)).toThrow(
      'line 7: x = 401 repeats the x of line 6: expected each x once',
    );
  });

  it('refuses x that changes direction (two scans in one file)', () => {
    expect(() => absorptionSpectrum(raw([400, 401, 402, 400.5], [1, 2, 3, 4], [2, 3, 4, 5]), units)).toThrow(
      /^line 5: x = 400\.5 after 402 breaks the rising order of x/,
    );
  });

  it('refuses a non-positive x and a non-positive transmittance', () => {
    expect(() => absorptionSpectrum(raw([0, 1], [1, 2]), units)).toThrow(
      /point 1: x = 0 nm: expected a positive/,
    );
    expect(() =>
      absorptionSpectrum(raw([1, 2], [5, 0], [10, 11]), { xUnit: 'nm', yUnit: 'transmittance-percent' }),
    ).toThrow(/line 11: transmittance 0 %/);
  });

  it('refuses c without l, and c with l for a y that is already ε', () => {
    expect(() => absorptionSpectrum(raw([1, 2], [1, 2]), { ...units, concentration: 0.1 })).toThrow(/both/);
    expect(() =>
      absorptionSpectrum(raw([1, 2], [1, 2]), {
        xUnit: 'nm',
        yUnit: 'epsilon',
        concentration: 0.1,
        pathLength: 1,
      }),
    ).toThrow(/already ε/);
  });
});
