/**
 * Text and JSON of spin–orbit results for the commands: double-group levels with parentage,
 * free-ion J levels, the magnetism table, and a band fit refined with ζ held or fitted.
 */
import type { MomentPoint } from '../../src/analysis/susceptibility.js';
import type { FreeIonLevel } from '../../src/atom/jLevels.js';
import { cmToNm } from '../../src/core/units.js';
import { DOUBLE_GROUP_NOTATION } from '../../src/field/doubleGroup.js';
import { unicodeLabel, unicodeTerm } from '../../src/field/labels.js';
import type { ParentWeight, SpinOrbitResult } from '../../src/field/spinOrbitSolver.js';
import type { SpinOrbitRefinement } from '../../src/fit/spinOrbitRefinement.js';
import type { ZetaFit } from '../../src/fit/zetaFit.js';
import { fixed, listSection, table } from '../format.js';

/** Parents shown per level in text; JSON has them all. */
export const PARENTS_SHOWN = 3;

/** A parent state in Unicode: a cubic level (`⁴T₁g(F)`), a free-ion term (`⁴F`) or several joined by `/`. */
function parentName(state: string): string {
  return state
    .split('/')
    .map((s) => {
      const cubic = unicodeLabel(s);
      return cubic === s ? unicodeTerm(s) : cubic;
    })
    .join('/');
}

/** `72 % ⁴T₁g(F) + 20 % ⁴T₂g`: the largest parents of a level, in per cent. */
export function parentageText(parentage: readonly ParentWeight[], shown = PARENTS_SHOWN): string {
  const parts = parentage
    .slice(0, shown)
    .filter((p) => p.weight >= 0.005)
    .map((p) => `${fixed(100 * p.weight)} % ${parentName(p.state)}`);
  return parts.join(' + ');
}

/** The table of double-group levels, with the notation named. */
export function spinOrbitText(result: SpinOrbitResult): string {
  const rows = result.levels.map((l) => [
    l.irrep,
    fixed(l.energy, 0),
    l.energy > 0 ? fixed(cmToNm(l.energy), 1) : '—',
    String(l.degeneracy),
    parentageText(l.parentage),
  ]);
  return [
    `With spin–orbit coupling, ζ = ${fixed(result.zeta)} cm⁻¹: ${result.levels.length} levels, ground ${result.ground.irrep} ` +
      `(${parentageText(result.ground.parentage, 1)})`,
    `Labels in ${DOUBLE_GROUP_NOTATION}.`,
    table(['level', 'cm⁻¹', 'nm', 'degeneracy', 'parentage'], rows),
  ].join('\n');
}

/** The JSON of a spin–orbit result. */
export function spinOrbitJson(result: SpinOrbitResult) {
  return {
    zeta: result.zeta,
    notation: DOUBLE_GROUP_NOTATION,
    ground: result.ground.label,
    levels: result.levels.map((l) => ({
      label: l.label,
      irrep: l.irrep,
      energy: l.energy,
      degeneracy: l.degeneracy,
      parent: l.parent,
      parentage: l.parentage,
    })),
  };
}

/** The table of free-ion J levels. */
export function jLevelsText(levels: readonly FreeIonLevel[], zeta: number): string {
  const rows = levels.map((l) => [
    unicodeTerm(l.label),
    fixed(l.energy, 0),
    String(l.degeneracy),
    parentageText(l.parentage),
  ]);
  return [
    `Free-ion levels with spin–orbit coupling, ζ = ${fixed(zeta)} cm⁻¹ (intermediate coupling; each labelled by its largest term):`,
    table(['level', 'cm⁻¹', '2J+1', 'parentage'], rows),
  ].join('\n');
}

