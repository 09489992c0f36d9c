// The car's drive force scaled as one: rated power and, where the car has gears, the whole torque curve, so that
// a fitted or drawn power changes what the engine gives at every speed and in every gear.

import type { Car } from '../car/types.js';

export function withDriveScaled(car: Car, factor: number): Car {
  const gearing = car.powertrain.gearing;
  return {
    ...car,
    powertrain: {
      ...car.powertrain,
      maxPowerW: car.powertrain.maxPowerW * factor,
      gearing: gearing
        ? {
            ...gearing,
            torqueCurve: {
              rpm: gearing.torqueCurve.rpm,
              torqueNm: gearing.torqueCurve.torqueNm.map((torque) => torque * factor),
            },
          }
        : null,
    },
  };
}

/** The car with a drive force so large that the tyres alone set every limit (for the grip fit). */
export function withUnlimitedDrive(car: Car): Car {
  return withDriveScaled(car, 1e4);
}
