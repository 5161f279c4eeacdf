/**
 * The levels of a dⁿ ion in a complex of lower than cubic symmetry, from its geometry and bonding
 * parameters (angular overlap model) or from published tetragonal or trigonal crystal-field
 * parameters: the field, its point group, the labelled levels, the one-electron orbital energies
 * and the nearest cubic field with each level's cubic parent.
 */

import { ensure } from '../core/errors.js';
import { aomField, type BondParameters, dsMixingField, type Ligand } from './angularOverlap.js';
import { tetragonalField, trigonalField, trigonalFrame } from './axialFields.js';
import { cubicParents, cubicReference } from './cubicParent.js';
import {
  type FieldSpinOrbitResult,
  type SpinOrbitReference,
  solveFieldSpinOrbit,
  spinFreeReference,
} from './fieldSpinOrbit.js';
import { presetLigands } from './geometries.js';
import { type FieldResult, solveField, symmetryContext } from './lowSymmetrySolver.js';
import {
  DEFAULT_SYMMETRY_TOLERANCE,
  idealisedLigands,
  MAX_SYMMETRY_TOLERANCE,
  type PointGroup,
  pointGroup,
} from './pointGroups.js';
import { apply3, orbitalTransform, transformField } from './realOrbitals.js';
import { checkZeta } from './spinOrbit.js';
import { solveSpinOrbit } from './spinOrbitSolver.js';

/** How the one-electron field is given. */
export type FieldSpec =
  | {
      readonly kind: 'aom';
      readonly ligands: readonly Ligand[];
      readonly parameters: Readonly<Record<string, BondParameters>>;
      /**
       * Largest mismatch of a moved unit ligand direction for a symmetry operation; a loose one
       * (e.g. 0.02 for measured coordinates) idealises the field to the group found.
       * @default DEFAULT_SYMMETRY_TOLERANCE
       */
      readonly symmetryTolerance?: number;
      /** The d–s mixing parameter e_ds of the complex, cm⁻¹ (see dsMixingField). @default 0 */
      readonly eDs?: number;
    }
  | { readonly kind: 'tetragonal'; readonly dq: number; readonly ds: number; readonly dt: number }
  | { readonly kind: 'trigonal'; readonly dq: number; readonly dSigma: number; readonly dTau: number };

/** Input of {@link solveDistorted}. Energies in cm⁻¹. */
export interface DistortedInput {
  /** Number of d electrons, 1…9. */
  readonly n: number;
  readonly B: number;
  readonly C: number;
  readonly field: FieldSpec;
}

/** One d orbital level (an eigenvalue of the one-electron field) with its irrep. */
export interface OrbitalLevel {
  /** Irrep in lower case (`b1g`), `?` where unlabelled. */
  readonly irrep: string;
  /** Energy relative to the barycentre of the five orbitals, cm⁻¹. */
  readonly energy: number;
  readonly dimension: number;
}

/** The levels of a distorted complex. */
export interface DistortedResult extends FieldResult {
  /** The point group used for the labels. */
  readonly group: string;
  /** The one-electron field over xy, yz, z², xz, x²−y² (row-major 5×5). */
  readonly field: Float64Array;
  /** The d orbital levels, lowest first. */
  readonly orbitals: readonly OrbitalLevel[];
  /** The nearest cubic field: Dq with the octahedral sign, and the relative misfit (0 = cubic). */
  readonly cubic: { readonly dq: number; readonly misfit: number };
}

/** Fraction of a level below which its cubic parent is not named. */
export const PARENT_MIN_WEIGHT = 0.5;

/**
 * The ligand set that stands for a field given by parameters, for its point group: the
 * tetragonal field has the symmetry of trans-MA₄B₂ (D4h, x towards a ligand); the trigonal one
 * that of an octahedron turned as in trigonalField and stretched along z (D3d).
 */
function standInLigands(spec: FieldSpec): readonly Ligand[] {
  if (spec.kind === 'aom') return spec.ligands;
  if (spec.kind === 'tetragonal') return presetLigands('trans-MA4B2');
  const r = trigonalFrame();
  return presetLigands('octahedron').map((l) => {
    const d = apply3(r, l.direction);
    return { ...l, direction: [d[0], d[1], 1.2 * d[2]] };
  });
}

/** The field of a {@link FieldSpec}. */
export function fieldOf(spec: FieldSpec): Float64Array {
  if (spec.kind === 'aom') {
    const field = aomField(spec.ligands, spec.parameters);
    if (!spec.eDs) return field;
    const ds = dsMixingField(spec.ligands, spec.eDs);
    return field.map((x, k) => x + (ds[k] ?? 0));
  }
  if (spec.kind === 'tetragonal') return tetragonalField(spec.dq, spec.ds, spec.dt);
  return trigonalField(spec.dq, spec.dSigma, spec.dTau);
}

/**
 * The field description with its ligands idealised to the symmetry they have within a symmetry
 * tolerance looser than the default (see {@link idealisedLigands}); others as they are.
 */
export function idealised(spec: FieldSpec): FieldSpec {
  if (spec.kind !== 'aom' || spec.symmetryTolerance === undefined) return spec;
  const tolerance = spec.symmetryTolerance;
  ensure(
    Number.isFinite(tolerance) && tolerance > 0 && tolerance <= MAX_SYMMETRY_TOLERANCE,
    `symmetry tolerance ${tolerance}: expected a number above 0 and at most ${MAX_SYMMETRY_TOLERANCE}`,
  );
  const { symmetryTolerance: _, ...rest } = spec;
  return tolerance <= DEFAULT_SYMMETRY_TOLERANCE
    ? rest
    : { ...rest, ligands: idealisedLigands(spec.ligands, tolerance) };
}

