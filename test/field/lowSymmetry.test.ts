import { describe, expect, it } from 'vitest';
import { binomial, microstates } from '../../src/atom/microstates.js';
import { type OneBodyTerm, oneBodyMatrix } from '../../src/atom/operators.js';
import { aomField, type Ligand } from '../../src/field/angularOverlap.js';
import { groupCharacters } from '../../src/field/characterTables.js';
import { solveCubic } from '../../src/field/cubic.js';
import { type DistortedResult, solveDistorted } from '../../src/field/distortedComplex.js';
import { GEOMETRY_PRESETS, presetLigands } from '../../src/field/geometries.js';
import { determinantBlock } from '../../src/field/hamiltonian.js';
import { solveField, symmetryContext } from '../../src/field/lowSymmetrySolver.js';
import { pointGroup } from '../../src/field/pointGroups.js';
import { apply3, axisRotation, compose3, fieldInComplexBasis } from '../../src/field/realOrbitals.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose } from '../helpers.js';

const PARAMETERS = {
  L: { eSigma: 6000, ePi: 1000 },
  eq: { eSigma: 6000, ePi: 1000 },
  ax: { eSigma: 4800, ePi: 700 },
  A: { eSigma: 6000, ePi: 1000 },
  B: { eSigma: 5200, ePi: 600 },
};

/** A ligand set of no symmetry at all. */
const SKEW: Ligand[] = [
  { kind: 'A', direction: [1, 0.1, 0.05] },
  { kind: 'A', direction: [-0.9, 0.2, 0.1] },
  { kind: 'B', direction: [0.05, 1, -0.2] },
  { kind: 'A', direction: [0.1, -1, 0.3] },
  { kind: 'B', direction: [0.2, 0.1, 1] },
];

const TURN = compose3(axisRotation([0.3, -0.5, 1], 0.83), axisRotation([1, 0.2, 0], 2.2));

function turned(ligands: readonly Ligand[]): Ligand[] {
  return ligands.map((l) => ({ ...l, direction: apply3(TURN, l.direction) }));
}

/** Every state energy (above the ground) of a result, each level repeated by its degeneracy. */
function expanded(levels: readonly { energy: number; degeneracy: number }[]): number[] {
  return levels.flatMap((l) => new Array<number>(l.degeneracy).fill(l.energy)).sort((a, b) => a - b);
}

/**
 * The slow path: H over all C(10, n) determinants of the |m_l⟩ orbitals with the field in its
 * complex form, diagonalised as the real symmetric matrix [[Re H, −Im H], [Im H, Re H]] (each
 * eigenvalue twice). No real orbitals, no M_S blocks, no S².
 */
function fullComplexSpectrum(n: number, field: Float64Array, B: number, C: number): number[] {
  const block = determinantBlock(microstates(2, n).map((s) => s.mask));
  const complex = fieldInComplexBasis(field);
  const re: OneBodyTerm[] = [];
  const im: OneBodyTerm[] = [];
  for (const offset of [0, 5]) {
    for (let a = 0; a < 5; a++) {
      for (let b = 0; b < 5; b++) {
        const v = complex[a]?.[b] ?? { re: 0, im: 0 };
        if (v.re !== 0) re.push({ to: a + offset, from: b + offset, value: v.re });
        if (v.im !== 0) im.push({ to: a + offset, from: b + offset, value: v.im });
      }
    }
  }
  const a = oneBodyMatrix(block, re);
  const b = oneBodyMatrix(block, im);
  const size = block.masks.length;
  const big = new Float64Array(4 * size * size);
  const w = 2 * size;
  for (let i = 0; i < size; i++) {
    for (let j = 0; j < size; j++) {
      const h =
        (a[i * size + j] ?? 0) + B * (block.partB[i * size + j] ?? 0) + C * (block.partC[i * size + j] ?? 0);
      const x = b[i * size + j] ?? 0;
      big[i * w + j] = h;
      big[(i + size) * w + j + size] = h;
      big[(i + size) * w + j] = x;
      big[i * w + j + size] = -x;
    }
  }
  const values = [...symmetricEigen(big, w).values].filter((_, k) => k % 2 === 0);
  const ground = values[0] ?? 0;
  return values.map((v) => v - ground);
}

