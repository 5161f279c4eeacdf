import { describe, expect, it } from 'vitest';
import { solveDistorted } from '../../src/field/distortedComplex.js';
import { presetLigands } from '../../src/field/geometries.js';
import { fitDistorted } from '../../src/fit/distortedFit.js';
import { expectClose } from '../helpers.js';

describe('fitDistorted: tetragonal parameters', () => {
  it('fitDistorted(d9, Dq, Ds, Dt) meets the closed forms 2B2g = 10Dq, 2A1g = 4Ds + 5Dt, 2Eg = 10Dq + 3Ds − 5Dt (Hathaway & Billing, Coord. Chem. Rev. 5, 143, 1970; Lever 1984)', () => {
    // Band energies chosen to exercise the closed forms, not a measured spectrum.
    const [b2g, a1g, eg] = [12500, 9000, 15500];
    const dq = b2g / 10;
    // 4Ds + 5Dt = a1g and 3Ds − 5Dt = eg − 10Dq give Ds and Dt.
    const ds = (a1g + eg - b2g) / 7;
    const dt = (a1g - 4 * ds) / 5;
    const fit = fitDistorted({
      n: 9,
      field: { kind: 'tetragonal', dq: 1000, ds: 500, dt: 200 },
      B: 0,
      C: 0,
      free: ['dq', 'ds', 'dt'],
      bands: [
        { energy: b2g, level: '2B2g' },
        { energy: a1g, level: '2A1g' },
        { energy: eg, level: '2Eg' },
      ],
    });
    expect(fit.group).toBe('D4h');
    expectClose(fit.parameters.dq, dq, 1e-7);
    expectClose(fit.parameters.ds, ds, 1e-7);
    expectClose(fit.parameters.dt, dt, 1e-7);
    expect(fit.warnings.map((w) => w.code)).toContain('exact');
  });

  it('fitDistorted recovers the AOM parameters and B of a trans-MA4B2 d3 ion from its own quartet bands', () => {
    const ligands = presetLigands('trans-MA4B2');
    const truth = { A: { eSigma: 7200, ePi: 1300 }, B: { eSigma: 5600, ePi: 600 } };
    const levels = solveDistorted({
      n: 3,
      B: 650,
      C: 2900,
      field: { kind: 'aom', ligands, parameters: truth },
    });
    const quartets = levels.levels.filter((l) => l.S === 1.5 && l.energy > 0).slice(0, 4);
    const fit = fitDistorted({
      n: 3,
      field: {
        kind: 'aom',
        ligands,
        parameters: { A: { eSigma: 7000, ePi: 1300 }, B: { eSigma: 5000, ePi: 600 } },
      },
      B: 700,
      C: 3123,
      free: ['eSigma(A)', 'eSigma(B)', 'B'],
      bands: quartets.map((l) => ({ energy: l.energy, level: l.label })),
    });
    expectClose(fit.parameters['eSigma(A)'], 7200, 1e-6);
    expectClose(fit.parameters['eSigma(B)'], 5600, 1e-6);
    expectClose(fit.B, 650, 1e-6);
    expect(fit.rms).toBeLessThan(1e-3);
  });
});

describe('fitDistorted: parameters held', () => {
  it('fitDistorted keeps a held e_ds and anisotropic π of the start in the fitted field', () => {
    const ligands = presetLigands('square-plane');
    const fit = fitDistorted({
      n: 9,
      field: { kind: 'aom', ligands, parameters: { L: { eSigma: 5000, ePiX: 900, ePiY: 1000 } }, eDs: 1400 },
      B: 0,
      C: 0,
      free: ['eSigma(L)'],
      bands: [{ energy: 12600, level: '2B2g' }],
    });
    expect(fit.field.kind === 'aom' && fit.field.eDs).toBe(1400);
    expect(fit.parameters['ePiX(L)']).toBe(900);
    // 2B2g: hole from x²−y² (3eσ) to xy (4eπ across the bond–z plane).
    expectClose(fit.parameters['eSigma(L)'], (12600 + 4000) / 3, 1e-7);
  });
});

describe('fitDistorted: warnings when the bands cannot fix the parameters', () => {
  it('fitDistorted warns "underdetermined" with more free parameters than bands', () => {
    const fit = fitDistorted({
      n: 3,
      field: {
        kind: 'aom',
        ligands: presetLigands('trans-MA4B2'),
        parameters: { A: { eSigma: 7000, ePi: 1000 }, B: { eSigma: 6000, ePi: 800 } },
      },
      B: 700,
      C: 3000,
      free: ['eSigma(A)', 'ePi(A)', 'eSigma(B)', 'ePi(B)', 'B'],
      bands: [{ energy: 17000 }, { energy: 19000 }],
    });
    expect(fit.warnings.map((w) => w.code)).toEqual(
      expect.arrayContaining(['underdetermined', 'assigned-by-order']),
    );
  });

  it('fitDistorted names eσ and eπ of an octahedron as a combination its bands do not fix (only 3eσ − 4eπ counts)', () => {
    const fit = fitDistorted({
      n: 3,
      field: {
        kind: 'aom',
        ligands: presetLigands('octahedron'),
        parameters: { L: { eSigma: 7000, ePi: 1000 } },
      },
      B: 700,
      C: 3000,
      free: ['eSigma(L)', 'ePi(L)'],
      bands: [
        { energy: 17400, level: '4T2g' },
        { energy: 24600, level: '4T1g(1)' },
      ],
    });
    const w = fit.warnings.find((x) => x.code === 'undetermined-combination');
    expect(w?.message).toMatch(/eSigma\(L\).*ePi\(L\)/);
    expect(fit.errors['eSigma(L)']).toBeNull();
  });
});
