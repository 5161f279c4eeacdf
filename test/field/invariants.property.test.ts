import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type CubicResult, solveCubic } from '../../src/field/cubic.js';
import { fullHamiltonian } from '../../src/field/hamiltonian.js';
import { tridiagonalQlValues } from '../../src/numeric/tridiagonalQl.js';
import { fuzz } from '../fuzz.js';
import { expectClose } from '../helpers.js';

/**
 * Invariants of the dⁿ Hamiltonian H = B·H_B + C·H_C + Dq·V as properties over random ions and
 * parameters (fixed seed, test/fuzz.ts), held against the slow full-matrix path where a second
 * path exists. Without spin–orbit coupling throughout (with it, the hole–electron rule also turns
 * ζ → −ζ).
 * - Scaling: every term of H is linear in (B, C, Dq), so E(λB, λC, λDq) = λ·E(B, C, Dq).
 * - Hole–electron symmetry: d¹⁰⁻ⁿ has the repulsion of dⁿ up to a constant and the one-electron
 *   field with the opposite sign (J. S. Griffith, The Theory of Transition-Metal Ions, 1961, from
 *   memory), so its levels at −Dq are those of dⁿ at Dq; with Td = Oh at −Dq, Oh dⁿ = Td d¹⁰⁻ⁿ.
 * - Td(Dq) = Oh(−Dq): the tetrahedral field is −4/9 of the octahedral one for the same ligands,
 *   and the solver takes the tetrahedral Dq as its own (10Dq = Δt), so a Td ion at Dq is the
 *   octahedral matrix at −Dq (the solver's convention, DEVELOPERS.md).
 * - Trace rule: V is traceless over the d shell, so the sum of all dⁿ energies (the barycentre)
 *   does not depend on Dq.
 */

const params = fc.record({
  n: fc.integer({ min: 1, max: 9 }),
  dq: fc.integer({ min: 0, max: 4_000 }),
  B: fc.integer({ min: 300, max: 1_200 }),
  cb: fc.integer({ min: 30, max: 60 }).map((v) => v / 10),
});

/** Energies above the ground state, one per state (degeneracy counted), rising. */
function states(r: CubicResult): number[] {
  return r.levels.flatMap((l) => new Array<number>(l.degeneracy).fill(l.energy)).sort((a, b) => a - b);
}

/** Eigenvalues of the full C(10, n) matrix at a signed octahedral Dq, rising. */
function fullEigenvalues(n: number, dq: number, B: number, C: number): number[] {
  const { size, matrix } = fullHamiltonian(n, dq, B, C);
  return [...tridiagonalQlValues(matrix, size)].sort((a, b) => a - b);
}

function expectSameStates(a: readonly number[], b: readonly number[], scale: number): void {
  expect(a).toHaveLength(b.length);
  a.forEach((e, i) => {
    expectClose(e, b[i] as number, 1e-8, 1e-7 * scale);
  });
}

describe('cubic dⁿ levels (property)', () => {
  it('scale with the parameters: E(λB, λC, λDq) = λE(B, C, Dq), state by state', () => {
    fuzz(
      fc.property(
        params,
        fc.constantFrom('oct', 'tet'),
        fc.integer({ min: 2, max: 50 }),
        (p, geometry, k) => {
          const lambda = k / 10;
          const base = solveCubic({ n: p.n, geometry, dq: p.dq, B: p.B, C: p.cb * p.B });
          const scaled = solveCubic({
            n: p.n,
            geometry,
            dq: lambda * p.dq,
            B: lambda * p.B,
            C: lambda * p.cb * p.B,
          });
          expectSameStates(
            states(scaled),
            states(base).map((e) => lambda * e),
            p.B,
          );
        },
      ),
      40,
    );
  });

  it('hole–electron symmetry: octahedral dⁿ at Dq has the levels of tetrahedral d¹⁰⁻ⁿ at Dq (spins and irreps too)', () => {
    fuzz(
      fc.property(params, (p) => {
        const C = p.cb * p.B;
        const oct = solveCubic({ n: p.n, geometry: 'oct', dq: p.dq, B: p.B, C });
        const tet = solveCubic({ n: 10 - p.n, geometry: 'tet', dq: p.dq, B: p.B, C });
        expectSameStates(states(oct), states(tet), p.B);
        expect(tet.ground.S).toBe(oct.ground.S);
        expect(tet.ground.cubicIrrep).toBe(oct.ground.cubicIrrep);
      }),
      40,
    );
  });

  it('Td(Dq) = Oh(−Dq): the tetrahedral levels are the full octahedral matrix at −Dq, and d¹⁰⁻ⁿ at Dq', () => {
    fuzz(
      fc.property(params, (p) => {
        const C = p.cb * p.B;
        const tet = states(solveCubic({ n: p.n, geometry: 'tet', dq: p.dq, B: p.B, C }));
        const full = fullEigenvalues(p.n, -p.dq, p.B, C);
        expectSameStates(
          tet,
          full.map((e) => e - (full[0] as number)),
          p.B,
        );
        const hole = fullEigenvalues(10 - p.n, p.dq, p.B, C);
        expectSameStates(
          tet,
          hole.map((e) => e - (hole[0] as number)),
          p.B,
        );
      }),
      15,
    );
  });

  it('trace rule: the sum of all dⁿ energies does not depend on Dq, and the solver’s levels sum to it', () => {
    fuzz(
      fc.property(params, (p) => {
        const C = p.cb * p.B;
        const free = fullEigenvalues(p.n, 0, p.B, C);
        const inField = fullEigenvalues(p.n, p.dq, p.B, C);
        const sum = (v: readonly number[]) => v.reduce((s, e) => s + e, 0);
        expectClose(sum(inField), sum(free), 1e-9, 1e-6 * p.B * free.length);
        const levels = states(solveCubic({ n: p.n, dq: p.dq, B: p.B, C }));
        const ground = inField[0] as number;
        expectClose(sum(levels) + levels.length * ground, sum(free), 1e-9, 1e-6 * p.B * free.length);
      }),
      15,
    );
  });
});
