import { describe, expect, it } from 'vitest';
import { fittedSample } from '../../src/analysis/fittedSample.js';
import { findIon, InputError } from '../../src/index.js';

// [Ni(H2O)6]2+: bands at 8500, 13 800 and 25 300 cm⁻¹; for octahedral d8 the first band is 10Dq.
// A. B. P. Lever, "Inorganic Electronic Spectroscopy", 2nd ed., Elsevier, 1984, ch. 6 (from memory).
describe('fittedSample', () => {
  it('places a Ni2+ sample at Dq = ν1/10 with errors for Dq and B', () => {
    const ion = findIon('Ni2+');
    const placed = fittedSample({
      n: 8,
      geometry: 'oct',
      ion,
      cOverB: 4.5,
      bands: [{ energy: 8500 }, { energy: 13800 }, { energy: 25300 }],
    });
    expect(placed.dq.value).toBeGreaterThan(830);
    expect(placed.dq.value).toBeLessThan(870);
    expect(placed.B).toBeGreaterThan(700);
    expect(placed.B).toBeLessThan(ion.B ?? 0);
    expect(placed.C).toBeCloseTo(4.5 * placed.B, 6);
    expect(placed.dq.sigma).toBeGreaterThan(0);
  });

  it('throws an InputError for a band energy that is not positive', () => {
    expect(() => fittedSample({ n: 8, geometry: 'oct', cOverB: 4.5, bands: [{ energy: -5 }] })).toThrow(
      InputError,
    );
  });
});
