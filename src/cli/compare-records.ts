// What `compare` and `demo` share: the comparison from already-read records (the reference path resolved, an
// envelope file read where given) and the files `--out DIR` writes.

import path from 'node:path';
import { startSpeedMps, type CarOptionValues, type TrackOptionValues } from './options.js';
import { lapOption, startFinishOption, type TelemetryOptionValues } from './telemetry-options.js';
import type { ReportOptionValues } from './html-options.js';
import type { UncertaintyOptionValues } from './uncertainty-options.js';
import type { UnitsOptionValues } from './units-option.js';
import { resolveReferenceLine } from './reference-path.js';
import { compareSession, type SessionComparison } from '../compare/compare-session.js';
import { readEnvelopeFile } from '../io/read-envelope.js';
import { alignedTracesCsv, type AlignedOtherLap } from '../report/aligned-traces-csv.js';
import { comparisonCornersCsv } from '../report/comparison-corners-csv.js';
import { displayUnits, type DisplayUnits } from '../report/units.js';
import type { ReferenceLine } from '../line/reference-line.js';
import { demonstratedEnvelope } from '../car/demonstrated-envelope.js';
import type { Ambient, Car } from '../car/types.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';

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
  /** The reference's path where the caller has already resolved `values.line` (the demo drives its own line). */
  resolved?: ReferenceLine,
): CliComparison {
  const lap = values.lap !== undefined ? lapOption(values as TelemetryOptionValues) : undefined;
  const startFinish = values.startFinish !== undefined ? startFinishOption(values as TelemetryOptionValues) : undefined;
  const envelopeRecord = values.envelope ? readEnvelopeFile(values.envelope) : undefined;
  const start = values.track ? startSpeedMps(values as TrackOptionValues) : 0;
  // The line is optimised on the envelope the reference drives: the demonstrated one where --envelope gives it.
  const reference =
    resolved ??
    resolveReferenceLine(track, car, ambient, values.line, {
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

/** Files `--out DIR` writes: the aligned traces (with the other lap of `--against`, where given) and the corner table. */
export function comparisonFiles(
  comparison: SessionComparison,
  dir: string,
  units: DisplayUnits = displayUnits('metric'),
  other: AlignedOtherLap | null = null,
): { file: string; content: string }[] {
  return [
    {
      file: path.join(dir, 'aligned.csv'),
      content: alignedTracesCsv(comparison.result, comparison.reference, comparison.lap, other, units),
    },
    { file: path.join(dir, 'corners.csv'), content: comparisonCornersCsv(comparison, units) },
  ];
}
