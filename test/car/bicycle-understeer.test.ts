import { describe, expect, it } from 'vitest';
import {
  characteristicSpeedMps,
  criticalSpeedMps,
  linearAxlesOf,
  steadyStateSteerRad,
  understeerGradientDegPerG,
  understeerGradientRadPerMps2,
} from '../../src/car/understeer.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../../src/units.js';
import { clubCar } from './bicycle-fixtures.js';

// Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6: K = Wf/Cf - Wr/Cr (deg/g with W in force units and
// C in force per degree), delta = 57.3 L / R + K ay (deg, ay in g), characteristic speed sqrt(57.3 L g / K),
// critical speed sqrt(-57.3 L g / K). The tests evaluate the handbook's formulas in its own units, with 57.3 as
// 180/pi, and compare with the SI implementation.
const DEG_PER_RAD = 180 / Math.PI;

function handbookK(massKg: number, frontFraction: number, cfNPerRad: number, crNPerRad: number): number {
  const wf = massKg * G * frontFraction;
  const wr = massKg * G * (1 - frontFraction);
  return wf / (cfNPerRad / DEG_PER_RAD) - wr / (crNPerRad / DEG_PER_RAD); // deg per g
}

describe('understeer gradient and steady-state steer', () => {
  const car = clubCar();
  const axles = linearAxlesOf(car)!;
  const massKg = car.massKg + car.fuel.massKg;

  it('K = Wf/Cf - Wr/Cr in deg/g', () => {
    const k = handbookK(massKg, 0.55, 110_000, 120_000);
    expect(understeerGradientDegPerG(axles)).toBeCloseTo(k, 9);
    expect(k).toBeGreaterThan(0);
  });

  it('delta = 57.3 L / R + K ay', () => {
    const k = handbookK(massKg, 0.55, 110_000, 120_000);
    for (const [radiusM, speedMps] of [
      [50, 15],
      [120, 30],
      [400, 55],
    ] as const) {
      const ayG = (speedMps * speedMps) / radiusM / G;
      const expectedDeg = (DEG_PER_RAD * 2.5) / radiusM + k * ayG;
      const steerRad = steadyStateSteerRad(2.5, 1 / radiusM, understeerGradientRadPerMps2(axles), ayG * G);
      expect(steerRad * DEG_PER_RAD).toBeCloseTo(expectedDeg, 9);
    }
  });

  it('characteristic speed sqrt(57.3 L g / K) for an understeering car, none for the others', () => {
    const k = handbookK(massKg, 0.55, 110_000, 120_000);
    expect(characteristicSpeedMps(2.5, understeerGradientRadPerMps2(axles))).toBeCloseTo(
      Math.sqrt((DEG_PER_RAD * 2.5 * G) / k),
      6,
    );
    expect(criticalSpeedMps(2.5, understeerGradientRadPerMps2(axles))).toBeNull();
  });

  it('a neutral car has K = 0 and neither characteristic nor critical speed', () => {
    // Wf/Cf = Wr/Cr: 50/50 weight on equal stiffnesses.
    const neutral = linearAxlesOf(
      clubCar({
        frontWeightFraction: 0.5,
        tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: 100_000, corneringStiffnessRearNPerRad: 100_000 },
      }),
    )!;
    expect(understeerGradientRadPerMps2(neutral)).toBe(0);
    expect(characteristicSpeedMps(2.5, 0)).toBeNull();
    expect(criticalSpeedMps(2.5, 0)).toBeNull();
  });

  it('an oversteering car has critical speed sqrt(-57.3 L g / K)', () => {
    const over = linearAxlesOf(
      clubCar({
        frontWeightFraction: 0.42,
        tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: 120_000, corneringStiffnessRearNPerRad: 100_000 },
      }),
    )!;
    const k = handbookK(massKg, 0.42, 120_000, 100_000);
    expect(k).toBeLessThan(0);
    expect(understeerGradientDegPerG(over)).toBeCloseTo(k, 9);
    expect(criticalSpeedMps(2.5, understeerGradientRadPerMps2(over))).toBeCloseTo(
      Math.sqrt((-DEG_PER_RAD * 2.5 * G) / k),
      6,
    );
    expect(characteristicSpeedMps(2.5, understeerGradientRadPerMps2(over))).toBeNull();
  });
});
