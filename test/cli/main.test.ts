// The command table of src/cli/main.ts: `reflap --help` prints each command's line from the table without
// loading the command, so the table must say what the command itself declares once it is loaded.

import { describe, expect, it } from 'vitest';
import { Help } from 'commander';
import { buildProgram, commandEntries, commandToRun } from '../../src/cli/main.js';

describe('command table', () => {
  it('gives every command the help line and description it declares itself, in the same order', async () => {
    const program = await buildProgram();
    const help = new Help();
    const declared = program.commands.map((command) => ({
      name: command.name(),
      term: help.subcommandTerm(command),
      description: command.description(),
    }));
    expect(declared).toEqual(
      commandEntries.map((entry) => ({ name: entry.name, term: entry.term, description: entry.description })),
    );
  });

  it('loads only the command that runs, also for `help NAME`', () => {
    const argv = (...words: string[]) => ['node', 'reflap', ...words];
    expect(commandToRun(argv('check', '--json', 'car.json'))?.name).toBe('check');
    expect(commandToRun(argv('help', 'simulate'))?.name).toBe('simulate');
    expect(commandToRun(argv('--help'))).toBeNull();
    expect(commandToRun(argv('no-such-command'))).toBeNull();
  });
});
