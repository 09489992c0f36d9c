// `reflap check`: validates car, track and telemetry files and collects every problem it can find in each,
// not only the first that would stop a command. Each problem is one line naming the file and the place.
// A kind's reader is imported when the first file of that kind is met, so checking a car file loads neither the
// track nor the log readers (most of the check command's start-up was loading them).

import { closeSync, openSync, readFileSync, readSync } from 'node:fs';
import { decodeText, guardInputFile } from '../io/input-file.js';
import { InputError } from '../errors.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { detectKind, KIND_LABELS, type FileKind } from './detect-kind.js';
import { DEFAULT_TRACK_READ_OPTIONS } from '../io/track-read-options.js';
import { metricNoteText } from '../note.js';

/** A file's problems beyond this many are counted, not listed (a garbage file would print one per row). */
export const MAX_PROBLEMS_PER_FILE = 50;

export interface FileCheck {
  file: string;
  kind: FileKind;
  /** One line each, naming the file and the row, column or field. Empty when the file is fine. */
  problems: string[];
  /** Things worth knowing that are not problems (skipped sentences, guessed units, repeated time stamps). */
  notes: string[];
  /** What was read when the file is fine, e.g. "1,200 m closed track, 1,200 grid points". */
  summary: string | null;
}

export interface CheckReport {
  files: FileCheck[];
  /** True when no file has a problem. */
  ok: boolean;
}

function inputMessage(error: unknown): string {
  if (error instanceof InputError) return error.message;
  throw error;
}

/** The JSON readers join every schema issue with '; ' on one line: one problem each. */
function splitProblems(message: string, source: string): string[] {
  const prefix = `${source}: `;
  const body = message.startsWith(prefix) ? message.slice(prefix.length) : message;
  if (body.includes('not valid JSON')) return [message];
  return body.split('; ').map((part) => (part.startsWith(prefix) ? part : prefix + part));
}

function sessionSummary(kind: FileKind, session: TelemetrySession): string {
  return `${KIND_LABELS[kind]}: ${session.count} samples over ${(session.timeS[session.count - 1]! - session.timeS[0]!).toFixed(1)} s`;
}

/** The cell-by-cell passes, run only on a file its reader refuses (or a log with repeated time stamps). */
const cellPasses = () => import('./collect-cells.js');

function capped(problems: string[], file: string): string[] {
  if (problems.length <= MAX_PROBLEMS_PER_FILE) return problems;
  return [
    ...problems.slice(0, MAX_PROBLEMS_PER_FILE),
    `${file}: ... and ${problems.length - MAX_PROBLEMS_PER_FILE} more problems`,
  ];
}

/** Checks one file's text; `source` names it in messages and its extension helps tell the kind. */
export async function checkText(text: string, source: string): Promise<FileCheck> {
  const kind = detectKind(text.slice(0, 65536), source);
  const result: FileCheck = { file: source, kind, problems: [], notes: [], summary: null };
  if (text.replace(/^\uFEFF/, '').trim() === '') {
    result.problems.push(`${source}: the file is empty`);
    return result;
  }
  if (kind === 'unknown') {
    result.problems.push(
      `${source}: not a file reflap reads: expected a car or segment track (JSON), a centreline CSV (x_m, y_m), or a log (CSV with a time column, NMEA 0183, GPX)`,
    );
    return result;
  }
  if (kind === 'car') {
    const { parseCarJson } = await import('../io/read-car.js');
    try {
      parseCarJson(text, source, 'quick');
    } catch (error) {
      result.problems = splitProblems(inputMessage(error), source);
    }
    if (result.problems.length === 0) result.summary = KIND_LABELS.car;
    return result;
  }
  // The real reader runs first; only a file it refuses is read again cell by cell, to list every problem rather
  // than the first (a good file is parsed once).
  if (kind === 'track-json' || kind === 'track-csv') {
    // A centreline goes straight to its reader, so the segment-track modules stay unloaded.
    const parse =
      kind === 'track-csv'
        ? (await import('../io/track-csv.js')).parseTrackCsv
        : (await import('../io/read-track.js')).parseTrackText;
    try {
      const track = parse(text, source, DEFAULT_TRACK_READ_OPTIONS);
      result.summary = `${KIND_LABELS[kind]}: ${track.closed ? 'closed' : 'open'} track, ${track.lengthM.toFixed(0)} m`;
    } catch (error) {
      const message = inputMessage(error);
      if (kind === 'track-csv') result.problems = (await cellPasses()).centrelineCellProblems(text, source).problems;
      if (result.problems.length === 0)
        result.problems.push(...(kind === 'track-json' ? splitProblems(message, source) : [message]));
    }
    result.problems = capped(result.problems, source);
    return result;
  }
  const { parseTelemetryText } = await import('../io/telemetry/read-telemetry.js');
  try {
    const session = parseTelemetryText(text, source, { columns: {} });
    // Repeated time stamps are a note of the cell pass (it knows their lines); it runs only when the log has one.
    if (kind === 'telemetry-csv' && hasRepeatedTime(session.timeS))
      result.notes.push(...(await cellPasses()).telemetryCellProblems(text, source).notes);
    // check speaks in the units of the files it reads.
    result.notes.push(...session.notes.map(metricNoteText));
    result.summary = sessionSummary(kind, session);
  } catch (error) {
    const message = inputMessage(error);
    if (kind === 'telemetry-csv') {
      const cells = (await cellPasses()).telemetryCellProblems(text, source);
      result.problems = cells.problems;
      result.notes.push(...cells.notes);
    }
    if (result.problems.length === 0) result.problems.push(message);
  }
  result.problems = capped(result.problems, source);
  return result;
}

