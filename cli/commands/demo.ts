import { resolve } from 'node:path';
import type { Command } from 'commander';
import { findIon, solveCubic, unicodeLabel } from '../../src/index.js';
import { packageRoot, readTextFile } from '../files.js';
import { fixed, jsonText, table } from '../format.js';
import type { Io } from '../io.js';
import { termsCommand } from './terms.js';

interface DemoSample {
  name: string;
  ion: string;
  geometry: 'oct' | 'tet';
  bands: string;
  notebook: { dq: number; B: number };
}

/** The invented demo scenario shipped in fixtures/demo. */
export function loadScenario(): { about: string; samples: DemoSample[] } {
  return JSON.parse(readTextFile(resolve(packageRoot(), 'fixtures/demo/scenario.json')));
}

/** `termsplit demo`: the main job on the built-in invented scenario. */
export function registerDemo(program: Command, io: Io): void {
  program
    .command('demo')
    .description('run termsplit on its built-in invented demo scenario')
    .option('--json', 'print JSON on stdout')
    .action((opts: { json?: boolean }) => {
      const scenario = loadScenario();
      const results = scenario.samples.map((s) => {
        const ion = findIon(s.ion);
        const B = s.notebook.B;
        const C = B * ((ion.C ?? 4.5 * (ion.B ?? 1)) / (ion.B ?? 1));
        return { sample: s, result: solveCubic({ n: ion.n, geometry: s.geometry, dq: s.notebook.dq, B, C }) };
      });
      if (opts.json) {
        io.out(
          jsonText({
            about: scenario.about,
            samples: results.map(({ sample, result }) => ({
              name: sample.name,
              ion: sample.ion,
              geometry: result.geometry,
              dq: result.dq,
              B: result.B,
              C: result.C,
              ground: result.ground.label,
              bands: result.levels
                .filter((l) => l.spinAllowed && l !== result.ground)
                .map((l) => ({ label: l.label, energy: l.energy })),
            })),
          }),
        );
        return;
      }
      const lines = [`termsplit demo — ${scenario.about}`, ''];
      lines.push('Free ions of the series:');
      lines.push(
        termsCommand(undefined, { ion: 'Ni2+' })
          .split('\n')
          .filter((l) => l !== '')
          .slice(-7)
          .join('\n'),
      );
      lines.push('');
      for (const { sample, result } of results) {
        const bands = result.levels.filter((l) => l.spinAllowed && l !== result.ground);
        lines.push(
          `${sample.name} (${sample.ion}, ${sample.geometry}; notebook Dq = ${sample.notebook.dq}, B = ${sample.notebook.B} cm⁻¹): ` +
            `ground ${unicodeLabel(result.ground.label)}`,
        );
        lines.push(
          table(
            ['predicted band', 'cm⁻¹', 'observed (invented)'],
            bands
              .slice(0, 4)
              .map((l, i) => [unicodeLabel(l.label), fixed(l.energy), sample.bands.split(',')[i] ?? '—']),
          ),
        );
        lines.push('');
      }
      lines.push('All data above are invented for this demo. Predictions are for an ideal cubic field.');
      io.out(`${lines.join('\n')}\n`);
    });
}
