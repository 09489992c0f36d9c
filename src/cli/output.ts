// Output files are written whole or not at all: into a temporary file beside the target, then renamed.
// An output that would overwrite one of the command's inputs is refused.

import { mkdirSync, renameSync, rmSync, writeFileSync, realpathSync, existsSync } from 'node:fs';
import { dirname, resolve, basename, join } from 'node:path';
import { InputError } from '../errors.js';

function canonical(file: string): string {
  const absolute = resolve(file);
  try {
    return realpathSync(absolute);
  } catch {
    return absolute;
  }
}

/** Throws an InputError when `outFile` names one of `inputFiles`. */
export function refuseOverwritingInputs(outFile: string, inputFiles: readonly (string | undefined | null)[]): void {
  const target = canonical(outFile);
  for (const input of inputFiles) {
    if (input && existsSync(input) && canonical(input) === target) {
      throw new InputError(`${outFile}: refusing to write the output over an input file; choose another --out`);
    }
  }
}

function temporaryBeside(file: string): string {
  const folder = dirname(resolve(file));
  mkdirSync(folder, { recursive: true });
  return join(folder, `.${basename(file)}.tmp-${process.pid}-${Date.now()}`);
}

/** Writes text or bytes atomically: a reader sees the old file or the whole new one, never half of it. */
export function writeFileAtomic(
  file: string,
  content: string | Uint8Array,
  inputFiles: readonly (string | undefined | null)[] = [],
): void {
  refuseOverwritingInputs(file, inputFiles);
  const temporary = temporaryBeside(file);
  try {
    writeFileSync(temporary, content);
    renameSync(temporary, file);
  } catch (error) {
    rmSync(temporary, { force: true });
    throw error;
  }
}

/** Collects several outputs and commits them only when all were produced, so a failure leaves none behind. */
export interface OutputBatch {
  add(file: string, content: string | Uint8Array): void;
  commit(): void;
}

export function outputBatch(inputFiles: readonly (string | undefined | null)[] = []): OutputBatch {
  const pending: { file: string; content: string | Uint8Array }[] = [];
  return {
    add(file, content) {
      refuseOverwritingInputs(file, inputFiles);
      pending.push({ file, content });
    },
    commit() {
      // Every file is written in full beside its target first; only then are they renamed into place, so a
      // failure while writing (a full disk, a folder that cannot be made) leaves none of them behind.
      const written: { temporary: string; file: string }[] = [];
      try {
        for (const { file, content } of pending) {
          const temporary = temporaryBeside(file);
          written.push({ temporary, file });
          writeFileSync(temporary, content);
        }
      } catch (error) {
        for (const { temporary } of written) rmSync(temporary, { force: true });
        throw error;
      }
      for (const { temporary, file } of written) renameSync(temporary, file);
      pending.length = 0;
    },
  };
}
