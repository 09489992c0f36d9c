// `reflap simulate`: the reference lap of a car on a track, as a summary, a JSON object or a trace CSV.

import type { Command } from 'commander';
import { addCarOptions, addTrackOptions, inputFilesOf, loadCar, loadTrack, startSpeedMps, type CarOptionValues, type TrackOptionValues } from '../options.js';
import { simulate } from '../../solve/simulate.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { traceCsv, type ExtraColumn } from '../../report/trace-csv.js';
import { lapSummaryJson, lapSummaryText } from '../../report/lap-summary.js';
import { outputBatch } from '../output.js';

interface SimulateValues extends TrackOptionValues, CarOptionValues {
  out?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program.command('simulate').description('compute the reference lap of a car on a track');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .option('--out <file>', 'write the lap trace as CSV')
    .option('--json', 'print one JSON object instead of the summary')
    .action((values: SimulateValues) => runSimulate(values));
}

export function runSimulate(values: SimulateValues): void {
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const envelope = buildEnvelope(car, ambient);
  const result = simulate(track, car, { ambient, envelope, startSpeedMps: startSpeedMps(values) });
  const extraColumns: ExtraColumn[] = [];
  const outputs = outputBatch(inputFilesOf(values));
  if (values.out) outputs.add(values.out, traceCsv(result, extraColumns));
  outputs.commit();
  if (values.json) {
    process.stdout.write(JSON.stringify(lapSummaryJson(result, car.name), null, 2) + '\n');
  } else {
    process.stdout.write(lapSummaryText(result, car.name));
    if (values.out) process.stdout.write(`Trace written to ${values.out}\n`);
  }
}
