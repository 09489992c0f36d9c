import { describe, expect, it } from 'vitest';
import { describeCar } from '../../src/car/describe.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { parseCarJson } from '../../src/io/read-car.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../../src/units.js';
import { clubCar } from './bicycle-fixtures.js';

describe('car description', () => {
  it('gives static axle loads, K, the characteristic speed and the envelope rows', () => {
    // Gillespie, SAE 1992, ch. 6: K = Wf/Cf - Wr/Cr, characteristic speed sqrt(57.3 L g / K).
    const car = clubCar();
    const d = describeCar(car, ambientFrom());
    expect(d.staticFrontAxleKg).toBeCloseTo(1180 * 0.55, 9);
    expect(d.staticRearAxleKg).toBeCloseTo(1180 * 0.45, 9);
    const kDegPerG = (1180 * G * 0.55) / (110_000 * (Math.PI / 180)) - (1180 * G * 0.45) / (120_000 * (Math.PI / 180));
    expect(d.understeerGradientDegPerG).toBeCloseTo(kDegPerG, 9);
    expect(d.steer).toBe('understeer');
    expect(d.characteristicSpeedKph).toBeCloseTo(Math.sqrt(((180 / Math.PI) * 2.5 * G) / kDegPerG) * 3.6, 6);
    expect(d.criticalSpeedKph).toBeNull();
    expect(d.envelope.length).toBeGreaterThan(2);
    for (const row of d.envelope) {
      expect(row.lateralG).toBeGreaterThan(0.8);
      expect(row.lateralG).toBeLessThan(2);
      expect(['front', 'rear']).toContain(row.lateralLimitingAxle);
    }
  });

  it('gives null gradient and speeds for a car without cornering stiffnesses', () => {
    const d = describeCar(
      { ...clubCar({ model: 'point-mass' }), tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: null } },
      ambientFrom(),
    );
    expect(d.understeerGradientDegPerG).toBeNull();
    expect(d.characteristicSpeedKph).toBeNull();
    expect(d.criticalSpeedKph).toBeNull();
    expect(d.envelope[0]!.lateralLimitingAxle).toBeNull();
  });
});

describe('car file with the bicycle model', () => {
  it('lists every missing field in one line', () => {
    const text = JSON.stringify({
      model: 'bicycle',
      massKg: 900,
      tyre: { muLong: 1.2, muLat: 1.2 },
      aero: { dragAreaM2: 0.7, liftAreaM2: 1 },
      powertrain: { maxPowerW: 1e5 },
    });
    let message = '';
    try {
      parseCarJson(text, 'car.json');
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toBe(
      'car.json: the bicycle model needs fields cgHeightM, wheelbaseM, trackFrontM, trackRearM, rollStiffnessFrontFraction, ' +
        'tyre.corneringStiffnessFrontNPerRad, tyre.corneringStiffnessRearNPerRad, aero.frontDownforceFraction, brakes.frontBias',
    );
    expect(message).not.toContain('\n');
  });
});
