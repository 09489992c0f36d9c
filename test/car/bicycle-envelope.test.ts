import { describe, expect, it } from 'vitest';
import { bicycleEnvelope } from '../../src/car/bicycle-envelope.js';
import { pointMassEnvelope } from '../../src/car/point-mass.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { axleState, newAxleState } from '../../src/car/bicycle-axles.js';
import { bicycleParams } from '../../src/car/bicycle-params.js';
import { longitudinalLoadTransferN, lateralLoadTransferN } from '../../src/car/load-transfer.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../../src/units.js';
import type { Car, DrivenAxle } from '../../src/car/types.js';
import { clubCar } from './bicycle-fixtures.js';

const ambient = ambientFrom();

/** No load transfer and the same relative load on both axles: every axle sees the point mass's friction. */
function noTransferCar(drive: DrivenAxle, maxDecelG: number | null, ggExponent = 2): Car {
  const base = clubCar();
  return {
    ...base,
    tyre: { ...base.tyre, ggExponent },
    cgHeightM: 0,
    aero: { ...base.aero, frontDownforceFraction: base.frontWeightFraction },
    brakes: { maxDecelG, frontBias: base.frontWeightFraction },
    powertrain: { ...base.powertrain, drive },
  };
}

describe('bicycle envelope without load transfer equals the point-mass envelope', () => {
  // The identity follows from the models' definitions: with h = 0 each axle carries its static share of weight and
  // downforce, so the first axle to saturate does so exactly where the point mass does (itself checked against the
  // friction ellipse written out in point-mass-limits.test.ts), for a circle and for other ellipse exponents.
  for (const [drive, cap, ggExponent] of [
    ['rear', null, 2],
    ['front', null, 2],
    ['all', null, 2],
    ['rear', 1.1, 2],
    ['front', 1.1, 2],
    ['all', 1.1, 2],
    ['rear', null, 2.2],
    ['front', 1.1, 1.5],
    ['all', null, 1.2],
  ] as const) {
    it(`drive ${drive}, brake cap ${cap ?? 'none'}, exponent ${ggExponent}`, () => {
      const car = noTransferCar(drive, cap, ggExponent);
      const bicycle = bicycleEnvelope(car, ambient);
      const pointMass = pointMassEnvelope(car, ambient);
      expect(bicycle.topSpeedMps).toBeCloseTo(pointMass.topSpeedMps, 6);
      for (const speed of [8, 20.3, 35, 52.7, 68]) {
        const lateral = pointMass.lateralLimitMps2(speed, 1);
        expect(Math.abs(bicycle.lateralLimitMps2(speed, 1) - lateral)).toBeLessThan(1e-6 * lateral);
        expect(Math.abs(bicycle.lateralLimitMps2(speed, -1) - lateral)).toBeLessThan(1e-6 * lateral);
        for (const fraction of [0, 0.25, 0.6, 0.9, 0.99, 0.9999]) {
          const ay = fraction * lateral;
          expect(bicycle.accelLimitMps2(speed, ay)).toBeCloseTo(pointMass.accelLimitMps2(speed, ay), 5);
          expect(bicycle.brakeLimitMps2(speed, -ay)).toBeCloseTo(pointMass.brakeLimitMps2(speed, -ay), 5);
          for (const ax of [-9, -3, 0, 2.5]) {
            expect(bicycle.gripUse(speed, ax, ay)).toBeCloseTo(pointMass.gripUse(speed, ax, ay), 5);
          }
        }
      }
    });
  }
});

