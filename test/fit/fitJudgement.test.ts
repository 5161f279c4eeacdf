import { describe, expect, it } from 'vitest';
import { findIon, fitBands } from '../../src/index.js';

const bands = (...energies: number[]) => energies.map((energy) => ({ energy }));
const codes = (warnings: readonly { code: string }[]) => warnings.map((w) => w.code);
const fitIon = (ion: string, energies: number[], more: Partial<Parameters<typeof fitBands>[0]> = {}) => {
  const free = findIon(ion);
  return fitBands({ n: free.n, bands: bands(...energies), freeIon: free, ...more });
};

describe('fitBands keeps parameters inside the optimiser', () => {
  it('fits [Co(H2O)6]2+ 8100, 19400 cm⁻¹ without an assignment: no bound reaches the user, Dq 921, B 828 (Lever 1984, from memory)', () => {
    const best = fitIon('Co2+', [8100, 19400]).solutions[0];
    expect(best?.assignments.map((a) => a.label)).toEqual(['4T2g', '4T1g(P)']);
    expect(best?.dq).toBeCloseTo(921.6, 0);
    expect(best?.B).toBeCloseTo(828, -1);
  });
});

describe('fitBands ranks by chemistry as well as residuals', () => {
  it('ranks ⁴T₂g + ⁴T₁g(P) of Co2+ 9000, 20000 first: ⁴A₂g is a two-electron jump and scores worse', () => {
    const r = fitIon('Co2+', [9000, 20000]);
    expect(r.solutions[0]?.assignments[0]?.label).toBe('4T2g');
    const other = r.solutions.find((s) => s.assignments[0]?.label === '4A2g');
    expect(other?.score.twoElectron).toBe(1);
    expect(other?.predicted.find((p) => p.label === '4A2g')?.twoElectron).toBe(true);
  });

  it('gives the score and its parts with every solution; parts add up to the total', () => {
    for (const s of fitIon('V3+', [17800, 25700]).solutions) {
      const { total, residual, beta, twoElectron, unobserved, intensity } = s.score;
      expect(total).toBeCloseTo(residual + beta + twoElectron + unobserved + intensity, 9);
    }
  });

  it('scores a β far above 1 (V3+ ³A₂g, ³T₁g(P)) by its distance from the plausibility window', () => {
    const s = fitIon('V3+', [17800, 25700]).solutions.find((x) => (x.beta ?? 0) > 1);
    expect(s?.score.beta).toBeCloseTo(((s?.beta ?? 0) - 1) ** 2 / 0.05 ** 2, 6);
  });

  it('fits tetrahedral [CoCl4]2− 5500, 14700 as ν₂, ν₃: ν₁ below 5000 cm⁻¹ is not missed, a ⁴T₁(F) between the bands would be', () => {
    const r = fitBands({ n: 7, geometry: 'tet', bands: bands(5500, 14700), freeIon: findIon('Co2+') });
    expect(r.solutions[0]?.assignments.map((a) => a.label)).toEqual(['4T1(F)', '4T1(P)']);
    expect(r.solutions.find((s) => s.assignments[0]?.label === '4T2')?.score.unobserved).toBe(4);
  });

  it('uses ε where given: a band with the ε of a spin-forbidden one costs when assigned spin-allowed', () => {
    const r = fitBands({
      n: 3,
      bands: [
        { energy: 17400, epsilon: 13 },
        { energy: 24600, epsilon: 0.2 },
      ],
      freeIon: findIon('Cr3+'),
    });
    expect(r.solutions[0]?.score.intensity).toBe(2);
  });
});

