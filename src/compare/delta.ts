// Time delta between two laps on one distance grid: the driver's elapsed time minus the reference's at each
// station, and the helpers that read either lap's clock across the start line of a closed circuit.

/** Driver minus reference elapsed time at each station, s. */
export function timeDeltaS(driverTimeS: Float64Array, referenceTimeS: Float64Array): Float64Array {
  const n = driverTimeS.length;
  if (referenceTimeS.length !== n)
    throw new Error(`driver lap has ${n} stations but the reference has ${referenceTimeS.length}`);
  const delta = new Float64Array(n);
  for (let i = 0; i < n; i++) delta[i] = driverTimeS[i]! - referenceTimeS[i]!;
  return delta;
}

/**
 * Elapsed time at an unwrapped station index: index n is the finish (the lap time), negative indices are the
 * end of the previous lap, so spans across the start line of a closed circuit read the right time.
 */
export function clockAt(timeS: Float64Array, lapTimeS: number, index: number, closed: boolean): number {
  const n = timeS.length;
  if (!closed) return timeS[Math.min(n - 1, Math.max(0, index))]!;
  const laps = Math.floor(index / n);
  return timeS[index - laps * n]! + laps * lapTimeS;
}

/** A distance along the lap as time at a speed: how long the car takes to cover it, s. */
export function distanceAsTimeS(distanceM: number, speedMps: number): number {
  return speedMps > 0 ? distanceM / speedMps : 0;
}
