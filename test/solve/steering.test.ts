import { describe, expect, it } from 'vitest';
import { trackFromSegments } from '../../src/track/segments.js';
import { simulate } from '../../src/solve/simulate.js';
import { criticalSpeedWarning, steeringTraceDeg } from '../../src/solve/steering.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../../src/units.js';
import { clubCar } from '../car/bicycle-fixtures.js';

const ambient = ambientFrom();

describe('steering trace', () => {
  it('on a ring the steer is 57.3 L / R + K ay, and zero on a straight', () => {
    // Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6 (K = Wf/Cf - Wr/Cr in deg/g, 57.3 as 180/pi).
    const car = clubCar();
    const radiusM = 90;
    const track = trackFromSegments(
      {
        name: 'ring',
        closed: true,
        widthM: 12,
        segments: [
          { kind: 'straight', lengthM: 300 },
          { kind: 'arc', radiusM, angleDeg: 180 },
          { kind: 'straight', lengthM: 300 },
          { kind: 'arc', radiusM, angleDeg: 180 },
        ],
      },
      1,
      'ring',
    );
    const lap = simulate(track, car, { ambient });
    const steer = steeringTraceDeg(lap, car);
    const massKg = car.massKg + car.fuel.massKg;
    const kDegPerG =
      (massKg * G * 0.55) / (110_000 * (Math.PI / 180)) - (massKg * G * 0.45) / (120_000 * (Math.PI / 180));
    const mid = 300 + Math.round((Math.PI * radiusM) / 2); // middle of the first arc
    const ayG = lap.trace.ayMps2[mid]! / G;
    const kappa = lap.trace.curvaturePerM[mid]!;
    expect(Math.abs(kappa - 1 / radiusM)).toBeLessThan(1e-3 / radiusM);
    expect(steer[mid]!).toBeCloseTo((180 / Math.PI) * 2.5 * kappa + kDegPerG * ayG, 9);
    expect(steer[150]!).toBeCloseTo(0, 6);
  });

  it('warns when an oversteering car goes faster than its critical speed, with the speed', () => {
    // Critical speed sqrt(-57.3 L g / K) (Gillespie, SAE 1992, ch. 6).
    const car = clubCar({
      frontWeightFraction: 0.4,
      tyre: { ...clubCar().tyre, corneringStiffnessFrontNPerRad: 120_000, corneringStiffnessRearNPerRad: 80_000 },
    });
    const massKg = car.massKg + car.fuel.massKg;
    const kRad = (massKg * 0.4) / 120_000 - (massKg * 0.6) / 80_000;
    const criticalKph = Math.sqrt(-2.5 / kRad) * 3.6;
    const track = trackFromSegments(
      { name: 'straight', closed: false, widthM: 12, segments: [{ kind: 'straight', lengthM: 2000 }] },
      1,
      'straight',
    );
    const lap = simulate(track, car, { ambient, startSpeedMps: 10 });
    expect(lap.maxSpeedMps * 3.6).toBeGreaterThan(criticalKph);
    const warning = criticalSpeedWarning(lap, car);
    expect(warning).not.toBeNull();
    expect(noteText(warning!)).toContain(`${criticalKph.toFixed(0)} km/h`);
    // In the reader's units: 1 mph = 0.44704 m/s exactly (NIST SP 811, appendix B).
    const criticalMph = criticalKph / 3.6 / 0.44704;
    expect(noteText(warning!, displayUnits('imperial'))).toContain(`critical speed ${criticalMph.toFixed(0)} mph`);
    expect(criticalSpeedWarning(lap, clubCar())).toBeNull();
  });
});
