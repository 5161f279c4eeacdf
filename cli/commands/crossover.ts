/**
 * `termsplit crossover`: checks the configuration or ion, B, C and the sample (its Dq, or its
 * bands to fit) into one resolved input, asks the library for the crossover analysis, the
 * sample's verdict, the one-electron picture and spin-only moments, prints them as text or JSON
 * and draws the ground-state map if asked.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { type FigureFormat, formatOfPath } from '../../charts/figureFormat.js';
import {
  type Crossover,
  type CrossoverAnalysis,
  type CrossoverCaution,
  crossoverAnalysis,
  crossoverCautions,
  NEAR_CROSSOVER_PERCENT,
  type SampleVerdict,
  SETTLED_SIGMAS,
  sampleVerdict,
  TETRAHEDRAL_DELTA_CEILING,
} from '../../src/analysis/crossover.js';
import type { fittedSample as placeByFit } from '../../src/analysis/fittedSample.js';
import { GROUND_MAP_DEFAULTS, groundStateMap } from '../../src/analysis/groundMap.js';
import {
  impliedPairingEnergy,
  type OneElectronState,
  type OneElectronStates,
  oneElectronStates,
  pairingCoefficients,
  pairingEnergy,
} from '../../src/analysis/lfse.js';
import { type MomentEstimate, momentEstimate } from '../../src/analysis/magnetism.js';
import { hasSpinChoice } from '../../src/analysis/spinChoice.js';
import { susceptibility } from '../../src/analysis/susceptibility.js';
import { halfIntegerText } from '../../src/atom/terms.js';
import { DEFAULT_C_OVER_B, NOMINAL_B } from '../../src/core/defaults.js';
import { InputError } from '../../src/core/errors.js';
import type { Geometry } from '../../src/core/geometry.js';
import type { FreeIon } from '../../src/core/ions.js';
import { COMPLEX_B_LIMIT, DQ_LIMIT, positive } from '../../src/core/limits.js';
import { parseEnergyList } from '../../src/core/units.js';
import { solveCubic } from '../../src/field/cubic.js';
import { unicodeConfiguration, unicodeLabel } from '../../src/field/labels.js';
import { solveSpinOrbit } from '../../src/field/spinOrbitSolver.js';
import type { FitSolution } from '../../src/fit/fitTypes.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { checkOutputDirectory, writeFileAtomic } from '../files.js';
import { fixed, ionText, jsonText, table, unicodeIons } from '../format.js';
import { type Io, progress } from '../io.js';
import {
  cbHelp,
  checkSampleRatio,
  configOrIon,
  GEOMETRY_OPTION,
  geometryOption,
  numberWithSigma,
  ratioChoice,
} from '../options.js';
import { crossingsJson, verdictJson } from '../present/crossoverPresent.js';
import { solutionJson } from '../present/fitPresent.js';
import { ZETA_FACTOR_HELP, zetaOption } from '../zetaOption.js';

/** Options of `termsplit crossover`. */
export interface CrossoverCommandOptions {
  ion?: string;
  B?: string;
  C?: string;
  cb?: string;
  geometry?: string;
  dq?: string;
  bands?: string;
  output?: string;
  zeta?: string;
  zetaFactor?: string;
  json?: boolean;
}

