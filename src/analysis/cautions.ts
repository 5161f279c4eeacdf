/**
 * Where the cubic model is known to mislead, in words a report can carry. The thresholds are
 * rules of thumb (common practice, no source).
 */

import { halfIntegerText } from '../atom/terms.js';
import type { CubicResult } from '../field/cubic.js';
import { unicodeLabel } from '../field/labels.js';

/** Above this, charge-transfer and intraligand bands often lie and can hide d–d bands, cm⁻¹. */
export const CHARGE_TRANSFER_ONSET = 30000;

/** One caution: a short code for programs and a sentence for people. */
export interface Caution {
  readonly code: 'jahn-teller' | 'excited-jahn-teller' | 'charge-transfer' | 'spin-state';
  readonly message: string;
}

/**
 * Cautions about a set of cubic levels: Jahn–Teller activity, bands in the charge-transfer region,
 * spin state. `element` (such as `Fe`), when known, lets the spin-state caution name ⁵⁷Fe
 * Mössbauer spectroscopy, a method for iron only.
 */
export function cubicCautions(result: CubicResult, element?: string): Caution[] {
  const out: Caution[] = [];
  const g = result.ground;
  if (g.cubicIrrep === 'E') {
    out.push({
      code: 'jahn-teller',
      message:
        `ground state ${unicodeLabel(g.symbol)} is orbitally degenerate (E): Jahn–Teller active; real complexes distort ` +
        '(usually tetragonally) and bands split or broaden, so cubic positions are averages at best',
    });
  } else if (g.cubicIrrep === 'T1' || g.cubicIrrep === 'T2') {
    out.push({
      code: 'jahn-teller',
      message:
        `ground state ${unicodeLabel(g.symbol)} is orbitally degenerate (T): weakly Jahn–Teller active and split by spin–orbit ` +
        'coupling, which this model leaves out; expect broadened bands and magnetic moments off the spin-only value',
    });
  }
  const firstBand = result.levels.find((l) => l !== g && l.spinAllowed);
  if (firstBand && firstBand.cubicIrrep === 'E' && g.cubicIrrep !== 'E') {
    out.push({
      code: 'excited-jahn-teller',
      message:
        `the lowest spin-allowed band goes to ${unicodeLabel(firstBand.label)} (an E state): excited-state Jahn–Teller ` +
        'splitting often gives it two components or a shoulder',
    });
  }
  const high = result.levels.filter((l) => l.spinAllowed && l !== g && l.energy > CHARGE_TRANSFER_ONSET);
  if (high.length > 0) {
    const named = high.slice(0, 3).map((l) => unicodeLabel(l.label));
    const more = high.length > 3 ? ` and ${high.length - 3} more` : '';
    out.push({
      code: 'charge-transfer',
      message:
        `spin-allowed band${high.length > 1 ? 's' : ''} ${named.join(', ')}${more} predicted above ` +
        `${CHARGE_TRANSFER_ONSET} cm⁻¹, where charge-transfer and ligand bands often hide d–d bands`,
    });
  }
  if (result.n >= 4 && result.n <= 7) {
    out.push({
      code: 'spin-state',
      message:
        `d${result.n}: the ground state here is ${unicodeLabel(g.symbol)} (S = ${halfIntegerText(g.S)}); which spin state a real compound adopts ` +
        `depends also on temperature, lattice and entropy — magnetic measurement${element === 'Fe' ? ' or ⁵⁷Fe Mössbauer spectroscopy' : ''} decides`,
    });
  }
  return out;
}
