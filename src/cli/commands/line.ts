// `reflap line`: the racing line inside the track edges for one car, as a summary, a JSON object or a line CSV.

import { Option, type Command } from 'commander';
import { InputError } from '../../errors.js';
import type { Car } from '../../car/types.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { defaultMarginM } from '../../line/corridor.js';
import { lineCsv } from '../../line/line-csv.js';
import { racingLine } from '../../line/racing-line.js';
import { LINE_OBJECTIVES, type LineObjective } from '../../line/types.js';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  loadCar,
  loadTrack,
  numberOption,
  startSpeedMps,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { outputBatch } from '../output.js';
import { racingLineJson, racingLineText } from '../../report/racing-line-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface LineValues extends TrackOptionValues, CarOptionValues, UnitsOptionValues {
  objective?: LineObjective;
  marginM?: string;
  out?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program.command('line').description('compute the racing line inside the track edges for a car');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .addOption(
      new Option('--objective <kind>', 'time: fastest line for this car; curvature: minimum-curvature line')
        .choices([...LINE_OBJECTIVES])
        .default('time'),
    )
    .option('--margin-m <m>', "distance kept from each edge, m (default: half the car's width + 0.3 m, else 0.8)")
    .option('--out <file>', 'write the line as CSV (s_m,offset_m,x_m,y_m,curvature_1pm)')
    .option('--json', 'print one JSON object instead of the summary');
  addUnitsOption(command).action((values: LineValues) => runLine(values));
}

export function marginFrom(value: string | undefined, car: Car): number {
  const marginM = numberOption(value, '--margin-m', defaultMarginM(car));
  if (!(marginM >= 0) || marginM > 20)
    throw new InputError(`option --margin-m: ${marginM} is out of range (0 to 20 m)`);
  return marginM;
}

export function runLine(values: LineValues): void {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const marginM = marginFrom(values.marginM, car);
  const envelope = buildEnvelope(car, ambient);
  const line = racingLine(track, car, {
    objective: values.objective ?? 'time',
    marginM,
    ambient,
    envelope,
    startSpeedMps: startSpeedMps(values),
  });
  const outputs = outputBatch(inputFilesOf(values));
  if (values.out) outputs.add(values.out, lineCsv(line));
  outputs.commit();
  if (values.json) {
    process.stdout.write(JSON.stringify(racingLineJson(line, track, car.name), null, 2) + '\n');
  } else {
    process.stdout.write(racingLineText(line, track, car.name, units));
    if (values.out) process.stdout.write(`Line written to ${values.out}\n`);
  }
}
