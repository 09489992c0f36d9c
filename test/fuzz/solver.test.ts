// Property-based tests of the solver (simulate) on random valid segment tracks and random valid cars: every
// lap it returns keeps the invariants of a quasi-steady-state lap (Brayshaw and Harrison, Proc. IMechE Part D
// 219 (2005)): finite positive lap time, time strictly increasing, speed never above the corner limit, the
// combined acceleration inside the g-g envelope up to the solver's discretisation, braking zones on the lap.

import { describe, it } from 'vitest';
import fc from 'fast-check';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments } from '../../src/track/segments.js';
import { parseCarJson } from '../../src/io/read-car.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import type { Car } from '../../src/car/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import type { TrackSegment } from '../../src/track/segments.js';
import { carFile, closedCircuit, resultOrInputError, runs, segment } from './generators.js';
import { expectGripUseWithin, expectInsideEnvelope, expectSoundLap } from './lap-checks.js';

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
