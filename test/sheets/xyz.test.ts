import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { solveDistorted } from '../../src/field/distortedComplex.js';
import { coordinationSphere, parseXyz } from '../../src/sheets/xyz.js';

/** Invented coordinates of a trans-dichloro tetraaqua ion with a few hydrogens (demo data, not a measured structure). */
const TRANS = `9
invented trans-[M(H2O)4Cl2] for the tests
Cr   0.000  0.000  0.000
O    1.980  0.000  0.000
O   -1.980  0.000  0.000
O    0.000  1.980  0.000
O    0.000 -1.980  0.000
Cl   0.000  0.000  2.300
Cl   0.000  0.000 -2.300
H    2.560  0.780  0.000
H    2.560 -0.780  0.000
`;

describe('parseXyz and coordinationSphere', () => {
  it('parseXyz reads the count, comment and atoms; coordinationSphere keeps the donors by distance', () => {
    const s = parseXyz(TRANS);
    expect(s.atoms).toHaveLength(9);
    expect(s.comment).toContain('invented');
    const sphere = coordinationSphere(s, { cutoff: 2.5 });
    expect(sphere.metal.element).toBe('Cr');
    expect(sphere.ligands.map((l) => l.kind).sort()).toEqual(['Cl', 'Cl', 'O', 'O', 'O', 'O']);
    // The default shell, 1.25 × 1.98 Å, leaves the chlorides (2.30 Å) in and the hydrogens out.
    expect(coordinationSphere(s).ligands).toHaveLength(6);
    expect(coordinationSphere(s, { metal: 'cr' }).metal.line).toBe(3);
  });

  it('solveDistorted finds D4h for the XYZ ligands, with the chlorides as their own kind', () => {
    const { ligands } = coordinationSphere(parseXyz(TRANS));
    const r = solveDistorted({
      n: 3,
      B: 700,
      C: 3000,
      field: {
        kind: 'aom',
        ligands,
        parameters: { O: { eSigma: 7000, ePi: 1200 }, Cl: { eSigma: 5500, ePi: 1000 } },
      },
    });
    expect(r.group).toBe('D4h');
    expect(r.ground.label).toBe('4B1g');
  });

  it('solveDistorted with a loose symmetry tolerance idealises slightly uneven coordinates to D4h; the default finds C1', () => {
    const uneven = TRANS.replace('O    1.980  0.000  0.000', 'O    1.990  0.012  0.000').replace(
      'Cl   0.000  0.000  2.300',
      'Cl   0.010  0.000  2.310',
    );
    const { ligands } = coordinationSphere(parseXyz(uneven));
    const parameters = { O: { eSigma: 7000, ePi: 1200 }, Cl: { eSigma: 5500, ePi: 1000 } };
    const strict = solveDistorted({ n: 3, B: 700, C: 3000, field: { kind: 'aom', ligands, parameters } });
    expect(strict.group).toBe('C1');
    const loose = solveDistorted({
      n: 3,
      B: 700,
      C: 3000,
      field: { kind: 'aom', ligands, parameters, symmetryTolerance: 0.02 },
    });
    expect(loose.group).toBe('D4h');
    expect(loose.ground.label).toBe('4B1g');
  });

  it('parseXyz and coordinationSphere refuse a bad count, a bad atom line and an absent metal with one line each', () => {
    expect(() => parseXyz('x\n\nCr 0 0 0')).toThrow(/line 1 "x": expected the number of atoms/);
    expect(() => parseXyz('2\n\nCr 0 0 0\nO 1 0')).toThrow(
      /line 4 "O 1 0": expected an element symbol and three coordinates/,
    );
    expect(() => coordinationSphere(parseXyz(TRANS), { metal: 'Ni' })).toThrow(InputError);
  });
});
