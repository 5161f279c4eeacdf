/**
 * Levels of dⁿ in a one-electron field of any symmetry with spin–orbit coupling ζ Σ l·s, over
 * all C(10, n) determinants of the complex |m_l⟩ spin-orbitals. There the repulsion and l·s are
 * real (Condon–Shortley phases) but a general field is complex Hermitian, H = A + iB. Without a
 * point group, time reversal is used: for even n, H is real over a basis of time-reversal-even
 * states, of the same size; for odd n (Kramers) it is diagonalised as the real symmetric
 * [[A, −B], [B, A]] of twice the size, whose spectrum is H's with every eigenvalue twice
 * (ml-matrix has no Hermitian solver). With a point group that has a k-fold rotation about its
 * principal axis, the field is carried into the group's frame, where H couples only determinants
 * of one 2M_J mod 2k; each such block is solved alone (real, or embedded as above), and the
 * classes 2M_J and −2M_J, images under time reversal, once for both. The levels are named by their degeneracy (Kramers
 * doublets for odd n), the spin–orbit-free level they come from, where the field is near cubic
 * the double-group level of the nearest cubic field (weights of the eigenvectors), and, given the
 * point group, their irreps in its double group (doubleGroupLabels.ts).
 */

import { microstates, quantumNumbers, spinOrbital } from '../atom/microstates.js';
import { type OneBodyTerm, oneBodyMatrix } from '../atom/operators.js';
import { clusterSorted, column, symmetricEigen } from '../numeric/eigen.js';
import {
  type ComplexVector,
  levelLabel,
  principalOrder,
  spaceCharacters,
  spinOrbitSymmetry,
  standardFrame,
} from './doubleGroupLabels.js';
import { type DeterminantBlock, determinantBlock } from './hamiltonian.js';
import {
  aboveGround,
  checkFieldInput,
  DEGENERACY_RELATIVE,
  DEGENERACY_TOLERANCE,
  type FieldInput,
  type FieldResult,
} from './lowSymmetrySolver.js';
import type { PointGroup } from './pointGroups.js';
import { fieldInComplexBasis, orbitalTransform, transformField } from './realOrbitals.js';
import { checkZeta, spinOrbitTerms } from './spinOrbit.js';

/** Input of {@link solveFieldSpinOrbit}. Energies in cm⁻¹. */
export interface FieldSpinOrbitInput extends FieldInput {
  /** One-electron spin–orbit constant ζ, 0…MAX_ZETA. */
  readonly zeta: number;
}

/** A labelled reference set of levels to name the spin–orbit levels by (see {@link solveFieldSpinOrbit}). */
export interface SpinOrbitReference {
  /** The reference field over the real orbitals. */
  readonly field: Float64Array;
  /** ζ of the reference (0: the spin–orbit-free levels). */
  readonly zeta: number;
  /** Label of each reference level by its energy above the reference ground level. */
  readonly labels: readonly { readonly energy: number; readonly label: string }[];
}

/** A level's parent in a reference and the weight of its eigenvectors there. */
export interface SpinOrbitParent {
  readonly label: string;
  /** Fraction 0…1 of the level in it. */
  readonly weight: number;
}

/** One level of dⁿ with spin–orbit coupling in a general field. */
export interface FieldSpinOrbitLevel {
  /** Place from below, 1 for the ground level. */
  readonly index: number;
  /** Energy above the ground level, cm⁻¹. */
  readonly energy: number;
  /** Number of states: 2 for a Kramers doublet, more only where symmetry or chance joins levels. */
  readonly degeneracy: number;
  /** The spin–orbit-free level it lies in most, where that reference was given. */
  readonly parent?: SpinOrbitParent;
  /** The cubic double-group level it lies in most, where that reference was given. */
  readonly cubicParent?: SpinOrbitParent;
  /**
   * Its irreps in the point group's double group, where the group was given and is tabulated:
   * for odd n a spinor irrep in Bethe's Γ notation (`Γ7g`, `Γ4`, `Γ5+Γ6` for a time-reversal
   * pair), for even n the single-valued irrep of the total state (`B2g`, `E`); irreps joined by
   * `+` where levels fall together; `?` where the characters fit no sum of irreps.
   */
  readonly pointGroupLabel?: string;
}