describe('load transfer', () => {
  it('longitudinal transfer is m ax h / L', () => {
    // Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 2 (Wf = W c/L - (W/g) ax h/L): a 1500 kg car braking
    // at 1 g with h = 0.5 m on L = 2.5 m moves 1500 * 9.80665 * 0.5 / 2.5 = 2941.995 N onto the front axle.
    expect(longitudinalLoadTransferN(1500, -G, 0.5, 2.5)).toBeCloseTo(-2941.995, 3);
    const car = clubCar({ aero: { dragAreaM2: 0, liftAreaM2: 0, frontDownforceFraction: 0.5 } });
    const p = bicycleParams(car);
    const s = axleState(p, car.tyre, 0, -8, 0, newAxleState());
    const shift = (p.massKg * 8 * 0.48) / 2.5;
    expect(s.frontLoadN).toBeCloseTo(p.weightN * 0.55 + shift, 6);
    expect(s.rearLoadN).toBeCloseTo(p.weightN * 0.45 - shift, 6);
  });

  it('lateral transfer per axle follows the roll-stiffness share: share m ay h / t', () => {
    // Milliken and Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 18, with roll-centre heights at ground level.
    expect(lateralLoadTransferN(1200, 10, 0.5, 1.5, 0.6)).toBeCloseTo((0.6 * 1200 * 10 * 0.5) / 1.5, 9);
  });

  it('braking with a fixed bias saturates the axle the closed form predicts', () => {
    // Gillespie, SAE 1992, ch. 3 (braking performance): front axle limit mu (Wf + (W/g) Dx h/L) = bias Fb and rear
    // limit mu (Wr - (W/g) Dx h/L) = (1 - bias) Fb give Fb = mu Wf / (bias - mu h/L) and mu Wr / (1 - bias + mu h/L).
    const mu = 1.2;
    const car = clubCar({
      rollingResistanceCoeff: 0,
      tyre: { ...clubCar().tyre, muLong: mu, loadSensitivity: 0 },
      aero: { dragAreaM2: 0, liftAreaM2: 0, frontDownforceFraction: 0.5 },
    });
    const envelope = bicycleEnvelope(car, ambient);
    const p = envelope.params;
    const hOverL = 0.48 / 2.5;
    for (const bias of [0.5, 0.65, 0.8]) {
      const biased = bicycleEnvelope({ ...car, brakes: { maxDecelG: null, frontBias: bias } }, ambient);
      const frontLimitN = (mu * p.weightN * 0.55) / (bias - mu * hOverL);
      const rearLimitN = (mu * p.weightN * 0.45) / (1 - bias + mu * hOverL);
      const expected = Math.min(frontLimitN > 0 ? frontLimitN : Infinity, rearLimitN) / p.massKg;
      expect(biased.brakeLimitMps2(30, 0)).toBeCloseTo(expected, 5);
    }
  });

  it('rear-drive traction with load transfer matches the closed form', () => {
    // Gillespie, SAE 1992, ch. 2 (traction-limited acceleration, rear drive): Fx = mu Wr / (1 - mu h / L), no drag.
    const mu = 1.1;
    const car = clubCar({
      rollingResistanceCoeff: 0,
      tyre: { ...clubCar().tyre, muLong: mu, loadSensitivity: 0 },
      aero: { dragAreaM2: 0, liftAreaM2: 0, frontDownforceFraction: 0.5 },
      powertrain: { maxPowerW: 2e6, drivetrainEfficiency: 1, drive: 'rear', gearing: null },
    });
    const envelope = bicycleEnvelope(car, ambient);
    const p = envelope.params;
    const expected = (mu * p.weightN * 0.45) / (1 - (mu * 0.48) / 2.5) / p.massKg;
    expect(envelope.accelLimitMps2(10, 0)).toBeCloseTo(expected, 5);
  });

  it('lateral transfer with load-sensitive tyres lowers the cornering limit, by the quadratic the tyre law gives', () => {
    // With mu = mu0 (1 - k (Fz - F0) / F0) per tyre, an axle's two tyres at Fbar +- dF give
    // mu0 [2 Fbar (1 + k) - 2 k (Fbar^2 + dF^2) / F0]; the limit solves demand = capacity (common practice).
    const k = 0.15;
    const mu0 = 1.3;
    const car = clubCar({
      tyre: { ...clubCar().tyre, muLat: mu0, loadSensitivity: k },
      aero: { dragAreaM2: 0, liftAreaM2: 0, frontDownforceFraction: 0.5 },
    });
    const envelope = bicycleEnvelope(car, ambient);
    const p = envelope.params;
    const axleLimit = (axleLoad: number, rollShare: number, track: number, demandShare: number) => {
      const f0 = axleLoad / 2;
      const c = (rollShare * p.massKg * 0.48) / track; // dF per unit ay
      // demandShare m ay = mu0 [2 f0 (1 + k) - 2 k (f0^2 + c^2 ay^2) / f0] = mu0 [2 f0 - 2 k c^2 ay^2 / f0]
      const A = (2 * mu0 * k * c * c) / f0;
      const B = demandShare * p.massKg;
      const C = -2 * mu0 * f0;
      return (-B + Math.sqrt(B * B - 4 * A * C)) / (2 * A);
    };
    const front = axleLimit(p.weightN * 0.55, 0.58, 1.5, 0.55);
    const rear = axleLimit(p.weightN * 0.45, 0.42, 1.48, 0.45);
    expect(envelope.lateralLimitMps2(25, 1)).toBeCloseTo(Math.min(front, rear), 6);
    expect(envelope.lateralLimitingAxle(25)).toBe(front < rear ? 'front' : 'rear');
    expect(Math.min(front, rear)).toBeLessThan(mu0 * G);
  });

  it('a stiffer front roll share moves the cornering limit to the front axle', () => {
    // Milliken and Milliken, SAE 1995, ch. 18: more roll stiffness at one end means more load transfer and less grip there.
    const soft = bicycleEnvelope(clubCar({ rollStiffnessFrontFraction: 0.3 }), ambient);
    const stiff = bicycleEnvelope(clubCar({ rollStiffnessFrontFraction: 0.8 }), ambient);
    expect(soft.lateralLimitingAxle(30)).toBe('rear');
    expect(stiff.lateralLimitingAxle(30)).toBe('front');
  });
});

describe('bicycle envelope', () => {
  it('lists every missing bicycle field in one message', () => {
    const car = clubCar({ cgHeightM: null, trackRearM: null, brakes: { maxDecelG: null, frontBias: null } });
    expect(() => bicycleEnvelope(car, ambient)).toThrow(/cgHeightM, trackRearM, brakes.frontBias/);
  });

  it('with linear tyres the cornering limit is the weaker axle of mu (W_i + D_i) / (m share_i), between table nodes too', () => {
    // Gillespie, SAE 1992, ch. 6: axle lateral forces m ay b/L and m ay a/L; with no load sensitivity each axle
    // can give mu times its load (weight share plus its share of the downforce), whatever the lateral transfer.
    const car = clubCar({
      tyre: { ...clubCar().tyre, loadSensitivity: 0 },
      aero: { dragAreaM2: 0.8, liftAreaM2: 2.5, frontDownforceFraction: 0.3 },
    });
    const envelope = bicycleEnvelope(car, ambient);
    const p = envelope.params;
    for (const speed of [10.05, 33.333, 61.27, 80.04]) {
      const downforce = 0.5 * ambient.airDensityKgPerM3 * 2.5 * speed * speed;
      const front = (1.3 * (p.weightN * 0.55 + 0.3 * downforce)) / (p.massKg * 0.55);
      const rear = (1.3 * (p.weightN * 0.45 + 0.7 * downforce)) / (p.massKg * 0.45);
      const expected = Math.min(front, rear);
      expect(Math.abs(envelope.lateralLimitMps2(speed, 1) - expected)).toBeLessThan(1e-7 * expected);
    }
  });
});
