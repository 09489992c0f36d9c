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

/** Writes text or bytes atomically: a reader sees the old file or the whole new one, never half of it. */
export function writeFileAtomic(file: string, content: string | Uint8Array, inputFiles: readonly (string | undefined | null)[] = []): void {
  refuseOverwritingInputs(file, inputFiles);
  const folder = dirname(resolve(file));
  mkdirSync(folder, { recursive: true });
  const temporary = join(folder, `.${basename(file)}.tmp-${process.pid}-${Date.now()}`);
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
      for (const { file, content } of pending) writeFileAtomic(file, content, inputFiles);
      pending.length = 0;
    },
  };
}
