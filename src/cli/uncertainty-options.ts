// `--uncertainty [N]` for the commands that run a reference lap: the number of draws of the car file's uncertain
// fields (default 64), checked once here so every command takes it the same way.

import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { DEFAULT_DRAWS } from '../uncertainty/draws.js';

export interface UncertaintyOptionValues {
  uncertainty?: string | boolean;
}

/** Most draws a run may ask for: enough for any band, few enough that a typo does not start an hour's work. */
export const MAX_DRAWS = 5000;

export function addUncertaintyOption(command: Command): Command {
  return command.option(
    '--uncertainty [draws]',
    `run the reference over this many draws of the car file's uncertainty block (default ${DEFAULT_DRAWS}) and report the median and the 90 % band`,
  );
}

/** The number of draws asked for, or null when the option is absent. */
export function drawsOption(values: UncertaintyOptionValues): number | null {
  const value = values.uncertainty;
  if (value === undefined || value === false) return null;
  if (value === true) return DEFAULT_DRAWS;
  const draws = Number(value);
  if (value.trim() === '' || !Number.isInteger(draws) || draws < 2 || draws > MAX_DRAWS) {
    throw new InputError(
      `option --uncertainty: '${value}' is not a number of draws (a whole number from 2 to ${MAX_DRAWS})`,
    );
  }
  return draws;
}
