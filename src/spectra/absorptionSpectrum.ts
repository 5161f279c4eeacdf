/**
 * An absorption spectrum on a rising wavenumber axis, with y as absorbance, molar
 * absorptivity ε, the Kubelka–Munk function of a diffuse reflectance, or an arbitrary quantity
 * proportional to absorption.
 *
 * Diffuse reflectance R of an optically thick powder is turned into the Kubelka–Munk function
 * F(R) = (1 − R)²/(2R) = K/S (P. Kubelka and F. Munk, "Ein Beitrag zur Optik der
 * Farbanstriche", Z. Tech. Phys. 1931, 12, 593), the ratio of the absorption to the scattering
 * coefficient: proportional to absorption where S varies slowly, but with no ε.
 *
 * No Jacobian is applied when x was a wavelength. Absorbance is −log₁₀ of a ratio of two
 * intensities measured at the same wavelength, a value at a point and not a density per unit
 * wavelength, so A(ν̃) = A(λ = 10⁷/ν̃) exactly; the Jacobian |dλ/dν̃| = 10⁷/ν̃² belongs to
 * spectral densities such as emission spectra recorded per nm. The band shape is Gaussian in
 * energy, which is why bands are found on the wavenumber axis.
 */

import { ensure, InputError } from '../core/errors.js';
import { toWavenumber } from '../core/units.js';
import { ensureMonotonicX, pointPlace, type RawSpectrum } from './rawSpectrum.js';
import { chooseUnit, type SpectrumXUnit, type SpectrumYUnit, type UnitChoice } from './spectrumUnits.js';

/** What y holds after conversion. */
export type AbsorptionQuantity = 'absorbance' | 'epsilon' | 'kubelka-munk' | 'arbitrary';

/** The Kubelka–Munk function F(R) = (1 − R)²/(2R) of a diffuse reflectance R (a fraction, 0 < R ≤ 1). */
export function kubelkaMunk(r: number): number {
  return (1 - r) ** 2 / (2 * r);
}

/** The reflectance R (0 < R ≤ 1) whose Kubelka–Munk function is F ≥ 0: R = 1 + F − √(F² + 2F). */
export function reflectanceOfKubelkaMunk(f: number): number {
  return 1 + f - Math.sqrt(f * f + 2 * f);
}

/** An absorption spectrum in cm⁻¹, x rising. */
export interface AbsorptionSpectrum {
  /** Wavenumbers, cm⁻¹, strictly rising. */
  readonly wavenumber: Float64Array;
  /** Absorbance, ε (L mol⁻¹ cm⁻¹) or arbitrary units, at each wavenumber. */
  readonly value: Float64Array;
  readonly quantity: AbsorptionQuantity;
  /** The x unit of the file and where it came from. */
  readonly xUnit: UnitChoice<SpectrumXUnit>;
  /** The y unit of the file and where it came from. */
  readonly yUnit: UnitChoice<SpectrumYUnit>;
  /** What was done to y, e.g. `A = 2 − log₁₀(%T)`, `ε = A / (c·l)`, in order. */
  readonly conversions: readonly string[];
}

/** Options of {@link absorptionSpectrum}. */
export interface AbsorptionOptions {
  /** The x unit the user gave; must agree with the file's, if it names one. @default the file's */
  readonly xUnit?: SpectrumXUnit;
  /** The y unit the user gave; must agree with the file's. @default the file's */
  readonly yUnit?: SpectrumYUnit;
  /** Concentration of the absorbing ion, mol L⁻¹; with `pathLength`, turns absorbance into ε. */
  readonly concentration?: number;
  /** Optical path length, cm; with `concentration`, turns absorbance into ε. */
  readonly pathLength?: number;
}

/**
 * Applies the units to a spectrum read from a file: x to cm⁻¹ (rising), transmittance to
 * absorbance (A = −log₁₀ T, or 2 − log₁₀ %T), and absorbance to ε = A / (c·l) when the
 * concentration and path length are given (Beer–Lambert law).
 * @throws InputError when a unit is unknown or disagrees with the file, x is not one
 *   monotonic scan or not positive, a transmittance is not positive, or c and l come singly or
 *   with a y that is not absorbance.
 */