/** `termsplit crossover`: the high-spin/low-spin crossover, the sample's side, LFSE, spin-only moments, map. */
export function registerCrossover(program: Command, io: Io): void {
  program
    .command('crossover')
    .description(COMMAND_SUMMARIES.crossover.description)
    .argument('[config]', 'd-electron configuration such as d6 (optional with --ion)')
    .option('--ion <name>', 'the metal ion, e.g. Co3+ (gives n, and B and C/B when not given)')
    .option('--B <cm-1>', 'Racah B of the complex, cm⁻¹, optionally ±σ (default: the free-ion B of --ion)')
    .option('--C <cm-1>', 'Racah C of the complex, cm⁻¹')
    .option('--cb <ratio>', cbHelp('C/B instead of --C'))
    .option(...GEOMETRY_OPTION)
    .option('--dq <cm-1>', "the sample's Dq, optionally ±σ (e.g. 2300±60), for its side of the crossover")
    .option(
      '--bands <list>',
      "the sample's band maxima instead of --dq and --B: Dq, B (and their errors) come from a band fit",
    )
    .option('-o, --output <file>', 'write the ground-state map to a .png, .svg or .pdf file')
    .option('--zeta <cm-1|ion>', 'also μ_eff with spin–orbit coupling beside spin-only (cm⁻¹, or "ion")')
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option('--json', 'print one JSON object on stdout')
    .action(async (configText: string | undefined, opts: CrossoverCommandOptions) => {
      io.out(await crossoverCommand(configText, opts, io));
    });
}

interface Resolved {
  readonly n: number;
  readonly ion?: FreeIon;
  readonly geometry: Geometry;
  readonly B: number;
  readonly sigmaB?: number;
  readonly bOrigin: string;
  readonly cOrigin: string;
  readonly C: number;
}

/** A sample placed by a band fit: its Dq ± σ, the correlation of Dq and B, and the fit itself. */
interface FittedSample {
  readonly input: Resolved;
  readonly dq: { value: number; sigma?: number };
  readonly correlation?: number;
  readonly solution: FitSolution;
  /** Other assignments that fit nearly as well. */
  readonly alternatives: number;
}

/**
 * Fits the bands at the resolved C/B (library {@link placeByFit}) and puts the best solution's
 * B, C and Dq with their errors in place of given ones, noting where they came from.
 */
async function fittedSample(input: Resolved, bandsText: string): Promise<FittedSample> {
  // The band fit (and ml-matrix with it) loads only when --bands asks for it.
  const { fittedSample: placeByFit } = await import('../../src/analysis/fittedSample.js');
  const bands = parseEnergyList(bandsText).map((b) =>
    b.sigma === undefined ? { energy: b.value } : { energy: b.value, sigma: b.sigma },
  );
  let placed: ReturnType<typeof placeByFit>;
  try {
    placed = placeByFit({
      n: input.n,
      geometry: input.geometry,
      bands,
      ...(input.ion ? { ion: input.ion } : {}),
      cOverB: input.B > 0 ? input.C / input.B : DEFAULT_C_OVER_B,
    });
  } catch (e) {
    if (e instanceof InputError) throw new InputError(`--bands "${bandsText}": ${e.message}`);
    throw e;
  }
  const best = placed.solution;
  const assignment = best.assignments.map((a) => unicodeLabel(a.label)).join(', ');
  return {
    input: {
      ...input,
      B: placed.B,
      C: placed.C,
      ...(placed.sigmaB !== undefined ? { sigmaB: placed.sigmaB } : {}),
      bOrigin: `fitted to the bands as ${assignment}, rms ${fixed(best.rms)} cm⁻¹`,
      cOrigin: `held at ${fixed(best.C / best.B, 2)} in the fit`,
    },
    dq: placed.dq,
    ...(placed.correlation !== undefined ? { correlation: placed.correlation } : {}),
    solution: best,
    alternatives: placed.alternatives,
  };
}

