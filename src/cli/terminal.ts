// What the CLI prints goes through here: text from the user's files (names of cars, tracks, corners) reaches the
// terminal with its bidirectional-text controls shown as \u escapes rather than obeyed (see src/bidi.ts). JSON on
// stdout stays valid: the escape sits inside a string and reads back as the same character.

import { neutraliseBidi } from '../bidi.js';

let guarded = false;

/** Wraps stdout and stderr once so that every string written is neutralised. */
export function neutraliseTerminalOutput(): void {
  if (guarded) return;
  guarded = true;
  for (const stream of [process.stdout, process.stderr]) {
    const write = stream.write.bind(stream) as (chunk: unknown, ...rest: unknown[]) => boolean;
    stream.write = ((chunk: unknown, ...rest: unknown[]) =>
      write(typeof chunk === 'string' ? neutraliseBidi(chunk) : chunk, ...rest)) as typeof stream.write;
  }
}
