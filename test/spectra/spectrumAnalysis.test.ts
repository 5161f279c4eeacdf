import { describe, expect, it } from 'vitest';
import { findIon } from '../../src/index.js';
import { syntheticSpectrum } from '../../src/spectra/gaussianBands.js';
import { analyseSpectrum } from '../../src/spectra/spectrumAnalysis.js';

// [Cr(H2O)6]3+: spin-allowed bands at 17 400 (4T2g) and 24 600 cm⁻¹ (4T1g(F)); for octahedral d3
// the first band is 10Dq itself. A. B. P. Lever, "Inorganic Electronic Spectroscopy", 2nd ed.,
// Elsevier, 1984, ch. 6 (from memory). The spectrum is built from these two bands.
const x = Float64Array.from({ length: 601 }, (_, i) => 10000 + 30 * i);
const y = syntheticSpectrum(
  [
    { center: 17400, height: 13, fwhm: 2600 },
    { center: 24600, height: 15, fwhm: 2800 },
  ],
  x,
  { noise: 0.05 },
);
const text = `cm-1;epsilon\n${Array.from(x, (v, i) => `${String(v).replace('.', ',')};${String(y[i]).replace('.', ',')}`).join('\n')}\n`;

describe('analyseSpectrum', () => {
  it('finds both bands of a semicolon/decimal-comma text and fits 10Dq = ν1 for Cr3+', () => {
    const ion = findIon('Cr3+');
    const r = analyseSpectrum(text, {
      baseline: 'linear',
      includeChargeTransfer: false,
      fit: {
        n: 3,
        geometry: 'oct',
        ion,
        ratio: { cOverB: 4.5, origin: 'given' },
        fitC: false,
        includeSpinForbidden: false,
      },
    });
    expect(r.ligandField.map((b) => Math.round(b.center / 100) * 100)).toEqual([17400, 24600]);
    expect(r.fit && 'result' in r.fit).toBe(true);
    const best = r.fit && 'result' in r.fit ? r.fit.result.solutions[0] : undefined;
    expect(best?.tenDq).toBeGreaterThan(17200);
    expect(best?.tenDq).toBeLessThan(17600);
    expect(r.transitions.length).toBeGreaterThan(0);
    expect(r.cautions.some((c) => /Gaussian components/.test(c))).toBe(true);
  });

  it('says what was found instead when no d–d band stands out', () => {
    const flat = `cm-1,epsilon\n${Array.from(x, (v) => `${v},0`).join('\n')}\n`;
    expect(() => analyseSpectrum(flat, { baseline: 'linear', includeChargeTransfer: false })).toThrow(
      /no d–d bands found/,
    );
  });

  it('says when a band set apart by its charge-transfer ε lies at a predicted d–d level, naming the setting that keeps it', () => {
    // The band maxima of [Cr(H2O)6]3+, ν₃ (⁴T₁g(P)) at about 37 800 cm⁻¹ (Lever 1984, from
    // memory), with invented ε: ν₃ at 1200, as when it borrows intensity from a charge-transfer band.
    const wide = Float64Array.from({ length: 1201 }, (_, i) => 10000 + 30 * i);
    const yy = syntheticSpectrum(
      [
        { center: 17400, height: 60, fwhm: 2600 },
        { center: 24600, height: 70, fwhm: 2800 },
        { center: 37800, height: 1200, fwhm: 3500 },
      ],
      wide,
      { noise: 0.05 },
    );
    const csv = `cm-1,epsilon\n${Array.from(wide, (v, i) => `${v},${yy[i]}`).join('\n')}\n`;
    const r = analyseSpectrum(csv, {
      baseline: 'linear',
      includeChargeTransfer: false,
      names: { concentrationAndPath: '-', includeChargeTransfer: '--include-ct' },
      fit: {
        n: 3,
        geometry: 'oct',
        ion: findIon('Cr3+'),
        ratio: { cOverB: 4.5, origin: 'given' },
        includeSpinForbidden: false,
      },
    });
    const intense = r.analysis.bands.find((b) => b.flags.includes('intense'));
    expect(r.ligandField).not.toContain(intense);
    expect(
      r.cautions.some((c) =>
        /has the ε of a charge-transfer band but lies at ⁴T₁g\(P\).*--include-ct fits it/.test(c),
      ),
    ).toBe(true);
  });
});
