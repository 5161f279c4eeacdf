/**
 * The cubic double group O* (and Td*, its isomorph) for dⁿ with spin–orbit coupling: the M_J
 * classes that block the Hamiltonian, the spin-and-space rotations whose characters name an
 * eigenspace, and the reduction of those characters to irreps. Names follow Bethe's Γ notation
 * as the trade uses it (Bethe, Ann. Phys. 3, 133, 1929; Koster, Dimmock, Wheeler & Statz,
 * Properties of the Thirty-Two Point Groups, 1963): Γ1…Γ5 = A1, A2, E, T1, T2 for an even
 * electron count and Γ6 (E′, from j = ½), Γ7 (E″) and Γ8 (U′, from j = 3/2) for an odd one.
 * d functions are even under inversion, so the same names serve Oh (without g) and Td.
 */
import { type Complex, wignerD } from '../atom/angular.js';
import { mlOf, twoMsOf } from '../atom/microstates.js';
import { CHARACTERS, CUBIC_IRREPS, cubicRotations, eulerAngles, rotationOfShell } from './symmetry.js';

/** An irreducible representation of the double group O*, in Bethe's notation. */
export type DoubleIrrep = 'Γ1' | 'Γ2' | 'Γ3' | 'Γ4' | 'Γ5' | 'Γ6' | 'Γ7' | 'Γ8';

/** The double-group irreps of an even electron count: the single-valued A1, A2, E, T1, T2. */
export const EVEN_IRREPS: readonly DoubleIrrep[] = ['Γ1', 'Γ2', 'Γ3', 'Γ4', 'Γ5'];

/** The double-group irreps of an odd electron count (spinor irreps). */
export const ODD_IRREPS: readonly DoubleIrrep[] = ['Γ6', 'Γ7', 'Γ8'];

/** Dimension of each double-group irrep. */
export const DOUBLE_IRREP_DIMENSION: Readonly<Record<DoubleIrrep, number>> = {
  Γ1: 1,
  Γ2: 1,
  Γ3: 2,
  Γ4: 3,
  Γ5: 3,
  Γ6: 2,
  Γ7: 2,
  Γ8: 4,
};

/** Mulliken-style names of the same irreps, for readers who use those. */
export const MULLIKEN_NAME: Readonly<Record<DoubleIrrep, string>> = {
  Γ1: 'A1',
  Γ2: 'A2',
  Γ3: 'E',
  Γ4: 'T1',
  Γ5: 'T2',
  Γ6: "E'",
  Γ7: 'E"',
  Γ8: "U'",
};

/** A sentence naming the notation, for outputs. */
export const DOUBLE_GROUP_NOTATION =
  "Bethe's notation of the cubic double group (Γ1…Γ5 = A1, A2, E, T1, T2; Γ6 = E′, Γ7 = E″, Γ8 = U′)";

/**
 * The M_J class of a determinant: 2M_J mod 8. Spin–orbit coupling conserves M_J and the cubic
 * field changes M_L by ±4, so H connects determinants of one class only; the class is the
 * eigenvalue e^{−iπM_J/2} of the fourfold rotation about z.
 */
export function mjClass(ML: number, twoMS: number): number {
  return (((2 * ML + twoMS) % 8) + 8) % 8;
}

/**
 * The classes to diagonalise and how many classes each stands for: time reversal pairs the class
 * of M_J with that of −M_J at the same energies, so an odd count needs 2M_J ≡ 1, 3 (each standing
 * also for 7, 5: Kramers doublets) and an even count needs 0, 2, 4 (2 standing also for 6).
 */
export function keptClasses(n: number): { cls: number; weight: number }[] {
  return n % 2 === 1
    ? [
        { cls: 1, weight: 2 },
        { cls: 3, weight: 2 },
      ]
    : [
        { cls: 0, weight: 1 },
        { cls: 2, weight: 2 },
        { cls: 4, weight: 1 },
      ];
}

/** χ of the fourfold rotation over components counted per class 2M_J mod 8 (all eight classes). */
export function c4Character(countByClass: readonly number[]): number {
  let sum = 0;
  countByClass.forEach((count, cls) => {
    sum += count * Math.cos((Math.PI * cls) / 4);
  });
  return sum;
}

