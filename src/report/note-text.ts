// Notes (src/note.ts) as text in the units a person reads: each distance and list of speeds written with its unit.

import type { Note, NoteQuantity } from '../note.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

function quantityText(quantity: NoteQuantity, units: DisplayUnits): string {
  if ('distanceM' in quantity) return phrasing(units).signedDistance(quantity.distanceM, quantity.digits);
  return `${quantity.speedsMps.map((speedMps) => units.speed(speedMps).toFixed(0)).join(', ')} ${units.speedLabel}`;
}

/** A note's text; km/h and metres unless other units are given (the JSON's notes stay in those). */
export function noteText(note: Note, units: DisplayUnits = displayUnits('metric')): string {
  if (typeof note === 'string') return note;
  return note.parts.map((part) => (typeof part === 'string' ? part : quantityText(part, units))).join('');
}