/** Levels with spin–orbit coupling in a general field. */
export interface FieldSpinOrbitResult {
  readonly n: number;
  readonly B: number;
  readonly C: number;
  readonly zeta: number;
  /** Odd n: every level is at least a Kramers doublet. */
  readonly kramers: boolean;
  /** Energy of the ground level on the Hamiltonian's own scale (the levels are measured from it), cm⁻¹. */
  readonly groundEnergy: number;
  /** The point group whose irreps label the levels (`pointGroupLabel`), where there is one. */
  readonly pointGroup?: string;
  readonly levels: readonly FieldSpinOrbitLevel[];
}

/** Options of {@link solveFieldSpinOrbit}. */
export interface FieldSpinOrbitOptions {
  /** Name each level by the spin–orbit-free levels of this reference (same basis). */
  readonly spinFree?: SpinOrbitReference;
  /** Name each level by the levels of this (cubic, with ζ) reference. */
  readonly cubic?: SpinOrbitReference;
  /**
   * Label each level by the irreps of this group's double group (the field must have its
   * symmetry), and solve block by block of 2M_J mod 2k in its frame where it has a k-fold axis.
   */
  readonly group?: PointGroup;
  /** Use the group's axis to block the Hamiltonian; false keeps the full matrix (for tests). @default true */
  readonly blocked?: boolean;
}

interface FullBasis {
  readonly block: DeterminantBlock;
  readonly partZeta: Float64Array;
}

const basisCache = new Map<number, FullBasis>();

/** All determinants of dⁿ with the repulsion and l·s over them; cached per n. */
function fullBasis(n: number): FullBasis {
  const cached = basisCache.get(n);
  if (cached) return cached;
  const block = determinantBlock(microstates(2, n).map((s) => s.mask));
  const out = { block, partZeta: oneBodyMatrix(block, spinOrbitTerms()) };
  basisCache.set(n, out);
  return out;
}

/** The real and imaginary parts of a real-orbital field's matrix over the |m_l⟩ determinants. */
function complexFieldMatrices(
  block: DeterminantBlock,
  field: Float64Array,
): { re: Float64Array; im: Float64Array } {
  const v = fieldInComplexBasis(field);
  const re: OneBodyTerm[] = [];
  const im: OneBodyTerm[] = [];
  for (const alpha of [true, false]) {
    for (let a = -2; a <= 2; a++) {
      for (let b = -2; b <= 2; b++) {
        const x = v[a + 2]?.[b + 2] ?? { re: 0, im: 0 };
        const to = spinOrbital(2, a, alpha);
        const from = spinOrbital(2, b, alpha);
        if (x.re !== 0) re.push({ to, from, value: x.re });
        if (x.im !== 0) im.push({ to, from, value: x.im });
      }
    }
  }
  return { re: oneBodyMatrix(block, re), im: oneBodyMatrix(block, im) };
}

/** H = A + iB = B·H_B + C·H_C + V + ζ·H_ζ over all N determinants of dⁿ (row-major N×N parts). */
function complexHamiltonian(input: FieldSpinOrbitInput): {
  size: number;
  re: Float64Array;
  im: Float64Array;
} {
  const { block, partZeta } = fullBasis(input.n);
  const field = complexFieldMatrices(block, input.field);
  const re = field.re.map(
    (x, k) =>
      x + input.B * (block.partB[k] ?? 0) + input.C * (block.partC[k] ?? 0) + input.zeta * (partZeta[k] ?? 0),
  );
  return { size: block.masks.length, re, im: field.im };
}

/**
 * The real symmetric [[A, −B], [B, A]] (row-major, size 2N) of H = A + iB over all N determinants
 * of dⁿ: the slow, obvious path with nothing blocked (each eigenvalue of H twice).
 */