/** The magnetism table: T, χ, χT, μ_eff and the spin-only moment beside it. */
export function momentsText(points: readonly MomentPoint[], spinOnly: number | null): string {
  const rows = points.map((p) => [
    fixed(p.T, 1),
    p.chi.toExponential(4),
    fixed(p.chiT, 4),
    fixed(p.muEff, 3),
    spinOnly === null ? '—' : fixed(spinOnly, 3),
  ]);
  return table(['T / K', 'χ / cm³ mol⁻¹', 'χT / cm³ K mol⁻¹', 'μ_eff / μ_B', 'spin-only / μ_B'], rows);
}

/** `1234 ± 12`, or the bare value without an error. */
function valueWithError(x: number, error: number | null | undefined): string {
  return error === null || error === undefined ? fixed(x) : `${fixed(x)} ± ${fixed(error)}`;
}

/** A band's level: the cubic level, or the spin–orbit level of a resolved component with its parentage. */
function bandLevelText(r: SpinOrbitRefinement, band: SpinOrbitRefinement['bands'][number]): string {
  const cubic = band.level.startsWith('Γ') ? band.level : unicodeLabel(band.level);
  const component = band.components?.[0];
  if (component === undefined) return `${cubic} (centroid)`;
  const level = r.levels.levels.find((l) => l.label === component);
  return `${component}, ${level ? parentageText(level.parentage, 2) : cubic}`;
}

/** The fit refined with spin–orbit coupling, as text: ζ held or fitted, each band's level, the warnings. */
export function zetaFitText(z: ZetaFit): string {
  const r = z.refinement;
  const e = r.errors;
  const ratio = z.zetaRatio === null ? '' : `, ${fixed(z.zetaRatio, 2)} × the free ion`;
  const how = z.zetaFitted
    ? `fitted${ratio}; band centroids on their cubic level, resolved components on one spin–orbit level each`
    : `held${z.zetaAsked ? ' (not determined by these bands)' : ''}; each band at the centroid of its level’s spin–orbit components`;
  const rows = r.bands.map((b) => [
    bandLevelText(r, b),
    fixed(b.observed),
    fixed(b.calculated),
    fixed(b.observed - b.calculated),
  ]);
  const lines = [
    `With spin–orbit coupling (ζ = ${valueWithError(r.zeta, e?.zeta)} cm⁻¹, ${how}):`,
    `  Dq = ${valueWithError(r.dq, e?.dq)} cm⁻¹ (10Dq = ${fixed(10 * r.dq)}), B = ${valueWithError(r.B, e?.B)} cm⁻¹, ` +
      `C = ${valueWithError(r.C, e?.C)} cm⁻¹, rms ${fixed(r.rms, 1)} cm⁻¹${r.converged ? '' : ` (not converged: ${r.reason})`}`,
    table(['band → level (parentage)', 'observed', 'calculated', 'obs − calc'], rows),
  ];
  if (z.zetaFitted) lines.push(`Spin–orbit labels in ${DOUBLE_GROUP_NOTATION}.`);
  lines.push(...listSection('Spin–orbit warnings:', z.warnings));
  return `${lines.join('\n')}\n`;
}

/** The fit refined with spin–orbit coupling, as JSON. */
export function zetaFitJson(z: ZetaFit) {
  const r = z.refinement;
  return {
    zeta: r.zeta,
    fitZeta: z.zetaAsked,
    zetaFitted: z.zetaFitted,
    zetaOverFreeIon: z.zetaRatio,
    dq: r.dq,
    tenDq: 10 * r.dq,
    B: r.B,
    C: r.C,
    errors: r.errors,
    rms: r.rms,
    converged: r.converged,
    reason: r.reason,
    bands: r.bands.map((b) => {
      const component = b.components?.[0];
      const level = component === undefined ? undefined : r.levels.levels.find((l) => l.label === component);
      return { ...b, ...(level ? { parentage: level.parentage } : {}) };
    }),
    warnings: z.warnings,
    notation: DOUBLE_GROUP_NOTATION,
    levels: spinOrbitJson(r.levels).levels,
  };
}
