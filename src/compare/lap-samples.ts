// Reading one lap's channels on the track's distance grid at unwrapped station indices (a closed lap wraps around):
// values between stations, the minimum and slowest point of a stretch, and where a straight's speed peak ends.

import { wrapIndex } from '../numeric/lap-index.js';

/** The channels of one lap (the driver's or the reference) that the corner-by-corner comparison reads. */
export interface LapView {
  speedMps: Float64Array;
  timeS: Float64Array;
  lapTimeS: number;
  brake: Float64Array;
}

/** Speed tolerance that decides where a straight's speed peak ends, m/s (covers logger noise). */
const PEAK_TOLERANCE_MPS = 0.5;

export const clampIndex = (value: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, value));

export function minimumOver(
  values: Float64Array,
  from: number,
  to: number,
  n: number,
): { value: number; index: number } {
  let value = Infinity;
  let index = from;
  for (let u = from; u <= to; u++) {
    const v = values[wrapIndex(u, n)]!;
    if (v < value) {
      value = v;
      index = u;
    }
  }
  return { value, index };
}

/** Speed within this of the minimum counts as the same slowest stretch, m/s (a constant-radius arc, logger noise). */
const SLOWEST_TOLERANCE_MPS = 0.15;

/** The slowest point of [from, to]: the minimum, placed at the middle of the stretch around it that stays that slow. */
export function slowestPoint(
  values: Float64Array,
  from: number,
  to: number,
  n: number,
): { value: number; index: number } {
  const min = minimumOver(values, from, to, n);
  const limit = min.value + SLOWEST_TOLERANCE_MPS;
  let lo = min.index;
  let hi = min.index;
  while (lo > from && values[wrapIndex(lo - 1, n)]! <= limit) lo--;
  while (hi < to && values[wrapIndex(hi + 1, n)]! <= limit) hi++;
  return { value: min.value, index: Math.round((lo + hi) / 2) };
}

/** Last index of [from, to] whose speed is within the tolerance of the stretch's peak: where the lap stops gaining. */
export function lastPeakIndex(speed: Float64Array, from: number, to: number, n: number): number {
  let peak = -Infinity;
  for (let u = from; u <= to; u++) peak = Math.max(peak, speed[wrapIndex(u, n)]!);
  let last = from;
  for (let u = from; u <= to; u++) if (speed[wrapIndex(u, n)]! >= peak - PEAK_TOLERANCE_MPS) last = u;
  return last;
}
