/**
 * The octahedral rotation group O: its irreducible representations, character table,
 * the branching of free-ion terms into cubic components, and the decomposition of a
 * degenerate eigenspace into irreps from a few characters.
 */

import { type Complex, wignerD } from '../atom/angular.js';
import { rotateDeterminants } from '../atom/determinantRotation.js';
import { mlOf, twoMsOf } from '../atom/microstates.js';
import type { BasisBlock } from '../atom/operators.js';

/** Irreducible representations of O (and, with the same names, of Td and without g of Oh). */
export type CubicIrrep = 'A1' | 'A2' | 'E' | 'T1' | 'T2';

/** The irreps in the conventional order. */
export const CUBIC_IRREPS: readonly CubicIrrep[] = ['A1', 'A2', 'E', 'T1', 'T2'];

/** Dimension of each irrep. */
export const IRREP_DIMENSION: Readonly<Record<CubicIrrep, number>> = { A1: 1, A2: 1, E: 2, T1: 3, T2: 3 };

/** Rotation angle and class size of the five classes E, 8C3, 3C2, 6C4, 6C2′. */
const CLASSES = [
  { size: 1, angle: 0 },
  { size: 8, angle: (2 * Math.PI) / 3 },
  { size: 3, angle: Math.PI },
  { size: 6, angle: Math.PI / 2 },
  { size: 6, angle: Math.PI },
] as const;

/** Character table of O over the classes E, 8C3, 3C2 (= C4²), 6C4, 6C2′ (any group-theory text). */
export const CHARACTERS: Readonly<Record<CubicIrrep, readonly number[]>> = {
  A1: [1, 1, 1, 1, 1],
  A2: [1, 1, 1, -1, -1],
  E: [2, -1, 2, 0, 0],
  T1: [3, 0, -1, 1, -1],
  T2: [3, 0, -1, -1, 1],
};

/** Character of a rotation by θ in the (2L+1)-dimensional representation: Σ_m e^{imθ}. */
export function rotationCharacter(L: number, angle: number): number {
  let sum = 1;
  for (let m = 1; m <= L; m++) sum += 2 * Math.cos(m * angle);
  return sum;
}

/**
 * How often each cubic irrep occurs in a free-ion term of orbital angular momentum L, by the
 * reduction formula n(Γ) = (1/24) Σ_classes N_c χ_Γ(c) χ_L(θ_c) (Bethe, Ann. Phys. 3, 133, 1929).
 */
export function branchTerm(L: number): Record<CubicIrrep, number> {
  const cached = branchCache.get(L);
  if (cached) return { ...cached };
  const out = { A1: 0, A2: 0, E: 0, T1: 0, T2: 0 };
  for (const irrep of CUBIC_IRREPS) {
    let sum = 0;
    CLASSES.forEach((c, i) => {
      sum += c.size * (CHARACTERS[irrep][i] ?? 0) * rotationCharacter(L, c.angle);
    });
    out[irrep] = Math.round(sum / 24);
  }
  branchCache.set(L, out);
  return { ...out };
}

const branchCache = new Map<number, Record<CubicIrrep, number>>();

/**
 * Decomposes a degenerate eigenspace of fixed S into irreps of O.
 *
 * `counts[k]` (k = 0, 1, 2) is the number of its basis vectors with M_L ≡ k (mod 4), i.e. the
 * multiplicities of the C₄(z) eigenvalues e^{−iπk/2} (k = 3 mirrors k = 1). A1 spans k = 0;
 * A2, k = 2; E, k = 0 and 2; T1, k = 0, 1, 3; T2, k = 2, 1, 3. These counts settle a single
 * irrep except E against A1 + A2, and T1 + A2 against T2 + A1; where they leave a choice,
 * `chiC2p` (the character of one C₂′ rotation on the space) and `c3SumK0` (the trace of the sum of
 * the eight C₃ rotations over the space's k = 0 part) settle it. They are only called then.
 * @throws Error when the numbers fit no decomposition (a numerical failure).
 */
export function decomposeCubic(
  counts: readonly [number, number, number],
  chiC2p: () => number,
  c3SumK0: () => number,
): Record<CubicIrrep, number> {
  const [n0, n1, n2] = counts;
  let t1: number;
  const t1Min = Math.max(0, n1 - n2);
  const t1Max = Math.min(n1, n0);
  if (t1Min > t1Max) throw new Error(`cubic labelling: no decomposition of counts ${counts.join(',')}`);
  if (t1Min === t1Max) {
    t1 = t1Min;
  } else {
    // χ(C₂′) = a1 − a2 − t1 + t2 = n0 − n2 + 2n1 − 4t1.
    t1 = integral((n0 - n2 + 2 * n1 - chiC2p()) / 4, 'C2′');
  }
  const t2 = n1 - t1;
  const x = n0 - t1;
  const y = n2 - t2;
  let e = 0;
  if (Math.min(x, y) > 0) {
    // The C₃ class sum acts on an irrep Γ as 8χ_Γ(C₃)/dim Γ: 8 on A1, −4 on E, 0 on T1 (the k = 0
    // parts), so its trace over the k = 0 part is 8(x − e) − 4e.
    e = integral((8 * x - c3SumK0()) / 12, 'C3');
  }
  const out = { A1: x - e, A2: y - e, E: e, T1: t1, T2: t2 };
  // Called for every level at every point of a sweep: the five checks written out.
  if (out.A1 < 0 || out.A2 < 0 || e < 0 || t1 < 0 || t2 < 0)
    throw new Error(`cubic labelling: negative irrep count from counts ${counts.join(',')}`);
  return out;
}

