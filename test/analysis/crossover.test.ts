import { describe, expect, it } from 'vitest';
import { crossoverCautions, TETRAHEDRAL_DELTA_CEILING } from '../../src/analysis/crossover.js';
import { crossoverAnalysis, InputError, sampleVerdict, solveCubic, sweepDiagram } from '../../src/index.js';

const B = 800;

describe('crossoverAnalysis', () => {
  // Order of ground states across the crossover, octahedral: Tanabe & Sugano, J. Phys. Soc. Japan
  // 9, 753 and 766 (1954); Lever, Inorganic Electronic Spectroscopy, 1984.
  it.each([
    [4, '5Eg', '3T1g', 2, 1],
    [5, '6A1g', '2T2g', 2.5, 0.5],
    [6, '5T2g', '1A1g', 2, 0],
    [7, '4T1g', '2Eg', 1.5, 0.5],
  ])('puts octahedral d%i from %s to %s, as in the Tanabe–Sugano diagrams', (n, from, to, fromS, toS) => {
    const a = crossoverAnalysis({ n, B, C: 4.5 * B });
    expect(a.crossings).toHaveLength(1);
    expect(a.crossings[0]).toMatchObject({ fromSymbol: from, toSymbol: to, fromS, toS });
    expect(a.crossings[0]?.from.startsWith(from)).toBe(true);
  });

  // Δc/B at the C/B of the published diagrams (Tanabe & Sugano 1954): d⁶ ≈ 20 at C/B = 4.8
  // (read off the figure); d⁴ ≈ 27 at 4.61, d⁵ ≈ 28 at 4.477, d⁷ ≈ 21.5 at 4.633 (from memory of
  // the figures). Tolerances fit a reading off a printed figure.
  it.each([
    [6, 4.8, 20, 1],
    [4, 4.61, 27, 1.5],
    [5, 4.477, 28, 1.5],
    [7, 4.633, 21.5, 1.5],
  ])(
    'gives octahedral d%i at C/B = %s a crossover near Δ/B = %s (Tanabe–Sugano 1954)',
    (n, cb, read, tol) => {
      const a = crossoverAnalysis({ n, B, C: cb * B });
      expect(Math.abs((a.crossings[0]?.deltaOverB ?? 0) - read)).toBeLessThanOrEqual(tol);
    },
  );

  it('finds the point where the lowest levels of the two spins have equal energy, to the root tolerance', () => {
    for (const n of [4, 5, 6, 7]) {
      const a = crossoverAnalysis({ n, B, C: 4.5 * B });
      const c = a.crossings[0];
      if (!c) throw new Error('expected a crossover');
      const at = (dq: number) => solveCubic({ n, dq, B, C: 4.5 * B });
      const r = at(c.dq);
      const e = (S: number) => r.levels.find((l) => l.S === S)?.energy ?? Number.NaN;
      // The gap changes by ~10–30 cm⁻¹ per cm⁻¹ of Dq, the root is good to 1e-7 in Dq.
      expect(Math.abs(e(c.fromS) - e(c.toS))).toBeLessThan(1e-4);
      expect(at(c.dq - 0.01).ground.S).toBe(c.fromS);
      expect(at(c.dq + 0.01).ground.S).toBe(c.toS);
      expect(c.tenDq).toBeCloseTo(10 * c.dq, 9);
      expect(c.deltaOverB).toBeCloseTo(c.tenDq / B, 9);
    }
  });

  it('scales the crossover Dq linearly with B at fixed C/B (energies are homogeneous in B, C, Dq)', () => {
    for (const n of [5, 6]) {
      const base = crossoverAnalysis({ n, B: 700, C: 4.4 * 700 }).crossings[0];
      for (const lambda of [0.6, 1.45]) {
        const scaled = crossoverAnalysis({ n, B: 700 * lambda, C: 4.4 * 700 * lambda }).crossings[0];
        expect(scaled?.dq ?? 0).toBeCloseTo(lambda * (base?.dq ?? 0), 5);
        expect(scaled?.deltaOverB ?? 0).toBeCloseTo(base?.deltaOverB ?? 0, 7);
      }
    }
  });

  it('finds tetrahedral dⁿ to be octahedral d¹⁰⁻ⁿ (hole equivalence) and says the crossover is out of reach', () => {
    const tet = crossoverAnalysis({ n: 4, geometry: 'tet', B, C: 4.5 * B });
    const oct = crossoverAnalysis({ n: 6, geometry: 'oct', B, C: 4.5 * B });
    expect(tet.crossings[0]?.dq ?? 0).toBeCloseTo(oct.crossings[0]?.dq ?? 1, 5);
    expect([tet.crossings[0]?.fromSymbol, tet.crossings[0]?.toSymbol]).toEqual(['5T2', '1A1']);
    expect(tet.crossings[0]?.tenDq ?? 0).toBeGreaterThan(TETRAHEDRAL_DELTA_CEILING);
    expect(tet.outOfReach).toMatch(/high-spin/);
    expect(oct.outOfReach).toBeUndefined();
    expect(crossoverCautions(tet).map((c) => c.code)).toContain('tetrahedral');
  });

  it('states that d3, d8, d1 and d9 have no crossover, without an error', () => {
    const cases: [number, number][] = [
      [2, 1],
      [3, 1.5],
      [8, 1],
    ];
    for (const [n, S] of cases) {
      const a = crossoverAnalysis({ n, B, C: 4.5 * B });
      expect(a.crossings).toEqual([]);
      expect(a.weakFieldS).toBe(S);
      expect(a.statement).toMatch(/no spin crossover/);
    }
    for (const n of [1, 9])
      expect(crossoverAnalysis({ n, B: 0, C: 0 }).statement).toMatch(/single spin state/);
    expect(crossoverCautions(crossoverAnalysis({ n: 3, B, C: 4.5 * B }))).toEqual([]);
  });

  it('cautions about entropy and lattice, bond lengths, and Jahn–Teller for E states (d⁴ ⁵Eg)', () => {
    const codes = crossoverCautions(crossoverAnalysis({ n: 4, B, C: 4.5 * B })).map((c) => c.code);
    expect(codes).toEqual(['spin-state', 'bond-length', 'jahn-teller']);
    const text = crossoverCautions(crossoverAnalysis({ n: 6, B, C: 4.5 * B }))
      .map((c) => c.message)
      .join(' ');
    expect(text).toMatch(/entropy/);
    expect(text).toMatch(/Mössbauer/);
  });

  it('refuses bad input with InputError naming the value', () => {
    expect(() => crossoverAnalysis({ n: 6, B: 0, C: 100 })).toThrow(/Racah B/);
    expect(() => crossoverAnalysis({ n: 6, B: 800, C: -1 })).toThrow(InputError);
    expect(() => crossoverAnalysis({ n: 10, B: 800, C: 3000 })).toThrow(/d-electron count 10/);
    expect(() => crossoverAnalysis({ n: 6, geometry: 'hex' as 'oct', B: 800, C: 3000 })).toThrow(/geometry/);
  });
});

