import { describe, expect, it } from 'vitest';
import { gaunt, threeJ, wignerD } from '../../src/atom/angular.js';
import { octahedralFieldMatrix } from '../../src/field/crystalField.js';
import { cubicRotations, eulerAngles, rotationOfShell } from '../../src/field/symmetry.js';
import { expectClose } from '../helpers.js';

describe('threeJ', () => {
  it('threeJ gives the tabulated values (1 1 0; 0 0 0) = −1/√3 and (2 2 2; 0 0 0) = −√(2/35) (Edmonds 1957, Table 2)', () => {
    expectClose(threeJ(1, 1, 0, 0, 0, 0), -1 / Math.sqrt(3), 1e-12);
    expectClose(threeJ(2, 2, 2, 0, 0, 0), -Math.sqrt(2 / 35), 1e-12);
    expectClose(threeJ(2, 4, 2, 0, 0, 0), Math.sqrt(2 / 35), 1e-12);
  });

  it('threeJ obeys the orthogonality Σ_{m1,m2} (j1 j2 j; m1 m2 m)² = 1/(2j+1), summed over m to 1 (Edmonds 1957, eq. 3.7.8)', () => {
    for (const [j1, j2] of [
      [2, 2],
      [3, 2],
      [3, 3],
    ] as const) {
      for (let j = Math.abs(j1 - j2); j <= j1 + j2; j++) {
        let sum = 0;
        for (let m1 = -j1; m1 <= j1; m1++) {
          for (let m2 = -j2; m2 <= j2; m2++) sum += threeJ(j1, j2, j, m1, m2, -m1 - m2) ** 2;
        }
        expectClose(sum, 1, 1e-12);
      }
    }
  });

  it('threeJ vanishes unless m1 + m2 + m3 = 0 and the triangle rule holds', () => {
    expect(threeJ(2, 2, 2, 1, 1, 1)).toBe(0);
    expect(threeJ(1, 1, 3, 0, 0, 0)).toBe(0);
  });
});

describe('gaunt', () => {
  // Condon & Shortley, The Theory of Atomic Spectra, 1935, Table 1⁶ (c^k for d electrons), from memory.
  const table: [number, number, number, number][] = [
    [2, 2, 2, -2 / 7],
    [2, 2, 1, Math.sqrt(6) / 7],
    [2, 2, 0, -2 / 7],
    [2, 1, 1, 1 / 7],
    [2, 1, 0, 1 / 7],
    [2, 0, 0, 2 / 7],
    [4, 2, 2, 1 / 21],
    [4, 2, 1, -Math.sqrt(5) / 21],
    [4, 2, 0, Math.sqrt(15) / 21],
    [4, 2, -1, -Math.sqrt(35) / 21],
    [4, 2, -2, Math.sqrt(70) / 21],
    [4, 1, 1, -4 / 21],
    [4, 1, 0, Math.sqrt(30) / 21],
    [4, 1, -1, -Math.sqrt(40) / 21],
    [4, 0, 0, 6 / 21],
  ];
  for (const [k, m1, m2, value] of table) {
    it(`gaunt c^${k}(2 ${m1}, 2 ${m2}) is the tabulated value`, () => {
      expectClose(gaunt(k, 2, m1, 2, m2), value, 1e-12);
    });
  }

  it('gaunt c^0(l m, l m) = 1 and c^k is symmetric as c^k(m, m′) = (−1)^{m−m′} c^k(m′, m)', () => {
    for (let m = -2; m <= 2; m++) expectClose(gaunt(0, 2, m, 2, m), 1, 1e-12);
    for (let m = -2; m <= 2; m++) {
      for (let mp = -2; mp <= 2; mp++) {
        expectClose(gaunt(4, 2, m, 2, mp), (-1) ** (m - mp) * gaunt(4, 2, mp, 2, m), 1e-12, 1e-14);
      }
    }
  });
});

describe('wignerD and the cubic rotations', () => {
  it('cubicRotations gives the 24 rotations of O in classes of 1, 8, 3, 6, 6', () => {
    const rotations = cubicRotations();
    expect(rotations).toHaveLength(24);
    const count = (c: string) => rotations.filter((r) => r.cls === c).length;
    expect([count('E'), count('C3'), count('C2'), count('C4'), count('C2p')]).toEqual([1, 8, 3, 6, 6]);
  });

  it('wignerD of every cubic rotation leaves the octahedral field invariant, D†VD = V', () => {
    const v = octahedralFieldMatrix();
    for (const r of cubicRotations()) {
      const d = rotationOfShell(2, r.matrix);
      for (let a = 0; a < 5; a++) {
        for (let b = 0; b < 5; b++) {
          let re = 0;
          let im = 0;
          for (let i = 0; i < 5; i++) {
            for (let j = 0; j < 5; j++) {
              const x = d[i]?.[a];
              const y = d[j]?.[b];
              const vij = v[i]?.[j] ?? 0;
              if (!x || !y || vij === 0) continue;
              // conj(x) · v · y
              re += vij * (x.re * y.re + x.im * y.im);
              im += vij * (x.re * y.im - x.im * y.re);
            }
          }
          expectClose(re, v[a]?.[b] ?? 0, 1e-12, 1e-12);
          expectClose(im, 0, 1e-12, 1e-12);
        }
      }
    }
  });

  it('eulerAngles gives R = R_z(α) R_y(β) R_z(γ) for every cubic rotation', () => {
    const rz = (t: number) => [Math.cos(t), -Math.sin(t), 0, Math.sin(t), Math.cos(t), 0, 0, 0, 1];
    const ry = (t: number) => [Math.cos(t), 0, Math.sin(t), 0, 1, 0, -Math.sin(t), 0, Math.cos(t)];
    const mul = (x: number[], y: number[]) =>
      Array.from({ length: 9 }, (_, i) => {
        const r = Math.floor(i / 3);
        const c = i % 3;
        return (
          (x[r * 3] ?? 0) * (y[c] ?? 0) +
          (x[r * 3 + 1] ?? 0) * (y[3 + c] ?? 0) +
          (x[r * 3 + 2] ?? 0) * (y[6 + c] ?? 0)
        );
      });
    for (const r of cubicRotations()) {
      const [a, b, g] = eulerAngles(r.matrix);
      const rebuilt = mul(mul(rz(a), ry(b)), rz(g));
      rebuilt.forEach((x, i) => {
        expectClose(x, r.matrix[i] ?? 0, 0, 1e-12);
      });
    }
  });

  it('wignerD is unitary', () => {
    const d = wignerD(2, 0.3, 1.1, -0.7);
    for (let i = 0; i < 5; i++) {
      for (let j = 0; j < 5; j++) {
        let re = 0;
        let im = 0;
        for (let k = 0; k < 5; k++) {
          const x = d[k]?.[i];
          const y = d[k]?.[j];
          if (!x || !y) continue;
          re += x.re * y.re + x.im * y.im;
          im += x.re * y.im - x.im * y.re;
        }
        expectClose(re, i === j ? 1 : 0, 0, 1e-12);
        expectClose(im, 0, 0, 1e-12);
      }
    }
  });
});
