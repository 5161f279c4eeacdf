/**
 * `termsplit ions`: lists the built-in free ions with their n, Racah B and C, C/B, ζ and sources,
 * as text or JSON.
 */

import type { Command } from 'commander';
import { FREE_IONS, freeIonRatio } from '../../src/core/ions.js';
import { COMMAND_SUMMARIES } from '../commandSummaries.js';
import { fixed, jsonText, table } from '../format.js';
import type { Io } from '../io.js';

/** `termsplit ions`: the built-in table of free-ion parameters with sources. */
export function registerIons(program: Command, io: Io): void {
  program
    .command('ions')
    .description(COMMAND_SUMMARIES.ions.description)
    .option('--json', 'print JSON on stdout')
    .action((opts: { json?: boolean }) => {
      if (opts.json) {
        io.out(jsonText({ ions: FREE_IONS.map((i) => ({ ...i, cOverB: freeIonRatio(i) ?? null })) }));
        return;
      }
      const rows = FREE_IONS.map((i) => [
        i.ion,
        `d${i.n}`,
        i.B === undefined ? '—' : fixed(i.B),
        i.C === undefined ? '—' : fixed(i.C),
        freeIonRatio(i) === undefined ? '—' : fixed(freeIonRatio(i) ?? 0, 2),
        i.zeta === undefined ? '—' : fixed(i.zeta),
      ]);
      const sources = [...new Set(FREE_IONS.map((i) => i.source))];
      io.out(
        `${table(['ion', 'dⁿ', 'B / cm⁻¹', 'C / cm⁻¹', 'C/B', 'ζ / cm⁻¹'], rows)}\n\nSources:\n${sources.map((s) => `  - ${s}`).join('\n')}\n`,
      );
    });
}