describe('fitBands ground-spin hypotheses', () => {
  it('fits the spin-forbidden bands of [Mn(H2O)6]2+ by default as high-spin, C fitted, and lists the best low-spin solution too', () => {
    const r = fitIon('Mn2+', [18900, 23100, 24950, 27950, 29700]);
    expect(r.solutions[0]?.ground).toBe('6A1g');
    expect(r.solutions[0]?.cFitted).toBe(true);
    expect(r.cChoice).toBe('bands-determine-it');
    expect(codes(r.warnings)).toContain('c-fitted');
    expect(r.hypotheses.map((h) => [h.kind, h.transitions])).toEqual([
      ['high', 'spin-forbidden'],
      ['low', 'spin-allowed'],
    ]);
    expect(r.solutions.some((s) => s.spin === 0.5)).toBe(true);
    // ⁴A₁g and ⁴Eg(G) are degenerate in a cubic field: both explain the 24950 band.
    const pair = r.solutions[0]?.predicted.filter((p) => p.label === '4A1g' || p.label === '4Eg(G)');
    expect(pair?.map((p) => p.band)).toEqual([2, 2]);
  });

  it('fits only low-spin [Co(NH3)6]3+ and says why there is no high-spin solution, with no Jahn–Teller pair warning', () => {
    const r = fitIon('Co3+', [21000, 29500]);
    expect(r.hypotheses.find((h) => h.kind === 'high')?.note).toMatch(
      /cannot all be spin-allowed transitions from 5T2g/,
    );
    expect(codes(r.warnings)).not.toContain('jahn-teller-pair');
  });
});

describe('fitBands merging of band components', () => {
  it('merges the Jahn–Teller pair of [Ti(H2O)6]3+ (17400, 20300) and takes Dq from the centroid, with the reason', () => {
    const r = fitIon('Ti3+', [17400, 20300]);
    expect(r.bands).toHaveLength(1);
    expect(r.solutions[0]?.dq).toBeCloseTo(1885, 6);
    expect(r.warnings.find((w) => w.code === 'merged-bands')?.message).toMatch(/Jahn–Teller pair.*centroid/);
  });

  it('merges the spin–orbit triplet of tetrahedral Co(II) ν₃ at its ε-weighted centroid', () => {
    const r = fitBands({
      n: 7,
      geometry: 'tet',
      bands: [
        { energy: 5500, epsilon: 60 },
        { energy: 14200, epsilon: 500 },
        { energy: 14700, epsilon: 600 },
        { energy: 15300, epsilon: 400 },
      ],
      freeIon: findIon('Co2+'),
    });
    expect(r.merges[0]?.members).toEqual([1, 2, 3]);
    expect(r.merges[0]?.centroid).toBeCloseTo((14200 * 500 + 14700 * 600 + 15300 * 400) / 1500, 6);
    expect(r.merges[0]?.reason).toMatch(/spin–orbit/);
  });

  it('merges the shoulder on ν₃ of [Co(H2O)6]2+ and keeps bands apart on request', () => {
    expect(fitIon('Co2+', [8100, 19400, 21550]).merges).toHaveLength(1);
    expect(fitIon('Co2+', [8100, 19400, 21550], { merge: false }).merges).toHaveLength(0);
  });
});

describe('fitBands sharp bands', () => {
  it('matches a sharp band of [Cr(H2O)6]3+ to the nearest of ²Eg, ²T₁g without fitting it, and marks it observed', () => {
    const r = fitBands({
      n: 3,
      bands: [{ energy: 17400 }, { energy: 24600 }, { energy: 15000, sharp: true }],
      freeIon: findIon('Cr3+'),
    });
    const best = r.solutions[0];
    expect(best?.dq).toBeCloseTo(1740, 6);
    const label = best?.sharp[0]?.label ?? '';
    expect(['2Eg(G)', '2T1g(G)']).toContain(label);
    expect(best?.predicted.find((p) => p.label === label)?.band).toBe(2);
    expect(best?.assignments).toHaveLength(2);
  });
});

describe('fitBands advice names the right element and geometry', () => {
  it('suggests Mössbauer spectroscopy only for iron', () => {
    const text = (r: ReturnType<typeof fitBands>) =>
      [...r.warnings, ...r.solutions.flatMap((s) => s.warnings)].map((w) => w.message).join(' ');
    expect(text(fitIon('Co3+', [21000, 29500]))).not.toMatch(/Mössbauer/);
    expect(text(fitIon('Mn2+', [18900, 23100, 24950, 27950, 29700]))).not.toMatch(/Mössbauer/);
    expect(text(fitIon('Fe2+', [10400], { fixedB: 800 }))).toMatch(/⁵⁷Fe Mössbauer/);
  });

  it('gives no spin-state caution for tetrahedral d7, which has no spin choice at real fields', () => {
    const r = fitBands({ n: 7, geometry: 'tet', bands: bands(5500, 14700), freeIon: findIon('Co2+') });
    expect(codes(r.solutions[0]?.warnings ?? [])).not.toContain('spin-state');
  });
});
