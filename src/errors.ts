// Errors a user can cause carry the place (file, row, column or field) and end the CLI with exit code 2;
// anything else is an internal error (exit code 1).

/** A problem with the user's input: one line, naming the file and the place. */
export class InputError extends Error {
  override readonly name = 'InputError';
  constructor(message: string) {
    super(message);
  }
}

export function isInputError(error: unknown): error is InputError {
  return error instanceof InputError;
}

/** Formats "file: row 12, column speed_kph: message" style places consistently across readers. */
export function placeOf(file: string, where?: string): string {
  return where ? `${file}: ${where}` : file;
}
