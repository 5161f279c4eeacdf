import { describe, expect, it } from 'vitest';
import { hasSpinChoice } from '../../src/analysis/spinChoice.js';

// High- and low-spin ground states exist for d4–d7 octahedral and d3–d6 tetrahedral ions:
// B. N. Figgis and M. A. Hitchman, "Ligand Field Theory and Its Applications", Wiley-VCH, 2000,
// ch. 3 (from memory).
describe('hasSpinChoice', () => {
  it('is true for d4–d7 in Oh and d3–d6 in Td, false otherwise', () => {
    const oct = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((n) => hasSpinChoice(n, 'oct'));
    const tet = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((n) => hasSpinChoice(n, 'tet'));
    expect(oct).toEqual([4, 5, 6, 7]);
    expect(tet).toEqual([3, 4, 5, 6]);
  });
});
