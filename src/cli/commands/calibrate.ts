// `reflap calibrate`: the car a driver's own log shows, fitted from the user's car file (power and drag from the
// full-throttle stretches, grip, downforce and load sensitivity from the demonstrated boundary), written as an
// ordinary car file with the standard errors in its uncertainty block and a note of where each value came from.

import type { Command } from 'commander';
import {
  addCarOptions,
  inputFilesOf,
  loadCar,
  trackReadOptions,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { outputBatch } from '../output.js';
import { parseColumnMapping } from '../../io/columns.js';
import { readTelemetryFile } from '../../io/telemetry/read-telemetry.js';
import { readTrackFile } from '../../io/read-track.js';
import { calibrationSamples } from '../../calibrate/samples.js';
import { calibrateCar } from '../../calibrate/calibrate-car.js';
import { carFileJson } from '../../report/car-file.js';
import { calibrationJson, calibrationText } from '../../report/calibration-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface CalibrateValues extends CarOptionValues, Partial<Omit<TrackOptionValues, 'track'>>, UnitsOptionValues {
  telemetry: string;
  telemetryColumns?: string;
  track?: string;
  out: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('calibrate')
    .description("fit power, drag, grip and downforce to a driver's log, starting from a car file");
  command
    .requiredOption('--telemetry <file>', 'driver log: CSV with a header, NMEA 0183 (RMC, GGA) or GPX 1.1')
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. speed_kph=GPS Speed,time_s=Time')
    .option(
      '--track <file>',
      'track file: needed when the log has no accelerometer channels (they are derived on its grid)',
    );
  addCarOptions(command);
  command
    .requiredOption('--out <file>', 'write the fitted car file here (nothing is written when the fit fails)')
    .option('--json', 'print one JSON object instead of the summary');
  addUnitsOption(command).action((values: CalibrateValues) => runCalibrate(values));
}

export async function runCalibrate(values: CalibrateValues): Promise<void> {
  const units = unitsOf(values);
  const { car, ambient } = loadCar(values);
  const track = values.track ? readTrackFile(values.track, trackReadOptions({ ...values, track: values.track })) : null;
  const columns = values.telemetryColumns ? parseColumnMapping(values.telemetryColumns, '--telemetry-columns') : {};
  const session = await readTelemetryFile(values.telemetry, { columns });
  const result = calibrateCar(car, ambient, calibrationSamples(session, track));
  const outputs = outputBatch(inputFilesOf(values));
  outputs.add(values.out, carFileJson(result.car));
  outputs.commit();
  if (values.json)
    process.stdout.write(JSON.stringify({ ...calibrationJson(result, car), out: values.out }, null, 2) + '\n');
  else process.stdout.write(calibrationText(result, car, units) + `Fitted car written to ${values.out}\n`);
}