export function absorptionSpectrum(raw: RawSpectrum, options: AbsorptionOptions = {}): AbsorptionSpectrum {
  const xUnit = chooseUnit('x', raw.xLabel, raw.xUnit, options.xUnit);
  const yUnit = chooseUnit('y', raw.yLabel, raw.yUnit, options.yUnit);
  ensureMonotonicX(raw);
  const n = raw.x.length;
  for (let i = 0; i < n; i++) {
    const v = raw.x[i] as number;
    if (!(v > 0)) {
      throw new InputError(
        `${pointPlace(raw, i)}: x = ${v} ${xUnit.unit}: expected a positive ${xUnit.unit} value`,
      );
    }
  }
  const conversions: string[] = [];
  const y = Float64Array.from(raw.y);
  let quantity = quantityOf(yUnit.unit);
  if (yUnit.unit === 'reflectance' || yUnit.unit === 'reflectance-percent') {
    toKubelkaMunk(raw, y, yUnit.unit === 'reflectance-percent');
    conversions.push(
      `F(R) = (1 − R)²/(2R)${yUnit.unit === 'reflectance-percent' ? ', R = %R/100' : ''} (Kubelka–Munk)`,
    );
  }
  if (yUnit.unit === 'transmittance' || yUnit.unit === 'transmittance-percent') {
    const percent = yUnit.unit === 'transmittance-percent';
    for (let i = 0; i < n; i++) {
      const t = y[i] as number;
      if (!(t > 0)) {
        throw new InputError(
          `${pointPlace(raw, i)}: transmittance ${t}${percent ? ' %' : ''}: expected a positive value (absorbance would be infinite)`,
        );
      }
      y[i] = percent ? 2 - Math.log10(t) : -Math.log10(t);
    }
    conversions.push(percent ? 'A = 2 − log₁₀(%T)' : 'A = −log₁₀(T)');
  }
  const { concentration: c, pathLength: l } = options;
  if (c !== undefined || l !== undefined) {
    ensure(
      c !== undefined && l !== undefined,
      'give both the concentration and the path length to turn absorbance into ε',
    );
    ensure(c > 0 && Number.isFinite(c), `concentration ${c} mol/L: expected a positive number`);
    ensure(l > 0 && Number.isFinite(l), `path length ${l} cm: expected a positive number`);
    ensure(
      quantity === 'absorbance',
      `y is already ${quantity === 'epsilon' ? 'ε' : quantity === 'kubelka-munk' ? 'the Kubelka–Munk F(R) of a reflectance' : 'in arbitrary units'}: concentration and path length apply to absorbance only`,
    );
    for (let i = 0; i < n; i++) y[i] = (y[i] as number) / (c * l);
    conversions.push(`ε = A / (c·l), c = ${c} mol L⁻¹, l = ${l} cm`);
    quantity = 'epsilon';
  }
  const wavenumber = new Float64Array(n);
  for (let i = 0; i < n; i++) wavenumber[i] = toWavenumber(raw.x[i] as number, xUnit.unit);
  if ((wavenumber[n - 1] as number) < (wavenumber[0] as number)) {
    wavenumber.reverse();
    y.reverse();
  }
  return { wavenumber, value: y, quantity, xUnit, yUnit, conversions };
}

function quantityOf(unit: SpectrumYUnit): AbsorptionQuantity {
  if (unit === 'epsilon' || unit === 'arbitrary' || unit === 'kubelka-munk') return unit;
  if (unit === 'reflectance' || unit === 'reflectance-percent') return 'kubelka-munk';
  return 'absorbance';
}

/**
 * Diffuse reflectance (fraction or per cent) → F(R), in place. R must lie in (0, 1]: at 0 F(R)
 * is infinite, and above a perfect white (the reference) the formula has no meaning.
 */
function toKubelkaMunk(raw: RawSpectrum, y: Float64Array, percent: boolean): void {
  const scale = percent ? 100 : 1;
  for (let i = 0; i < y.length; i++) {
    const given = y[i] as number;
    const r = given / scale;
    if (!(r > 0 && r <= 1)) {
      throw new InputError(
        `${pointPlace(raw, i)}: reflectance ${given}${percent ? ' %' : ''}: expected a value above 0 and at most ${percent ? '100 %' : '1'} ` +
          '(F(R) = (1 − R)²/2R needs 0 < R ≤ 1; rescale to the white standard)',
      );
    }
    y[i] = kubelkaMunk(r);
  }
}