/** The point group of the field's ligands (or of the stand-in ligands of a parameterised field). */
export function groupOf(spec: FieldSpec): PointGroup {
  return pointGroup(standInLigands(idealised(spec)));
}

/**
 * Levels of dⁿ in a field given by geometry and bonding parameters or by published tetragonal or
 * trigonal parameters, labelled in the point group, with cubic parents where the distortion is
 * small enough for them to mean something (weight ≥ {@link PARENT_MIN_WEIGHT}).
 * @throws InputError for bad n, B, C, ligands or parameters.
 */
export function solveDistorted(input: DistortedInput): DistortedResult {
  const { n, B, C } = input;
  const spec = idealised(input.field);
  ensure(spec.kind === 'aom' ? spec.ligands.length > 0 : true, 'ligands: expected at least one');
  const group = groupOf(spec);
  const field = symmetrised(fieldOf(spec), group);
  const ligands = standInLigands(spec);
  const reference = cubicReference(field, ligands, group);
  const result = solveField(
    { n, field, B, C },
    {
      symmetry: symmetryContext(n, group),
      parents: (spaces) =>
        cubicParents({ n, field, B, C }, spaces, reference).map((p) =>
          p && p.weight >= PARENT_MIN_WEIGHT ? p : undefined,
        ),
    },
  );
  return {
    ...result,
    group: group.name,
    field,
    orbitals: orbitalLevels(field, group),
    cubic: { dq: reference.dq, misfit: reference.misfit },
  };
}

/**
 * The field averaged over the group, (1/|G|) Σ T_g V T_gᵀ: unchanged (to rounding) for ligands that
 * have the group's symmetry exactly, and idealised to it for coordinates that have it only within
 * a loose tolerance, so that the levels carry the group's labels.
 */
export function symmetrised(field: Float64Array, group: PointGroup): Float64Array {
  const out = new Float64Array(25);
  for (const op of group.operations) {
    const moved = transformField(orbitalTransform(op.matrix), field);
    for (let k = 0; k < 25; k++) out[k] = (out[k] ?? 0) + (moved[k] ?? 0) / group.operations.length;
  }
  return out;
}

/** The d orbital levels of a field labelled in a group: the levels of d¹ with B = C = 0. */
export function orbitalLevels(field: Float64Array, group: PointGroup): OrbitalLevel[] {
  const one = solveField({ n: 1, field, B: 0, C: 0 }, { symmetry: symmetryContext(1, group) });
  // Energies come above the lowest level; the barycentre is their dimension-weighted mean.
  const barycentre = one.levels.reduce((s, l) => s + l.energy * l.dimension, 0) / 5;
  return one.levels.map((l) => ({
    irrep: l.irrep ? l.irrep.toLowerCase() : '?',
    energy: l.energy - barycentre,
    dimension: l.dimension,
  }));
}

/** A distorted complex's levels without and with spin–orbit coupling. */
export interface DistortedSpinOrbitResult extends DistortedResult {
  /** The levels with ζ: degeneracy, spin–orbit-free parent, cubic double-group parent when near cubic, irreps in the double group of `group`. */
  readonly spinOrbit: FieldSpinOrbitResult;
}

/**
 * Levels of a distorted complex with spin–orbit coupling ζ, besides those without: each named by
 * its degeneracy, its irreps in the double group of the complex's point group (spinor irreps such
 * as Γ7g for odd n), the level without ζ it lies in most and, for small distortions (weight ≥
 * {@link PARENT_MIN_WEIGHT}), the double-group level of the nearest cubic field with the same ζ.
 * @throws InputError as {@link solveDistorted}, and for ζ outside 0…MAX_ZETA.
 */
export function solveDistortedSpinOrbit(
  input: DistortedInput & { readonly zeta: number },
): DistortedSpinOrbitResult {
  checkZeta(input.zeta);
  const base = solveDistorted(input);
  const { n, B, C, zeta } = input;
  const spec = idealised(input.field);
  const reference = cubicReference(base.field, standInLigands(spec), groupOf(spec));
  let cubic: SpinOrbitReference | undefined;
  if (Math.abs(reference.dq) >= 1) {
    const geometry = reference.dq >= 0 ? 'oct' : 'tet';
    const levels = solveSpinOrbit({
      n,
      geometry,
      dq: Math.abs(reference.dq),
      B,
      C,
      zeta,
      parentage: false,
    }).levels;
    cubic = {
      field: reference.field,
      zeta,
      labels: levels.map((l) => ({ energy: l.energy, label: l.label })),
    };
  }
  const solved = solveFieldSpinOrbit(
    { n, field: base.field, B, C, zeta },
    { spinFree: spinFreeReference(base.field, base), group: groupOf(spec), ...(cubic ? { cubic } : {}) },
  );
  const levels = solved.levels.map((l) => {
    if (!l.cubicParent || l.cubicParent.weight >= PARENT_MIN_WEIGHT) return l;
    const { cubicParent: _, ...rest } = l;
    return rest;
  });
  return { ...base, spinOrbit: { ...solved, levels } };
}
