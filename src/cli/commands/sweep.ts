// `reflap sweep`: many setups (a full grid or one field at a time) across worker threads, with the lap time
// and every braking point per run, a sensitivity table around the baseline, shards and their merge.

import type { Command } from 'commander';
import { Option } from 'commander';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  numberOption,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import {
  loadSetupInputs,
  setupReference,
  workerCount,
  WORKERS_OPTION_TEXT,
  type SetupOptionValues,
} from '../setup-inputs.js';
import { outputBatch, type OutputBatch } from '../output.js';
import { addPageOutputs, addReportOptions, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { sweepChartSvgs, sweepReportHtml } from '../../report/sweep-page.js';
import { createProgress } from '../progress.js';
import { parseSetting, parseVariation } from '../../sweep/settings.js';
import { parseShard, type SweepMode } from '../../sweep/plan.js';
import { runSweep } from '../../sweep/run-sweep.js';
import { mergeSweepCsv, sweepCsv } from '../../sweep/csv.js';
import { sensitivities, type SweepTable } from '../../sweep/table.js';
import { DEFAULT_MATCH_TOLERANCE_M } from '../../sweep/match-zones.js';
import { InputError } from '../../errors.js';
import { readTextFile } from '../../io/read-text.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { sweepJson, sweepSummaryText } from '../../report/sweep-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import type { DisplayUnits } from '../../report/units.js';

interface SweepValues
  extends Partial<TrackOptionValues>, Partial<CarOptionValues>, ReportOptionValues, UnitsOptionValues {
  vary?: string[];
  set?: string[];
  mode?: SweepMode;
  workers?: string;
  shard?: string;
  merge?: string[];
  out?: string;
  matchM?: string;
  line?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('sweep')
    .description('many setups across worker threads: lap times, braking points and sensitivities');
  addTrackOptions(command);
  addCarOptions(command);
  // --merge needs neither a track nor a car; the action checks them for a sweep.
  for (const option of command.options)
    if (option.long === '--track' || option.long === '--car') option.mandatory = false;
  command
    .option(
      '--vary <field=from:to:step...>',
      'a field to sweep: massKg=600:660:10, tyre.muLat=-10%:+10%:5%, airTempC=10:40:5',
    )
    .option('--set <field=value...>', 'fixed changes for every run, as in whatif')
    .addOption(
      new Option('--mode <mode>', 'every combination, or one field at a time with the others at the baseline')
        .choices(['grid', 'one-at-a-time'])
        .default('grid'),
    )
    .option('--workers <n>', WORKERS_OPTION_TEXT)
    .option('--shard <i/n>', 'run only shard I of N (I from 1), for batch systems; join the CSVs with --merge')
    .option('--merge <files...>', 'join shard CSVs of one sweep into one (no new runs)')
    .option('--out <file>', 'write the runs as CSV (see docs/setup-sweeps.md for the columns)')
    .option(
      '--match-m <m>',
      `largest distance between the slowest points of one corner in two runs, m (default ${DEFAULT_MATCH_TOLERANCE_M})`,
    )
    .option('--json', 'print one JSON object instead of the tables');
  addLineOption(command, true);
  addUnitsOption(command);
  addReportOptions(
    command,
    'the sweep report: one HTML page with lap time and braking-point shift against each field',
  ).action((values: SweepValues) => runSweepCommand(values));
}

function addSweepReport(
  outputs: OutputBatch,
  values: ReportOptionValues,
  table: SweepTable,
  units: DisplayUnits,
): string[] {
  return addPageOutputs(outputs, values, {
    html: () => sweepReportHtml(table, units),
    charts: () => sweepChartSvgs(table, units),
  });
}

export async function runSweepCommand(values: SweepValues): Promise<void> {
  const units = unitsOf(values);
  if (values.merge) {
    if (values.vary || values.shard)
      throw new InputError('sweep --merge joins finished shards; it takes no --vary or --shard');
    const files = values.merge.map((file) => ({ text: readTextFile(file, 'shard CSV', 'table'), source: file }));
    const { csv, table } = mergeSweepCsv(files);
    const outputs = outputBatch(values.merge);
    if (values.out) outputs.add(values.out, csv);
    const reportFiles = addSweepReport(outputs, values, table, units);
    outputs.commit();
    const found = sensitivities(table);
    if (values.json) process.stdout.write(JSON.stringify(sweepJson(table, found, true), null, 2) + '\n');
    else if (values.out)
      process.stdout.write(sweepSummaryText(table, found, true, values.out, units) + reportWrittenText(reportFiles));
    else process.stdout.write(csv);
    return;
  }
  if (!values.track) throw new InputError("sweep: required option '--track <file>' not specified");
  if (!values.car) throw new InputError("sweep: required option '--car <file>' not specified");
  const variations = (values.vary ?? []).map((text) => parseVariation(text));
  if (variations.length === 0)
    throw new InputError('sweep: give at least one --vary FIELD=FROM:TO:STEP (or --merge FILES)');
  const settings = (values.set ?? []).map((text) => parseSetting(text));
  const shard = values.shard ? parseShard(values.shard) : undefined;
  if (shard && !values.out) throw new InputError('sweep --shard: give --out FILE for the shard CSV');
  const workers = workerCount(values.workers);
  const matchToleranceM = numberOption(values.matchM, '--match-m', DEFAULT_MATCH_TOLERANCE_M);
  if (!(matchToleranceM > 0)) throw new InputError(`option --match-m: ${matchToleranceM} must be positive`);
  const inputs = loadSetupInputs(values as SetupOptionValues, settings);
  const { track, base, start } = inputs;
  const reference = setupReference(values as SetupOptionValues, inputs);
  const path = reference.path;
  const progress = createProgress({ label: 'sweep', json: values.json });
  let output;
  try {
    output = await runSweep(
      {
        track,
        base,
        variations,
        mode: values.mode ?? 'grid',
        settings: settings.map((s) => s.text),
        startSpeedMps: start,
        matchToleranceM,
        ...(path ? { path } : {}),
        ...(shard ? { shard } : {}),
      },
      { workers, onProgress: (done, total) => progress.update(done, total) },
    );
  } finally {
    progress.stop();
  }
  const { table, complete } = output;
  const outputs = outputBatch(inputFilesOf(values));
  if (values.out) outputs.add(values.out, sweepCsv(table));
  const reportFiles = addSweepReport(outputs, values, table, units);
  outputs.commit();
  const found = sensitivities(table);
  if (values.json)
    process.stdout.write(
      JSON.stringify({ ...sweepJson(table, found, complete), ...referencePathJson(reference, true) }, null, 2) + '\n',
    );
  else
    process.stdout.write(
      withReferencePath(sweepSummaryText(table, found, complete, values.out, units), reference, true) +
        reportWrittenText(reportFiles),
    );
}
