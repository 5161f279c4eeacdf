import { describe, expect, it } from 'vitest';
import type { Ligand } from '../../src/field/angularOverlap.js';
import { type GroupCharacters, groupCharacters } from '../../src/field/characterTables.js';
import { groupOf, solveDistorted, solveDistortedSpinOrbit } from '../../src/field/distortedComplex.js';
import { solveFieldSpinOrbit, spinFreeReference } from '../../src/field/fieldSpinOrbit.js';
import { polar, presetLigands } from '../../src/field/geometries.js';
import { pointGroup } from '../../src/field/pointGroups.js';
import { apply3, axisRotation } from '../../src/field/realOrbitals.js';
import { expectClose } from '../helpers.js';

const BONDS = {
  L: { eSigma: 6000, ePi: 1000 },
  eq: { eSigma: 6000, ePi: 1000 },
  ax: { eSigma: 4500, ePi: 600 },
  A: { eSigma: 6000, ePi: 1000 },
  B: { eSigma: 4800, ePi: 400 },
  C: { eSigma: 3900, ePi: 900 },
};

/** Six ligands of a trigonal prism twisted by 30° (half-way to the antiprism): D3. */
const TWISTED_PRISM: Ligand[] = [0, 120, 240].flatMap((phi) => [
  polar('L', 54.74, phi),
  polar('L', 125.26, phi + 30),
]);

/** A trigonal pyramid capped on its axis (fac-MA3B3 on octahedral positions has a cubic AOM field). */
const CAPPED_PYRAMID: Ligand[] = [polar('ax', 0, 0), ...[0, 120, 240].map((phi) => polar('eq', 105, phi))];

/** trans-MA2B2C2 on the axes: D2h. */
const RECTANGULAR: Ligand[] = [
  { kind: 'A', direction: [1, 0, 0] },
  { kind: 'A', direction: [-1, 0, 0] },
  { kind: 'B', direction: [0, 1, 0] },
  { kind: 'B', direction: [0, -1, 0] },
  { kind: 'C', direction: [0, 0, 1] },
  { kind: 'C', direction: [0, 0, -1] },
];

/** Ligands with only a twofold axis z: C2; with their inversion images too: C2h. */
const TWOFOLD_ONLY: Ligand[] = [
  { kind: 'A', direction: [1, 0.2, 0.3] },
  { kind: 'A', direction: [-1, -0.2, 0.3] },
  { kind: 'B', direction: [0.3, 1, -0.2] },
  { kind: 'B', direction: [-0.3, -1, -0.2] },
];
const TWOFOLD_CENTRED: Ligand[] = TWOFOLD_ONLY.flatMap((l) => [
  l,
  { ...l, direction: [-l.direction[0], -l.direction[1], -l.direction[2]] },
]);

/** Ligands with only the mirror plane xz: Cs. */
const MIRROR_ONLY: Ligand[] = [
  { kind: 'A', direction: [1, 0, 0] },
  { kind: 'B', direction: [0, 0, 1] },
  { kind: 'C', direction: [0, 1, 0] },
  { kind: 'C', direction: [0, -1, 0] },
  { kind: 'L', direction: [-1, 0, -0.5] },
];

/** Two kinds of ligand above and below, turned against each other: C3; a propeller and its inversion image: S6. */
const THREEFOLD_ONLY: Ligand[] = [0, 120, 240].flatMap((phi) => [
  polar('A', 60, phi + 10),
  polar('B', 120, phi + 50),
]);
const THREEFOLD_CENTRED: Ligand[] = [0, 120, 240].flatMap((phi) => [
  polar('A', 60, phi + 10),
  polar('A', 120, phi + 190),
  polar('B', 80, phi + 40),
  polar('B', 100, phi + 220),
]);

