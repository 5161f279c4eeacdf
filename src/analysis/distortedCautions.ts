/**
 * Where the levels of a distorted complex can mislead, in words a report can carry: an orbitally
 * degenerate ground state (Jahn–Teller), open axial positions (d–s mixing, which the angular
 * overlap model here leaves out), spin–orbit coupling (left out, or named only in part where the double group is not tabulated), and bands in the
 * charge-transfer region. Thresholds are rules of thumb (common practice, no source).
 */

import type { Ligand } from '../field/angularOverlap.js';
import type { DistortedResult, DistortedSpinOrbitResult } from '../field/distortedComplex.js';
import { CHARGE_TRANSFER_ONSET } from './cautions.js';

/** One caution about a distorted complex. */
export interface DistortedCaution {
  readonly code: 'jahn-teller' | 'd-s-mixing' | 'spin-orbit' | 'charge-transfer' | 'weak-parents';
  readonly message: string;
}

/** Misfit of the nearest cubic field above which the spin–orbit levels' cubic names are worth a caution (common practice, no source). */
const SPIN_ORBIT_PARENT_MISFIT = 0.1;

/** A ligand counts as axial when its direction is within this cosine of the principal axis. */
const AXIAL_COSINE = 0.9;

/**
 * Cautions about a distorted complex; `ligands` (when the field came from them) tell open axial
 * sites, and `eDs` whether d–s mixing was included.
 */
export function distortedCautions(
  result: DistortedResult,
  ligands?: readonly Ligand[],
  eDs = 0,
): DistortedCaution[] {
  const out: DistortedCaution[] = [];
  const g = result.ground;
  if (g.dimension > 1) {
    out.push({
      code: 'jahn-teller',
      message: `ground state ${g.symbol} is orbitally degenerate in ${result.group}: Jahn–Teller active, so the complex is expected to distort further unless spin–orbit coupling quenches it; the measured structure decides`,
    });
  }
  if (ligands && eDs === 0 && (result.group === 'D4h' || result.group === 'C4v')) {
    const axial = ligands.filter((l) => {
      const [x, y, z] = l.direction;
      return Math.abs(z) / Math.hypot(x, y, z) > AXIAL_COSINE;
    }).length;
    if (axial < 2) {
      out.push({
        code: 'd-s-mixing',
        message:
          'open axial positions: d–s mixing lowers d_z² in such complexes by up to a few thousand cm⁻¹; without --eds it is left out, so levels with a d_z² hole or electron sit too high and fitted eσ absorb the error',
      });
    }
  }
  if (!('spinOrbit' in result)) {
    out.push({
      code: 'spin-orbit',
      message:
        'spin–orbit coupling is left out (give ζ to add it): levels split further (strongly for 4d and 5d ions), and spin-forbidden bands borrow intensity where levels of different spin come close',
    });
  } else if (
    result.cubic.misfit > SPIN_ORBIT_PARENT_MISFIT &&
    (result as DistortedSpinOrbitResult).spinOrbit.pointGroup === undefined
  ) {
    out.push({
      code: 'spin-orbit',
      message: `with spin–orbit coupling the levels are named only by their degeneracy, the level without ζ they lie in most and, where the weight is high, the cubic double-group level: the double group of ${result.group} is not tabulated here`,
    });
  }
  if (result.levels.some((l) => l.spinAllowed && l.energy > CHARGE_TRANSFER_ONSET)) {
    out.push({
      code: 'charge-transfer',
      message: `bands above about ${CHARGE_TRANSFER_ONSET} cm⁻¹ may be hidden under charge-transfer or ligand bands`,
    });
  }
  if (result.levels.some((l) => l.cubicParent === undefined)) {
    out.push({
      code: 'weak-parents',
      message:
        'some levels have no cubic parent: the distortion mixes cubic levels too much for cubic names to describe them',
    });
  }
  return out;
}
