// The quasi-steady-state solver against closed-form results from outside the project.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments, type TrackSegment } from '../../src/track/segments.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { pointMassEnvelope } from '../../src/car/point-mass.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';
import { speedWherePowerMeets } from '../helpers/bisect.js';
import { projectRoot } from '../helpers/cli.js';
import { readCarFile } from '../../src/io/read-car.js';

const ring = (radiusM: number, stepM = 1) =>
  trackFromSegments(
    { name: 'ring', closed: true, widthM: 10, segments: [{ kind: 'arc', radiusM, angleDeg: 360 }] },
    stepM,
    'ring',
  );

const openStage = (segments: TrackSegment[], stepM = 1) =>
  trackFromSegments({ name: 'stage', closed: false, widthM: 10, segments }, stepM, 'stage');

describe('constant-radius cornering', () => {
  // Steady-state cornering: v = sqrt(mu g R) (Milliken and Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 2).
  it('reaches v = sqrt(mu g R) on a ring without downforce', () => {
    const car = testCar({ mu: 1.1 });
    const lap = simulate(ring(100), car);
    const expected = Math.sqrt(1.1 * g * 100);
    expect(lap.minSpeedMps).toBeCloseTo(expected, 3);
    expect(lap.maxSpeedMps).toBeCloseTo(expected, 3);
    expect(lap.lapTimeS).toBeCloseTo((2 * Math.PI * 100) / expected, 2);
  });

  // With downforce: m v^2 / R = mu (m g + 1/2 rho ClA v^2), so v^2 = mu g R / (1 - mu rho ClA R / (2 m))
  // (Milliken and Milliken, Race Car Vehicle Dynamics, 1995).
  it('reaches v^2 = mu g R / (1 - mu rho ClA R / (2 m)) with downforce', () => {
    const car = testCar({ mu: 1.4, liftAreaM2: 3, massKg: 800 });
    const rho = ambientFrom().airDensityKgPerM3;
    const radiusM = 80;
    const expected = Math.sqrt((1.4 * g * radiusM) / (1 - (1.4 * rho * 3 * radiusM) / (2 * 800)));
    const lap = simulate(ring(radiusM), car);
    expect(Math.abs(lap.minSpeedMps - expected) / expected).toBeLessThan(1e-4);
  });
});

describe('straight-line kinematics', () => {
  // Constant-deceleration kinematics: braking distance d = (v1^2 - v2^2) / (2 mu g).
  it('brakes over (v1^2 - v2^2) / (2 mu g) into a hairpin', () => {
    const mu = 1.2;
    // A car with almost no power and no resistances holds its start speed on the straight.
    const car = testCar({ mu, maxPowerW: 1 });
    const v1 = 100 / 3.6;
    const straightM = 400;
    const radiusM = 30;
    const track = openStage([
      { kind: 'straight', lengthM: straightM },
      { kind: 'arc', radiusM, angleDeg: 180 },
    ]);
    const lap = simulate(track, car, { startSpeedMps: v1 });
    const v2 = Math.sqrt(mu * g * radiusM);
    const expectedStartM = straightM - (v1 * v1 - v2 * v2) / (2 * mu * g);
    expect(lap.brakingZones).toHaveLength(1);
    expect(Math.abs(lap.brakingZones[0]!.startM - expectedStartM)).toBeLessThan(1);
    expect(lap.brakingZones[0]!.entrySpeedMps).toBeCloseTo(v1, 2);
    expect(lap.brakingZones[0]!.minSpeedMps).toBeCloseTo(v2, 2);
  });

  // Drag-limited top speed where P = 1/2 rho CdA v^3 + Crr m g v (power balance; e.g. Gillespie, Fundamentals
  // of Vehicle Dynamics, SAE 1992, ch. 2). Solved here by bisection, independently of the program. The air is
  // at the engine rating's reference conditions (SAE J1349: 25 °C, 99 kPa dry air), where the rated power applies
  // as it is, and its density comes from the ideal gas law with R = 287.05 J/(kg K) (ISO 2533).
  it('reaches the drag-limited top speed on a long straight', () => {
    const car = testCar({
      maxPowerW: 150_000,
      dragAreaM2: 0.7,
      rollingResistanceCoeff: 0.012,
      massKg: 1000,
      mu: 1.3,
      drive: 'rear',
    });
    const ambient = ambientFrom({ airTempC: 25, pressureHpa: 990 });
    const rho = 99_000 / (287.05 * 298.15);
    const demand = (v: number) => 0.5 * rho * 0.7 * v ** 3 + 0.012 * 1000 * g * v;
    const lo = speedWherePowerMeets(demand, 150_000);
    const lap = simulate(openStage([{ kind: 'straight', lengthM: 30_000 }], 5), car, { ambient });
    expect(Math.abs(lap.maxSpeedMps - lo) / lo).toBeLessThan(0.005);
  });

  // Common practice (no source): at 200 km/h a car covers 5 m in about 0.09 s.
  it('takes about 0.09 s for 5 m at 200 km/h', () => {
    const car = testCar({ maxPowerW: 1 });
    const lap = simulate(openStage([{ kind: 'straight', lengthM: 100 }]), car, { startSpeedMps: 200 / 3.6 });
    const index = lap.trace.stationM.findIndex((s) => Math.abs(s - 5) < 1e-9);
    expect(lap.trace.timeS[index]).toBeGreaterThan(0.085);
    expect(lap.trace.timeS[index]).toBeLessThan(0.095);
  });
});