function resolveInput(configText: string | undefined, opts: CrossoverCommandOptions): Resolved {
  const { n, ion } = configOrIon(configText, opts.ion);
  const geometry = geometryOption(opts.geometry);
  const single = n === 1 || n === 9;
  const givenB = numberWithSigma('--B', opts.B, COMPLEX_B_LIMIT);
  let B: number;
  let bOrigin: string;
  if (givenB) {
    B = givenB.value;
    bOrigin = 'given';
  } else if (ion?.B !== undefined) {
    B = ion.B;
    bOrigin = `free-ion B of ${ion.ion}; --B not given`;
  } else if (single) {
    B = 0;
    bOrigin = 'not used (one d electron or hole)';
  } else if (!hasSpinChoice(n, geometry)) {
    // No crossover exists whatever B is; a nominal B only serves the one-electron picture.
    B = NOMINAL_B;
    bOrigin = `not needed: d${n} ${geometry === 'oct' ? 'octahedral' : 'tetrahedral'} has no choice of spin; ${NOMINAL_B} cm⁻¹ used for the levels`;
  } else {
    throw new InputError(
      `d${n}: give --B (Racah B of the complex, cm⁻¹)${ion ? '' : ' or --ion to use its free-ion B'}`,
    );
  }
  if (single) {
    return {
      n,
      geometry,
      B,
      C: 0,
      bOrigin,
      cOrigin: 'not used (one d electron or hole)',
      ...(ion ? { ion } : {}),
    };
  }
  const ratio = ratioChoice(B, opts.C, opts.cb, ion);
  return {
    n,
    geometry,
    B,
    C: ratio.cOverB * B,
    bOrigin,
    cOrigin: ratio.origin,
    ...(givenB?.sigma !== undefined ? { sigmaB: givenB.sigma } : {}),
    ...(ion ? { ion } : {}),
  };
}

/** The C/B and Δ/B extent of the map: the default range, widened to hold the sample and crossovers. */
function mapRange(analysis: CrossoverAnalysis, verdict: SampleVerdict | undefined) {
  const d = GROUND_MAP_DEFAULTS;
  const k = analysis.cOverB;
  const minCOverB = Number.isFinite(k) ? Math.min(d.minCOverB, Math.floor(2 * (k - 0.5)) / 2) : d.minCOverB;
  const maxCOverB = Number.isFinite(k) ? Math.max(d.maxCOverB, Math.ceil(2 * (k + 0.5)) / 2) : d.maxCOverB;
  const reach = [
    ...analysis.crossings.map((c) => 1.3 * c.deltaOverB),
    verdict && Number.isFinite(verdict.deltaOverB) ? 1.15 * verdict.deltaOverB : 0,
  ];
  const maxDeltaOverB = Math.max(d.maxDeltaOverB, Math.ceil(Math.max(...reach) / 10) * 10);
  // Rows every 0.25 in C/B, as in the default range.
  const rows = Math.round((maxCOverB - minCOverB) / 0.25) + 1;
  return { minCOverB, maxCOverB, maxDeltaOverB, rows };
}

function spinName(s: OneElectronState['spin']): string {
  return s === 'high-spin' ? 'high spin' : 'low spin';
}

/** The Π term of an LFSE, e.g. ` + 2Π`, or nothing for the high-spin arrangement. */
function pairsText(s: OneElectronState): string {
  return s.extraPairs === 0 ? '' : ` + ${s.extraPairs === 1 ? '' : s.extraPairs}Π`;
}

/** The LFSE in units of Dq, e.g. `−24Dq + 2Π`. */
function lfseText(s: OneElectronState): string {
  return `${s.lfseDq < 0 ? '−' : ''}${Math.abs(s.lfseDq)}Dq${pairsText(s)}`;
}

/** The LFSE in cm⁻¹ at `dq`, with its Π term left symbolic. */
function lfseAt(s: OneElectronState, dq: number | undefined): string {
  return dq === undefined ? '—' : `${fixed(s.lfseDq * dq)}${pairsText(s)}`;
}

/** A number with its sign always shown (ASCII, so values copy into other programs). */
function signed(x: number, digits = 0): string {
  const t = fixed(Math.abs(x), digits);
  return x < 0 ? `-${t}` : `+${t}`;
}

