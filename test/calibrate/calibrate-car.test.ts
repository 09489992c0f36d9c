// The calibration on synthetic logs made by the solver for a car whose power, drag area, grip and downforce are
// known, with the noise of a club data logger added (./synthetic-log.ts): an empirical coverage check of the
// standard errors, the ring where grip and downforce cannot be told apart, and the refusals.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { calibrationSamples, DERIVED_GRIP_NOTE } from '../../src/calibrate/samples.js';
import { calibrateCar, CALIBRATED_FIELDS } from '../../src/calibrate/calibrate-car.js';
import { fitGrip } from '../../src/calibrate/grip-fit.js';
import { isInputError } from '../../src/errors.js';
import { testCircuit } from '../compare/fixtures.js';
import { ring } from '../line/hand-tracks.js';
import { testCar } from '../helpers/cars.js';
import { syntheticSession } from './synthetic-log.js';
import { guessedCar, knownCar, knownValues } from './known-car.js';

const ambient = ambientFrom();
const truth = knownCar;
const known = knownValues;
const guess = guessedCar;

describe('calibration coverage', () => {
  it('recovers each identifiable parameter within 2 standard errors in at least 90 % of 50 seeded logs', () => {
    const track = testCircuit();
    const lap = simulate(track, truth, { ambient });
    const estimates: Record<string, number[]> = {};
    const errors: Record<string, number[]> = {};
    const covered: Record<string, number> = {};
    for (let seed = 1; seed <= 50; seed++) {
      const samples = calibrationSamples(syntheticSession(track, lap, { seed, laps: 2, rateHz: 20 }), null);
      const result = calibrateCar(guess, ambient, samples);
      for (const fitted of result.fitted) {
        (estimates[fitted.field] ??= []).push(fitted.value);
        (errors[fitted.field] ??= []).push(fitted.sd);
        if (Math.abs(fitted.value - known[fitted.field]!) <= 2 * fitted.sd)
          covered[fitted.field] = (covered[fitted.field] ?? 0) + 1;
      }
    }
    // The circuit has corners from 50 m to 300 m radius and braking from several speeds: power, drag, both grips
    // and the downforce are identifiable in every log (load sensitivity is not, and is kept as given).
    expect(Object.keys(estimates).sort()).toEqual(Object.keys(known).sort());
    for (const field of Object.keys(known)) {
      const values = estimates[field]!;
      expect(values).toHaveLength(50);
      expect(covered[field] ?? 0, `${field} covered`).toBeGreaterThanOrEqual(45);
      // The standard errors against the scatter of the estimates over the 50 logs: within a factor of 1.5.
      const mean = values.reduce((a, b) => a + b, 0) / values.length;
      const scatter = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
      const typicalSe = errors[field]!.reduce((a, b) => a + b, 0) / values.length;
      expect(typicalSe / scatter, `${field} standard error / scatter`).toBeGreaterThan(1 / 1.5);
      expect(typicalSe / scatter, `${field} standard error / scatter`).toBeLessThan(1.5);
    }
  });
});

describe('calibration of a GPS-only log', () => {
  // Speed and positions only, no pedals (a GPS lap timer): the accelerations are derived on the track's grid. The
  // power and drag stand on the speed trace alone and must hold to their standard errors as with an accelerometer
  // (within 3: a normal estimate strays further with probability 0.3 %, standard normal tables). The fitted car's lap
  // is held to the 2 % the comparison's demonstrated lap is held to on GPS-only logs (issue 11's acceptance level).
  const track = testCircuit();
  const lap = simulate(track, truth, { ambient });
  for (const rateHz of [10, 25]) {
    it(`at ${rateHz} Hz: power and drag within 3 standard errors, the fitted car's lap within 2 %`, () => {
      for (let seed = 1; seed <= 3; seed++) {
        const session = syntheticSession(track, lap, { seed, laps: 3, rateHz, accelerometer: false, throttle: false });
        const samples = calibrationSamples(session, track);
        expect(samples.derivedChannels).toEqual(expect.arrayContaining(['axMps2', 'ayMps2']));
        const result = calibrateCar(guess, ambient, samples);
        expect(result.notes).toContain(DERIVED_GRIP_NOTE);
        for (const field of ['powertrain.maxPowerW', 'aero.dragAreaM2']) {
          const fitted = result.fitted.find((f) => f.field === field);
          expect(fitted, `${field} fitted (seed ${seed})`).toBeDefined();
          expect(Math.abs(fitted!.value - known[field]!), `${field} (seed ${seed})`).toBeLessThanOrEqual(
            3 * fitted!.sd,
          );
        }
        const fittedLapS = simulate(track, result.car, { ambient }).lapTimeS;
        expect(Math.abs(fittedLapS / lap.lapTimeS - 1), `lap (seed ${seed})`).toBeLessThan(0.02);
      }
    });
  }

  it('recovers the known grip without bias: 16 logs at 10 and 25 Hz, each grip within 2 standard errors in 14', () => {
    // Before the one-sided term was held out for derived channels, the skewness pre-test let it in on half of these
    // logs (the smoothing blurs corner entries and exits inside the boundary) and muLat came out 3.6 % high on
    // average, up to 7 %. The known values are those the synthetic logs were made with; 14 of 16 is what a 95 %
    // coverage allows (binomial, P(fewer) = 4 %).
    const grips = ['tyre.muLat', 'tyre.muLong'];
    const covered: Record<string, number> = {};
    const sums: Record<string, number> = {};
    for (const rateHz of [10, 25]) {
      for (let seed = 1; seed <= 8; seed++) {
        const session = syntheticSession(track, lap, { seed, laps: 3, rateHz, accelerometer: false, throttle: false });
        const result = calibrateCar(guess, ambient, calibrationSamples(session, track));
        expect(result.grip.insideSdMps2, `inside term (seed ${seed}, ${rateHz} Hz)`).toBe(0);
        for (const field of grips) {
          const fitted = result.fitted.find((f) => f.field === field)!;
          expect(fitted, `${field} fitted`).toBeDefined();
          sums[field] = (sums[field] ?? 0) + fitted.value;
          if (Math.abs(fitted.value - known[field]!) <= 2 * fitted.sd) covered[field] = (covered[field] ?? 0) + 1;
        }
      }
    }
    for (const field of grips) {
      expect(covered[field] ?? 0, `${field} covered`).toBeGreaterThanOrEqual(14);
      // The mean of 16 within 1.5 % of the known grip (the old fit's mean was 3.6 % high on muLat).
      expect(Math.abs(sums[field]! / 16 / known[field]! - 1), `${field} mean`).toBeLessThan(0.015);
    }
  });
});

