import { levelKeys } from '../analysis/bandModel.js';
import type { CubicLevel, CubicResult } from '../field/cubic.js';
import type { FitAssignment, FitBand, PredictedBand, SharpMatch } from './fitTypes.js';

/**
 * The band-by-band picture of a fitted solution: each band with its level, every predicted
 * level with the band it explains (both levels of an exactly degenerate pair included) and its
 * one- or two-electron character, and the sharp bands matched to the predicted levels.
 */

/**
 * A transition moving this many electrons between t₂ and e or more (in the mean over the
 * configurations of both states) counts as a two-electron jump: such transitions are weak,
 * since the dipole operator moves one electron (e.g. ⁴T₁g → ⁴A₂g of octahedral d⁷; Lever,
 * Inorganic Electronic Spectroscopy, 2nd ed., 1984; from memory).
 */
export const TWO_ELECTRON_SHIFT = 1.75;

/**
 * A level whose mean e occupation differs from the ground state's by less than this is
 * intra-configurational: its energy barely depends on Dq, and its band is sharp (²Eg of Cr(III),
 * ¹Eg of Ni(II)).
 */
export const INTRA_CONFIGURATION_SHIFT = 0.5;

/** Two levels closer than this are taken as one degenerate pair, cm⁻¹. */
const DEGENERATE = 1;

/** Mean number of e electrons of a level over its strong-field configurations. */
function meanE(level: CubicLevel): number {
  return level.configurations.reduce((s, c) => s + c.weight * c.e, 0);
}

/** How many electrons the transition from the ground state moves between t₂ and e, on average. */
export function electronShift(result: CubicResult, level: CubicLevel): number {
  return Math.abs(meanE(level) - meanE(result.ground));
}

/** The picture of one solution. */
export interface BandPicture {
  readonly assignments: FitAssignment[];
  readonly predicted: PredictedBand[];
  readonly sharp: SharpMatch[];
}

/** Sharp bands matched greedily to the nearest free spin-forbidden intra-configurational level. */
function matchSharp(
  result: CubicResult,
  sharp: readonly FitBand[],
  offset: number,
  taken: ReadonlySet<CubicLevel>,
): SharpMatch[] {
  const free = new Set(
    result.levels.filter(
      (l) =>
        l !== result.ground &&
        !l.spinAllowed &&
        !taken.has(l) &&
        electronShift(result, l) < INTRA_CONFIGURATION_SHIFT,
    ),
  );
  const out: SharpMatch[] = [];
  for (const [k, b] of sharp.entries()) {
    let best: CubicLevel | undefined;
    for (const l of free)
      if (!best || Math.abs(l.energy - b.energy) < Math.abs(best.energy - b.energy)) best = l;
    if (!best) continue;
    free.delete(best);
    out.push({
      band: offset + k,
      observed: b.energy,
      label: best.label,
      calculated: best.energy,
      difference: b.energy - best.energy,
    });
  }
  return out;
}

/**
 * The picture of a solution: `keys` are the level keys assigned to `bands` (in order),
 * `calculated` their energies; `sharp` bands are matched afterwards and numbered after the
 * fitted ones.
 */
export function bandPicture(
  levels: CubicResult,
  bands: readonly FitBand[],
  keys: readonly string[],
  calculated: readonly number[],
  sharp: readonly FitBand[],
): BandPicture {
  const allKeys = levelKeys(levels);
  const groundS = levels.ground.S;
  const byKey = new Map(levels.levels.map((l, i) => [allKeys[i] ?? '', l]));
  const assignments: FitAssignment[] = bands.map((b, i) => {
    const level = byKey.get(keys[i] ?? '');
    return {
      band: i,
      observed: b.energy,
      sigma: b.sigma ?? null,
      calculated: calculated[i] ?? 0,
      difference: b.energy - (calculated[i] ?? 0),
      label: level?.label ?? '?',
      spinAllowed: level?.S === groundS,
    };
  });
  const assigned = new Map<CubicLevel, number>();
  keys.forEach((k, i) => {
    const level = byKey.get(k);
    if (level) assigned.set(level, i);
  });
  const sharpMatches = matchSharp(levels, sharp, bands.length, new Set(assigned.keys()));
  const bandOf = new Map(assigned);
  for (const m of sharpMatches) {
    const level = levels.levels.find((l) => l.label === m.label);
    if (level) bandOf.set(level, m.band);
  }
  const partner = (l: CubicLevel) => {
    for (const [other, band] of bandOf) if (Math.abs(other.energy - l.energy) < DEGENERATE) return band;
    return null;
  };
  const predicted: PredictedBand[] = levels.levels.slice(1).map((l) => ({
    label: l.label,
    symbol: l.symbol,
    energy: l.energy,
    spinAllowed: l.spinAllowed,
    band: bandOf.get(l) ?? partner(l),
    twoElectron: electronShift(levels, l) >= TWO_ELECTRON_SHIFT,
  }));
  return { assignments, predicted, sharp: sharpMatches };
}
