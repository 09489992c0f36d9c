// The driver's line from positions: a lap on the reference's speeds whose path is moved across the track over one
// corner by a known amount (a smooth sin^2 ramp), with and without white position noise of a known size.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { driverLine } from '../../src/compare/driver-line/driver-line.js';
import { cornerLayoutOf } from '../../src/track/corner-layout.js';
import type { DriverLap } from '../../src/compare/types.js';
import { circuitCar, driverLapFromReference, testCircuit } from './fixtures.js';
import { gaussian, uniform } from './gps-session.js';
import { lineFindingText, lineNotes } from '../../src/report/line-phrases.js';

const track = testCircuit();
const reference = simulate(track, circuitCar());
const n = track.distanceM.length;
const corner = cornerLayoutOf(track).corners[0]!;
const RAMP_M = 30;

/** The reference's lap driven `inwardM` towards the inside of the first corner, with noise of `noiseM` (SD). */
function movedLap(inwardM: number, noiseM: number, seed = 1): DriverLap {
  const lap = driverLapFromReference(track, reference);
  const normal = gaussian(uniform(seed));
  const from = corner.entryIndex - RAMP_M;
  const to = corner.exitIndex + RAMP_M;
  const xM = new Float64Array(n);
  const yM = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ramp = i > from && i < to ? Math.sin((Math.PI * (i - from)) / (to - from)) ** 2 : 0;
    // Left normal of the heading h is (-sin h, cos h); the corner's side is +1 for a left turn.
    const offset = corner.side * inwardM * ramp;
    const h = track.headingRad[i]!;
    xM[i] = track.xM[i]! - offset * Math.sin(h) + noiseM * normal();
    yM[i] = track.yM[i]! + offset * Math.cos(h) + noiseM * normal();
  }
  return { ...lap, xM, yM };
}

/**
 * An outside-inside line through the first corner: `outsideM` towards the outside from 80 m before the turn-in point
 * (a sin^2 ramp out), held there up to the turn-in, then a straight run across to `outsideM` inside at the apex and
 * a sin^2 ramp back after the exit; white noise of `noiseM` (SD) on each coordinate.
 */
function outsideInsideLap(turnInIndex: number, outsideM: number, noiseM: number, seed: number): DriverLap {
  const lap = driverLapFromReference(track, reference);
  const normal = gaussian(uniform(seed));
  const xM = new Float64Array(n);
  const yM = new Float64Array(n);
  const out = turnInIndex - 80;
  const back = corner.exitIndex + RAMP_M;
  for (let i = 0; i < n; i++) {
    let inward = 0;
    if (i > out - RAMP_M && i <= out) inward = -outsideM * Math.sin((Math.PI / 2) * ((i - out + RAMP_M) / RAMP_M)) ** 2;
    else if (i > out && i <= turnInIndex) inward = -outsideM;
    else if (i > turnInIndex && i <= corner.apexIndex)
      inward = -outsideM + (2 * outsideM * (i - turnInIndex)) / (corner.apexIndex - turnInIndex);
    else if (i > corner.apexIndex && i < back)
      inward = outsideM * Math.cos((Math.PI / 2) * ((i - corner.apexIndex) / (back - corner.apexIndex))) ** 2;
    const offset = corner.side * inward;
    const h = track.headingRad[i]!;
    xM[i] = track.xM[i]! - offset * Math.sin(h) + noiseM * normal();
    yM[i] = track.yM[i]! + offset * Math.cos(h) + noiseM * normal();
  }
  return { ...lap, xM, yM };
}

