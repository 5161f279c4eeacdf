/**
 * The fit of band maxima as people and programs read it: the JSON form of a fit and of each
 * solution, the human text with the best solution, its assignments, alternatives and predicted
 * bands, and values written with their standard errors. Shared by the fit and spectrum commands
 * and the report.
 */

import { halfIntegerText } from '../../src/atom/terms.js';
import { BAND_CEILING } from '../../src/core/defaults.js';
import { cmToNm } from '../../src/core/units.js';
import { unicodeIon, unicodeLabel } from '../../src/field/labels.js';
import type { FitResult, FitScore, FitSolution, SpinHypothesis } from '../../src/fit/fitTypes.js';
import type { FitWarningCode } from '../../src/fit/fitWarnings.js';
import { fixed, ionText, listSection, table, unicodeIons } from '../format.js';

/** Whether only Dq was fitted because there is no B (d¹, d⁹). */
function single(s: FitSolution): boolean {
  return s.parameters.length === 1 && !s.bHeld && s.bDetermined;
}

/** JSON form of one solution (the solver's full levels left out); B and C are null where the bands do not fix them. */
export function solutionJson(s: FitSolution) {
  const noB = single(s) || !s.bDetermined;
  return {
    rank: s.rank,
    dq: s.dq,
    tenDq: s.tenDq,
    B: noB ? null : s.B,
    C: noB ? null : s.C,
    bDetermined: s.bDetermined,
    spin: s.spin,
    score: s.score,
    cOverB: s.cOverB,
    cFitted: s.cFitted,
    bHeld: s.bHeld,
    deltaOverB: s.deltaOverB,
    beta: s.beta,
    rms: s.rms,
    weightedRms: s.weightedRms,
    chiSquare: s.chiSquare,
    dof: s.dof,
    converged: s.converged,
    reason: s.reason,
    reasonText: s.reasonText,
    iterations: s.iterations,
    errors: s.errors,
    errorBasis: s.errorBasis,
    errorNote: s.errorNote,
    parameters: s.parameters,
    covariance: s.covariance,
    ground: s.ground,
    assignments: s.assignments.map((a) => ({
      band: a.band,
      observed: a.observed,
      sigma: a.sigma,
      calculated: a.calculated,
      difference: a.difference,
      label: a.label,
      spinAllowed: a.spinAllowed,
    })),
    predicted: s.predicted.map((p) => ({
      label: p.label,
      energy: p.energy,
      wavelength: p.energy > 0 ? cmToNm(p.energy) : null,
      spinAllowed: p.spinAllowed,
      band: p.band,
      twoElectron: p.twoElectron,
    })),
    sharp: s.sharp,
    warnings: s.warnings,
  };
}

/** A value with its standard error, both to two significant digits of the error. */
export function withError(value: number, error: number | null, digits = 0): string {
  if (error === null || !(error > 0)) return fixed(value, digits);
  const d = Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(error))));
  return `${fixed(value, d)} ± ${fixed(error, d)}`;
}

/** Words for the warnings an alternative's one-line summary carries. */
const SUMMARY_FLAGS: Partial<Record<FitWarningCode, string>> = {
  'beta-above-one': 'β above 1: implausible',
  'beta-very-low': 'β far below the free ion: implausible',
  'range-edge': 'Δ/B at the edge of the scan',
  'not-converged': 'not converged',
  'b-not-determined': 'B not fixed by the bands',
};

/** The ranking score in one line: its total and the parts that are not zero. */
export function scoreText(score: FitScore): string {
  const parts = (
    [
      ['residuals', score.residual],
      ['β', score.beta],
      ['two-electron', score.twoElectron],
      ['unobserved bands', score.unobserved],
      ['intensities', score.intensity],
    ] as const
  ).filter(([, v]) => v > 0.005);
  return `${fixed(score.total, 2)}${parts.length > 0 ? ` (${parts.map(([k, v]) => `${k} ${fixed(v, 2)}`).join(', ')})` : ''}`;
}

function solutionSummary(s: FitSolution): string {
  const beta = s.beta === null ? '' : `, β ${fixed(s.beta, 2)}`;
  const assigned = s.assignments
    .map((a) => `${fixed(a.observed)} → ${unicodeLabel(a.label)}${a.spinAllowed ? '' : ' (spin-forbidden)'}`)
    .join(', ');
  const flags = s.warnings.flatMap((w) => SUMMARY_FLAGS[w.code] ?? []);
  return (
    `#${s.rank}  ${unicodeLabel(s.ground)} (S = ${halfIntegerText(s.spin)}), Dq ${fixed(s.dq)}, 10Dq ${fixed(s.tenDq)}` +
    `${single(s) || !s.bDetermined ? '' : `, B ${fixed(s.B)}`}${beta}, rms ${fixed(s.rms)} cm⁻¹, score ${scoreText(s.score)}: ` +
    `${assigned}${flags.length > 0 ? `  [${flags.join('; ')}]` : ''}`
  );
}

