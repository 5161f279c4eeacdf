/**
 * The command-line program: every command registered on one commander program, its own errors
 * turned into the one-line `termsplit: …` form, and the run that maps input errors to exit code 2
 * and anything else to exit code 1.
 */

import { Command, CommanderError } from 'commander';
import { InputError } from '../src/core/errors.js';
import { registerCrossover } from './commands/crossover.js';
import { registerDemo } from './commands/demo.js';
import { registerDiagram } from './commands/diagram.js';
import { registerExplore } from './commands/explore.js';
import { registerFit } from './commands/fit.js';
import { registerIons } from './commands/ions.js';
import { registerLevels } from './commands/levels.js';
import { registerMagnetism } from './commands/magnetism.js';
import { registerReport } from './commands/report.js';
import { registerSpectrum } from './commands/spectrum.js';
import { registerTerms } from './commands/terms.js';
import { messageLine } from './format.js';
import type { Io } from './io.js';
import { VERSION } from './version.js';

/** Exit codes: 0 success, 1 an internal failure, 2 bad input. */
export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_INPUT = 2;

/** The command-line program, with every command registered, writing to `io`. */
export function buildProgram(io: Io): Command {
  const program = new Command('termsplit')
    .description(
      'Ligand-field analysis of transition-metal ions: terms, cubic levels, diagrams, fits, spin state.',
    )
    .version(VERSION)
    .configureOutput(output(io))
    .exitOverride();
  for (const register of [
    registerTerms,
    registerLevels,
    registerIons,
    registerFit,
    registerDiagram,
    registerCrossover,
    registerMagnetism,
    registerSpectrum,
    registerReport,
    registerDemo,
    registerExplore,
  ])
    register(program, io);
  for (const c of program.commands) c.exitOverride().configureOutput(output(io));
  return program;
}

/**
 * Where commander writes: help on stdout; its own errors (unknown option, missing value) as one
 * line `termsplit: …` on stderr, like every other input error, with a pointer to --help.
 */
function output(io: Io) {
  return {
    writeOut: (t: string) => io.out(t),
    writeErr: (t: string) => io.err(t),
    outputError: (t: string, write: (s: string) => void) =>
      write(
        `termsplit: ${messageLine(
          t
            .trim()
            .replace(/^error: /, '')
            .replace(/\n+/g, ' '),
        )} (see --help)\n`,
      ),
  };
}

/**
 * Runs the program on `argv` (the words after `termsplit`) and returns the exit code. Input
 * errors print one line on stderr; nothing is written to stdout then.
 */
export async function run(argv: readonly string[], io: Io): Promise<number> {
  const program = buildProgram(io);
  if (argv.length === 0) {
    io.out(program.helpInformation());
    return EXIT_OK;
  }
  try {
    await program.parseAsync([...argv], { from: 'user' });
    return EXIT_OK;
  } catch (e) {
    if (e instanceof CommanderError) {
      if (
        e.code === 'commander.helpDisplayed' ||
        e.code === 'commander.version' ||
        e.code === 'commander.help'
      ) {
        return EXIT_OK;
      }
      return EXIT_INPUT;
    }
    if (e instanceof InputError) {
      io.err(`termsplit: ${messageLine(e.message)}\n`);
      return EXIT_INPUT;
    }
    const message = e instanceof Error ? e.message : String(e);
    io.err(`termsplit: internal error: ${messageLine(message)}\n`);
    if (process.env.TERMSPLIT_DEBUG && e instanceof Error && e.stack) io.err(`${e.stack}\n`);
    return EXIT_INTERNAL;
  }
}
