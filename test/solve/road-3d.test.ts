// Grade, bank and vertical curvature in the solver, against textbook force balances worked out here, by hand,
// independently of the program; and a flat track, given as heights of zero and banks of zero, lapping exactly as
// one without them.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments, type TrackSegment } from '../../src/track/segments.js';
import type { TrackGrid } from '../../src/track/types.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { roadProfileOf } from '../../src/track/road-profile.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';
import { speedWherePowerMeets } from '../helpers/bisect.js';
import { clubCar } from '../car/bicycle-fixtures.js';
import { testCircuit } from '../compare/fixtures.js';

const ring = (radiusM: number) =>
  trackFromSegments(
    { name: 'ring', closed: true, widthM: 10, segments: [{ kind: 'arc', radiusM, angleDeg: 360 }] },
    1,
    'ring',
  );
const openStage = (segments: TrackSegment[], stepM = 1) =>
  trackFromSegments({ name: 'stage', closed: false, widthM: 10, segments }, stepM, 'stage');

/** The same grid with heights z(s) and a bank angle (rad) at every sample. */
function withRoad(track: TrackGrid, z: (s: number) => number, bankRad = 0): TrackGrid {
  return {
    ...track,
    zM: track.distanceM.map(z),
    bankRad: new Float64Array(track.distanceM.length).fill(bankRad),
  };
}

describe('banked curve at the grip limit', () => {
  // v^2 = g R (sin t + mu cos t) / (cos t - mu sin t): the banked curve with friction (e.g. Beer and Johnston,
  // Vector Mechanics for Engineers: Dynamics, ch. 12; from memory); with t = 0 it is sqrt(mu g R).
  const mu = 1.1;
  const radiusM = 100;
  const banked = (t: number) =>
    Math.sqrt((g * radiusM * (Math.sin(t) + mu * Math.cos(t))) / (Math.cos(t) - mu * Math.sin(t)));

  it.each([0, 10, 20, 30])('point mass on a %s degree bank', (deg) => {
    const t = (deg * Math.PI) / 180;
    const lap = simulate(
      withRoad(ring(radiusM), () => 0, t),
      testCar({ mu, maxPowerW: 2_000_000, dragAreaM2: 0.3 }),
    );
    // The grip limit itself, and the lap round the ring (a little under it: the last of the grip overcomes drag).
    const limit = Math.min(...lap.trace.cornerLimitMps);
    expect(Math.abs(limit - banked(t)) / banked(t)).toBeLessThan(1e-5);
    expect(Math.abs(lap.minSpeedMps - banked(t)) / banked(t)).toBeLessThan(1e-3);
  });

  it('a bank falling the wrong way (to the outside) lowers the limit by the same balance', () => {
    const t = (-10 * Math.PI) / 180;
    const lap = simulate(
      withRoad(ring(radiusM), () => 0, t),
      testCar({ mu, maxPowerW: 2_000_000 }),
    );
    expect(Math.abs(Math.min(...lap.trace.cornerLimitMps) - banked(t)) / banked(t)).toBeLessThan(1e-5);
  });

  // The bicycle model's axles share the extra load like the weight. Without tyre load sensitivity and downforce
  // each axle's grip grows in proportion to its load, so the car's effective mu on the flat (v^2 / g R) carries
  // over and the banked limit follows the same balance.
  it('bicycle model: the bank raises the limit as the balance says', () => {
    const base = clubCar();
    const car = {
      ...base,
      tyre: { ...base.tyre, loadSensitivity: 0 },
      aero: { ...base.aero, liftAreaM2: 0 },
    };
    const limitOn = (track: TrackGrid) => Math.min(...simulate(track, car).trace.cornerLimitMps);
    const flat = limitOn(ring(radiusM));
    const t = (20 * Math.PI) / 180;
    const onBank = limitOn(withRoad(ring(radiusM), () => 0, t));
    const muFlat = (flat * flat) / (g * radiusM);
    const expected = Math.sqrt(
      (g * radiusM * (Math.sin(t) + muFlat * Math.cos(t))) / (Math.cos(t) - muFlat * Math.sin(t)),
    );
    expect(Math.abs(onBank - expected) / expected).toBeLessThan(1e-3);
    expect(onBank).toBeGreaterThan(flat * 1.1);
  });
});

describe('grade', () => {
  // Top speed up a constant grade a: P = (1/2 rho CdA v^2 + Crr m g cos a + m g sin a) v (power balance on an
  // incline; Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 2), solved here by bisection. Air at the
  // engine rating's reference conditions (SAE J1349: 25 °C, 99 kPa), density by the ideal gas law (ISO 2533).
  it.each([0.03, 0.08])('reaches the power-limited top speed up a %s grade', (grade) => {
    const car = testCar({ maxPowerW: 150_000, dragAreaM2: 0.7, rollingResistanceCoeff: 0.012, massKg: 1000 });
    const ambient = ambientFrom({ airTempC: 25, pressureHpa: 990 });
    const rho = 99_000 / (287.05 * 298.15);
    const a = Math.atan(grade);
    const demand = (v: number) =>
      (0.5 * rho * 0.7 * v * v + 0.012 * 1000 * g * Math.cos(a) + 1000 * g * Math.sin(a)) * v;
    const lo = speedWherePowerMeets(demand, 150_000);
    const stage = withRoad(openStage([{ kind: 'straight', lengthM: 20_000 }], 5), (s) => grade * s);
    const lap = simulate(stage, car, { ambient });
    expect(Math.abs(lap.maxSpeedMps - lo) / lo).toBeLessThan(0.005);
  });

  // A standing start up a grade with grip-limited drive on all wheels and no resistances: constant acceleration
  // a = mu g cos(grade) - g sin(grade), so t = sqrt(2 L / a) (uniform acceleration). The grid measures horizontal
  // distance, shorter than the slope by cos(grade) (0.3 % at 8 %), within the tolerance.
  it('climbs a hill in the closed-form time', () => {
    const mu = 1.0;
    const grade = 0.08;
    const a = Math.atan(grade);
    const car = testCar({ mu, maxPowerW: 50_000_000, dragAreaM2: 0, rollingResistanceCoeff: 0, drive: 'all' });
    const L = 400;
    const stage = withRoad(openStage([{ kind: 'straight', lengthM: L }]), (s) => grade * s);
    const lap = simulate(stage, car, { startSpeedMps: 0 });
    const expected = Math.sqrt((2 * L) / (mu * g * Math.cos(a) - g * Math.sin(a)));
    expect(Math.abs(lap.lapTimeS - expected) / expected).toBeLessThan(0.005);
    const flat = simulate(openStage([{ kind: 'straight', lengthM: L }]), car, { startSpeedMps: 0 });
    expect(lap.lapTimeS).toBeGreaterThan(flat.lapTimeS);
  });
});