/** The states whose moments the output lists: both sides of each crossover, or the one ground state. */
function momentStates(analysis: CrossoverAnalysis, verdict: SampleVerdict | undefined): MomentEstimate[] {
  const { n, geometry, B, C } = analysis;
  const labels = new Set<string>();
  const out: MomentEstimate[] = [];
  const add = (dq: number, label?: string) => {
    const r = solveCubic({ n, geometry, dq, B, C });
    const level = label ? r.levels.find((l) => l.label === label) : r.ground;
    if (level && !labels.has(level.symbol)) {
      labels.add(level.symbol);
      out.push(momentEstimate({ ...level, label: level.symbol }, n));
    }
  };
  for (const c of analysis.crossings) {
    add(c.dq, c.from);
    add(c.dq, c.to);
  }
  // Without a crossover the ground spin is the same at every Dq; Δ/B = 10 stands for any.
  if (analysis.crossings.length === 0) add(verdict?.dq ?? (B > 0 ? B : NOMINAL_B));
  return out;
}

/** Temperatures of the spin–orbit moments beside spin-only, K. */
export const MOMENT_TEMPERATURES = [300, 80, 2] as const;

/** A Dq either side of a crossover at which its states' moments are shown, as a fraction of Dq_c. */
export const CROSSOVER_SIDE = 0.1;

/** μ_eff with spin–orbit coupling at chosen Dq values. */
interface SpinOrbitMoments {
  readonly zeta: number;
  readonly temperatures: readonly number[];
  readonly points: readonly {
    readonly where: string;
    readonly dq: number;
    readonly ground: string;
    readonly parent: string;
    readonly muEff: readonly number[];
  }[];
}

/** With --zeta: μ_eff at the sample's Dq, else a little either side of each crossover, else at one Dq. */
function spinOrbitMomentsOf(
  opts: CrossoverCommandOptions,
  ion: FreeIon | undefined,
  analysis: CrossoverAnalysis,
  verdict: SampleVerdict | undefined,
): { spinOrbitMoments?: SpinOrbitMoments } {
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, ion);
  if (zeta === undefined) return {};
  const { n, geometry, B, C } = analysis;
  const places: { where: string; dq: number }[] = verdict
    ? [{ where: 'sample', dq: verdict.dq }]
    : analysis.crossings.length > 0
      ? analysis.crossings.flatMap((c) => [
          {
            where: `below the crossover (${fixed(100 * CROSSOVER_SIDE)} %)`,
            dq: c.dq * (1 - CROSSOVER_SIDE),
          },
          {
            where: `above the crossover (${fixed(100 * CROSSOVER_SIDE)} %)`,
            dq: c.dq * (1 + CROSSOVER_SIDE),
          },
        ])
      : [{ where: 'Δ/B = 10', dq: B > 0 ? B : NOMINAL_B }];
  const temperatures = [...MOMENT_TEMPERATURES];
  const points = places.map(({ where, dq }) => {
    const ground = solveSpinOrbit({ n, geometry, dq, B, C, zeta }).ground;
    const moments = susceptibility({ n, geometry, dq, B, C, zeta, temperatures });
    return { where, dq, ground: ground.label, parent: ground.parent, muEff: moments.map((m) => m.muEff) };
  });
  return { spinOrbitMoments: { zeta, temperatures, points } };
}

/** Everything the command reports, computed before anything is printed. */
interface Report {
  readonly input: Resolved;
  /** The band fit that placed the sample, when --bands was given. */
  readonly fit?: { readonly solution: FitSolution; readonly alternatives: number };
  readonly sampleSigmaDq?: number;
  readonly analysis: CrossoverAnalysis;
  readonly verdict?: SampleVerdict;
  readonly states: OneElectronStates;
  /** The crossover from the high-spin to the low-spin arrangement of the one-electron picture. */
  readonly hsToLs?: Crossover;
  readonly implied?: number;
  readonly classroom?: number;
  readonly coefficients?: { readonly B: number; readonly C: number };
  readonly moments: readonly MomentEstimate[];
  /** μ_eff with spin–orbit coupling, when --zeta is given. */
  readonly spinOrbitMoments?: SpinOrbitMoments;
  readonly cautions: readonly CrossoverCaution[];
  /** The output path as given, when the map was written. */
  readonly map?: string;
}

