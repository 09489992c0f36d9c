// Notes (src/note.ts) as text in the units a person reads: each distance and list of speeds written with its unit.

import type { Note, NoteQuantity } from '../note.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

function quantityText(quantity: NoteQuantity, units: DisplayUnits): string {
  if ('distanceM' in quantity) return phrasing(units).signedDistance(quantity.distanceM, quantity.digits);
  if ('fromM' in quantity) {
    const { fromM, toM, digits } = quantity;
    return `${units.distance(fromM).toFixed(digits)} to ${units.distance(toM).toFixed(digits)} ${units.distanceLabel}`;
  }
  if ('perM' in quantity) {
    // A count per metre is a count per distance unit once divided by the unit's length in metres; a foot holds a
    // third as many, so it takes one more decimal to say as much.
    const perUnit = quantity.perM / units.distance(1);
    const digits = quantity.digits + (units.distanceLabel === 'm' ? 0 : 1);
    return `${perUnit.toFixed(digits)} ${quantity.noun} per ${units.distanceLabel === 'm' ? 'metre' : 'foot'}`;
  }
  const speeds = quantity.speedsMps.map((speedMps) => units.speed(speedMps).toFixed(0));
  return `${speeds.join(quantity.separator ?? ', ')} ${units.speedLabel}`;
}

/** A note's text; km/h and metres unless other units are given (the JSON's notes stay in those). */
export function noteText(note: Note, units: DisplayUnits = displayUnits('metric')): string {
  if (typeof note === 'string') return note;
  return note.parts.map((part) => (typeof part === 'string' ? part : quantityText(part, units))).join('');
}