function hasRepeatedTime(timeS: Float64Array): boolean {
  for (let i = 1; i < timeS.length; i++) if (timeS[i] === timeS[i - 1]) return true;
  return false;
}

/** Files above this are checked by streaming (a log of gigabytes does not fit in one string). */
export const STREAMED_CHECK_BYTES = 128 * 1024 * 1024;

function unreadable(file: string, error: unknown): FileCheck {
  const code = (error as NodeJS.ErrnoException).code;
  const reason =
    code === 'ENOENT'
      ? 'no such file'
      : code === 'EISDIR'
        ? 'is a directory'
        : code === 'EACCES'
          ? 'permission denied'
          : (code ?? 'unreadable');
  return { file, kind: 'unknown', problems: [`${file}: cannot read the file (${reason})`], notes: [], summary: null };
}

/** The first 64 KiB of a file as text, enough to tell its kind. */
function headOf(file: string): string {
  const descriptor = openSync(file, 'r');
  try {
    const bytes = Buffer.alloc(65536);
    return decodeText(bytes.subarray(0, readSync(descriptor, bytes, 0, bytes.length, 0)));
  } finally {
    closeSync(descriptor);
  }
}

/** A large telemetry CSV through the chunked streaming reader: its first problem only, with a note saying so. */
async function checkLargeFile(file: string, limitBytes: number): Promise<FileCheck> {
  const head = headOf(file);
  const kind = detectKind(head, file);
  const result: FileCheck = {
    file,
    kind,
    problems: [],
    notes: [`large file: read by streaming, so only the first problem is listed`],
    summary: null,
  };
  if (kind !== 'telemetry-csv') {
    result.problems.push(
      `${file}: ${KIND_LABELS[kind]} of over ${(limitBytes / 1024 / 1024).toFixed(0)} MB; only telemetry CSV files may be that large`,
    );
    return result;
  }
  const { streamTelemetryCsv } = await import('../io/telemetry/read-telemetry.js');
  try {
    // Chunks are not kept: the reader's own checks are the check, and memory stays flat however large the file.
    const summary = await streamTelemetryCsv(file, { columns: {} }, () => {});
    result.notes.push(...summary.notes);
    result.summary = `${KIND_LABELS[kind]}: ${summary.rows} samples over ${(summary.endTimeS - summary.startTimeS).toFixed(1)} s`;
  } catch (error) {
    result.problems.push(inputMessage(error));
  }
  return result;
}

/** Checks every file; a file that cannot be read is a problem of that file, not the end of the check. */
export async function checkFiles(
  files: readonly string[],
  options: { streamAboveBytes?: number } = {},
): Promise<CheckReport> {
  const streamAboveBytes = options.streamAboveBytes ?? STREAMED_CHECK_BYTES;
  const checks: FileCheck[] = [];
  for (const file of files) {
    let sizeBytes: number;
    try {
      // A FIFO, a device or a folder is refused before it is opened: opening or reading one could block forever.
      sizeBytes = guardInputFile(file, 'file', 'telemetryCsv');
    } catch (error) {
      checks.push({ file, kind: 'unknown', problems: [inputMessage(error)], notes: [], summary: null });
      continue;
    }
    try {
      checks.push(
        sizeBytes > streamAboveBytes
          ? await checkLargeFile(file, streamAboveBytes)
          : await checkText(decodeText(readFileSync(file)), file),
      );
    } catch (error) {
      if (error instanceof InputError) throw error;
      if ((error as NodeJS.ErrnoException).code === undefined) throw error;
      checks.push(unreadable(file, error));
    }
  }
  return { files: checks, ok: checks.every((check) => check.problems.length === 0) };
}
