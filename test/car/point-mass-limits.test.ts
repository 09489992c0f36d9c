// The point mass's acceleration and braking limits against the model as published, written out here with Math.pow:
// normal load m g + 1/2 rho ClA v^2, longitudinal capacity muLong on the driven load, lateral capacity muLat N, the
// friction ellipse |ax/axMax|^n + |ay/ayMax|^n = 1, the power limit eta P / v, drag and rolling resistance
// (Brayshaw and Harrison, Proc. IMechE Part D 219 (2005); the header of src/car/point-mass.ts). The envelope skips the
// ellipse's powers where the engine gives less than the tyres could in any case; these checks sweep the speeds and
// lateral shares around that choice, for ellipse exponents from 1 (a diamond) to 3.

import { describe, expect, it } from 'vitest';
import { pointMassEnvelope } from '../../src/car/point-mass.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';

const ambient = ambientFrom();

/** The limits of a test car without load sensitivity or gears, from the formulas in this file's header. */
function published(car: ReturnType<typeof testCar>) {
  const rho = ambient.airDensityKgPerM3;
  const normalN = (v: number) =>
    Math.max(0.1 * car.massKg * g, car.massKg * g + 0.5 * rho * car.aero.liftAreaM2 * v * v);
  const coast = (v: number) =>
    (0.5 * rho * car.aero.dragAreaM2 * v * v + car.rollingResistanceCoeff * normalN(v)) / car.massKg;
  const lateralCap = (v: number) => (car.tyre.muLat * normalN(v)) / car.massKg;
  const longCap = (v: number) => (car.tyre.muLong * normalN(v)) / car.massKg;
  const n = car.tyre.ggExponent;
  const left = (share: number) => (share >= 1 ? 0 : Math.pow(1 - Math.pow(share, n), 1 / n));
  // The power at the wheels, scaled to the air by the ambient's factor (SAE J1349, checked in power-correction.test.ts).
  const engine = (v: number) =>
    (car.powertrain.maxPowerW * ambient.powerFactor * car.powertrain.drivetrainEfficiency) /
    Math.max(v, 1) /
    car.massKg;
  return {
    lateralCap,
    engine,
    tyreAccel: (v: number, share: number) => longCap(v) * left(share),
    accel: (v: number, share: number) => Math.min(longCap(v) * left(share), engine(v)) - coast(v),
    brake: (v: number, share: number) => longCap(v) * left(share) + coast(v),
  };
}

describe('point-mass limits against the friction ellipse written out', () => {
  for (const ggExponent of [1, 1.5, 2, 2.2, 3]) {
    it(`agree to 1e-12 relative with exponent ${ggExponent}, where the engine limits and where the tyres do`, () => {
      // A car whose engine (120 kW) limits at speed but not in slow corners: both branches of the acceleration limit.
      const car = testCar({ mu: 1.3, massKg: 1100, maxPowerW: 120e3, dragAreaM2: 0.7, liftAreaM2: 0.8, ggExponent });
      car.rollingResistanceCoeff = 0.012;
      const envelope = pointMassEnvelope(car, ambient);
      const model = published(car);
      let engineLimited = 0;
      let tyreLimited = 0;
      let worst = 0;
      for (let v = 2; v <= 70; v += 0.37) {
        for (let share = 0; share <= 1; share += 1 / 64) {
          const lateral = share * model.lateralCap(v);
          for (const side of [1, -1]) {
            const accel = envelope.accelLimitMps2(v, side * lateral);
            const brake = envelope.brakeLimitMps2(v, side * lateral);
            const expectedAccel = model.accel(v, share);
            const expectedBrake = model.brake(v, share);
            worst = Math.max(
              worst,
              Math.abs(accel - expectedAccel) / Math.max(1, Math.abs(expectedAccel)),
              Math.abs(brake - expectedBrake) / Math.max(1, Math.abs(expectedBrake)),
            );
          }
          // Which of the two limits the published model gives, nearest to the switch counted too.
          if (model.engine(v) < model.tyreAccel(v, share)) engineLimited++;
          else tyreLimited++;
        }
      }
      expect(worst).toBeLessThan(1e-12);
      // The sweep crosses the switch between the two (a check of one branch alone would not test the choice).
      expect(engineLimited).toBeGreaterThan(500);
      expect(tyreLimited).toBeGreaterThan(500);
    });
  }

  it('give the engine exactly where the tyres are near their limit sideways and the engine is just below them', () => {
    // With a diamond (n = 1) the share left is exactly 1 - u: an engine a hair below the tyres' traction there must
    // still be the limit, and a hair above must not.
    const car = testCar({ mu: 1.2, massKg: 1000, maxPowerW: 60e3, ggExponent: 1 });
    const envelope = pointMassEnvelope(car, ambient);
    const model = published(car);
    const v = 20;
    const engine = model.engine(v);
    // The lateral share at which the tyres' traction equals the engine's drive: 1 - u = engine / longCap.
    const switchShare = 1 - engine / (model.tyreAccel(v, 0) || 1);
    for (const share of [switchShare - 1e-6, switchShare - 1e-9, switchShare + 1e-9, switchShare + 1e-6]) {
      const lateral = share * model.lateralCap(v);
      expect(envelope.accelLimitMps2(v, lateral)).toBeCloseTo(model.accel(v, share), 10);
    }
  });
});
