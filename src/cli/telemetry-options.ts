// Options shared by the commands that read a driver's log (`compare`, `envelope`): the file, its column
// mapping, which lap, where the start/finish line is, and a demonstrated envelope file.

import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { parseColumnMapping } from '../io/columns.js';
import { readTelemetryFile } from '../io/telemetry/read-telemetry.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { numberOption } from './options.js';

export interface TelemetryOptionValues {
  telemetry: string;
  telemetryColumns?: string;
  lap?: string;
  startFinish?: string;
}

export function addTelemetryOptions(command: Command): Command {
  return command
    .requiredOption('--telemetry <file>', 'driver log: CSV with a header, NMEA 0183 (RMC, GGA) or GPX 1.1')
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. speed_kph=GPS Speed,time_s=Time')
    .option('--lap <n>', 'lap of the session to use (default: the fastest complete lap)')
    .option('--start-finish <x,y>', "start/finish line position in the track's plane, m (default: the track's start)");
}

export async function loadSession(values: TelemetryOptionValues): Promise<TelemetrySession> {
  const columns = values.telemetryColumns ? parseColumnMapping(values.telemetryColumns, '--telemetry-columns') : {};
  return readTelemetryFile(values.telemetry, { columns });
}

export function lapOption(values: TelemetryOptionValues): number | undefined {
  const lap = numberOption(values.lap, '--lap', null);
  if (lap === null) return undefined;
  if (!Number.isInteger(lap) || lap < 1) throw new InputError(`option --lap: ${lap} is not a lap number (1, 2, ...)`);
  return lap;
}

export function startFinishOption(values: TelemetryOptionValues): { xM: number; yM: number } | undefined {
  if (values.startFinish === undefined) return undefined;
  const parts = values.startFinish.split(',').map((part) => Number(part.trim()));
  if (parts.length !== 2 || !parts.every(Number.isFinite))
    throw new InputError(`option --start-finish: '${values.startFinish}' is not of the form x,y (metres)`);
  return { xM: parts[0]!, yM: parts[1]! };
}