describe('crest', () => {
  // Over a crest of vertical radius Rv the normal load is m (g - v^2 / Rv) (circular motion in the vertical
  // plane; any mechanics textbook). On a crest that is also a corner of radius R the grip limit is
  // v^2 / R = mu (g - v^2 / Rv), so v = sqrt(mu g / (1 / R + mu / Rv)). The profile is the parabola
  // z = -(s - s0)^2 / (2 Rv), whose curvature at its top is exactly 1 / Rv.
  const mu = 1.2;
  const R = 60;
  const Rv = 150;
  const lengthM = 120;
  const stage = () =>
    withRoad(openStage([{ kind: 'arc', radiusM: R, angleDeg: (lengthM / R) * (180 / Math.PI) }]), (s) => {
      const d = s - lengthM / 2;
      return (-d * d) / (2 * Rv);
    });

  it('reads the vertical radius back from the heights', () => {
    const profile = roadProfileOf(stage())!;
    const top = lengthM / 2;
    expect(profile.verticalCurvaturePerM[top]).toBeCloseTo(-1 / Rv, 6);
    expect(profile.gradeRad[top]).toBeCloseTo(0, 9);
  });

  it('lowers the corner limit at the top to sqrt(mu g / (1/R + mu/Rv))', () => {
    const lap = simulate(stage(), testCar({ mu, maxPowerW: 2_000_000 }), { startSpeedMps: 0 });
    const expected = Math.sqrt((mu * g) / (1 / R + mu / Rv));
    const top = lap.trace.cornerLimitMps[lengthM / 2]!;
    expect(Math.abs(top - expected) / expected).toBeLessThan(1e-4);
    expect(top).toBeLessThan(Math.sqrt(mu * g * R));
  });

  it('a compression (the same parabola upside down) raises it: sqrt(mu g / (1/R - mu/Rv))', () => {
    const dip = { ...stage(), zM: stage().zM!.map((z) => -z) };
    const lap = simulate(dip, testCar({ mu, maxPowerW: 2_000_000 }), { startSpeedMps: 0 });
    const expected = Math.sqrt((mu * g) / (1 / R - mu / Rv));
    const bottom = lap.trace.cornerLimitMps[lengthM / 2]!;
    expect(Math.abs(bottom - expected) / expected).toBeLessThan(1e-4);
  });
});

describe('a straight crest', () => {
  // No curvature and no bank: the tyres are asked for no lateral force, and only the normal load m (g - v^2 / Rv)
  // falling to zero at the top limits the speed there, to v = sqrt(g Rv) (circular motion in the vertical plane; any
  // mechanics textbook). The parabola z = -(s - s0)^2 / (2 Rv) has curvature exactly 1 / Rv at its top.
  it('holds the car on the road up to sqrt(g Rv) at the top, and to its top speed on the level', () => {
    const Rv = 60;
    const lengthM = 200;
    const straight = openStage([{ kind: 'straight', lengthM }]);
    const crest = withRoad(straight, (s) => -((s - lengthM / 2) ** 2) / (2 * Rv));
    const car = testCar({ mu: 1.2, maxPowerW: 2_000_000, dragAreaM2: 0.3 });
    const lap = simulate(crest, car, { startSpeedMps: 0 });
    const expected = Math.sqrt(g * Rv);
    const top = lap.trace.cornerLimitMps[lengthM / 2]!;
    // The grade at the top is zero to rounding (a central difference of a symmetric parabola), so cos(grade) = 1.
    expect(Math.abs(top - expected) / expected).toBeLessThan(1e-6);
    // Level and straight (no heights): nothing but the top speed limits it (the car's, on the same envelope).
    const level = simulate(straight, car, { startSpeedMps: 0 });
    expect(level.trace.cornerLimitMps[lengthM / 2]).toBeGreaterThan(2 * expected);
  });
});

describe('a flat track', () => {
  it('gives exactly the lap time it gives without heights and banks (the new terms vanish)', () => {
    const track = testCircuit();
    const car = testCar({ mu: 1.3, maxPowerW: 200_000, dragAreaM2: 0.7, massKg: 1200 });
    const flat = simulate(track, car);
    const zeros = simulate(
      withRoad(track, () => 0, 0),
      car,
    );
    expect(zeros.lapTimeS).toBe(flat.lapTimeS);
    expect(Array.from(zeros.trace.speedMps)).toEqual(Array.from(flat.trace.speedMps));
    const bicycle = clubCar();
    expect(
      simulate(
        withRoad(track, () => 0, 0),
        bicycle,
      ).lapTimeS,
    ).toBe(simulate(track, bicycle).lapTimeS);
  });
});
