import { describe, expect, it } from 'vitest';
import { DEFAULT_MAX_DELTA_OVER_B, DEFAULT_SWEEP_POINTS, diagramCautions } from '../../src/analysis/sweep.js';
import {
  type CorrelationDiagram,
  diagramCsv,
  diagramJson,
  freeIonTerms,
  type Geometry,
  InputError,
  solveCubic,
  sweepDiagram,
} from '../../src/index.js';
import { brentRoot } from '../../src/numeric/roots.js';

/** |a − b| ≤ abs + rel·|b|. */
function close(a: number, b: number, rel = 1e-9, abs = 1e-9): boolean {
  return Math.abs(a - b) <= abs + rel * Math.abs(b);
}

const cache = new Map<string, CorrelationDiagram>();
/** Sweeps are cached: several checks look at the same diagram. */
function sweep(n: number, geometry: Geometry, cOverB = 4.5, points = 200): CorrelationDiagram {
  const key = `${n}:${geometry}:${cOverB}:${points}`;
  let d = cache.get(key);
  if (!d) {
    d = sweepDiagram(n, { geometry, cOverB, points });
    cache.set(key, d);
  }
  return d;
}

function curve(d: CorrelationDiagram, label: string) {
  const c = d.curves.find((x) => x.label === label);
  if (!c) throw new Error(`no curve ${label}`);
  return c;
}

const ALL: [number, Geometry][] = [];
for (const geometry of ['oct', 'tet'] as const) for (let n = 1; n <= 9; n++) ALL.push([n, geometry]);

describe('sweepDiagram: the grid and the defaults', () => {
  it('spans 0 to 40 in 400 points by default, with each crossing inserted', () => {
    const d = sweepDiagram(3, { points: undefined });
    expect(d.maxDeltaOverB).toBe(DEFAULT_MAX_DELTA_OVER_B);
    expect(d.points).toBe(DEFAULT_SWEEP_POINTS);
    expect(d.deltaOverB).toHaveLength(DEFAULT_SWEEP_POINTS);
    expect(d.deltaOverB[0]).toBe(0);
    expect(d.deltaOverB.at(-1)).toBe(40);
    const d6 = sweep(6, 'oct', 4.8);
    expect(d6.deltaOverB).toHaveLength(200 + d6.crossings.length);
    for (const c of d6.crossings) expect(d6.deltaOverB).toContain(c.deltaOverB);
    for (let i = 1; i < d6.deltaOverB.length; i++) {
      expect(d6.deltaOverB[i] ?? 0).toBeGreaterThan(d6.deltaOverB[i - 1] ?? 0);
    }
  });

  it('has one curve per level of the solver, each with a value at every Δ/B', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      const levels = solveCubic({ n, geometry, dq: 1500, B: 800, C: 3600 }).levels;
      expect(d.curves.map((c) => c.label).sort()).toEqual(levels.map((l) => l.label).sort());
      for (const c of d.curves) expect(c.values).toHaveLength(d.deltaOverB.length);
    }
  });

  it('reports progress once per point, ending at the total', () => {
    const calls: [number, number][] = [];
    sweepDiagram(2, { points: 7, onProgress: (done, total) => calls.push([done, total]) });
    expect(calls).toEqual([1, 2, 3, 4, 5, 6, 7].map((i) => [i, 7]));
  });
});

describe('sweepDiagram: curve values are the solver’s levels', () => {
  // The sweep solves at B = 1000 cm⁻¹; checking at other B tests that E/B depends on Δ/B and C/B only.
  it('equals solveCubic at the same Δ/B and C/B for any B, in units of B', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      for (const i of [0, 1, 37, 120, d.deltaOverB.length - 1]) {
        const x = d.deltaOverB[i] ?? 0;
        for (const B of [640, 1090]) {
          const r = solveCubic({ n, geometry, dq: (x * B) / 10, B, C: 4.5 * B });
          for (const l of r.levels) {
            const v = curve(d, l.label).values[i] ?? Number.NaN;
            expect(close(v, l.energy / B, 1e-9, 1e-9), `d${n} ${geometry} ${l.label} at Δ/B ${x}`).toBe(true);
          }
        }
      }
    }
  });

  it('puts the ground state at zero at every Δ/B and nothing below it', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      d.deltaOverB.forEach((_, i) => {
        const column = d.curves.map((c) => c.values[i] ?? Number.NaN);
        expect(Math.min(...column)).toBeCloseTo(0, 12);
      });
    }
  });
});

