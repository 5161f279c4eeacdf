import { describe, expect, it } from 'vitest';
import { fitBandsOf, multipletComponents, sharpBands } from '../../src/spectra/bandClasses.js';
import type { FoundBand } from '../../src/spectra/bandFinding.js';
import { findBands } from '../../src/spectra/bandFinding.js';
import { intensityRange } from '../../src/spectra/bandIntensity.js';
import { syntheticSpectrum } from '../../src/spectra/gaussianBands.js';

/** A found band with what the classes look at; the rest is filler. */
function band(number: number, center: number, fwhm: number, height: number): FoundBand {
  return {
    number,
    center,
    fwhm,
    height,
    centerSigma: 5,
    fwhmSigma: 10,
    heightSigma: 0.01,
    area: height * fwhm * 1.0645,
    areaSigma: 0,
    flags: fwhm < 1000 ? ['narrow'] : [],
    chargeTransfer: false,
  };
}

describe('intensityRange by geometry (Lever 1984, from memory; cut-offs common practice)', () => {
  it('calls a tetrahedral band of ε 80 non-centrosymmetric d–d, and an octahedral one centrosymmetric', () => {
    expect(intensityRange(80, 'tet')).toBe('non-centrosymmetric d–d');
    expect(intensityRange(80, 'oct')).toBe('centrosymmetric d–d');
    expect(intensityRange(80)).toBe('centrosymmetric d–d');
  });

  it('keeps a tetrahedral ν₃ of ε 1000 a d–d band; octahedral ε 1000 is charge transfer', () => {
    expect(intensityRange(1000, 'tet')).toBe('non-centrosymmetric d–d');
    expect(intensityRange(1000, 'oct')).toBe('charge transfer');
    expect(intensityRange(8000, 'tet')).toBe('charge transfer');
  });

  it('puts tetrahedral bands below ε 10 in the spin-forbidden range', () => {
    expect(intensityRange(5, 'tet')).toBe('spin-forbidden');
    expect(intensityRange(5, 'oct')).toBe('centrosymmetric d–d');
  });
});

describe('band classes for the fit', () => {
  // The ν₃ spin–orbit triplet of a tetrahedral Co(II), and the ²Eg/²T₁g pair of a Cr(III).
  const triplet = [band(2, 14450, 750, 650), band(3, 15060, 750, 900), band(4, 15660, 750, 650)];
  const crPair = [band(1, 14030, 320, 1), band(2, 14630, 360, 0.8)];

  it('multipletComponents takes overlapping narrow components with a broad envelope as one split band', () => {
    expect([...multipletComponents(triplet)].map((b) => b.number)).toEqual([2, 3, 4]);
    expect(multipletComponents(crPair).size).toBe(0);
  });

  it('sharpBands marks weak narrow bands that stand alone, not multiplet components nor intense ones', () => {
    const options = { n: 3, geometry: 'oct' as const, includeSpinForbidden: false };
    expect([...sharpBands(crPair, 'epsilon', options)].map((b) => b.number)).toEqual([1, 2]);
    expect(sharpBands(triplet, 'epsilon', { ...options, n: 7, geometry: 'tet' }).size).toBe(0);
    expect(sharpBands([band(1, 20000, 500, 60)], 'epsilon', options).size).toBe(0);
    expect(sharpBands(crPair, 'epsilon', { ...options, includeSpinForbidden: true }).size).toBe(0);
  });

  it('sharpBands sets nothing aside for d5 unless it is said to be low-spin: high-spin d5 bands are all ΔS = 1', () => {
    const mn = [band(1, 12800, 2000, 0.025), band(2, 19120, 350, 0.05)];
    const options = { n: 5, geometry: 'oct' as const, includeSpinForbidden: false };
    expect(sharpBands(mn, 'epsilon', options).size).toBe(0);
    expect(sharpBands(mn, 'epsilon', { ...options, spinState: 'low' }).size).toBe(1);
  });

  it('fitBandsOf passes width, ε only when y is ε, and σ = fit ⊕ 5 % of FWHM', () => {
    const [a] = fitBandsOf([band(1, 17400, 3000, 13)], 'epsilon', {
      n: 3,
      geometry: 'oct',
      includeSpinForbidden: false,
    });
    expect(a).toEqual({ energy: 17400, sigma: Math.hypot(5, 150), width: 3000, epsilon: 13 });
    const [b] = fitBandsOf([band(1, 17400, 3000, 0.3)], 'absorbance', {
      n: 3,
      geometry: 'oct',
      includeSpinForbidden: false,
    });
    expect(b?.epsilon).toBeUndefined();
  });
});

describe('findBands judges intensity by the geometry it is given', () => {
  // ν₂ and ν₃ of a tetrahedral Co(II) such as [Co(NCS)4]2− (ε of ν₃ ≈ 1500–2000; Lever 1984,
  // from memory), and an octahedral-like ν₃ above 30 000 cm⁻¹ with ε 30.
  const x = Float64Array.from({ length: 1300 }, (_, i) => 5000 + 25 * i);
  const y = syntheticSpectrum(
    [
      { center: 8000, height: 100, fwhm: 2500 },
      { center: 16000, height: 1500, fwhm: 2500 },
      { center: 34800, height: 30, fwhm: 3500 },
    ],
    x,
    { noise: 0.3, seed: 5 },
  );
  const spectrum = { wavenumber: x, value: y, quantity: 'epsilon' as const };
  let plainRun: ReturnType<typeof findBands> | undefined;
  const plain = () => {
    plainRun ??= findBands(spectrum);
    return plainRun;
  };

  it('a tetrahedral ν₃ of ε 1500 is a d–d band, not charge transfer; without a geometry it is', () => {
    const tet = findBands(spectrum, { geometry: 'tet' }).bands.find((b) => Math.abs(b.center - 16000) < 100);
    expect(tet?.chargeTransfer).toBe(false);
    expect(tet?.intensityRange).toBe('non-centrosymmetric d–d');
    const nu3 = plain().bands.find((b) => Math.abs(b.center - 16000) < 100);
    expect(nu3?.flags).toContain('intense');
    expect(nu3?.chargeTransfer).toBe(true);
  });

  it('a band at 34 800 cm⁻¹ with ε 30 is high in energy but not charge transfer, its ε being known', () => {
    const high = plain().bands.find((b) => Math.abs(b.center - 34800) < 200);
    expect(high?.flags).toContain('high-energy');
    expect(high?.chargeTransfer).toBe(false);
  });
});
