import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REFLECTANCE_SPECTRUM } from '../../fixtures/spectra/generate.js';
import { findIon, freeIonRatio } from '../../src/index.js';
import {
  absorptionSpectrum,
  kubelkaMunk,
  reflectanceOfKubelkaMunk,
} from '../../src/spectra/absorptionSpectrum.js';
import { analyseSpectrum, KUBELKA_MUNK_CAUTION } from '../../src/spectra/spectrumAnalysis.js';
import { parseSpectrumText } from '../../src/spectra/spectrumText.js';
import { parseYUnit, yUnitFromLabel } from '../../src/spectra/spectrumUnits.js';
import { expectClose } from '../helpers.js';

/**
 * Diffuse reflectance through the Kubelka–Munk function F(R) = (1 − R)²/2R (P. Kubelka and
 * F. Munk, Z. Tech. Phys. 1931, 12, 593). The fixture is INVENTED (fixtures/spectra/generate.ts):
 * bands made in F(R) at invented Dq and B, turned into %R.
 */

describe('kubelkaMunk', () => {
  it('gives the closed form F(R) = (1 − R)²/2R: 0 at R = 1, 1/4 at R = 1/2, 4.05 at R = 0.1', () => {
    expect(kubelkaMunk(1)).toBe(0);
    expectClose(kubelkaMunk(0.5), 0.25);
    expectClose(kubelkaMunk(0.1), 4.05);
  });

  it('reflectanceOfKubelkaMunk inverts it', () => {
    for (const r of [0.01, 0.2, 0.5, 0.93, 1])
      expectClose(reflectanceOfKubelkaMunk(kubelkaMunk(r)), r, 1e-12, 1e-12);
  });
});

describe('reflectance units', () => {
  it.each([
    ['%R', 'reflectance-percent'],
    ['R (%)', 'reflectance-percent'],
    ['Reflectance (%)', 'reflectance-percent'],
    ['% Reflectance', 'reflectance-percent'],
    ['F(R)', 'kubelka-munk'],
    ['Kubelka-Munk', 'kubelka-munk'],
  ])('yUnitFromLabel reads "%s" as %s', (label, unit) => {
    expect(yUnitFromLabel(label)).toBe(unit);
  });

  it('parseYUnit takes %R, R and F(R)', () => {
    expect(parseYUnit('%R')).toBe('reflectance-percent');
    expect(parseYUnit('R')).toBe('reflectance');
    expect(parseYUnit('F(R)')).toBe('kubelka-munk');
  });

  it('absorptionSpectrum turns %R into F(R) and says so', () => {
    const raw = parseSpectrumText('nm,%R\n500,50\n600,100\n700,10\n');
    const s = absorptionSpectrum(raw);
    expect(s.quantity).toBe('kubelka-munk');
    expect([...s.value]).toEqual([kubelkaMunk(0.1), 0, kubelkaMunk(0.5)]);
    expect(s.conversions.join()).toMatch(/F\(R\) = \(1 − R\)²\/\(2R\)/);
  });

  it('absorptionSpectrum refuses a reflectance of 0 or above 100 % naming the line, and c and l with reflectance', () => {
    expect(() => absorptionSpectrum(parseSpectrumText('nm,%R\n500,50\n600,101.5\n'))).toThrow(
      /^line 3: reflectance 101.5 %: expected a value above 0 and at most 100 %/,
    );
    expect(() =>
      absorptionSpectrum(parseSpectrumText('nm,y\n500,0\n600,0.5\n'), { yUnit: 'reflectance' }),
    ).toThrow(/line 2: reflectance 0: expected a value above 0/);
    expect(() =>
      absorptionSpectrum(parseSpectrumText('nm,%R\n500,50\n600,60\n'), { concentration: 1, pathLength: 1 }),
    ).toThrow(/Kubelka–Munk F\(R\) of a reflectance: concentration and path length apply to absorbance only/);
  });
});

describe('analyseSpectrum of the invented Cr(III)-doped oxide reflectance spectrum', () => {
  const demo = REFLECTANCE_SPECTRUM;
  const text = readFileSync(resolve(__dirname, '../../fixtures/spectra', demo.file), 'utf8');
  const ion = findIon(demo.ion);
  const r = analyseSpectrum(text, {
    fileName: demo.file,
    baseline: 'linear',
    includeChargeTransfer: false,
    fit: {
      n: ion.n,
      geometry: 'oct',
      ion,
      ratio: { cOverB: freeIonRatio(ion) ?? 4.5, origin: 'free ion' },
      includeSpinForbidden: false,
    },
  });

  it('is marked invented in its header', () => {
    expect(text.split('\n')[0]).toMatch(/INVENTED/);
  });

  it('fits Dq and B within 3 % of the invented values by default', () => {
    const best = r.fit && 'result' in r.fit ? r.fit.result.solutions[0] : undefined;
    expectClose(best?.dq, demo.dq, 0.03);
    expectClose(best?.B, demo.B, 0.03);
  });

  it('classes bands by relative height only: no ε range, no oscillator strength, no "intense" flag, and the caution says so', () => {
    expect(r.spectrum.quantity).toBe('kubelka-munk');
    for (const b of r.analysis.bands) {
      expect(b.intensityRange).toBeUndefined();
      expect(b.oscillatorStrength).toBeUndefined();
      expect(b.flags).not.toContain('intense');
    }
    expect(r.cautions).toContain(KUBELKA_MUNK_CAUTION);
    expect(KUBELKA_MUNK_CAUTION).toMatch(/ε is not known/);
  });
});
