import { rotateDeterminantsByMinors } from '../atom/determinantRotation.js';
import { congruence, symmetricEigen } from '../numeric/eigen.js';
import { decodeAdaptedBlocks } from './cubicBasisCodec.js';
import { STORED_CUBIC_BASES } from './cubicBasisData.js';
import { type DeterminantBlock, determinantBlock, determinantClasses } from './hamiltonian.js';
import { cubicRotations, rotationBlock, rotationOfShell } from './symmetry.js';

/**
 * The symmetry-adapted basis of dⁿ in a cubic field. Within each class k = M_L mod 4 (at the
 * lowest M_S), the basis vectors have a definite strong-field configuration t₂ᵃeᵇ, total spin S
 * and, for k = 0 and 2, parity p = ±1 under the C₂′ rotation about [110] (which maps M_L to −M_L
 * and so keeps those classes). H commutes with S² and C₂′, so it splits into blocks of one
 * (k, S, p): each much smaller than the determinant block, each eigenvector with its S known
 * and its configuration weights read off its components. The basis is built once per n, or (much
 * quicker at start-up) decoded from the stored copy in cubicBasisData.ts, which
 * test/field/cubicBasisData.test.ts holds equal, bit for bit, to what {@link buildAdaptedBlocks} builds.
 */
export interface AdaptedBlock {
  /** M_L mod 4 (0, 1 or 2). */
  readonly k: number;
  readonly S: number;
  /** Eigenvalue of C₂′(110) on the block: +1 or −1 for k = 0, 2; 0 for k = 1 (not defined there). */
  readonly parity: number;
  readonly size: number;
  /** ∂H/∂B in this basis, row-major size×size. */
  readonly partB: Float64Array;
  /** ∂H/∂C in this basis. */
  readonly partC: Float64Array;
  /** ∂H/∂Dq, diagonal: −4a + 6b of each basis vector. */
  readonly fieldDiagonal: Float64Array;
  /** e-set electron count b of each basis vector. */
  readonly eCount: readonly number[];
  /** Sum of the eight C₃ rotations in this basis (k = 0 only), for the E against A1 + A2 question. */
  readonly c3Sum: Float64Array | null;
  /** The determinants of class k, and the basis vectors as columns over them (rows: determinants). */
  readonly masks: readonly number[];
  readonly toDeterminants: Float64Array;
}

const cache = new Map<number, AdaptedBlock[]>();

/** The adapted blocks of dⁿ, n = 1…9, cached: decoded from the stored copy, else built. */
export function adaptedBlocks(n: number): AdaptedBlock[] {
  const cached = cache.get(n);
  if (cached) return cached;
  const stored = STORED_CUBIC_BASES[n - 1];
  const out = (stored && decodeAdaptedBlocks(n, stored, determinantClasses(n))) ?? buildAdaptedBlocks(n);
  cache.set(n, out);
  return out;
}

/**
 * The adapted blocks of dⁿ built from the determinants: the reference for the stored copy, and
 * the path taken where it cannot be read.
 */
export function buildAdaptedBlocks(n: number): AdaptedBlock[] {
  const rotations = cubicRotations();
  // The C₂′ with its axis in the xy plane maps M_L to −M_L.
  const c2pRotation = rotations.find((r) => r.cls === 'C2p' && r.matrix[8] === -1);
  const c3Rotations = rotations.filter((r) => r.cls === 'C3');
  const out: AdaptedBlock[] = [];
  determinantClasses(n).forEach((masks, k) => {
    const det = determinantBlock(masks);
    const size = masks.length;
    const c2p = k !== 1 && c2pRotation ? rotationBlock(2, det, rotationOfShell(2, c2pRotation.matrix)) : null;
    let c3Sum: Float64Array | null = null;
    if (k === 0) {
      // The class holds each rotation with its inverse, whose real matrix on the determinants is
      // the transpose (the representation is unitary): four rotations give the whole sum, which
      // is by far the dearest part of the basis (dense one-electron matrices).
      c3Sum = new Float64Array(size * size);
      for (const r of c3Rotations) {
        if (!isFirstOfInversePair(r.matrix, c3Rotations)) continue;
        const part = rotationBlock(2, det, rotationOfShell(2, r.matrix), rotateDeterminantsByMinors);
        for (let i = 0; i < size; i++) {
          for (let j = 0; j < size; j++) {
            c3Sum[i * size + j] =
              (c3Sum[i * size + j] as number) +
              (part[i * size + j] as number) +
              (part[j * size + i] as number);
          }
        }
      }
    }
    for (const group of splitClass(n, det, c2p)) {
      const cols = group.columns;
      const m = cols.length;
      const w = new Float64Array(size * m);
      cols.forEach((v, j) => {
        for (let i = 0; i < size; i++) w[i * m + j] = v[i] ?? 0;
      });
      const fieldDiagonal = Float64Array.from(group.eCount, (b) => -4 * (n - b) + 6 * b);
      out.push({
        k,
        S: group.S,
        parity: group.parity,
        size: m,
        partB: congruence(w, det.partB, size, m),
        partC: congruence(w, det.partC, size, m),
        fieldDiagonal,
        eCount: group.eCount,
        c3Sum: c3Sum ? congruence(w, c3Sum, size, m) : null,
        masks,
        toDeterminants: w,
      });
    }
  });
  return out;
}

