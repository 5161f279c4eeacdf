import { describe, expect, it } from 'vitest';
import { aomField, type Ligand } from '../../src/field/angularOverlap.js';
import { solveDistorted, solveDistortedSpinOrbit } from '../../src/field/distortedComplex.js';
import {
  embeddedHamiltonian,
  solveFieldSpinOrbit,
  timeEvenHamiltonian,
} from '../../src/field/fieldSpinOrbit.js';
import { presetLigands } from '../../src/field/geometries.js';
import { solveField } from '../../src/field/lowSymmetrySolver.js';
import { apply3, axisRotation } from '../../src/field/realOrbitals.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose } from '../helpers.js';

/** A ligand set of no symmetry at all. */
const SKEW: Ligand[] = [
  { kind: 'A', direction: [1, 0.1, 0.05] },
  { kind: 'A', direction: [-0.9, 0.2, 0.1] },
  { kind: 'B', direction: [0.05, 1, -0.2] },
  { kind: 'A', direction: [0.1, -1, 0.3] },
  { kind: 'B', direction: [0.2, 0.1, 1] },
];
const SKEW_BONDS = { A: { eSigma: 6000, ePi: 1000 }, B: { eSigma: 5200, ePi: 600 } };
const SKEW_FIELD = aomField(SKEW, SKEW_BONDS);

/** Every state energy of a list of levels, each repeated by its degeneracy. */
function expanded(levels: readonly { energy: number; degeneracy: number }[]): number[] {
  return levels.flatMap((l) => new Array<number>(l.degeneracy).fill(l.energy)).sort((a, b) => a - b);
}

function expectSameSpectrum(a: number[], b: number[], abs: number): void {
  expect(a.length).toBe(b.length);
  a.forEach((x, i) => {
    expectClose(x, b[i] ?? Number.NaN, 0, abs);
  });
}

describe('solveFieldSpinOrbit: against the solvers without ζ and for cubic fields', () => {
  it('solveFieldSpinOrbit at ζ = 0 gives the levels of solveField, each (2S+1)·dim times, to 1e-8 cm⁻¹', () => {
    for (const n of [2, 3]) {
      const input = { n, field: SKEW_FIELD, B: 700, C: 3000 };
      const free = solveField(input);
      const withZeta = solveFieldSpinOrbit({ ...input, zeta: 0 });
      expectSameSpectrum(expanded(withZeta.levels), expanded(free.levels), 1e-8);
    }
  });

  it('solveDistortedSpinOrbit for an AOM octahedron (10Dq = 3eσ − 4eπ) gives the levels of solveSpinOrbit to 1e-6 cm⁻¹', () => {
    const ligands = presetLigands('octahedron');
    for (const n of [2, 3, 8]) {
      const r = solveDistortedSpinOrbit({
        n,
        B: 700,
        C: 3000,
        zeta: 400,
        field: { kind: 'aom', ligands, parameters: { L: { eSigma: 6000, ePi: 1000 } } },
      });
      const cubic = solveSpinOrbit({ n, geometry: 'oct', dq: 1400, B: 700, C: 3000, zeta: 400 });
      expectSameSpectrum(expanded(r.spinOrbit.levels), expanded(cubic.levels), 1e-6);
      // Each level lies wholly in the cubic level of the same energy.
      for (const l of r.spinOrbit.levels) expect(l.cubicParent?.weight).toBeGreaterThan(1 - 1e-8);
      expect(r.spinOrbit.levels[0]?.cubicParent?.label).toBe(cubic.ground.label);
    }
  });

  it('solveDistortedSpinOrbit for an AOM tetrahedron (10Dq = (4/3)eσ − (16/9)eπ) gives the tetrahedral levels of solveSpinOrbit', () => {
    const r = solveDistortedSpinOrbit({
      n: 8,
      B: 750,
      C: 3300,
      zeta: 500,
      field: {
        kind: 'aom',
        ligands: presetLigands('tetrahedron'),
        parameters: { L: { eSigma: 4500, ePi: 900 } },
      },
    });
    const dq = ((4 / 3) * 4500 - (16 / 9) * 900) / 10;
    const cubic = solveSpinOrbit({ n: 8, geometry: 'tet', dq, B: 750, C: 3300, zeta: 500 });
    expectSameSpectrum(expanded(r.spinOrbit.levels), expanded(cubic.levels), 1e-6);
  });
});

