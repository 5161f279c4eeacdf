/**
 * Named ligand arrangements (names of this project) for the angular overlap model. Each places
 * its ligands on unit directions from the metal with kinds: `L` where all are alike, `eq` and `ax`
 * for equatorial and axial positions, `A` and `B` for the two ligands of MA₄B₂ and MA₃B₃. Where an
 * angle shapes the figure it is an option with the regular figure's value as its default.
 */

import { ensure } from '../core/errors.js';
import type { Ligand } from './angularOverlap.js';
import type { Vec3 } from './realOrbitals.js';

/** A named arrangement. */
export interface GeometryPreset {
  readonly name: string;
  /** One line for listings. */
  readonly description: string;
  /** The ligand kinds it uses, in the order they are described. */
  readonly kinds: readonly string[];
  /** The point group of the default figure (with distinct kinds). */
  readonly group: string;
  /** What `angle` means for this figure, when it takes one. */
  readonly angle?: { readonly meaning: string; readonly defaultDegrees: number };
  readonly ligands: (angleDegrees: number) => Ligand[];
}

/** The angle of a regular tetrahedron's bonds (and an octahedron's threefold view) from their axis, degrees. */
export const MAGIC_ANGLE = (Math.acos(1 / Math.sqrt(3)) * 180) / Math.PI;

/** Polar angle of an equilateral trigonal prism's ligands from its threefold axis (height = edge), degrees. */
export const PRISM_ANGLE = (Math.atan(2 / Math.sqrt(3)) * 180) / Math.PI;

const AXES: Readonly<Record<string, Vec3>> = {
  '+x': [1, 0, 0],
  '-x': [-1, 0, 0],
  '+y': [0, 1, 0],
  '-y': [0, -1, 0],
  '+z': [0, 0, 1],
  '-z': [0, 0, -1],
};

function onAxes(kinds: Readonly<Record<string, string>>): Ligand[] {
  return Object.entries(kinds).map(([axis, kind]) => ({ kind, direction: AXES[axis] ?? [0, 0, 1] }));
}

/** A ligand at polar angle θ and azimuth φ, degrees. */
export function polar(kind: string, thetaDeg: number, phiDeg: number): Ligand {
  const t = (thetaDeg * Math.PI) / 180;
  const p = (phiDeg * Math.PI) / 180;
  return { kind, direction: [Math.sin(t) * Math.cos(p), Math.sin(t) * Math.sin(p), Math.cos(t)] };
}

const octahedral = (ax: string, eq: string) =>
  onAxes({ '+x': eq, '-x': eq, '+y': eq, '-y': eq, '+z': ax, '-z': ax });

