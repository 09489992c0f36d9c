// Accelerations derived from GPS-only logs. Synthetic logs of a known reference lap (several laps, 10 and 25 Hz
// with jittered intervals, 0.5-1.5 m of white position noise, 0.3 km/h of speed noise) check the derived channels
// against the lap's own; the real kart log checks physical bounds.

import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { simulate } from '../../src/solve/simulate.js';
import { DEFAULT_DERIVE, deriveSessionAccelerations } from '../../src/compare/derive-session.js';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { STANDARD_GRAVITY_MPS2 } from '../../src/units.js';
import { circuitCar } from './fixtures.js';
import { closedCircuit, gpsSession } from './gps-session.js';

const reference = simulate(closedCircuit(), circuitCar());
const SPEED_NOISE_MPS = 0.3 / 3.6;

function rms(values: number[]): number {
  return Math.sqrt(values.reduce((sum, v) => sum + v * v, 0) / Math.max(1, values.length));
}

describe('accelerations derived from a GPS-only log', () => {
  for (const rateHz of [10, 25]) {
    for (const positionNoiseM of [0.5, 1.5]) {
      it(`${rateHz} Hz, ${positionNoiseM} m position noise: errors stated and bounded`, () => {
        const { session, trueAxMps2, trueAyMps2 } = gpsSession(reference, {
          laps: 4,
          rateHz,
          positionNoiseM,
          speedNoiseMps: SPEED_NOISE_MPS,
          jitter: 0.3,
          seed: rateHz * 10 + positionNoiseM * 2,
        });
        const derived = deriveSessionAccelerations(session);
        const quality = derived.quality!;
        expect(derived.derived).toEqual(['axMps2', 'ayMps2']);
        expect(quality.problems).toEqual([]);
        // Linear interpolation onto the grid at a uniform fraction w averages neighbours: the white noise left has
        // variance sigma^2 E[(1 - w)^2 + w^2] = 2/3 sigma^2 (direct calculation); the estimate within 30 % of it.
        expect(quality.positionNoiseM / (positionNoiseM * Math.sqrt(2 / 3))).toBeGreaterThan(0.7);
        expect(quality.positionNoiseM / (positionNoiseM * Math.sqrt(2 / 3))).toBeLessThan(1.3);
        const t = session.timeS;
        const ax = derived.session.axMps2!;
        const ay = derived.session.ayMps2!;
        // Where the true acceleration is steady over the filter's window, the error is the noise the window
        // rule predicts (its target); allow twice that for the correlation interpolation leaves in the noise.
        const steady = (truth: Float64Array, i: number, halfS: number) => {
          for (let j = i; j >= 0 && t[i]! - t[j]! <= halfS; j--)
            if (Math.abs(truth[j]! - truth[i]!) > 0.05) return false;
          for (let j = i; j < session.count && t[j]! - t[i]! <= halfS; j++)
            if (Math.abs(truth[j]! - truth[i]!) > 0.05) return false;
          return true;
        };
        const steadyAx: number[] = [];
        const steadyAy: number[] = [];
        const allAx: number[] = [];
        const allAy: number[] = [];
        for (let i = 0; i < session.count; i++) {
          allAx.push(ax[i]! - trueAxMps2[i]!);
          allAy.push(ay[i]! - trueAyMps2[i]!);
          if (steady(trueAxMps2, i, quality.longitudinalHalfWindowS + 0.2)) steadyAx.push(ax[i]! - trueAxMps2[i]!);
          if (steady(trueAyMps2, i, quality.lateralHalfWindowS + 0.2)) steadyAy.push(ay[i]! - trueAyMps2[i]!);
        }
        expect(steadyAy.length).toBeGreaterThan(session.count / 5);
        expect(rms(steadyAx)).toBeLessThan(2 * DEFAULT_DERIVE.targetNoiseMps2);
        expect(rms(steadyAy)).toBeLessThan(2 * DEFAULT_DERIVE.targetNoiseMps2);
        // Over the whole lap the error is mostly the smoothing of this lap's instant steps (a quasi-steady-state
        // lap switches from full braking to the cornering limit at once); our acceptance bounds, not a published
        // figure: 0.2 g longitudinal, 0.35 g lateral (measured 0.12-0.17 g and 0.24-0.33 g: 1.5 m of noise needs a
        // window of 4-5 s).
        expect(rms(allAx)).toBeLessThan(0.2 * STANDARD_GRAVITY_MPS2);
        expect(rms(allAy)).toBeLessThan(0.35 * STANDARD_GRAVITY_MPS2);
      });
    }
  }

  it('names a log too sparse or too gappy to trust', () => {
    const sparse = gpsSession(reference, {
      laps: 2,
      rateHz: 2,
      positionNoiseM: 0.5,
      speedNoiseMps: SPEED_NOISE_MPS,
      jitter: 0,
      seed: 3,
    });
    expect(deriveSessionAccelerations(sparse.session).quality!.problems.join(' ')).toMatch(/too few/);
    const full = gpsSession(reference, {
      laps: 2,
      rateHz: 10,
      positionNoiseM: 0.5,
      speedNoiseMps: SPEED_NOISE_MPS,
      jitter: 0,
      seed: 4,
    }).session;
    // Drop 3 s of samples in the middle of the first lap.
    const keep = Array.from(full.timeS, (time: number) => !(time > 20 && time < 23));
    const pick = (values: Float64Array | null) => (values ? values.filter((_, i) => keep[i]) : null);
    const gappy = {
      ...full,
      count: keep.filter(Boolean).length,
      timeS: pick(full.timeS)!,
      xM: pick(full.xM),
      yM: pick(full.yM),
      speedMps: pick(full.speedMps),
    };
    expect(deriveSessionAccelerations(gappy).quality!.problems.join(' ')).toMatch(/gap .* longer than a corner/);
  });
});

