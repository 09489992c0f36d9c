// A note for people whose numbers are quantities in SI rather than text, so a note composed below the report names
// no unit: src/report/note-text.ts writes it in the reader's units (km/h and m, or mph and ft).

/** A distance, m, written to `digits` decimals; or a list of speeds, m/s, written in whole units. */
export type NoteQuantity = { distanceM: number; digits: number } | { speedsMps: readonly number[] };

/** A note as text and quantities in order. */
export interface PhrasedNote {
  parts: (string | NoteQuantity)[];
}

/** A note: plain text where it names no speed or distance, else its parts. */
export type Note = string | PhrasedNote;

export const distanceOf = (distanceM: number, digits = 0): NoteQuantity => ({ distanceM, digits });
export const speedsOf = (speedsMps: readonly number[]): NoteQuantity => ({ speedsMps });

/** A note from a template: note`the log ends ${distanceOf(120)} before the line`; a note inside is spliced in. */
export function note(strings: TemplateStringsArray, ...values: (NoteQuantity | Note | number)[]): PhrasedNote {
  const parts: (string | NoteQuantity)[] = [];
  const text = (value: string) => {
    if (value === '') return;
    const last = parts[parts.length - 1];
    if (typeof last === 'string') parts[parts.length - 1] = last + value;
    else parts.push(value);
  };
  strings.forEach((piece, k) => {
    text(piece);
    if (k >= values.length) return;
    const value = values[k]!;
    if (typeof value === 'string' || typeof value === 'number') text(String(value));
    else if ('parts' in value) for (const part of value.parts) typeof part === 'string' ? text(part) : parts.push(part);
    else parts.push(value);
  });
  return { parts };
}