describe('solveField: the general-field solver against independent paths', () => {
  it('solveField with the octahedral AOM field reproduces solveCubic to 1e-8 cm⁻¹ for d1…d9', () => {
    const field = aomField(presetLigands('octahedron'), PARAMETERS);
    const dq = (3 * 6000 - 4 * 1000) / 10;
    for (let n = 1; n <= 9; n++) {
      const fast = expanded(solveField({ n, field, B: 780, C: 3300 }).levels);
      const cubic = expanded(solveCubic({ n, dq, B: 780, C: 3300 }).levels);
      expect(fast.length).toBe(binomial(10, n));
      cubic.forEach((e, i) => {
        expectClose(fast[i], e, 0, 1e-8);
      });
    }
  });

  it('solveField over the lowest M_S block matches the full complex |m_l⟩ matrix for a field of no symmetry (d2, d3, d7)', () => {
    const field = aomField(SKEW, PARAMETERS);
    for (const n of [2, 3, 7]) {
      const fast = expanded(solveField({ n, field, B: 700, C: 3000 }).levels);
      const slow = fullComplexSpectrum(n, field, 700, 3000);
      expect(fast.length).toBe(slow.length);
      slow.forEach((e, i) => {
        expectClose(fast[i], e, 1e-10, 1e-7);
      });
    }
  });

  it('solveField gives the same levels and labels for a rotated copy of every preset and of a skew ligand set', () => {
    const sets = [...GEOMETRY_PRESETS.map((p) => p.ligands(p.angle?.defaultDegrees ?? 0)), SKEW];
    for (const ligands of sets) {
      for (const n of [3]) {
        const a = labelledLevels(n, ligands);
        const b = labelledLevels(n, turned(ligands));
        expect(b.levels.map((l) => l.label)).toEqual(a.levels.map((l) => l.label));
        a.levels.forEach((l, i) => {
          expectClose(b.levels[i]?.energy, l.energy, 1e-10, 1e-7);
        });
      }
    }
  });
});

describe('pointGroup and labels: the groups of the presets and the character tables', () => {
  it('pointGroup finds the group of every preset and of its rotated copy, and C1 for a skew set', () => {
    for (const p of GEOMETRY_PRESETS) {
      const ligands = p.ligands(p.angle?.defaultDegrees ?? 0);
      expect(pointGroup(ligands).name, p.name).toBe(p.group);
      expect(pointGroup(turned(ligands)).name, p.name).toBe(p.group);
    }
    expect(pointGroup(SKEW).name).toBe('C1');
    expect(pointGroup(presetLigands('flattened-tetrahedron', 90)).name).toBe('D4h');
    expect(pointGroup(presetLigands('trigonal-prism', 70)).name).toBe('D3h');
  });

  it('pointGroup finds D3 for a twisted trigonal prism and C3v for a pyramid', () => {
    const twisted = [0, 120, 240].flatMap((phi) => [
      { kind: 'L', direction: polar(50, phi) },
      { kind: 'L', direction: polar(130, phi + 25) },
    ]);
    expect(pointGroup(twisted).name).toBe('D3');
    const pyramid = [0, 120, 240].map((phi) => ({ kind: 'L', direction: polar(110, phi) }));
    expect(pointGroup(pyramid).name).toBe('C3v');
  });

  it('groupCharacters gives class sizes that add up to the group and rows that are orthogonal (the great orthogonality theorem)', () => {
    const sets = [
      ...GEOMETRY_PRESETS.map((p) => p.ligands(p.angle?.defaultDegrees ?? 0)),
      presetLigands('flattened-tetrahedron', 90),
      [0, 120, 240].flatMap((phi) => [
        { kind: 'L', direction: polar(50, phi) },
        { kind: 'L', direction: polar(130, phi + 25) },
      ]),
    ];
    for (const ligands of sets) {
      const group = pointGroup(ligands);
      const table = groupCharacters(group);
      expect(table, group.name).toBeDefined();
      if (!table) continue;
      const order = group.operations.length;
      expect(table.classSizes.reduce((a, b) => a + b, 0)).toBe(order);
      table.irreps.forEach((a, i) => {
        table.irreps.forEach((b, j) => {
          const sum = a.characters.reduce(
            (s, x, c) => s + (table.classSizes[c] ?? 0) * x * (b.characters[c] ?? 0),
            0,
          );
          // A merged complex pair (a real E of a cyclic group) has norm 2|G|.
          const merged =
            a.dimension === 2 && ['C3', 'C4', 'S4', 'C3h', 'C4h', 'S6'].includes(group.name) ? 2 : 1;
          expect(sum, `${group.name} ${a.name}·${b.name}`).toBeCloseTo(i === j ? order * merged : 0, 9);
        });
      });
    }
  });

  it('every labelled level has an irrep of the group, and dimensions add up to C(10, n) (d2, d5, d8, every preset)', () => {
    for (const p of GEOMETRY_PRESETS) {
      for (const n of [2, 5, 8]) {
        const r = labelledLevels(n, p.ligands(p.angle?.defaultDegrees ?? 0));
        expect(
          r.levels.every((l) => l.irrep !== undefined),
          `${p.name} d${n}`,
        ).toBe(true);
        expect(r.levels.reduce((s, l) => s + l.degeneracy, 0)).toBe(binomial(10, n));
      }
    }
  });
});