const REAL_LOG = '../shared/data/real-gps/kart-circuit-long-layout.nmea';

// Real data: one lap of a kart on an outdoor kart circuit, NMEA 0183 at 10-25 Hz, from the test fixtures of the
// open-source DovesLapTimer library (GPL v3), as ../shared/data/real-gps/README.md credits it.
describe.skipIf(!existsSync(REAL_LOG))('the real kart GPS log', () => {
  it('gives accelerations within a kart’s physical bounds and no absurd peaks', () => {
    const session = parseTelemetryText(readFileSync(REAL_LOG, 'utf8'), REAL_LOG, { columns: {} });
    const derived = deriveSessionAccelerations(session);
    expect(derived.quality!.problems).toEqual([]);
    const g = STANDARD_GRAVITY_MPS2;
    const ax = Array.from(derived.session.axMps2!, Math.abs).sort((a, b) => a - b);
    const ay = Array.from(derived.session.ayMps2!, Math.abs).sort((a, b) => a - b);
    // Bounds from memory (no source): karts corner at up to about 2.5-3 g and brake at up to about 1.5-2 g;
    // they accelerate at well under 1 g. Anything past 3 g laterally or 2 g longitudinally is noise.
    expect(ay.at(-1)!).toBeLessThan(3 * g);
    expect(ax.at(-1)!).toBeLessThan(2 * g);
    // A kart does corner: the lateral acceleration's 95th percentile is at least 0.5 g (from memory).
    expect(ay[Math.floor(0.95 * ay.length)]!).toBeGreaterThan(0.5 * g);
    // No isolated spikes: the peak is within 1.5 times the 99th percentile.
    expect(ay.at(-1)!).toBeLessThan(1.5 * ay[Math.floor(0.99 * ay.length)]!);
    expect(ax.at(-1)!).toBeLessThan(1.5 * ax[Math.floor(0.99 * ax.length)]!);
  });
});