/** χ of the twofold rotation about z over components counted per class. */
export function c2Character(countByClass: readonly number[]): number {
  let sum = 0;
  countByClass.forEach((count, cls) => {
    sum += count * Math.cos((Math.PI * cls) / 2);
  });
  return sum;
}

/** Characters of an eigenspace on the classes E, 8C3, 3C2, 6C4, 6C2′ of O (the ones of O* that tell irreps apart). */
export interface SpaceCharacters {
  readonly E: number;
  readonly C3: number;
  readonly C2: number;
  readonly C4: number;
  readonly C2p: number;
}

function integral(x: number, what: string): number {
  const r = Math.round(x);
  if (Math.abs(x - r) > 0.05 || r < 0)
    throw new Error(`double-group labelling: ${what} comes out ${x}, not a count`);
  return r;
}

/**
 * The irreps of an eigenspace from its characters. Odd counts: Γ6, Γ7, Γ8 have χ(E) = 2, 2, 4,
 * χ(C3) = 1, 1, −1, χ(C4) = √2, −√2, 0 (and 0 on C2, C2′); even counts: the table of O.
 * @throws Error when the characters fit no sum of irreps (a numerical failure).
 */
export function reduceCharacters(odd: boolean, chi: SpaceCharacters): Partial<Record<DoubleIrrep, number>> {
  if (odd) {
    const g8 = integral((chi.E - 2 * chi.C3) / 6, 'Γ8 count');
    const sum67 = (chi.E - 4 * g8) / 2;
    const diff67 = chi.C4 / Math.SQRT2;
    return {
      Γ6: integral((sum67 + diff67) / 2, 'Γ6 count'),
      Γ7: integral((sum67 - diff67) / 2, 'Γ7 count'),
      Γ8: g8,
    };
  }
  const values = [chi.E, chi.C3, chi.C2, chi.C4, chi.C2p];
  const sizes = [1, 8, 3, 6, 6];
  const out: Partial<Record<DoubleIrrep, number>> = {};
  CUBIC_IRREPS.forEach((irrep, i) => {
    let sum = 0;
    values.forEach((v, c) => {
      sum += (sizes[c] ?? 0) * (CHARACTERS[irrep][c] ?? 0) * v;
    });
    out[EVEN_IRREPS[i] as DoubleIrrep] = integral(sum / 24, `${irrep} count`);
  });
  return out;
}

/**
 * One-electron matrix (10×10, `U[q][p]` over spin-orbitals) of a proper rotation acting on space
 * and spin together. The spin part is the SU(2) matrix of the same Euler angles, taken with the
 * sign that gives it a non-negative trace: the rotation by θ ≤ π, not θ + 2π, which fixes the
 * class of the double group it stands for.
 */