/** One ground-spin hypothesis in words. */
function hypothesisText(h: SpinHypothesis): string {
  const what = `${h.kind === 'only' ? '' : `${h.kind}-spin `}S = ${halfIntegerText(h.spin)}`;
  const bands = h.transitions === 'spin-forbidden' ? ', its ΔS = 1 bands (it has no spin-allowed ones)' : '';
  return `${what}${bands}: ${h.bestRank === null ? 'no solution' : `best is #${h.bestRank}`}`;
}

/** The JSON form of a fit result (solutions best first). */
export function fitJson(result: FitResult, ion: string | undefined, cOrigin: string) {
  return {
    ...(ion ? { ion } : {}),
    n: result.n,
    geometry: result.geometry,
    cOverB: result.cOverB,
    cOrigin,
    fitC: result.fitC,
    freeIon: result.freeIon,
    bands: result.bands.map((b) => ({ energy: b.energy, sigma: b.sigma ?? null })),
    merges: result.merges,
    cChoice: result.cChoice,
    hypotheses: result.hypotheses,
    weighting: result.weighting,
    tried: result.tried,
    refined: result.refined,
    omitted: result.omitted,
    solutions: result.solutions.map(solutionJson),
    warnings: result.warnings,
  };
}

/** The human form of a fit result: how it was fitted and under which ground spins, the best solution with its score, alternatives, predictions. */
export function fitText(result: FitResult, ion: string | undefined, cOrigin: string): string {
  const best = result.solutions[0];
  if (!best) throw new Error('fit returned no solution');
  const lines = [
    ...fitHeaderLines(result, best, ion, cOrigin),
    ...bestLines(result, best, ion),
    ...assignmentLines(best),
    ...alternativeLines(result),
    ...predictedLines(best),
  ];
  const warnings = [...best.warnings, ...result.warnings];
  lines.push(
    ...listSection(
      'Warnings and cautions:',
      warnings.map((w) => w.message),
    ),
  );
  lines.push('');
  lines.push('These are model results for an ideal cubic field; the spectrum and other measurements decide.');
  return `${lines.join('\n')}\n`;
}

/** What was fitted and how: the bands, where C/B came from, the weighting and the search. */
function fitHeaderLines(
  result: FitResult,
  best: FitSolution,
  ion: string | undefined,
  cOrigin: string,
): string[] {
  const geometryName = result.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const lines: string[] = [];
  const bandList = result.bands
    .map((b) => `${fixed(b.energy)}${b.sigma === undefined ? '' : `±${fixed(b.sigma)}`}`)
    .join(', ');
  lines.push(
    `Fit of ${ionText(ion, result.n)}, ${geometryName}, to ${result.bands.length} band${result.bands.length === 1 ? '' : 's'}: ${bandList} cm⁻¹`,
  );
  const cLine = single(best)
    ? 'only Dq enters (one d electron or hole)'
    : best.bHeld
      ? `B held at ${fixed(best.B)} cm⁻¹ (given) and C/B at ${fixed(result.cOverB, 2)} (${unicodeIons(cOrigin)}); only Dq fitted`
      : result.fitC && best.cFitted
        ? `C fitted${result.cChoice === 'bands-determine-it' ? ' because the bands fix it' : ''}, starting from C/B ${fixed(result.cOverB, 2)} (${unicodeIons(cOrigin)})`
        : result.fitC
          ? `C asked to be fitted, but no assigned band depends on it: held at C/B ${fixed(result.cOverB, 2)} (${unicodeIons(cOrigin)})`
          : `C/B held at ${fixed(result.cOverB, 2)} (${unicodeIons(cOrigin)})`;
  lines.push(
    `${cLine}; bands weighted ${result.weighting === 'given' ? 'by their given uncertainties' : 'equally (no uncertainties given)'}`,
  );
  lines.push(
    `${result.tried} assignment${result.tried === 1 ? '' : 's'} tried on the Δ/B scan, ${result.refined} starting point${result.refined === 1 ? '' : 's'} refined by least squares, ` +
      `${result.solutions.length} solution${result.solutions.length === 1 ? '' : 's'} shown` +
      `${result.omitted > 0 ? ` (and ${result.omitted} more that fit nearly as well)` : ''}.`,
  );
  lines.push(`Ground spin: ${result.hypotheses.map(hypothesisText).join('; ')}.`);
  return lines;
}