export function embeddedHamiltonian(input: FieldSpinOrbitInput): { size: number; matrix: Float64Array } {
  const { size: n, re, im } = complexHamiltonian(input);
  const size = 2 * n;
  const matrix = new Float64Array(size * size);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const a = re[i * n + j] ?? 0;
      const b = im[i * n + j] ?? 0;
      matrix[i * size + j] = a;
      matrix[(n + i) * size + n + j] = a;
      matrix[i * size + n + j] = -b;
      matrix[(n + i) * size + j] = b;
    }
  }
  return { size, matrix };
}

/** One vector of the time-reversal-even basis: a few determinants with complex coefficients. */
type SparseVector = readonly { readonly index: number; readonly re: number; readonly im: number }[];

/**
 * Time reversal Θ = K·(−iσ_y) on one spin-orbital: |m α⟩ → (−1)^m |−m β⟩, |m β⟩ → −(−1)^m |−m α⟩
 * (K turns Y_lm into (−1)^m Y_l,−m in the Condon–Shortley phase). Returns the image and its sign.
 */
function reversedSpinOrbital(p: number): { q: number; sign: number } {
  const alpha = p < 5;
  const m = alpha ? p - 2 : p - 7;
  const even = m % 2 === 0 ? 1 : -1;
  return { q: spinOrbital(2, -m, !alpha), sign: alpha ? even : -even };
}

/** Θ on a determinant (creators in ascending spin-orbital order): the image's mask and sign. */
function reversedDeterminant(mask: number): { mask: number; sign: number } {
  const qs: number[] = [];
  let sign = 1;
  for (let p = 0; p < 10; p++) {
    if (!(mask & (1 << p))) continue;
    const r = reversedSpinOrbital(p);
    qs.push(r.q);
    sign *= r.sign;
  }
  // Bring the creators back into ascending order: one sign per inversion.
  for (let i = 0; i < qs.length; i++)
    for (let j = i + 1; j < qs.length; j++) if ((qs[i] ?? 0) > (qs[j] ?? 0)) sign = -sign;
  return { mask: qs.reduce((m, q) => m | (1 << q), 0), sign };
}

const evenBasisCache = new Map<number, SparseVector[]>();

/**
 * For even n, where Θ² = +1: an orthonormal basis of Θ-even states, (D + ΘD)/√2 and i(D − ΘD)/√2
 * for each pair of determinants ΘD = ±D′, and D or iD for a determinant that is its own image.
 * H commutes with Θ (no magnetic field), so its matrix there is real (Wigner's theorem).
 */
function timeEvenBasis(n: number): SparseVector[] {
  const cached = evenBasisCache.get(n);
  if (cached) return cached;
  const { block } = fullBasis(n);
  const out: SparseVector[] = [];
  const s = Math.SQRT1_2;
  block.masks.forEach((mask, i) => {
    const r = reversedDeterminant(mask);
    const j = block.index.get(r.mask);
    if (j === undefined) throw new Error('time reversal leaves the determinants of dⁿ');
    if (j === i) {
      out.push([r.sign > 0 ? { index: i, re: 1, im: 0 } : { index: i, re: 0, im: 1 }]);
    } else if (i < j) {
      out.push([
        { index: i, re: s, im: 0 },
        { index: j, re: r.sign * s, im: 0 },
      ]);
      out.push([
        { index: i, re: 0, im: s },
        { index: j, re: 0, im: -r.sign * s },
      ]);
    }
  });
  evenBasisCache.set(n, out);
  return out;
}

/** H over the Θ-even basis of even n: real symmetric, N×N (the imaginary part vanishes). */
export function timeEvenHamiltonian(input: FieldSpinOrbitInput): { size: number; matrix: Float64Array } {
  const { size, re, im } = complexHamiltonian(input);
  const basis = timeEvenBasis(input.n);
  const matrix = new Float64Array(size * size);
  basis.forEach((u, k) => {
    basis.forEach((v, l) => {
      if (l < k) return;
      let sum = 0;
      for (const a of u) {
        for (const b of v) {
          const hr = re[a.index * size + b.index] ?? 0;
          const hi = im[a.index * size + b.index] ?? 0;
          // Re(conj(a)·h·b)
          const tr = hr * b.re - hi * b.im;
          const ti = hr * b.im + hi * b.re;
          sum += a.re * tr + a.im * ti;
        }
      }
      matrix[k * size + l] = sum;
      matrix[l * size + k] = sum;
    });
  });
  return { size, matrix };
}

