// The braking point between grid samples: where the accelerating branch of the speed profile meets the
// braking branch, each taken as constant acceleration over its segment (straight lines in v^2 against
// distance, as in the quasi-steady-state method). A sweep reads shifts far smaller than the grid step from it.

import type { BrakingZone, LapResult } from '../solve/types.js';
import type { LapTimeResult } from '../solve/simulate.js';
import { wrapIndex } from '../numeric/lap-index.js';

/**
 * Braking point of `zone`, m along the centreline (station), on a lap in full or in the solver's lap-time mode
 * (both carry the speeds and the path they were driven on). The brakes come on at sample s, so the two
 * branches cross between samples s - 1 and s + 1 (the segment out of s may still be a mix of both): v^2
 * rises from sample s - 1 at the slope of the segment before it, and falls into sample s + 1 at the slope
 * of the segment after it. Falls back to the zone's sample where the lap has no such segments.
 */
export function brakingPointM(lap: LapResult | LapTimeResult, zone: BrakingZone): number {
  const v = 'trace' in lap ? lap.trace.speedMps : lap.speedMps;
  const { closed, segmentLengthM } = lap.path;
  const trackLengthM = lap.track.lengthM;
  const stationM = lap.track.distanceM;
  const n = v.length;
  const s = zone.startIndex;
  if (n < 5 || (!closed && (s < 2 || s + 2 > n - 1))) return zone.startM;
  const at = (i: number) => wrapIndex(i, n);
  const a = at(s - 1);
  const middle = at(s);
  const b = at(s + 1);
  const before = at(s - 2);
  // Constant acceleration over a segment: (v_out^2 - v_in^2) / (2 ds), as the trace's ax has it.
  const riseMps2 = (v[a]! * v[a]! - v[before]! * v[before]!) / (2 * segmentLengthM[before]!);
  const after = at(s + 2);
  const fallMps2 = (v[after]! * v[after]! - v[b]! * v[b]!) / (2 * segmentLengthM[b]!);
  const spanM = segmentLengthM[a]! + segmentLengthM[middle]!;
  let stationSpanM = stationM[b]! - stationM[a]!;
  if (stationSpanM < 0) stationSpanM += trackLengthM;
  const denominator = 2 * (riseMps2 - fallMps2);
  if (!(spanM > 0) || !(denominator > 1e-9) || !(fallMps2 < 0)) return zone.startM;
  const uA = v[a]! * v[a]!;
  const uB = v[b]! * v[b]!;
  const x = Math.min(spanM, Math.max(0, (uB - uA - 2 * fallMps2 * spanM) / denominator));
  let pointM = stationM[a]! + (x / spanM) * stationSpanM;
  if (closed && pointM >= trackLengthM) pointM -= trackLengthM;
  return pointM;
}
