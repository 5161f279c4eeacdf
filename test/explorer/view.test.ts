import { describe, expect, it } from 'vitest';
import { diagramSvg } from '../../explorer/diagramSvg.js';
import { spectrumSvg } from '../../explorer/spectrumSvg.js';
import { levelTable } from '../../explorer/tables.js';
import { DIAGRAM_POINTS, diagramRange, viewComputer } from '../../explorer/view.js';
import { sweepDiagram } from '../../src/analysis/sweep.js';
import { solveCubic } from '../../src/field/cubic.js';
import { expectClose } from '../helpers.js';

const params = { sample: 0, n: 3, geometry: 'oct', dq: 1740, B: 725, cOverB: 4, zeta: 0 } as const;

describe('the explorer view', () => {
  it('viewComputer gives the levels of solveCubic and keeps the diagram while only Dq moves', () => {
    const compute = viewComputer();
    const a = compute(params);
    expect(a.levels).toEqual(solveCubic({ n: 3, geometry: 'oct', dq: 1740, B: 725, C: 2900 }));
    expect(a.diagram.points).toBe(DIAGRAM_POINTS);
    expect(compute({ ...params, dq: 1800 }).diagram).toBe(a.diagram);
    expect(compute({ ...params, cOverB: 4.5 }).diagram).not.toBe(a.diagram);
  });

  it('the coarser crossover search finds the crossings of the library’s default diagram (d4–d7)', () => {
    const compute = viewComputer();
    for (const n of [4, 5, 6, 7]) {
      const view = compute({ ...params, n, cOverB: 4.5 });
      const reference = sweepDiagram(n, {
        cOverB: 4.5,
        maxDeltaOverB: view.diagram.maxDeltaOverB,
        points: 2,
      });
      expect(view.diagram.crossings.length).toBe(reference.crossings.length);
      for (const [i, c] of view.diagram.crossings.entries()) {
        expectClose(c.deltaOverB, reference.crossings[i]?.deltaOverB ?? Number.NaN, 0, 1e-6);
      }
    }
  });

  it('diagramRange widens the Δ/B range in steps of 10 to hold the current point', () => {
    expect(diagramRange(24)).toBe(40);
    expect(diagramRange(50)).toBe(60);
  });

  it('viewComputer adds the spin–orbit levels only for ζ > 0', () => {
    const compute = viewComputer();
    expect(compute(params).spinOrbit).toBeUndefined();
    expect(compute({ ...params, zeta: 200 }).spinOrbit?.zeta).toBe(200);
  });

  it('diagramSvg draws one hover target per curve, the current line and one diamond per band', () => {
    const view = viewComputer()(params);
    const svg = diagramSvg(view, [17400, 24600]);
    expect(svg.match(/data-curve="/g)).toHaveLength(view.diagram.curves.length);
    expect(svg.match(/data-observed="/g)).toHaveLength(2);
    expect(svg).toContain(`data-current="${view.deltaOverB}"`);
    expect(svg).toContain('⁴T₂g');
  });

  it('spectrumSvg draws a stick for every level inside the spectrum range', () => {
    const view = viewComputer()(params);
    const spectrum = { wavenumber: [10_000, 20_000, 30_000], value: [0, 1, 0], quantity: 'absorbance' };
    const inside = view.levels.levels.filter((l) => l.energy >= 10_000 && l.energy <= 30_000);
    expect(spectrumSvg(view, spectrum, []).match(/data-stick="/g)).toHaveLength(inside.length);
  });

  it('levelTable gives each row its label and exact energy', () => {
    const { levels } = viewComputer()(params).levels;
    const html = levelTable(levels);
    for (const l of levels) expect(html).toContain(`data-label="${l.label}" data-energy="${l.energy}"`);
  });
});
