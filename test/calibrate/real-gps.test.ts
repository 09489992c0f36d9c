// Calibration on a real GPS log: one lap of a kart on an outdoor circuit, logged by a consumer receiver as NMEA 0183
// at an irregular 10-25 Hz, position and speed only (real GPS noise; no pedals, no accelerometer, no track file).
// Source: the test fixtures of the open-source DovesLapTimer library (TheAngryRaven/DovesLapTimer, file
// examples/real_track_data_debug/gps_race_data_long_lap.h), GNU GPL v3, read from ../shared/data/real-gps/ and not
// copied here. The track is the log's own path, as no track file comes with it.

import { describe, expect, it } from 'vitest';
import { readTelemetryFile } from '../../src/io/telemetry/read-telemetry.js';
import { parseCarJson } from '../../src/io/read-car.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { simulate } from '../../src/solve/simulate.js';
import { calibrationSamples } from '../../src/calibrate/samples.js';
import { calibrateCar } from '../../src/calibrate/calibrate-car.js';
import { kartTrackOf, REAL_KART_LOG, realKartLogPresent } from '../helpers/real-gps.js';

const file = REAL_KART_LOG;
const present = realKartLogPresent;
if (!present) console.warn(`skipping the real-GPS calibration: ${file} is absent`);

describe.skipIf(!present)('calibration on a real kart lap (GPS only)', () => {
  it('fits a kart that drives the lap within a few per cent of the driver, where a guessed car is far off', async () => {
    const session = await readTelemetryFile(file, { columns: {} });
    const track = kartTrackOf(session);
    // An invented guess at a kart with its driver.
    const guess = parseCarJson(
      JSON.stringify({
        name: 'kart guess',
        massKg: 240,
        rollingResistanceCoeff: 0.02,
        tyre: { muLong: 1.0, muLat: 1.1 },
        aero: { dragAreaM2: 0.6, liftAreaM2: 0 },
        powertrain: { maxPowerW: 7000 },
      }),
      'kart guess',
    );
    const ambient = ambientFrom();
    const samples = calibrationSamples(session, track);
    const result = calibrateCar(guess, ambient, samples);
    // The lateral acceleration comes from the driver's own path. Here the track is the log's own path smoothed at
    // 10 m, so the path and the centreline are one curve up to that smoothing: the two fits must agree on the grip
    // within one standard error.
    expect(samples.lateralPath?.path).toBe('driver');
    const n = track.distanceM.length;
    const onCentreline = Float64Array.from(
      samples.ayMps2,
      (_, i) => samples.speedMps[i]! ** 2 * track.curvaturePerM[i % n]!,
    );
    const centrelineMu = calibrateCar(guess, ambient, { ...samples, ayMps2: onCentreline }).fitted.find(
      (f) => f.field === 'tyre.muLat',
    )!;
    const fitted = new Map(result.fitted.map((f) => [f.field, f]));
    for (const field of ['powertrain.maxPowerW', 'aero.dragAreaM2', 'tyre.muLat', 'tyre.muLong']) {
      expect(fitted.get(field), field).toBeDefined();
      expect(fitted.get(field)!.sd).toBeGreaterThan(0);
    }
    // A kart has no wings: the downforce the log shows must be nothing within two standard errors (from memory:
    // karts carry no aerodynamic devices that make downforce).
    const muLat = fitted.get('tyre.muLat')!;
    expect(Math.abs(muLat.value - centrelineMu.value)).toBeLessThan(muLat.sd);
    const lift = fitted.get('aero.liftAreaM2');
    if (lift) expect(Math.abs(lift.value)).toBeLessThan(2 * lift.sd);
    const driverLapS = session.timeS[session.count - 1]! - session.timeS[0]!;
    const start = { ambient, startSpeedMps: session.speedMps![0]! };
    const guessed = simulate(track, guess, start).lapTimeS;
    const calibrated = simulate(track, result.car, start).lapTimeS;
    // The issue behind the calibration saw a generic car put a kart's reference 13.6 % off its real laps; fitted to
    // the lap itself, the reference must come within 5 % of it, and much closer than the guess.
    expect(Math.abs(calibrated / driverLapS - 1)).toBeLessThan(0.05);
    expect(Math.abs(guessed / driverLapS - 1)).toBeGreaterThan(3 * Math.abs(calibrated / driverLapS - 1));
  });
});