describe('sweepDiagram: curves are followed by label', () => {
  // Hellmann–Feynman: dE/dΔ = ⟨∂H/∂Δ⟩ = 0.6·N_e − 0.4·N_t2 (Oh; reversed in Td) lies within a range
  // of width n for n electrons, so E/B above the ground state changes by at most n·Δ(Δ/B).
  // A swap of two labels between neighbouring points would show as a jump of their gap.
  it('changes along every curve by at most n × the step between neighbouring points', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      for (const c of d.curves) {
        for (let i = 1; i < d.deltaOverB.length; i++) {
          const step = (d.deltaOverB[i] ?? 0) - (d.deltaOverB[i - 1] ?? 0);
          const jump = Math.abs((c.values[i] ?? 0) - (c.values[i - 1] ?? 0));
          expect(jump, `d${n} ${geometry} ${c.label} at point ${i}`).toBeLessThanOrEqual(
            n * step * (1 + 1e-9) + 1e-9,
          );
        }
      }
    }
  });

  // Levels of one ²ˢ⁺¹Γ mix and repel instead of crossing (the non-crossing rule; Tanabe & Sugano,
  // J. Phys. Soc. Japan 9, 753, 1954, draw them so).
  it('never lets two curves of the same ²ˢ⁺¹Γ cross', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      const bySymbol = new Map<string, (typeof d.curves)[number][]>();
      for (const c of d.curves) bySymbol.set(c.symbol, [...(bySymbol.get(c.symbol) ?? []), c]);
      for (const group of bySymbol.values()) {
        for (let a = 0; a < group.length; a++) {
          for (let b = a + 1; b < group.length; b++) {
            const signs = new Set<number>();
            d.deltaOverB.forEach((_, i) => {
              const diff = (group[a]?.values[i] ?? 0) - (group[b]?.values[i] ?? 0);
              if (Math.abs(diff) > 1e-7) signs.add(Math.sign(diff));
            });
            expect(
              signs.size,
              `d${n} ${geometry} ${group[a]?.label} / ${group[b]?.label}`,
            ).toBeLessThanOrEqual(1);
          }
        }
      }
    }
  });
});