/** Builds the command's output (text or JSON) and writes the map if asked; errors leave stdout empty. */
export async function crossoverCommand(
  configText: string | undefined,
  opts: CrossoverCommandOptions,
  io: Io,
): Promise<string> {
  if (opts.bands !== undefined && (opts.dq !== undefined || opts.B !== undefined || opts.C !== undefined)) {
    throw new InputError(
      '--bands places the sample by a fit: leave out --dq, --B and --C (--cb sets the C/B it holds)',
    );
  }
  if (opts.dq !== undefined && opts.B === undefined) {
    throw new InputError(
      '--dq needs --B of the same complex: the crossover Dq scales with B, so the free-ion B would misplace the sample; give --B, or --bands to fit both',
    );
  }
  const given = resolveInput(configText, opts);
  const format: FigureFormat | undefined = opts.output === undefined ? undefined : formatOfPath(opts.output);
  if (opts.output !== undefined) checkOutputDirectory(resolve(io.cwd, opts.output));
  const fitted = opts.bands === undefined ? undefined : await fittedSample(given, opts.bands);
  const input = fitted?.input ?? given;
  const sampleDq = fitted?.dq ?? numberWithSigma('--dq', opts.dq, positive(DQ_LIMIT));
  const { n, geometry, B, C } = input;
  if (sampleDq && B > 0) checkSampleRatio(opts.dq ?? fixed(sampleDq.value), sampleDq.value, B);
  const analysis = crossoverAnalysis({ n, geometry, B, C });
  const verdict = sampleDq
    ? sampleVerdict(analysis, {
        dq: sampleDq.value,
        ...(sampleDq.sigma !== undefined ? { sigmaDq: sampleDq.sigma } : {}),
        ...(input.sigmaB !== undefined ? { sigmaB: input.sigmaB } : {}),
        ...(fitted?.correlation !== undefined ? { correlation: fitted.correlation } : {}),
      })
    : undefined;
  const states = oneElectronStates(n, geometry);
  const hsToLs = analysis.crossings.find((c) => c.fromS === states.highSpin.S && c.toS === states.lowSpin?.S);
  const implied = hsToLs ? impliedPairingEnergy(states, hsToLs.dq) : undefined;
  const classroom = B > 0 ? pairingEnergy(n, geometry, B, C) : undefined;
  const coefficients = pairingCoefficients(n, geometry);
  if (opts.output !== undefined && format) {
    writeFileAtomic(resolve(io.cwd, opts.output), await mapBytes(analysis, verdict, format, io));
  }
  const report: Report = {
    input,
    ...(fitted ? { fit: { solution: fitted.solution, alternatives: fitted.alternatives } } : {}),
    ...(sampleDq?.sigma !== undefined ? { sampleSigmaDq: sampleDq.sigma } : {}),
    analysis,
    ...(verdict ? { verdict } : {}),
    states,
    ...(hsToLs ? { hsToLs } : {}),
    ...(implied !== undefined ? { implied } : {}),
    ...(classroom !== undefined ? { classroom } : {}),
    ...(coefficients ? { coefficients } : {}),
    moments: momentStates(analysis, verdict),
    ...spinOrbitMomentsOf(opts, input.ion, analysis, verdict),
    cautions: crossoverCautions(analysis),
    ...(opts.output !== undefined ? { map: opts.output } : {}),
  };
  return opts.json ? jsonText(reportJson(report)) : reportText(report);
}