describe('solveFieldSpinOrbit: invariants', () => {
  it('solveFieldSpinOrbit keeps the sum of all state energies (the trace of H) whatever ζ', () => {
    const total = (zeta: number) => {
      const r = solveFieldSpinOrbit({ n: 2, field: SKEW_FIELD, B: 700, C: 3000, zeta });
      return r.levels.reduce((s, l) => s + l.degeneracy * (l.energy + r.groundEnergy), 0);
    };
    const base = total(0);
    for (const zeta of [200, 1500]) expectClose(total(zeta), base, 1e-12, 1e-6);
  });

  it('solveFieldSpinOrbit gives Kramers doublets for odd n in a field of no symmetry, and splits even n fully', () => {
    for (const n of [1, 3, 9]) {
      const r = solveFieldSpinOrbit({ n, field: SKEW_FIELD, B: 700, C: 3000, zeta: 600 });
      expect(r.kramers).toBe(true);
      for (const l of r.levels) expect(l.degeneracy).toBe(2);
    }
    const even = solveFieldSpinOrbit({ n: 2, field: SKEW_FIELD, B: 700, C: 3000, zeta: 600 });
    expect(even.kramers).toBe(false);
    for (const l of even.levels) expect(l.degeneracy).toBe(1);
  });

  it('solveFieldSpinOrbit gives the same levels for a rotated copy of the ligands', () => {
    const turn = axisRotation([0.3, -0.5, 1], 0.83);
    const turned = SKEW.map((l) => ({ ...l, direction: apply3(turn, l.direction) }));
    const a = solveFieldSpinOrbit({ n: 2, field: SKEW_FIELD, B: 700, C: 3000, zeta: 600 });
    const b = solveFieldSpinOrbit({ n: 2, field: aomField(turned, SKEW_BONDS), B: 700, C: 3000, zeta: 600 });
    expectSameSpectrum(expanded(a.levels), expanded(b.levels), 1e-7);
  });

  it('solveDistortedSpinOrbit names each level of an elongated d9 ion by its level without ζ', () => {
    const field = {
      kind: 'aom' as const,
      ligands: presetLigands('elongated-octahedron'),
      parameters: { eq: { eSigma: 6000, ePi: 1000 }, ax: { eSigma: 3000, ePi: 500 } },
    };
    const r = solveDistortedSpinOrbit({ n: 9, B: 0, C: 0, zeta: 830, field });
    const free = solveDistorted({ n: 9, B: 0, C: 0, field });
    expect(r.group).toBe('D4h');
    expect(r.spinOrbit.levels.map((l) => l.degeneracy)).toEqual([2, 2, 2, 2, 2]);
    expect(r.spinOrbit.levels[0]?.parent?.label).toBe(free.ground.label);
    expect(r.spinOrbit.levels[0]?.parent?.weight).toBeGreaterThan(0.99);
  });
});

describe('solveFieldSpinOrbit: the real time-even path against the embedded one', () => {
  it('timeEvenHamiltonian (N×N) has the spectrum of embeddedHamiltonian (2N×2N), each value once instead of twice', () => {
    for (const n of [2, 8]) {
      const input = { n, field: SKEW_FIELD, B: 700, C: 3000, zeta: 700 };
      const fast = timeEvenHamiltonian(input);
      const slow = embeddedHamiltonian(input);
      expect(slow.size).toBe(2 * fast.size);
      const a = [...symmetricEigen(fast.matrix, fast.size).values];
      const b = [...symmetricEigen(slow.matrix, slow.size).values].filter((_, i) => i % 2 === 0);
      expectSameSpectrum(a, b, 1e-7);
    }
  });
});