/** One ligand set of each group with the double-group levels of d¹ with ζ. */
const CASES: { group: string; ligands: Ligand[]; d1: Record<string, number> }[] = [
  // Oh: t2g ⊗ Γ6 = Γ7 + Γ8, eg ⊗ Γ6 = Γ8 (Koster 1963, product table of O).
  { group: 'Oh', ligands: presetLigands('octahedron'), d1: { Γ7g: 1, Γ8g: 2 } },
  { group: 'Td', ligands: presetLigands('tetrahedron'), d1: { Γ7: 1, Γ8: 2 } },
  // D4h: a1g, b1g, b2g, eg; A ⊗ Γ6 = Γ6, B ⊗ Γ6 = Γ7, E ⊗ Γ6 = Γ6 + Γ7 (Koster 1963, D4).
  { group: 'D4h', ligands: presetLigands('elongated-octahedron'), d1: { Γ6g: 2, Γ7g: 3 } },
  { group: 'C4v', ligands: presetLigands('square-pyramid'), d1: { Γ6: 2, Γ7: 3 } },
  { group: 'D2d', ligands: presetLigands('flattened-tetrahedron'), d1: { Γ6: 2, Γ7: 3 } },
  // D3d: a1g + 2eg; A1 ⊗ Γ4 = Γ4, E ⊗ Γ4 = Γ4 + Γ5 + Γ6 (Koster 1963, D3).
  { group: 'D3d', ligands: presetLigands('trigonal-antiprism'), d1: { Γ4g: 3, 'Γ5g+Γ6g': 2 } },
  { group: 'D3', ligands: TWISTED_PRISM, d1: { Γ4: 3, 'Γ5+Γ6': 2 } },
  { group: 'C3v', ligands: CAPPED_PYRAMID, d1: { Γ4: 3, 'Γ5+Γ6': 2 } },
  // D3h: a1′ + e′ + e″; A1′ ⊗ Γ7 = Γ7, E′ ⊗ Γ7 = Γ8 + Γ9, E″ ⊗ Γ7 = Γ7 + Γ9 (Koster 1963, D3h).
  { group: 'D3h', ligands: presetLigands('trigonal-bipyramid'), d1: { Γ7: 2, Γ8: 1, Γ9: 2 } },
  { group: 'D3h', ligands: presetLigands('trigonal-prism'), d1: { Γ7: 2, Γ8: 1, Γ9: 2 } },
  // C2v, D2h: one spinor irrep Γ5, so five Kramers doublets Γ5 (Koster 1963).
  { group: 'C2v', ligands: presetLigands('cis-MA4B2'), d1: { Γ5: 5 } },
  { group: 'D2h', ligands: RECTANGULAR, d1: { Γ5g: 5 } },
  // C2, Cs, C2h: the one time-reversal pair Γ3+Γ4 (Koster 1963).
  { group: 'C2', ligands: TWOFOLD_ONLY, d1: { 'Γ3+Γ4': 5 } },
  { group: 'Cs', ligands: MIRROR_ONLY, d1: { 'Γ3+Γ4': 5 } },
  { group: 'C2h', ligands: TWOFOLD_CENTRED, d1: { 'Γ3g+Γ4g': 5 } },
  // C3: a + 2e; A ⊗ (Γ5+Γ6) = Γ5+Γ6, E ⊗ (Γ5+Γ6) = 2Γ4 + Γ5+Γ6 (characters e^{±iπ/3}·e^{±2πi/3}).
  { group: 'C3', ligands: THREEFOLD_ONLY, d1: { 'Γ5+Γ6': 3, '2Γ4': 2 } },
  { group: 'S6', ligands: THREEFOLD_CENTRED, d1: { 'Γ5g+Γ6g': 3, '2Γ4g': 2 } },
];

function labelCounts(levels: readonly { pointGroupLabel?: string }[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const l of levels) {
    const key = l.pointGroupLabel ?? 'none';
    out[key] = (out[key] ?? 0) + 1;
  }
  return out;
}

describe('double-group labels of d¹ with ζ in each point group', () => {
  for (const c of CASES) {
    it(`solveDistortedSpinOrbit labels d¹ in ${c.group} as ${JSON.stringify(c.d1)}`, () => {
      expect(pointGroup(c.ligands).name).toBe(c.group);
      const r = solveDistortedSpinOrbit({
        n: 1,
        B: 0,
        C: 0,
        zeta: 600,
        field: { kind: 'aom', ligands: c.ligands, parameters: BONDS },
      });
      expect(r.spinOrbit.pointGroup).toBe(c.group);
      expect(labelCounts(r.spinOrbit.levels)).toEqual(c.d1);
    });
  }
});

