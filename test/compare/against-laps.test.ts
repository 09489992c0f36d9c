// Lap against lap in the library: a lap against itself, a lap uniformly slower than another (time = distance /
// speed makes every stretch 2 % longer), and a real GPS session against a slowed copy of itself.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { lapAgainstLap } from '../../src/compare/against/lap-against-lap.js';
import { otherLapOf } from '../../src/compare/against/other-lap.js';
import { compareSession } from '../../src/compare/compare-session.js';
import { readTelemetryFile } from '../../src/io/telemetry/read-telemetry.js';
import { parseCarJson } from '../../src/io/read-car.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { arcRanges, circuitCar, driverLapFromReference, driverLapFromSpeeds, testCircuit } from './fixtures.js';
import { kartTrackOf, REAL_KART_LOG, realKartLogPresent } from '../helpers/real-gps.js';
import { againstFindingText } from '../../src/report/against-phrases.js';
import { noteText } from '../../src/report/note-text.js';

const track = testCircuit();
const car = circuitCar();
const ambient = ambientFrom();
const envelope = buildEnvelope(car, ambient);
const reference = simulate(track, car, { ambient, envelope });
const SLOWER = 1.02;

describe('a lap against itself', () => {
  it('has every corner difference zero and no finding', () => {
    const lap = driverLapFromReference(track, reference);
    const result = lapAgainstLap(track, reference, lap, driverLapFromReference(track, reference), envelope);
    expect(result.corners.length).toBe(arcRanges().length);
    for (const corner of result.corners) {
      expect(corner.timeLostS).toBe(0);
      expect(corner.minSpeedDeltaKph).toBe(0);
      expect(corner.brakingPointDeltaM ?? 0).toBe(0);
      expect(corner.brakeReleaseDeltaM ?? 0).toBe(0);
    }
    expect(result.findings).toEqual([]);
  });
});

describe('a lap 2 % slower everywhere against the faster one', () => {
  const fast = driverLapFromReference(track, reference);
  const t = reference.trace;
  const slow = driverLapFromSpeeds(
    track,
    Float64Array.from(t.speedMps, (v) => v / SLOWER),
    Float64Array.from(t.throttle),
    Float64Array.from(t.brake),
  );
  const result = lapAgainstLap(track, reference, slow, fast, envelope);

  it('loses 2 % of the faster lap’s time in every corner, and the corners add up to the lap', () => {
    // Each station-to-station time is 2 s / (v + v') (trapezoid rule in the fixture): dividing every speed by 1.02
    // multiplies every step, hence every stretch, by 1.02.
    for (const corner of result.corners)
      expect(corner.timeLostS).toBeCloseTo((SLOWER - 1) * corner.second.cornerTimeS, 9);
    const sum = result.corners.reduce((s, c) => s + c.timeLostS, 0);
    expect(sum).toBeCloseTo((SLOWER - 1) * fast.lapTimeS, 6);
  });

  it('brakes at the same places, and is slowest 1/1.02 as fast', () => {
    for (const corner of result.corners) {
      if (corner.brakingPointDeltaM !== null) expect(Math.abs(corner.brakingPointDeltaM)).toBeLessThan(1e-9);
      expect(corner.first.minSpeedKph).toBeCloseTo(corner.second.minSpeedKph / SLOWER, 9);
    }
  });

  it('says the faster lap is quicker in the corners and is itself the reference there', () => {
    expect(result.findings.length).toBeGreaterThan(0);
    for (const finding of result.findings) {
      expect(finding.timeS).toBeGreaterThan(0);
      expect(againstFindingText(finding)).toMatch(/lap 1 of reference copy is [0-9.]+ s quicker here/);
      expect(againstFindingText(finding)).toMatch(/within 0\.00 s of the reference here, so copying it is enough/);
    }
  });
});

// Real data: the kart lap in ../shared/data/real-gps/ (test/helpers/real-gps.ts names its source and licence).
if (!realKartLogPresent) console.warn(`skipping lap against lap on the real GPS log: ${REAL_KART_LOG} is absent`);

describe.skipIf(!realKartLogPresent)('a real GPS lap against a slowed copy of itself', () => {
  it('finds the copy 2 % slower, shared among the corners within 0.01 s', async () => {
    const session = await readTelemetryFile(REAL_KART_LOG, { columns: {} });
    const kartTrack = kartTrackOf(session);
    // An invented kart with its driver.
    const kart = parseCarJson(
      JSON.stringify({
        name: 'invented kart',
        massKg: 240,
        rollingResistanceCoeff: 0.02,
        tyre: { muLong: 1.0, muLat: 1.2 },
        aero: { dragAreaM2: 0.6, liftAreaM2: 0 },
        powertrain: { maxPowerW: 9000 },
      }),
      'invented kart',
    );
    // The same fixes a little later each: every interval 2 % longer and every speed 2 % lower, the path unchanged.
    const t0 = session.timeS[0]!;
    const slowed: TelemetrySession = {
      ...session,
      source: 'slowed copy',
      timeS: session.timeS.map((t) => t0 + (t - t0) * SLOWER),
      speedMps: session.speedMps!.map((v) => v / SLOWER),
      notes: [],
    };
    const comparison = compareSession(kartTrack, kart, session, { ambient, startSpeedMps: session.speedMps![0]! });
    expect(comparison.notes.map((note) => noteText(note)).join(' ')).toMatch(/Savitzky-Golay/);
    const other = otherLapOf(slowed, kartTrack, { optionName: '--against' }).lap;
    const result = lapAgainstLap(kartTrack, comparison.reference, comparison.lap, other, comparison.envelope);
    // time = distance / speed: the copy takes 2 % longer over the whole lap (0.01 s, the tolerance).
    expect(Math.abs(result.lapTimeS - SLOWER * result.driverLapTimeS)).toBeLessThan(0.01);
    expect(result.corners.length).toBeGreaterThanOrEqual(5);
    const sum = result.corners.reduce((s, c) => s + c.timeLostS, 0);
    expect(Math.abs(sum - (result.driverLapTimeS - result.lapTimeS))).toBeLessThan(0.01);
    for (const corner of result.corners) expect(corner.timeLostS).toBeLessThan(0.005);
    // A real lap against itself: nothing to tell apart.
    const self = lapAgainstLap(kartTrack, comparison.reference, comparison.lap, comparison.lap, comparison.envelope);
    expect(self.findings).toEqual([]);
  });
});
