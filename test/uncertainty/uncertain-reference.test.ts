// The reference over draws of an uncertain car: with no uncertainty it is exactly the plain answer; with a normal
// grip on a ring its lap-time band is the closed form's within what N Latin-hypercube draws allow; a finding's share
// of draws follows the normal probability of the grip for which the corner speed clears its threshold.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { compareLaps } from '../../src/compare/compare-laps.js';
import { normalCdf, normalQuantile } from '../../src/numeric/normal.js';
import { uncertainReference } from '../../src/uncertainty/uncertain-reference.js';
import type { Car } from '../../src/car/types.js';
import { ring } from '../line/hand-tracks.js';
import { arcRanges, driverLapFromReference, driverLapFromSpeeds, testCircuit } from '../compare/fixtures.js';
import { testCar } from '../helpers/cars.js';

const ambient = ambientFrom();
const G = 9.80665;

describe('no uncertainty', () => {
  it('gives exactly the plain answer: lap time, speed at every station, every corner and every finding', async () => {
    const track = testCircuit();
    const plainCar = testCar({
      massKg: 1200,
      mu: 1.3,
      dragAreaM2: 0.7,
      maxPowerW: 220_000,
      rollingResistanceCoeff: 0.013,
    });
    const car: Car = {
      ...plainCar,
      uncertainty: { sd: { 'tyre.muLat': 0, 'aero.dragAreaM2': 0, 'powertrain.maxPowerW': 0 }, correlation: [] },
    };
    const plain = simulate(track, plainCar, { ambient });
    // A driver 3 % slower everywhere: findings at every corner.
    const driver = driverLapFromReference(track, plain);
    for (let i = 0; i < driver.speedMps.length; i++) driver.speedMps[i]! *= 0.97;
    const slower = driverLapFromSpeeds(track, driver.speedMps, driver.throttle!, driver.brake!);
    const result = compareLaps(track, plainCar, plain, slower, buildEnvelope(plainCar, ambient));
    const u = await uncertainReference(
      { track, car, ambient, nominal: plain, comparison: { driver: slower, result } },
      { draws: 16, workers: 0 },
    );
    expect(u.lapTimeS).toEqual({ median: plain.lapTimeS, low: plain.lapTimeS, high: plain.lapTimeS });
    for (let i = 0; i < plain.trace.count; i++) {
      expect(u.speedMps.low[i]).toBe(plain.trace.speedMps[i]);
      expect(u.speedMps.high[i]).toBe(plain.trace.speedMps[i]);
    }
    expect(u.corners.map((c) => c.timeLostS.median)).toEqual(result.corners.map((c) => c.timeLostS));
    expect(u.findings.map((f) => f.finding)).toEqual(result.findings);
    expect(result.findings.length).toBeGreaterThan(0);
    for (const finding of u.findings) {
      expect(finding.holds).toBe(1);
      expect(finding.uncertain).toBe(false);
      expect(finding.timeS.low).toBe(finding.nominalTimeS);
    }
    // A car file without any uncertainty block says the same.
    const none = await uncertainReference(
      { track, car: plainCar, ambient, nominal: plain, comparison: { driver: slower, result } },
      { draws: 8, workers: 0 },
    );
    expect(none.lapTimeS.median).toBe(plain.lapTimeS);
    expect(none.fields).toEqual([]);
  });
});

