/**
 * Character tables of the point groups met by d-metal complexes (any group-theory text, e.g.
 * Cotton, Chemical Applications of Group Theory, 3rd ed., 1990, appendix IIA), the assignment of
 * each symmetry operation to its class, and the decomposition of a representation into irreps
 * from its characters.
 *
 * Groups with inversion are direct products with Ci; d functions are even, so only their g
 * irreps occur, and those are the irreps of the rotation subgroup with a g added: the operations
 * are matched by their proper part P = det·R. Complex-conjugate pairs of one-dimensional irreps
 * (C3, C4, S4, C3h) are merged into one real E, as a real Hamiltonian keeps them degenerate.
 */

import type { PointGroup, SymmetryOperation } from './pointGroups.js';
import { dot, type Vec3 } from './realOrbitals.js';

/** Where an operation's axis (of its proper part; a mirror's normal) lies in the standard frame. */
type AxisRule = 'any' | 'z' | 'perp' | 'perp0' | 'perp1' | 'fourfold' | 'notFourfold';

/** One class of a character table: operations with this det (if given), order and axis. */
interface ClassRule {
  readonly det?: 1 | -1;
  readonly order: number;
  readonly axis?: AxisRule;
}

interface CharacterTable {
  readonly classes: readonly ClassRule[];
  /** Irrep name and its character on each class. */
  readonly irreps: readonly (readonly [string, readonly number[]])[];
  /** Spinor irreps: name and character on the ω ≤ π element of each class (none: not tabulated here). */
  readonly spinors?: readonly (readonly [string, readonly number[]])[];
  /** The principal order n, for the families perp0 / perp1 of axes at kπ/n from x (k even / odd). */
  readonly n: number;
}

const E: ClassRule = { order: 1 };

/** O*: Γ6 = D^½, Γ7 = Γ6 ⊗ A2, Γ8 = Γ6 ⊗ E (Koster 1963). */
const CUBIC_SPINORS: CharacterTable['spinors'] = [
  ['Γ6', [2, 1, 0, Math.SQRT2, 0]],
  ['Γ7', [2, 1, 0, -Math.SQRT2, 0]],
  ['Γ8', [4, -1, 0, 0, 0]],
];

const O_TABLE: CharacterTable = {
  n: 4,
  spinors: CUBIC_SPINORS,
  classes: [E, { order: 3 }, { order: 2, axis: 'fourfold' }, { order: 4 }, { order: 2, axis: 'notFourfold' }],
  irreps: [
    ['A1', [1, 1, 1, 1, 1]],
    ['A2', [1, 1, 1, -1, -1]],
    ['E', [2, -1, 2, 0, 0]],
    ['T1', [3, 0, -1, 1, -1]],
    ['T2', [3, 0, -1, -1, 1]],
  ],
};

const TD_TABLE: CharacterTable = {
  ...O_TABLE,
  classes: [E, { det: 1, order: 3 }, { det: 1, order: 2 }, { det: -1, order: 4 }, { det: -1, order: 2 }],
};

const FOURFOLD_IRREPS: CharacterTable['irreps'] = [
  ['A1', [1, 1, 1, 1, 1]],
  ['A2', [1, 1, 1, -1, -1]],
  ['B1', [1, -1, 1, 1, -1]],
  ['B2', [1, -1, 1, -1, 1]],
  ['E', [2, 0, -2, 0, 0]],
];

/** D4*, C4v*, D2d*: Γ6 = D^½, Γ7 = Γ6 ⊗ B1 (Koster 1963); zero on every twofold class. */
const FOURFOLD_SPINORS: CharacterTable['spinors'] = [
  ['Γ6', [2, Math.SQRT2, 0, 0, 0]],
  ['Γ7', [2, -Math.SQRT2, 0, 0, 0]],
];

const D4_TABLE: CharacterTable = {
  n: 4,
  spinors: FOURFOLD_SPINORS,
  classes: [
    E,
    { order: 4 },
    { order: 2, axis: 'z' },
    { order: 2, axis: 'perp0' },
    { order: 2, axis: 'perp1' },
  ],
  irreps: FOURFOLD_IRREPS,
};

const C4V_TABLE: CharacterTable = {
  n: 4,
  spinors: FOURFOLD_SPINORS,
  classes: [
    E,
    { order: 4 },
    { det: 1, order: 2 },
    { det: -1, order: 2, axis: 'perp0' },
    { det: -1, order: 2, axis: 'perp1' },
  ],
  irreps: FOURFOLD_IRREPS,
};