describe('sweepDiagram: published limits and closed forms', () => {
  it('starts every curve at its free-ion term’s E/B at Δ/B = 0', () => {
    for (const [n, geometry] of ALL) {
      const d = sweep(n, geometry);
      const terms = new Map(freeIonTerms(n, 1000, 4500).map((t) => [t.name, t.energy / 1000]));
      for (const c of d.curves) expect(c.values[0]).toBeCloseTo(terms.get(c.parent) ?? Number.NaN, 9);
    }
  });

  // d² terms above ³F: ³P 15B, ¹D 5B + 2C, ¹G 12B + 2C, ¹S 22B + 7C (Racah, Phys. Rev. 62, 438,
  // 1942; tabulated in Griffith, The Theory of Transition-Metal Ions, 1961).
  it('starts d² at the closed-form term energies 15, 5 + 2γ, 12 + 2γ, 22 + 7γ (γ = C/B)', () => {
    const g = 4.5;
    const d = sweep(2, 'oct', g);
    const start = (parent: string) => d.curves.find((c) => c.parent === parent)?.values[0] ?? Number.NaN;
    expect(start('3F')).toBeCloseTo(0, 9);
    expect(start('3P')).toBeCloseTo(15, 9);
    expect(start('1D')).toBeCloseTo(5 + 2 * g, 9);
    expect(start('1G')).toBeCloseTo(12 + 2 * g, 9);
    expect(start('1S')).toBeCloseTo(22 + 7 * g, 9);
  });

  // d³ terms above ⁴F: ⁴P 15B, ²G 4B + 3C, ²P and ²H 9B + 3C, ²F 24B + 3C,
  // ²D 20B + 5C ∓ √(193B² + 8BC + 4C²) (same sources).
  it('starts d³ at the closed-form term energies, the two ²D included', () => {
    const g = 4.5;
    const d = sweep(3, 'oct', g);
    const start = (parent: string) => d.curves.find((c) => c.parent === parent)?.values[0] ?? Number.NaN;
    const root = Math.sqrt(193 + 8 * g + 4 * g * g);
    expect(start('4P')).toBeCloseTo(15, 9);
    expect(start('2G')).toBeCloseTo(4 + 3 * g, 9);
    expect(start('2P')).toBeCloseTo(9 + 3 * g, 9);
    expect(start('2H')).toBeCloseTo(9 + 3 * g, 9);
    expect(start('2F')).toBeCloseTo(24 + 3 * g, 9);
    expect(start('a2D')).toBeCloseTo(20 + 5 * g - root, 9);
    expect(start('b2D')).toBeCloseTo(20 + 5 * g + root, 9);
  });

  // ⁴A₂g → ⁴T₂g is exactly 10Dq in octahedral d³ (Tanabe & Sugano, J. Phys. Soc. Japan 9, 753,
  // 1954); by hole–particle and Oh ↔ Td symmetry the same holds for Oh d⁸ (³A₂g → ³T₂g),
  // Td d⁷ (⁴A₂ → ⁴T₂) and Td d² (³A₂ → ³T₂).
  it('draws the first spin-allowed band of A₂-ground ions as the straight line E/B = Δ/B', () => {
    const cases: [number, Geometry, string][] = [
      [3, 'oct', '4T2g'],
      [8, 'oct', '3T2g'],
      [7, 'tet', '4T2'],
      [2, 'tet', '3T2'],
    ];
    for (const [n, geometry, label] of cases) {
      const d = sweep(n, geometry);
      curve(d, label).values.forEach((v, i) => {
        expect(close(v, d.deltaOverB[i] ?? 0, 1e-10, 1e-9), `d${n} ${geometry} at ${i}`).toBe(true);
      });
    }
  });

  // ⁴T₁g(F), ⁴T₁g(P) of Oh d³ (and ³T₁g of Oh d⁸) at 7.5B + 1.5Δ ∓ ½√(225B² − 18BΔ + Δ²) above the
  // ground state (Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984; from memory).
  it('follows the closed form of the two T₁ bands of d³ and d⁸', () => {
    for (const [n, S] of [
      [3, 4],
      [8, 3],
    ] as const) {
      const d = sweep(n, 'oct', 4.5);
      const f = curve(d, `${S}T1g(F)`);
      const p = curve(d, `${S}T1g(P)`);
      d.deltaOverB.forEach((x, i) => {
        const root = 0.5 * Math.sqrt(225 - 18 * x + x * x);
        expect(close(f.values[i] ?? 0, 7.5 + 1.5 * x - root, 1e-9, 1e-8)).toBe(true);
        expect(close(p.values[i] ?? 0, 7.5 + 1.5 * x + root, 1e-9, 1e-8)).toBe(true);
      });
    }
  });

  // Read off the published d⁶ diagram (Tanabe & Sugano, J. Phys. Soc. Japan 9, 753 and 766, 1954, drawn at
  // C/B = 4.8): the ⁵T₂g / ¹A₁g crossover stands at Δ/B ≈ 20. A value read off a printed figure
  // is good to about ±1 here.
  it('puts the d⁶ high-spin/low-spin crossover near Δ/B = 20 at C/B = 4.8', () => {
    const d = sweep(6, 'oct', 4.8);
    expect(d.crossings).toHaveLength(1);
    const c = d.crossings[0];
    expect(c?.from).toBe('5T2g');
    expect(c?.to.startsWith('1A1g')).toBe(true);
    expect(Math.abs((c?.deltaOverB ?? 0) - 20)).toBeLessThan(1);
  });
});

