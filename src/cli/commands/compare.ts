// `reflap compare`: a driver's logged lap against the reference lap of the same car in the same conditions,
// corner by corner, as a table and ranked findings, a JSON object, and the aligned traces as CSV.

import path from 'node:path';
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
import { outputBatch } from '../output.js';
import {
  addTelemetryOptions,
  lapOption,
  loadSession,
  startFinishOption,
  type TelemetryOptionValues,
} from './telemetry-options.js';
import { compareSession, type SessionComparison } from '../../compare/compare-session.js';
import { readEnvelopeFile } from '../../io/read-envelope.js';
import { alignedTracesCsv, compareSummaryJson, compareSummaryText } from '../../report/compare-summary.js';
import { addLineOption, referencePathJson, resolveReferenceLine, withReferencePath } from '../reference-path.js';
import type { ReferenceLine } from '../../line/reference-line.js';
import { demonstratedEnvelope } from '../../car/demonstrated-envelope.js';
import type { Ambient, Car } from '../../car/types.js';
import type { TrackGrid } from '../../track/types.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { addReportOptions, addReportOutputs, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { sessionReportInput } from '../../report/html/from-session.js';
import { InputError } from '../../errors.js';
import { addUncertaintyOption, drawsOption, type UncertaintyOptionValues } from '../uncertainty-options.js';
import { uncertainComparison } from '../../uncertainty/uncertain-reference.js';
import { uncertaintyJson } from '../../report/uncertainty-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { displayUnits, type DisplayUnits } from '../../report/units.js';
import { kphToMps } from '../../units.js';

export interface CompareValues
  extends
    TrackOptionValues,
    CarOptionValues,
    TelemetryOptionValues,
    ReportOptionValues,
    UncertaintyOptionValues,
    UnitsOptionValues {
  line?: string;
  envelope?: string;
  json?: boolean;
  out?: string;
}

export function register(program: Command): void {
  const command = program
    .command('compare')
    .description("compare a driver's logged lap with the reference lap of the same car, corner by corner");
  addTrackOptions(command);
  addCarOptions(command);
  addTelemetryOptions(command);
  addLineOption(command);
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
  addReportOptions(command).action((values: CompareValues) => runCompare(values));
}

/** A comparison, with the path the reference drove and the positions of its line where it drove one. */
export type CliComparison = SessionComparison & {
  referencePath: ReferenceLine;
  linePositions?: { xM: Float64Array; yM: Float64Array };
};

/** The comparison from already-read records, shared by `compare` and `demo`. */
export function compareFromRecords(
  track: TrackGrid,
  car: Car,
  ambient: Ambient,
  session: TelemetrySession,
  values: Partial<CompareValues>,
): CliComparison {
  const lap = values.lap !== undefined ? lapOption(values as TelemetryOptionValues) : undefined;
  const startFinish = values.startFinish !== undefined ? startFinishOption(values as TelemetryOptionValues) : undefined;
  const envelopeRecord = values.envelope ? readEnvelopeFile(values.envelope) : undefined;
  const start = values.track ? startSpeedMps(values as TrackOptionValues) : 0;
  // The line is optimised on the envelope the reference drives: the demonstrated one where --envelope gives it.
  const reference = resolveReferenceLine(track, car, ambient, values.line, {
    startSpeedMps: start,
    ...(envelopeRecord ? { envelope: demonstratedEnvelope(envelopeRecord) } : {}),
  });
  const comparison = compareSession(track, car, session, {
    ambient,
    ...(lap !== undefined ? { lap } : {}),
    ...(startFinish ? { startFinish } : {}),
    ...(reference.path ? { path: reference.path } : {}),
    ...(envelopeRecord ? { envelopeRecord } : {}),
    startSpeedMps: start,
  });
  const { xM, yM } = reference;
  return { ...comparison, referencePath: reference, ...(xM && yM ? { linePositions: { xM, yM } } : {}) };
}