const D2D_TABLE: CharacterTable = {
  n: 4,
  spinors: FOURFOLD_SPINORS,
  classes: [
    E,
    { det: -1, order: 4 },
    { det: 1, order: 2, axis: 'z' },
    { det: 1, order: 2, axis: 'perp' },
    { det: -1, order: 2 },
  ],
  irreps: FOURFOLD_IRREPS,
};

const THREEFOLD_IRREPS: CharacterTable['irreps'] = [
  ['A1', [1, 1, 1]],
  ['A2', [1, 1, -1]],
  ['E', [2, -1, 0]],
];

/**
 * D3*, C3v*: Γ4 = D^½; Γ5, Γ6 one-dimensional with χ(C3) = −1, χ(C2) = ±i, complex conjugates
 * kept degenerate by time reversal, merged (Koster 1963).
 */
const THREEFOLD_SPINORS: CharacterTable['spinors'] = [
  ['Γ4', [2, 1, 0]],
  ['Γ5+Γ6', [2, -2, 0]],
];

const D3_TABLE: CharacterTable = {
  n: 3,
  classes: [E, { order: 3 }, { order: 2 }],
  irreps: THREEFOLD_IRREPS,
  spinors: THREEFOLD_SPINORS,
};

const C3V_TABLE: CharacterTable = {
  n: 3,
  spinors: THREEFOLD_SPINORS,
  classes: [E, { det: 1, order: 3 }, { det: -1, order: 2 }],
  irreps: THREEFOLD_IRREPS,
};

/** D3h*: Γ7 = D^½ (χ(S3) = 2cos(π/6) = √3), Γ8 = Γ7 ⊗ A1″, Γ7 ⊗ E′ = Γ8 + Γ9 (Koster 1963). */
const D3H_TABLE: CharacterTable = {
  n: 3,
  spinors: [
    ['Γ7', [2, 1, 0, 0, Math.sqrt(3), 0]],
    ['Γ8', [2, 1, 0, 0, -Math.sqrt(3), 0]],
    ['Γ9', [2, -2, 0, 0, 0, 0]],
  ],
  classes: [
    E,
    { det: 1, order: 3 },
    { det: 1, order: 2 },
    { det: -1, order: 2, axis: 'z' },
    { det: -1, order: 6 },
    { det: -1, order: 2, axis: 'perp' },
  ],
  irreps: [
    ["A1'", [1, 1, 1, 1, 1, 1]],
    ["A2'", [1, 1, -1, 1, 1, -1]],
    ["E'", [2, -1, 0, 2, -1, 0]],
    ['A1"', [1, 1, 1, -1, -1, -1]],
    ['A2"', [1, 1, -1, -1, -1, 1]],
    ['E"', [2, -1, 0, -2, 1, 0]],
  ],
};

/** D2*, C2v*: the one spinor irrep Γ5 = D^½, zero on every twofold class (Koster 1963). */
const TWOFOLD_SPINORS: CharacterTable['spinors'] = [['Γ5', [2, 0, 0, 0]]];

const D2_TABLE: CharacterTable = {
  n: 2,
  spinors: TWOFOLD_SPINORS,
  classes: [E, { order: 2, axis: 'z' }, { order: 2, axis: 'perp1' }, { order: 2, axis: 'perp0' }],
  irreps: [
    ['A', [1, 1, 1, 1]],
    ['B1', [1, 1, -1, -1]],
    ['B2', [1, -1, 1, -1]],
    ['B3', [1, -1, -1, 1]],
  ],
};

const C2V_TABLE: CharacterTable = {
  n: 2,
  spinors: TWOFOLD_SPINORS,
  classes: [
    E,
    { det: 1, order: 2 },
    { det: -1, order: 2, axis: 'perp1' },
    { det: -1, order: 2, axis: 'perp0' },
  ],
  irreps: [
    ['A1', [1, 1, 1, 1]],
    ['A2', [1, 1, -1, -1]],
    ['B1', [1, -1, 1, -1]],
    ['B2', [1, -1, -1, 1]],
  ],
};

/**
 * C2*, Cs*: the two one-dimensional spinor irreps Γ3, Γ4 (χ = ±i on the twofold element) are
 * complex conjugates, kept together by time reversal (Koster 1963; the numbering from memory).
 */
const BINARY_SPINORS: CharacterTable['spinors'] = [['Γ3+Γ4', [2, 0]]];

const C2_TABLE: CharacterTable = {
  n: 2,
  spinors: BINARY_SPINORS,
  classes: [E, { order: 2 }],
  irreps: [
    ['A', [1, 1]],
    ['B', [1, -1]],
  ],
};