export function spinorRotation(matrix: readonly number[]): Complex[][] {
  const [alpha, beta, gamma] = eulerAngles(matrix);
  const space = rotationOfShell(2, matrix);
  let spin = wignerD(0.5, alpha, beta, gamma);
  const trace = (spin[0]?.[0]?.re ?? 0) + (spin[1]?.[1]?.re ?? 0);
  if (trace < -1e-12) spin = spin.map((row) => row.map((c) => ({ re: -c.re, im: -c.im })));
  const out: Complex[][] = [];
  for (let q = 0; q < 10; q++) {
    const row: Complex[] = [];
    for (let p = 0; p < 10; p++) {
      const a = space[mlOf(2, q) + 2]?.[mlOf(2, p) + 2] ?? { re: 0, im: 0 };
      // wignerD(½) indexes m_s = −½, +½ as 0, 1.
      const b = spin[twoMsOf(2, q) > 0 ? 1 : 0]?.[twoMsOf(2, p) > 0 ? 1 : 0] ?? { re: 0, im: 0 };
      row.push({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
    }
    out.push(row);
  }
  return out;
}

/**
 * A threefold rotation of the cube, and a twofold one about an axis in the xy plane ([110] or
 * [1−10]), which maps M_J to −M_J and so keeps the classes 2M_J ≡ 0, 4 (mod 8).
 */
export function namingRotations(): { c3: readonly number[]; c2p: readonly number[] } {
  const rotations = cubicRotations();
  const c3 = rotations.find((r) => r.cls === 'C3');
  const c2p = rotations.find((r) => r.cls === 'C2p' && r.matrix[8] === -1);
  if (!c3 || !c2p) throw new Error('the cube has no C3 or C2′ rotation');
  return { c3: c3.matrix, c2p: c2p.matrix };
}

/** The double-group irreps of the spin functions of S (D^S restricted to O*), with multiplicity. */
const SPIN_IRREPS: Readonly<Record<number, readonly DoubleIrrep[]>> = {
  0: ['Γ1'],
  0.5: ['Γ6'],
  1: ['Γ4'],
  1.5: ['Γ8'],
  2: ['Γ3', 'Γ5'],
  2.5: ['Γ7', 'Γ8'],
};

/**
 * Products of a single-valued irrep (row) with any irrep (column) of O*, from the multiplication
 * table of Koster, Dimmock, Wheeler & Statz, Properties of the Thirty-Two Point Groups (1963).
 */
const PRODUCTS: Readonly<Record<string, Readonly<Record<string, readonly DoubleIrrep[]>>>> = {
  Γ2: {
    Γ1: ['Γ2'],
    Γ3: ['Γ3'],
    Γ4: ['Γ5'],
    Γ5: ['Γ4'],
    Γ6: ['Γ7'],
    Γ7: ['Γ6'],
    Γ8: ['Γ8'],
  },
  Γ3: {
    Γ1: ['Γ3'],
    Γ3: ['Γ1', 'Γ2', 'Γ3'],
    Γ4: ['Γ4', 'Γ5'],
    Γ5: ['Γ4', 'Γ5'],
    Γ6: ['Γ8'],
    Γ7: ['Γ8'],
    Γ8: ['Γ6', 'Γ7', 'Γ8'],
  },
  Γ4: {
    Γ1: ['Γ4'],
    Γ3: ['Γ4', 'Γ5'],
    Γ4: ['Γ1', 'Γ3', 'Γ4', 'Γ5'],
    Γ5: ['Γ2', 'Γ3', 'Γ4', 'Γ5'],
    Γ6: ['Γ6', 'Γ8'],
    Γ7: ['Γ7', 'Γ8'],
    Γ8: ['Γ6', 'Γ7', 'Γ8', 'Γ8'],
  },
  Γ5: {
    Γ1: ['Γ5'],
    Γ3: ['Γ4', 'Γ5'],
    Γ4: ['Γ2', 'Γ3', 'Γ4', 'Γ5'],
    Γ5: ['Γ1', 'Γ3', 'Γ4', 'Γ5'],
    Γ6: ['Γ7', 'Γ8'],
    Γ7: ['Γ6', 'Γ8'],
    Γ8: ['Γ6', 'Γ7', 'Γ8', 'Γ8'],
  },
};

/** The cubic irrep (`T1g`, `E`, …; g and u dropped, the same in Td) as Γ1…Γ5. */
const SPACE_IRREP: Readonly<Record<string, DoubleIrrep>> = {
  A1: 'Γ1',
  A2: 'Γ2',
  E: 'Γ3',
  T1: 'Γ4',
  T2: 'Γ5',
};

/**
 * The double-group levels a spin–orbit-free cubic level ²ˢ⁺¹Γ splits into: Γ ⊗ D^S, each irrep
 * as often as it occurs (e.g. ⁴T₁ → Γ6, Γ7, Γ8, Γ8).
 * @throws Error for an irrep or spin that dⁿ does not have.
 */
export function spinOrbitSplitting(irrep: string, S: number): DoubleIrrep[] {
  const space = SPACE_IRREP[irrep.replace(/[gu]$/, '')];
  const spin = SPIN_IRREPS[S];
  if (!space || !spin) throw new Error(`no double-group splitting for ${irrep}, S = ${S}`);
  if (space === 'Γ1') return [...spin];
  const row = PRODUCTS[space] ?? {};
  return spin.flatMap((s) => row[s] ?? []);
}
