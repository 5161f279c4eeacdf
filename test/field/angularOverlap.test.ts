import { describe, expect, it } from 'vitest';
import { aomField, dsMixingField, type Ligand } from '../../src/field/angularOverlap.js';
import {
  cubicField,
  tetragonalField,
  trigonalField,
  trigonalFrame,
  trigonalFromSplitting,
} from '../../src/field/axialFields.js';
import { octahedralFieldMatrix } from '../../src/field/crystalField.js';
import {
  apply3,
  axisRotation,
  compose3,
  fieldInComplexBasis,
  orbitalTransform,
  realToComplex,
  type Vec3,
} from '../../src/field/realOrbitals.js';
import { rotationOfShell } from '../../src/field/symmetry.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose } from '../helpers.js';

const AXES: Vec3[] = [
  [1, 0, 0],
  [-1, 0, 0],
  [0, 1, 0],
  [0, -1, 0],
  [0, 0, 1],
  [0, 0, -1],
];

function octahedron(kind = 'L'): Ligand[] {
  return AXES.map((direction) => ({ kind, direction }));
}

/** Eigenvalues of a 5×5 field, ascending. */
function orbitalEnergies(v: Float64Array): number[] {
  return [...symmetricEigen(Float64Array.from(v), 5).values];
}

/** Diagonal of a 5×5 field in the order xy, yz, z², xz, x²−y². */
function diagonal(v: Float64Array): number[] {
  return [0, 1, 2, 3, 4].map((i) => v[6 * i] ?? 0);
}

function traceless(values: number[]): number[] {
  const mean = values.reduce((s, x) => s + x, 0) / values.length;
  return values.map((x) => x - mean);
}

describe('realOrbitals: the real d orbitals against the |m⟩ basis', () => {
  it('fieldInComplexBasis(cubicField(1)) is the octahedral operator per unit Dq in |m⟩ (Ballhausen 1962, ch. 4)', () => {
    const complex = fieldInComplexBasis(cubicField(1));
    const reference = octahedralFieldMatrix();
    for (let a = 0; a < 5; a++) {
      for (let b = 0; b < 5; b++) {
        expectClose(complex[a]?.[b]?.re, reference[a]?.[b] ?? 0, 0, 1e-12);
        expectClose(complex[a]?.[b]?.im, 0, 0, 1e-12);
      }
    }
  });

  it('orbitalTransform(R) equals U†·D²(R)·U from the Wigner matrices for rotations about skew axes', () => {
    const u = realToComplex();
    for (const [axis, angle] of [
      [[1, 2, 3], 0.7],
      [[-0.3, 0.2, 1], 2.1],
      [[1, 1, 1], (2 * Math.PI) / 3],
    ] as [Vec3, number][]) {
      const r = axisRotation(axis, angle);
      const t = orbitalTransform(r);
      const d = rotationOfShell(2, r);
      for (let i = 0; i < 5; i++) {
        for (let j = 0; j < 5; j++) {
          // (U† D U)_{ij} = Σ conj(U_{a i}) D_{a b} U_{b j}
          let re = 0;
          let im = 0;
          for (let a = 0; a < 5; a++) {
            for (let b = 0; b < 5; b++) {
              const p = u[a]?.[i] ?? { re: 0, im: 0 };
              const q = d[a]?.[b] ?? { re: 0, im: 0 };
              const s = u[b]?.[j] ?? { re: 0, im: 0 };
              const qsRe = q.re * s.re - q.im * s.im;
              const qsIm = q.re * s.im + q.im * s.re;
              re += p.re * qsRe + p.im * qsIm;
              im += p.re * qsIm - p.im * qsRe;
            }
          }
          expectClose(t[5 * i + j], re, 0, 1e-12);
          expectClose(im, 0, 0, 1e-12);
        }
      }
    }
  });
});

