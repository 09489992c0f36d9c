// Bicycle-model g-g-v envelope: the limit is where the first axle saturates. Each axle has its own friction
// ellipse |Fx/Fxmax|^n + |Fy/Fymax|^n = 1 on its own load (weight split, aero balance, longitudinal and lateral
// load transfer, load-sensitive mu); steady cornering asks Fyf = m ay b/L and Fyr = m ay a/L of the axles
// (Gillespie, SAE 1992, ch. 6), drive goes through the driven axle(s), braking through the fixed brake balance.
// Drag, rolling resistance, the power limit and gearing are the point-mass model's, reused unchanged.

import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { bicycleParams, type BicycleParams } from './bicycle-params.js';
import { axleState, newAxleState, type AxleState } from './bicycle-axles.js';
import { combinedShare, pointMassEnvelope, remainingShare, surelyWithinShare, topSpeedOf } from './point-mass.js';
import { driveForceTable } from './drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';
import { largestHolding } from '../numeric/bisect.js';

export type Axle = 'front' | 'rear';

export interface BicycleEnvelope extends Envelope {
  readonly params: BicycleParams;
  /** The axle that saturates first in steady cornering at this speed. */
  lateralLimitingAxle(speedMps: number): Axle;
}

// The pure lateral limit is tabulated on this speed grid (speedTable below).
const TABLE_STEP_MPS = 0.1;
const TABLE_TOP_MPS = 160;
const BISECTION_STEPS = 60;

const share = (demandN: number, capacityN: number): number =>
  capacityN > 0 ? demandN / capacityN : demandN > 0 ? Infinity : 0;

/** Whether forceN <= capacityN x the ellipse's share left beside the lateral share `used`, to the last bit: the share
 * is at most 1 and at least what surelyWithinShare takes, and is computed only where those leave the answer open (the
 * bisections below ask mostly far from the limit). */
function withinShareLeft(forceN: number, capacityN: number, used: number, exponent: number): boolean {
  if (forceN > capacityN && capacityN >= 0) return false;
  if (surelyWithinShare(forceN, capacityN, used, exponent)) return true;
  return forceN <= capacityN * remainingShare(used, exponent);
}

/**
 * A smooth function of speed tabulated every TABLE_STEP_MPS up to TABLE_TOP_MPS and read back by cubic Hermite
 * interpolation with central-difference slopes; computed directly above the table.
 */
function speedTable(exact: (speedMps: number) => number): (speedMps: number) => number {
  const count = Math.round(TABLE_TOP_MPS / TABLE_STEP_MPS) + 1;
  const table = new Float64Array(count);
  for (let k = 0; k < count; k++) table[k] = exact(k * TABLE_STEP_MPS);
  const slopeAt = (k: number): number => {
    if (k === 0) return table[1]! - table[0]!;
    if (k === count - 1) return table[k]! - table[k - 1]!;
    return 0.5 * (table[k + 1]! - table[k - 1]!);
  };
  return (v) => {
    if (v >= TABLE_TOP_MPS) return exact(v);
    const position = v / TABLE_STEP_MPS;
    const k = Math.min(Math.floor(position), count - 2);
    const t = position - k;
    const t2 = t * t;
    const t3 = t2 * t;
    return (
      (2 * t3 - 3 * t2 + 1) * table[k]! +
      (t3 - 2 * t2 + t) * slopeAt(k) +
      (-2 * t3 + 3 * t2) * table[k + 1]! +
      (t3 - t2) * slopeAt(k + 1)
    );
  };
}

/** What every limit of the bicycle model reads: the car's parameters, its tyres and one scratch axle state. */
interface BicycleModel {
  p: BicycleParams;
  tyre: Car['tyre'];
  exponent: number;
  massKg: number;
  brakeCapN: number;
  scratch: AxleState;
  downforceN: (speedMps: number) => number;
}

/** The axles' state at these accelerations, or null when either axle cannot hold the lateral demand. */
function cornerHolds(
  m: BicycleModel,
  speedMps: number,
  axMps2: number,
  ayMps2: number,
  extraN: number,
): AxleState | null {
  const s = axleState(m.p, m.tyre, m.downforceN(speedMps), axMps2, ayMps2, m.scratch, extraN);
  return s.frontLatDemandN > s.frontLatCapN || s.rearLatDemandN > s.rearLatCapN ? null : s;
}