/** A level: energy, degeneracy and (when asked for) an orthonormal basis of its states over the determinants. */
interface Level {
  readonly energy: number;
  readonly degeneracy: number;
  readonly vectors: readonly ComplexVector[];
}

/** The eigenvalues of a real symmetric matrix in degenerate runs, with each run's eigenvectors. */
function eigenRuns(matrix: Float64Array, size: number, withVectors: boolean) {
  const eig = symmetricEigen(matrix, size);
  const values = [...eig.values];
  let scale = 1;
  for (const v of values) scale = Math.max(scale, Math.abs(v));
  return clusterSorted(values, DEGENERACY_TOLERANCE + DEGENERACY_RELATIVE * scale).map((run) => ({
    energy: run.reduce((s, i) => s + (values[i] ?? 0), 0) / run.length,
    count: run.length,
    vectors: withVectors ? run.map((i) => column(eig.vectors, size, i)) : [],
  }));
}

/**
 * An orthonormal basis of the complex span of `states`, `count` long: Gram–Schmidt over the complex
 * inner product (the embedded real vectors of a level of odd n give each state twice, as z and iz).
 */
function complexBasis(states: readonly ComplexVector[], count: number): ComplexVector[] {
  const out: ComplexVector[] = [];
  for (const z of states) {
    if (out.length === count) break;
    const re = Float64Array.from(z.re);
    const im = Float64Array.from(z.im);
    for (const q of out) {
      // c = ⟨q|r⟩; r −= c q
      let cr = 0;
      let ci = 0;
      for (let i = 0; i < re.length; i++) {
        cr += (q.re[i] as number) * (re[i] as number) + (q.im[i] as number) * (im[i] as number);
        ci += (q.re[i] as number) * (im[i] as number) - (q.im[i] as number) * (re[i] as number);
      }
      for (let i = 0; i < re.length; i++) {
        const qr = q.re[i] as number;
        const qi = q.im[i] as number;
        re[i] = (re[i] as number) - (cr * qr - ci * qi);
        im[i] = (im[i] as number) - (cr * qi + ci * qr);
      }
    }
    let norm = 0;
    for (let i = 0; i < re.length; i++) norm += (re[i] as number) ** 2 + (im[i] as number) ** 2;
    if (norm < 0.25) continue;
    const scale = 1 / Math.sqrt(norm);
    out.push({ re: re.map((x) => x * scale), im: im.map((x) => x * scale) });
  }
  return out;
}

/** A level's real eigenvectors of the full path as complex states over the determinants. */
function complexStates(n: number, vectors: readonly Float64Array[], degeneracy: number): ComplexVector[] {
  const size = fullBasis(n).block.masks.length;
  if (n % 2 === 1) {
    const states = vectors.map((v) => ({ re: v.subarray(0, size), im: v.subarray(size) }));
    return complexBasis(states, degeneracy);
  }
  const basis = timeEvenBasis(n);
  return vectors.map((c) => {
    const re = new Float64Array(size);
    const im = new Float64Array(size);
    basis.forEach((u, k) => {
      const x = c[k] as number;
      for (const e of u) {
        re[e.index] = (re[e.index] as number) + x * e.re;
        im[e.index] = (im[e.index] as number) + x * e.im;
      }
    });
    return { re, im };
  });
}

/**
 * The levels over all determinants, the slow, obvious path: for even n from the real N×N matrix
 * over the Θ-even basis, for odd n (Θ² = −1, no real basis) from the embedded 2N×2N one, where
 * every level's vectors come twice.
 */
