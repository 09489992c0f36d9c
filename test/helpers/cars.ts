// Test cars built in code, so each check controls exactly which terms of the physics are switched on.

import type { Car } from '../../src/car/types.js';

export function testCar(
  overrides: {
    massKg?: number;
    mu?: number;
    muLong?: number;
    muLat?: number;
    dragAreaM2?: number;
    liftAreaM2?: number;
    maxPowerW?: number;
    drivetrainEfficiency?: number;
    rollingResistanceCoeff?: number;
    drive?: Car['powertrain']['drive'];
    ggExponent?: number;
  } = {},
): Car {
  const mu = overrides.mu ?? 1.2;
  return {
    name: 'test car',
    model: 'point-mass',
    massKg: overrides.massKg ?? 1000,
    frontWeightFraction: 0.5,
    cgHeightM: null,
    wheelbaseM: null,
    widthM: null,
    trackFrontM: null,
    trackRearM: null,
    rollStiffnessFrontFraction: null,
    rollingResistanceCoeff: overrides.rollingResistanceCoeff ?? 0,
    tyre: {
      muLong: overrides.muLong ?? mu,
      muLat: overrides.muLat ?? mu,
      ggExponent: overrides.ggExponent ?? 2,
      loadSensitivity: 0,
      corneringStiffnessFrontNPerRad: null,
      corneringStiffnessRearNPerRad: null,
    },
    aero: {
      dragAreaM2: overrides.dragAreaM2 ?? 0,
      liftAreaM2: overrides.liftAreaM2 ?? 0,
      frontDownforceFraction: null,
    },
    powertrain: {
      maxPowerW: overrides.maxPowerW ?? 1e9,
      // An ideal drivetrain unless a check asks for losses, so closed forms in P hold as written.
      drivetrainEfficiency: overrides.drivetrainEfficiency ?? 1,
      drive: overrides.drive ?? 'all',
      gearing: null,
    },
    brakes: { maxDecelG: null, frontBias: null },
    fuel: { massKg: 0, burnKgPerLap: 0 },
  };
}

/** The car of the open-circuit line checks: 1,000 kg, mu 1.3, 150 kW, CdA 0.7 m^2, ClA 1.0 m^2. */
export const openTrackCar = (): Car =>
  testCar({
    massKg: 1000,
    mu: 1.3,
    maxPowerW: 150_000,
    dragAreaM2: 0.7,
    liftAreaM2: 1.0,
    rollingResistanceCoeff: 0.012,
  });