describe('sweepDiagram: crossings', () => {
  it('finds the crossover at the root of E(lowest high-spin) − E(lowest low-spin), computed here directly', () => {
    for (const n of [4, 5, 6, 7]) {
      const d = sweep(n, 'oct', 4.6);
      expect(d.crossings).toHaveLength(1);
      const c = d.crossings[0];
      if (!c) throw new Error('no crossing');
      // Directly: at B = 870 cm⁻¹, bracketed by a coarse scan of our own, solved by Brent's method.
      const B = 870;
      const gap = (x: number) => {
        const levels = solveCubic({ n, dq: (x * B) / 10, B, C: 4.6 * B }).levels;
        const low = (S: number) => levels.find((l) => l.S === S)?.energy ?? Number.NaN;
        return (low(c.fromS) - low(c.toS)) / B;
      };
      let a = 0;
      while (gap(a + 1) < 0) a += 1;
      const root = brentRoot(gap, a, a + 1, { xTolerance: 1e-10 });
      expect(c.deltaOverB).toBeCloseTo(root, 6);
      // Both ground states are at zero in the crossing's column.
      const i = d.deltaOverB.indexOf(c.deltaOverB);
      expect(curve(d, c.from).values[i]).toBeCloseTo(0, 6);
      expect(curve(d, c.to).values[i]).toBeCloseTo(0, 6);
    }
  });

  it('splits the sweep into spin regions at the crossings, with the right ground states', () => {
    const d = sweep(6, 'oct', 4.8);
    expect(d.regions.map((r) => [r.S, r.ground])).toEqual([
      [2, '5T2g'],
      [0, d.crossings[0]?.to],
    ]);
    expect(d.regions[0]?.toDeltaOverB).toBe(d.crossings[0]?.deltaOverB);
    const d3 = sweep(3, 'oct');
    expect(d3.crossings).toEqual([]);
    expect(d3.regions).toEqual([{ fromDeltaOverB: 0, toDeltaOverB: 40, S: 1.5, ground: '4A2g' }]);
  });

  it('gives a spin-state caution exactly when the ground state changes', () => {
    expect(diagramCautions(sweep(3, 'oct'))).toEqual([]);
    const cautions = diagramCautions(sweep(6, 'oct', 4.8));
    expect(cautions).toHaveLength(1);
    expect(cautions[0]?.code).toBe('spin-state');
    expect(cautions[0]?.message).toMatch(/measurement decides/);
    // In Td the model's crossover lies far above real tetrahedral fields: said so as well.
    const td = diagramCautions(sweep(4, 'tet'));
    expect(td).toHaveLength(2);
    expect(td[1]?.message).toMatch(/tetrahedral fields are weak/);
  });
});

describe('diagramCsv and diagramJson', () => {
  /** A small RFC 4180 reader for the round trip. */
  function parseCsv(text: string): string[][] {
    return text
      .trimEnd()
      .split('\n')
      .map((line) => [...line.matchAll(/("(?:[^"]|"")*"|[^,]*)(,|$)/g)].slice(0, -1).map((m) => m[1] ?? ''))
      .map((cells) => cells.map((c) => (c.startsWith('"') ? c.slice(1, -1).replace(/""/g, '"') : c)));
  }

  it('writes a header of Δ/B and every label (quoted where it holds a comma), then one row per Δ/B', () => {
    const d = sweep(4, 'oct');
    const csv = diagramCsv(d);
    expect(csv).toMatch(/"3T1g\(H,1\)"/);
    const rows = parseCsv(csv);
    expect(rows[0]).toEqual(['Delta/B', ...d.curves.map((c) => c.label)]);
    expect(rows).toHaveLength(d.deltaOverB.length + 1);
    rows.slice(1).forEach((row, i) => {
      expect(row).toHaveLength(d.curves.length + 1);
      expect(Number(row[0])).toBeCloseTo(d.deltaOverB[i] ?? 0, 6);
      d.curves.forEach((c, k) => {
        expect(Number(row[k + 1])).toBeCloseTo(c.values[i] ?? 0, 6);
      });
    });
  });

  it('gives JSON with the settings, crossings, regions and every curve', () => {
    const d = sweep(6, 'oct', 4.8);
    const back = JSON.parse(JSON.stringify(diagramJson(d)));
    expect(back).toMatchObject({ n: 6, geometry: 'oct', cOverB: 4.8, maxDeltaOverB: 40, points: 200 });
    expect(back.crossings).toEqual(d.crossings);
    expect(back.curves).toHaveLength(d.curves.length);
    expect(back.curves[0]).toMatchObject({ label: '5T2g', parent: '5D', S: 2 });
    expect(back.deltaOverB).toEqual(d.deltaOverB);
  });
});

describe('sweepDiagram: bad input', () => {
  it.each([
    [0, {}, /d-electron count 0/],
    [10, {}, /d-electron count 10/],
    [2.5, {}, /d-electron count 2.5/],
    [3, { cOverB: 0 }, /C\/B 0: expected a positive number/],
    [3, { cOverB: Number.NaN }, /C\/B NaN/],
    [3, { maxDeltaOverB: -3 }, /largest Δ\/B -3/],
    [3, { maxDeltaOverB: Number.POSITIVE_INFINITY }, /largest Δ\/B Infinity/],
    [3, { points: 1 }, /points 1: expected a whole number from 2/],
    [3, { points: 2.5 }, /points 2.5/],
    [3, { points: 1e6 }, /points 1000000/],
    [3, { geometry: 'square' as Geometry }, /geometry "square"/],
  ])('sweepDiagram(%s, %o) throws an InputError naming the value', (n, options, message) => {
    expect(() => sweepDiagram(n, options)).toThrow(InputError);
    expect(() => sweepDiagram(n, options)).toThrow(message);
  });
});
