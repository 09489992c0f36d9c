// The comparison on an invented circuit of straights and arcs, against laps built here from the reference
// trace by hand (never from the comparison's own output).

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { compareLaps } from '../../src/compare/compare-laps.js';
import { detectCorners } from '../../src/track/corners.js';
import { distanceAsTimeS } from '../../src/compare/delta.js';
import { arcRanges, circuitCar, driverLapFromReference, driverLapFromSpeeds, testCircuit } from './fixtures.js';
import { findingText } from '../../src/report/finding-phrases.js';

const track = testCircuit();
const car = circuitCar();
const ambient = ambientFrom();
const envelope = buildEnvelope(car, ambient);
const reference = simulate(track, car, { ambient, envelope });

describe('corners from curvature', () => {
  it('finds each arc of the circuit once, in running order, with the apex at the arc middle', () => {
    // Expected places come from the circuit's construction: each arc's midpoint is its geometric apex.
    const corners = detectCorners(track);
    const arcs = arcRanges();
    expect(corners.map((c) => c.id)).toEqual(arcs.map((_, i) => i + 1));
    corners.forEach((corner, i) => {
      const arc = arcs[i]!;
      expect(Math.abs(corner.apexM - (arc.fromM + arc.toM) / 2)).toBeLessThan(3);
      expect(corner.entryM).toBeGreaterThan(arc.fromM - 15);
      expect(corner.exitM).toBeLessThan(arc.toM + 15);
      expect(corner.side).toBe(Math.sign(arc.radiusM));
    });
    expect(corners[0]!.name).toBe('First');
    expect(corners.slice(1).every((c) => c.name === null)).toBe(true);
  });
});

describe('a lap against itself', () => {
  it('loses no time anywhere and makes no finding', () => {
    const result = compareLaps(track, car, reference, driverLapFromReference(track, reference), envelope);
    expect(Math.abs(result.driverLapTimeS - result.referenceLapTimeS)).toBeLessThan(1e-9);
    for (const corner of result.corners) {
      expect(Math.abs(corner.timeLostS)).toBeLessThan(1e-9);
      if (corner.brakingPointDeltaM !== null) expect(Math.abs(corner.brakingPointDeltaM)).toBeLessThan(1e-9);
      expect(corner.minSpeedDeltaKph).toBeCloseTo(0, 9);
    }
    expect(result.findings).toEqual([]);
  });
});

/**
 * The reference lap with the braking for one corner begun `earlierM` sooner: from there the speed falls with the
 * same deceleration the reference uses `earlierM` later, down to the reference's slowest speed, which is then held
 * (brakes off, a touch of throttle) until the reference lap reaches that speed itself.
 */
function earlyBrakingLap(zoneIndex: number, earlierM: number) {
  const t = reference.trace;
  const n = t.count;
  const zone = reference.brakingZones[zoneIndex]!;
  const shift = Math.round(earlierM / track.stepM);
  const speed = Float64Array.from(t.speedMps);
  const throttle = Float64Array.from(t.throttle);
  const brake = Float64Array.from(t.brake);
  const slowest = t.speedMps[zone.minSpeedIndex]!;
  const wrap = (k: number) => ((k % n) + n) % n;
  let i = zone.startIndex - shift;
  let v = t.speedMps[wrap(i)]!;
  let holding = false;
  while (wrap(i) !== zone.minSpeedIndex) {
    const k = wrap(i);
    if (!holding) {
      speed[k] = v;
      brake[k] = t.brake[wrap(i + shift)]!;
      throttle[k] = 0;
      const a = t.speedMps[wrap(i + shift)]!;
      const b = t.speedMps[wrap(i + shift + 1)]!;
      const next = Math.sqrt(Math.max(0, v * v + (b * b - a * a)));
      if (next <= slowest) holding = true;
      else v = next;
    }
    if (holding) {
      speed[k] = Math.min(t.speedMps[k]!, slowest);
      brake[k] = 0;
      throttle[k] = 0.1;
    }
    i++;
  }
  return { lap: driverLapFromSpeeds(track, speed, throttle, brake, 'early braking'), zone };
}

describe('braking 10 m early at one corner', () => {
  const { lap, zone } = earlyBrakingLap(0, 10);
  const result = compareLaps(track, car, reference, lap, envelope);
  const target = result.corners.find(
    (c) => c.brakingPointDeltaM !== null && Math.abs((c.referenceBrakingPointM ?? -1e9) - zone.startM) < 2,
  )!;

  it('reports 10 m earlier at that corner and at most 2 m elsewhere', () => {
    expect(target).toBeDefined();
    expect(target.brakingPointDeltaM!).toBeGreaterThan(-11);
    expect(target.brakingPointDeltaM!).toBeLessThan(-9);
    for (const corner of result.corners)
      if (corner !== target && corner.brakingPointDeltaM !== null)
        expect(Math.abs(corner.brakingPointDeltaM)).toBeLessThanOrEqual(2);
  });

  it('states the gap as time at the reference speed, and makes that corner the only finding', () => {
    const v = reference.trace.speedMps[zone.startIndex]!;
    expect(target.brakingPointDeltaS!).toBeCloseTo(target.brakingPointDeltaM! / v, 2);
    expect(result.findings.length).toBe(1);
    expect(result.findings[0]!.corner).toBe(target.id);
    expect(findingText(result.findings[0]!)).toMatch(/10 m before the reference/);
    expect(target.timeLostS).toBeGreaterThan(0);
  });

  it('shares out the lap-time difference among the corners exactly', () => {
    const sum = result.corners.reduce((s, c) => s + c.timeLostS, 0);
    expect(sum).toBeCloseTo(result.driverLapTimeS - result.referenceLapTimeS, 9);
    expect(result.driverLapTimeS).toBeGreaterThan(result.referenceLapTimeS);
  });
});

describe('time delta', () => {
  it('reaches the lap-time difference at the finish for a lap driven at 95 % of the reference speed', () => {
    // At a constant speed ratio every elapsed time scales by 1 / 0.95 (time = distance / speed), so the delta at
    // the finish is T (1 / 0.95 - 1) for the reference lap time T.
    const t = reference.trace;
    const lap = driverLapFromSpeeds(
      track,
      t.speedMps.map((v) => 0.95 * v),
      Float64Array.from(t.throttle),
      Float64Array.from(t.brake),
    );
    const result = compareLaps(track, car, reference, lap, envelope);
    const expected = reference.lapTimeS * (1 / 0.95 - 1);
    expect(Math.abs(result.deltaS[t.count - 1]! - expected)).toBeLessThan(0.01);
    const sum = result.corners.reduce((s, c) => s + c.timeLostS, 0);
    expect(Math.abs(sum - expected)).toBeLessThan(0.01);
    expect(result.corners.every((c) => c.minSpeedDeltaKph < 0)).toBe(true);
  });
});

describe('braking point as time', () => {
  it('turns 5 m at 200 km/h into just under a tenth of a second', () => {
    // Rule of thumb (common practice): 5 m at 200 km/h is just under 0.1 s.
    const seconds = distanceAsTimeS(5, 200 / 3.6);
    expect(seconds).toBeGreaterThan(0.08);
    expect(seconds).toBeLessThan(0.1);
  });
});
