// How the lap is shared among the corners and how each corner's time is split: ownership bounds on the straights,
// the time lost on entry, in the middle and on exit (each corner's losses add up to its share of the lap-time gap),
// and the time spent coasting.

import type { CornerSpan } from '../track/corners.js';
import { clockAt } from './delta.js';
import { clampIndex, lastPeakIndex, type LapView } from './lap-samples.js';
import { wrapIndex } from '../numeric/lap-index.js';

/** The split between two corners sits this far before the earlier of the two laps' speed peaks, m. */
const SPLIT_MARGIN_M = 10;

/**
 * Where each corner's stretch begins (unwrapped indices, one more than the corners: bounds[c] to bounds[c + 1]).
 * Between two corners the split sits just before the earlier of the two laps' speed peaks on the straight, so a
 * slow exit is charged to the corner before it and an early lift or brake to the corner after it.
 */
export function ownershipBounds(
  spans: CornerSpan[],
  ref: LapView,
  drv: LapView,
  n: number,
  step: number,
  closed: boolean,
): number[] {
  const count = spans.length;
  if (count === 0) return closed ? [0, n] : [0, n - 1];
  const margin = Math.round(SPLIT_MARGIN_M / step);
  const splitBetween = (exitU: number, entryU: number) => {
    if (entryU <= exitU) return Math.round((exitU + entryU) / 2);
    const peak = Math.min(lastPeakIndex(ref.speedMps, exitU, entryU, n), lastPeakIndex(drv.speedMps, exitU, entryU, n));
    return clampIndex(peak - margin, exitU, entryU);
  };
  const splits: number[] = [];
  for (let c = 0; c + 1 < count; c++) splits.push(splitBetween(spans[c]!.exitIndex, spans[c + 1]!.entryIndex));
  if (!closed) return [0, ...splits, n - 1];
  // The split after the last corner also starts the first corner's stretch, one lap earlier.
  const last = splitBetween(spans[count - 1]!.exitIndex, spans[0]!.entryIndex + n);
  return [last - n, ...splits, last];
}

/**
 * Time lost over the corner's stretch [ownStart, ownEnd] in three phases split at the midpoints between entry, apex
 * and exit; deltaAt(u) is the driver's clock minus the reference's at unwrapped station u.
 */
export function phaseTimesLost(
  span: CornerSpan,
  ownStart: number,
  ownEnd: number,
  deltaAt: (u: number) => number,
): { entryS: number; middleS: number; exitS: number } {
  const entryMid = clampIndex(Math.round((span.entryIndex + span.apexIndex) / 2), ownStart, ownEnd);
  const exitMid = clampIndex(Math.round((span.apexIndex + span.exitIndex) / 2), entryMid, ownEnd);
  return {
    entryS: deltaAt(entryMid) - deltaAt(ownStart),
    middleS: deltaAt(exitMid) - deltaAt(entryMid),
    exitS: deltaAt(ownEnd) - deltaAt(exitMid),
  };
}

export function coastingTime(
  throttle: Float64Array,
  brake: Float64Array,
  timeS: Float64Array,
  lapTimeS: number,
  from: number,
  to: number,
  closed: boolean,
  threshold: number,
): number {
  const n = timeS.length;
  let total = 0;
  for (let u = from; u < to; u++) {
    const i = wrapIndex(u, n);
    if (throttle[i]! <= threshold && brake[i]! <= threshold)
      total += clockAt(timeS, lapTimeS, u + 1, closed) - clockAt(timeS, lapTimeS, u, closed);
  }
  return total;
}
