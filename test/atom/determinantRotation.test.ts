import { describe, expect, it } from 'vitest';
import { rotateDeterminantsByMinors } from '../../src/atom/determinantRotation.js';
import { determinantBlock, determinantClasses } from '../../src/field/hamiltonian.js';
import { cubicRotations, rotationBlock, rotationOfShell } from '../../src/field/symmetry.js';

describe('rotateDeterminantsByMinors', () => {
  it('equals the electron-by-electron expansion (rotateDeterminants) to 1e-13 for every rotation of the cube on the d²…d⁵ classes', () => {
    const rotations = cubicRotations().filter((r) => r.cls !== 'E');
    for (const n of [2, 3, 4, 5]) {
      for (const masks of determinantClasses(n)) {
        const det = determinantBlock(masks);
        for (const r of rotations) {
          const U = rotationOfShell(2, r.matrix);
          const expanded = rotationBlock(2, det, U);
          const minors = rotationBlock(2, det, U, rotateDeterminantsByMinors);
          let worst = 0;
          expanded.forEach((x, i) => {
            worst = Math.max(worst, Math.abs(x - (minors[i] ?? Number.NaN)));
          });
          expect(worst).toBeLessThan(1e-13);
        }
      }
    }
  });
});
