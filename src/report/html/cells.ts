// Table cells and summary tiles every report page shares: numbers with a dash for a missing value, signed
// differences with a true minus sign, and a corner's number badge with its name. Input text goes through escapeHtml.

import { escapeHtml } from './escape.js';

export const fixed = (value: number | null | undefined, digits: number): string =>
  value === null || value === undefined || !Number.isFinite(value) ? '–' : value.toFixed(digits);
export const signed = (value: number | null | undefined, digits: number): string =>
  value === null || value === undefined || !Number.isFinite(value)
    ? '–'
    : `${value > 0 ? '+' : value < 0 ? '−' : '±'}${Math.abs(value).toFixed(digits)}`;

export function tile(label: string, value: string, note = ''): string {
  return `<div class="tile"><div class="tile-label">${escapeHtml(label)}</div><div class="tile-value">${escapeHtml(value)}</div>${note ? `<div class="tile-note">${escapeHtml(note)}</div>` : ''}</div>`;
}

export function cornerCell(id: number | string, name: string | null): string {
  return `<td class="corner-id"><span class="badge">${id}</span>${name ? ` ${escapeHtml(name)}` : ''}</td>`;
}
