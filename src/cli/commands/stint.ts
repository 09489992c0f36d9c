// `reflap stint`: lap after lap with the fuel burning off; the lap times and braking points that drift
// through the stint as the car gets lighter.

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
import { loadSetupInputs, setupReference, workerCount, WORKERS_OPTION_TEXT } from '../setup-inputs.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { runStintInWorkers, type StintResult } from '../../sweep/stint.js';
import { stintCsv, stintJson, stintText } from '../../report/stint-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface StintValues extends TrackOptionValues, CarOptionValues, UnitsOptionValues {
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
    .option('--workers <n>', WORKERS_OPTION_TEXT)
    .option('--out <file>', 'write one CSV row per lap')
    .option('--json', 'print one JSON object instead of the tables');
  addUnitsOption(addLineOption(command, true)).action((values: StintValues) => runStintCommand(values));
}

export async function runStintCommand(values: StintValues): Promise<void> {
  const laps = numberOption(values.laps, '--laps', 1);
  const units = unitsOf(values);
  const workers = workerCount(values.workers);
  const settings = (values.set ?? []).map((text) => parseSetting(text));
  const inputs = loadSetupInputs(values, settings);
  const { track, base, start } = inputs;
  const reference = setupReference(values, inputs);
  const path = reference.path;
  const progress = createProgress({ label: 'stint', json: values.json });
  let result: StintResult;
  try {
    result = await runStintInWorkers(
      { track, base, laps, startSpeedMps: start, ...(path ? { path } : {}) },
      { workers, onProgress: (done, total) => progress.update(done, total) },
    );
  } finally {
    progress.stop();
  }
  if (values.out) writeFileAtomic(values.out, stintCsv(result, units), inputFilesOf(values));
  if (values.json)
    process.stdout.write(
      JSON.stringify({ ...stintJson(result), ...referencePathJson(reference, true) }, null, 2) + '\n',
    );
  else
    process.stdout.write(
      withReferencePath(stintText(result, track.name, base.car.name, units), reference, true) +
        (values.out ? `Laps written to ${values.out}\n` : ''),
    );
}
