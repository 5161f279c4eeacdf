/**
 * `termsplit terms`: checks the configuration or ion and optional Racah B and C, asks the library
 * for microstates, terms, the Hund ground level, J levels and free-ion energies, and prints them
 * as text or JSON.
 */

import type { Command } from 'commander';
import { freeIonTerms } from '../../src/atom/freeIon.js';
import { freeIonLevels } from '../../src/atom/jLevels.js';
import { binomial } from '../../src/atom/microstates.js';
import {
  halfIntegerText,
  hundGround,
  jLevels,
  microstateTable,
  parseConfiguration,
  termsOf,
} from '../../src/atom/terms.js';
import { InputError } from '../../src/core/errors.js';
import { type FreeIon, findIon } from '../../src/core/ions.js';
import { B_LIMIT, C_LIMIT } from '../../src/core/limits.js';
import { unicodeTerm } from '../../src/field/labels.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { fixed, jsonText, table } from '../format.js';
import type { Io } from '../io.js';
import { numberOption } from '../options.js';
import { jLevelsText } from '../present/spinOrbitPresent.js';
import { ZETA_FACTOR_HELP, zetaOption } from '../zetaOption.js';

interface TermsOptions {
  B?: string;
  C?: string;
  zeta?: string;
  zetaFactor?: string;
  ion?: string;
  json?: boolean;
}

/** `termsplit terms <config>`: microstates, terms, Hund ground level, J levels, free-ion energies. */
export function registerTerms(program: Command, io: Io): void {
  program
    .command('terms')
    .description(COMMAND_SUMMARIES.terms.description)
    .argument('[config]', 'configuration such as p2, d3, 3d8, f2 (optional with --ion)')
    .option('--B <cm-1>', 'Racah B, for free-ion term energies of a d configuration')
    .option('--C <cm-1>', 'Racah C, with --B')
    .option('--ion <name>', 'take n, B and C of a free ion from the built-in table, e.g. Cr3+')
    .option(
      '--zeta <cm-1|ion>',
      'spin–orbit ζ, cm⁻¹, or "ion": adds the free-ion J levels with energies (needs B and C)',
    )
    .option('--zeta-factor <f>', ZETA_FACTOR_HELP)
    .option('--json', 'print one JSON object on stdout')
    .action((configText: string | undefined, opts: TermsOptions) => {
      io.out(termsCommand(configText, opts));
    });
}

/** Builds the command's output text (the action only writes it, so errors leave stdout empty). */
export function termsCommand(configText: string | undefined, opts: TermsOptions): string {
  const job = termsJob(configText, opts);
  const result = termsResult(job);
  return opts.json ? jsonText(result) : termsText(job, result);
}

/** The configuration, the ion if named, and B and C when free-ion energies are asked for. */
interface TermsJob {
  readonly config: ReturnType<typeof parseConfiguration>;
  readonly ion?: FreeIon;
  readonly B?: number;
  readonly C?: number;
  /** ζ when J-level energies are asked for. */
  readonly zeta?: number;
}

/** Checks the configuration or ion and the Racah parameters. */
function termsJob(configText: string | undefined, opts: TermsOptions): TermsJob {
  const ion = opts.ion === undefined ? undefined : findIon(opts.ion);
  if (configText === undefined && !ion) throw new InputError('give a configuration such as d3, or --ion');
  const config = parseConfiguration(configText ?? `d${ion?.n}`);
  if (ion && (config.l !== 2 || config.n !== ion.n)) {
    throw new InputError(`configuration ${config.text} disagrees with --ion ${ion.ion}, which is d${ion.n}`);
  }
  let B = numberOption('--B', opts.B, B_LIMIT);
  let C = numberOption('--C', opts.C, C_LIMIT);
  if ((B === undefined) !== (C === undefined))
    throw new InputError('free-ion energies need both --B and --C');
  if (ion && B === undefined) {
    B = ion.B;
    C = ion.C;
  }
  if (B !== undefined && config.l !== 2) {
    throw new InputError(`free-ion energies from Racah B and C are for d configurations, not ${config.text}`);
  }
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, ion);
  if (zeta !== undefined && config.l !== 2) {
    throw new InputError(`--zeta: J-level energies are for d configurations, not ${config.text}`);
  }
  const single = config.n === 1 || config.n === 9;
  if (zeta !== undefined && B === undefined && !single) {
    throw new InputError('--zeta needs --B and --C (or --ion) for the J-level energies');
  }
  return {
    ...(zeta !== undefined ? { zeta } : {}),
    config,
    ...(ion ? { ion } : {}),
    ...(B !== undefined ? { B } : {}),
    ...(C !== undefined ? { C } : {}),
  };
}

