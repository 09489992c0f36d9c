// What the transient check's driver reads of the reference lap at any station (curvature, speed and the
// acceleration between samples), and the room from the reference line to each edge of the track, against which
// the followed car's deviation is judged.

import { wrapDistanceM } from '../numeric/lap-index.js';
import type { Car } from '../car/types.js';
import type { LapResult } from './types.js';
import type { ReferenceLookup } from './transient-driver.js';

export type DeviationLimitSource = 'track width' | 'track width less half the car' | 'fixed';

const FALLBACK_DEVIATION_LIMIT_M = 1;
/** The least room counted, m, so that a line that grazes the edge still gives a finite share. */
const MIN_ROOM_M = 0.1;

/**
 * The reference as the driver reads it, at any station: curvature linear between samples, the speed with v^2
 * linear between samples (constant acceleration over each segment, as the solver's profile has it) and that
 * acceleration, and the room to each edge of the track.
 */
export function referenceLookup(
  result: LapResult,
  roomLeftM: Float64Array,
  roomRightM: Float64Array,
): ReferenceLookup & { endM: number; roomLeftM(s: number): number; roomRightM(s: number): number } {
  const t = result.trace;
  const n = t.count;
  const d = t.distanceM;
  const closed = t.closed;
  const lengthM = result.lengthM;
  const endM = closed ? lengthM : d[n - 1]!;
  const speedSquared = new Float64Array(n);
  for (let i = 0; i < n; i++) speedSquared[i] = t.speedMps[i]! * t.speedMps[i]!;
  const axMps2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 < n ? i + 1 : closed ? 0 : -1;
    const lengthOfSegment = (i + 1 < n ? d[i + 1]! : lengthM) - d[i]!;
    axMps2[i] =
      j >= 0 && lengthOfSegment > 0
        ? (speedSquared[j]! - speedSquared[i]!) / (2 * lengthOfSegment)
        : i > 0
          ? axMps2[i - 1]!
          : 0;
  }
  let k = 0;
  let next = 1;
  let share = 0;
  const locate = (stationM: number) => {
    let s = stationM;
    if (closed) s = wrapDistanceM(s, lengthM);
    else s = Math.min(Math.max(s, 0), endM);
    while (k > 0 && d[k]! > s) k--;
    while (k < n - 1 && d[k + 1]! <= s) k++;
    next = k + 1 < n ? k + 1 : closed ? 0 : k;
    const endOfSegment = k + 1 < n ? d[k + 1]! : lengthM;
    share = endOfSegment > d[k]! ? (s - d[k]!) / (endOfSegment - d[k]!) : 0;
  };
  const read = (values: Float64Array, stationM: number) => {
    locate(stationM);
    return values[k]! + share * (values[next]! - values[k]!);
  };
  return {
    endM,
    curvaturePerM: (s) => read(t.curvaturePerM, s),
    speedMps: (s) => Math.sqrt(Math.max(0, read(speedSquared, s))),
    axMps2: (s) => {
      locate(s);
      return axMps2[k]!;
    },
    roomLeftM: (s) => read(roomLeftM, s),
    roomRightM: (s) => read(roomRightM, s),
  };
}

/**
 * Room from the reference line to each edge of the track at every sample, less half the car's width where the car
 * file gives it: the track's widths to the left and right of the centreline, moved by the line's offset when the
 * reference drives a racing line. Without widths (or, on a racing line, without its offsets) a fixed limit applies.
 */
export function deviationRoom(
  result: LapResult,
  car: Car,
  fixedLimitM: number | undefined,
  pathOffsetM: Float64Array | undefined,
): { leftM: Float64Array; rightM: Float64Array; source: DeviationLimitSource } {
  const n = result.trace.count;
  const leftM = new Float64Array(n);
  const rightM = new Float64Array(n);
  const track = result.track;
  const onCentreline = result.path.curvaturePerM.every((kappa, i) => Math.abs(kappa - track.curvaturePerM[i]!) < 1e-12);
  const offsets = pathOffsetM ?? (onCentreline ? null : undefined);
  if (fixedLimitM !== undefined || !track.widthLeftM || !track.widthRightM || offsets === undefined) {
    leftM.fill(fixedLimitM ?? FALLBACK_DEVIATION_LIMIT_M);
    rightM.fill(fixedLimitM ?? FALLBACK_DEVIATION_LIMIT_M);
    return { leftM, rightM, source: 'fixed' };
  }
  const halfCarM = car.widthM !== null && car.widthM > 0 ? car.widthM / 2 : 0;
  for (let i = 0; i < n; i++) {
    const offsetM = offsets ? offsets[i]! : 0;
    leftM[i] = Math.max(MIN_ROOM_M, track.widthLeftM[i]! - offsetM - halfCarM);
    rightM[i] = Math.max(MIN_ROOM_M, track.widthRightM[i]! + offsetM - halfCarM);
  }
  return { leftM, rightM, source: halfCarM > 0 ? 'track width less half the car' : 'track width' };
}

/** The reference lap as the transient check reads it: the driver's lookup, the lap's end and the room to each edge. */
export type TransientReference = ReturnType<typeof referenceLookup>;
