/**
 * The crystal-field parameterisations of axial fields as published: tetragonal (Dq, Ds, Dt) about
 * z and trigonal (Dq, Dσ, Dτ, or Dq, v, v′) about a threefold axis. Each is a real 5×5 field over
 * the real d orbitals (see realOrbitals.ts), cm⁻¹, with zero trace (the barycentre of the d
 * orbitals at zero).
 */

import { ensure } from '../core/errors.js';
import { axisRotation, compose3, type Mat3, orbitalTransform, transformField, unit } from './realOrbitals.js';

/** The cubic field per unit Dq with the fourfold axes along x, y, z: e_g at +6Dq, t₂g at −4Dq. */
export function cubicField(dq: number): Float64Array {
  const v = new Float64Array(25);
  // xy, yz, z², xz, x²−y²
  [-4, -4, 6, -4, 6].forEach((x, i) => {
    v[6 * i] = x * dq;
  });
  return v;
}

/**
 * The axial operators about z per unit parameter, diagonal in |m⟩: Ds gives m² − 2 and Dt gives
 * −(35m⁴ − 155m² + 72)/12, so that with Dq the tetragonal orbital energies are
 * x²−y²: 6Dq + 2Ds − Dt; z²: 6Dq − 2Ds − 6Dt; xy: −4Dq + 2Ds − Dt; xz, yz: −4Dq − Ds + 4Dt
 * (Ballhausen, Introduction to Ligand Field Theory, 1962, ch. 5; Lever, Inorganic Electronic
 * Spectroscopy, 2nd ed., 1984, §6). The real orbitals of m and −m share these values.
 */
function axialDiagonal(ds: number, dt: number): Float64Array {
  const v = new Float64Array(25);
  const mOf = [-2, -1, 0, 1, 2];
  mOf.forEach((m, i) => {
    v[6 * i] = ds * (m * m - 2) - (dt * (35 * m ** 4 - 155 * m * m + 72)) / 12;
  });
  return v;
}

function add(a: Float64Array, b: Float64Array): Float64Array {
  return a.map((x, i) => x + (b[i] ?? 0));
}

function checkFinite(values: Readonly<Record<string, number>>): void {
  for (const [name, x] of Object.entries(values)) {
    ensure(Number.isFinite(x), `${name} = ${x}: expected a number of cm⁻¹`);
  }
}

/**
 * The tetragonal field (Dq, Ds, Dt) with the fourfold axis along z and x, y towards the
 * equatorial ligands. Positive Ds and Dt describe an elongation along z.
 */
export function tetragonalField(dq: number, ds: number, dt: number): Float64Array {
  checkFinite({ Dq: dq, Ds: ds, Dt: dt });
  return add(cubicField(dq), axialDiagonal(ds, dt));
}

/**
 * The rotation taking the cube axes of an octahedron to a frame with one threefold axis along z
 * and a twofold axis (the cube face diagonal [1, −1, 0]) along x: the cube's [111] goes to z.
 */
export function trigonalFrame(): number[] {
  // Turn [111] into z: rotate about (1, −1, 0)/√2 by the angle between [111] and z.
  const tilt = axisRotation(unit([1, -1, 0]), Math.acos(1 / Math.sqrt(3)));
  // Then turn the twofold axis [1, −1, 0] (left in place by the tilt) onto x.
  return compose3(axisRotation([0, 0, 1], Math.PI / 4), tilt);
}

/** The cubic field per unit Dq seen in a frame R (the octahedron's axes moved by R). */
export function rotatedCubicField(dq: number, r: Mat3): Float64Array {
  return transformField(orbitalTransform(r), cubicField(dq));
}

/**
 * The trigonal field (Dq, Dσ, Dτ) with the threefold axis along z: the cubic field of an
 * octahedron with its [111] axis along z and a twofold axis along x, plus the axial operators
 * of Ds and Dt taken about the threefold axis (Dσ and Dτ). The t₂g orbitals split into
 * a₁ = −4Dq − 2Dσ − 6Dτ and e = −4Dq + Dσ + (2/3)Dτ, the e_g pair stays at 6Dq + (7/3)Dτ on the
 * diagonal, and the two e pairs mix by (√2/3)(3Dσ − 5Dτ) (König & Kremer, Ligand Field Energy
 * Diagrams, 1977; Perumareddi, J. Phys. Chem. 71, 3144, 1967 — from memory).
 */
export function trigonalField(dq: number, dSigma: number, dTau: number): Float64Array {
  checkFinite({ Dq: dq, Dσ: dSigma, Dτ: dTau });
  return add(rotatedCubicField(dq, trigonalFrame()), axialDiagonal(dSigma, dTau));
}

/**
 * Dσ and Dτ from the trigonal splitting v = E(a₁) − E(e) of t₂g and the mixing v′ of the two e
 * pairs as defined in {@link trigonalField}: v = −3Dσ − (20/3)Dτ, v′ = (√2/3)(3Dσ − 5Dτ).
 * Authors differ in the sign of v and v′; these are the signs of this project.
 */
export function trigonalFromSplitting(v: number, vPrime: number): { dSigma: number; dTau: number } {
  checkFinite({ v, 'v′': vPrime });
  // Solve [−3, −20/3; √2, −5√2/3] [Dσ, Dτ] = [v, v′].
  const a = -3;
  const b = -20 / 3;
  const c = Math.SQRT2;
  const d = (-5 * Math.SQRT2) / 3;
  const det = a * d - b * c;
  return { dSigma: (d * v - b * vPrime) / det, dTau: (a * vPrime - c * v) / det };
}
