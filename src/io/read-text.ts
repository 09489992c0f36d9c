// Reads a whole input file as text, turning the operating system's refusal into one line that names the file.

import { readFileSync } from 'node:fs';
import { InputError } from '../errors.js';

const REASONS: Record<string, string> = {
  ENOENT: 'no such file',
  EISDIR: 'is a directory',
  EACCES: 'permission denied',
  EPERM: 'permission denied',
};

/** `what` names the kind of file for the message, e.g. 'car file'. */
export function readTextFile(file: string, what: string): string {
  try {
    return readFileSync(file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? '';
    throw new InputError(`${file}: cannot read the ${what} (${REASONS[code] ?? (code || 'unreadable')})`);
  }
}
