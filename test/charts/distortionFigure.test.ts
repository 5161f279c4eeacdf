import { writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { groupStateRuns, renderDistortionDiagram } from '../../charts/distortionDiagram.js';
import { distortionSweep } from '../../src/analysis/distortionSweep.js';
import { presetLigands } from '../../src/field/geometries.js';

describe('renderDistortionDiagram', () => {
  it('groupStateRuns raises the multiplicity, lowers the index and keeps primes and ranks', () => {
    expect(groupStateRuns('3B1g(2)').map((r) => r.text)).toEqual(['3', 'B', '1g', '(2)']);
    expect(groupStateRuns('2E"').map((r) => r.text)).toEqual(['2', 'E', '″']);
  });

  it('renderDistortionDiagram writes a PNG of the octahedron-to-square-plane path', () => {
    const eq = { eSigma: 7000, ePi: 1000 };
    const sweep = distortionSweep({
      n: 8,
      B: 700,
      C: 3000,
      from: 1,
      to: 0,
      steps: 20,
      coordinate: 'eσ(axial) / eσ(equatorial)',
      fieldAt: (r) => ({
        kind: 'aom',
        ligands: presetLigands('elongated-octahedron'),
        parameters: { eq, ax: { eSigma: r * eq.eSigma, ePi: r * eq.ePi } },
      }),
    });
    const png = renderDistortionDiagram(sweep, { format: 'png' }, 40000);
    expect(png.subarray(1, 4).toString()).toBe('PNG');
    if (process.env.TERMSPLIT_KEEP_FIGURES) writeFileSync(process.env.TERMSPLIT_KEEP_FIGURES, png);
  });
});
