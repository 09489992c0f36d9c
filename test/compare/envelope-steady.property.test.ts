// The demonstrated envelope moves a little when its log moves a little. A sample a hair across a speed band's edge
// or a sector's 45-degree boundary, 1 % of the samples dropped, the speed 0.1 km/h off or one lap of several left
// out must not make the lap "with the grip already shown" jump; and the checks still hold on every
// perturbed log: not slower than the driven lap beyond 0.5 %, within 2 % of the known lap on synthetic GPS-only logs.

import path from 'node:path';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitEnvelope, DEFAULT_ENVELOPE_FIT, type EnvelopeSamples } from '../../src/compare/envelope-fit.js';
import { compareSession } from '../../src/compare/compare-session.js';
import { simulate } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { readTrackFile } from '../../src/io/read-track.js';
import { readCarFile } from '../../src/io/read-car.js';
import { referenceLine } from '../../src/line/reference-line.js';
import { demoDriver, demoLogCsv, DEFAULT_DEMO_LOG } from '../../src/demo/demo-driver.js';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { circuitCar } from './fixtures.js';
import { closedCircuit, gpsSession } from './gps-session.js';
import { projectRoot } from '../helpers/cli.js';

const ambient = ambientFrom();

/** The session with only the rows `keep` accepts, every channel alike. */
function keepRows(session: TelemetrySession, keep: (i: number) => boolean): TelemetrySession {
  const rows: number[] = [];
  for (let i = 0; i < session.count; i++) if (keep(i)) rows.push(i);
  const pick = (values: Float64Array | null | undefined) =>
    values ? Float64Array.from(rows, (i) => values[i]!) : null;
  return {
    ...session,
    count: rows.length,
    timeS: pick(session.timeS)!,
    distanceM: pick(session.distanceM),
    speedMps: pick(session.speedMps),
    throttle: pick(session.throttle),
    brake: pick(session.brake),
    axMps2: pick(session.axMps2),
    ayMps2: pick(session.ayMps2),
    steeringDeg: pick(session.steeringDeg),
    gear: pick(session.gear),
    rpm: pick(session.rpm),
    xM: pick(session.xM),
    yM: pick(session.yM),
    notes: [],
  };
}

/** 1 % of the rows dropped at random (first and last kept), and every speed shifted by `shiftMps`. */
function perturbed(session: TelemetrySession, dropSeed: number, shiftMps: number): TelemetrySession {
  const { uniform } = seededRandom(dropSeed);
  const dropped = Array.from({ length: session.count }, () => uniform() < 0.01);
  const kept = keepRows(session, (i) => !dropped[i] || i === 0 || i === session.count - 1);
  return { ...kept, speedMps: kept.speedMps!.map((v) => v + shiftMps) };
}

describe('the fit moves continuously with its samples', () => {
  // A thin band (30 left-turn samples at 8 m/s^2) between two full ones (200 each at 12 m/s^2), with plenty of
  // every other direction, so that only the thin cell is in question.
  function thinBandSamples(edgeSpeedMps: number): EnvelopeSamples {
    const speed: number[] = [];
    const ax: number[] = [];
    const ay: number[] = [];
    const add = (v: number, x: number, y: number) => (speed.push(v), ax.push(x), ay.push(y));
    for (let k = 0; k < 200; k++) {
      const v = 5 + (20 * k) / 200;
      add(v, -10, 0);
      add(v, 4, 0);
      add(v, 0, -11);
      add(7.6 + (k % 20) * 0.1, 0, 12);
      add(12.6 + (k % 20) * 0.1, 0, 12);
    }
    for (let k = 0; k < 29; k++) add(10.2 + k * 0.07, 0, 8);
    add(edgeSpeedMps, 0, 8);
    return {
      speedMps: Float64Array.from(speed),
      axMps2: Float64Array.from(ax),
      ayMps2: Float64Array.from(ay),
      throttle: null,
      brake: null,
    };
  }

  it("a sample 2 mm/s across a band edge moves no band's limit by more than 0.04 m/s^2", () => {
    const bandEdge = 4 * DEFAULT_ENVELOPE_FIT.bandWidthMps;
    const above = fitEnvelope(thinBandSamples(bandEdge + 0.001), 'above');
    const below = fitEnvelope(thinBandSamples(bandEdge - 0.001), 'below');
    expect(above.bands.length).toBe(below.bands.length);
    // The sample's weight in any band changes by 0.002 / 2.5 = 0.08 % of it, so a continuous fit moves each limit
    // by a small share of the 4 m/s^2 between the thin band's values and its neighbours' (1 % of it: 0.04 m/s^2,
    // our tolerance). Counting the sample in one band or the other (a hard edge with a switch at 30 samples) moves
    // the thin band's left-turn limit by most of those 4 m/s^2.
    for (const [b, band] of above.bands.entries()) {
      const other = below.bands[b]!;
      for (const key of ['brakeMps2', 'accelMps2', 'leftMps2', 'rightMps2'] as const)
        expect(Math.abs(band[key] - other[key]), `${key} at ${band.speedMps} m/s`).toBeLessThan(0.04);
    }
  });

  it('a sample a hair either side of the 45-degree sector boundary moves no limit by more than 0.04 m/s^2', () => {
    const base = thinBandSamples(11);
    const at = (angleDeg: number) => {
      const samples = { ...base, axMps2: Float64Array.from(base.axMps2), ayMps2: Float64Array.from(base.ayMps2) };
      // One strong combined sample at 11 m/s, 12 m/s^2 in all, braking and turning left.
      const angle = (angleDeg * Math.PI) / 180;
      samples.axMps2[0] = -12 * Math.cos(angle);
      samples.ayMps2[0] = 12 * Math.sin(angle);
      samples.speedMps[0] = 11;
      return fitEnvelope(samples, `${angleDeg} deg`);
    };
    const brakeSide = at(44.99);
    const leftSide = at(45.01);
    // Same tolerance as above (ours): a hard sector boundary hands the whole sample from one cell to the other.
    for (const [b, band] of brakeSide.bands.entries())
      for (const key of ['brakeMps2', 'accelMps2', 'leftMps2', 'rightMps2'] as const)
        expect(Math.abs(band[key] - leftSide.bands[b]![key]), `${key} at ${band.speedMps} m/s`).toBeLessThan(0.04);
  });
});

