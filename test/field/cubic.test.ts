import { describe, expect, it } from 'vitest';
import { groundStateCrossings } from '../../src/analysis/groundState.js';
import { freeIonTerms } from '../../src/atom/freeIon.js';
import { InputError } from '../../src/core/errors.js';
import {
  type CubicLevel,
  type CubicResult,
  cubicLevels,
  groundSpin,
  solveCubic,
} from '../../src/field/cubic.js';
import { adaptedBlocks } from '../../src/field/cubicBasis.js';
import { determinantBlock, fullHamiltonian } from '../../src/field/hamiltonian.js';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { expectClose, fixture } from '../helpers.js';

const bethe = fixture<{ split: Record<string, string[]> }>('reference/bethe.json');

function energyOf(r: CubicResult, label: string): number | undefined {
  return r.levels.find((l) => l.label === label)?.energy;
}

/** Every component energy of a result, each level repeated by its degeneracy, ascending. */
function expanded(r: CubicResult): number[] {
  return r.levels.flatMap((l) => new Array<number>(l.degeneracy).fill(l.energy)).sort((a, b) => a - b);
}

describe('solveCubic: one electron or hole', () => {
  it('solveCubic(d¹, oct) puts ²T₂g at 0 and ²E_g at 10Dq; Td reverses them; d⁹ reverses Oh (any ligand-field text)', () => {
    const oct = solveCubic({ n: 1, dq: 2030, B: 0, C: 0 });
    expect(oct.ground.label).toBe('2T2g');
    expectClose(energyOf(oct, '2Eg'), 20300);
    const tet = solveCubic({ n: 1, geometry: 'tet', dq: 500, B: 0, C: 0 });
    expect(tet.ground.label).toBe('2E');
    expectClose(energyOf(tet, '2T2'), 5000);
    const d9 = solveCubic({ n: 9, dq: 1260, B: 0, C: 0 });
    expect(d9.ground.label).toBe('2Eg');
    expectClose(energyOf(d9, '2T2g'), 12600);
  });
});

describe('solveCubic: closed forms of the two-term spin manifolds', () => {
  // The ⁴T₁g (³T₁g) 2×2 secular equation between the F and P terms, e.g. Lever, Inorganic
  // Electronic Spectroscopy, 2nd ed., 1984, and Figgis & Hitchman, Ligand Field Theory and its
  // Applications, 2000. For d³ and d⁸ (A₂g ground) relative to the ground state:
  // T₂g = 10Dq, T₁g(F), T₁g(P) = 7.5B + 15Dq ∓ ½√(225B² − 180B·Dq + 100Dq²).
  const points: [number, number][] = [
    [1740, 725],
    [850, 900],
    [1200, 650],
    [300, 1000],
    [2500, 600],
  ];
  for (const [n, spin] of [
    [3, 4],
    [8, 3],
  ] as const) {
    it(`solveCubic(d${n}, oct) gives ${spin}T2g = 10Dq and the ${spin}T1g pair by the secular equation`, () => {
      for (const [dq, B] of points) {
        const r = solveCubic({ n, dq, B, C: 4.4 * B });
        expect(r.ground.label).toBe(`${spin}A2g`);
        const root = Math.sqrt(225 * B * B - 180 * B * dq + 100 * dq * dq);
        expectClose(energyOf(r, `${spin}T2g`), 10 * dq, 1e-10, 1e-7);
        expectClose(energyOf(r, `${spin}T1g(F)`), 7.5 * B + 15 * dq - root / 2, 1e-10, 1e-7);
        expectClose(energyOf(r, `${spin}T1g(P)`), 7.5 * B + 15 * dq + root / 2, 1e-10, 1e-7);
      }
    });
  }

  // For d² and high-spin d⁷ (T₁g(F) ground), the same F–P pair with the field reversed: relative to
  // the ³F (⁴F) barycentre T₂g = 2Dq, A₂g = 12Dq and T₁g = 7.5B − 3Dq ∓ ½√(225B² + 180B·Dq + 100Dq²).
  for (const [n, spin] of [
    [2, 3],
    [7, 4],
  ] as const) {
    it(`solveCubic(d${n}, oct) gives the ${spin}T2g, ${spin}A2g and ${spin}T1g(P) closed forms relative to ${spin}T1g(F)`, () => {
      for (const [dq, B] of [
        [1850, 860],
        [930, 970],
        [500, 800],
      ] as const) {
        const r = solveCubic({ n, dq, B, C: 4.4 * B });
        const root = Math.sqrt(225 * B * B + 180 * B * dq + 100 * dq * dq);
        const t1f = 7.5 * B - 3 * dq - root / 2;
        const t1p = 7.5 * B - 3 * dq + root / 2;
        // Differences from T₁g(F), which need not be the ground state (d⁷ turns low-spin).
        const base = energyOf(r, `${spin}T1g(F)`) ?? Number.NaN;
        expectClose((energyOf(r, `${spin}T2g`) ?? Number.NaN) - base, 2 * dq - t1f, 1e-10, 1e-7);
        expectClose((energyOf(r, `${spin}A2g`) ?? Number.NaN) - base, 12 * dq - t1f, 1e-10, 1e-7);
        expectClose((energyOf(r, `${spin}T1g(P)`) ?? Number.NaN) - base, t1p - t1f, 1e-10, 1e-7);
      }
    });
  }
});

