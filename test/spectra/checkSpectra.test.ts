import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CHECK_SPECTRA, type DemoSpectrum } from '../../fixtures/spectra/generate.js';
import { findIon, freeIonRatio } from '../../src/index.js';
import {
  analyseSpectrum,
  type SpectrumAnalysis,
  type SpectrumFitRequest,
} from '../../src/spectra/spectrumAnalysis.js';
import { expectClose } from '../helpers.js';

/**
 * The default spectrum analysis of the invented check spectra (fixtures/spectra/generate.ts):
 * each is built from invented Dq and B, so the fit must give them back. "Within a few %" is 3 %
 * here: the band centres carry the noise and the overlap of their neighbours.
 */

const spec = (file: string) => CHECK_SPECTRA.find((d) => d.file === file) as DemoSpectrum;
const text = (demo: DemoSpectrum) =>
  readFileSync(resolve(__dirname, '../../fixtures/spectra', demo.file), 'utf8');

function request(demo: DemoSpectrum, more: Partial<SpectrumFitRequest> = {}): SpectrumFitRequest {
  const ion = findIon(demo.ion);
  return {
    n: ion.n,
    geometry: demo.geometry,
    ion,
    ratio: { cOverB: freeIonRatio(ion) ?? 4.5, origin: 'free ion' },
    includeSpinForbidden: false,
    ...more,
  };
}

/** The analysis with default options, ε from the cell the file names (when it has one). */
function analyse(
  demo: DemoSpectrum,
  more: Partial<SpectrumFitRequest> = {},
  withCell = true,
): SpectrumAnalysis {
  return analyseSpectrum(text(demo), {
    fileName: demo.file,
    baseline: 'linear',
    includeChargeTransfer: false,
    ...(demo.cell && withCell
      ? { concentration: demo.cell.concentration, pathLength: demo.cell.pathLength }
      : {}),
    fit: request(demo, more),
  });
}

const cache = new Map<string, SpectrumAnalysis>();
function analysed(file: string): SpectrumAnalysis {
  const hit = cache.get(file);
  if (hit) return hit;
  const r = analyse(spec(file));
  cache.set(file, r);
  return r;
}

function fitOf(r: SpectrumAnalysis) {
  if (!r.fit || !('result' in r.fit)) throw new Error(`no fit: ${JSON.stringify(r.fit)}`);
  return r.fit;
}

function expectRecovered(r: SpectrumAnalysis, demo: DemoSpectrum): void {
  const best = fitOf(r).result.solutions[0];
  expectClose(best?.dq, demo.dq, 0.03);
  expectClose(best?.B, demo.B, 0.03);
}

const bandsAt = (r: SpectrumAnalysis, label: string) => r.transitions.find((t) => t.label === label)?.bands;

