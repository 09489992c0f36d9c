// The reference trace's channels against closed forms: throttle as the share of the engine's drive force in use,
// grip use as the tyres' share of their friction ellipse, the power-limited state and gear shifts.
// Forces: aerodynamic drag 1/2 rho CdA v^2 and rolling resistance Crr m g (Gillespie, Fundamentals of Vehicle
// Dynamics, SAE 1992, ch. 4), the engine's drive force P / v at full power, steady cornering ay = v^2 / R and the
// friction ellipse (ax/axMax)^2 + (ay/ayMax)^2 = 1 (Milliken and Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 2).

import { existsSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments } from '../../src/track/segments.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { readCarFile } from '../../src/io/read-car.js';
import { readTrackFile } from '../../src/io/read-track.js';
import type { TrackGrid } from '../../src/track/types.js';
import { traceCsv } from '../../src/report/trace-csv.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';
import { projectRoot } from '../helpers/cli.js';

const ambient = ambientFrom();
const rho = ambient.airDensityKgPerM3;

describe('throttle and grip use in steady cornering at the grip limit', () => {
  it('throttle = (drag + rolling resistance) / drive force, grip use 100 %', () => {
    const massKg = 1000;
    const mu = 1.2;
    const dragAreaM2 = 0.7;
    const crr = 0.015;
    const maxPowerW = 150_000;
    const car = testCar({
      massKg,
      mu,
      dragAreaM2,
      rollingResistanceCoeff: crr,
      maxPowerW,
      drivetrainEfficiency: 0.9,
      drive: 'all',
    });
    const radiusM = 80;
    const track = trackFromSegments(
      { name: 'ring', closed: true, widthM: 10, segments: [{ kind: 'arc', radiusM, angleDeg: 360 }] },
      1,
      'ring',
    );
    const lap = simulate(track, car, { ambient });
    const t = lap.trace;
    const i = Math.floor(t.count / 2);
    const v = t.speedMps[i]!;
    // Steady state: constant speed all round.
    expect(Math.abs(t.speedMps[0]! - v)).toBeLessThan(1e-6 * v);
    const resistanceN = 0.5 * rho * dragAreaM2 * v * v + crr * massKg * g;
    // No gears: the drive force at full power is the wheel power eta P over v, eta = 0.9 as given (applied
    // with and without gears alike, see docs/cars.md).
    const driveForceN = (0.9 * maxPowerW * ambient.powerFactor) / v;
    expect(t.throttle[i]! / (resistanceN / driveForceN)).toBeCloseTo(1, 2);
    expect(t.throttle[i]!).toBeLessThan(0.2);
    // All-wheel drive, no downforce: the tyres give mu g both ways; the ellipse holds the resistance and ay.
    const share = Math.hypot(resistanceN / (massKg * mu * g), (v * v) / radiusM / (mu * g));
    expect(share).toBeCloseTo(1, 2);
    expect(t.gripUse[i]!).toBeCloseTo(1, 2);
    expect(t.powerLimited[i]).toBe(0);
    expect(t.brake[i]).toBe(0);
  });
});

describe('a power-limited straight', () => {
  it('is at full throttle and power-limited, with grip use well under 100 %', () => {
    const massKg = 1200;
    const mu = 1.2;
    const maxPowerW = 120_000;
    const car = testCar({
      massKg,
      mu,
      dragAreaM2: 0.6,
      rollingResistanceCoeff: 0.012,
      maxPowerW,
      drivetrainEfficiency: 0.9,
      drive: 'rear',
    });
    const track = trackFromSegments(
      { name: 'straight', closed: false, widthM: 10, segments: [{ kind: 'straight', lengthM: 1500 }] },
      1,
      'straight',
    );
    const lap = simulate(track, car, { ambient, startSpeedMps: 0 });
    const t = lap.trace;
    const i = t.count - 200;
    const v = t.speedMps[i]!;
    expect(v).toBeGreaterThan(40);
    expect(t.throttle[i]).toBeCloseTo(1, 6);
    expect(t.powerLimited[i]).toBe(1);
    // Rear drive, half the weight on the rear axle (testCar): the tyres could give mu g m / 2 forward; the engine
    // gives 0.9 P / v. Grip use is the tyres' share: that force over their capacity.
    const driveForceN = (0.9 * maxPowerW * ambient.powerFactor) / v;
    const expected = driveForceN / (mu * massKg * g * 0.5);
    expect(t.gripUse[i]!).toBeCloseTo(expected, 2);
    expect(t.gripUse[i]!).toBeLessThan(0.6);
    // At walking pace the same car is held by its tyres, not its engine.
    const early = 3;
    expect(t.powerLimited[early]).toBe(0);
    expect(t.gripUse[early]!).toBeCloseTo(1, 2);
  });
});

