import { describe, expect, it } from 'vitest';
import { distortedSampleFit } from '../../cli/distorted.js';
import { geometrySchema } from '../../src/sheets/geometrySheet.js';

describe('geometrySchema and distortedSampleFit', () => {
  it('geometrySchema takes one field source and refuses none or two', () => {
    expect(geometrySchema.safeParse({ shape: 'square-plane', bonds: { L: [9000, 1000] } }).success).toBe(
      true,
    );
    expect(geometrySchema.safeParse({ bonds: { L: [9000, 1000] } }).success).toBe(false);
    expect(geometrySchema.safeParse({ shape: 'square-plane', tetragonal: [1, 2, 3] }).success).toBe(false);
    expect(geometrySchema.safeParse({ shape: 'square-plane', colour: 'red' }).success).toBe(false);
  });

  it('distortedSampleFit fits a sheet sample with tetragonal parameters and reports the geometry used', () => {
    const report = distortedSampleFit(
      { tetragonal: [1000, 500, 200], assign: ['2B2g', '2A1g', '2Eg'] },
      '.',
      {
        n: 9,
        cOverB: 4,
        bands: [{ energy: 12500 }, { energy: 9000 }, { energy: 15500 }],
      },
    );
    expect(report.group).toBe('D4h');
    expect(report.parameters.dq).toBeCloseTo(1250, 6);
    expect(report.geometryText).toContain('tetragonal field (D4h)');
  });
});
