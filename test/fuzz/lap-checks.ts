// The invariants every lap of the quasi-steady-state solver keeps (Brayshaw and Harrison, Proc. IMechE Part D
// 219 (2005)), as checks the fuzzers share: finite positive lap time and every output number finite, time strictly
// increasing, speed never above the corner limit, the acceleration inside the g-g envelope and grip use at most 1
// up to the solver's discretisation.

import { expect } from 'vitest';
import type { Envelope } from '../../src/car/envelope.js';
import type { LapResult } from '../../src/solve/types.js';

/**
 * Acceleration the trace may show beyond the envelope's own limit at the sample's speed and lateral demand,
 * m/s^2. The passes take each step's limit at one end of the step while the trace reads it at the sample, so
 * where the demand changes inside a step the sample can sit slightly outside; the largest excess over 1,400
 * fuzzed open stages at steps of 0.5 to 5 m was 0.074 m/s^2 (docs/robustness.md).
 */
export const ACCEL_TOLERANCE_MPS2 = 0.1;
/** Grip use may exceed 1 by this much (the same discretisation, as a share of the envelope). */
export const GRIP_USE_TOLERANCE = 0.02;

/** The invariants every lap keeps today, on closed circuits and open stages alike. */
export function expectSoundLap(lap: LapResult): void {
  const { trace } = lap;
  expect(Number.isFinite(lap.lapTimeS) && lap.lapTimeS > 0).toBe(true);
  // Every output value is finite: the summary numbers, every channel of the trace (the corner limit is infinite on
  // a straight by definition, so it only may not be NaN) and every braking zone's numbers.
  for (const [name, value] of Object.entries({ lengthM: lap.lengthM, max: lap.maxSpeedMps, min: lap.minSpeedMps }))
    if (!Number.isFinite(value)) throw new Error(`${name} is ${value}`);
  for (const [name, channel] of Object.entries(trace)) {
    if (!ArrayBuffer.isView(channel)) continue;
    const values = channel as unknown as ArrayLike<number>;
    for (let i = 0; i < values.length; i++) {
      const value = values[i]!;
      if (name === 'cornerLimitMps' ? Number.isNaN(value) : !Number.isFinite(value))
        throw new Error(`trace.${name} is ${value} at sample ${i}`);
    }
  }
  for (const zone of lap.brakingZones)
    for (const [name, value] of Object.entries(zone))
      if (typeof value === 'number' && !Number.isFinite(value)) throw new Error(`braking zone ${name} is ${value}`);
  for (let i = 1; i < trace.count; i++) {
    if (!(trace.timeS[i]! > trace.timeS[i - 1]!))
      throw new Error(`time not increasing at sample ${i}: ${trace.timeS[i - 1]} then ${trace.timeS[i]}`);
  }
  for (let i = 0; i < trace.count; i++) {
    const speed = trace.speedMps[i]!;
    if (!(Number.isFinite(speed) && speed >= 0)) throw new Error(`speed ${speed} at sample ${i}`);
    if (!(speed <= trace.cornerLimitMps[i]!))
      throw new Error(`speed ${speed} above the corner limit ${trace.cornerLimitMps[i]} at sample ${i}`);
  }
  for (const zone of lap.brakingZones) {
    if (!(zone.startM >= 0 && zone.startM < lap.lengthM))
      throw new Error(`braking zone starts at ${zone.startM} m on a lap of ${lap.lengthM} m`);
  }
}

/** Each step's acceleration inside the envelope (drive or brake limit at the sample's speed and lateral demand). */
export function expectInsideEnvelope(lap: LapResult, envelope: Envelope): void {
  const { trace } = lap;
  const steps = trace.closed ? trace.count : trace.count - 1;
  for (let i = 0; i < steps; i++) {
    const speed = trace.speedMps[i]!;
    const ax = trace.axMps2[i]!;
    const ay = trace.ayMps2[i]!;
    const limit = ax >= 0 ? envelope.accelLimitMps2(speed, ay) : envelope.brakeLimitMps2(speed, ay);
    const excess = Math.abs(ax) - limit;
    if (ax !== 0 && excess > ACCEL_TOLERANCE_MPS2) {
      throw new Error(
        `sample ${i} (${trace.distanceM[i]!.toFixed(1)} m, ${speed.toFixed(2)} m/s): ax ${ax.toFixed(3)} m/s^2 beyond the ${ax >= 0 ? 'drive' : 'brake'} limit ${limit.toFixed(3)}`,
      );
    }
  }
}

/** Grip use at most 1 + tolerance at every sample. */
export function expectGripUseWithin(lap: LapResult): void {
  const { trace } = lap;
  const samples = trace.count;
  for (let i = 0; i < samples; i++) {
    if (!(trace.gripUse[i]! <= 1 + GRIP_USE_TOLERANCE))
      throw new Error(
        `grip use ${trace.gripUse[i]} at sample ${i} (${trace.distanceM[i]!.toFixed(1)} m, ${trace.speedMps[i]!.toFixed(2)} m/s)`,
      );
  }
}
