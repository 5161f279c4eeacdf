import { describe, expect, it } from 'vitest';
import { groundSpins, groundStateCrossings } from '../../src/analysis/groundState.js';
import { groundSpin } from '../../src/field/cubic.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';

/** The obvious scan: the ground spin solved at every grid point. */
function fullScan(n: number, sign: number, B: number, C: number, maxDq: number, points: number): number[] {
  return Array.from({ length: points + 1 }, (_, i) =>
    groundSpin(n, i === 0 ? 0 : sign * ((maxDq * i) / points), B, C),
  );
}

describe('groundSpins', () => {
  it('groundSpins gives the ground spin of every grid point exactly as solving each point does (d1–d9, Oh and Td, random B, C/B, ranges and grids)', () => {
    const random = uniformRandom(18);
    for (let n = 1; n <= 9; n++) {
      for (const sign of [1, -1]) {
        for (let trial = 0; trial < 3; trial++) {
          const B = 500 + 700 * random();
          const C = B * (2 + 6 * random());
          const maxDq = (B * (20 + 80 * random())) / 10;
          const points = [240, 37, 9][trial] as number;
          expect(groundSpins(n, sign, B, C, maxDq, points), `d${n} sign ${sign} B ${B} C ${C}`).toEqual(
            fullScan(n, sign, B, C, maxDq, points),
          );
        }
      }
    }
  });

  it('groundStateCrossings finds the d5 high-spin → low-spin change of the Tanabe–Sugano diagram near Δ/B ≈ 28 at C/B = 4.477', () => {
    // Tanabe & Sugano, J. Phys. Soc. Jpn. 9, 753 (1954): the d5 diagram (C/B = 4.477) has its
    // ⁶A₁ → ²T₂ change at Δ/B of about 28 (read from the published figure; from memory).
    const crossings = groundStateCrossings({ n: 5, B: 1000, C: 4477 });
    expect(crossings).toHaveLength(1);
    expect(crossings[0]?.fromS).toBe(2.5);
    expect(crossings[0]?.toS).toBe(0.5);
    expect(Math.abs((crossings[0]?.deltaOverB ?? 0) - 28)).toBeLessThan(1.5);
  });
});