/** The rotation subgroup's order: the spinor irreps of a double group have Σ dim² equal to it (Burnside). */
const ROTATION_ORDER: Record<string, number> = {
  Oh: 24,
  Td: 24,
  D4h: 8,
  C4v: 8,
  D2d: 8,
  D3d: 6,
  D3: 6,
  C3v: 6,
  D3h: 12,
  C2v: 4,
  D2h: 4,
  C2: 2,
  Cs: 2,
  C2h: 2,
  C3: 3,
  S6: 3,
};

describe('spinor character tables (characterTables.ts) against the orthogonality relations', () => {
  for (const c of CASES) {
    it(`groupCharacters(${c.group}) spinor rows are orthogonal with norm |G| (2|G| for a merged pair), Σ dim² = the rotation group's order, and D^½ is the first row`, () => {
      const group = pointGroup(c.ligands);
      const table = groupCharacters(group);
      if (!table) throw new Error(`no table for ${c.group}`);
      const order = table.classSizes.reduce((s, x) => s + x, 0);
      expect(order).toBe(group.operations.length);
      table.spinors.forEach((a, i) => {
        table.spinors.forEach((b, j) => {
          let sum = 0;
          table.classSizes.forEach((size, k) => {
            sum += size * (a.characters[k] ?? 0) * (b.characters[k] ?? 0);
          });
          const expected = i === j ? order * (a.pair ? 2 : 1) : 0;
          expect(Math.abs(sum - expected)).toBeLessThan(1e-9);
        });
      });
      const dims = table.spinors.reduce((s, g) => s + (g.pair ? 2 : g.dimension ** 2), 0);
      expect(dims).toBe(ROTATION_ORDER[c.group]);
      // The spin-½ functions: χ = 2cos(ω/2) on the element rotating by ω = 2π/order ≤ π (0 for E).
      const first = table.spinors[0];
      table.representatives.forEach((r, k) => {
        const order = group.operations[r]?.order ?? 1;
        const omega = order === 1 ? 0 : (2 * Math.PI) / order;
        expect(Math.abs((first?.characters[k] ?? 0) - 2 * Math.cos(omega / 2))).toBeLessThan(1e-12);
      });
    });
  }
});

/**
 * Compatibility of O* with D4* (z a fourfold axis) and D3* (z a threefold axis), Koster, Dimmock,
 * Wheeler & Statz, Properties of the Thirty-Two Point Groups (1963), compatibility tables; the
 * single-valued part is the usual correlation table (Cotton, Chemical Applications of Group
 * Theory, 3rd ed., 1990, appendix IIB). Every irrep with g, as d states are gerade.
 */
const O_TO_D4: Record<string, string[]> = {
  Γ1: ['A1g'],
  Γ2: ['B1g'],
  Γ3: ['A1g', 'B1g'],
  Γ4: ['A2g', 'Eg'],
  Γ5: ['B2g', 'Eg'],
  Γ6: ['Γ6g'],
  Γ7: ['Γ7g'],
  Γ8: ['Γ6g', 'Γ7g'],
};
const O_TO_D3: Record<string, string[]> = {
  Γ6: ['Γ4g'],
  Γ7: ['Γ4g'],
  Γ8: ['Γ4g', 'Γ5g+Γ6g'],
};

/**
 * For each cubic level (by its label in solveSpinOrbit, e.g. `Γ8(2)`), the sorted labels of the
 * lower-symmetry levels whose cubic parent it is; cubic levels that fall together are left out.
 */
function descent(levels: readonly { pointGroupLabel?: string; cubicParent?: { label: string } }[]) {
  const out = new Map<string, string[]>();
  for (const l of levels) {
    const parent = l.cubicParent?.label;
    if (!parent || parent.includes('/')) continue;
    out.set(parent, [...(out.get(parent) ?? []), l.pointGroupLabel ?? 'none'].sort());
  }
  return out;
}

