// Output sets are written whole or not at all: every file goes to a temporary file beside its target, and only
// when all are written are they renamed into place; a failed rename puts back what the set had replaced. An
// output that would overwrite one of the command's inputs is refused, and the environment's refusals (a
// read-only folder, a full disk, a target that is a folder) are the user's to fix: one line, exit 2.

import * as fs from 'node:fs';
import { dirname, resolve, basename, join } from 'node:path';
import { InputError } from '../errors.js';
import { onInterrupt } from './interrupt.js';

/** The file-system calls the commit makes, replaceable so that tests can make one of them fail. */
export interface OutputFileSystem {
  writeFileSync(file: string, content: string | Uint8Array, options: { flag: string }): void;
  renameSync(from: string, to: string): void;
  linkSync(existing: string, link: string): void;
}

const NODE_FILE_SYSTEM: OutputFileSystem = {
  writeFileSync: (file, content, options) => fs.writeFileSync(file, content, options),
  renameSync: (from, to) => fs.renameSync(from, to),
  linkSync: (existing, link) => fs.linkSync(existing, link),
};

const WRITE_REASONS: Record<string, string> = {
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  EROFS: 'read-only file system',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'disk quota exceeded',
  EFBIG: 'file too large for the file system',
  EISDIR: 'is a folder',
  ENOTDIR: 'a part of the path is not a folder',
  ENOENT: 'no such folder',
  ENAMETOOLONG: 'name too long',
  ELOOP: 'too many symbolic links',
  EXDEV: 'crosses file systems',
  EBUSY: 'busy',
  EIO: 'input/output error',
  EMFILE: 'too many open files',
  ENFILE: 'too many open files',
};

/** System folders whose entries are not files: writing there is never what the user meant. */
const SYSTEM_FOLDERS = ['/proc', '/sys', '/dev'];

/** An error the operating system raised while writing `file`, as one line naming the path; other errors pass. */
export function asWriteError(error: unknown, file: string): unknown {
  if (error instanceof InputError) return error;
  const code = (error as NodeJS.ErrnoException | null)?.code;
  if (typeof code !== 'string' || !/^E[A-Z]+$/.test(code)) return error;
  return new InputError(`${file}: cannot write the output (${WRITE_REASONS[code] ?? code})`);
}

function canonical(file: string): string {
  const absolute = resolve(file);
  try {
    return fs.realpathSync(absolute);
  } catch {
    return absolute;
  }
}

/** Throws an InputError when `outFile` names one of `inputFiles`. */
export function refuseOverwritingInputs(outFile: string, inputFiles: readonly (string | undefined | null)[]): void {
  const target = canonical(outFile);
  for (const input of inputFiles) {
    if (input && fs.existsSync(input) && canonical(input) === target) {
      throw new InputError(`${outFile}: refusing to write the output over an input file; choose another --out`);
    }
  }
}

/** Refuses a target that cannot be a plain output file, before anything is written. */
function refuseUnwritableTarget(file: string): void {
  const target = canonical(file);
  if (SYSTEM_FOLDERS.some((folder) => target === folder || target.startsWith(`${folder}/`))) {
    throw new InputError(`${file}: cannot write the output (${target.split('/')[1]} is a system folder)`);
  }
  let stats: fs.Stats;
  try {
    stats = fs.statSync(target);
  } catch {
    return; // a new file
  }
  if (stats.isDirectory()) throw new InputError(`${file}: cannot write the output (is a folder)`);
  if (!stats.isFile()) throw new InputError(`${file}: cannot write the output (not a regular file)`);
}

const SCRATCH_NAME = /^\.(.+)\.(tmp|bak)-(\d+)-\d+$/;
let scratchCount = 0;

function scratchBeside(file: string, kind: 'tmp' | 'bak'): string {
  return join(dirname(resolve(file)), `.${basename(file)}.${kind}-${process.pid}-${++scratchCount}`);
}

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes temporary and backup files that an earlier run left beside `file` when it was killed outright
 * (SIGKILL, a power cut). Only files whose process is gone are touched, so a concurrent run keeps its own.
 */
