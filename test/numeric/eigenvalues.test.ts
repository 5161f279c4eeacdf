import { describe, it } from 'vitest';
import { symmetricEigen } from '../../src/numeric/eigen.js';
import { symmetricEigenvalues } from '../../src/numeric/eigenvalues.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';
import { expectClose } from '../helpers.js';

describe('symmetricEigenvalues', () => {
  it('symmetricEigenvalues equals the eigenvalues of ml-matrix’s full decomposition on random symmetric matrices', () => {
    const random = uniformRandom(7);
    for (const n of [1, 2, 5, 17, 40]) {
      const a = new Float64Array(n * n);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j <= i; j++) {
          const x = random() * 2 - 1;
          a[i * n + j] = x;
          a[j * n + i] = x;
        }
      }
      const expected = symmetricEigen(a, n).values;
      symmetricEigenvalues(a, n).forEach((v, i) => {
        expectClose(v, expected[i] ?? Number.NaN, 1e-12, 1e-12);
      });
    }
  });

  it('symmetricEigenvalues keeps exact degeneracies of a diagonal matrix', () => {
    const a = Float64Array.from([3, 0, 0, 0, -1, 0, 0, 0, 3]);
    const v = symmetricEigenvalues(a, 3);
    expectClose(v[0], -1);
    expectClose(v[1], 3);
    expectClose(v[2], 3);
  });
});
