/**
 * The command-line program: every command registered on one commander program, its own errors
 * turned into the one-line `termsplit: …` form, and the run that maps input errors to exit code 2
 * and anything else to exit code 1.
 *
 * Commands are loaded lazily: when the first word names a command (or the second, after `help`),
 * only that command's module is imported (a start-up of a text command then loads no figure or
 * reader code); for help, the version, no words or an unknown word no command module is loaded:
 * each command stands in the program as its name and summary (commandSummaries.ts), which is all
 * the top-level help shows.
 */

import { Command, CommanderError, Help } from 'commander';
import { InputError } from '../src/core/errors.js';
import { COMMAND_SUMMARIES, type CommandName } from './commandSummaries.js';
import { messageLine } from './format.js';
import type { Io } from './io.js';
import { VERSION } from './version.js';

/** Exit codes: 0 success, 1 an internal failure, 2 bad input. */
export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_INPUT = 2;

/** What a command module exports: a function adding the command to the program. */
type Register = (program: Command, io: Io) => void;

/** Every command, in the order help lists them, and how to load its module. */
const COMMANDS: ReadonlyMap<string, () => Promise<Register>> = new Map<CommandName, () => Promise<Register>>([
  ['terms', async () => (await import('./commands/terms.js')).registerTerms],
  ['levels', async () => (await import('./commands/levels.js')).registerLevels],
  ['ions', async () => (await import('./commands/ions.js')).registerIons],
  ['fit', async () => (await import('./commands/fit.js')).registerFit],
  ['diagram', async () => (await import('./commands/diagram.js')).registerDiagram],
  ['crossover', async () => (await import('./commands/crossover.js')).registerCrossover],
  ['magnetism', async () => (await import('./commands/magnetism.js')).registerMagnetism],
  ['spectrum', async () => (await import('./commands/spectrum.js')).registerSpectrum],
  ['report', async () => (await import('./commands/report.js')).registerReport],
  ['demo', async () => (await import('./commands/demo.js')).registerDemo],
  ['explore', async () => (await import('./commands/explore.js')).registerExplore],
]);

/**
 * The command-line program writing to `io`: with only the command `argv` names when its first
 * word (or, after `help`, its second) is a command, else with every command as its summary.
 */
export async function buildProgram(io: Io, argv: readonly string[] = []): Promise<Command> {
  const program = baseProgram(io);
  const named = COMMANDS.get((argv[0] === 'help' ? argv[1] : argv[0]) ?? '');
  if (named) (await named())(program, io);
  else addSummaries(program);
  for (const c of program.commands) c.exitOverride().configureOutput(output(io));
  return program;
}

/** The program with every command module loaded and registered (for tests of the whole set). */
export async function buildFullProgram(io: Io): Promise<Command> {
  const program = baseProgram(io);
  const registers = await Promise.all([...COMMANDS.values()].map((load) => load()));
  for (const register of registers) register(program, io);
  for (const c of program.commands) c.exitOverride().configureOutput(output(io));
  return program;
}

function baseProgram(io: Io): Command {
  return new Command('termsplit')
    .description(
      'Ligand-field analysis of transition-metal ions: terms, cubic levels, diagrams, fits, spin state.',
    )
    .version(VERSION)
    .configureOutput(output(io))
    .exitOverride();
}

/**
 * Every command as its name and description only, listed with the usage the command declares
 * (commander would write `[options]` and the arguments only for a command that has them).
 */
function addSummaries(program: Command): void {
  for (const [name, { description }] of Object.entries(COMMAND_SUMMARIES))
    program.command(name).description(description);
  program.configureHelp({
    subcommandTerm: (cmd) => {
      const summary = COMMAND_SUMMARIES[cmd.name() as CommandName];
      return summary ? `${cmd.name()} ${summary.usage}` : Help.prototype.subcommandTerm.call(new Help(), cmd);
    },
  });
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
  const program = await buildProgram(io, argv);
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