describe('closed-form lap time', () => {
  // Two straights of length L joined by two semicircles of radius R, accelerating and braking at mu g
  // (no drag, unlimited power, all-wheel traction). From the kinematics above: corner speed vc = sqrt(mu g R);
  // each straight accelerates from vc over L/2 and brakes back over L/2, so its peak speed is
  // vp = sqrt(vc^2 + mu g L) and it takes 2 (vp - vc) / (mu g); the two semicircles take 2 pi R / vc.
  it('matches T = 4 (vp - vc) / (mu g) + 2 pi R / vc within 0.5 % at the default step', () => {
    const mu = 1.2;
    const L = 500;
    const R = 50;
    const track = trackFromSegments(
      {
        name: 'stadium',
        closed: true,
        widthM: 10,
        segments: [
          { kind: 'straight', lengthM: L },
          { kind: 'arc', radiusM: R, angleDeg: 180 },
          { kind: 'straight', lengthM: L },
          { kind: 'arc', radiusM: R, angleDeg: 180 },
        ],
      },
      1,
      'stadium',
    );
    const vc = Math.sqrt(mu * g * R);
    const vp = Math.sqrt(vc * vc + mu * g * L);
    const expected = (4 * (vp - vc)) / (mu * g) + (2 * Math.PI * R) / vc;
    const lap = simulate(track, testCar({ mu }));
    expect(Math.abs(lap.lapTimeS - expected) / expected).toBeLessThan(0.005);
    expect(Math.abs(lap.maxSpeedMps - vp) / vp).toBeLessThan(0.005);
    expect(lap.brakingZones).toHaveLength(2);
  });
});

describe('lap invariants', () => {
  const segments: TrackSegment[] = [
    { kind: 'straight', lengthM: 700 },
    { kind: 'transition', lengthM: 50, startCurvature: 0, endCurvature: 1 / 40 },
    { kind: 'arc', radiusM: 40, angleDeg: 180 - (50 / 40) * (180 / Math.PI) },
    { kind: 'transition', lengthM: 50, startCurvature: 1 / 40, endCurvature: 0 },
    { kind: 'straight', lengthM: 300 },
    { kind: 'arc', radiusM: 70, angleDeg: -60 },
    { kind: 'arc', radiusM: 70, angleDeg: 60 },
    { kind: 'straight', lengthM: 400 - 2 * 70 * Math.sin(Math.PI / 3) * 0 },
    { kind: 'arc', radiusM: 120, angleDeg: 180 },
  ];
  const car = testCar({
    mu: 1.3,
    maxPowerW: 200_000,
    dragAreaM2: 0.8,
    liftAreaM2: 1.5,
    rollingResistanceCoeff: 0.012,
    drive: 'rear',
  });

  it('halving the step changes the lap time by less than 0.1 % (step convergence)', () => {
    const stage = (stepM: number) =>
      trackFromSegments({ name: 'stage', closed: false, widthM: 10, segments }, stepM, 'stage');
    const coarse = simulate(stage(1), car).lapTimeS;
    const fine = simulate(stage(0.5), car).lapTimeS;
    expect(Math.abs(coarse - fine) / fine).toBeLessThan(0.001);
  });

  it('converges with the step for a car with gears and shift time too', () => {
    const geared = readCarFile(`${projectRoot}cars/tarnfell-gt.json`);
    expect(geared.powertrain.gearing?.shiftTimeS).toBeGreaterThan(0);
    const stage = (stepM: number) =>
      trackFromSegments({ name: 'stage', closed: false, widthM: 10, segments }, stepM, 'stage');
    const coarse = simulate(stage(1), geared).lapTimeS;
    const fine = simulate(stage(0.5), geared).lapTimeS;
    expect(Math.abs(coarse - fine) / fine).toBeLessThan(0.001);
  });

  it('never exceeds the corner limit or the envelope, and time strictly increases', () => {
    const track = trackFromSegments({ name: 'stage', closed: false, widthM: 10, segments }, 1, 'stage');
    const lap = simulate(track, car, { startSpeedMps: 20 });
    const envelope = pointMassEnvelope(car, ambientFrom());
    for (let i = 0; i < lap.trace.count; i++) {
      expect(lap.trace.speedMps[i]).toBeLessThanOrEqual(lap.trace.cornerLimitMps[i]! + 1e-9);
      // 2 %: the discretisation of one grid step where the lateral demand changes inside the step (the passes
      // take each step's limit at one end); on the limit itself grip use is 1 by construction.
      expect(lap.trace.gripUse[i]).toBeLessThan(1.02);
      if (i > 0) expect(lap.trace.timeS[i]).toBeGreaterThan(lap.trace.timeS[i - 1]!);
      expect(Math.abs(lap.trace.ayMps2[i]!)).toBeLessThanOrEqual(
        envelope.lateralLimitMps2(lap.trace.speedMps[i]!, 1) * (1 + 1e-6),
      );
    }
  });
});
