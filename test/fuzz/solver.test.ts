// Property-based tests of the solver (simulate) on random valid segment tracks and random valid cars: every
// lap it returns keeps the invariants of a quasi-steady-state lap (Brayshaw and Harrison, Proc. IMechE Part D
// 219 (2005)): finite positive lap time, time strictly increasing, speed never above the corner limit, the
// combined acceleration inside the g-g envelope up to the solver's discretisation, braking zones on the lap.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments } from '../../src/track/segments.js';
import { parseCarJson } from '../../src/io/read-car.js';
import type { LapResult } from '../../src/solve/types.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import type { Envelope } from '../../src/car/envelope.js';
import type { Car } from '../../src/car/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import type { TrackSegment } from '../../src/track/segments.js';
import { carFile, closedCircuit, resultOrInputError, runs, segment } from './generators.js';

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

const stepM = fc.constantFrom(0.5, 1, 2, 5);

/** Specs, not grids, so a counterexample prints short; the grid is built inside the property. */
const closedSpec = fc.record({ segments: closedCircuit, stepM });
const openSpec = fc.record({
  segments: fc.array(segment, { minLength: 1, maxLength: 6 }),
  stepM,
  startSpeedMps: fc.double({ min: 0, max: 90, noNaN: true }),
});

function closedTrack(spec: { segments: TrackSegment[]; stepM: number }): TrackGrid {
  return trackFromSegments(
    { name: 'fuzzed circuit', closed: true, widthM: 10, segments: spec.segments },
    spec.stepM,
    'fuzzed circuit',
  );
}

function openTrack(spec: { segments: TrackSegment[]; stepM: number }): TrackGrid | null {
  return resultOrInputError(
    () =>
      trackFromSegments(
        { name: 'fuzzed stage', closed: false, widthM: null, segments: spec.segments },
        spec.stepM,
        'fuzzed stage',
      ),
    'fuzzed stage',
  );
}

const toCar = (file: Record<string, unknown>): Car => parseCarJson(JSON.stringify(file), 'fuzzed car');

describe('solver fuzz', () => {
  it('closed circuits: lap time, time order, corner limit, braking zones, envelope and grip use hold', () => {
    fc.assert(
      fc.property(closedSpec, carFile, (spec, file) => {
        const car = toCar(file);
        const envelope = buildEnvelope(car, ambientFrom());
        const lap = simulate(closedTrack(spec), car, { envelope });
        expectSoundLap(lap);
        expectInsideEnvelope(lap, envelope);
        if (car.powertrain.gearing === null) expectGripUseWithin(lap);
      }),
      runs(500, 20260618),
    );
  });

  it('open stages from any segment list and start speed: the same, every step inside the envelope, grip use at most 1 + tolerance', () => {
    fc.assert(
      fc.property(openSpec, carFile, (spec, file) => {
        const track = openTrack(spec);
        if (!track) return;
        const car = toCar(file);
        const envelope = buildEnvelope(car, ambientFrom());
        const lap = simulate(track, car, { startSpeedMps: spec.startSpeedMps, envelope });
        expectSoundLap(lap);
        expectInsideEnvelope(lap, envelope);
        // With gears, grip use reaches about 1.07 at the rev limiter (reported); checked without gears.
        if (car.powertrain.gearing === null) expectGripUseWithin(lap);
      }),
      runs(600, 20260619),
    );
  });

  // Found by this fuzzing and fixed in the solver: a closed lap started its passes at the slowest corner
  // limit even when the car could not reach it (its top speed capped every limit, or drag held it below),
  // so the lap did not join: the first step showed an acceleration far beyond the envelope.
  it('regression: a closed lap whose slowest corner limit is out of reach joins without a jump in speed', () => {
    // Shrunk by fast-check from a fuzzed case: a 5 kW, 150 kg car on a small rounded square, 0.5 m grid.
    const car = toCar({
      name: 'slow car',
      massKg: 150,
      tyre: { muLong: 0.3, muLat: 0.672, ggExponent: 1 },
      aero: { dragAreaM2: 2, liftAreaM2: 0 },
      powertrain: { maxPowerW: 5000, drive: 'rear' },
    });
    const corner: TrackSegment[] = [
      { kind: 'straight', lengthM: 5 },
      { kind: 'arc', radiusM: 10, angleDeg: 90 },
    ];
    const track = closedTrack({ segments: [...corner, ...corner, ...corner, ...corner], stepM: 0.5 });
    const envelope = buildEnvelope(car, ambientFrom());
    expectInsideEnvelope(simulate(track, car, { envelope }), envelope);
  });
});
