// `reflap session`: every lap of a logged session at once: lap and sector times, each corner across the laps (best,
// median, spread), the session best from the driver's own best corners, and the four answers to "where could my lap
// be" side by side, with the corners ranked by time available and by consistency.

import type { Command } from 'commander';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  loadCar,
  loadTrack,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { outputBatch } from '../output.js';
import { loadSession, type TelemetryOptionValues } from '../telemetry-options.js';
import { compareFromRecords } from '../compare-records.js';
import { addLineOption } from '../reference-path.js';
import { addReportOptions, addReportOutputs, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { sessionReportInput } from '../../report/html/from-session.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { sessionOverview } from '../../compare/session/session-overview.js';
import { sessionJson, sessionText } from '../../report/session-summary.js';
import { cornerTracesCollector } from '../../compare/session/corner-traces.js';
import { cornerRangeM } from '../../report/html/model.js';
import { noteText } from '../../report/note-text.js';

export interface SessionValues
  extends TrackOptionValues, CarOptionValues, TelemetryOptionValues, ReportOptionValues, UnitsOptionValues {
  line?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('session')
    .description('every lap of a logged session: lap and sector times, corners across the laps, the session best');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .requiredOption('--telemetry <file>', 'driver log: CSV with a header, NMEA 0183 (RMC, GGA) or GPX 1.1')
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. speed_kph=GPS Speed,time_s=Time')
    .option('--start-finish <x,y>', "start/finish line position in the track's plane, m (default: the track's start)");
  addLineOption(command);
  command.option('--json', 'print one JSON object instead of the summary');
  addUnitsOption(command);
  addReportOptions(
    command,
    "the session's report (laps, corners across them, every lap's speed and brake per corner, the best lap's charts) as one HTML page",
  ).action((values: SessionValues) => runSession(values));
}

export async function runSession(values: SessionValues): Promise<void> {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  const session = await loadSession(values);
  const comparison = compareFromRecords(track, car, ambient, session, { ...values, lap: undefined });
  // Each corner's small multiple covers the stretch the report zooms to for that corner.
  const windows = comparison.result.corners.map((corner) => {
    const [fromM, toM] = cornerRangeM(corner, track.lengthM);
    return { id: corner.id, fromM, toM };
  });
  const traces = cornerTracesCollector(track, windows, comparison.reference);
  const overview = sessionOverview(
    {
      track,
      session: comparison.session ?? session,
      laps: comparison.laps ?? [],
      reference: comparison.reference,
      envelope: comparison.envelope,
      demonstratedLapTimeS: comparison.demonstratedLap?.lapTimeS ?? null,
    },
    { onLap: (lapNumber, lap) => traces.add(lapNumber, lap) },
  );
  // The laps table lists every lap and why any is left out; the note naming compare's chosen lap does not apply.
  overview.notes.unshift(...comparison.notes.filter((note) => !/^lap \d+ chosen:/.test(noteText(note))));
  const outputs = outputBatch(inputFilesOf(values));
  const report = {
    ...sessionReportInput(comparison, car, ambient, comparison.linePositions),
    session: { overview, cornerTraces: traces.traces },
    units,
  };
  const reportFiles = addReportOutputs(outputs, values, report);
  outputs.commit();
  if (values.json) process.stdout.write(JSON.stringify(sessionJson(overview), null, 2) + '\n');
  else process.stdout.write(sessionText(overview, units) + reportWrittenText(reportFiles));
}
