// The --units option shared by every command that prints numbers for people, with its default from the
// REFLAP_UNITS environment variable (metric when unset).

import { Option, type Command } from 'commander';
import { InputError } from '../errors.js';
import { displayUnits, UNIT_SYSTEMS, type DisplayUnits, type UnitSystem } from '../report/units.js';

export const UNITS_ENVIRONMENT_VARIABLE = 'REFLAP_UNITS';

export interface UnitsOptionValues {
  units?: string;
}

export function addUnitsOption(command: Command): Command {
  return command.addOption(
    new Option(
      '--units <system>',
      `units of printed tables, reports and CSVs for people: metric (km/h, m) or imperial (mph, ft); JSON stays SI (default: $${UNITS_ENVIRONMENT_VARIABLE}, else metric)`,
    ).choices(UNIT_SYSTEMS),
  );
}

/** The units chosen by --units, else by the environment variable, else metric. */
export function unitsOf(values: UnitsOptionValues, environment: NodeJS.ProcessEnv = process.env): DisplayUnits {
  if (values.units !== undefined) return displayUnits(values.units as UnitSystem);
  const fromEnvironment = environment[UNITS_ENVIRONMENT_VARIABLE]?.trim().toLowerCase();
  if (fromEnvironment === undefined || fromEnvironment === '') return displayUnits('metric');
  if (!(UNIT_SYSTEMS as readonly string[]).includes(fromEnvironment)) {
    throw new InputError(
      `environment variable ${UNITS_ENVIRONMENT_VARIABLE}: '${environment[UNITS_ENVIRONMENT_VARIABLE]}' is not one of ${UNIT_SYSTEMS.join(', ')}`,
    );
  }
  return displayUnits(fromEnvironment as UnitSystem);
}
