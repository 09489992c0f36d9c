// `reflap compare`: a driver's logged lap against the reference lap of the same car in the same conditions,
// corner by corner, as a table and ranked findings, a JSON object, and the aligned traces as CSV.

import type { Command } from 'commander';
import { addCarOptions, addTrackOptions, inputFilesOf, loadCar, loadTrack, startSpeedMps } from '../options.js';
import { outputBatch } from '../output.js';
import { addTelemetryOptions, loadSession, startFinishOption } from '../telemetry-options.js';
import { compareFromRecords, comparisonFiles, type CompareValues } from '../compare-records.js';
import { compareSummaryJson, compareSummaryText } from '../../report/compare-summary.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { addReportOptions, addReportOutputs, reportWrittenText } from '../html-options.js';
import { sessionReportInput } from '../../report/html/from-session.js';
import { InputError } from '../../errors.js';
import { addUncertaintyOption, drawsOption } from '../uncertainty-options.js';
import { uncertainComparison } from '../../uncertainty/uncertain-reference.js';
import { uncertaintyJson } from '../../report/uncertainty-summary.js';
import { addUnitsOption, unitsOf } from '../units-option.js';
import {
  addAgainstOptions,
  againstFromOptions,
  readAgainstOptions,
  type AgainstOptionValues,
} from '../against-options.js';
import { againstJson, againstSummaryText } from '../../report/against-summary.js';
import { driverLine } from '../../compare/driver-line/driver-line.js';
import { estimatedPedal } from '../../compare/estimated-pedal.js';
import { lineJson, lineSummaryText } from '../../report/line-summary.js';

export function register(program: Command): void {
  const command = program
    .command('compare')
    .description("compare a driver's logged lap with the reference lap of the same car, corner by corner");
  addTrackOptions(command);
  addCarOptions(command);
  addTelemetryOptions(command);
  addLineOption(command);
  addAgainstOptions(command);
  command
    .option(
      '--envelope <file>',
      "use this demonstrated envelope (from `reflap envelope`) for the reference instead of the car model's",
    )
    .option('--json', 'print one JSON object instead of the summary')
    .option(
      '--out <dir>',
      'write the aligned traces (aligned.csv) and the corner table (corners.csv) into this folder',
    );
  addUncertaintyOption(command);
  addUnitsOption(command);
  addReportOptions(command).action((values: CompareValues & AgainstOptionValues) => runCompare(values));
}

export async function runCompare(values: CompareValues & AgainstOptionValues): Promise<void> {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const draws = drawsOption(values);
  if (draws !== null && values.envelope)
    throw new InputError(
      "option --uncertainty draws the car file's uncertain fields; it cannot be combined with --envelope",
    );
  const session = await loadSession(values);
  const againstRequest = await readAgainstOptions(values);
  const comparison = compareFromRecords(track, car, ambient, session, values);
  const paired = againstRequest && againstFromOptions(track, comparison, againstRequest, startFinishOption(values));
  const against = paired?.result ?? null;
  const line = driverLine({
    track,
    lap: comparison.lap,
    brake: comparison.lap.brake ?? estimatedPedal(comparison.lap, comparison.envelope, 'brake'),
    referenceLine: comparison.linePositions ?? null,
    other: paired?.other ?? null,
    fromGps: Boolean(comparison.session?.geoOrigin),
  });
  const uncertainty =
    draws === null
      ? null
      : await uncertainComparison(comparison, car, ambient, { draws, startSpeedMps: startSpeedMps(values) });
  const outputs = outputBatch([...inputFilesOf(values), ...(values.against ? [values.against] : [])]);
  if (values.out)
    for (const { file, content } of comparisonFiles(
      comparison,
      values.out,
      units,
      paired ? { lap: paired.other, driverDeltaS: paired.result.deltaS } : null,
    ))
      outputs.add(file, content);
  const report = {
    ...sessionReportInput(comparison, car, ambient, comparison.linePositions),
    ...(uncertainty ? { uncertainty } : {}),
    ...(paired ? { against: { result: paired.result, other: paired.other } } : {}),
    units,
  };
  const reportFiles = addReportOutputs(outputs, values, report);
  outputs.commit();
  if (values.json) {
    process.stdout.write(
      JSON.stringify(
        {
          ...compareSummaryJson(comparison.result),
          ...referencePathJson(comparison.referencePath),
          ...(uncertainty ? { uncertainty: uncertaintyJson(uncertainty) } : {}),
          ...(against ? { against: againstJson(against) } : {}),
          ...(line ? { line: lineJson(line) } : {}),
        },
        null,
        2,
      ) + '\n',
    );
  } else {
    process.stdout.write(
      withReferencePath(
        compareSummaryText(comparison.result, uncertainty ?? undefined, units),
        comparison.referencePath,
      ),
    );
    if (against) process.stdout.write('\n' + againstSummaryText(against, units));
    if (line) process.stdout.write('\n' + lineSummaryText(line, units));
    if (values.out) process.stdout.write(`Aligned traces and corner table written to ${values.out}\n`);
    process.stdout.write(reportWrittenText(reportFiles));
  }
}
