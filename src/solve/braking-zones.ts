// Braking zones of a lap: each place where the brakes come on, the entry speed there, and the slowest point
// that follows. These are the braking points a driver is compared against.

import type { BrakingZone, LapTrace } from './types.js';

export interface BrakingZoneOptions {
  /** Brake share above which the brakes count as on (0-1). */
  brakeThreshold: number;
  /** Gaps in braking shorter than this join one zone, m. */
  mergeGapM: number;
  /** Zones that take off less speed than this are ignored, m/s. */
  minSpeedDropMps: number;
}

/** Rises smaller than this do not end the fall towards the slowest point, m/s (solver and sensor ripple). */
const PLATEAU_RISE_MPS = 0.01;
/** Samples within this of the minimum speed form its plateau, m/s. */
const PLATEAU_BAND_MPS = 0.05;

export const DEFAULT_BRAKING_ZONE_OPTIONS: BrakingZoneOptions = {
  brakeThreshold: 0.05,
  mergeGapM: 10,
  minSpeedDropMps: 1,
};

/** Finds the zones on any trace with speed and a brake share (the reference lap or a driver's lap). */
export function findBrakingZones(
  trace: Pick<LapTrace, 'closed' | 'count' | 'speedMps' | 'stationM'> & { brake: Float64Array },
  options: BrakingZoneOptions = DEFAULT_BRAKING_ZONE_OPTIONS,
): BrakingZone[] {
  const n = trace.count;
  const { brake, speedMps, stationM, closed } = trace;
  const on = (i: number) => brake[i]! > options.brakeThreshold;
  const stepM = n > 1 ? stationM[1]! - stationM[0]! : 1;
  const mergeSamples = Math.max(1, Math.round(options.mergeGapM / stepM));
  // A closed lap may be braking across the start line: scan from a sample where the brakes are off.
  let origin = 0;
  if (closed) {
    while (origin < n && on(origin)) origin++;
    if (origin === n) return [];
  }
  const zones: BrakingZone[] = [];
  // k counts from the origin and stays below three laps (a zone's scan runs at most a lap past its start).
  const index = (k: number) => {
    if (!closed) return k;
    let i = origin + k;
    while (i >= n) i -= n;
    return i;
  };
  let k = firstOnFrom(brake, n, options.brakeThreshold, origin, 0);
  while (k < n) {
    const startK = k;
    let lastOnK = k;
    let scan = k + 1;
    while (scan < n && scan - lastOnK <= mergeSamples) {
      if (on(index(scan))) lastOnK = scan;
      scan++;
    }
    // The slowest point that follows: walk on while the speed keeps falling, then take the middle of the
    // plateau around the minimum (a constant-radius corner holds its speed for a while).
    let probe = startK;
    const span = closed ? n : n - 1;
    while (probe - startK < span - 1 && speedMps[index(probe + 1)]! <= speedMps[index(probe)]! + PLATEAU_RISE_MPS)
      probe++;
    let minK = startK;
    for (let q = startK; q <= Math.max(probe, lastOnK); q++) if (speedMps[index(q)]! < speedMps[index(minK)]!) minK = q;
    const floor = speedMps[index(minK)]! + PLATEAU_BAND_MPS;
    let plateauStart = minK;
    let plateauEnd = minK;
    while (plateauStart > startK && speedMps[index(plateauStart - 1)]! <= floor) plateauStart--;
    while (plateauEnd - startK < span - 1 && speedMps[index(plateauEnd + 1)]! <= floor) plateauEnd++;
    minK = Math.round(0.5 * (plateauStart + plateauEnd));
    const startIndex = index(startK);
    const minSpeedIndex = index(minK);
    const entrySpeedMps = speedMps[startIndex]!;
    const minSpeedMps = speedMps[minSpeedIndex]!;
    if (entrySpeedMps - minSpeedMps >= options.minSpeedDropMps) {
      zones.push({
        startIndex,
        startM: stationM[startIndex]!,
        entrySpeedMps,
        minSpeedIndex,
        minSpeedAtM: stationM[minSpeedIndex]!,
        minSpeedMps,
        brakingLengthM: (lastOnK - startK + 1) * stepM,
      });
    }
    k = firstOnFrom(brake, n, options.brakeThreshold, origin, Math.max(lastOnK + 1, k + 1));
  }
  zones.sort((a, b) => a.startM - b.startM);
  return zones;
}

/** The first count k >= `from` (below n, the lap's samples) whose sample, `origin` + k round the lap, has the brakes
 * on; n when none has. A plain loop of its own over the samples, most of which have the brakes off: through the
 * finder's closures each cost two calls, which before V8 had compiled them was most of a lap's zones. */
function firstOnFrom(brake: Float64Array, n: number, threshold: number, origin: number, from: number): number {
  for (let k = from; k < n; k++) {
    const i = origin + k < n ? origin + k : origin + k - n;
    if (brake[i]! > threshold) return k;
  }
  return n;
}
