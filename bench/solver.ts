/** Solver benchmark: blocked against full-matrix time per dⁿ, block sizes, and a 1000-point d⁵ sweep. */

import { termsOf } from '../src/atom/terms.js';
import { solveCubic } from '../src/field/cubic.js';
import { adaptedBlocks } from '../src/field/cubicBasis.js';
import { determinantClasses, fullHamiltonian } from '../src/field/hamiltonian.js';
import { symmetricEigen } from '../src/numeric/eigen.js';
import { timeIt } from './timing.js';

/** Prints the solver timings and block sizes of d¹ to d⁹, then the d⁵ sweep. */
export function benchSolver(): void {
  console.log('Cubic solver, one point (Dq = 1500, B = 800, C = 3500 cm⁻¹), every level labelled:');
  console.log(
    '  dⁿ   blocked/ms   full/ms   full÷blocked   determinant classes (M_S lowest, M_L mod 4)   adapted blocks (k, S, C₂′)',
  );
  for (let n = 1; n <= 9; n++) {
    solveCubic({ n, dq: 1500, B: 800, C: 3500 });
    const blocked = timeIt(() => solveCubic({ n, dq: 1500, B: 800, C: 3500 }), 200);
    const { size, matrix } = fullHamiltonian(n, 1500, 800, 3500);
    const full = timeIt(() => symmetricEigen(matrix, size), n === 5 || n === 4 || n === 6 ? 3 : 10);
    const classes = determinantClasses(n).map((c) => c.length);
    const blocks = adaptedBlocks(n).map((b) => b.size);
    console.log(
      `  d${n}   ${blocked.toFixed(3).padStart(10)}   ${full.toFixed(1).padStart(7)}   ${(full / blocked).toFixed(0).padStart(12)}   ` +
        `${classes.join(' + ').padEnd(44)}  ${blocks.join(' ')}`,
    );
  }
  solveCubic({ n: 5, dq: 0, B: 800, C: 3500 });
  const start = performance.now();
  for (let i = 0; i < 1000; i++) solveCubic({ n: 5, dq: (4 * 800 * i) / 999, B: 800, C: 3500 });
  console.log(
    `  d5, 1000 Δ points (Δ/B 0…40), every state labelled: ${(performance.now() - start).toFixed(0)} ms`,
  );
  const t = timeIt(() => termsOf(3, 7), 5);
  console.log(`Terms of f7 (3432 microstates): ${t.toFixed(1)} ms`);
}