function removeStaleScratch(file: string): void {
  const folder = dirname(resolve(file));
  let names: string[];
  try {
    names = fs.readdirSync(folder);
  } catch {
    return;
  }
  for (const name of names) {
    const match = SCRATCH_NAME.exec(name);
    if (!match || match[1] !== basename(file)) continue;
    const pid = Number(match[3]);
    if (pid !== process.pid && !processAlive(pid)) fs.rmSync(join(folder, name), { force: true });
  }
}

function makeFolder(file: string): void {
  try {
    fs.mkdirSync(dirname(resolve(file)), { recursive: true });
  } catch (error) {
    // mkdir reports a file standing where a folder of the path should be as EEXIST.
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') throw Object.assign(error as Error, { code: 'ENOTDIR' });
    throw error;
  }
}

function removeQuietly(file: string): void {
  try {
    fs.rmSync(file, { force: true });
  } catch {
    // Nothing more can be done; the clean-up of the other files goes on.
  }
}

/** Collects several outputs and commits them only when all were produced, so a failure leaves none behind. */
export interface OutputBatch {
  add(file: string, content: string | Uint8Array): void;
  commit(): void;
}

interface Placed {
  file: string;
  temporary: string;
  /** A hard link to (or copy of) the file this output replaced, kept until the whole set is in place. */
  backup: string | null;
}

/** Moves every written temporary file into place, or, on a failure, restores every target as it was. */
function placeAll(placed: Placed[], fileSystem: OutputFileSystem): void {
  const renamed: Placed[] = [];
  try {
    for (const entry of placed) {
      if (fs.existsSync(entry.file)) {
        const backup = scratchBeside(entry.file, 'bak');
        try {
          fileSystem.linkSync(entry.file, backup);
        } catch {
          fs.copyFileSync(entry.file, backup); // a file system without hard links
        }
        entry.backup = backup;
      }
      fileSystem.renameSync(entry.temporary, entry.file);
      renamed.push(entry);
    }
  } catch (error) {
    for (const entry of renamed.reverse()) {
      try {
        if (entry.backup) fs.renameSync(entry.backup, entry.file);
        else fs.rmSync(entry.file, { force: true });
      } catch {
        // Restoring one target failed; the others are still restored.
      }
    }
    throw asWriteError(error, placed[renamed.length]?.file ?? placed[0]!.file);
  }
}

export function outputBatch(
  inputFiles: readonly (string | undefined | null)[] = [],
  fileSystem: OutputFileSystem = NODE_FILE_SYSTEM,
): OutputBatch {
  const pending: { file: string; content: string | Uint8Array }[] = [];
  return {
    add(file, content) {
      refuseOverwritingInputs(file, inputFiles);
      refuseUnwritableTarget(file);
      pending.push({ file, content });
    },
    commit() {
      const placed: Placed[] = [];
      const removeScratch = () => {
        for (const entry of placed) {
          removeQuietly(entry.temporary);
          if (entry.backup) removeQuietly(entry.backup);
        }
      };
      // The commit is synchronous, so a Ctrl-C arriving meanwhile is handled once it has finished or rolled
      // back; the clean-up then finds nothing left to remove, and the process ends by the signal.
      const release = onInterrupt(removeScratch);
      try {
        for (const { file, content } of pending) {
          refuseUnwritableTarget(file);
          removeStaleScratch(file);
          const entry: Placed = { file, temporary: scratchBeside(file, 'tmp'), backup: null };
          try {
            makeFolder(file);
            placed.push(entry);
            fileSystem.writeFileSync(entry.temporary, content, { flag: 'wx' });
          } catch (error) {
            throw asWriteError(error, file);
          }
        }
        placeAll(placed, fileSystem);
        pending.length = 0;
      } finally {
        removeScratch();
        release();
      }
    },
  };
}

/** Writes text or bytes atomically: a reader sees the old file or the whole new one, never half of it. */
export function writeFileAtomic(
  file: string,
  content: string | Uint8Array,
  inputFiles: readonly (string | undefined | null)[] = [],
): void {
  const batch = outputBatch(inputFiles);
  batch.add(file, content);
  batch.commit();
}
