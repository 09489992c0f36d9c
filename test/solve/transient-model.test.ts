import { describe, expect, it } from 'vitest';
import { newOdexSolver } from '../../src/solve/transient-odex.js';
import {
  newSingleTrackForces,
  singleTrackForces,
  singleTrackModel,
  axleLateralForceN,
} from '../../src/solve/transient-model.js';
import { bicycleParams } from '../../src/car/bicycle-params.js';
import { understeerGradientRadPerMps2 } from '../../src/car/understeer.js';
import { clubCar } from '../car/bicycle-fixtures.js';
import type { Car } from '../../src/car/types.js';

/** Integrates vy and r at constant speed and steer with odex until the transient has died away. */
function settledYawRate(car: Car, speedMps: number, steerRad: number): number {
  const p = bicycleParams(car);
  const model = singleTrackModel(p, car, 1.225, 'linear', () => 0);
  const forces = newSingleTrackForces();
  const input = { steerRad, frontLongN: 0, rearLongN: 0 };
  const solver = newOdexSolver(2);
  solver.absoluteTolerance = 1e-12;
  solver.relativeTolerance = 1e-10;
  const result = solver.solve(
    (_t, y) => {
      singleTrackForces(model, y[0]!, y[1]!, speedMps, input, forces);
      return [forces.lateralVelocityRate, forces.yawAcceleration];
    },
    0,
    [0, 0],
    20,
  );
  expect(result.outcome).toBe(0);
  return result.y[1]!;
}

describe('single-track model integrated with odex', () => {
  // Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6, eq. 6-16: r / delta = (V / L) / (1 + K V^2 / (57.3 L g)),
  // with K in deg/g; written with K in rad per m/s^2 it is V / (L + K V^2).
  const cases: [string, Car][] = [
    ['understeering', clubCar()],
    [
      'neutral',
      clubCar({
        frontWeightFraction: 0.5,
        tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: 100_000, corneringStiffnessRearNPerRad: 100_000 },
      }),
    ],
    [
      'oversteering, below its critical speed',
      clubCar({
        frontWeightFraction: 0.42,
        tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: 120_000, corneringStiffnessRearNPerRad: 100_000 },
      }),
    ],
  ];
  for (const [label, car] of cases) {
    it(`settles to the steady-state yaw-rate gain: ${label}`, () => {
      const p = bicycleParams(car);
      const mf = p.massKg * p.frontWeightFraction;
      // K from the handbook's definition Wf/Cf - Wr/Cr, per unit of lateral acceleration (W/g = m).
      const gradient = mf / p.corneringStiffnessFrontNPerRad - (p.massKg - mf) / p.corneringStiffnessRearNPerRad;
      expect(understeerGradientRadPerMps2(p)).toBeCloseTo(gradient, 12);
      for (const speed of [10, 25, 40]) {
        if (gradient < 0 && speed * speed > -p.wheelbaseM / gradient) continue;
        const steer = 0.001;
        const expected = speed / (p.wheelbaseM + gradient * speed * speed);
        const yawRate = settledYawRate(car, speed, steer);
        // Small steer: the model's atan slip angles and cos(delta) differ from the linear theory by O(delta^2).
        expect(Math.abs(yawRate / steer - expected)).toBeLessThan(1e-4 * expected);
      }
    });
  }

  it('a saturating axle gives C alpha at small slip and never more than its capacity', () => {
    // tanh law: slope C at the origin, asymptote at the capacity (common practice for a smooth saturating tyre).
    expect(axleLateralForceN(100_000, 1e-5, 8000, 'saturating')).toBeCloseTo(1, 6);
    expect(axleLateralForceN(100_000, 0.5, 8000, 'saturating')).toBeLessThanOrEqual(8000);
    expect(axleLateralForceN(100_000, 0.5, 8000, 'saturating')).toBeGreaterThan(7999);
  });
});
