// `reflap demo`: an invented driver's lap on the bundled demo circuit with the bundled demo car, logged at 20 Hz
// with sensor and GPS noise, written to ./out/, then compared against the reference lap, from any folder.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Command } from 'commander';
import { loadCar, loadTrack, numberOption } from '../options.js';
import { outputBatch } from '../output.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { demoDriver, demoLogCsv, DEFAULT_DEMO_LOG } from '../../demo/demo-driver.js';
import { parseTelemetryText } from '../../io/telemetry/read-telemetry.js';
import { compareSummaryText } from '../../report/compare-summary.js';
import { compareFromRecords, comparisonFiles } from '../compare-records.js';
import { addReportOptions, addReportOutputs, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { sessionReportInput } from '../../report/html/from-session.js';
import { resolveReferenceLine, withReferencePath } from '../reference-path.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { noteText } from '../../report/note-text.js';
import type { Note } from '../../note.js';

export const DEMO_TRACK = 'tracks/velmora-downs.json';
export const DEMO_CAR = 'cars/tarnfell-gt.json';

interface DemoValues extends ReportOptionValues, UnitsOptionValues {
  out: string;
  seed?: string;
}

/** The installed package's root: the nearest folder above this module with reflap's package.json. */
export function packageRoot(): string {
  let folder = path.dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const manifest = path.join(folder, 'package.json');
    if (existsSync(manifest)) {
      try {
        if ((JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'reflap') return folder;
      } catch {
        // not ours; keep climbing
      }
    }
    const parent = path.dirname(folder);
    if (parent === folder)
      throw new Error(
        'cannot find the reflap package folder (with cars/ and tracks/) above ' + fileURLToPath(import.meta.url),
      );
    folder = parent;
  }
}

export function register(program: Command): void {
  const command = program
    .command('demo')
    .description(
      'make an invented driver lap on the demo circuit, write it to ./out/ and compare it with the reference',
    )
    .option('--out <dir>', 'folder for the demo files', 'out')
    .option('--seed <n>', 'seed of the logging noise (same seed, same files)');
  // --html defaults to report.html in the demo folder.
  addUnitsOption(command);
  addReportOptions(command).action((values: DemoValues) => runDemo(values));
}

export function runDemo(values: DemoValues): void {
  const units = unitsOf(values);
  const root = packageRoot();
  const trackFile = path.join(root, DEMO_TRACK);
  const carFile = path.join(root, DEMO_CAR);
  const track = loadTrack({ track: trackFile });
  const { car, ambient } = loadCar({ car: carFile });
  const envelope = buildEnvelope(car, ambient);
  // The reference drives the racing line (the default); the invented driver a line of its own that uses the track.
  const referencePath = resolveReferenceLine(track, car, ambient, undefined, { envelope });
  const lap = demoDriver(track, car, ambient, envelope, referencePath.offsetM);
  const seed = numberOption(values.seed, '--seed', DEFAULT_DEMO_LOG.seed);
  const csv = demoLogCsv(track, lap, { ...DEFAULT_DEMO_LOG, seed });
  const logFile = path.join(values.out, 'demo-lap.csv');
  const session = parseTelemetryText(csv, logFile, { columns: {} });
  const comparison = compareFromRecords(track, car, ambient, session, {}, referencePath);
  const outputs = outputBatch([trackFile, carFile]);
  outputs.add(logFile, csv);
  for (const { file, content } of comparisonFiles(comparison, values.out, units)) outputs.add(file, content);
  const reportOptions = {
    html: values.html ?? path.join(values.out, 'report.html'),
    ...(values.svg ? { svg: values.svg } : {}),
  };
  const reportFiles = addReportOutputs(outputs, reportOptions, {
    ...sessionReportInput(comparison, car, ambient, comparison.linePositions),
    units,
  });
  outputs.commit();
  const faults = lap.faults
    .map((f) => `${f.kind.replace(/-/g, ' ')} at corner ${f.cornerId}${f.cornerName ? ` (${f.cornerName})` : ''}`)
    .join('; ');
  process.stdout.write(
    `Demo: an invented driver in the ${car.name} on ${track.name}, logged at ${DEFAULT_DEMO_LOG.rateHz} Hz with sensor and GPS noise.\n` +
      `The driver drives a line of its own that uses the track (the racing line's shape, not quite all its width).\n` +
      `The driver model's faults: ${faults}.\n` +
      `Log written to ${logFile}; aligned traces and corner table in ${values.out}/.\n\n`,
  );
  process.stdout.write(
    withReferencePath(
      compareSummaryText({ ...comparison.result, notes: demoNotes(comparison.result.notes) }, undefined, units),
      comparison.referencePath,
    ),
  );
  process.stdout.write('\n' + reportWrittenText(reportFiles).replace(/\n$/, ' (open it in a browser)\n'));
  process.stdout.write(
    `\nTo run this comparison yourself: reflap compare --track ${trackFile} --car ${carFile} --telemetry ${logFile}\n`,
  );
}

/**
 * The demo's invented session starts and ends mid-lap as a real one does; the notes meant for a real log's partial
 * laps ("lap 0 left out ...") become one line that says what they are.
 */
export function demoNotes(notes: readonly Note[]): Note[] {
  const partial = notes.filter((note) => /^lap \d+ left out/.test(noteText(note))).length;
  const rest = notes.filter((note) => !/^lap \d+ (left out|chosen)/.test(noteText(note)));
  if (partial === 0) return rest;
  return [
    `the invented session has an out lap and an in lap around the timed lap; ${partial === 1 ? 'the partial lap is' : 'both are'} left out`,
    ...rest,
  ];
}