/** The presets, by name. */
export const GEOMETRY_PRESETS: readonly GeometryPreset[] = [
  {
    name: 'octahedron',
    description: 'six alike ligands on ±x, ±y, ±z',
    kinds: ['L'],
    group: 'Oh',
    ligands: () => octahedral('L', 'L'),
  },
  {
    name: 'elongated-octahedron',
    description: 'four equatorial (eq) and two weaker axial (ax) ligands along z (eσ(ax) < eσ(eq))',
    kinds: ['eq', 'ax'],
    group: 'D4h',
    ligands: () => octahedral('ax', 'eq'),
  },
  {
    name: 'compressed-octahedron',
    description: 'four equatorial (eq) and two stronger axial (ax) ligands along z (eσ(ax) > eσ(eq))',
    kinds: ['eq', 'ax'],
    group: 'D4h',
    ligands: () => octahedral('ax', 'eq'),
  },
  {
    name: 'square-plane',
    description: 'four ligands on ±x, ±y',
    kinds: ['L'],
    group: 'D4h',
    ligands: () => onAxes({ '+x': 'L', '-x': 'L', '+y': 'L', '-y': 'L' }),
  },
  {
    name: 'square-pyramid',
    description: 'four basal (eq) ligands and one apical (ax) ligand on +z',
    kinds: ['eq', 'ax'],
    group: 'C4v',
    angle: { meaning: 'angle between the apical and each basal bond', defaultDegrees: 90 },
    ligands: (a) => [polar('ax', 0, 0), ...[0, 90, 180, 270].map((phi) => polar('eq', a, phi))],
  },
  {
    name: 'trigonal-bipyramid',
    description: 'two axial (ax) ligands on ±z and three equatorial (eq) ligands in the xy plane',
    kinds: ['eq', 'ax'],
    group: 'D3h',
    ligands: () => [
      polar('ax', 0, 0),
      polar('ax', 180, 0),
      ...[0, 120, 240].map((phi) => polar('eq', 90, phi)),
    ],
  },
  {
    name: 'tetrahedron',
    description: 'four alike ligands at alternate corners of a cube',
    kinds: ['L'],
    group: 'Td',
    ligands: () => tetrahedral(MAGIC_ANGLE),
  },
  {
    name: 'flattened-tetrahedron',
    description: 'four alike ligands flattened along the S4 axis z towards a square plane',
    kinds: ['L'],
    group: 'D2d',
    angle: {
      meaning: 'angle of each bond from the S4 axis (54.74° regular, 90° square plane)',
      defaultDegrees: 65,
    },
    ligands: (a) => tetrahedral(a),
  },
  {
    name: 'trigonal-prism',
    description: 'six alike ligands at the corners of a trigonal prism about z',
    kinds: ['L'],
    group: 'D3h',
    angle: {
      meaning: 'angle of each bond from the threefold axis (49.11° equilateral)',
      defaultDegrees: PRISM_ANGLE,
    },
    ligands: (a) => [0, 120, 240].flatMap((phi) => [polar('L', a, phi), polar('L', 180 - a, phi)]),
  },
  {
    name: 'trigonal-antiprism',
    description:
      'six alike ligands of an octahedron seen down a threefold axis z, stretched or squashed along it',
    kinds: ['L'],
    group: 'D3d',
    angle: {
      meaning: 'angle of each bond from the threefold axis (54.74° regular octahedron)',
      defaultDegrees: 50,
    },
    ligands: (a) => [0, 120, 240].flatMap((phi) => [polar('L', a, phi), polar('L', 180 - a, phi + 60)]),
  },
  {
    name: 'trans-MA4B2',
    description: 'four A ligands on ±x, ±y and two B ligands on ±z',
    kinds: ['A', 'B'],
    group: 'D4h',
    ligands: () => octahedral('B', 'A'),
  },
  {
    name: 'cis-MA4B2',
    description: 'B ligands on +x and +y, A ligands on −x, −y, ±z',
    kinds: ['A', 'B'],
    group: 'C2v',
    ligands: () => onAxes({ '+x': 'B', '-x': 'A', '+y': 'B', '-y': 'A', '+z': 'A', '-z': 'A' }),
  },
  {
    name: 'fac-MA3B3',
    description: 'B ligands on +x, +y, +z (one face), A ligands opposite',
    kinds: ['A', 'B'],
    group: 'C3v',
    ligands: () => onAxes({ '+x': 'B', '-x': 'A', '+y': 'B', '-y': 'A', '+z': 'B', '-z': 'A' }),
  },
  {
    name: 'mer-MA3B3',
    description: 'B ligands on +x, −x, +z (one meridian), A ligands on ±y, −z',
    kinds: ['A', 'B'],
    group: 'C2v',
    ligands: () => onAxes({ '+x': 'B', '-x': 'B', '+y': 'A', '-y': 'A', '+z': 'B', '-z': 'A' }),
  },
];

function tetrahedral(thetaDeg: number): Ligand[] {
  return [
    polar('L', thetaDeg, 45),
    polar('L', thetaDeg, 225),
    polar('L', 180 - thetaDeg, 135),
    polar('L', 180 - thetaDeg, 315),
  ];
}

/** Names of the presets. */
export const GEOMETRY_NAMES: readonly string[] = GEOMETRY_PRESETS.map((p) => p.name);

/**
 * The ligands of a named arrangement, with `angleDegrees` for those that take an angle.
 * @throws InputError for an unknown name, an angle where none is taken, or one out of range.
 */
export function presetLigands(name: string, angleDegrees?: number): Ligand[] {
  const preset = GEOMETRY_PRESETS.find((p) => p.name.toLowerCase() === name.toLowerCase());
  ensure(preset !== undefined, `geometry "${name}": expected one of ${GEOMETRY_NAMES.join(', ')}`);
  if (angleDegrees !== undefined) {
    ensure(preset.angle !== undefined, `angle ${angleDegrees}°: geometry ${preset.name} takes no angle`);
    ensure(
      Number.isFinite(angleDegrees) && angleDegrees > 0 && angleDegrees < 180,
      `angle ${angleDegrees}°: expected a number of degrees between 0 and 180`,
    );
  }
  return preset.ligands(angleDegrees ?? preset.angle?.defaultDegrees ?? 0);
}