describe('analyseSpectrum on the invented check spectra, default options', () => {
  it('tetrahedral [Co(qel)4]2−: ν₃ with ε ≈ 900 is a d–d band, its spin–orbit triplet is merged at the centroid, Dq and B recovered', () => {
    const demo = spec('co-qel4-epsilon-wavenumber.csv');
    const r = analysed(demo.file);
    const triplet = r.analysis.bands.filter((b) => b.center > 14000 && b.center < 16000);
    expect(triplet).toHaveLength(3);
    expect(triplet.every((b) => !b.chargeTransfer && b.intensityRange === 'non-centrosymmetric d–d')).toBe(
      true,
    );
    expect(r.analysis.bands[0]?.intensityRange).toBe('non-centrosymmetric d–d');
    const fit = fitOf(r);
    expect(fit.leftOut).toEqual([]);
    expect(fit.members).toEqual([[1], [2, 3, 4]]);
    expect(fit.result.merges[0]?.reason).toMatch(/spin–orbit/);
    expectRecovered(r, demo);
    expect(fit.result.solutions[0]?.assignments.map((a) => a.label)).toEqual(['4T1(F)', '4T1(P)']);
    expect(bandsAt(r, '4T1(P)')).toEqual([2, 3, 4]);
  });

  it('high-spin [Mn(pld)6]2+: every weak band, the sharp ⁴A₁g/⁴Eg(G) one included, is fitted as a ΔS = 1 band from ⁶A₁g', () => {
    const demo = spec('mn-pld6-absorbance-nm.csv');
    const r = analysed(demo.file);
    const fit = fitOf(r);
    expect(r.ligandField.map((b) => b.number)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(fit.used).toEqual([1, 2, 3, 4, 5, 6]);
    expect(fit.leftOut).toEqual([]);
    expect(fit.result.solutions[0]?.ground).toBe('6A1g');
    expectRecovered(r, demo);
    // ⁴A₁g and ⁴Eg(G) are degenerate in a cubic field: both are marked with the sharp band.
    expect(bandsAt(r, '4A1g')).toEqual([3]);
    expect(bandsAt(r, '4Eg(G)')).toEqual([3]);
  });

  it('octahedral [Co(mz)6]2+: the weak two-electron ⁴A₂g band is found and kept apart, the ν₃ shoulder merged', () => {
    const demo = spec('co-mz6-absorbance-nm.csv');
    const r = analysed(demo.file);
    const weak = r.analysis.bands.find((b) => Math.abs(b.center - 15926) < 300);
    expect(weak?.height).toBeLessThan(0.5);
    const fit = fitOf(r);
    expect(fit.members).toEqual([[1], [2], [3, 4]]);
    expectRecovered(r, demo);
    expect(bandsAt(r, '4A2g')).toEqual([weak?.number]);
  });

  it('octahedral [Cr(vor)6]3+: ν₃ above 30 000 cm⁻¹ with ε 30 is a d–d band, not charge transfer', () => {
    const demo = spec('cr-vor6-absorbance-nm.csv');
    const r = analysed(demo.file);
    const nu3 = r.analysis.bands.find((b) => Math.abs(b.center - 35200) < 300);
    expect(nu3?.flags).toContain('high-energy');
    expect(nu3?.chargeTransfer).toBe(false);
    expect(fitOf(r).used).toContain(nu3?.number);
    expectRecovered(r, demo);
    expect(r.analysis.bands.at(-1)?.chargeTransfer).toBe(true);
  });

  it('octahedral [Cr(vor)6]3+ in absorbance: ν₃ is taken in because it lies at the predicted ⁴T₁g(P), and said so', () => {
    const demo = spec('cr-vor6-absorbance-nm.csv');
    const r = analyse(demo, {}, false);
    const nu3 = r.analysis.bands.find((b) => Math.abs(b.center - 35200) < 300);
    expect(nu3?.chargeTransfer).toBe(true);
    const fit = fitOf(r);
    expect(fit.adopted).toEqual([nu3?.number]);
    expect(r.ligandField).toContain(nu3);
    expectRecovered(r, demo);
    expect(r.cautions.some((c) => /predicted from the other bands/.test(c))).toBe(true);
    expect(r.cautions.some((c) => /give the concentration and the path length/.test(c))).toBe(true);
  });
});

describe('analyseSpectrum with the demo [Cr(mz)6]3+ spectrum', () => {
  it('matches the sharp ²Eg and ²T₁g bands to their levels instead of dropping them, and names the settings it is given', () => {
    const text = readFileSync(resolve(__dirname, '../../fixtures/spectra/cr-mz6-absorbance-nm.csv'), 'utf8');
    const ion = findIon('Cr3+');
    const r = analyseSpectrum(text, {
      baseline: 'linear',
      includeChargeTransfer: false,
      names: { concentrationAndPath: 'the fields conc and path' },
      fit: {
        n: 3,
        geometry: 'oct',
        ion,
        ratio: { cOverB: freeIonRatio(ion) ?? 4.5, origin: 'free ion' },
        includeSpinForbidden: false,
      },
    });
    const fit = fitOf(r);
    expect(fit.leftOut).toEqual([1, 2]);
    expect(fit.result.solutions[0]?.sharp.map((m) => m.label)).toEqual(['2Eg(G)', '2T1g(G)']);
    expect(bandsAt(r, '2Eg(G)')).toEqual([1]);
    expect(bandsAt(r, '2T1g(G)')).toEqual([2]);
    expect(r.cautions.some((c) => c.includes('give the fields conc and path'))).toBe(true);
    expect(r.cautions.join(' ')).not.toMatch(/--conc|Mössbauer/);
  });
});
