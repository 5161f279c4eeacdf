/** The cubic crystal-field operator V of one d electron, per unit Dq, as a matrix and as one-electron terms. */

import type { OneBodyTerm } from '../atom/operators.js';

/**
 * The cubic crystal-field operator of a d electron in the |m_l⟩ basis, per unit Dq, for an
 * octahedron of ligands on the coordinate axes: ⟨±2|V|±2⟩ = Dq, ⟨±1|V|±1⟩ = −4Dq, ⟨0|V|0⟩ = 6Dq,
 * ⟨2|V|−2⟩ = ⟨−2|V|2⟩ = 5Dq, so t₂g lies at −4Dq and e_g at +6Dq and 10Dq = Δo (Ballhausen,
 * Introduction to Ligand Field Theory, 1962, ch. 4; Figgis & Hitchman, Ligand Field Theory and
 * its Applications, 2000, ch. 3). A tetrahedron is the same operator with Dq of the other sign.
 * Returned as `V[m′+2][m+2]`.
 */
export function octahedralFieldMatrix(): number[][] {
  const v = [
    [1, 0, 0, 0, 5],
    [0, -4, 0, 0, 0],
    [0, 0, 6, 0, 0],
    [0, 0, 0, -4, 0],
    [5, 0, 0, 0, 1],
  ];
  return v;
}

/** The octahedral field per unit Dq as one-electron terms on the 10 d spin-orbitals. */
export function octahedralFieldTerms(): OneBodyTerm[] {
  const v = octahedralFieldMatrix();
  const terms: OneBodyTerm[] = [];
  for (let spinOffset = 0; spinOffset <= 5; spinOffset += 5) {
    for (let a = 0; a < 5; a++) {
      for (let b = 0; b < 5; b++) {
        const value = v[a]?.[b] ?? 0;
        if (value !== 0) terms.push({ to: a + spinOffset, from: b + spinOffset, value });
      }
    }
  }
  return terms;
}