const CS_TABLE: CharacterTable = {
  n: 1,
  spinors: BINARY_SPINORS,
  classes: [E, { det: -1, order: 2 }],
  irreps: [
    ["A'", [1, 1]],
    ['A"', [1, -1]],
  ],
};

const C1_TABLE: CharacterTable = { n: 1, classes: [E], irreps: [['A', [1]]] };

const CYCLIC4_IRREPS: CharacterTable['irreps'] = [
  ['A', [1, 1, 1]],
  ['B', [1, -1, 1]],
  ['E', [2, 0, -2]],
];

const C4_TABLE: CharacterTable = { n: 4, classes: [E, { order: 4 }, { order: 2 }], irreps: CYCLIC4_IRREPS };

const S4_TABLE: CharacterTable = {
  n: 4,
  classes: [E, { det: -1, order: 4 }, { det: 1, order: 2 }],
  irreps: CYCLIC4_IRREPS,
};

/**
 * C3*: Γ5, Γ6 (χ(C3) = e^{±iπ/3}) complex conjugates kept together by time reversal, their sum
 * D^½; Γ4 (χ(C3) = −1) real, so time reversal doubles it: a Kramers doublet 2Γ4 (Koster 1963;
 * the numbering from memory).
 */
const C3_TABLE: CharacterTable = {
  n: 3,
  spinors: [
    ['Γ5+Γ6', [2, 1]],
    ['Γ4', [1, -1]],
  ],
  classes: [E, { order: 3 }],
  irreps: [
    ['A', [1, 1]],
    ['E', [2, -1]],
  ],
};

const C3H_TABLE: CharacterTable = {
  n: 3,
  classes: [E, { det: 1, order: 3 }, { det: -1, order: 2 }, { det: -1, order: 6 }],
  irreps: [
    ["A'", [1, 1, 1, 1]],
    ["E'", [2, -1, 2, -1]],
    ['A"', [1, 1, -1, -1]],
    ['E"', [2, -1, -2, 1]],
  ],
};

/** How each supported group is labelled: its table, and whether it has inversion (g labels). */
const GROUPS: Readonly<Record<string, { table: CharacterTable; gerade: boolean }>> = {
  Oh: { table: O_TABLE, gerade: true },
  O: { table: O_TABLE, gerade: false },
  Td: { table: TD_TABLE, gerade: false },
  D4h: { table: D4_TABLE, gerade: true },
  D4: { table: D4_TABLE, gerade: false },
  C4v: { table: C4V_TABLE, gerade: false },
  D2d: { table: D2D_TABLE, gerade: false },
  C4h: { table: C4_TABLE, gerade: true },
  C4: { table: C4_TABLE, gerade: false },
  S4: { table: S4_TABLE, gerade: false },
  D3d: { table: D3_TABLE, gerade: true },
  D3: { table: D3_TABLE, gerade: false },
  C3v: { table: C3V_TABLE, gerade: false },
  D3h: { table: D3H_TABLE, gerade: false },
  S6: { table: C3_TABLE, gerade: true },
  C3: { table: C3_TABLE, gerade: false },
  C3h: { table: C3H_TABLE, gerade: false },
  D2h: { table: D2_TABLE, gerade: true },
  D2: { table: D2_TABLE, gerade: false },
  C2v: { table: C2V_TABLE, gerade: false },
  C2h: { table: C2_TABLE, gerade: true },
  C2: { table: C2_TABLE, gerade: false },
  Cs: { table: CS_TABLE, gerade: false },
  Ci: { table: C1_TABLE, gerade: true },
  C1: { table: C1_TABLE, gerade: false },
};

/** Names of the groups whose states are labelled. */
export const LABELLED_GROUPS: readonly string[] = Object.keys(GROUPS);

/** An irrep of a labelled group with its character on each class. */
export interface GroupIrrep {
  /** Name with g where the group has inversion, e.g. `B1g`, `E'`. */
  readonly name: string;
  /** Dimension over the reals (2 for a merged complex pair). */
  readonly dimension: number;
  /** χ on each class, in the order of {@link GroupCharacters.classSizes} (for a spinor irrep, on the ω ≤ π element). */
  readonly characters: readonly number[];
  /** A merged time-reversal pair of complex-conjugate one-dimensional spinor irreps (`Γ5+Γ6`). */
  readonly pair?: boolean;
}

