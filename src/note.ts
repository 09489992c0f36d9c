// A note for people whose numbers are quantities in SI rather than text, so a note composed below the report names
// no unit: src/report/note-text.ts writes it in the reader's units (km/h and m, or mph and ft).

/**
 * A distance, m, written to `digits` decimals; a range of distances, m, written 'from to to' with the unit once; a
 * list of speeds, m/s, written in whole units with `separator` between them (', ' unless given) and the unit once
 * after the last; or a count of things per metre of track (`noun` names them), written to `digits` decimals per
 * metre or per foot.
 */
export type NoteQuantity =
  | { distanceM: number; digits: number }
  | { fromM: number; toM: number; digits: number }
  | { speedsMps: readonly number[]; separator?: string }
  | { perM: number; digits: number; noun: string };

/** A note as text and quantities in order. */
export interface PhrasedNote {
  parts: (string | NoteQuantity)[];
}

/** A note: plain text where it names no speed or distance, else its parts. */
export type Note = string | PhrasedNote;

export const distanceOf = (distanceM: number, digits = 0): NoteQuantity => ({ distanceM, digits });
export const distanceRangeOf = (fromM: number, toM: number, digits = 0): NoteQuantity => ({ fromM, toM, digits });
export const speedsOf = (speedsMps: readonly number[], separator?: string): NoteQuantity =>
  separator === undefined ? { speedsMps } : { speedsMps, separator };
export const densityOf = (perM: number, digits: number, noun: string): NoteQuantity => ({ perM, digits, noun });

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

/** Notes one after another with a separator between them ('; '), as one note. */
export function joinNotes(notes: readonly Note[], separator: string): Note {
  return notes.reduce<Note>((joined, next, k) => (k === 0 ? next : note`${joined}${separator}${next}`), '');
}

/**
 * A note's text in metres and km/h, for the places below the report that must say it in words: an `InputError`
 * echoes the input files, which are metric. The report writes notes for people (src/report/note-text.ts). Speeds
 * are km/h = m/s x 3.6, written out here: this module shares the lowest floor with units.ts and imports nothing.
 */
export function metricNoteText(note: Note): string {
  if (typeof note === 'string') return note;
  return note.parts
    .map((part) => {
      if (typeof part === 'string') return part;
      if ('distanceM' in part) return `${part.distanceM.toFixed(part.digits)} m`;
      if ('fromM' in part) return `${part.fromM.toFixed(part.digits)} to ${part.toM.toFixed(part.digits)} m`;
      if ('perM' in part) return `${part.perM.toFixed(part.digits)} ${part.noun} per metre`;
      return `${part.speedsMps.map((speedMps) => (speedMps * 3.6).toFixed(0)).join(part.separator ?? ', ')} km/h`;
    })
    .join('');
}
