import { describe, expect, it } from 'vitest';
import { freeIonLevels } from '../../src/atom/jLevels.js';
import { hundGround } from '../../src/atom/terms.js';
import { InputError } from '../../src/core/errors.js';
import { expectClose } from '../helpers.js';

describe('freeIonLevels', () => {
  // Landé's interval rule: within a term E(J) − E(J−1) = λJ, with λ = +ζ/2S for a less than
  // half-filled shell and −ζ/2S for a more than half-filled one (Landé, Z. Phys. 15, 189, 1923;
  // Condon & Shortley, The Theory of Atomic Spectra, 1935, §7.4).
  it.each([2, 3, 4, 6, 7, 8])(
    'freeIonLevels(d%i) splits the ground term by the interval rule in the weak-ζ limit',
    (n) => {
      const zeta = 0.1;
      const ground = hundGround(2, n);
      const S = ground.term.S;
      const lambda = ((n < 5 ? 1 : -1) * zeta) / (2 * S);
      const levels = freeIonLevels(n, 1000, 4000, zeta)
        .filter((l) => l.term === ground.term.symbol)
        .sort((a, b) => a.J - b.J);
      expect(levels.length).toBe(Math.round(2 * Math.min(S, ground.term.L) + 1));
      for (let i = 1; i < levels.length; i++) {
        const up = levels[i];
        const down = levels[i - 1];
        if (!up || !down) continue;
        expectClose(up.energy - down.energy, lambda * up.J, 1e-3);
      }
      expect(levels.find((l) => l.energy === 0)?.J).toBe(ground.J);
    },
  );

  it('freeIonLevels(d¹) gives ²D₃/₂ at 0 and ²D₅/₂ at 5ζ/2; d⁹ reverses them', () => {
    const d1 = freeIonLevels(1, 0, 0, 154);
    expect(d1.map((l) => l.label)).toEqual(['2D3/2', '2D5/2']);
    expectClose(d1[1]?.energy, 385, 1e-12);
    const d9 = freeIonLevels(9, 0, 0, 829);
    expect(d9.map((l) => l.label)).toEqual(['2D5/2', '2D3/2']);
    expectClose(d9[1]?.energy, 2072.5, 1e-12);
  });

  it('freeIonLevels gives 2J + 1 states per level, C(10, n) in all, and parent weights summing to 1', () => {
    const levels = freeIonLevels(3, 918, 3850, 273);
    expect(levels.reduce((s, l) => s + l.degeneracy, 0)).toBe(120);
    for (const l of levels) expect(l.parentage.reduce((s, p) => s + p.weight, 0)).toBeGreaterThan(0.999);
    expect(levels[0]?.label).toBe('4F3/2');
  });

  it('freeIonLevels refuses a negative ζ with InputError', () => {
    expect(() => freeIonLevels(3, 918, 3850, -1)).toThrow(InputError);
  });
});