describe('aomField: closed forms of the angular overlap model', () => {
  it('aomField(octahedron) puts t2g at 4eπ and eg at 3eσ, so 10Dq = 3eσ − 4eπ (Schäffer & Jørgensen, Mol. Phys. 9, 401, 1965)', () => {
    for (const [eSigma, ePi] of [
      [7000, 1500],
      [5000, -800],
    ] as const) {
      const v = aomField(octahedron(), { L: { eSigma, ePi } });
      const e = orbitalEnergies(v);
      for (const x of e.slice(0, 3)) expectClose(x, 4 * ePi, 1e-12, 1e-9);
      for (const x of e.slice(3)) expectClose(x, 3 * eSigma, 1e-12, 1e-9);
      expectClose((e[4] ?? 0) - (e[0] ?? 0), 3 * eSigma - 4 * ePi, 1e-12, 1e-9);
    }
  });

  it('aomField(tetrahedron) gives 10Dq = (4/3)eσ − (16/9)eπ, with e below t2 (Schäffer 1968; Larsen & La Mar, J. Chem. Educ. 51, 633, 1974)', () => {
    const s = 1 / Math.sqrt(3);
    const tet: Ligand[] = [
      [s, s, s],
      [-s, -s, s],
      [s, -s, -s],
      [-s, s, -s],
    ].map((d) => ({ kind: 'L', direction: d as unknown as Vec3 }));
    const eSigma = 4000;
    const ePi = 900;
    const e = orbitalEnergies(aomField(tet, { L: { eSigma, ePi } }));
    expectClose(e[0], (8 / 3) * ePi, 1e-12, 1e-9);
    expectClose(e[1], (8 / 3) * ePi, 1e-12, 1e-9);
    expectClose(e[4], (4 / 3) * eSigma + (8 / 9) * ePi, 1e-12, 1e-9);
    expectClose((e[2] ?? 0) - (e[0] ?? 0), (4 / 3) * eSigma - (16 / 9) * ePi, 1e-12, 1e-9);
  });

  it('aomField(square plane) orders x²−y² (3eσ) > z² (eσ) > xy (4eπ) > xz, yz (2eπ) for eσ > 4eπ (Larsen & La Mar 1974)', () => {
    const plane = octahedron().filter((l) => l.direction[2] === 0);
    const eSigma = 6000;
    const ePi = 1000;
    const d = diagonal(aomField(plane, { L: { eSigma, ePi } }));
    const [xy, yz, z2, xz, x2y2] = d;
    expectClose(x2y2, 3 * eSigma, 1e-12, 1e-9);
    expectClose(z2, eSigma, 1e-12, 1e-9);
    expectClose(xy, 4 * ePi, 1e-12, 1e-9);
    expectClose(xz, 2 * ePi, 1e-12, 1e-9);
    expectClose(yz, 2 * ePi, 1e-12, 1e-9);
  });

  it('aomField(square plane) with different π bonding in the two planes puts xz, yz at 2eπ(bond–z plane) and xy at 4eπ(in-plane) (Larsen & La Mar 1974)', () => {
    const plane = octahedron().filter((l) => l.direction[2] === 0);
    const [xy, yz, , xz] = diagonal(aomField(plane, { L: { eSigma: 6000, ePiX: 900, ePiY: 1000 } }));
    expectClose(xz, 1800, 1e-12, 1e-9);
    expectClose(yz, 1800, 1e-12, 1e-9);
    expectClose(xy, 4000, 1e-12, 1e-9);
  });

  it('aomField(trans-MA4B2) is the tetragonal field with 10Dq = 3eσ − 4eπ (equatorial), Ds = (2/7)(δσ + δπ), Dt = (2/35)(3δσ − 4δπ), δ = equatorial − axial (Lever, Inorganic Electronic Spectroscopy, 1984 — from memory)', () => {
    const ligands = octahedron().map((l) => ({ ...l, kind: l.direction[2] === 0 ? 'eq' : 'ax' }));
    const eq = { eSigma: 7200, ePi: 1100 };
    const ax = { eSigma: 4300, ePi: 300 };
    const aom = traceless(diagonal(aomField(ligands, { eq, ax })));
    const dSigma = eq.eSigma - ax.eSigma;
    const dPi = eq.ePi - ax.ePi;
    const tetragonal = diagonal(
      tetragonalField(
        (3 * eq.eSigma - 4 * eq.ePi) / 10,
        (2 / 7) * (dSigma + dPi),
        (2 / 35) * (3 * dSigma - 4 * dPi),
      ),
    );
    aom.forEach((x, i) => {
      expectClose(x, tetragonal[i] ?? 0, 1e-12, 1e-9);
    });
  });
});

describe('dsMixingField: the d–s mixing term', () => {
  it('dsMixingField lowers d_z² of a square plane by 4e_ds and leaves the octahedron alone (Smith, Inorg. Chim. Acta 22, 107, 1977 — from memory)', () => {
    const plane = octahedron().filter((l) => l.direction[2] === 0);
    const d = diagonal(dsMixingField(plane, 1500));
    expect(d.map((x) => Math.round(x * 1e9) / 1e9)).toEqual([0, 0, -6000, 0, 0]);
    for (const x of dsMixingField(octahedron(), 1500)) expectClose(x, 0, 0, 1e-9);
  });
});