function fullLevels(input: FieldSpinOrbitInput, withVectors: boolean): Level[] {
  const even = input.n % 2 === 0;
  const { size, matrix } = even ? timeEvenHamiltonian(input) : embeddedHamiltonian(input);
  const copies = even ? 1 : 2;
  return eigenRuns(matrix, size, withVectors).map((run) => {
    const degeneracy = run.count / copies;
    const vectors = withVectors ? complexStates(input.n, run.vectors, degeneracy) : [];
    return { energy: run.energy, degeneracy, vectors };
  });
}

/** The determinants of one class of 2M_J mod 2k, and whether Θ maps it onto another class (2M_J → −2M_J). */
interface AxialClass {
  readonly indices: readonly number[];
  readonly partner: boolean;
}

const axialCache = new Map<string, AxialClass[]>();

/**
 * The determinants of dⁿ by 2M_J mod 2k, the eigenvalue e^{−2πiM_J/k} of the rotation by 2π/k about
 * z: a field with that rotation couples only determinants of one class. Θ maps class c onto −c at
 * the same energies, so only c = 0…k are kept; those with a partner stand for two.
 */
function axialClasses(n: number, order: number): AxialClass[] {
  const key = `${n}:${order}`;
  const cached = axialCache.get(key);
  if (cached) return cached;
  const mod = 2 * order;
  const byClass: number[][] = Array.from({ length: mod }, () => []);
  fullBasis(n).block.masks.forEach((mask, i) => {
    const { ML, twoMS } = quantumNumbers(2, mask);
    byClass[(((2 * ML + twoMS) % mod) + mod) % mod]?.push(i);
  });
  const out: AxialClass[] = [];
  for (let c = 0; c <= order; c++) {
    const indices = byClass[c] ?? [];
    if (indices.length > 0) out.push({ indices, partner: c !== 0 && c !== order });
  }
  axialCache.set(key, out);
  return out;
}

/** Θz for a state over the determinants: (Θz)_j = sign·conj(z_i) where ΘD_i = sign·D_j. */
function reversedState(n: number, z: ComplexVector): ComplexVector {
  const { block } = fullBasis(n);
  const re = new Float64Array(z.re.length);
  const im = new Float64Array(z.re.length);
  block.masks.forEach((mask, i) => {
    const r = reversedDeterminant(mask);
    const j = block.index.get(r.mask) as number;
    re[j] = r.sign * (z.re[i] as number);
    im[j] = -r.sign * (z.im[i] as number);
  });
  return { re, im };
}

/** One class's block of H = A + iB: real where B vanishes there, else embedded as [[A, −B], [B, A]]. */
function classBlock(re: Float64Array, im: Float64Array, n: number, indices: readonly number[]) {
  const m = indices.length;
  let complex = false;
  for (const i of indices)
    for (const j of indices) if (Math.abs(im[i * n + j] as number) > 1e-12) complex = true;
  const size = complex ? 2 * m : m;
  const matrix = new Float64Array(size * size);
  indices.forEach((i, a) => {
    indices.forEach((j, b) => {
      const x = re[i * n + j] as number;
      matrix[a * size + b] = x;
      if (!complex) return;
      const y = im[i * n + j] as number;
      matrix[(m + a) * size + m + b] = x;
      matrix[a * size + m + b] = -y;
      matrix[(m + a) * size + b] = y;
    });
  });
  return { size, matrix, complex };
}

/**
 * The levels of a field that has a k-fold rotation about z (given in that frame), block by block
 * of 2M_J mod 2k: much smaller matrices than the full path's, the same levels (a test holds them
 * to it). Each class's levels stand also for their time-reversed images in the partner class.
 */
function axialLevels(input: FieldSpinOrbitInput, order: number, withVectors: boolean): Level[] {
  const { size: n, re, im } = complexHamiltonian(input);
  const parts: Level[] = [];
  for (const { indices, partner } of axialClasses(input.n, order)) {
    const { size, matrix, complex } = classBlock(re, im, n, indices);
    for (const run of eigenRuns(matrix, size, withVectors)) {
      const count = complex ? run.count / 2 : run.count;
      let vectors: ComplexVector[] = [];
      if (withVectors) {
        const states = run.vectors.map((v) => {
          const z = { re: new Float64Array(n), im: new Float64Array(n) };
          indices.forEach((i, a) => {
            z.re[i] = v[a] as number;
            if (complex) z.im[i] = v[indices.length + a] as number;
          });
          return z;
        });
        vectors = complex ? complexBasis(states, count) : states;
        if (partner) vectors = [...vectors, ...vectors.map((z) => reversedState(input.n, z))];
      }
      parts.push({ energy: run.energy, degeneracy: partner ? 2 * count : count, vectors });
    }
  }
  return mergedLevels(parts);
}

