// `reflap stint`: lap after lap with the fuel burning off; the lap times and braking points that drift
// through the stint as the car gets lighter.

import { zoneLabel } from '../../track/corner-layout.js';
import type { Command } from 'commander';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  numberOption,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { writeFileAtomic } from '../output.js';
import { createProgress } from '../progress.js';
import { parseSetting } from '../../sweep/settings.js';
import { loadSetupInputs, setupReference, workerCount } from '../setup-inputs.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { runStintInWorkers, type StintResult } from '../../sweep/stint.js';
import { DIGITS } from '../../sweep/table.js';
import { formatTable } from '../../report/text-table.js';
import { SAFETY_CAUTION } from '../../report/lap-summary.js';
import { formatLapTime } from '../../units.js';

interface StintValues extends TrackOptionValues, CarOptionValues {
  laps: string;
  set?: string[];
  workers?: string;
  out?: string;
  line?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('stint')
    .description('lap by lap with the fuel burning off: lap times and braking points through a stint');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .requiredOption(
      '--laps <n>',
      'number of laps; each starts with one lap of fuel (fuel.burnKgPerLap) less than the one before',
    )
    .option('--set <field=value...>', 'changes to the car first, as in whatif (e.g. fuel.massKg=60)')
    .option('--workers <n>', 'worker threads (default: the number of cores; 0 = in this thread)')
    .option('--out <file>', 'write one CSV row per lap')
    .option('--json', 'print one JSON object instead of the tables');
  addLineOption(command, true).action((values: StintValues) => runStintCommand(values));
}

const fmt = (value: number, digits: number) => (Number.isFinite(value) ? value.toFixed(digits) : '');
const signed = (value: number, digits: number) =>
  Number.isFinite(value) ? `${value >= 0 ? '+' : ''}${value.toFixed(digits)}` : '-';

export function stintCsv(result: StintResult): string {
  const header = [
    'lap',
    'fuel_kg',
    'lap_time_s',
    ...result.corners.flatMap((c) => [`${c.tag}_brake_m`, `${c.tag}_min_kph`]),
  ];
  const rows = result.laps.map((lap) =>
    [
      String(lap.lap),
      String(lap.fuelKg),
      fmt(lap.lapTimeS, DIGITS.lapTimeS),
      ...lap.brakingPointM.flatMap((m, k) => [fmt(m, DIGITS.brakingPointM), fmt(lap.minSpeedKph[k]!, DIGITS.speedKph)]),
    ].join(','),
  );
  return [header.join(','), ...rows].join('\n') + '\n';
}

export function stintJson(result: StintResult) {
  const nan = (v: number) => (Number.isFinite(v) ? v : null);
  return {
    corners: result.corners,
    emptyFromLap: result.emptyFromLap,
    totalTimeS: Number(result.totalTimeS.toFixed(DIGITS.lapTimeS)),
    laps: result.laps.map((lap) => ({
      ...lap,
      brakingPointM: lap.brakingPointM.map(nan),
      minSpeedKph: lap.minSpeedKph.map(nan),
    })),
  };
}

export function stintText(result: StintResult, trackName: string, carName: string): string {
  const first = result.laps[0]!;
  const last = result.laps[result.laps.length - 1]!;
  const lines = [
    `${trackName} · ${carName} · stint of ${result.laps.length} laps, ${formatLapTime(result.totalTimeS)} in all`,
    '',
    formatTable(
      ['lap', 'fuel kg', 'lap time', 'to lap 1 s'],
      result.laps.map((lap) => [
        String(lap.lap),
        lap.fuelKg.toFixed(1),
        formatLapTime(lap.lapTimeS),
        signed(lap.lapTimeS - first.lapTimeS, 3),
      ]),
    ),
    '',
    `Braking points, lap 1 against lap ${last.lap} (negative = earlier)`,
    formatTable(
      ['corner', 'slowest at m', `lap 1 brake m`, `lap ${last.lap} brake m`, 'drift m', 'slowest km/h'],
      result.corners.map((corner, k) => [
        zoneLabel(corner),
        corner.minSpeedAtM.toFixed(0),
        fmt(first.brakingPointM[k]!, 1),
        fmt(last.brakingPointM[k]!, 1) || 'no braking',
        signed(last.brakingPointM[k]! - first.brakingPointM[k]!, 1),
        `${fmt(first.minSpeedKph[k]!, 1)} -> ${fmt(last.minSpeedKph[k]!, 1)}`,
      ]),
    ),
  ];
  if (result.emptyFromLap !== null)
    lines.push(
      '',
      `The tank is empty from lap ${result.emptyFromLap} on (fuel.massKg / fuel.burnKgPerLap); later laps run at zero fuel.`,
    );
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}

export async function runStintCommand(values: StintValues): Promise<void> {
  const laps = numberOption(values.laps, '--laps', 1);
  const workers = workerCount(values.workers);
  const settings = (values.set ?? []).map((text) => parseSetting(text));
  const inputs = loadSetupInputs(values, settings);
  const { track, base, start } = inputs;
  const reference = setupReference(values, inputs);
  const path = reference.path;
  const progress = createProgress({ label: 'stint', json: values.json });
  let result: StintResult;
  try {
    // Fewer laps than a worker takes to start are quicker in this thread.
    result = await runStintInWorkers(
      { track, base, laps, startSpeedMps: start, ...(path ? { path } : {}) },
      { workers: laps < 8 ? 0 : workers, onProgress: (done, total) => progress.update(done, total) },
    );
  } finally {
    progress.stop();
  }
  if (values.out) writeFileAtomic(values.out, stintCsv(result), inputFilesOf(values));
  if (values.json)
    process.stdout.write(
      JSON.stringify({ ...stintJson(result), ...referencePathJson(reference, true) }, null, 2) + '\n',
    );
  else
    process.stdout.write(
      withReferencePath(stintText(result, track.name, base.car.name), reference, true) +
        (values.out ? `Laps written to ${values.out}\n` : ''),
    );
}