describe('identifiability on one speed', () => {
  it('reports grip and downforce as not separable on a ring, and fits the grip that the one speed demands', () => {
    const track = ring(120, 12, 1);
    const lap = simulate(track, truth, { ambient });
    const samples = calibrationSamples(syntheticSession(track, lap, { seed: 3, laps: 4, rateHz: 20 }), null);
    const fit = fitGrip(guess, ambient, samples);
    const entangled = fit.notSeparable.find((set) => set.fields.includes('aero.liftAreaM2'));
    expect(entangled?.fields).toContain('tyre.muLat');
    expect(fit.kept.map((k) => k.field)).toContain('aero.liftAreaM2');
    expect(fit.fields).toContain('tyre.muLat');
    // With the downforce kept at the guess, the fitted grip must give the ring's steady state in the point-mass
    // model (Brayshaw and Harrison 2005): the tyres carry N = m g + 1/2 rho ClA v^2, and while cornering they must
    // also push against drag and rolling resistance c, so on the friction ellipse (c / T)^2 + (ay / L)^2 = 1 with the
    // traction limit T = muLong N_rear / m (rear drive, half the load) and the lateral limit L = muLat N / m.
    const v = lap.trace.speedMps[0]!;
    const ay = (v * v) / 120;
    const halfRho = 0.5 * ambient.airDensityKgPerM3;
    const loadN = guess.massKg * 9.80665 + halfRho * guess.aero.liftAreaM2 * v * v;
    const c = (halfRho * guess.aero.dragAreaM2 * v * v + guess.rollingResistanceCoeff * loadN) / guess.massKg;
    const traction = (guess.tyre.muLong * loadN) / 2 / guess.massKg;
    const demanded = (ay / Math.sqrt(1 - (c / traction) ** 2)) * (guess.massKg / loadN);
    const k = fit.fields.indexOf('tyre.muLat');
    // Within 0.2 %: the noise of the log and its 4 laps allow no more.
    expect(Math.abs(fit.values[k]! / demanded - 1)).toBeLessThan(0.002);
  });
});

describe('refusals', () => {
  it('refuses a fit whose grip comes out above 3, and names the field and the bounds', () => {
    const track = testCircuit();
    const wild = testCar({
      massKg: 1000,
      muLat: 3.4,
      muLong: 3.3,
      dragAreaM2: 0.8,
      liftAreaM2: 0,
      maxPowerW: 600_000,
      rollingResistanceCoeff: 0.015,
      drive: 'all',
    });
    const lap = simulate(track, wild, { ambient });
    const samples = calibrationSamples(syntheticSession(track, lap, { seed: 5, laps: 2 }), null);
    let message = '';
    try {
      calibrateCar(
        { ...guess, powertrain: { ...guess.powertrain, drive: 'all', maxPowerW: 500_000 } },
        ambient,
        samples,
      );
    } catch (error) {
      expect(isInputError(error)).toBe(true);
      message = (error as Error).message;
    }
    expect(message).toMatch(
      /^synthetic log \(seed 5\): calibration refused: tyre\.muLat = 3\.\d+ is outside physical bounds \(0\.3 to 3\)/,
    );
    expect(message).toMatch(/nothing written$/);
  });

  it('lists every field a calibration may fit', () => {
    expect([...CALIBRATED_FIELDS].sort()).toEqual([
      'aero.dragAreaM2',
      'aero.liftAreaM2',
      'powertrain.maxPowerW',
      'tyre.loadSensitivity',
      'tyre.muLat',
      'tyre.muLong',
    ]);
  });
});