/** Levels of all classes merged by energy, lowest first. */
function mergedLevels(parts: Level[]): Level[] {
  parts.sort((a, b) => a.energy - b.energy);
  let scale = 1;
  for (const p of parts) scale = Math.max(scale, Math.abs(p.energy));
  const tol = DEGENERACY_TOLERANCE + DEGENERACY_RELATIVE * scale;
  const out: { energy: number; degeneracy: number; vectors: ComplexVector[]; last: number }[] = [];
  for (const p of parts) {
    const prev = out[out.length - 1];
    if (prev && p.energy - prev.last <= tol) {
      prev.energy =
        (prev.energy * prev.degeneracy + p.energy * p.degeneracy) / (prev.degeneracy + p.degeneracy);
      prev.degeneracy += p.degeneracy;
      prev.vectors.push(...p.vectors);
      prev.last = p.energy;
    } else {
      out.push({ energy: p.energy, degeneracy: p.degeneracy, vectors: [...p.vectors], last: p.energy });
    }
  }
  return out.map(({ energy, degeneracy, vectors }) => ({ energy, degeneracy, vectors }));
}

/** Largest entry, relative to the field's largest, that may break a rotation and still count as rounding. */
const AXIAL_TOLERANCE = 1e-9;

/**
 * The field carried into the group's standard frame, when it has the k-fold rotation about z
 * there (every ⟨m′|V|m⟩ with m′ − m not a multiple of k vanishes), else undefined.
 */
function axialField(field: Float64Array, frame: readonly number[], order: number): Float64Array | undefined {
  if (order < 2) return undefined;
  const turned = transformField(orbitalTransform(frame), field);
  const v = fieldInComplexBasis(turned);
  let scale = 0;
  for (const row of v) for (const x of row) scale = Math.max(scale, Math.hypot(x.re, x.im));
  for (let a = 0; a < 5; a++) {
    for (let b = 0; b < 5; b++) {
      const x = v[a]?.[b] ?? { re: 0, im: 0 };
      if ((a - b) % order !== 0 && Math.hypot(x.re, x.im) > AXIAL_TOLERANCE * (1 + scale)) return undefined;
    }
  }
  return turned;
}

/** Fraction of `level` in the span of `ref`: Σ|⟨u|v⟩|² over their orthonormal states, per state of `level`. */
function weightIn(level: Level, ref: Level): number {
  let w = 0;
  for (const v of level.vectors) {
    for (const u of ref.vectors) {
      let xr = 0;
      let xi = 0;
      for (let i = 0; i < v.re.length; i++) {
        const ur = u.re[i] as number;
        const ui = u.im[i] as number;
        const vr = v.re[i] as number;
        const vi = v.im[i] as number;
        xr += ur * vr + ui * vi;
        xi += ur * vi - ui * vr;
      }
      w += xr * xr + xi * xi;
    }
  }
  return w / level.vectors.length;
}

/** How the levels of one solve (and its references) are found: over all determinants or block by block in a frame. */
type LevelSolver = (input: FieldSpinOrbitInput, withVectors: boolean) => Level[];

/** The reference's levels with their labels (matched by energy above the reference ground). */
function labelledReference(
  input: FieldSpinOrbitInput,
  reference: SpinOrbitReference,
  levelsOf: LevelSolver,
): { level: Level; label: string }[] {
  const levels = levelsOf({ ...input, field: reference.field, zeta: reference.zeta }, true);
  const { above, tol } = aboveGround(levels.map((l) => l.energy));
  return levels.map((level, i) => {
    const e = above[i] ?? 0;
    const names = [
      ...new Set(reference.labels.filter((l) => Math.abs(l.energy - e) <= tol).map((l) => l.label)),
    ];
    return { level, label: names.length > 0 ? names.join('/') : '?' };
  });
}

