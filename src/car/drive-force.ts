// Tractive force the powertrain can deliver at each road speed: the power at the wheels eta P over v, or, where
// the car file gives a torque curve and gears, the best gear's wheel force T(rpm) i_gear i_final eta / r_wheel,
// capped by eta P / v. The drivetrain efficiency eta is applied the same way with and without gears.

import type { Car, Gearing } from './types.js';

/** Methods, not free functions: call them on the table (`table.forceN(v)`), or wrap them to pass them on. */
export interface DriveForceTable {
  /** Tractive force at the wheels, N, before the tyre limit, at this road speed. */
  forceN(speedMps: number): number;
  /** Gear (1-based) that gives that force, 0 where the car has no gears. */
  gearAt(speedMps: number): number;
}

const TABLE_STEP_MPS = 0.1;
const TABLE_TOP_MPS = 160;
const TABLE_COUNT = Math.round(TABLE_TOP_MPS / TABLE_STEP_MPS) + 1;
/** First entry of the table's last interval, where speeds at and above the top are read. A constant rather than
 * `TABLE_COUNT - 2` in forceN: that subtraction, first met at top speed after V8 had optimised the solver around
 * it, sent the solver back to be compiled again in every new thread. */
const LAST_INTERVAL = TABLE_COUNT - 2;

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

/**
 * The drive force of one car: the power's eta P / v, or the gear table read by linear interpolation. One class with
 * the same fields and methods for every car, geared or not, so the solver's calls through it see one shape and one
 * target whichever cars ran before in the process (closures per car made those calls polymorphic and uninlined).
 */
class DriveForce implements DriveForceTable {
  constructor(
    private readonly powerW: number,
    private readonly hasGears: boolean,
    /** Best gear's force at each TABLE_STEP_MPS of speed (empty without gears). */
    private readonly tableForceN: Float64Array,
    private readonly tableGear: Int8Array,
  ) {}

  // Ternaries rather than Math.min and Math.max: the same values, in less bytecode, which keeps these calls within
  // what V8 inlines into the solver's loops.

  forceN(speedMps: number): number {
    if (!this.hasGears) return this.powerW / (speedMps > 1 ? speedMps : 1);
    const force = this.tableForceN;
    const position = tablePosition(speedMps);
    const floor = Math.floor(position);
    const lo = floor < LAST_INTERVAL ? floor : LAST_INTERVAL;
    return force[lo]! + (position - lo) * (force[lo + 1]! - force[lo]!);
  }

  gearAt(speedMps: number): number {
    return this.hasGears ? this.tableGear[Math.round(tablePosition(speedMps))]! : 0;
  }
}

/** Place of a speed on the table's steps, within the table. */
function tablePosition(speedMps: number): number {
  return (speedMps > 0 ? (speedMps < TABLE_TOP_MPS ? speedMps : TABLE_TOP_MPS) : 0) / TABLE_STEP_MPS;
}

export function driveForceTable(car: Car, powerFactor: number): DriveForceTable {
  const efficiency = car.powertrain.drivetrainEfficiency;
  const powerW = car.powertrain.maxPowerW * powerFactor * efficiency;
  const gearing = car.powertrain.gearing;
  if (!gearing) return new DriveForce(powerW, false, new Float64Array(0), new Int8Array(0));
  const { gearForceN, gear } = gearTableOf(gearing, efficiency);
  const force = new Float64Array(TABLE_COUNT);
  for (let k = 0; k < TABLE_COUNT; k++) {
    // Below walking pace P / v is unbounded; the tyre limit caps it in the envelope, but keep it finite here.
    force[k] = Math.min(gearForceN[k]! * powerFactor, powerW / Math.max(k * TABLE_STEP_MPS, 1));
  }
  return new DriveForce(powerW, true, force, gear);
}

/** The best gear's wheel force at each step of road speed, before the air's power factor, and that gear. */
interface GearTable {
  gearForceN: Float64Array;
  gear: Int8Array;
}

/**
 * The last gearbox's table, reused while the next car's gearbox and efficiency are the same in every number: the
 * runs of a sweep, a stint or an uncertainty band mostly change mass, grip or air, and building the table was a tenth
 * of each run's time. Compared by value, not by record, so a script that edits a car in place still gets its own.
 */
let lastGearTable: { key: Float64Array; table: GearTable } | null = null;

function gearTableOf(gearing: Gearing, efficiency: number): GearTable {
  const key = gearboxKey(gearing, efficiency);
  if (lastGearTable && sameNumbers(lastGearTable.key, key)) return lastGearTable.table;
  const table = gearTable(gearing, efficiency);
  lastGearTable = { key, table };
  return table;
}

/** Every number the gear table depends on, in a fixed order (each list after its length). */
function gearboxKey(gearing: Gearing, efficiency: number): Float64Array {
  const { gearRatios, torqueCurve } = gearing;
  const points = torqueCurve.rpm.length;
  const key = new Float64Array(6 + gearRatios.length + 2 * points);
  key.set([efficiency, gearing.finalDrive, gearing.wheelRadiusM, gearing.maxRpm, gearRatios.length, points]);
  key.set(gearRatios, 6);
  key.set(torqueCurve.rpm, 6 + gearRatios.length);
  key.set(torqueCurve.torqueNm, 6 + gearRatios.length + points);
  return key;
}

function sameNumbers(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}

function gearTable(gearing: Gearing, efficiency: number): GearTable {
  const gearForceN = new Float64Array(TABLE_COUNT);
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
    gearForceN[k] = best;
    gear[k] = bestGear;
  }
  return { gearForceN, gear };
}