describe('sampleVerdict', () => {
  const C = 4.8 * B;
  const analysis = crossoverAnalysis({ n: 6, B, C });
  const dqC = analysis.crossings[0]?.dq ?? Number.NaN;

  it('puts a sample below the crossover on the high-spin side with a negative margin, and above on the low-spin side', () => {
    const low = sampleVerdict(analysis, { dq: 0.8 * dqC });
    expect(low).toMatchObject({ side: 'high-spin', groundSymbol: '5T2g', S: 2, other: '1A1g(I)' });
    expect(low.margin?.dq).toBeCloseTo(-0.2 * dqC, 6);
    expect(low.margin?.tenDq).toBeCloseTo(-2 * dqC, 6);
    expect(low.margin?.percent).toBeCloseTo(-20, 9);
    expect(low.gap ?? 0).toBeGreaterThan(0);
    expect(low.near).toBe(false);
    const high = sampleVerdict(analysis, { dq: 1.05 * dqC });
    expect(high).toMatchObject({ side: 'low-spin', groundSymbol: '1A1g', S: 0, near: true });
    expect(high.margin?.percent).toBeCloseTo(5, 9);
    expect(high.sigma).toBeUndefined();
  });

  it('has a gap that vanishes at the crossover', () => {
    expect(sampleVerdict(analysis, { dq: dqC }).gap ?? 1).toBeLessThan(1e-4);
  });

  it('propagates σ(Dq), σ(B) and their correlation as the numerical gradient of the margin says (GUM, JCGM 100:2008, §5.2)', () => {
    const dq = 1.04 * dqC;
    const sigmaDq = 30;
    const sigmaB = 25;
    const rho = 0.6;
    const v = sampleVerdict(analysis, { dq, sigmaDq, sigmaB, correlation: rho });
    // Margin and percentage as functions of (Dq, B) at fixed C/B, differentiated numerically.
    const h = 2;
    const dqcAt = (b: number) => crossoverAnalysis({ n: 6, B: b, C: 4.8 * b }).crossings[0]?.dq ?? Number.NaN;
    const up = dqcAt(B + h);
    const down = dqcAt(B - h);
    const dMdB = -(up - down) / (2 * h);
    const dPdB = (100 * (dq / up - dq / down)) / (2 * h);
    const dPdDq = 100 / dqC;
    const sigmaM = Math.sqrt(sigmaDq ** 2 + (dMdB * sigmaB) ** 2 + 2 * rho * dMdB * sigmaDq * sigmaB);
    const sigmaP = Math.sqrt(
      (dPdDq * sigmaDq) ** 2 + (dPdB * sigmaB) ** 2 + 2 * rho * dPdDq * dPdB * sigmaDq * sigmaB,
    );
    expect(v.sigma?.dq ?? 0).toBeCloseTo(sigmaM, 4);
    expect(v.sigma?.tenDq ?? 0).toBeCloseTo(10 * sigmaM, 3);
    expect(v.sigma?.percent ?? 0).toBeCloseTo(sigmaP, 4);
    expect(v.crossingSigmaDq ?? 0).toBeCloseTo(-dMdB * sigmaB, 4);
    expect(v.sigmas ?? 0).toBeCloseTo(Math.abs(v.margin?.dq ?? 0) / sigmaM, 4);
    expect(v.settled).toBe((v.sigmas ?? 0) > 2);
  });

  it('reduces to σ(Dq) alone without σ(B), and calls a margin of many σ settled', () => {
    const v = sampleVerdict(analysis, { dq: 1.2 * dqC, sigmaDq: 10 });
    expect(v.sigma?.dq).toBeCloseTo(10, 12);
    expect(v.sigmaDeltaOverB ?? 0).toBeCloseTo(100 / B, 12);
    expect(v.settled).toBe(true);
    expect(sampleVerdict(analysis, { dq: 1.01 * dqC, sigmaDq: 50 }).settled).toBe(false);
  });

  it('gives d3 the side no-crossover and its ground state, without a margin', () => {
    const v = sampleVerdict(crossoverAnalysis({ n: 3, B, C: 4 * B }), { dq: 1700, sigmaDq: 20 });
    expect(v).toMatchObject({ side: 'no-crossover', groundSymbol: '4A2g' });
    expect(v.margin).toBeUndefined();
  });

  it('refuses a negative Dq or σ and a correlation outside [−1, 1] with InputError', () => {
    expect(() => sampleVerdict(analysis, { dq: -1 })).toThrow(InputError);
    expect(() => sampleVerdict(analysis, { dq: 1000, sigmaB: -3 })).toThrow(/σ\(B\)/);
    expect(() => sampleVerdict(analysis, { dq: 1000, sigmaDq: 3, correlation: 1.5 })).toThrow(/correlation/);
  });
});

describe('crossoverAnalysis and the correlation diagram', () => {
  it('the crossover is where every curve of the d⁴–d⁷ diagrams jumps (the sweep inserts the same root)', () => {
    for (const n of [4, 5, 6, 7]) {
      const cb = 4.8;
      const diagram = sweepDiagram(n, { cOverB: cb });
      const analysis = crossoverAnalysis({ n, B: 800, C: cb * 800 });
      expect(diagram.crossings).toHaveLength(1);
      expect(
        Math.abs((diagram.crossings[0]?.deltaOverB ?? 0) - (analysis.crossings[0]?.deltaOverB ?? 0)),
      ).toBeLessThan(1e-6);
      // The grid holds that Δ/B itself, so every curve has its kink drawn at the root.
      const x = diagram.crossings[0]?.deltaOverB ?? 0;
      const i = diagram.deltaOverB.findIndex((v) => Math.abs(v - x) < 1e-12);
      expect(i).toBeGreaterThan(0);
    }
  });
});
