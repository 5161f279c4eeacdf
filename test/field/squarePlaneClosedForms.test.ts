import { describe, it } from 'vitest';
import { presetLigands } from '../../src/field/geometries.js';
import { solveField, symmetryContext } from '../../src/field/lowSymmetrySolver.js';
import { pointGroup } from '../../src/field/pointGroups.js';
import { expectClose } from '../helpers.js';

/**
 * Strong-field closed forms of d⁸ in a square-planar (D4h) field: with x²−y² far above the other
 * four orbitals, the ground state is the closed shell ¹A1g (x²−y² empty) and each excited level
 * is one electron moved from orbital i into x²−y². Its energy above the ground state is
 * Δᵢ + J(i, x²−y²) ± K(i, x²−y²) − J(x²−y², x²−y²) (+K for the singlet, −K for the triplet),
 * which with the Coulomb and exchange integrals of the real d orbitals in Racah's A, B, C gives
 * ¹A2g = Δ(xy) − C, ³A2g = Δ(xy) − 3C; ¹Eg = Δ(xz) − 3B − C, ³Eg = Δ(xz) − 9B − 3C;
 * ¹B1g = Δ(z²) − 4B − C, ³B1g = Δ(z²) − 12B − 3C, Δ(i) = ε(x²−y²) − ε(i).
 * Integrals: Griffith, The Theory of Transition-Metal Ions, Cambridge 1961, tables of J and K
 * over the real d orbitals; the singlet forms as used for planar d⁸ spectra in Lever,
 * Inorganic Electronic Spectroscopy, 2nd ed., 1984 (from memory).
 */
describe('square-planar d8 in the strong-field limit', () => {
  const B = 600;
  const C = 2700;
  const eps = { xy: 3000, xz: 1000, z2: -2000 };
  const symmetry = symmetryContext(8, pointGroup(presetLigands('square-plane')));
  /** Levels with x²−y² at `top` (diagonal field over xy, yz, z², xz, x²−y², the solver's order). */
  const solveAt = (top: number) => {
    const field = new Float64Array(25);
    [eps.xy, eps.xz, eps.z2, eps.xz, top].forEach((e, i) => {
      field[i * 6] = e;
    });
    return solveField({ n: 8, field, B, C }, { symmetry });
  };
  /**
   * Configuration mixing shifts each level by O(B²/top, C²/top) (second order); solving at top
   * and 2·top and extrapolating (Richardson) removes it, so the closed forms hold to 0.01 cm⁻¹.
   */
  const TOP = 5e6;
  const result = solveAt(TOP);
  const doubled = solveAt(2 * TOP);
  const energyIn = (r: typeof result, symbol: string) => {
    const level = r.levels.find((l) => l.symbol === symbol);
    if (!level) throw new Error(`no ${symbol} among ${r.levels.map((l) => l.label).join(', ')}`);
    return level.energy;
  };
  /** Energy above the ground less the x²−y² height, extrapolated to an infinitely high x²−y². */
  const limitOf = (symbol: string) =>
    2 * (energyIn(doubled, symbol) - 2 * TOP) - (energyIn(result, symbol) - TOP);

  it('solveField(d8, planar field) has the closed-shell 1A1g ground state', () => {
    if (result.ground.symbol !== '1A1g') throw new Error(`ground ${result.ground.label}`);
  });

  const cases: [string, number][] = [
    ['1A2g', -eps.xy - C],
    ['3A2g', -eps.xy - 3 * C],
    ['1Eg', -eps.xz - 3 * B - C],
    ['3Eg', -eps.xz - 9 * B - 3 * C],
    ['1B1g', -eps.z2 - 4 * B - C],
    ['3B1g', -eps.z2 - 12 * B - 3 * C],
  ];
  for (const [symbol, expected] of cases) {
    it(`solveField(d8, planar field) puts the lowest ${symbol} at its one-electron closed form`, () => {
      expectClose(limitOf(symbol), expected, 0, 0.01);
    });
  }
});