describe("the driver's line", () => {
  it('finds the turn-in of an outside-inside line where the line leaves the outside, through GPS-like scatter', () => {
    // The turn-in is where the constructed line stops running along the outside (the test's own construction);
    // with 0.3 m of scatter the running-mean offset wanders along the flat outside run, and the turn-in must not
    // follow its wiggles: within 10 m of the true point on every seed.
    const turnInIndex = corner.apexIndex - 60;
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const result = driverLine({ track, lap: outsideInsideLap(turnInIndex, 3, 0.3, seed), brake: null })!;
      const found = result.corners[0]!.driver;
      expect(Math.abs(found.turnInBeforeApexM - (corner.apexIndex - turnInIndex) * track.stepM)).toBeLessThan(10);
    }
  });

  it('puts no turn-in ahead of the apex for a line that stays on the centreline, whatever the noise', () => {
    // A driver on the centreline with 0.5 m of scatter never moves inward by more than the resolution (twice the
    // scatter): no turn-in is read from the noise, so the turn-in sits at the apex on every seed.
    for (const seed of [11, 12, 13, 14, 15]) {
      const result = driverLine({ track, lap: movedLap(0, 0.5, seed), brake: null })!;
      expect(result.corners[0]!.driver.turnInBeforeApexM).toBe(0);
    }
  });

  it('reports a line moved 2 m inward over one corner within 0.3 m at the apex (issue 13)', () => {
    const apexRamp =
      Math.sin(
        (Math.PI * (corner.apexIndex - corner.entryIndex + RAMP_M)) /
          (corner.exitIndex - corner.entryIndex + 2 * RAMP_M),
      ) ** 2;
    const result = driverLine({ track, lap: movedLap(2, 0), brake: null })!;
    const first = result.corners[0]!;
    expect(Math.abs(first.driver.apexOffsetM - corner.side * 2 * apexRamp)).toBeLessThan(0.3);
    // The other corners are driven on the centreline.
    for (const other of result.corners.slice(2)) expect(Math.abs(other.driver.apexOffsetM)).toBeLessThan(0.3);
  });

  it('measures the scatter of a noisy log and names the resolution it allows', () => {
    // White noise of 0.5 m on each coordinate puts 0.5 m of scatter across the track (a normal vector's
    // projection on a unit direction keeps its standard deviation).
    const result = driverLine({ track, lap: movedLap(0, 0.5), brake: null })!;
    expect(result.scatterM).toBeGreaterThan(0.4);
    expect(result.scatterM).toBeLessThan(0.6);
    expect(result.resolutionM).toBeCloseTo(2 * result.scatterM, 9);
    expect(lineNotes(result).join(' ')).toMatch(/line differences under 1\.\d m are not reported/);
  });

  it('calls a missed apex against the reference line only when it is larger than the scatter allows', () => {
    const referenceLine = { xM: track.xM, yM: track.yM };
    // 3 m wide of the centreline line with 0.5 m of noise (resolution about 1 m): a finding.
    const wide = driverLine({ track, lap: movedLap(-3, 0.5), brake: null, referenceLine })!;
    expect(
      wide.findings.some((f) => f.corner === corner.id && /misses the apex by [23]\.\d m/.test(lineFindingText(f))),
    ).toBe(true);
    // 1 m wide with 1 m of noise (resolution about 2 m): no finding.
    const hidden = driverLine({ track, lap: movedLap(-1, 1, 7), brake: null, referenceLine })!;
    expect(hidden.findings.filter((f) => f.corner === corner.id)).toEqual([]);
  });

  it("holds a GPS line against the reference to the receiver's absolute error", () => {
    const referenceLine = { xM: track.xM, yM: track.yM };
    // 2 m wide with little scatter: seen from a simulator's positions, not from GPS (a few metres absolute error).
    const simulator = driverLine({ track, lap: movedLap(-2.5, 0.05), brake: null, referenceLine })!;
    expect(simulator.findings.some((f) => f.corner === corner.id && f.kind === 'misses-apex')).toBe(true);
    const gps = driverLine({ track, lap: movedLap(-2.5, 0.05), brake: null, referenceLine, fromGps: true })!;
    expect(gps.findings.filter((f) => f.corner === corner.id)).toEqual([]);
    expect(gps.placedResolutionM).toBeGreaterThanOrEqual(3);
  });
});
