import { pathToFileURL } from 'node:url';
import { sweepSpinOrbit } from '../src/analysis/spinOrbitSweep.js';
import { fullSpinOrbitHamiltonian } from '../src/field/spinOrbitBlocks.js';
import { solveSpinOrbit } from '../src/field/spinOrbitSolver.js';
import { symmetricEigen } from '../src/numeric/eigen.js';
import { timeIt } from './timing.js';

/**
 * Spin–orbit benchmark: the M_J-blocked solver against the full C(10, n) matrix in the same run
 * (every level labelled Γ1…Γ8; with and without parentage), and a 1000-point d⁵ diagram with ζ.
 */
export function benchSpinOrbit(): void {
  const point = { dq: 1500, B: 800, C: 3500, zeta: 400 };
  console.log('Spin–orbit solver, one point (Dq = 1500, B = 800, C = 3500, ζ = 400 cm⁻¹):');
  console.log('  dⁿ   size   blocked/ms   +parentage/ms   full/ms   full÷blocked');
  for (const n of [2, 3, 4, 5]) {
    const blocked = timeIt(() => solveSpinOrbit({ n, ...point, parentage: false }), 20);
    const withParents = timeIt(() => solveSpinOrbit({ n, ...point }), 10);
    const { size, matrix } = fullSpinOrbitHamiltonian(n, point.dq, point.B, point.C, point.zeta);
    const full = timeIt(() => symmetricEigen(matrix, size), n >= 4 ? 3 : 10);
    console.log(
      `  d${n}   ${String(size).padStart(4)}   ${blocked.toFixed(2).padStart(10)}   ${withParents.toFixed(2).padStart(13)}   ` +
        `${full.toFixed(1).padStart(7)}   ${(full / blocked).toFixed(0).padStart(12)}`,
    );
  }
  sweepSpinOrbit(5, { zetaOverB: 0.5, points: 10 });
  const start = performance.now();
  sweepSpinOrbit(5, { zetaOverB: 0.5, points: 1000 });
  console.log(
    `  d5 diagram with ζ/B = 0.5, 1000 Δ/B points (0…40): ${(performance.now() - start).toFixed(0)} ms`,
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchSpinOrbit();