/** The character table of a detected group, tied to its operations. */
export interface GroupCharacters {
  readonly irreps: readonly GroupIrrep[];
  /** The spinor irreps of the double group (odd electron counts with ζ); empty where not tabulated. */
  readonly spinors: readonly GroupIrrep[];
  /** Number of the group's operations in each class. */
  readonly classSizes: readonly number[];
  /** Index (into `PointGroup.operations`) of one operation of each class. */
  readonly representatives: readonly number[];
}
function matches(
  rule: ClassRule,
  op: SymmetryOperation,
  group: PointGroup,
  n: number,
  gerade: boolean,
): boolean {
  if (!gerade && rule.det !== undefined && rule.det !== op.det) return false;
  if (rule.order !== op.order) return false;
  const axis = rule.axis ?? 'any';
  if (axis === 'any') return true;
  const along = Math.abs(dot(op.axis, group.zAxis));
  if (axis === 'z') return along > 1 - 1e-6;
  if (axis === 'fourfold' || axis === 'notFourfold') {
    const onFourfold = group.operations.some(
      (o) => o.order === 4 && Math.abs(Math.abs(dot(o.axis, op.axis)) - 1) < 1e-6,
    );
    return onFourfold === (axis === 'fourfold');
  }
  if (along > 1e-6) return false;
  if (axis === 'perp') return true;
  const y: Vec3 = [
    group.zAxis[1] * group.xAxis[2] - group.zAxis[2] * group.xAxis[1],
    group.zAxis[2] * group.xAxis[0] - group.zAxis[0] * group.xAxis[2],
    group.zAxis[0] * group.xAxis[1] - group.zAxis[1] * group.xAxis[0],
  ];
  let phi = Math.atan2(dot(op.axis, y), dot(op.axis, group.xAxis));
  if (phi < 0) phi += Math.PI;
  const k = Math.round(phi / (Math.PI / n)) % n;
  return (k % 2 === 0) === (axis === 'perp0');
}

/**
 * The character table of a detected group with each of its operations put in its class, or
 * undefined for a group without a table here.
 * @throws Error when an operation fits no class or a class stays empty (a detection fault).
 */
export function groupCharacters(group: PointGroup): GroupCharacters | undefined {
  const entry = GROUPS[group.name];
  if (!entry) return undefined;
  const { table, gerade } = entry;
  const classSizes = table.classes.map(() => 0);
  const representatives = table.classes.map(() => -1);
  group.operations.forEach((op, i) => {
    const c = table.classes.findIndex((rule) => matches(rule, op, group, table.n, gerade));
    if (c < 0) throw new Error(`point group ${group.name}: an operation of order ${op.order} fits no class`);
    classSizes[c] = (classSizes[c] ?? 0) + 1;
    if (representatives[c] === -1) representatives[c] = i;
  });
  if (representatives.includes(-1)) throw new Error(`point group ${group.name}: a class has no operation`);
  const suffix = gerade ? 'g' : '';
  const irreps = table.irreps.map(([name, characters]) => ({
    name: name.endsWith("'") || name.endsWith('"') ? name : `${name}${suffix}`,
    dimension: characters[0] ?? 1,
    characters,
  }));
  const spinors = (table.spinors ?? []).map(([name, characters]) => ({
    name: name
      .split('+')
      .map((part) => `${part}${suffix}`)
      .join('+'),
    dimension: characters[0] ?? 1,
    characters,
    ...(name.includes('+') ? { pair: true } : {}),
  }));
  return { irreps, spinors, classSizes, representatives };
}

/**
 * How often each irrep occurs in a representation with character `chi[c]` on class c:
 * n(Γ) = Σ_c N_c χ_Γ(c)χ(c) / Σ_c N_c χ_Γ(c)², the usual reduction formula for an irreducible Γ
 * and also right for a merged pair. Returns undefined when a count is not near a whole number
 * (the space is not invariant, e.g. an accidental near-degeneracy).
 */
export function reduceRepresentation(
  table: GroupCharacters,
  chi: readonly number[],
): Map<string, number> | undefined {
  const out = new Map<string, number>();
  for (const irrep of table.irreps) {
    let num = 0;
    let den = 0;
    irrep.characters.forEach((c, k) => {
      const size = table.classSizes[k] ?? 0;
      num += size * c * (chi[k] ?? 0);
      den += size * c * c;
    });
    const x = num / den;
    const r = Math.round(x);
    if (Math.abs(x - r) > 0.05 || r < 0) return undefined;
    if (r > 0) out.set(irrep.name, r);
  }
  return out;
}
