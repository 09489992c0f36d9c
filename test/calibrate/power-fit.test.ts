// The full-throttle fit of power and drag area against worked cases computed here: an acceleration run integrated
// from m dv/dt = P / v - 1/2 rho CdA v^2 - Crr m g, and the least-squares normal equations solved by hand.

import { describe, expect, it } from 'vitest';
import { fitDrive } from '../../src/calibrate/power-fit.js';
import type { CalibrationSamples } from '../../src/calibrate/samples.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { driveForceTable } from '../../src/car/drive-force.js';
import type { Car } from '../../src/car/types.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';
import { isInputError } from '../../src/errors.js';
import { testCar } from '../helpers/cars.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from '../report/converted-quantities.js';

const ambient = ambientFrom();
const G = 9.80665;

/** A straight-line run at full throttle, integrated by the classical fourth-order Runge-Kutta method in 1 ms steps. */
function accelerationRun(car: Car, fromMps: number, durationS: number, rateHz: number): CalibrationSamples {
  const drive = driveForceTable(car, ambient.powerFactor);
  const halfRho = 0.5 * ambient.airDensityKgPerM3;
  const accel = (v: number) =>
    (drive.forceN(v) - halfRho * car.aero.dragAreaM2 * v * v - car.rollingResistanceCoeff * car.massKg * G) /
    car.massKg;
  const count = Math.round(durationS * rateHz);
  const timeS = new Float64Array(count);
  const speedMps = new Float64Array(count);
  const axMps2 = new Float64Array(count);
  let v = fromMps;
  const dt = 0.001;
  const stepsPerSample = Math.round(1 / rateHz / dt);
  for (let k = 0; k < count; k++) {
    timeS[k] = k / rateHz;
    speedMps[k] = v;
    axMps2[k] = accel(v);
    for (let s = 0; s < stepsPerSample; s++) {
      const k1 = accel(v);
      const k2 = accel(v + 0.5 * dt * k1);
      const k3 = accel(v + 0.5 * dt * k2);
      const k4 = accel(v + dt * k3);
      v += (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    }
  }
  return {
    source: 'acceleration run',
    count,
    timeS,
    speedMps,
    axMps2,
    ayMps2: new Float64Array(count),
    lateralPath: null,
    throttle: new Float64Array(count).fill(1),
    brake: new Float64Array(count),
    gear: null,
    runStarts: Int32Array.from([0, count]),
    derivedChannels: [],
    notes: [],
  };
}

// Grip high enough, and all wheels driven, so the engine and not the tyres limits the run from 20 m/s.
const truth = testCar({
  massKg: 1000,
  mu: 2,
  maxPowerW: 150_000,
  dragAreaM2: 0.7,
  rollingResistanceCoeff: 0.012,
  drive: 'all',
});
const base = {
  ...truth,
  powertrain: { ...truth.powertrain, maxPowerW: 100_000 },
  aero: { ...truth.aero, dragAreaM2: 0.4 },
};

describe('full-throttle fit', () => {
  it('recovers the power and drag area of an integrated acceleration run', () => {
    const run = accelerationRun(truth, 20, 25, 50);
    const fit = fitDrive(base, ambient, run);
    expect(fit.driveScale * base.powertrain.maxPowerW).toBeCloseTo(150_000, 0);
    expect(fit.dragAreaM2).toBeCloseTo(0.7, 5);
    expect(fit.dragAreaSd).not.toBeNull();
    expect(fit.stretches).toBe(1);
  });

  it('gives the least-squares answer and the covariance sigma^2 (X^T X)^-1 of the normal equations', () => {
    // With uniform noise (no sample beyond the trimming), the fit must equal the 2 x 2 normal equations solved by
    // Cramer's rule, and its standard errors the textbook sigma^2 (X^T X)^-1 with sigma^2 = RSS / (n - 2)
    // (Draper and Smith, Applied Regression Analysis, 1998, ch. 5): one stretch is one cluster, too few for the sandwich.
    const run = accelerationRun(truth, 20, 25, 50);
    const { uniform } = seededRandom(7);
    for (let i = 0; i < run.count; i++) run.axMps2[i]! += 0.6 * (uniform() - 0.5);
    const fit = fitDrive(base, ambient, run);
    const drive = driveForceTable(base, ambient.powerFactor);
    const halfRho = 0.5 * ambient.airDensityKgPerM3;
    let s11 = 0;
    let s12 = 0;
    let s22 = 0;
    let s1y = 0;
    let s2y = 0;
    const rows: [number, number, number][] = [];
    for (let i = 0; i < run.count; i++) {
      const v = run.speedMps[i]!;
      const x1 = drive.forceN(v);
      const x2 = -halfRho * v * v;
      const y = base.massKg * run.axMps2[i]! + base.rollingResistanceCoeff * base.massKg * G;
      rows.push([x1, x2, y]);
      s11 += x1 * x1;
      s12 += x1 * x2;
      s22 += x2 * x2;
      s1y += x1 * y;
      s2y += x2 * y;
    }
    const det = s11 * s22 - s12 * s12;
    const k = (s1y * s22 - s2y * s12) / det;
    const cda = (s11 * s2y - s12 * s1y) / det;
    let rss = 0;
    for (const [x1, x2, y] of rows) rss += (y - k * x1 - cda * x2) ** 2;
    const sigma2 = rss / (rows.length - 2);
    expect(fit.driveScale).toBeCloseTo(k, 10);
    expect(fit.dragAreaM2).toBeCloseTo(cda, 10);
    expect(fit.driveScaleSd).toBeCloseTo(Math.sqrt((sigma2 * s22) / det), 12);
    expect(fit.dragAreaSd!).toBeCloseTo(Math.sqrt((sigma2 * s11) / det), 12);
    expect(fit.correlation).toBeCloseTo(-s12 / Math.sqrt(s11 * s22), 10);
  });

  it('scales the torque curve of a car with gears', () => {
    const geared: Car = {
      ...truth,
      powertrain: {
        maxPowerW: 150_000,
        drivetrainEfficiency: 0.9,
        drive: 'all',
        gearing: {
          torqueCurve: { rpm: [1000, 3000, 5000, 7000], torqueNm: [150, 220, 240, 200] },
          gearRatios: [3.0, 2.0, 1.5, 1.2, 1.0],
          finalDrive: 3.7,
          wheelRadiusM: 0.32,
          shiftTimeS: 0,
          maxRpm: 7000,
        },
      },
    };
    const run = accelerationRun(geared, 15, 20, 50);
    const weaker = {
      ...geared,
      powertrain: {
        ...geared.powertrain,
        maxPowerW: 120_000,
        gearing: {
          ...geared.powertrain.gearing!,
          torqueCurve: { rpm: [1000, 3000, 5000, 7000], torqueNm: [120, 176, 192, 160] },
        },
      },
    };
    const fit = fitDrive(weaker, ambient, run);
    expect(fit.driveScale).toBeCloseTo(1.25, 4);
    expect(fit.dragAreaM2).toBeCloseTo(0.7, 3);
  });

  it('keeps the drag of the base car when the log covers too narrow a band of speed to tell it from power', () => {
    // Half a second of full throttle at a time, always around the same speed: P / v and v^2 barely change.
    const run = accelerationRun(truth, 60, 4, 50);
    const fit = fitDrive(base, ambient, run);
    expect(fit.dragAreaSd).toBeNull();
    expect(fit.dragAreaM2).toBe(base.aero.dragAreaM2);
    expect(fit.notes.map((note) => noteText(note)).join(' ')).toMatch(/drag kept from the base car/);
    // The speed band in mph under imperial, the km/h figures converted (1 mph = 0.44704 m/s, NIST SP 811).
    const [metricText, imperialText] = ['metric', 'imperial'].map((system) =>
      noteText(fit.notes[0]!, displayUnits(system as 'metric' | 'imperial')),
    );
    expect(metricText).toMatch(/full throttle only between \d+ and \d+ km\/h/);
    expect(imperialText).toMatch(/full throttle only between \d+ and \d+ mph/);
    expectConverted(metricText!, imperialText!);
  });

  it('refuses a log without a full-throttle stretch long enough, saying how long is needed', () => {
    const run = accelerationRun(truth, 20, 10, 50);
    // Lift every second: no stretch reaches 2 s.
    for (let i = 0; i < run.count; i++) if (Math.floor(run.timeS[i]!) % 2 === 1) run.throttle![i] = 0.3;
    let message = '';
    try {
      fitDrive(base, ambient, run);
    } catch (error) {
      expect(isInputError(error)).toBe(true);
      message = (error as Error).message;
    }
    expect(message).toMatch(
      /^acceleration run: no full-throttle stretch long enough to fit power and drag: at least one of 2 s in a straight line is needed \(the longest found is 1\.0 s\)$/,
    );
  });
});