describe('small perturbations of a realistic log move the demonstrated lap a little', () => {
  // Bound for the tiny perturbations (1 % of the samples, 0.1 km/h): a grip-limited lap goes as 1 / sqrt(grip)
  // (uniform circular motion, v = sqrt(a R)), so 0.25 % of lap time is every limit moved by 0.5 %; a perturbation
  // that changes the log by 1 % of its samples or 0.1 % of its speeds should move the limits by no more (our
  // tolerance, no source). Leaving out one lap of four is a quarter of the data, not a small change: half the
  // issue's 2 % acceptance band for the demonstrated lap.
  const SMALL_BOUND = 0.0025;
  const LAP_OUT_BOUND = 0.01;

  it('the demo session: 1 % of samples dropped and the speed up to 0.1 km/h off move it by at most 0.25 %', () => {
    const track = readTrackFile(path.join(projectRoot, 'tracks', 'velmora-downs.json'));
    const car = readCarFile(path.join(projectRoot, 'cars', 'tarnfell-gt.json'));
    const envelope = buildEnvelope(car, ambient);
    const line = referenceLine(track, car, { ambient, envelope, choice: 'auto' });
    const lap = demoDriver(track, car, ambient, envelope, line.offsetM);
    const session = parseTelemetryText(demoLogCsv(track, lap, DEFAULT_DEMO_LOG), 'demo-lap.csv', { columns: {} });
    const run = (log: TelemetrySession) =>
      compareSession(track, car, log, { ambient, ...(line.path ? { path: line.path } : {}), startSpeedMps: 0 });
    const base = run(session);
    const baseS = base.demonstratedLap!.lapTimeS;
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.double({ min: -0.1, max: 0.1, noNaN: true }), (seed, kph) => {
        const moved = run(perturbed(session, seed, kph / 3.6));
        const movedS = moved.demonstratedLap!.lapTimeS;
        expect(Math.abs(movedS / baseS - 1)).toBeLessThan(SMALL_BOUND);
        // The check: not slower than the driven lap beyond 0.5 %.
        expect(movedS).toBeLessThanOrEqual(moved.lap.lapTimeS * 1.005);
      }),
      // 0.1 km/h up is where a band's right-turn cell crossed 30 samples in the hard-banded fit.
      { numRuns: 8, examples: [[7, 0.1]] },
    );
  });

  const track = closedCircuit();
  const car = circuitCar();
  const known = simulate(track, car);
  for (const positionNoiseM of [0.5, 1.5]) {
    it(`a 10 Hz GPS-only log with ${positionNoiseM} m noise: one lap of four left out moves it by at most 1 %`, () => {
      const { session } = gpsSession(known, {
        laps: 4,
        rateHz: 10,
        positionNoiseM,
        speedNoiseMps: 0.3 / 3.6,
        jitter: 0.3,
        seed: 1,
      });
      const run = (log: TelemetrySession) => compareSession(track, car, log, { ambient });
      const baseS = run(session).demonstratedLap!.lapTimeS;
      const lapS = known.lapTimeS;
      for (let left = 0; left < 4; left++) {
        const fewer = keepRows(session, (i) => Math.floor(session.timeS[i]! / lapS) !== left);
        const moved = run(fewer);
        const movedS = moved.demonstratedLap!.lapTimeS;
        expect(Math.abs(movedS / baseS - 1), `lap ${left} left out`).toBeLessThan(LAP_OUT_BOUND);
        // The checks: within 2 % of the known lap, not slower than the driven lap beyond 0.5 %.
        expect(Math.abs(movedS / lapS - 1)).toBeLessThan(0.02);
        expect(movedS).toBeLessThanOrEqual(moved.lap.lapTimeS * 1.005);
      }
      // And the tiny perturbations, on a few draws.
      fc.assert(
        fc.property(fc.integer({ min: 1, max: 1e6 }), fc.double({ min: -0.1, max: 0.1, noNaN: true }), (seed, kph) => {
          const movedS = run(perturbed(session, seed, kph / 3.6)).demonstratedLap!.lapTimeS;
          expect(Math.abs(movedS / baseS - 1)).toBeLessThan(SMALL_BOUND);
        }),
        { numRuns: 4 },
      );
    });
  }
});