/** Whether `matrix` comes before its inverse (its transpose) in `rotations`. */
function isFirstOfInversePair(
  matrix: readonly number[],
  rotations: readonly { matrix: readonly number[] }[],
): boolean {
  const transpose = [0, 3, 6, 1, 4, 7, 2, 5, 8].map((i) => matrix[i]);
  const self = rotations.findIndex((r) => r.matrix === matrix);
  const inverse = rotations.findIndex((r) => r.matrix.every((x, i) => x === transpose[i]));
  if (inverse < 0 || inverse === self) throw new Error('C3 class: a rotation without its inverse');
  return self < inverse;
}

interface Group {
  S: number;
  parity: number;
  columns: Float64Array[];
  eCount: number[];
}

/**
 * Splits one class into (S, parity) groups of basis vectors with definite configuration: the
 * field operator is diagonalised first (its eigenvalue gives b), then S² within each b, then C₂′
 * within each (b, S). All three commute, so the result is a common eigenbasis.
 */
function splitClass(n: number, det: DeterminantBlock, c2p: Float64Array | null): Group[] {
  const size = det.masks.length;
  const field = symmetricEigen(det.partDq, size);
  const byB = new Map<number, Float64Array[]>();
  field.values.forEach((v, j) => {
    const b = Math.round((v + 4 * n) / 10);
    const col = new Float64Array(size);
    for (let i = 0; i < size; i++) col[i] = field.vectors[i * size + j] ?? 0;
    const list = byB.get(b) ?? [];
    list.push(col);
    byB.set(b, list);
  });
  const groups = new Map<string, Group>();
  for (const [b, cols] of byB) {
    for (const bySpin of diagonalWithin(cols, det.spinSquared)) {
      const S = Math.round(((-1 + Math.sqrt(1 + 4 * Math.max(0, bySpin.value))) / 2) * 2) / 2;
      const parts = c2p ? diagonalWithin(bySpin.vectors, c2p) : [{ value: 0, vectors: bySpin.vectors }];
      for (const part of parts) {
        const parity = Math.round(part.value);
        const key = `${S}:${parity}`;
        const g = groups.get(key) ?? { S, parity, columns: [], eCount: [] };
        for (const v of part.vectors) {
          g.columns.push(v);
          g.eCount.push(b);
        }
        groups.set(key, g);
      }
    }
  }
  return [...groups.values()];
}

/** Eigenspaces of a symmetric operator within the span of orthonormal vectors, eigenvalues rounded apart by 0.5. */
function diagonalWithin(
  vectors: Float64Array[],
  op: Float64Array,
): { value: number; vectors: Float64Array[] }[] {
  const size = vectors[0]?.length ?? 0;
  const m = vectors.length;
  const w = new Float64Array(size * m);
  vectors.forEach((v, j) => {
    for (let i = 0; i < size; i++) w[i * m + j] = v[i] ?? 0;
  });
  const small = congruence(w, op, size, m);
  const eig = symmetricEigen(small, m);
  const out: { value: number; vectors: Float64Array[] }[] = [];
  for (let c = 0; c < m; c++) {
    const value = eig.values[c] ?? 0;
    const v = new Float64Array(size);
    for (let j = 0; j < m; j++) {
      const coef = eig.vectors[j * m + c] ?? 0;
      if (coef === 0) continue;
      for (let i = 0; i < size; i++) v[i] = (v[i] ?? 0) + coef * (w[i * m + j] ?? 0);
    }
    const last = out[out.length - 1];
    if (last && Math.abs(value - last.value) < 0.5) last.vectors.push(v);
    else out.push({ value, vectors: [v] });
  }
  return out;
}