/** Can the tyres give a drive force of forceN at this speed while cornering at ayMps2? */
function driveFits(
  m: BicycleModel,
  speedMps: number,
  ayMps2: number,
  forceN: number,
  coastMps2: number,
  extraN: number,
): boolean {
  const { p, exponent } = m;
  const s = cornerHolds(m, speedMps, forceN / m.massKg - coastMps2, ayMps2, extraN);
  if (s === null) return false;
  const front = share(s.frontLatDemandN, s.frontLatCapN);
  const rear = share(s.rearLatDemandN, s.rearLatCapN);
  if (p.drive === 'rear') return withinShareLeft(forceN, s.rearLongCapN, rear, exponent);
  if (p.drive === 'front') return withinShareLeft(forceN, s.frontLongCapN, front, exponent);
  return forceN <= s.frontLongCapN * remainingShare(front, exponent) + s.rearLongCapN * remainingShare(rear, exponent);
}

/**
 * Can the brakes, split front/rear by the fixed bias, give forceN? maxDecelG shrinks the braking side of each
 * axle's ellipse, as it shrinks the point-mass ellipse.
 */
function brakeFits(
  m: BicycleModel,
  speedMps: number,
  ayMps2: number,
  forceN: number,
  coastMps2: number,
  extraN: number,
): boolean {
  const { p, exponent } = m;
  const s = cornerHolds(m, speedMps, -forceN / m.massKg - coastMps2, ayMps2, extraN);
  if (s === null) return false;
  const cap = Math.min(1, m.brakeCapN / (s.frontLongCapN + s.rearLongCapN));
  const bias = p.brakeFrontBias;
  return (
    withinShareLeft(bias * forceN, cap * s.frontLongCapN, share(s.frontLatDemandN, s.frontLatCapN), exponent) &&
    withinShareLeft((1 - bias) * forceN, cap * s.rearLongCapN, share(s.rearLatDemandN, s.rearLatCapN), exponent)
  );
}

/** The larger of the two axles' ellipse shares; the tyres' share only (the engine's limit is not grip in use). */
function gripUseOf(m: BicycleModel, coastMps2: number, speedMps: number, axMps2: number, ayMps2: number): number {
  const { p, exponent } = m;
  const tyreForceN = m.massKg * (axMps2 + coastMps2);
  const s = axleState(p, m.tyre, m.downforceN(speedMps), axMps2, ayMps2, m.scratch);
  const frontLat = share(s.frontLatDemandN, s.frontLatCapN);
  const rearLat = share(s.rearLatDemandN, s.rearLatCapN);
  let frontLong = 0;
  let rearLong = 0;
  if (tyreForceN >= 0) {
    if (p.drive === 'rear') rearLong = share(tyreForceN, s.rearLongCapN);
    else if (p.drive === 'front') frontLong = share(tyreForceN, s.frontLongCapN);
    else frontLong = rearLong = share(tyreForceN, s.frontLongCapN + s.rearLongCapN);
  } else {
    const bias = p.brakeFrontBias;
    const cap = Math.min(1, m.brakeCapN / (s.frontLongCapN + s.rearLongCapN));
    frontLong = share(-bias * tyreForceN, cap * s.frontLongCapN);
    rearLong = share(-(1 - bias) * tyreForceN, cap * s.rearLongCapN);
  }
  return Math.max(combinedShare(frontLong, frontLat, exponent), combinedShare(rearLong, rearLat, exponent));
}

/** The largest force in [0, hiN] that fits: 0 when none does, hiN when all do, else by bisection. */
function largestFitting(fits: (forceN: number) => boolean, hiN: number): number {
  if (!fits(0)) return 0;
  if (fits(hiN)) return hiN;
  return largestHolding(fits, 0, hiN, BISECTION_STEPS, 1e-9 * hiN);
}