describe('normal grip on a ring', () => {
  it('gives the lap-time band of the closed form T = L / sqrt(mu g R) within the sampling error of the draws', async () => {
    const radiusM = 80;
    const track = ring(radiusM, 10, 1);
    const muLat = 1.2;
    const sd = 0.06;
    // No drag, no rolling resistance: on the ring the point mass runs at its corner limit sqrt(mu g R) all the way
    // (Brayshaw and Harrison 2005), so the lap takes L / sqrt(mu g R).
    const car: Car = { ...testCar({ mu: muLat }), uncertainty: { sd: { 'tyre.muLat': sd }, correlation: [] } };
    const nominal = simulate(track, car, { ambient });
    const count = 64;
    const u = await uncertainReference({ track, car, ambient, nominal }, { draws: count, workers: 0 });
    const lapTime = (mu: number) => track.lengthM / Math.sqrt(mu * G * radiusM);
    const muAt = (share: number) => muLat + sd * normalQuantile(share);
    // A Latin hypercube has one draw per stratum of 1/N, so its k-th smallest grip lies in [k/N, (k+1)/N): the
    // type-7 quantile at p of the lap times (which fall as grip rises) lies between the closed form at the grip
    // quantiles (N - j)/N and (N - 2 - j)/N, j = floor((N - 1) p).
    const bounds = (p: number) => {
      const j = Math.floor((count - 1) * p);
      return [
        lapTime(muAt(Math.min(1 - 1e-9, (count - j) / count))),
        lapTime(muAt(Math.max(1e-9, (count - 2 - j) / count))),
      ] as const;
    };
    for (const [p, value] of [
      [0.05, u.lapTimeS.low],
      [0.5, u.lapTimeS.median],
      [0.95, u.lapTimeS.high],
    ] as const) {
      const [lo, hi] = bounds(p);
      expect(value, `quantile ${p}`).toBeGreaterThanOrEqual(lo - 1e-9);
      expect(value, `quantile ${p}`).toBeLessThanOrEqual(hi + 1e-9);
    }
    // The closed form's own 90 % band lies inside the same strata: the two agree to what 64 draws can resolve.
    const [lowLo, lowHi] = bounds(0.05);
    expect(lapTime(muAt(0.95))).toBeGreaterThanOrEqual(lowLo);
    expect(lapTime(muAt(0.95))).toBeLessThanOrEqual(lowHi);
  });
});

describe('robustness of a finding', () => {
  it('holds in the share of draws whose grip lets the reference clear the slowest-speed threshold', async () => {
    // No drag, no downforce: the reference's slowest point in a constant-radius corner is sqrt(mu g R). A driver 2.5 %
    // slower everywhere is "slowest point under the reference" at the 50 m corner when the gap reaches 2 km/h,
    // i.e. when mu >= mu* = (v_driver + 2 / 3.6)^2 / (g R); with mu normal the share is 1 - Phi((mu* - mu) / sd),
    // and one draw per stratum keeps the counted share within 1 / N of it.
    const track = testCircuit();
    const muLat = 1.3;
    const sd = 0.04;
    const plainCar = testCar({ massKg: 1200, muLat, muLong: 1.3, maxPowerW: 220_000 });
    const car: Car = { ...plainCar, uncertainty: { sd: { 'tyre.muLat': sd }, correlation: [] } };
    const plain = simulate(track, plainCar, { ambient });
    const reference = driverLapFromReference(track, plain);
    const speeds = reference.speedMps.map((v) => v * 0.975);
    const driver = driverLapFromSpeeds(track, speeds, reference.throttle!, reference.brake!);
    const result = compareLaps(track, plainCar, plain, driver, buildEnvelope(plainCar, ambient));
    const count = 64;
    const u = await uncertainReference(
      { track, car, ambient, nominal: plain, comparison: { driver, result } },
      { draws: count, workers: 0 },
    );
    const hairpin = arcRanges().find((arc) => arc.radiusM === 50)!;
    const index = result.corners.findIndex((c) => c.apexM >= hairpin.fromM && c.apexM <= hairpin.toM);
    const corner = u.corners[index]!;
    expect(corner.claim).toBe('slowest-point-low');
    const vDriver = 0.975 * Math.sqrt(muLat * G * 50);
    const threshold = (vDriver + 2 / 3.6) ** 2 / (G * 50);
    const expected = 1 - normalCdf((threshold - muLat) / sd);
    expect(expected).toBeGreaterThan(0.2);
    expect(expected).toBeLessThan(0.8);
    expect(Math.abs(corner.holds! - expected)).toBeLessThanOrEqual(1.5 / count);
  });
});
