// Escaping for the lap report: text from input files goes into HTML and SVG only through these, and the
// data for the page's script is JSON that cannot close its <script> element (OWASP XSS Prevention Cheat Sheet,
// rules 1 and 3.1).

import { neutraliseBidi } from '../../bidi.js';

const HTML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes text for an HTML or SVG text node or a quoted attribute value; bidi controls are shown, not obeyed. */
export function escapeHtml(text: string): string {
  return neutraliseBidi(String(text).replace(/[&<>"']/g, (character) => HTML_ESCAPES[character]!));
}

/**
 * JSON for a <script type="application/json"> element: <, > and & as \u escapes, and the two JS line separators.
 * A bidi control becomes the visible text \u202e (an escaped backslash in the JSON), so that the page's script
 * shows it rather than obeying it.
 */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value).replace(/[<>&\u2028\u2029\u202a-\u202e\u2066-\u2069]/g, (character) => {
    const escape = `\\u${character.charCodeAt(0).toString(16).padStart(4, '0')}`;
    return /[<>&\u2028\u2029]/.test(character) ? escape : `\\${escape}`;
  });
}