function expectDescent(
  levels: readonly { pointGroupLabel?: string; cubicParent?: { label: string } }[],
  table: Record<string, string[]>,
): void {
  const map = descent(levels);
  expect(map.size).toBeGreaterThan(3);
  for (const [parent, labels] of map) {
    const irrep = parent.replace(/\(\d+\)$/, '');
    expect({ parent, labels }).toEqual({ parent, labels: [...(table[irrep] ?? ['?'])].sort() });
  }
}

const SLIGHTLY_ELONGATED = {
  kind: 'aom' as const,
  ligands: presetLigands('elongated-octahedron'),
  parameters: { eq: { eSigma: 6000, ePi: 1000 }, ax: { eSigma: 5900, ePi: 980 } },
};

describe('double-group labels: descent from the cubic levels', () => {
  it('solveDistortedSpinOrbit splits each O* level of a slightly elongated d³ and d⁷ octahedron into the D4* irreps Γ6→Γ6, Γ7→Γ7, Γ8→Γ6+Γ7', () => {
    for (const n of [3, 7]) {
      const r = solveDistortedSpinOrbit({ n, B: 700, C: 3000, zeta: 300, field: SLIGHTLY_ELONGATED });
      expect(r.group).toBe('D4h');
      expectDescent(r.spinOrbit.levels, O_TO_D4);
    }
  });

  it('solveDistortedSpinOrbit splits each O* level of a slightly trigonal d³ field into the D3* irreps Γ6→Γ4, Γ7→Γ4, Γ8→Γ4+Γ5+Γ6', () => {
    const r = solveDistortedSpinOrbit({
      n: 3,
      B: 700,
      C: 3000,
      zeta: 300,
      field: { kind: 'trigonal', dq: 1500, dSigma: 40, dTau: 25 },
    });
    expect(r.group).toBe('D3d');
    expectDescent(r.spinOrbit.levels, O_TO_D3);
  });

  it('solveDistortedSpinOrbit labels even n by the single-valued irreps of the total state: d² and d⁸ descend O → D4 (Γ5 → B2g + Eg for ³A2g of d⁸ with ζ)', () => {
    for (const n of [2, 8]) {
      const r = solveDistortedSpinOrbit({ n, B: 700, C: 3000, zeta: 300, field: SLIGHTLY_ELONGATED });
      expectDescent(r.spinOrbit.levels, O_TO_D4);
    }
    const d8 = solveDistortedSpinOrbit({ n: 8, B: 700, C: 3000, zeta: 300, field: SLIGHTLY_ELONGATED });
    const ground = d8.spinOrbit.levels.filter((l) => l.cubicParent?.label === 'Γ5(1)');
    expect(ground.map((l) => l.pointGroupLabel).sort()).toEqual(['B2g', 'Eg']);
    expect(
      ground.every((l) => l.parent?.label.startsWith('3A2g') || l.parent?.label.startsWith('3B1g')),
    ).toBe(true);
  });
});

/** The dimension of a level label such as `Γ6g`, `2Γ7`, `Γ5+Γ6` or `A1g+B2g` in a table. */
function labelDimension(table: GroupCharacters, label: string): number {
  const names = new Map([...table.irreps, ...table.spinors].map((g) => [g.name, g.dimension]));
  let rest = label;
  let sum = 0;
  // Longest names first, so that a pair `Γ5+Γ6` is read whole.
  const ordered = [...names.keys()].sort((a, b) => b.length - a.length);
  while (rest.length > 0) {
    const m = /^(\d*)/.exec(rest);
    const count = m?.[1] ? Number(m[1]) : 1;
    rest = rest.slice(m?.[1]?.length ?? 0);
    const name = ordered.find((x) => rest.startsWith(x));
    if (!name) throw new Error(`label ${label}: no irrep at ${rest}`);
    sum += count * (names.get(name) ?? 0);
    rest = rest.slice(name.length).replace(/^\+/, '');
  }
  return sum;
}