function integral(x: number, what: string): number {
  const r = Math.round(x);
  if (Math.abs(x - r) > 0.05)
    throw new Error(`cubic labelling: character of ${what} gives ${x}, not an integer`);
  return r;
}

/** A proper rotation of the cube as a 3×3 matrix (row-major), with its class. */
export interface CubicRotation {
  readonly matrix: readonly number[];
  readonly cls: 'E' | 'C3' | 'C2' | 'C4' | 'C2p';
}

/**
 * The 24 rotations of O: the signed permutation matrices of determinant +1. The class follows
 * from the trace (1 + 2 cos θ) and, for θ = π, from whether the axis is a coordinate axis.
 */
export function cubicRotations(): CubicRotation[] {
  const out: CubicRotation[] = [];
  const perms = [
    [0, 1, 2],
    [0, 2, 1],
    [1, 0, 2],
    [1, 2, 0],
    [2, 0, 1],
    [2, 1, 0],
  ];
  for (const perm of perms) {
    for (let signs = 0; signs < 8; signs++) {
      const m = new Array<number>(9).fill(0);
      perm.forEach((col, row) => {
        m[row * 3 + col] = signs & (1 << row) ? -1 : 1;
      });
      if (Math.abs(det3(m) - 1) > 1e-12) continue;
      const trace = (m[0] ?? 0) + (m[4] ?? 0) + (m[8] ?? 0);
      const diagonal = perm[0] === 0 && perm[1] === 1 && perm[2] === 2;
      const cls = trace === 3 ? 'E' : trace === 0 ? 'C3' : trace === 1 ? 'C4' : diagonal ? 'C2' : 'C2p';
      out.push({ matrix: m, cls });
    }
  }
  return out;
}

function det3(m: readonly number[]): number {
  const [a = 0, b = 0, c = 0, d = 0, e = 0, f = 0, g = 0, h = 0, i = 0] = m;
  return a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
}

/** sin β below which a rotation counts as one about z (β = 0 or π): rounding in a computed matrix stays far below it. */
const AXIAL_SIN_BETA = 1e-9;

/**
 * Euler angles (z-y-z, active: R = R_z(α) R_y(β) R_z(γ)) of a rotation matrix, with γ = 0 where
 * β = 0 or π leaves only one of α, γ defined. β comes from atan2, not acos, so a rotation about z
 * carrying rounding (r₃₃ = 1 − 10⁻¹⁶) is still seen as one.
 */
export function eulerAngles(m: readonly number[]): [number, number, number] {
  const r = (i: number, j: number) => m[(i - 1) * 3 + (j - 1)] ?? 0;
  const beta = Math.atan2(Math.hypot(r(1, 3), r(2, 3)), r(3, 3));
  if (Math.sin(beta) > AXIAL_SIN_BETA)
    return [Math.atan2(r(2, 3), r(1, 3)), beta, Math.atan2(r(3, 2), -r(3, 1))];
  if (r(3, 3) > 0) return [Math.atan2(r(2, 1), r(1, 1)), 0, 0];
  return [Math.atan2(-r(2, 1), -r(1, 1)), Math.PI, 0];
}

/**
 * Real part of ⟨D′|R|D⟩ within a block, for a spatial rotation R given by its one-electron
 * matrix `U[m′+l][m+l]` (spin untouched). R|D⟩ is expanded electron by electron, applying the
 * rotated creation operators in the order that builds the determinant, so the fermion signs
 * come out of the algebra (or, with `rotate` = rotateDeterminantsByMinors, each entry as a minor
 * of U: cheaper for dense U). Entries outside the block are dropped: only the diagonal block is
 * needed for characters of eigenspaces that lie in it.
 */
export function rotationBlock(
  l: number,
  block: BasisBlock,
  U: Complex[][],
  rotate: typeof rotateDeterminants = rotateDeterminants,
): Float64Array {
  const orbitals = 2 * l + 1;
  const zero = { re: 0, im: 0 };
  // Spin untouched: the spatial matrix on each spin separately.
  const spinOrbitalU = Array.from({ length: 2 * orbitals }, (_, q) =>
    Array.from({ length: 2 * orbitals }, (_, p) =>
      twoMsOf(l, q) === twoMsOf(l, p) ? (U[mlOf(l, q) + l]?.[mlOf(l, p) + l] ?? zero) : zero,
    ),
  );
  return rotate(block, spinOrbitalU, 2 * orbitals);
}

/** One-electron rotation matrix D^l of a rotation given as a 3×3 matrix. */
export function rotationOfShell(l: number, matrix: readonly number[]): Complex[][] {
  const [alpha, beta, gamma] = eulerAngles(matrix);
  return wignerD(l, alpha, beta, gamma);
}
