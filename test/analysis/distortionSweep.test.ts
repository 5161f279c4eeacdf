import { describe, expect, it } from 'vitest';
import { distortionCsv, distortionSweep } from '../../src/analysis/distortionSweep.js';
import { solveCubic } from '../../src/field/cubic.js';
import { presetLigands } from '../../src/field/geometries.js';
import { expectClose } from '../helpers.js';

const EQ = { eSigma: 9000, ePi: 1000 };

/** The axial-to-equatorial ratio path: 1 is the octahedron, 0 the square plane. */
function ratioPath(ratio: number) {
  return {
    kind: 'aom' as const,
    ligands: presetLigands('elongated-octahedron'),
    parameters: { eq: EQ, ax: { eSigma: ratio * EQ.eSigma, ePi: ratio * EQ.ePi } },
  };
}

describe('distortionSweep: octahedron to square plane', () => {
  it('distortionSweep(d8) starts at the cubic levels (10Dq = 3eσ − 4eπ), keeps D4h labels and turns low-spin (1A1g ground) towards the square plane', () => {
    const sweep = distortionSweep({
      n: 8,
      B: 700,
      C: 3000,
      fieldAt: ratioPath,
      from: 1,
      to: 0,
      steps: 10,
      coordinate: 'eσ(ax)/eσ(eq)',
    });
    expect(sweep.group).toBe('D4h');
    expect(sweep.x).toHaveLength(11);
    const cubic = solveCubic({ n: 8, dq: (3 * EQ.eSigma - 4 * EQ.ePi) / 10, B: 700, C: 3000 });
    // ³T₂g of the octahedron is ³B₂g + ³Eg in D4h, both at 10Dq at the start.
    const t2 = cubic.levels.find((l) => l.label === '3T2g')?.energy ?? Number.NaN;
    expectClose(sweep.curves.find((c) => c.label === '3B2g')?.energies[0], t2, 1e-9, 1e-6);
    expect(sweep.ground[0]).toBe('3B1g');
    expect(sweep.ground[10]).toBe('1A1g(1)');
    const csv = distortionCsv(sweep).split('\n');
    expect(csv[0]?.startsWith('eσ(ax)/eσ(eq),')).toBe(true);
    expect(csv).toHaveLength(13);
  });
});
