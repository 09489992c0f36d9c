// Tractive force the powertrain can deliver at each road speed: the power at the wheels eta P over v, or, where
// the car file gives a torque curve and gears, the best gear's wheel force T(rpm) i_gear i_final eta / r_wheel,
// capped by eta P / v. The drivetrain efficiency eta is applied the same way with and without gears.

import type { Car } from './types.js';

export interface DriveForceTable {
  /** Tractive force at the wheels, N, before the tyre limit, at this road speed. */
  forceN(speedMps: number): number;
  /** Gear (1-based) that gives that force, 0 where the car has no gears. */
  gearAt(speedMps: number): number;
}

const TABLE_STEP_MPS = 0.1;
const TABLE_TOP_MPS = 160;
const TABLE_COUNT = Math.round(TABLE_TOP_MPS / TABLE_STEP_MPS) + 1;

function torqueAt(rpmValues: number[], torqueValues: number[], rpm: number): number {
  const last = rpmValues.length - 1;
  if (rpm <= rpmValues[0]!) return torqueValues[0]!;
  if (rpm >= rpmValues[last]!) return torqueValues[last]!;
  let hi = 1;
  while (rpmValues[hi]! < rpm) hi++;
  const lo = hi - 1;
  const share = (rpm - rpmValues[lo]!) / (rpmValues[hi]! - rpmValues[lo]!);
  return torqueValues[lo]! + share * (torqueValues[hi]! - torqueValues[lo]!);
}

export function driveForceTable(car: Car, powerFactor: number): DriveForceTable {
  const efficiency = car.powertrain.drivetrainEfficiency;
  const powerW = car.powertrain.maxPowerW * powerFactor * efficiency;
  const gearing = car.powertrain.gearing;
  // Below walking pace P / v is unbounded; the tyre limit caps it in the envelope, but keep it finite here.
  const powerForce = (speedMps: number) => powerW / Math.max(speedMps, 1);
  const table = gearing ? gearTable(gearing, efficiency, powerFactor, powerForce) : null;
  // The same two functions with and without gears: the solver's calls through them then see one target whichever
  // car ran before (two shapes of table make the calls in the hot passes polymorphic, at about a third more time).
  return {
    forceN(speedMps) {
      if (table === null) return powerForce(speedMps);
      const position = Math.min(Math.max(speedMps, 0), TABLE_TOP_MPS) / TABLE_STEP_MPS;
      const lo = Math.min(Math.floor(position), TABLE_COUNT - 2);
      const share = position - lo;
      return table.force[lo]! + share * (table.force[lo + 1]! - table.force[lo]!);
    },
    gearAt(speedMps) {
      if (table === null) return 0;
      return table.gear[Math.round(Math.min(Math.max(speedMps, 0), TABLE_TOP_MPS) / TABLE_STEP_MPS)]!;
    },
  };
}

/** The best gear's wheel force at each step of road speed, capped by the power, and that gear. */
function gearTable(
  gearing: NonNullable<Car['powertrain']['gearing']>,
  efficiency: number,
  powerFactor: number,
  powerForce: (speedMps: number) => number,
): { force: Float64Array; gear: Int8Array } {
  const force = new Float64Array(TABLE_COUNT);
  const gear = new Int8Array(TABLE_COUNT);
  const radPerSToRpm = 60 / (2 * Math.PI);
  for (let k = 0; k < TABLE_COUNT; k++) {
    const speedMps = k * TABLE_STEP_MPS;
    let best = 0;
    let bestGear = 0;
    for (let g = 0; g < gearing.gearRatios.length; g++) {
      const ratio = gearing.gearRatios[g]! * gearing.finalDrive;
      const rpm = (speedMps / gearing.wheelRadiusM) * ratio * radPerSToRpm;
      if (rpm > gearing.maxRpm) continue;
      const wheelForce =
        (torqueAt(gearing.torqueCurve.rpm, gearing.torqueCurve.torqueNm, rpm) * ratio * efficiency) /
        gearing.wheelRadiusM;
      if (wheelForce > best) {
        best = wheelForce;
        bestGear = g + 1;
      }
    }
    force[k] = Math.min(best * powerFactor, powerForce(speedMps));
    gear[k] = bestGear;
  }
  return { force, gear };
}
