import { describe, expect, it } from 'vitest';
import { binomial, microstates, popcount, quantumNumbers } from '../../src/atom/microstates.js';
import { InputError } from '../../src/core/errors.js';

describe('microstates', () => {
  it('microstates(l, n) gives C(4l+2, n) distinct determinants for every shell s…f', () => {
    for (let l = 0; l <= 3; l++) {
      for (let n = 0; n <= 4 * l + 2; n++) {
        const states = microstates(l, n);
        expect(states.length).toBe(binomial(4 * l + 2, n));
        expect(new Set(states.map((s) => s.mask)).size).toBe(states.length);
        for (const s of states) expect(popcount(s.mask)).toBe(n);
      }
    }
  });

  it('microstates(1, 2) is the 15 determinants of p² (any atomic-spectroscopy text)', () => {
    expect(microstates(1, 2)).toHaveLength(15);
  });

  it('microstates(3, 7) has 3432 determinants with M_L from −12 to 12 and M_S from −7/2 to 7/2', () => {
    const states = microstates(3, 7);
    expect(states).toHaveLength(3432);
    expect(Math.max(...states.map((s) => s.ML))).toBe(12);
    expect(Math.max(...states.map((s) => s.twoMS))).toBe(7);
  });

  it('quantumNumbers of a full shell is M_L = 0, M_S = 0', () => {
    expect(quantumNumbers(2, (1 << 10) - 1)).toEqual({ ML: 0, twoMS: 0 });
  });

  it('microstates rejects n outside 0…4l+2 and unknown l with an InputError naming the value', () => {
    expect(() => microstates(2, 11)).toThrow(InputError);
    expect(() => microstates(2, 11)).toThrow(/11/);
    expect(() => microstates(4, 1)).toThrow(/l = 4/);
  });
});