/** The ground-state map of the analysis with the sample marked, as file bytes. */
async function mapBytes(
  analysis: CrossoverAnalysis,
  verdict: SampleVerdict | undefined,
  format: FigureFormat,
  io: Io,
): Promise<Buffer> {
  const { n, geometry, B } = analysis;
  const bar = progress(io, 'ground-state map');
  const map = groundStateMap(n, {
    geometry,
    ...mapRange(analysis, verdict),
    onRow: (done, total) => bar.update(done, total),
  });
  bar.end();
  const sigmaDeltaOverB = verdict?.sigmaDeltaOverB;
  const { renderGroundMap } = await import('../../charts/groundMap.js');
  return renderGroundMap(
    map,
    { format },
    {
      ...(B > 0 ? { cOverB: analysis.cOverB } : {}),
      ...(analysis.outOfReach
        ? {
            limit: {
              deltaOverB: TETRAHEDRAL_DELTA_CEILING / B,
              label: `usual upper limit of Δt, ${TETRAHEDRAL_DELTA_CEILING} cm⁻¹ (B = ${fixed(B)})`,
            },
          }
        : {}),
      ...(verdict && B > 0
        ? {
            sample: {
              deltaOverB: verdict.deltaOverB,
              cOverB: analysis.cOverB,
              ...(sigmaDeltaOverB ? { sigmaDeltaOverB } : {}),
            },
          }
        : {}),
    },
  );
}

function reportJson(r: Report) {
  const { input, analysis, verdict, states } = r;
  return {
    ...(input.ion ? { ion: input.ion.ion } : {}),
    n: input.n,
    geometry: input.geometry,
    B: input.B,
    bOrigin: input.bOrigin,
    C: input.C,
    cOverB: input.B > 0 ? input.C / input.B : null,
    cOrigin: input.cOrigin,
    ...(r.fit ? { fit: { ...solutionJson(r.fit.solution), alternatives: r.fit.alternatives } } : {}),
    statement: analysis.statement,
    weakFieldS: analysis.weakFieldS,
    crossings: crossingsJson(analysis),
    outOfReach: analysis.outOfReach ?? null,
    sample: verdict
      ? { ...verdictJson(verdict), sigmaDq: r.sampleSigmaDq ?? null, sigmaB: input.sigmaB ?? null }
      : null,
    oneElectron: {
      highSpin: states.highSpin,
      lowSpin: states.lowSpin ?? null,
      pairingFormula: r.coefficients ?? null,
      pairingEstimate: r.classroom ?? null,
      impliedPairing: r.implied ?? null,
    },
    magnetism: r.moments,
    ...(r.spinOrbitMoments ? { magnetismSpinOrbit: r.spinOrbitMoments } : {}),
    map: r.map ?? null,
    cautions: r.cautions.map((c) => c.message),
  };
}

/** Indents every line of a block by two spaces. */
function indent(block: string): string {
  return block
    .split('\n')
    .map((l) => `  ${l}`)
    .join('\n');
}

function headerLines(r: Report): string[] {
  const { input, analysis } = r;
  const { n, ion, B, C } = input;
  const where = input.geometry === 'oct' ? 'octahedral' : 'tetrahedral';
  const sigmaB = input.sigmaB !== undefined ? ` ± ${fixed(input.sigmaB)}` : '';
  const lines = [
    `${ionText(ion?.ion, n)}, ${where}` +
      (n === 1 || n === 9
        ? ''
        : `: B = ${fixed(B)}${sigmaB} cm⁻¹ (${unicodeIons(input.bOrigin)}), C = ${fixed(C)} cm⁻¹ ` +
          `(C/B = ${fixed(C / B, 2)}, ${unicodeIons(input.cOrigin)})`),
  ];
  if (input.bOrigin.startsWith('free-ion') && analysis.crossings.length > 0) {
    lines.push(
      '  Note: B is the free-ion value. B of a complex is smaller (β = B/B₀ < 1), so the crossover Dq and 10Dq in cm⁻¹ ' +
        'below are too high by 1/β; Δc/B depends only on C/B and holds for any B. Give --B for the complex.',
    );
  }
  return lines;
}

