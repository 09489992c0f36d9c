// Every number reflap prints or writes is finite: the writers check a lap before formatting it, and a NaN or an
// Infinity there is a fault of reflap (inputs are checked against plausible ranges at the edge), reported as an
// internal error that names the quantity instead of a silent "n/a" or an empty cell.

import type { LapResult } from '../solve/types.js';

/** A result that is not a finite number where one is required: an internal error, exit 1. */
export class NonFiniteResult extends Error {
  override readonly name = 'NonFiniteResult';
}

/** `value`, or a NonFiniteResult naming `quantity`. */
export function requireFinite(value: number, quantity: string): number {
  if (!Number.isFinite(value)) throw new NonFiniteResult(`the result's ${quantity} is not a finite number (${value})`);
  return value;
}

function requireFiniteArray(values: ArrayLike<number>, quantity: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) {
      throw new NonFiniteResult(`the result's ${quantity} at sample ${i} is not a finite number (${values[i]})`);
    }
  }
}

/** Checks every number of a lap that the writers use. The corner limit is infinite on a straight and is left out. */
export function requireFiniteLap(result: LapResult): LapResult {
  requireFinite(result.lapTimeS, 'lap time, s');
  requireFinite(result.lengthM, 'lap length, m');
  requireFinite(result.maxSpeedMps, 'top speed, m/s');
  requireFinite(result.minSpeedMps, 'lowest speed, m/s');
  const t = result.trace;
  const channels = { timeS: t.timeS, speedMps: t.speedMps, axMps2: t.axMps2, ayMps2: t.ayMps2, gripUse: t.gripUse };
  for (const [name, values] of Object.entries(channels)) requireFiniteArray(values, `trace ${name}`);
  result.brakingZones.forEach((zone, index) => {
    requireFinite(zone.entrySpeedMps, `braking zone ${index + 1} entry speed, m/s`);
    requireFinite(zone.minSpeedMps, `braking zone ${index + 1} lowest speed, m/s`);
  });
  return result;
}
