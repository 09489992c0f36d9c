// Whether an unknown value read from a file or handed to the library is a plain record of named fields: the
// first question every validator asks before it looks at a field.

/** True for an object that is neither null nor an array. */
export const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);
