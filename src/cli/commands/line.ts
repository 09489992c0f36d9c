// `reflap line`: the racing line inside the track edges for one car, as a summary, a JSON object or a line CSV.

import { Option, type Command } from 'commander';
import { InputError } from '../../errors.js';
import type { Car } from '../../car/types.js';
import type { TrackGrid } from '../../track/types.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { defaultMarginM } from '../../line/corridor.js';
import { lineCsv } from '../../line/line-csv.js';
import { racingLine } from '../../line/racing-line.js';
import { LINE_OBJECTIVES, type LineObjective, type RacingLine } from '../../line/types.js';
import { SAFETY_CAUTION } from '../../report/lap-summary.js';
import { roundToDigits } from '../../numeric/round.js';
import { formatLapTime } from '../../units.js';
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

interface LineValues extends TrackOptionValues, CarOptionValues {
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
    .option('--json', 'print one JSON object instead of the summary')
    .action((values: LineValues) => runLine(values));
}

export function marginFrom(value: string | undefined, car: Car): number {
  const marginM = numberOption(value, '--margin-m', defaultMarginM(car));
  if (!(marginM >= 0) || marginM > 20)
    throw new InputError(`option --margin-m: ${marginM} is out of range (0 to 20 m)`);
  return marginM;
}

export function lineSummaryJson(line: RacingLine, track: TrackGrid, carName: string) {
  return {
    track: track.name,
    car: carName,
    objective: line.objective,
    marginM: roundToDigits(line.marginM, 3),
    lapTimeCentrelineS: roundToDigits(line.centrelineLap.lapTimeS, 4),
    lapTimeLineS: roundToDigits(line.lap.lapTimeS, 4),
    lapTimeCurvatureLineS: roundToDigits(line.curvatureLineLapTimeS, 4),
    gainS: roundToDigits(line.centrelineLap.lapTimeS - line.lap.lapTimeS, 4),
    lengthM: roundToDigits(line.lengthM, 2),
    centrelineLengthM: roundToDigits(track.lengthM, 2),
    minRadiusM: Number.isFinite(line.minRadiusM) ? roundToDigits(line.minRadiusM, 2) : null,
    minRadiusAtM: roundToDigits(line.minRadiusAtM, 1),
    maxOffsetM: roundToDigits(line.maxOffsetM, 3),
    lapsDriven: line.lapEvaluations,
  };
}

export function lineSummaryText(line: RacingLine, track: TrackGrid, carName: string): string {
  const gain = line.centrelineLap.lapTimeS - line.lap.lapTimeS;
  const radius = Number.isFinite(line.minRadiusM)
    ? `${line.minRadiusM.toFixed(1)} m at ${line.minRadiusAtM.toFixed(0)} m`
    : 'none (straight)';
  return [
    `${track.name} · ${carName} · ${line.objective} line, ${line.marginM.toFixed(2)} m from the edges`,
    `Lap on the centreline   ${formatLapTime(line.centrelineLap.lapTimeS)}`,
    `Lap on the line         ${formatLapTime(line.lap.lapTimeS)}  (${gain >= 0 ? '-' : '+'}${Math.abs(gain).toFixed(3)} s)`,
    `Line length             ${line.lengthM.toFixed(1)} m (centreline ${track.lengthM.toFixed(1)} m)`,
    `Tightest radius         ${radius}`,
    `Largest offset          ${line.maxOffsetM.toFixed(2)} m`,
    '',
    SAFETY_CAUTION,
    '',
  ].join('\n');
}

export function runLine(values: LineValues): void {
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
    process.stdout.write(JSON.stringify(lineSummaryJson(line, track, car.name), null, 2) + '\n');
  } else {
    process.stdout.write(lineSummaryText(line, track, car.name));
    if (values.out) process.stdout.write(`Line written to ${values.out}\n`);
  }
}
