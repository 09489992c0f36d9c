// `reflap simulate`: the reference lap of a car on a track, as a summary, a JSON object or a trace CSV.

import type { Command } from 'commander';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  loadCar,
  loadTrack,
  startSpeedMps,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { simulate } from '../../solve/simulate.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { traceCsv, type ExtraColumn } from '../../report/trace-csv.js';
import { lapSummaryJson, lapSummaryText, SAFETY_CAUTION } from '../../report/lap-summary.js';
import { outputBatch } from '../output.js';
import { addLineOption, referencePathJson, resolveReferenceLine, withReferencePath } from '../reference-path.js';
import { addReportOptions, addReportOutputs, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { readEnvelopeFile } from '../../io/read-envelope.js';
import { demonstratedEnvelope } from '../../car/demonstrated-envelope.js';
import { bicycleSimulateExtras } from '../simulate-extras.js';
import { InputError } from '../../errors.js';
import { addUncertaintyOption, drawsOption, type UncertaintyOptionValues } from '../uncertainty-options.js';
import { uncertainReference } from '../../uncertainty/uncertain-reference.js';
import { uncertainReferenceText, uncertaintyJson } from '../../report/uncertainty-summary.js';
import { mpsToKph } from '../../units.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface SimulateValues
  extends TrackOptionValues, CarOptionValues, ReportOptionValues, UncertaintyOptionValues, UnitsOptionValues {
  out?: string;
  json?: boolean;
  envelope?: string;
  line?: string;
  checkTransient?: boolean;
}

export function register(program: Command): void {
  const command = program.command('simulate').description('compute the reference lap of a car on a track');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .option('--out <file>', "write the lap trace as CSV ('-' writes it to stdout instead of the summary)")
    .option('--json', 'print one JSON object instead of the summary')
    .option(
      '--envelope <file>',
      "drive on this demonstrated envelope (from `reflap envelope`) instead of the car model's",
    )
    .option(
      '--check-transient',
      'follow the reference with the single-track model and a driver model, and report whether it is drivable',
    );
  addUncertaintyOption(command);
  addLineOption(command);
  addUnitsOption(command);
  addReportOptions(command).action((values: SimulateValues) => runSimulate(values));
}

export async function runSimulate(values: SimulateValues): Promise<void> {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const draws = drawsOption(values);
  if (draws !== null && values.envelope)
    throw new InputError(
      "option --uncertainty draws the car file's uncertain fields; it cannot be combined with --envelope",
    );
  const envelope = values.envelope
    ? demonstratedEnvelope(readEnvelopeFile(values.envelope))
    : buildEnvelope(car, ambient);
  const reference = resolveReferenceLine(track, car, ambient, values.line, {
    envelope,
    startSpeedMps: startSpeedMps(values),
  });
  const result =
    reference.lap ??
    simulate(track, car, { ambient, envelope, startSpeedMps: startSpeedMps(values), path: reference.path });
  const { offsetM, xM, yM } = reference;
  const extraColumns: ExtraColumn[] =
    offsetM && xM && yM
      ? [
          { name: 'offset_m', values: offsetM, digits: 4 },
          { name: 'x_m', values: xM, digits: 3 },
          { name: 'y_m', values: yM, digits: 3 },
        ]
      : [];
  const bicycle = bicycleSimulateExtras(result, car, ambient, values.checkTransient === true, units, offsetM);
  extraColumns.push(...bicycle.columns);
  const uncertainty =
    draws === null
      ? null
      : await uncertainReference(
          { track, car, ambient, path: result.path, startSpeedMps: startSpeedMps(values), nominal: result },
          { draws },
        );
  if (uncertainty) {
    const kph = (values: Float64Array) => values.map(mpsToKph);
    extraColumns.push(
      { name: 'speed_p05_kph', values: kph(uncertainty.speedMps.low), digits: 3 },
      { name: 'speed_median_kph', values: kph(uncertainty.speedMps.median), digits: 3 },
      { name: 'speed_p95_kph', values: kph(uncertainty.speedMps.high), digits: 3 },
    );
  }
  const outputs = outputBatch(inputFilesOf(values));
  const traceToStdout = values.out === '-';
  if (values.out && !traceToStdout) outputs.add(values.out, traceCsv(result, extraColumns, units));
  const reportFiles = addReportOutputs(outputs, values, {
    reference: result,
    carName: car.name,
    envelope,
    ...(xM && yM ? { linePositions: { xM, yM } } : {}),
    ...(uncertainty ? { uncertainty } : {}),
    units,
  });
  outputs.commit();
  if (traceToStdout) {
    // The trace is the whole of stdout, so that it pipes into another tool; the JSON summary cannot share it.
    process.stdout.write(traceCsv(result, extraColumns, units));
  } else if (values.json) {
    process.stdout.write(
      JSON.stringify(
        {
          ...lapSummaryJson(result, car.name),
          ...referencePathJson(reference),
          ...bicycle.json,
          ...(uncertainty ? { uncertainty: uncertaintyJson(uncertainty) } : {}),
        },
        null,
        2,
      ) + '\n',
    );
  } else {
    const summary = withReferencePath(lapSummaryText(result, car.name, units), reference);
    // The band goes with the lap's own figures, before the caution that closes the summary.
    process.stdout.write(
      uncertainty
        ? summary.replace(SAFETY_CAUTION, uncertainReferenceText(uncertainty, units) + '\n' + SAFETY_CAUTION)
        : summary,
    );
    process.stdout.write(bicycle.text);
    if (values.out) process.stdout.write(`Trace written to ${values.out}\n`);
    process.stdout.write(reportWrittenText(reportFiles));
  }
}