/** Microstates, terms, ground level and (with B and C) free-ion energies, as JSON-ready data. */
function termsResult(job: TermsJob) {
  const { config, ion, B, C, zeta } = job;
  const { l, n } = config;
  const levels = zeta === undefined ? undefined : freeIonLevels(n, B ?? 0, C ?? 0, zeta);
  const tableOf = microstateTable(l, n);
  const terms = termsOf(l, n);
  const ground = hundGround(l, n);
  const total = binomial(2 * (2 * l + 1), n);
  const energies = B !== undefined && C !== undefined ? freeIonTerms(n, B, C) : undefined;
  const result = {
    config: config.text,
    l,
    n,
    microstates: total,
    table: tableOf,
    terms: terms.map((t) => ({ term: t.symbol, S: t.S, L: t.L, count: t.count, J: jLevels(t.S, t.L) })),
    ground: ground.symbol,
    groundJ: ground.J,
    ...(ion ? { ion: ion.ion, source: ion.source } : {}),
    ...(energies
      ? {
          B,
          C,
          energies: energies.map((e) => ({
            term: e.term,
            name: e.name,
            energy: e.energy,
            degeneracy: e.degeneracy,
          })),
        }
      : {}),
    ...(levels ? { zeta, levels } : {}),
  };
  return result;
}

/** The human form of the terms. */
function termsText(job: TermsJob, result: ReturnType<typeof termsResult>): string {
  const { config, ion, B, C } = job;
  const { table: tableOf, microstates: total } = result;
  const terms = termsOf(config.l, config.n);
  const ground = hundGround(config.l, config.n);
  const energies = result.energies;

  const lines: string[] = [];
  lines.push(`${config.text}: ${total} microstates`);
  lines.push('');
  lines.push('Microstate counts N(M_L, M_S), M_L ≥ 0, M_S ≥ 0:');
  lines.push(
    table(
      ['M_L', ...tableOf.MS.map((s) => `M_S=${halfIntegerText(s)}`)],
      tableOf.ML.map((m, i) => [String(m), ...(tableOf.counts[i] ?? []).map(String)]),
    ),
  );
  lines.push('');
  lines.push(
    `Terms: ${terms.map((t) => `${unicodeTerm(t.symbol)}${t.count > 1 ? ` (×${t.count})` : ''}`).join(', ')}`,
  );
  lines.push(`Ground level (Hund's rules): ${unicodeTerm(ground.symbol)}`);
  lines.push('');
  lines.push('J levels:');
  for (const t of terms)
    lines.push(`  ${unicodeTerm(t.symbol)}: J = ${jLevels(t.S, t.L).map(halfIntegerText).join(', ')}`);
  if (energies && B !== undefined && C !== undefined) {
    lines.push('');
    lines.push(
      `Free-ion term energies, B = ${fixed(B)} cm⁻¹, C = ${fixed(C)} cm⁻¹ (C/B = ${fixed(C / Math.max(B, 1e-12), 2)})` +
        `${ion ? `, ${ion.ion} (${ion.source})` : ''}:`,
    );
    lines.push(
      table(
        ['term', 'energy / cm⁻¹', 'E/B', 'degeneracy'],
        energies.map((e) => [
          unicodeTerm(e.name),
          fixed(e.energy, 0),
          B > 0 ? fixed(e.energy / B, 2) : '—',
          String(e.degeneracy),
        ]),
      ),
    );
  }
  if (result.levels && job.zeta !== undefined) lines.push('', jLevelsText(result.levels, job.zeta));
  return `${lines.join('\n')}\n`;
}
