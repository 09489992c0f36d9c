// The braking point between grid samples: where the accelerating branch of the speed profile meets the
// braking branch, each taken as constant acceleration over its segment (straight lines in v^2 against
// distance, as in the quasi-steady-state method). A sweep reads shifts far smaller than the grid step from it.

import type { BrakingZone, LapResult } from '../solve/types.js';
import { wrapIndex } from '../numeric/lap-index.js';

/**
 * Braking point of `zone`, m along the centreline (station). The brakes come on at sample s, so the two
 * branches cross between samples s - 1 and s + 1 (the segment out of s may still be a mix of both): v^2
 * rises from sample s - 1 at the slope of the segment before it, and falls into sample s + 1 at the slope
 * of the segment after it. Falls back to the zone's sample where the trace has no such segments.
 */
export function brakingPointM(result: LapResult, zone: BrakingZone): number {
  const trace = result.trace;
  const trackLengthM = result.track.lengthM;
  const n = trace.count;
  const s = zone.startIndex;
  const closed = trace.closed;
  if (n < 5 || (!closed && (s < 2 || s + 2 > n - 1))) return zone.startM;
  const at = (i: number) => wrapIndex(i, n);
  const a = at(s - 1);
  const b = at(s + 1);
  const v = trace.speedMps;
  const riseMps2 = trace.axMps2[at(s - 2)]!;
  const fallMps2 = trace.axMps2[b]!;
  // Distances measured forward from sample a, across the start line on a closed lap.
  const forward = (from: Float64Array, to: number, base: number, lap: number) => {
    const d = from[to]! - from[base]!;
    return d >= 0 ? d : d + lap;
  };
  const spanM = forward(trace.distanceM, b, a, result.lengthM);
  const stationSpanM = forward(trace.stationM, b, a, trackLengthM);
  const denominator = 2 * (riseMps2 - fallMps2);
  if (!(spanM > 0) || !(denominator > 1e-9) || !(fallMps2 < 0)) return zone.startM;
  const uA = v[a]! * v[a]!;
  const uB = v[b]! * v[b]!;
  const x = Math.min(spanM, Math.max(0, (uB - uA - 2 * fallMps2 * spanM) / denominator));
  let pointM = trace.stationM[a]! + (x / spanM) * stationSpanM;
  if (closed && pointM >= trackLengthM) pointM -= trackLengthM;
  return pointM;
}
