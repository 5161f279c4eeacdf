/**
 * The angular overlap model of the d-orbital field: each ligand adds eσ·Fσ(i)Fσ(j) +
 * eπx·Fπx(i)Fπx(j) + eπy·Fπy(i)Fπy(j) to ⟨i|V|j⟩, where F are the angular factors of the real d
 * orbitals towards the ligand (Schäffer & Jørgensen, Mol. Phys. 9, 401, 1965; Schäffer, Struct.
 * Bond. 5, 68, 1968). Fσ(i) = nᵀQᵢn for the ligand direction n, and Fπ(i) = 2uᵀQᵢn/√3 for a unit
 * vector u perpendicular to n (the π plane spanned by n and u): the orbital's overlap with a σ
 * orbital along n and a p orbital along u, normalised so that d_z² has Fσ = 1 towards z and
 * d_xz has Fπ = 1 towards z in the xz plane.
 */

import { ensure } from '../core/errors.js';
import { cross, dot, formValues, unit, type Vec3 } from './realOrbitals.js';

/** One donor atom seen from the metal. */
export interface Ligand {
  /** The ligand kind: its bonding parameters are looked up under this name. */
  readonly kind: string;
  /** Direction (or position) from the metal; only the direction counts. */
  readonly direction: Vec3;
  /**
   * A direction in the first π plane (eπx), for ligands with different π bonding in two planes;
   * its part perpendicular to the bond is used. @default z, or x for a ligand on the z axis
   */
  readonly piAxis?: Vec3;
}

/** Bonding parameters of one ligand kind, cm⁻¹. */
export interface BondParameters {
  /** eσ. */
  readonly eSigma: number;
  /** eπ in both π planes. @default 0 */
  readonly ePi?: number;
  /** eπ in the plane of `piAxis` (overrides ePi there). */
  readonly ePiX?: number;
  /** eπ in the plane perpendicular to `piAxis` (overrides ePi there). */
  readonly ePiY?: number;
}

/** Cosine above which a ligand counts as lying on the z axis when its π frame is chosen. */
const ON_AXIS = 1 - 1e-9;

/** The two π directions (u, v) perpendicular to a ligand direction n. */
export function piFrame(n: Vec3, piAxis?: Vec3): [Vec3, Vec3] {
  const reference: Vec3 = piAxis ?? (Math.abs(n[2]) > ON_AXIS ? [1, 0, 0] : [0, 0, 1]);
  const along = dot(reference, n);
  const perp: Vec3 = [reference[0] - along * n[0], reference[1] - along * n[1], reference[2] - along * n[2]];
  ensure(
    Math.hypot(...perp) > 1e-6,
    `π axis (${reference.join(', ')}): expected a direction not along the bond (${n.join(', ')})`,
  );
  const u = unit(perp);
  return [u, cross(n, u)];
}

/** Adds w·f fᵀ to a 5×5 matrix. */
function addOuter(v: Float64Array, f: readonly number[], w: number): void {
  if (w === 0) return;
  for (let i = 0; i < 5; i++) {
    for (let j = 0; j < 5; j++) v[5 * i + j] = (v[5 * i + j] ?? 0) + w * (f[i] ?? 0) * (f[j] ?? 0);
  }
}

/**
 * The d-orbital field (real orbitals, row-major 5×5, cm⁻¹) of a set of ligands with the bonding
 * parameters of each kind.
 * @throws InputError for a ligand at the origin, a kind without parameters or a non-finite value.
 */
export function aomField(
  ligands: readonly Ligand[],
  parameters: Readonly<Record<string, BondParameters>>,
): Float64Array {
  const v = new Float64Array(25);
  for (const ligand of ligands) {
    const p = parameters[ligand.kind];
    ensure(p !== undefined, `ligand kind "${ligand.kind}": expected bonding parameters (eσ, eπ) for it`);
    const d = ligand.direction;
    ensure(
      d.every(Number.isFinite) && Math.hypot(...d) > 1e-9,
      `ligand direction (${d.join(', ')}): expected a non-zero finite vector`,
    );
    const eSigma = p.eSigma;
    const ePiX = p.ePiX ?? p.ePi ?? 0;
    const ePiY = p.ePiY ?? p.ePi ?? 0;
    for (const [name, x] of [
      ['eσ', eSigma],
      ['eπ', ePiX],
      ['eπ', ePiY],
    ] as const) {
      ensure(Number.isFinite(x), `${name} of ligand kind "${ligand.kind}" = ${x}: expected a number of cm⁻¹`);
    }
    const n = unit(d);
    const [u, w] = piFrame(n, ligand.piAxis);
    addOuter(v, formValues(n, n), eSigma);
    const scale = 2 / Math.sqrt(3);
    addOuter(
      v,
      formValues(u, n).map((x) => scale * x),
      ePiX,
    );
    addOuter(
      v,
      formValues(w, n).map((x) => scale * x),
      ePiY,
    );
  }
  return v;
}

/**
 * The d–s mixing term of the angular overlap model: the metal s orbital interacts with the
 * totally symmetric combination of the ligands' σ orbitals and, through it, pushes down the
 * d combination s_i = Σ_L Fσ_L(i); the field gains −e_ds·s sᵀ. It vanishes for centrosymmetric
 * cubic sites and lowers d_z² of a square plane by 4e_ds (Smith, Inorg. Chim. Acta 22, 107, 1977;
 * Deeth & Gerloch, Inorg. Chem. 23, 3846, 1984 — from memory).
 */
export function dsMixingField(ligands: readonly Ligand[], eDs: number): Float64Array {
  ensure(Number.isFinite(eDs), `e_ds = ${eDs}: expected a number of cm⁻¹`);
  const s = [0, 0, 0, 0, 0];
  for (const ligand of ligands) {
    const n = unit(ligand.direction);
    formValues(n, n).forEach((f, i) => {
      s[i] = (s[i] ?? 0) + f;
    });
  }
  const v = new Float64Array(25);
  addOuter(v, s, -eDs);
  return v;
}