/** Files `--out DIR` writes: the aligned traces and the corner table. */
export function comparisonFiles(
  comparison: SessionComparison,
  dir: string,
  units: DisplayUnits = displayUnits('metric'),
): { file: string; content: string }[] {
  return [
    {
      file: path.join(dir, 'aligned.csv'),
      content: alignedTracesCsv(comparison.result, comparison.reference, comparison.lap),
    },
    { file: path.join(dir, 'corners.csv'), content: cornersCsv(comparison, units) },
  ];
}

function cornersCsv(comparison: SessionComparison, units: DisplayUnits): string {
  const rows = compareSummaryJson(comparison.result).corners;
  const columns = [
    'id',
    'name',
    'entryM',
    'apexM',
    'exitM',
    'brakingPointDeltaM',
    'brakingPointDeltaS',
    'entrySpeedDriverKph',
    'entrySpeedReferenceKph',
    'minSpeedDriverKph',
    'minSpeedReferenceKph',
    'minSpeedDeltaKph',
    'minSpeedOffsetFromApexM',
    'exitSpeedDriverKph',
    'exitSpeedReferenceKph',
    'entryTimeLostS',
    'middleTimeLostS',
    'exitTimeLostS',
    'timeLostS',
    'coastingS',
    'meanGripUse',
    'peakGripUse',
  ] as const;
  const cell = (value: unknown) =>
    value === null || value === undefined
      ? ''
      : typeof value === 'string'
        ? `"${value.replace(/"/g, '""')}"`
        : String(value);
  // The corner table is read by people: speeds and distances in the chosen units, the unit in each column name.
  const shown = columns.map((column) => displayColumn(column, units));
  return (
    [
      shown.map((c) => c.name).join(','),
      ...rows.map((row) => columns.map((column, k) => cell(shown[k]!.value(row[column]))).join(',')),
    ].join('\n') + '\n'
  );
}

export async function runCompare(values: CompareValues): Promise<void> {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const draws = drawsOption(values);
  if (draws !== null && values.envelope)
    throw new InputError(
      "option --uncertainty draws the car file's uncertain fields; it cannot be combined with --envelope",
    );
  const session = await loadSession(values);
  const comparison = compareFromRecords(track, car, ambient, session, values);
  const uncertainty =
    draws === null
      ? null
      : await uncertainComparison(comparison, car, ambient, { draws, startSpeedMps: startSpeedMps(values) });
  const outputs = outputBatch(inputFilesOf(values));
  if (values.out)
    for (const { file, content } of comparisonFiles(comparison, values.out, units)) outputs.add(file, content);
  const report = sessionReportInput(comparison, car, ambient, comparison.linePositions);
  const reportFiles = addReportOutputs(outputs, values, uncertainty ? { ...report, uncertainty } : report);
  outputs.commit();
  if (values.json) {
    process.stdout.write(
      JSON.stringify(
        {
          ...compareSummaryJson(comparison.result),
          ...referencePathJson(comparison.referencePath),
          ...(uncertainty ? { uncertainty: uncertaintyJson(uncertainty) } : {}),
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
    if (values.out) process.stdout.write(`Aligned traces and corner table written to ${values.out}\n`);
    process.stdout.write(reportWrittenText(reportFiles));
  }
}

/** A corner-table column in the chosen units: `...Kph` becomes `...Mph` and `...M` becomes `...Ft` in imperial. */
function displayColumn(column: string, units: DisplayUnits): { name: string; value: (v: unknown) => unknown } {
  const convert = (suffix: string, to: string, factor: (x: number) => number, digits: number) => ({
    name: column.slice(0, -suffix.length) + to,
    value: (v: unknown) => (typeof v === 'number' ? Number(factor(v).toFixed(digits)) : v),
  });
  if (units.system === 'imperial' && column.endsWith('Kph'))
    return convert('Kph', 'Mph', (kph) => units.speed(kphToMps(kph)), 2);
  if (units.system === 'imperial' && column.endsWith('M')) return convert('M', 'Ft', units.distance, 1);
  return { name: column, value: (v) => v };
}
