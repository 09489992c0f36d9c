// Invented test cars for the bicycle-model tests (no real make or model).

import type { Car } from '../../src/car/types.js';

/** A front-engined, rear-driven club car with every bicycle field given. */
export function clubCar(overrides: Partial<Car> = {}): Car {
  return {
    name: 'test club car',
    model: 'bicycle',
    massKg: 1150,
    frontWeightFraction: 0.55,
    cgHeightM: 0.48,
    wheelbaseM: 2.5,
    widthM: 1.8,
    trackFrontM: 1.5,
    trackRearM: 1.48,
    rollStiffnessFrontFraction: 0.58,
    rollingResistanceCoeff: 0.012,
    tyre: {
      muLong: 1.25,
      muLat: 1.3,
      ggExponent: 2,
      loadSensitivity: 0.1,
      corneringStiffnessFrontNPerRad: 110_000,
      corneringStiffnessRearNPerRad: 120_000,
    },
    aero: { dragAreaM2: 0.75, liftAreaM2: 0.6, frontDownforceFraction: 0.4 },
    powertrain: { maxPowerW: 180_000, drivetrainEfficiency: 1, drive: 'rear', gearing: null },
    brakes: { maxDecelG: null, frontBias: 0.65 },
    fuel: { massKg: 30, burnKgPerLap: 2 },
    ...overrides,
  };
}