export function bicycleEnvelope(car: Car, ambient: Ambient): BicycleEnvelope {
  const p = bicycleParams(car);
  const base = pointMassEnvelope(car, ambient);
  const drive = driveForceTable(car, ambient.powerFactor);
  const tyre = car.tyre;
  const massKg = p.massKg;
  const halfRhoLift = 0.5 * ambient.airDensityKgPerM3 * car.aero.liftAreaM2;
  const model: BicycleModel = {
    p,
    tyre,
    exponent: tyre.ggExponent,
    massKg,
    brakeCapN: car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2 * massKg,
    scratch: newAxleState(),
    downforceN: (speedMps) => halfRhoLift * speedMps * speedMps,
  };
  const { scratch, downforceN, brakeCapN } = model;
  const upperForceN = (speedMps: number, mu: number) =>
    2 * mu * (1 + tyre.loadSensitivity) * (p.weightN + Math.max(0, downforceN(speedMps))) + 1;

  // The road's load beyond the weight on level ground (loadFactor 1 adds nothing).
  const roadLoadN = (load: number) => (load === 1 ? 0 : (load - 1) * p.weightN);
  const lateralFits = (speedMps: number, ayMps2: number, extraN = 0): boolean => {
    const s = axleState(p, tyre, downforceN(speedMps), 0, ayMps2, scratch, extraN);
    return s.frontLatDemandN <= s.frontLatCapN && s.rearLatDemandN <= s.rearLatCapN;
  };
  const exactLateralLimitMps2 = (speedMps: number, extraN = 0): number =>
    largestHolding(
      (ayMps2) => lateralFits(speedMps, ayMps2, extraN),
      0,
      upperForceN(speedMps, tyre.muLat) / massKg + Math.max(0, (2 * tyre.muLat * extraN) / massKg),
      BISECTION_STEPS,
    );
  // The pure lateral limit is smooth in v (the downforce grows as v^2): tabulated for level ground.
  const levelLateralLimitMps2 = speedTable((v) => exactLateralLimitMps2(v));
  const lateralLimitMps2 = (speedMps: number, load = 1): number =>
    // Off level ground the table (made for the weight alone) does not apply: solve for this load.
    load !== 1 ? exactLateralLimitMps2(Math.abs(speedMps), roadLoadN(load)) : levelLateralLimitMps2(Math.abs(speedMps));

  const accelLimitMps2 = (speedMps: number, lateralMps2: number, load = 1): number => {
    const coastMps2 = base.coastDecelMps2(speedMps, load);
    const engineN = drive.forceN(speedMps);
    if (Math.abs(lateralMps2) >= lateralLimitMps2(speedMps, load)) return Math.min(0, engineN / massKg) - coastMps2;
    const extraN = roadLoadN(load);
    const forceN = largestFitting((f) => driveFits(model, speedMps, lateralMps2, f, coastMps2, extraN), engineN);
    return forceN / massKg - coastMps2;
  };

  const brakeLimitMps2 = (speedMps: number, lateralMps2: number, load = 1): number => {
    const coastMps2 = base.coastDecelMps2(speedMps, load);
    if (Math.abs(lateralMps2) >= lateralLimitMps2(speedMps, load)) return coastMps2;
    const extraN = roadLoadN(load);
    const forceN = largestFitting(
      (f) => brakeFits(model, speedMps, lateralMps2, f, coastMps2, extraN),
      Math.min(brakeCapN, upperForceN(speedMps, tyre.muLong) + Math.max(0, 2 * tyre.muLong * extraN)),
    );
    return forceN / massKg + coastMps2;
  };

  const lateralLimitingAxle = (speedMps: number): Axle => {
    const s = axleState(p, tyre, downforceN(speedMps), 0, lateralLimitMps2(speedMps), scratch);
    return share(s.frontLatDemandN, s.frontLatCapN) >= share(s.rearLatDemandN, s.rearLatCapN) ? 'front' : 'rear';
  };

  return {
    kind: 'bicycle',
    params: p,
    topSpeedMps: topSpeedOf(accelLimitMps2),
    lateralLimitMps2: (speedMps, _side, load) => lateralLimitMps2(speedMps, load ?? 1),
    accelLimitMps2,
    brakeLimitMps2,
    coastDecelMps2: (speedMps, load) => base.coastDecelMps2(speedMps, load),
    gripUse: (speedMps, axMps2, ayMps2) => gripUseOf(model, base.coastDecelMps2(speedMps), speedMps, axMps2, ayMps2),
    driveLimitMps2: (speedMps) => drive.forceN(speedMps) / massKg,
    gearAt: (speedMps) => drive.gearAt(speedMps),
    lateralLimitingAxle,
  };
}