function bestParent(level: Level, refs: readonly { level: Level; label: string }[]) {
  let best: SpinOrbitParent | undefined;
  for (const r of refs) {
    const weight = weightIn(level, r.level);
    if (!best || weight > best.weight) best = { label: r.label, weight };
  }
  return best;
}

/**
 * The solver for a solve and its references: block by block in the group's frame by the highest
 * rotation about its principal axis that every field has (a cubic reference of a D3h complex has
 * the C3 but not the C6 of the proper parts of S3), else over all determinants.
 */
function levelSolver(
  fields: readonly Float64Array[],
  group: PointGroup | undefined,
): { levelsOf: LevelSolver; frame: 'lab' | 'standard' } {
  const full = { levelsOf: fullLevels, frame: 'lab' as const };
  if (!group) return full;
  const frame = standardFrame(group);
  const highest = principalOrder(group);
  let order = highest;
  while (order >= 2 && (highest % order !== 0 || !fields.every((f) => axialField(f, frame, order)))) order--;
  if (order < 2) return full;
  return {
    levelsOf: (input, withVectors) =>
      axialLevels(
        { ...input, field: axialField(input.field, frame, order) as Float64Array },
        order,
        withVectors,
      ),
    frame: 'standard',
  };
}

/**
 * Levels of dⁿ in a general field with spin–orbit coupling, each with its degeneracy, where
 * references are given the spin–orbit-free and cubic levels it lies in most, and where a point
 * group is given its irreps in that group's double group.
 * @throws InputError for n outside 1…9, a bad B, C or ζ, or a field that is not a finite
 * symmetric 5×5 matrix.
 */
export function solveFieldSpinOrbit(
  input: FieldSpinOrbitInput,
  options: FieldSpinOrbitOptions = {},
): FieldSpinOrbitResult {
  checkFieldInput(input);
  checkZeta(input.zeta);
  const { group } = options;
  const symmetry = group ? spinOrbitSymmetry(fullBasis(input.n).block, input.n, group) : undefined;
  const named = options.spinFree !== undefined || options.cubic !== undefined || symmetry !== undefined;
  const fields = [input.field, options.spinFree?.field, options.cubic?.field].filter(
    (f): f is Float64Array => f !== undefined,
  );
  const { levelsOf, frame } = levelSolver(fields, options.blocked === false ? undefined : group);
  const levels = levelsOf(input, named);
  const spinFree = options.spinFree ? labelledReference(input, options.spinFree, levelsOf) : [];
  const cubic = options.cubic ? labelledReference(input, options.cubic, levelsOf) : [];
  const ground = levels[0]?.energy ?? 0;
  return {
    n: input.n,
    B: input.B,
    C: input.C,
    zeta: input.zeta,
    kramers: input.n % 2 === 1,
    groundEnergy: ground,
    ...(symmetry ? { pointGroup: symmetry.group } : {}),
    levels: levels.map((level, i) => {
      const parent = spinFree.length > 0 ? bestParent(level, spinFree) : undefined;
      const cubicParent = cubic.length > 0 ? bestParent(level, cubic) : undefined;
      const pointGroupLabel = symmetry
        ? levelLabel(symmetry, spaceCharacters(symmetry, level.vectors, frame))
        : undefined;
      return {
        index: i + 1,
        energy: level.energy - ground,
        degeneracy: level.degeneracy,
        ...(parent ? { parent } : {}),
        ...(cubicParent ? { cubicParent } : {}),
        ...(pointGroupLabel ? { pointGroupLabel } : {}),
      };
    }),
  };
}

/** The spin–orbit-free reference of a field from its labelled levels (solveField's result). */
export function spinFreeReference(field: Float64Array, result: FieldResult): SpinOrbitReference {
  return { field, zeta: 0, labels: result.levels.map((l) => ({ energy: l.energy, label: l.label })) };
}
