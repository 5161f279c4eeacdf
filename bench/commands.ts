/**
 * Whole-process benchmark of the command line as a user runs it: the start-up of each kind of
 * command against a bare `node -e 0` (runs interleaved, medians, so that a busy machine weighs on
 * both alike), one figure, `spectrum` on every fixture, `termsplit demo`, and a 20-sample report
 * with one worker and with two.
 */

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** The built command line and the package's fixtures, from dist/bench/. */
export const MAIN = fileURLToPath(new URL('../cli/main.js', import.meta.url));
export const FIXTURES = fileURLToPath(new URL('../../fixtures/', import.meta.url));

/** Runs of each command in the start-up comparison. */
const COLD_ROUNDS = 7;

/**
 * One command of each kind that prints text or JSON and draws nothing, with its default work, and
 * where the work is more than a lookup, the same command with the least work it takes (what is
 * left is the start-up: loading its code and reading its input), so that the two can be told apart.
 */
const TEXT_COMMANDS: readonly { readonly args: readonly string[]; readonly least?: readonly string[] }[] = [
  { args: ['terms', 'd3'] },
  { args: ['levels', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--json'] },
  { args: ['ions'] },
  {
    args: ['fit', '--ion', 'Ni2+', '--bands', '8500,13800,25300', '--json'],
    least: ['fit', '--ion', 'Ni2+', '--bands', '8500', '--json'],
  },
  { args: ['diagram', 'd6', '--json'], least: ['diagram', 'd6', '--points', '2', '--json'] },
  { args: ['crossover', 'd6', '--ion', 'Co3+'] },
  {
    args: ['magnetism', '--ion', 'Co2+', '--dq', '900', '--B', '850', '--json'],
    least: ['magnetism', '--ion', 'Co2+', '--dq', '900', '--B', '850', '--steps', '1', '--json'],
  },
  {
    args: ['spectrum', 'spectra/cr-mz6-absorbance-nm.csv', '--json'],
    least: ['spectrum', 'spectra/cr-mz6-absorbance-nm.csv', '--list-columns', '--json'],
  },
  { args: ['--help'] },
];

/** Wall milliseconds of one process; fails loudly if the command fails. */
export function runMs(args: readonly string[], cwd = FIXTURES): number {
  const start = performance.now();
  const r = spawnSync(process.execPath, args, { cwd, encoding: 'utf8' });
  const ms = performance.now() - start;
  if (r.status !== 0) throw new Error(`node ${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  return ms;
}

export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] ?? Number.NaN;
}

/** Medians of `rounds` runs of each command, interleaved with each other. */
function interleaved(commands: readonly (readonly string[])[], rounds: number): number[] {
  const times = commands.map(() => [] as number[]);
  for (let r = 0; r < rounds; r++) {
    commands.forEach((args, i) => {
      times[i]?.push(runMs(args));
    });
  }
  return times.map(median);
}

/** Start-up of every command kind as a ratio to bare Node, with its default work and with the least. */
export function benchStartup(): void {
  console.log(
    `machine: ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown'}), Node ${process.version}, load average ${loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')}`,
  );
  console.log(`start-up, median of ${COLD_ROUNDS} runs interleaved with bare node (goal ≤ 2×):`);
  const variants = TEXT_COMMANDS.flatMap((c) => (c.least ? [c.args, c.least] : [c.args]));
  const commands = [['-e', '0'], ...variants.map((args) => [MAIN, ...args])];
  const [bare = Number.NaN, ...medians] = interleaved(commands, COLD_ROUNDS);
  const line = (text: string, ms: number) =>
    console.log(`  ${text.padEnd(72)} ${ms.toFixed(0).padStart(6)} ms   ${(ms / bare).toFixed(2)}×`);
  line('node -e 0', bare);
  variants.forEach((args, i) => {
    const least = TEXT_COMMANDS.some((c) => c.least === args);
    line(`${least ? '  least work: ' : ''}termsplit ${args.join(' ')}`, medians[i] ?? Number.NaN);
  });
}

/** A report sheet of `count` samples: the demo sheet's samples repeated under new names. */
function sheetOf(count: number, dir: string): string {
  const demo = JSON.parse(readFileSync(join(FIXTURES, 'demo/samples.json'), 'utf8')) as {
    samples: { name: string; spectrum?: { file: string } }[];
  };
  const samples = Array.from({ length: count }, (_, i) => {
    const s = demo.samples[i % demo.samples.length];
    if (!s) throw new Error('the demo sheet has no samples');
    const spectrum = s.spectrum
      ? { spectrum: { ...s.spectrum, file: join(FIXTURES, 'demo', s.spectrum.file) } }
      : {};
    return { ...s, ...spectrum, name: `${s.name} #${i + 1}` };
  });
  const path = join(dir, `sheet-${count}.json`);
  writeFileSync(
    path,
    JSON.stringify({ title: `benchmark sheet of ${count} samples (invented demo data)`, samples }),
  );
  return path;
}

/** Whole runs that draw or read: one figure, every spectrum fixture, the demo, a 20-sample report. */
export function benchWholeRuns(): void {
  const dir = mkdtempSync(join(tmpdir(), 'termsplit-bench-'));
  try {
    const figure = median([0, 1, 2].map(() => runMs([MAIN, 'diagram', 'd6', '-o', join(dir, 'd6.png')])));
    console.log(`  diagram d6 -o d6.png (one figure, whole process; goal ≤ 1 s): ${figure.toFixed(0)} ms`);
    const spectra = readdirSync(join(FIXTURES, 'spectra')).filter((f) => /\.(csv|txt|jdx)$/.test(f));
    for (const f of spectra) {
      const ms = median([0, 1, 2].map(() => runMs([MAIN, 'spectrum', join('spectra', f), '--json'])));
      console.log(`  spectrum ${f} --json (goal < 1.5 s): ${ms.toFixed(0)} ms`);
    }
    const demo = median([0, 1, 2].map(() => runMs([MAIN, 'demo'], dir)));
    console.log(`  demo (7 samples, figures and the report folder; goal < 5 s): ${demo.toFixed(0)} ms`);
    const sheet = sheetOf(20, dir);
    for (const jobs of [1, 2]) {
      const ms = median(
        [0, 1].map(() =>
          runMs(
            [
              MAIN,
              'report',
              sheet,
              '-o',
              join(dir, `r${jobs}`),
              '--jobs',
              String(jobs),
              '--allow-outside-files',
            ],
            dir,
          ),
        ),
      );
      console.log(`  report of 20 samples, --jobs ${jobs} (goal < 10 s): ${ms.toFixed(0)} ms`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  benchStartup();
  benchWholeRuns();
}