describe('solveCubic: limits', () => {
  it('solveCubic at Dq = 0 splits each free-ion term into the cubic irreps of the Bethe table (Bethe 1929)', () => {
    for (let n = 2; n <= 8; n++) {
      const B = 900;
      const C = 4.1 * B;
      const r = solveCubic({ n, dq: 0, B, C });
      const terms = freeIonTerms(n, B, C);
      for (const term of terms) {
        const letter = term.term.replace(/^\d+/, '');
        const components = r.levels.filter((l) => l.parent === term.name);
        expect(components.map((l) => l.cubicIrrep).sort()).toEqual([...(bethe.split[letter] ?? [])].sort());
        expect(components.reduce((s, l) => s + l.degeneracy, 0)).toBe(term.degeneracy);
        for (const l of components) expectClose(l.energy, term.energy, 1e-9, 1e-6);
      }
    }
  });

  it('solveCubic at small Dq keeps each level next to its parent term (free-ion limit, d⁴ and d⁶ with I terms)', () => {
    for (const n of [4, 5, 6]) {
      const B = 1000;
      const r = solveCubic({ n, dq: 1, B, C: 4 * B });
      const terms = new Map(freeIonTerms(n, B, 4 * B).map((t) => [t.name, t.energy]));
      for (const l of r.levels)
        expect(Math.abs(l.energy - (terms.get(l.parent) ?? Number.NaN))).toBeLessThan(30);
    }
  });

  it('solveCubic with no repulsion puts every level of t₂ᵃeᵇ at (−4a + 6b)Dq (strong-field limit)', () => {
    for (let n = 1; n <= 9; n++) {
      const dq = 1000;
      const r = solveCubic({ n, dq, B: 0, C: 0 });
      const a0 = Math.min(n, 6);
      const groundEnergy = -4 * a0 * dq + 6 * (n - a0) * dq;
      for (const l of r.levels) {
        const c = l.configurations[0];
        expect(c?.weight).toBeCloseTo(1, 9);
        expectClose(l.energy, -4 * (c?.t2 ?? 0) * dq + 6 * (c?.e ?? 0) * dq - groundEnergy, 1e-10, 1e-7);
      }
    }
  });

  it('solveCubic at Dq/B = 40 has every level dominated (> 90 %) by one t₂ᵃeᵇ configuration', () => {
    for (let n = 2; n <= 8; n++) {
      const r = solveCubic({ n, dq: 40000, B: 1000, C: 4000 });
      for (const l of r.levels) expect(l.configurations[0]?.weight ?? 0).toBeGreaterThan(0.9);
    }
  });
});

