// `reflap check`: validates car, track and telemetry files and collects every problem it can find in each,
// not only the first that would stop a command. Each problem is one line naming the file and the place.

import { readFileSync } from 'node:fs';
import { InputError } from '../errors.js';
import { parseCarJson } from '../io/read-car.js';
import { parseTrackText } from '../io/read-track.js';
import { parseTelemetryText } from '../io/telemetry/read-telemetry.js';
import { detectKind, KIND_LABELS, type FileKind } from './detect-kind.js';
import { centrelineCellProblems, telemetryCellProblems } from './collect-cells.js';

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

const TRACK_DEFAULTS = { stepM: 1, columns: {}, widthM: null, layout: 'auto' as const, smoothingM: null };

function inputMessage(error: unknown): string {
  if (error instanceof InputError) return error.message;
  throw error;
}

/** The car reader joins every schema issue with '; ' after the file name: one problem each. */
function carProblems(text: string, source: string): string[] {
  try {
    parseCarJson(text, source);
    return [];
  } catch (error) {
    const message = inputMessage(error);
    const prefix = `${source}: `;
    const body = message.startsWith(prefix) ? message.slice(prefix.length) : message;
    if (body.startsWith('not valid JSON')) return [message];
    return body.split('; ').map((part) => prefix + part);
  }
}

function capped(problems: string[], file: string): string[] {
  if (problems.length <= MAX_PROBLEMS_PER_FILE) return problems;
  return [...problems.slice(0, MAX_PROBLEMS_PER_FILE), `${file}: ... and ${problems.length - MAX_PROBLEMS_PER_FILE} more problems`];
}

/** Checks one file's text; `source` names it in messages and its extension helps tell the kind. */
export function checkText(text: string, source: string): FileCheck {
  const kind = detectKind(text.slice(0, 65536), source);
  const result: FileCheck = { file: source, kind, problems: [], notes: [], summary: null };
  if (text.replace(/^\uFEFF/, '').trim() === '') {
    result.problems.push(`${source}: the file is empty`);
    return result;
  }
  if (kind === 'unknown') {
    result.problems.push(`${source}: not a file reflap reads: expected a car or segment track (JSON), a centreline CSV (x_m, y_m), or a log (CSV with a time column, NMEA 0183, GPX)`);
    return result;
  }
  if (kind === 'car') {
    result.problems = carProblems(text, source);
    if (result.problems.length === 0) result.summary = KIND_LABELS.car;
    return result;
  }
  if (kind === 'track-json' || kind === 'track-csv') {
    if (kind === 'track-csv') result.problems = centrelineCellProblems(text, source).problems;
    if (result.problems.length === 0) {
      try {
        const track = parseTrackText(text, source, TRACK_DEFAULTS);
        result.summary = `${KIND_LABELS[kind]}: ${track.closed ? 'closed' : 'open'} track, ${track.lengthM.toFixed(0)} m`;
      } catch (error) {
        result.problems.push(inputMessage(error));
      }
    }
    result.problems = capped(result.problems, source);
    return result;
  }
  if (kind === 'telemetry-csv') {
    const cells = telemetryCellProblems(text, source);
    result.problems = cells.problems;
    result.notes.push(...cells.notes);
  }
  if (result.problems.length === 0) {
    try {
      const session = parseTelemetryText(text, source, { columns: {} });
      result.notes.push(...session.notes);
      result.summary = `${KIND_LABELS[kind]}: ${session.count} samples over ${(session.timeS[session.count - 1]! - session.timeS[0]!).toFixed(1)} s`;
    } catch (error) {
      result.problems.push(inputMessage(error));
    }
  }
  result.problems = capped(result.problems, source);
  return result;
}

function readText(file: string): string | FileCheck {
  try {
    return readFileSync(file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' ? 'permission denied' : (code ?? 'unreadable');
    return { file, kind: 'unknown', problems: [`${file}: cannot read the file (${reason})`], notes: [], summary: null };
  }
}

/** Checks every file; a file that cannot be read is a problem of that file, not the end of the check. */
export function checkFiles(files: readonly string[]): CheckReport {
  const checks = files.map((file) => {
    const text = readText(file);
    return typeof text === 'string' ? checkText(text, file) : text;
  });
  return { files: checks, ok: checks.every((check) => check.problems.length === 0) };
}