describe('gear shifts', () => {
  it('are their own channel, with the throttle held through them, in the trace CSV too', () => {
    const geared = readCarFile(`${projectRoot}cars/tarnfell-gt.json`);
    const track = trackFromSegments(
      { name: 'straight', closed: false, widthM: 10, segments: [{ kind: 'straight', lengthM: 1500 }] },
      1,
      'straight',
    );
    const t = simulate(track, geared, { ambient, startSpeedMps: 0 }).trace;
    let shifts = 0;
    for (let i = 1; i < t.count; i++) {
      if (t.shift[i] && !t.shift[i - 1]) {
        shifts++;
        // The pedal does not drop during the gap: it holds its value from before the shift.
        expect(t.throttle[i]).toBe(t.throttle[i - 1]);
      }
      if (t.shift[i]) expect(t.throttle[i]).toBeGreaterThan(0.5);
    }
    // Accelerating from rest down a 1.5 km straight takes the car through several gears.
    expect(shifts).toBeGreaterThanOrEqual(3);
    const header = traceCsv({ ...simulate(track, geared, { ambient }) })
      .split('\n')[0]!
      .split(',');
    expect(header).toEqual(expect.arrayContaining(['power_limited', 'gear', 'shift']));
  });
});

describe('the brake channel through braking zones', () => {
  // brake = -(ax + coast) / (b - coast), the share of the tyres' braking left beside the cornering in use, with
  // b = muLong N / m (1 - u^n)^(1/n) + coast, u = ay / (muLat N / m), N = m g + 1/2 rho ClA v^2 and coast the drag
  // and rolling resistance (the friction ellipse of Brayshaw and Harrison, Proc. IMechE Part D 219 (2005); forces as
  // in this file's header), written out here with Math.pow at every braking sample of the lap. On a real centreline
  // (Monza, TUM racetrack-database, LGPL v3, geometry from OpenStreetMap, read from ../shared and skipped where
  // absent), whose curvature changes at every sample, and on a circuit of two hairpins.
  const monzaCsv = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Monza.csv');
  const hairpins = () =>
    trackFromSegments(
      {
        name: 'two hairpins',
        closed: true,
        widthM: 10,
        segments: [
          { kind: 'straight', lengthM: 700 },
          { kind: 'arc', radiusM: 45, angleDeg: 180 },
          { kind: 'straight', lengthM: 700 },
          { kind: 'arc', radiusM: 45, angleDeg: 180 },
        ],
      },
      1,
      'two hairpins',
    );
  const tracks: [string, () => TrackGrid][] = [['two hairpins', hairpins]];
  if (existsSync(monzaCsv))
    tracks.push([
      "Monza's centreline",
      () =>
        readTrackFile(monzaCsv, {
          stepM: 1,
          columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
          widthM: null,
          layout: 'auto',
          smoothingM: null,
        }),
    ]);
  else console.warn(`brake channel on a real centreline skipped: ${monzaCsv} is absent`);
  for (const [name, trackOf] of tracks)
    it(`is the share of the braking left in use at every braking sample (${name})`, () => {
      const massKg = 1100;
      const muLat = 1.35;
      const muLong = 1.3;
      const dragAreaM2 = 0.7;
      const liftAreaM2 = 1.2;
      const crr = 0.012;
      const n = 2.2;
      const car = testCar({ massKg, muLat, muLong, dragAreaM2, liftAreaM2, maxPowerW: 220e3, ggExponent: n });
      car.rollingResistanceCoeff = crr;
      const t = simulate(trackOf(), car, { ambient }).trace;
      let braking = 0;
      let worst = 0;
      for (let i = 0; i < t.count; i++) {
        if (!(t.brake[i]! > 0)) continue;
        braking++;
        const v = t.speedMps[i]!;
        const normalN = massKg * g + 0.5 * rho * liftAreaM2 * v * v;
        const coast = (0.5 * rho * dragAreaM2 * v * v + crr * normalN) / massKg;
        const used = Math.abs(t.ayMps2[i]!) / ((muLat * normalN) / massKg);
        const b = ((muLong * normalN) / massKg) * (used >= 1 ? 0 : Math.pow(1 - Math.pow(used, n), 1 / n)) + coast;
        const expected = Math.min(1, -(t.axMps2[i]! + coast) / (b - coast));
        worst = Math.max(worst, Math.abs(t.brake[i]! - expected));
      }
      expect(braking).toBeGreaterThan(100);
      expect(worst).toBeLessThan(1e-9);
    });
});
