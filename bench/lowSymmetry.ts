import { aomField } from '../src/field/angularOverlap.js';
import { solveDistorted } from '../src/field/distortedComplex.js';
import { presetLigands } from '../src/field/geometries.js';
import { solveField, symmetryContext } from '../src/field/lowSymmetrySolver.js';
import { pointGroup } from '../src/field/pointGroups.js';
import { fitDistorted } from '../src/fit/distortedFit.js';
import { timeIt } from './timing.js';

/**
 * Low-symmetry benchmark: one general-field solve per dⁿ (eigenvalues only, and with labels in
 * the point group), the whole distorted-complex task, and a four-parameter AOM fit.
 */
export function benchLowSymmetry(): void {
  const ligands = presetLigands('cis-MA4B2');
  const parameters = { A: { eSigma: 7000, ePi: 1000 }, B: { eSigma: 5500, ePi: 700 } };
  const field = aomField(ligands, parameters);
  const group = pointGroup(ligands);
  console.log('General field (cis-MA4B2, C2v), B = 750, C = 3200 cm⁻¹:');
  console.log('  dⁿ   levels/ms   labelled/ms   task (group, parents, orbitals)/ms');
  for (let n = 1; n <= 9; n++) {
    const symmetry = symmetryContext(n, group);
    const plain = timeIt(() => solveField({ n, field, B: 750, C: 3200 }), 10);
    const labelled = timeIt(() => solveField({ n, field, B: 750, C: 3200 }, { symmetry }), 10);
    const task = timeIt(
      () => solveDistorted({ n, B: 750, C: 3200, field: { kind: 'aom', ligands, parameters } }),
      3,
    );
    console.log(
      `  d${n}   ${plain.toFixed(2).padStart(9)}   ${labelled.toFixed(2).padStart(11)}   ${task.toFixed(1).padStart(8)}`,
    );
  }
  const start = performance.now();
  const fit = fitDistorted({
    n: 3,
    field: {
      kind: 'aom',
      ligands: presetLigands('trans-MA4B2'),
      parameters: { A: { eSigma: 6800, ePi: 1000 }, B: { eSigma: 5000, ePi: 600 } },
    },
    B: 700,
    C: 3100,
    free: ['eSigma(A)', 'eSigma(B)', 'ePi(B)', 'B'],
    bands: [{ energy: 16800 }, { energy: 18900 }, { energy: 23500 }, { energy: 25800 }],
  });
  console.log(
    `AOM fit of d3 trans-MA4B2, 4 parameters, 4 bands: ${(performance.now() - start).toFixed(0)} ms (${fit.reason})`,
  );
}