describe('solveCubic: invariants', () => {
  it('blocked eigenvalues equal those of the full C(10, n) matrix to 1e-8 relative', () => {
    for (let n = 1; n <= 9; n++) {
      for (const dq of [0, 733, 2400]) {
        const B = 870;
        const C = 3900;
        const r = solveCubic({ n, dq, B, C });
        const { size, matrix } = fullHamiltonian(n, dq, B, C);
        const full = Array.from(symmetricEigen(matrix, size).values);
        const lowest = full[0] ?? 0;
        const blocked = expanded(r);
        expect(blocked).toHaveLength(size);
        blocked.forEach((e, i) => {
          expectClose(e, (full[i] ?? 0) - lowest, 1e-8, 1e-6);
        });
      }
    }
  });

  it('the full matrix trace does not depend on Dq (the crystal field is traceless)', () => {
    for (const n of [2, 5, 7]) {
      const trace = (dq: number) => {
        const { size, matrix } = fullHamiltonian(n, dq, 900, 3800);
        let t = 0;
        for (let i = 0; i < size; i++) t += matrix[i * size + i] ?? 0;
        return t;
      };
      expectClose(trace(2500), trace(0), 1e-12, 1e-6);
    }
  });

  it('the degeneracy-weighted mean level, put on the absolute scale, does not depend on Dq', () => {
    for (const n of [3, 6]) {
      const mean = (dq: number) => {
        const r = solveCubic({ n, dq, B: 900, C: 3800 });
        const { size, matrix } = fullHamiltonian(n, dq, 900, 3800);
        const lowest = symmetricEigen(matrix, size).values[0] ?? 0;
        return r.levels.reduce((s, l) => s + l.degeneracy * (l.energy + lowest), 0) / size;
      };
      expectClose(mean(1900), mean(0), 1e-10, 1e-6);
      expectClose(mean(400), mean(0), 1e-10, 1e-6);
    }
  });

  it('solveCubic(tet, Dq) equals the octahedral levels at −Dq', () => {
    for (let n = 1; n <= 9; n++) {
      const tet = solveCubic({ n, geometry: 'tet', dq: 450, B: 780, C: 3400 });
      const oct = cubicLevels(n, -450, 780, 3400, 'oct');
      expect(tet.levels.map((l) => l.energy)).toEqual(oct.levels.map((l) => l.energy));
      expect(tet.levels.map((l) => l.label)).toEqual(oct.levels.map((l) => l.label.replace(/g(?=$|\()/, '')));
    }
  });

  it('dⁿ in Td has the levels of d¹⁰⁻ⁿ in Oh (hole equivalence)', () => {
    for (let n = 1; n <= 9; n++) {
      const tet = solveCubic({ n, geometry: 'tet', dq: 620, B: 800, C: 3600 });
      const oct = solveCubic({ n: 10 - n, dq: 620, B: 800, C: 3600 });
      expect(tet.levels.map((l) => l.label)).toEqual(oct.levels.map((l) => l.label.replace(/g(?=$|\()/, '')));
      tet.levels.forEach((l, i) => {
        expectClose(l.energy, oct.levels[i]?.energy ?? Number.NaN, 1e-10, 1e-6);
      });
    }
  });

  it('every adapted-block eigenvector satisfies ‖Hv − λv‖ < 1e-8 in the determinant basis', () => {
    for (const n of [3, 5, 6]) {
      const [dq, B, C] = [1500, 800, 3500];
      for (const block of adaptedBlocks(n)) {
        const det = determinantBlock(block.masks);
        const size = block.masks.length;
        const m = block.size;
        const h = new Float64Array(m * m);
        for (let i = 0; i < h.length; i++) h[i] = B * (block.partB[i] ?? 0) + C * (block.partC[i] ?? 0);
        for (let i = 0; i < m; i++) h[i * m + i] = (h[i * m + i] ?? 0) + dq * (block.fieldDiagonal[i] ?? 0);
        const eig = symmetricEigen(h, m);
        for (let j = 0; j < m; j++) {
          const v = new Float64Array(size);
          for (let r = 0; r < size; r++) {
            for (let c = 0; c < m; c++)
              v[r] = (v[r] ?? 0) + (block.toDeterminants[r * m + c] ?? 0) * (eig.vectors[c * m + j] ?? 0);
          }
          const lambda = eig.values[j] ?? 0;
          let residual = 0;
          for (let r = 0; r < size; r++) {
            let hv = 0;
            for (let c = 0; c < size; c++) {
              const x =
                B * (det.partB[r * size + c] ?? 0) +
                C * (det.partC[r * size + c] ?? 0) +
                dq * (det.partDq[r * size + c] ?? 0);
              hv += x * (v[c] ?? 0);
            }
            residual += (hv - lambda * (v[r] ?? 0)) ** 2;
          }
          expect(Math.sqrt(residual)).toBeLessThan(1e-8 * (1 + Math.abs(lambda)));
        }
      }
    }
  });

  it('configuration weights of every level sum to 1', () => {
    const r = solveCubic({ n: 5, dq: 1500, B: 800, C: 3500 });
    for (const l of r.levels)
      expectClose(
        l.configurations.reduce((s, c) => s + c.weight, 0),
        1,
        1e-10,
      );
  });

  it('cubicLevels without vectors gives the same labels and the very same energies as with them (C₃ trace from the parts against the eigenvector trace)', () => {
    // Dq = 0 (whole free-ion terms degenerate, ¹I and ²I with A1, A2 and E together), B = 0
    // (whole configurations degenerate across spins), and ordinary points in both signs of Dq.
    const points: [number, number, number][] = [
      [0, 900, 4000],
      [0, 1000, 4500],
      [700, 0, 0],
      [-450, 800, 3600],
      [1500, 800, 3500],
      [2400, 650, 3100],
    ];
    for (let n = 1; n <= 9; n++) {
      for (const [dq, B, C] of points) {
        const plain = (l: CubicLevel) => [l.label, l.S, l.irrep, l.energy, l.parent];
        const fast = cubicLevels(n, dq, B, C, 'oct', false);
        const full = cubicLevels(n, dq, B, C, 'oct', true);
        expect(fast.levels.map(plain)).toEqual(full.levels.map(plain));
      }
    }
  });

  it('groundSpin (eigenvalues of the k = 0 and 2 blocks alone) equals the S of the labelled ground level along a Dq scan', () => {
    for (let n = 1; n <= 9; n++) {
      for (let dq = -3000; dq <= 4000; dq += 137) {
        expect(groundSpin(n, dq, 800, 3700)).toBe(cubicLevels(n, dq, 800, 3700, 'oct').ground.S);
      }
    }
  });

  it('labels are the same set at Dq and Dq + 1 cm⁻¹, and each moves by less than 60 cm⁻¹', () => {
    for (let n = 2; n <= 8; n++) {
      for (const dq of [300, 1100, 2600]) {
        const a = solveCubic({ n, dq, B: 850, C: 3800 });
        const b = solveCubic({ n, dq: dq + 1, B: 850, C: 3800 });
        const bByLabel = new Map(b.levels.map((l) => [l.label, l.energy]));
        expect(new Set(bByLabel.keys())).toEqual(new Set(a.levels.map((l) => l.label)));
        for (const l of a.levels) {
          // Relative energies move by up to the slope of the ground state (≤ 40 cm⁻¹ per cm⁻¹ of Dq, for t₂ᵃeᵇ).
          expect(Math.abs((bByLabel.get(l.label) ?? Number.NaN) - l.energy)).toBeLessThan(60);
        }
      }
    }
  });
});

describe('solveCubic: labels and parents', () => {
  it('solveCubic(d³) names ⁴T₁g(F) and ⁴T₁g(P) by parent and the ²E_g of ruby-like Cr³⁺ from ²G', () => {
    const r = solveCubic({ n: 3, dq: 1740, B: 725, C: 3190 });
    expect(r.levels.find((l) => l.label === '4T1g(F)')?.parent).toBe('4F');
    expect(r.levels.find((l) => l.label === '4T1g(P)')?.parent).toBe('4P');
    const e = r.levels.find((l) => l.symbol === '2Eg' && l.parent === '2G');
    expect(e).toBeDefined();
    expect(e?.spinAllowed).toBe(false);
  });

  it('solveCubic(d⁶) at strong field has the ¹A₁g ground state from ¹I, t₂g⁶ (Tanabe & Sugano 1954)', () => {
    const r = solveCubic({ n: 6, dq: 3000, B: 1000, C: 4800 });
    expect(r.ground.symbol).toBe('1A1g');
    expect(r.ground.parent).toBe('1I');
    expect(r.ground.configuration).toBe('t2g^6');
  });

  it('spinAllowed marks exactly the levels of the ground-state spin', () => {
    const r = solveCubic({ n: 5, dq: 800, B: 900, C: 3400 });
    expect(r.ground.label).toBe('6A1g');
    expect(r.levels.filter((l) => l.spinAllowed).map((l) => l.label)).toEqual(['6A1g']);
  });

  it('groundStateCrossings switches d⁴…d⁷ from high to low spin as ⁵E_g→³T₁g, ⁶A₁g→²T₂g, ⁵T₂g→¹A₁g, ⁴T₁g→²E_g (Tanabe & Sugano 1954)', () => {
    const expected: Record<number, [string, string]> = {
      4: ['5Eg', '3T1g'],
      5: ['6A1g', '2T2g'],
      6: ['5T2g', '1A1g'],
      7: ['4T1g', '2Eg'],
    };
    for (const [n, [from, to]] of Object.entries(expected)) {
      const crossings = groundStateCrossings({ n: Number(n), B: 1000, C: 4500 });
      expect(crossings).toHaveLength(1);
      expect(crossings[0]?.from.replace(/\(.*\)$/, '')).toBe(from);
      expect(crossings[0]?.to.replace(/\(.*\)$/, '')).toBe(to);
      const below = solveCubic({ n: Number(n), dq: (crossings[0]?.dq ?? 0) * 0.98, B: 1000, C: 4500 });
      const above = solveCubic({ n: Number(n), dq: (crossings[0]?.dq ?? 0) * 1.02, B: 1000, C: 4500 });
      expect(below.ground.S).toBeGreaterThan(above.ground.S);
    }
  });

  it('groundStateCrossings finds none for d², d³, d⁸ octahedral', () => {
    for (const n of [2, 3, 8]) expect(groundStateCrossings({ n, B: 900, C: 3800 })).toEqual([]);
  });
});

describe('solveCubic: bad input', () => {
  it('solveCubic rejects n outside 1…9, negative or non-finite Dq, B, C and an unknown geometry', () => {
    expect(() => solveCubic({ n: 0, dq: 1000, B: 900, C: 3600 })).toThrow(InputError);
    expect(() => solveCubic({ n: 10, dq: 1000, B: 900, C: 3600 })).toThrow(/10/);
    expect(() => solveCubic({ n: 3, dq: -1, B: 900, C: 3600 })).toThrow(/Dq = -1/);
    expect(() => solveCubic({ n: 3, dq: 1000, B: -5, C: 3600 })).toThrow(/B = -5/);
    expect(() => solveCubic({ n: 3, dq: 1000, B: 900, C: Number.NaN })).toThrow(/C = NaN/);
    expect(() => solveCubic({ n: 3, geometry: 'sq' as 'oct', dq: 1000, B: 900, C: 3600 })).toThrow(
      /geometry/,
    );
  });
});