describe('double-group labels: dimensions and frames', () => {
  it('solveDistortedSpinOrbit labels every level of d¹, d², d³, d⁵, d⁸ in an elongated octahedron by irreps whose dimensions add to its degeneracy, C(10, n) in all, odd n one Kramers irrep each', () => {
    const field = {
      kind: 'aom' as const,
      ligands: presetLigands('elongated-octahedron'),
      parameters: { eq: { eSigma: 6000, ePi: 1000 }, ax: { eSigma: 4000, ePi: 600 } },
    };
    const table = groupCharacters(pointGroup(field.ligands));
    if (!table) throw new Error('no D4h table');
    const states = [10, 45, 120, 210, 252, 210, 120, 45, 10];
    // d⁴, d⁶, d⁷ and d⁹ add little to these and are left out to keep the suite fast.
    for (const n of [1, 2, 3, 5, 8]) {
      const r = solveDistortedSpinOrbit({ n, B: 700, C: 3000, zeta: 400, field });
      let total = 0;
      for (const l of r.spinOrbit.levels) {
        const label = l.pointGroupLabel ?? '?';
        expect(labelDimension(table, label)).toBe(l.degeneracy);
        if (n % 2 === 1) expect(['Γ6g', 'Γ7g']).toContain(label);
        total += l.degeneracy;
      }
      expect(total).toBe(states[n - 1]);
    }
  });

  it('solveDistortedSpinOrbit gives the same labels for a rotated copy of the ligands (D4h d³ and d⁸, D3h d³, D3 d²)', () => {
    const turn = axisRotation([0.3, -0.5, 1], 0.83);
    const cases = [
      { n: 3, ligands: presetLigands('elongated-octahedron') },
      { n: 8, ligands: presetLigands('elongated-octahedron') },
      { n: 3, ligands: presetLigands('trigonal-bipyramid') },
      { n: 2, ligands: TWISTED_PRISM },
    ];
    for (const c of cases) {
      const labels = (ligands: Ligand[]) =>
        solveDistortedSpinOrbit({
          n: c.n,
          B: 700,
          C: 3000,
          zeta: 400,
          field: { kind: 'aom', ligands, parameters: BONDS },
        }).spinOrbit.levels.map((l) => l.pointGroupLabel);
      const turned = c.ligands.map((l) => ({ ...l, direction: apply3(turn, l.direction) }));
      const a = labels(c.ligands);
      expect(a).not.toContain('?');
      expect(labels(turned)).toEqual(a);
    }
  });
});

describe('solveFieldSpinOrbit blocked by 2M_J mod 2k in the group frame', () => {
  it('solveFieldSpinOrbit with a group gives the levels, parents and labels of the full matrix (blocked: false) to 1e-7 cm⁻¹, for D4h (turned), D3d, D3h and C2v', () => {
    const turn = axisRotation([0.3, -0.5, 1], 0.83);
    const cases = [
      {
        n: 3,
        ligands: presetLigands('elongated-octahedron').map((l) => ({
          ...l,
          direction: apply3(turn, l.direction),
        })),
      },
      { n: 2, ligands: presetLigands('trigonal-antiprism') },
      { n: 3, ligands: presetLigands('trigonal-bipyramid') },
      { n: 3, ligands: presetLigands('cis-MA4B2') },
    ];
    for (const c of cases) {
      const field = { kind: 'aom' as const, ligands: c.ligands, parameters: BONDS };
      const base = solveDistorted({ n: c.n, B: 700, C: 3000, field });
      const options = { spinFree: spinFreeReference(base.field, base), group: groupOf(field) };
      const input = { n: c.n, field: base.field, B: 700, C: 3000, zeta: 500 };
      const fast = solveFieldSpinOrbit(input, options).levels;
      const slow = solveFieldSpinOrbit(input, { ...options, blocked: false }).levels;
      expect(fast.length).toBe(slow.length);
      fast.forEach((l, i) => {
        const s = slow[i];
        expectClose(l.energy, s?.energy ?? Number.NaN, 0, 1e-7);
        expect([l.degeneracy, l.pointGroupLabel, l.parent?.label]).toEqual([
          s?.degeneracy,
          s?.pointGroupLabel,
          s?.parent?.label,
        ]);
        expectClose(l.parent?.weight, s?.parent?.weight ?? Number.NaN, 0, 1e-8);
      });
    }
  });
});