function crossingLines(analysis: CrossoverAnalysis): string[] {
  const lines = ['Spin-state crossover (full dⁿ calculation, exact root):', `  ${analysis.statement}`];
  const first = analysis.crossings[0];
  if (first) {
    const rows = analysis.crossings.map((c) => [
      `${unicodeLabel(c.from)} (S = ${halfIntegerText(c.fromS)})`,
      `${unicodeLabel(c.to)} (S = ${halfIntegerText(c.toS)})`,
      fixed(c.dq),
      fixed(c.tenDq),
      fixed(c.deltaOverB, 2),
    ]);
    lines.push(indent(table(['from', 'to', 'Dq / cm⁻¹', '10Dq / cm⁻¹', 'Δ/B'], rows)));
    lines.push(
      '  Δc/B depends only on C/B: the crossover Dq scales linearly with B ' +
        `(Dq_c = ${fixed(first.deltaOverB / 10, 3)} × B here).`,
    );
  }
  if (analysis.outOfReach) lines.push(`  Out of reach: ${analysis.outOfReach}.`);
  return lines;
}

function sampleLines(r: Report, verdict: SampleVerdict): string[] {
  const spread = r.sampleSigmaDq !== undefined ? ` ± ${fixed(r.sampleSigmaDq)}` : '';
  const ratio = Number.isFinite(verdict.deltaOverB) ? `, Δ/B = ${fixed(verdict.deltaOverB, 2)}` : '';
  const lines = [
    `Sample${r.fit ? ' (from the band fit)' : ''}: Dq = ${fixed(verdict.dq)}${spread} cm⁻¹ (10Dq = ${fixed(verdict.tenDq)}${ratio}): ground state ` +
      `${unicodeLabel(verdict.ground)} (S = ${halfIntegerText(verdict.S)})`,
  ];
  if (r.fit && r.fit.alternatives > 0) {
    lines.push(
      `  caution: ${r.fit.alternatives} other assignment${r.fit.alternatives > 1 ? 's' : ''} of the bands fit nearly as well ` +
        '(see termsplit fit); they may put the sample elsewhere',
    );
  }
  const { margin: m, crossing, sigma: s } = verdict;
  if (!m || !crossing) {
    lines.push('  no crossover for this dⁿ: the spin state does not depend on Δ');
    return lines;
  }
  lines.push(
    `  ${verdict.side} side: ${signed(m.dq)} cm⁻¹ in Dq from the crossover (${signed(m.tenDq)} cm⁻¹ in 10Dq, ` +
      `${signed(m.percent, 1)} % of Δc = ${fixed(crossing.tenDq)} cm⁻¹)`,
  );
  if (s) {
    lines.push(
      `  uncertainty of the margin: ± ${fixed(s.dq)} cm⁻¹ in Dq (± ${fixed(s.tenDq)} in 10Dq, ± ${fixed(s.percent, 1)} %), ` +
        `i.e. ${fixed(verdict.sigmas ?? 0, 1)} σ from the crossover: ` +
        (verdict.settled
          ? 'the side is settled by these parameters'
          : `within ${SETTLED_SIGMAS}σ — these parameters do not settle the side`),
    );
  }
  if (verdict.other !== undefined && verdict.gap !== undefined) {
    lines.push(
      `  the lowest state of the other spin, ${unicodeLabel(verdict.other)}, lies ${fixed(verdict.gap)} cm⁻¹ above the ground state`,
    );
  }
  if (verdict.near) {
    lines.push(
      `  close to the crossover (within ${NEAR_CROSSOVER_PERCENT} % of Δc, rule of thumb): ` +
        'a spin-crossover candidate at most — see the cautions',
    );
  }
  return lines;
}

