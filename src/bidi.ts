// Bidirectional-text controls (Unicode UAX #9: embeddings, overrides and isolates, U+202A-U+202E and
// U+2066-U+2069) reorder the characters around them on screen, so a name from a file could make a terminal line
// or a report read differently from what it holds. Where text from a file is shown, they are written as visible
// \u escapes instead.

export const BIDI_CONTROLS = /[\u202a-\u202e\u2066-\u2069]/g;

/** `text` with every bidi control written as its \u escape. */
export function neutraliseBidi(text: string): string {
  return text.replace(BIDI_CONTROLS, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
