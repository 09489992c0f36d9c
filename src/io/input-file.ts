// Inputs are opened only when they are regular files, and only up to a size stated per kind of file
// (docs/robustness.md), checked before a byte is read: a FIFO, a device such as /dev/zero or a folder is refused
// at once instead of hanging the command or filling memory.

import { closeSync, constants, fstatSync, openSync, readFileSync, statSync, type Stats } from 'node:fs';
import { InputError } from '../errors.js';

const MIB = 1024 * 1024;

/** The largest file of each kind reflap reads, bytes. */
export const INPUT_LIMIT_BYTES = {
  /** A car or an envelope is a page of JSON; 1 MiB is hundreds of times the largest useful one. */
  car: 1 * MIB,
  envelope: 16 * MIB,
  /** A centreline at 0.1 m over 100 km is about 40 MB of CSV. */
  track: 64 * MIB,
  line: 64 * MIB,
  /** Sweep parts to merge and setup lists. */
  table: 256 * MIB,
  /** NMEA and GPX logs are read whole; a day of 10 Hz NMEA is about 80 MB. */
  gpsLog: 256 * MIB,
  /** Telemetry CSV is streamed; the limit keeps a session that `compare` holds in memory within a few GB. */
  telemetryCsv: 4096 * MIB,
} as const;

export type InputKind = keyof typeof INPUT_LIMIT_BYTES;

const READ_REASONS: Record<string, string> = {
  ENOENT: 'no such file',
  ENOTDIR: 'a part of the path is not a folder',
  EISDIR: 'is a folder',
  EACCES: 'permission denied',
  EPERM: 'permission denied',
  ELOOP: 'too many symbolic links',
  ENAMETOOLONG: 'name too long',
  EIO: 'input/output error',
};

export function readFailure(file: string, what: string, error: unknown): InputError {
  const code = (error as NodeJS.ErrnoException).code ?? '';
  return new InputError(`${file}: cannot read the ${what} (${READ_REASONS[code] ?? (code || 'unreadable')})`);
}

function kindOfNode(stats: Stats): string {
  if (stats.isDirectory()) return 'is a folder';
  if (stats.isFIFO()) return 'is a pipe (FIFO), not a regular file';
  if (stats.isCharacterDevice() || stats.isBlockDevice()) return 'is a device, not a regular file';
  if (stats.isSocket()) return 'is a socket, not a regular file';
  return 'not a regular file';
}

function megabytes(bytes: number): string {
  return `${(bytes / MIB).toFixed(bytes < 10 * MIB ? 1 : 0)} MiB`;
}

/** Throws the one-line refusal when `stats` is not a regular file of at most the kind's limit. */
function refuseUnlessReadable(file: string, what: string, kind: InputKind, stats: Stats): void {
  if (!stats.isFile()) throw new InputError(`${file}: cannot read the ${what} (${kindOfNode(stats)})`);
  const limit = INPUT_LIMIT_BYTES[kind];
  if (stats.size > limit) {
    throw new InputError(
      `${file}: the ${what} is ${megabytes(stats.size)}, over the ${megabytes(limit)} a ${what} may have`,
    );
  }
}

/** Checks, without opening it, that `file` is a regular file within its kind's limit; returns its size. */
export function guardInputFile(file: string, what: string, kind: InputKind): number {
  let stats: Stats;
  try {
    stats = statSync(file);
  } catch (error) {
    throw readFailure(file, what, error);
  }
  refuseUnlessReadable(file, what, kind, stats);
  return stats.size;
}

/**
 * Reads a whole input as UTF-8 text. The file is opened without blocking (a FIFO opened for reading would wait
 * for a writer) and checked through its descriptor, so what is checked is what is read.
 */
export function readGuardedText(file: string, what: string, kind: InputKind): string {
  let descriptor: number;
  try {
    descriptor = openSync(file, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (error) {
    throw readFailure(file, what, error);
  }
  try {
    refuseUnlessReadable(file, what, kind, fstatSync(descriptor));
    return readFileSync(descriptor, 'utf8');
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw readFailure(file, what, error);
  } finally {
    closeSync(descriptor);
  }
}

/** Whether bytes start with the UTF-16 little-endian byte order mark (FF FE), as some loggers export. */
export function isUtf16Le(bytes: Uint8Array): boolean {
  return bytes[0] === 0xff && bytes[1] === 0xfe;
}

/** Text of a file's bytes: UTF-16 LE where its byte order mark says so (as the CSV reader takes it), else UTF-8. */
export function decodeText(bytes: Buffer): string {
  return isUtf16Le(bytes) ? bytes.subarray(2).toString('utf16le') : bytes.toString('utf8');
}