/** Levels labelled in the ligands' group, without cubic parents. */
function labelledLevels(n: number, ligands: readonly Ligand[]) {
  const group = pointGroup(ligands);
  return solveField(
    { n, field: aomField(ligands, PARAMETERS), B: 750, C: 3100 },
    { symmetry: symmetryContext(n, group) },
  );
}

function polar(thetaDeg: number, phiDeg: number): [number, number, number] {
  const t = (thetaDeg * Math.PI) / 180;
  const f = (phiDeg * Math.PI) / 180;
  return [Math.sin(t) * Math.cos(f), Math.sin(t) * Math.sin(f), Math.cos(t)];
}

/** Irreps of the daughters of each cubic parent symbol (spin and parent letter dropped), sorted. */
function descent(r: DistortedResult): Map<string, string[]> {
  const byParent = new Map<string, string[]>();
  for (const l of r.levels) {
    const parent = l.cubicParent?.label;
    if (!parent) continue;
    const key = `${parent}`;
    byParent.set(key, [...(byParent.get(key) ?? []), l.irrep ?? '?'].sort());
  }
  return byParent;
}

function strip(parent: string): string {
  return parent.replace(/^\d+/, '').replace(/\(.*\)$/, '');
}

describe('cubic parents: descent in symmetry from Oh and Td (correlation tables, e.g. Cotton, Chemical Applications of Group Theory, 3rd ed., 1990, appendix IIB)', () => {
  const cases: [string, string, FieldSpecLigands, Record<string, string[]>][] = [
    [
      'Oh → D4h (trans-MA4B2)',
      'D4h',
      { ligands: presetLigands('trans-MA4B2') },
      { A1g: ['A1g'], A2g: ['B1g'], Eg: ['A1g', 'B1g'], T1g: ['A2g', 'Eg'], T2g: ['B2g', 'Eg'] },
    ],
    [
      'Oh → D3d (trigonal antiprism)',
      'D3d',
      { ligands: presetLigands('trigonal-antiprism', 54.2) },
      { A1g: ['A1g'], A2g: ['A2g'], Eg: ['Eg'], T1g: ['A2g', 'Eg'], T2g: ['A1g', 'Eg'] },
    ],
    [
      'Td → D2d (flattened tetrahedron)',
      'D2d',
      { ligands: presetLigands('flattened-tetrahedron', 55.5) },
      { A1: ['A1'], A2: ['B1'], E: ['A1', 'B1'], T1: ['A2', 'E'], T2: ['B2', 'E'] },
    ],
    [
      'Oh → C4v (square pyramid with a weak sixth ligand missing)',
      'C4v',
      { ligands: [...presetLigands('square-pyramid'), { kind: 'far', direction: [0, 0, -1] }] },
      { A1g: ['A1'], A2g: ['B1'], Eg: ['A1', 'B1'], T1g: ['A2', 'E'], T2g: ['B2', 'E'] },
    ],
  ];
  for (const [name, group, spec, table] of cases) {
    it(`solveDistorted labels each level of a small distortion ${name} as the correlation table says`, () => {
      const parameters = {
        ...PARAMETERS,
        A: { eSigma: 6000, ePi: 1000 },
        B: { eSigma: 5900, ePi: 950 },
        ax: { eSigma: 5900, ePi: 980 },
        far: { eSigma: 5800, ePi: 950 },
      };
      for (const n of [2, 3, 8]) {
        const r = solveDistorted({
          n,
          B: 750,
          C: 3100,
          field: { kind: 'aom', ligands: spec.ligands, parameters },
        });
        expect(r.group).toBe(group);
        expect(r.levels.every((l) => l.cubicParent !== undefined && l.cubicParent.weight > 0.5)).toBe(true);
        for (const [parent, daughters] of descent(r)) {
          const expected = table[strip(parent)];
          expect(expected, parent).toBeDefined();
          // Each cubic level gives each daughter irrep once.
          expect(daughters, `${name} d${n} ${parent}`).toEqual([...(expected ?? [])].sort());
        }
      }
    });
  }
});

interface FieldSpecLigands {
  readonly ligands: readonly Ligand[];
}
