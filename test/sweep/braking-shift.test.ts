import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { compareSetupChange } from '../../src/sweep/setup-change.js';
import { applySettings, parseSetting } from '../../src/sweep/settings.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { STANDARD_GRAVITY_MPS2 } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';
import { straightIntoHairpin } from './tracks.js';

const g = STANDARD_GRAVITY_MPS2;

describe('braking-point shift for a change of muLong', () => {
  // A 600 m straight entered at v1 = 50 m/s into a 180° hairpin of 20 m radius. No drag, no downforce,
  // no rolling resistance and next to no power (1 W): the car holds v1 down the straight and brakes at muLong g.
  const straightM = 600;
  const radiusM = 20;
  const v1Mps = 50;
  const muLat = 1.2;

  /** Constant-deceleration kinematics (v1^2 - v2^2 = 2 a d, any mechanics text): the braking point for muLong. */
  function kinematicBrakingPointM(muLong: number): number {
    const v2sq = muLat * g * radiusM; // steady cornering on the limit: v^2 = mu g R
    return straightM - (v1Mps ** 2 - v2sq) / (2 * muLong * g);
  }

  const run = (stepM: number, muLong: number, changedMuLong: string) => {
    const track = straightIntoHairpin(straightM, radiusM, 100, stepM);
    const car = testCar({ muLong, muLat, maxPowerW: 1, drive: 'all' });
    const air = { airTempC: 25, pressureHpa: 990 };
    const changed = applySettings({ car, air }, [parseSetting(`tyre.muLong=${changedMuLong}`)]);
    const options = { ambient: ambientFrom(air), startSpeedMps: v1Mps };
    return {
      changed,
      comparison: compareSetupChange(
        simulate(track, car, options),
        simulate(track, changed.car, { ...options, ambient: changed.ambient }),
      ),
    };
  };

  it('equals the difference of the kinematic braking distances (v1^2 - v2^2) / (2 mu g) within 1 m', () => {
    const { changed, comparison } = run(1, 1.2, '-20%');
    expect(changed.car.tyre.muLong).toBeCloseTo(0.96, 12);
    expect(comparison.zones).toHaveLength(1);
    const zone = comparison.zones[0]!;
    const expectedShiftM = kinematicBrakingPointM(0.96) - kinematicBrakingPointM(1.2);
    // Less grip: braking begins earlier (negative shift), by about 24 m here.
    expect(expectedShiftM).toBeLessThan(-20);
    expect(Math.abs(zone.brakingPointShiftM! - expectedShiftM)).toBeLessThan(1);
    expect(Math.abs(zone.brakingPointM - kinematicBrakingPointM(1.2))).toBeLessThan(1);
    expect(Math.abs(zone.changedBrakingPointM! - kinematicBrakingPointM(0.96))).toBeLessThan(1);
    // Same v1 and v2 (muLat unchanged): no change in entry or slowest speed.
    expect(Math.abs(zone.entrySpeedDeltaKph!)).toBeLessThan(0.1);
    expect(Math.abs(zone.minSpeedDeltaKph!)).toBeLessThan(0.1);
    expect(comparison.lapTimeDeltaS).toBeGreaterThan(0);
    expect(zone.zoneTimeDeltaS!).toBeGreaterThan(0);
  });

  it('holds on a coarse 2.5 m grid and for more grip (later braking)', () => {
    const { comparison } = run(2.5, 1.1, '1.3');
    const zone = comparison.zones[0]!;
    const expectedShiftM = kinematicBrakingPointM(1.3) - kinematicBrakingPointM(1.1);
    expect(expectedShiftM).toBeGreaterThan(10);
    expect(Math.abs(zone.brakingPointShiftM! - expectedShiftM)).toBeLessThan(1);
  });
});