function oneElectronLines(r: Report): string[] {
  const { states, verdict, hsToLs, implied, classroom, coefficients } = r;
  const { B, geometry, n } = r.input;
  const ls = states.lowSpin;
  const lines = [`One-electron picture${ls ? ' (the classroom rule: low spin when Δ > Π)' : ''}:`];
  const rows = [states.highSpin, ...(ls ? [ls] : [])].map((s) => [
    ls ? spinName(s.spin) : 'only arrangement',
    unicodeConfiguration(s.configuration),
    lfseText(s),
    lfseAt(s, verdict?.dq ?? hsToLs?.dq),
    String(s.unpaired),
    halfIntegerText(s.S),
  ]);
  const lfseHeader = verdict ? 'LFSE at sample / cm⁻¹' : hsToLs ? 'LFSE at Dq_c / cm⁻¹' : 'LFSE / cm⁻¹';
  lines.push(indent(table(['state', 'configuration', 'LFSE', lfseHeader, 'unpaired', 'S'], rows)));
  lines.push(
    `  LFSE: ${geometry === 'oct' ? 't₂g −4Dq, eg +6Dq' : 'e −6Dq, t₂ +4Dq (Dq of the tetrahedron)'}; ` +
      'Π counts the pairs beyond the high-spin arrangement.',
  );
  if (!ls) {
    lines.push(
      `  ${ionText(undefined, n)} ${geometry === 'oct' ? 'octahedral' : 'tetrahedral'}: one arrangement only, no choice of spin.`,
    );
    return lines;
  }
  if (implied !== undefined) {
    lines.push(
      `  Π implied by the full calculation at its crossover: Π = Δc = ${fixed(implied)} cm⁻¹ (${fixed(implied / B, 2)} B).`,
    );
  }
  if (classroom !== undefined && coefficients) {
    const off =
      implied !== undefined
        ? ` — ${signed((100 * (classroom - implied)) / implied, 1)} % from the full result`
        : '';
    lines.push(
      `  Π from B and C, ${coefficients.B}B + ${coefficients.C}C (Griffith 1961): ${fixed(classroom)} cm⁻¹ ` +
        `(${fixed(classroom / B, 2)} B), so the rule Δ > Π puts the crossover at Δ = ${fixed(classroom)} cm⁻¹${off}; ` +
        'the full calculation also mixes configurations, which the rule leaves out.',
    );
  }
  return lines;
}

function reportText(r: Report): string {
  const sections = [headerLines(r), crossingLines(r.analysis)];
  if (r.verdict) sections.push(sampleLines(r, r.verdict));
  sections.push(oneElectronLines(r));
  sections.push([
    'Spin-only moments, μ_so = √(4S(S+1)) μ_B:',
    ...r.moments.map(
      (m) =>
        `  ${unicodeLabel(m.state)}  S = ${halfIntegerText(m.S)}  μ_so = ${fixed(m.spinOnly, 2)} μ_B — ${m.note}`,
    ),
  ]);
  const so = r.spinOrbitMoments;
  if (so) {
    sections.push([
      `With spin–orbit coupling, ζ = ${fixed(so.zeta)} cm⁻¹ (Van Vleck over all states, k = 1, g = 2):`,
      ...so.points.map(
        (p) =>
          `  ${p.where}, Dq = ${fixed(p.dq)} cm⁻¹: ground ${p.ground.replace(/\(\d+\)$/, '')} (mainly ${unicodeLabel(p.parent)}), μ_eff = ` +
          p.muEff.map((m, i) => `${fixed(m, 2)} (${so.temperatures[i]} K)`).join(', ') +
          ' μ_B',
      ),
    ]);
  }
  if (r.map !== undefined) sections.push([`Ground-state map written to ${r.map}.`]);
  // The tetrahedral note is printed with the crossover already.
  const cautions = r.cautions.filter((c) => c.code !== 'tetrahedral');
  if (cautions.length > 0) sections.push(['Cautions:', ...cautions.map((c) => `  - ${c.message}`)]);
  sections.push([
    'The model places the crossover; measurement (magnetometry, Mössbauer spectroscopy) decides the spin state.',
  ]);
  return `${sections.map((lines) => lines.join('\n')).join('\n\n')}\n`;
}
