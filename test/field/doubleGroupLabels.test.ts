import { describe, expect, it } from 'vitest';
import type { Ligand } from '../../src/field/angularOverlap.js';
import { groupCharacters } from '../../src/field/characterTables.js';
import { solveDistortedSpinOrbit } from '../../src/field/distortedComplex.js';
import { polar, presetLigands } from '../../src/field/geometries.js';
import { pointGroup } from '../../src/field/pointGroups.js';

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
