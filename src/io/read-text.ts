// Reads a whole input file as text: a regular file within its kind's size limit (input-file.ts), the operating
// system's refusal turned into one line that names the file.

import { readGuardedText, type InputKind } from './input-file.js';

/** `what` names the kind of file for the message, e.g. 'car file'. */
export function readTextFile(file: string, what: string, kind: InputKind): string {
  return readGuardedText(file, what, kind);
}