describe('tetragonalField and trigonalField: the published one-electron energies', () => {
  it('tetragonalField(Dq, Ds, Dt) gives b1g 6Dq+2Ds−Dt, a1g 6Dq−2Ds−6Dt, b2g −4Dq+2Ds−Dt, eg −4Dq−Ds+4Dt (Ballhausen 1962; Lever 1984)', () => {
    const [dq, ds, dt] = [1500, 800, 200];
    const [xy, yz, z2, xz, x2y2] = diagonal(tetragonalField(dq, ds, dt));
    expectClose(x2y2, 6 * dq + 2 * ds - dt);
    expectClose(z2, 6 * dq - 2 * ds - 6 * dt);
    expectClose(xy, -4 * dq + 2 * ds - dt);
    expectClose(xz, -4 * dq - ds + 4 * dt);
    expectClose(yz, -4 * dq - ds + 4 * dt);
  });

  it('trigonalFrame() takes the cube [111] to z and the twofold axis [1,−1,0] to x', () => {
    const r = trigonalFrame();
    const z = apply3(r, [1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)]);
    const x = apply3(r, [Math.SQRT1_2, -Math.SQRT1_2, 0]);
    [0, 0, 1].forEach((c, i) => {
      expectClose(z[i], c, 0, 1e-12);
    });
    [1, 0, 0].forEach((c, i) => {
      expectClose(x[i], c, 0, 1e-12);
    });
  });

  it('trigonalField(Dq, 0, 0) is the cubic field turned, and trigonalField splits t2g into a1 and e by v = −3Dσ − (20/3)Dτ to first order', () => {
    expect(orbitalEnergies(trigonalField(1000, 0, 0)).map((x) => Math.round(x))).toEqual([
      -4000, -4000, -4000, 6000, 6000,
    ]);
    const [dq, dSigma, dTau] = [1800, 60, 25];
    const v = trigonalField(dq, dSigma, dTau);
    // a1 is d_z² about the threefold axis: exact, no other a1 orbital to mix with.
    expectClose(v[12], -4 * dq - 2 * dSigma - 6 * dTau, 1e-12, 1e-9);
    const { dSigma: s2, dTau: t2 } = trigonalFromSplitting(
      -3 * dSigma - (20 / 3) * dTau,
      (Math.SQRT2 / 3) * (3 * dSigma - 5 * dTau),
    );
    expectClose(s2, dSigma);
    expectClose(t2, dTau);
  });

  it('trigonalField(Dq, Dσ, Dτ) has the two e levels of the 2×2 block [−4Dq + Dσ + (2/3)Dτ, v′; v′, 6Dq + (7/3)Dτ], v′ = (√2/3)(3Dσ − 5Dτ) (Perumareddi, J. Phys. Chem. 71, 3144, 1967 — from memory)', () => {
    const [dq, dSigma, dTau] = [1700, -250, 120];
    const e = orbitalEnergies(trigonalField(dq, dSigma, dTau));
    const a = -4 * dq + dSigma + (2 / 3) * dTau;
    const d = 6 * dq + (7 / 3) * dTau;
    const v = (Math.SQRT2 / 3) * (3 * dSigma - 5 * dTau);
    const mid = (a + d) / 2;
    const half = Math.sqrt(((d - a) / 2) ** 2 + v * v);
    const a1 = -4 * dq - 2 * dSigma - 6 * dTau;
    const expected = [a1, mid - half, mid - half, mid + half, mid + half].sort((x, y) => x - y);
    expected.forEach((x, i) => {
      expectClose(e[i], x, 1e-12, 1e-9);
    });
  });

  it('a rotated copy of the octahedral AOM field has the same orbital energies', () => {
    const r = compose3(axisRotation([0.2, 1, -0.4], 1.1), axisRotation([1, 0, 0], 0.3));
    const turned = octahedron().map((l) => ({ ...l, direction: apply3(r, l.direction) }));
    const a = orbitalEnergies(aomField(octahedron(), { L: { eSigma: 6000, ePi: 1000 } }));
    const b = orbitalEnergies(aomField(turned, { L: { eSigma: 6000, ePi: 1000 } }));
    a.forEach((x, i) => {
      expectClose(b[i], x, 1e-12, 1e-9);
    });
  });
});