/** The best solution's parameters with their standard errors, rms and convergence. */
function bestLines(result: FitResult, best: FitSolution, ion: string | undefined): string[] {
  const lines: string[] = [];
  lines.push('');
  lines.push(`Best solution${result.solutions.length > 1 ? ` (1 of ${result.solutions.length})` : ''}:`);
  const e = best.errors;
  lines.push(
    `  Dq   = ${withError(best.dq, e.dq, 1)} cm⁻¹   (10Dq = Δ = ${withError(best.tenDq, e.tenDq)} cm⁻¹)`,
  );
  if (!single(best) && !best.bDetermined) {
    lines.push(
      `  B    = not fixed by the band${result.bands.length === 1 ? '' : 's'} (held at ${fixed(best.B)} cm⁻¹ only to place the other levels; no β)`,
    );
  } else if (!single(best)) {
    lines.push(`  B    = ${withError(best.B, e.B)} cm⁻¹${best.bHeld ? '   (held)' : ''}`);
    lines.push(
      best.cFitted
        ? `  C    = ${withError(best.C, e.C)} cm⁻¹   (C/B = ${withError(best.cOverB ?? 0, e.cOverB, 2)})`
        : `  C    = ${fixed(best.C)} cm⁻¹   (held at C/B ${fixed(best.cOverB ?? 0, 2)})`,
    );
    if (best.beta !== null && result.freeIon) {
      lines.push(
        `  β    = ${withError(best.beta, e.beta, 3)}   (B / free-ion B = ${fixed(result.freeIon.B)} cm⁻¹ of ${ion ? unicodeIon(ion) : 'the ion'})`,
      );
      if (result.freeIon.source) lines.push(`         free-ion B: ${result.freeIon.source}`);
    }
    lines.push(`  Δ/B  = ${withError(best.deltaOverB ?? 0, e.deltaOverB, 2)}`);
  }
  lines.push(
    `  rms  = ${fixed(best.rms)} cm⁻¹ (${result.bands.length} band${result.bands.length === 1 ? '' : 's'}, ` +
      `${best.dof} degree${best.dof === 1 ? '' : 's'} of freedom)`,
  );
  lines.push(`  score = ${scoreText(best.score)}; lower ranks first`);
  lines.push(`  errors: ${best.errorNote}`);
  lines.push(
    `  ${best.converged ? 'converged' : 'NOT converged'}: ${best.reasonText} (${best.iterations} iteration${best.iterations === 1 ? '' : 's'})`,
  );
  return lines;
}

/** The table of the best solution's assignments. */
function assignmentLines(best: FitSolution): string[] {
  const lines: string[] = [];
  lines.push('');
  lines.push(
    table(
      ['band', 'observed cm⁻¹', 'nm', 'calculated cm⁻¹', 'obs − calc', 'assigned to', 'spin'],
      [
        ...best.assignments.map((a) => [
          String(a.band + 1),
          a.sigma === null ? fixed(a.observed) : `${fixed(a.observed)}±${fixed(a.sigma)}`,
          fixed(cmToNm(a.observed), 1),
          fixed(a.calculated),
          fixed(Math.abs(a.difference) < 0.5 ? 0 : a.difference),
          unicodeLabel(a.label),
          a.spinAllowed ? 'allowed' : 'forbidden',
        ]),
        ...best.sharp.map((m) => [
          String(m.band + 1),
          fixed(m.observed),
          fixed(cmToNm(m.observed), 1),
          fixed(m.calculated),
          fixed(m.difference),
          unicodeLabel(m.label),
          'sharp: matched, not fitted',
        ]),
      ],
    ),
  );
  return lines;
}

/** The other solutions that fit nearly as well. */
function alternativeLines(result: FitResult): string[] {
  const lines: string[] = [];
  lines.push('');
  const alternatives = result.solutions.slice(1);
  if (alternatives.length === 0) {
    lines.push(
      result.tried === 1
        ? 'Alternatives: none (this was the only assignment to try).'
        : 'Alternatives: none fits nearly as well.',
    );
  } else {
    lines.push('Alternatives that fit nearly as well:');
    for (const s of alternatives) lines.push(`  ${solutionSummary(s)}`);
    if (result.omitted > 0) lines.push(`  … and ${result.omitted} more that fit nearly as well (not shown)`);
  }
  return lines;
}

/** The best solution's predicted bands up to {@link BAND_CEILING}. */
function predictedLines(best: FitSolution): string[] {
  const lines: string[] = [];
  lines.push('');
  const shown = best.predicted.filter((p) => p.energy <= BAND_CEILING);
  lines.push(
    `Predicted bands of the best solution (from the ground state ${unicodeLabel(best.ground)}, up to ${BAND_CEILING} cm⁻¹):`,
  );
  lines.push(
    table(
      ['level', 'cm⁻¹', 'nm', 'spin', 'observed'],
      shown.map((p) => [
        unicodeLabel(p.label),
        fixed(p.energy),
        fixed(cmToNm(p.energy), 1),
        p.spinAllowed ? 'allowed' : 'forbidden',
        p.band === null ? '' : `band ${p.band + 1}`,
      ]),
    ),
  );
  return lines;
}
