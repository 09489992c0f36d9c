// The car the synthetic logs are made with (its power, drag area, grip and downforce known) and the user's guess the
// calibration starts from, every fitted value well off. Invented values, typical of a light sports racer (from
// memory, no source).

import { testCar } from '../helpers/cars.js';

export const knownCar = testCar({
  massKg: 1000,
  muLat: 1.4,
  muLong: 1.3,
  dragAreaM2: 0.8,
  liftAreaM2: 2.0,
  maxPowerW: 250_000,
  rollingResistanceCoeff: 0.015,
  drive: 'rear',
});

/** The known car's fitted fields. */
export const knownValues: Record<string, number> = {
  'powertrain.maxPowerW': 250_000,
  'aero.dragAreaM2': 0.8,
  'tyre.muLat': 1.4,
  'tyre.muLong': 1.3,
  'aero.liftAreaM2': 2,
};

export const guessedCar = testCar({
  massKg: 1000,
  muLat: 1.2,
  muLong: 1.2,
  dragAreaM2: 0.6,
  liftAreaM2: 1.0,
  maxPowerW: 200_000,
  rollingResistanceCoeff: 0.015,
  drive: 'rear',
});
