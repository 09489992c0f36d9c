// The command-line interface: a thin declarative layer (commander) over the library in src/.
// Each command lives in its own file under commands/ and is loaded only when it runs: the table below names every
// command with the line `reflap --help` shows for it, so the help and the start of a command load one command's
// modules and their libraries, not all of them.

import { createRequire } from 'node:module';
import type * as Commander from 'commander';
import { isInputError } from '../errors.js';
import { neutraliseTerminalOutput } from './terminal.js';
import { endQuietlyOnClosedStdout } from './closed-stdout.js';

// commander through its CommonJS entry: its ES module wrapper first has Node scan the CommonJS source for its
// export names, a few milliseconds of every start (the command modules' own imports of it reuse the same module).
const { Command, CommanderError, Help } = createRequire(import.meta.url)('commander') as typeof Commander;
type Command = Commander.Command;

export interface CommandModule {
  register(program: Command): void;
}

export interface CommandEntry {
  name: string;
  /** The command's line in `reflap --help`: what commander prints for it once registered (a test holds them equal). */
  term: string;
  description: string;
  load(): Promise<CommandModule>;
}

// Order here is the order of `reflap --help`.
export const commandEntries: CommandEntry[] = [
  {
    name: 'simulate',
    term: 'simulate [options]',
    description: 'compute the reference lap of a car on a track',
    load: () => import('./commands/simulate.js'),
  },
  {
    name: 'budget',
    term: 'budget [options]',
    description: 'friction-circle arithmetic: what is left for braking and accelerating while cornering',
    load: () => import('./commands/budget.js'),
  },
  {
    name: 'whatif',
    term: 'whatif [options]',
    description: 'one setup change against the baseline: lap time and braking points',
    load: () => import('./commands/whatif.js'),
  },
  {
    name: 'sweep',
    term: 'sweep [options]',
    description: 'many setups across worker threads: lap times, braking points and sensitivities',
    load: () => import('./commands/sweep.js'),
  },
  {
    name: 'stint',
    term: 'stint [options]',
    description: 'lap by lap with the fuel burning off: lap times and braking points through a stint',
    load: () => import('./commands/stint.js'),
  },
  {
    name: 'compare',
    term: 'compare [options]',
    description: "compare a driver's logged lap with the reference lap of the same car, corner by corner",
    load: () => import('./commands/compare.js'),
  },
  {
    name: 'session',
    term: 'session [options]',
    description: 'every lap of a logged session: lap and sector times, corners across the laps, the session best',
    load: () => import('./commands/session.js'),
  },
  {
    name: 'envelope',
    term: 'envelope [options]',
    description:
      'fit the g-g-v envelope the driver has demonstrated in a logged session (per speed band, 98th percentile by direction)',
    load: () => import('./commands/envelope.js'),
  },
  {
    name: 'calibrate',
    term: 'calibrate [options]',
    description: "fit power, drag, grip and downforce to a driver's log, starting from a car file",
    load: () => import('./commands/calibrate.js'),
  },
  {
    name: 'line',
    term: 'line [options]',
    description: 'compute the racing line inside the track edges for a car',
    load: () => import('./commands/line.js'),
  },
  {
    name: 'corners',
    term: 'corners [options]',
    description: "list a track's corners and sectors, and write a corners file to edit (--corners on any command)",
    load: () => import('./commands/corners.js'),
  },
  {
    name: 'heights',
    term: 'heights [options]',
    description: "build a track's height profile from a log's GPS altitudes and write the track with it (z_m)",
    load: () => import('./commands/heights.js'),
  },
  {
    name: 'car',
    term: 'car [options]',
    description: 'describe a car: axle loads, understeer gradient, envelope at a few speeds',
    load: () => import('./commands/car.js'),
  },
  {
    name: 'check',
    term: 'check [options] <files...>',
    description: 'validate car, track and telemetry files and list every problem found',
    load: () => import('./commands/check.js'),
  },
  {
    name: 'demo',
    term: 'demo [options]',
    description:
      'make an invented driver lap on the demo circuit, write it to ./out/ and compare it with the reference',
    load: () => import('./commands/demo.js'),
  },
];

/** The command that `argv` runs (`reflap NAME ...` or `reflap help NAME`), or null for the program's own help. */
export function commandToRun(argv: string[]): CommandEntry | null {
  const words = argv.slice(2).filter((word) => !word.startsWith('-'));
  const name = words[0] === 'help' ? words[1] : words[0];
  return commandEntries.find((entry) => entry.name === name) ?? null;
}

/** The program with `loaded` commands registered in full and the others as their help line only. */
function assembleProgram(loaded: Map<string, CommandModule>): Command {
  const program = new Command();
  program
    .name('reflap')
    .description('Theoretical reference lap of a car on a track, and a driver lap compared against it.')
    .version('0.1.0')
    .showHelpAfterError(false)
    .exitOverride();
  const terms = new Map<Command, string>();
  for (const entry of commandEntries) {
    const module = loaded.get(entry.name);
    if (module) module.register(program);
    else terms.set(program.command(entry.name).description(entry.description), entry.term);
  }
  program.configureHelp({
    subcommandTerm(command: Command): string {
      return terms.get(command) ?? Help.prototype.subcommandTerm.call(this, command);
    },
  });
  for (const command of program.commands) command.exitOverride();
  return program;
}

/** The whole program with every command registered in full (what the help lines are checked against). */
export async function buildProgram(): Promise<Command> {
  const loaded = new Map<string, CommandModule>();
  for (const entry of commandEntries) loaded.set(entry.name, await entry.load());
  return assembleProgram(loaded);
}

/** Runs the CLI and returns the exit code: 0 success, 2 bad input, 1 internal error. */
export async function main(argv: string[]): Promise<number> {
  neutraliseTerminalOutput();
  endQuietlyOnClosedStdout();
  try {
    const entry = commandToRun(argv);
    const loaded = new Map<string, CommandModule>();
    if (entry) loaded.set(entry.name, await entry.load());
    await assembleProgram(loaded).parseAsync(argv);
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) {
      // Help and version end through here with code 0; usage errors are bad input.
      if (error.exitCode === 0 || error.code === 'commander.helpDisplayed' || error.code === 'commander.version')
        return 0;
      return 2;
    }
    if (isInputError(error)) {
      process.stderr.write(`reflap: ${error.message}\n`);
      return 2;
    }
    const message = error instanceof Error ? (error.stack ?? error.message) : String(error);
    process.stderr.write(
      `reflap: internal error: ${message}\nThis is a fault in reflap, not in your files; please report it with the command you ran.\n`,
    );
    return 1;
  }
}
