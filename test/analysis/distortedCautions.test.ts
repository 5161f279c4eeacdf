import { describe, expect, it } from 'vitest';
import { distortedCautions } from '../../src/analysis/distortedCautions.js';
import type { Ligand } from '../../src/field/angularOverlap.js';
import { solveDistortedSpinOrbit } from '../../src/field/distortedComplex.js';
import { presetLigands } from '../../src/field/geometries.js';

/** Five ligands of no symmetry at all (C1). */
const SKEW: Ligand[] = [
  { kind: 'L', direction: [1, 0.1, 0.05] },
  { kind: 'L', direction: [-0.9, 0.2, 0.1] },
  { kind: 'L', direction: [0.05, 1, -0.2] },
  { kind: 'L', direction: [0.1, -1, 0.3] },
  { kind: 'L', direction: [0.2, 0.1, 1] },
];

function spinOrbitCaution(ligands: Ligand[], parameters: Record<string, { eSigma: number; ePi: number }>) {
  const result = solveDistortedSpinOrbit({
    n: 1,
    B: 0,
    C: 0,
    zeta: 600,
    field: { kind: 'aom', ligands, parameters },
  });
  return { result, caution: distortedCautions(result, ligands).find((c) => c.code === 'spin-orbit') };
}

describe('distortedCautions: spin–orbit names', () => {
  it('distortedCautions gives no spin–orbit caution for a far-from-cubic D4h complex, whose levels carry double-group labels', () => {
    const { result, caution } = spinOrbitCaution(presetLigands('elongated-octahedron'), {
      eq: { eSigma: 6500, ePi: 1000 },
      ax: { eSigma: 1500, ePi: 200 },
    });
    expect(result.cubic.misfit).toBeGreaterThan(0.1);
    expect(caution).toBeUndefined();
  });

  it('distortedCautions says that the double group is not tabulated for a far-from-cubic C1 complex', () => {
    const { result, caution } = spinOrbitCaution(SKEW, { L: { eSigma: 6000, ePi: 1000 } });
    expect(result.group).toBe('C1');
    expect(result.cubic.misfit).toBeGreaterThan(0.1);
    expect(caution?.message).toContain('the double group of C1 is not tabulated here');
  });
});
