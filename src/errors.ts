// Errors a user can cause carry the place (file, row, column or field) and end the CLI with exit code 2;
// anything else is an internal error (exit code 1).

/**
 * Control characters quoted from a user's file (a line break in a quoted cell, a stray CR, a right-to-left
 * override) are shown escaped.
 */
function oneLine(message: string): string {
  return message.replace(/[\u0000-\u001f\u007f\u0085\u2028\u2029\u202a-\u202e\u2066-\u2069]/g, (c) =>
    c === '\n'
      ? '\\n'
      : c === '\r'
        ? '\\r'
        : c === '\t'
          ? '\\t'
          : `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`,
  );
}

/** A problem with the user's input: one line, naming the file and the place. */
export class InputError extends Error {
  override readonly name = 'InputError';
  constructor(message: string) {
    super(oneLine(message));
  }
}

export function isInputError(error: unknown): error is InputError {
  return error instanceof InputError;
}

/** Formats "file: row 12, column speed_kph: message" style places consistently across readers. */
export function placeOf(file: string, where?: string): string {
  return where ? `${file}: ${where}` : file;
}
