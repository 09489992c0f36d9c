// Linear interpolation: between two values, and between the samples of a closed lap at a fractional index.

import { wrapIndex } from './lap-index.js';

/** The value a share t of the way from a to b (t = 0 gives a, t = 1 gives b). */
export function lerp(a: number, b: number, t: number): number {
  return a + t * (b - a);
}

/** The value at fractional sample index u of a closed lap of n samples, linear between the samples either side. */
export function interpolateOnLap(values: ArrayLike<number>, u: number, n: number): number {
  const lo = Math.floor(u);
  return lerp(values[wrapIndex(lo, n)]!, values[wrapIndex(lo + 1, n)]!, u - lo);
}
