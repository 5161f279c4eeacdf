import { describe, expect, it } from 'vitest';
import { COMMAND_SUMMARIES } from '../../cli/commandSummaries.js';
import { memoryIo } from '../../cli/io.js';
import { buildFullProgram, buildProgram } from '../../cli/program.js';
import { runInProcess } from '../cliRunner.js';

describe('command summaries: the top-level help without loading the commands', () => {
  it('buildProgram for help writes the very help text of the program with every command registered', async () => {
    const io = memoryIo();
    const full = (await buildFullProgram(io)).helpInformation();
    expect((await buildProgram(io, ['--help'])).helpInformation()).toBe(full);
    expect((await buildProgram(io, [])).helpInformation()).toBe(full);
  });

  it('COMMAND_SUMMARIES lists every registered command in order, with its description', async () => {
    const commands = (await buildFullProgram(memoryIo())).commands;
    expect(commands.map((c) => c.name())).toEqual(Object.keys(COMMAND_SUMMARIES));
    for (const c of commands)
      expect(c.description()).toBe(COMMAND_SUMMARIES[c.name() as keyof typeof COMMAND_SUMMARIES].description);
  });

  it('termsplit help <command> loads that command and prints its own help', async () => {
    const r = await runInProcess(['help', 'terms']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('--ion <name>');
    expect(r.stdout).toContain('Usage: termsplit terms [options] [config]');
  });
});
