import { describe, expect, it } from 'vitest';
import { solveCubic } from '../src/index.js';

describe('solveCubic smoke', () => {
  it('puts 4T2g of octahedral d3 at exactly 10Dq (Lever, Inorganic Electronic Spectroscopy, 1984)', () => {
    const r = solveCubic({ n: 3, dq: 1740, B: 725, C: 3190 });
    expect(r.levels.find((l) => l.label === '4T2g')?.energy).toBeCloseTo(17400, 6);
  });
});
