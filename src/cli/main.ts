// The command-line interface: a thin declarative layer (commander) over the library in src/.
// Each command lives in its own file under commands/ and registers itself here.

import { Command, CommanderError } from 'commander';
import { isInputError } from '../errors.js';
import * as simulateCommand from './commands/simulate.js';
import * as budgetCommand from './commands/budget.js';
import * as whatifCommand from './commands/whatif.js';
import * as sweepCommand from './commands/sweep.js';
import * as stintCommand from './commands/stint.js';
import * as lineCommand from './commands/line.js';
import * as compareCommand from './commands/compare.js';
import * as envelopeCommand from './commands/envelope.js';
import * as demoCommand from './commands/demo.js';
import * as carCommand from './commands/car.js';
import * as checkCommand from './commands/check.js';
import * as calibrateCommand from './commands/calibrate.js';
import * as cornersCommand from './commands/corners.js';

interface CommandModule {
  register(program: Command): void;
}

// Order here is the order of `reflap --help`.
const commandModules: CommandModule[] = [
  simulateCommand,
  budgetCommand,
  whatifCommand,
  sweepCommand,
  stintCommand,
  compareCommand,
  envelopeCommand,
  calibrateCommand,
  lineCommand,
  cornersCommand,
  carCommand,
  checkCommand,
  demoCommand,
];

export function buildProgram(): Command {
  const program = new Command();
  program
    .name('reflap')
    .description('Theoretical reference lap of a car on a track, and a driver lap compared against it.')
    .version('0.1.0')
    .showHelpAfterError(false)
    .exitOverride();
  for (const module of commandModules) module.register(program);
  for (const command of program.commands) command.exitOverride();
  return program;
}

/** Runs the CLI and returns the exit code: 0 success, 2 bad input, 1 internal error. */
export async function main(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
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
