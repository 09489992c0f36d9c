// Bicycle-model g-g-v envelope: the limit is where the first axle saturates. Each axle has its own friction
// ellipse |Fx/Fxmax|^n + |Fy/Fymax|^n = 1 on its own load (weight split, aero balance, longitudinal and lateral
// load transfer, load-sensitive mu); steady cornering asks Fyf = m ay b/L and Fyr = m ay a/L of the axles
// (Gillespie, SAE 1992, ch. 6), drive goes through the driven axle(s), braking through the fixed brake balance.
// Drag, rolling resistance, the power limit and gearing are the point-mass model's, reused unchanged.

import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { bicycleParams, type BicycleParams } from './bicycle-params.js';
import { axleState, newAxleState, type AxleState } from './bicycle-axles.js';
import { combinedShare, pointMassEnvelope, remainingShare, topSpeedOf } from './point-mass.js';
import { driveForceTable } from './drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

export type Axle = 'front' | 'rear';

export interface BicycleEnvelope extends Envelope {
  readonly params: BicycleParams;
  /** The axle that saturates first in steady cornering at this speed. */
  lateralLimitingAxle(speedMps: number): Axle;
}

// The pure lateral limit is tabulated on this speed grid and read back by cubic Hermite interpolation
// (it is smooth in v: the downforce grows as v^2); above the table it is computed directly.
const TABLE_STEP_MPS = 0.1;
const TABLE_TOP_MPS = 160;
const BISECTION_STEPS = 60;

const share = (demandN: number, capacityN: number): number =>
  capacityN > 0 ? demandN / capacityN : demandN > 0 ? Infinity : 0;

export function bicycleEnvelope(car: Car, ambient: Ambient): BicycleEnvelope {
  const p = bicycleParams(car);
  const base = pointMassEnvelope(car, ambient);
  const drive = driveForceTable(car, ambient.powerFactor);
  const tyre = car.tyre;
  const exponent = tyre.ggExponent;
  const massKg = p.massKg;
  const halfRhoLift = 0.5 * ambient.airDensityKgPerM3 * car.aero.liftAreaM2;
  const brakeCapN = car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2 * massKg;
  const bias = p.brakeFrontBias;
  const scratch: AxleState = newAxleState();
  const downforceN = (speedMps: number) => halfRhoLift * speedMps * speedMps;
  const upperForceN = (speedMps: number, mu: number) =>
    2 * mu * (1 + tyre.loadSensitivity) * (p.weightN + Math.max(0, downforceN(speedMps))) + 1;

  // The road's load beyond the weight on level ground (loadFactor 1 adds nothing).
  const roadLoadN = (load: number) => (load === 1 ? 0 : (load - 1) * p.weightN);
  const lateralFits = (speedMps: number, ayMps2: number, extraN = 0): boolean => {
    const s = axleState(p, tyre, downforceN(speedMps), 0, ayMps2, scratch, extraN);
    return s.frontLatDemandN <= s.frontLatCapN && s.rearLatDemandN <= s.rearLatCapN;
  };
  const exactLateralLimitMps2 = (speedMps: number, extraN = 0): number => {
    let lo = 0;
    let hi = upperForceN(speedMps, tyre.muLat) / massKg + Math.max(0, (2 * tyre.muLat * extraN) / massKg);
    for (let k = 0; k < BISECTION_STEPS; k++) {
      const mid = 0.5 * (lo + hi);
      if (lateralFits(speedMps, mid, extraN)) lo = mid;
      else hi = mid;
    }
    return lo;
  };

  const tableCount = Math.round(TABLE_TOP_MPS / TABLE_STEP_MPS) + 1;
  const lateralTable = new Float64Array(tableCount);
  for (let k = 0; k < tableCount; k++) lateralTable[k] = exactLateralLimitMps2(k * TABLE_STEP_MPS);
  const slopeAt = (k: number): number => {
    if (k === 0) return lateralTable[1]! - lateralTable[0]!;
    if (k === tableCount - 1) return lateralTable[k]! - lateralTable[k - 1]!;
    return 0.5 * (lateralTable[k + 1]! - lateralTable[k - 1]!);
  };
  const lateralLimitMps2 = (speedMps: number, load = 1): number => {
    // Off level ground the table (made for the weight alone) does not apply: solve for this load.
    if (load !== 1) return exactLateralLimitMps2(Math.abs(speedMps), roadLoadN(load));
    const v = Math.abs(speedMps);
    if (v >= TABLE_TOP_MPS) return exactLateralLimitMps2(v);
    const position = v / TABLE_STEP_MPS;
    const k = Math.min(Math.floor(position), tableCount - 2);
    const t = position - k;
    const t2 = t * t;
    const t3 = t2 * t;
    return (
      (2 * t3 - 3 * t2 + 1) * lateralTable[k]! +
      (t3 - 2 * t2 + t) * slopeAt(k) +
      (-2 * t3 + 3 * t2) * lateralTable[k + 1]! +
      (t3 - t2) * slopeAt(k + 1)
    );
  };

  // Can the tyres give a drive force of forceN at this speed while cornering at ayMps2?
  const driveFits = (speedMps: number, ayMps2: number, forceN: number, coastMps2: number, extraN: number): boolean => {
    const s = axleState(p, tyre, downforceN(speedMps), forceN / massKg - coastMps2, ayMps2, scratch, extraN);
    if (s.frontLatDemandN > s.frontLatCapN || s.rearLatDemandN > s.rearLatCapN) return false;
    const frontLeftN = s.frontLongCapN * remainingShare(share(s.frontLatDemandN, s.frontLatCapN), exponent);
    const rearLeftN = s.rearLongCapN * remainingShare(share(s.rearLatDemandN, s.rearLatCapN), exponent);
    if (p.drive === 'rear') return forceN <= rearLeftN;
    if (p.drive === 'front') return forceN <= frontLeftN;
    return forceN <= frontLeftN + rearLeftN;
  };
  // Can the brakes, split front/rear by the fixed bias, give forceN? maxDecelG shrinks the braking side of each
  // axle's ellipse, as it shrinks the point-mass ellipse.
  const brakeFits = (speedMps: number, ayMps2: number, forceN: number, coastMps2: number, extraN: number): boolean => {
    const s = axleState(p, tyre, downforceN(speedMps), -forceN / massKg - coastMps2, ayMps2, scratch, extraN);
    if (s.frontLatDemandN > s.frontLatCapN || s.rearLatDemandN > s.rearLatCapN) return false;
    const cap = Math.min(1, brakeCapN / (s.frontLongCapN + s.rearLongCapN));
    const frontLeftN = cap * s.frontLongCapN * remainingShare(share(s.frontLatDemandN, s.frontLatCapN), exponent);
    const rearLeftN = cap * s.rearLongCapN * remainingShare(share(s.rearLatDemandN, s.rearLatCapN), exponent);
    return bias * forceN <= frontLeftN && (1 - bias) * forceN <= rearLeftN;
  };
  const largestFitting = (fits: (force: number) => boolean, hiN: number): number => {
    if (!fits(0)) return 0;
    if (fits(hiN)) return hiN;
    let lo = 0;
    let hi = hiN;
    for (let k = 0; k < BISECTION_STEPS && hi - lo > 1e-9 * hiN; k++) {
      const mid = 0.5 * (lo + hi);
      if (fits(mid)) lo = mid;
      else hi = mid;
    }
    return lo;
  };

  const accelLimitMps2 = (speedMps: number, lateralMps2: number, load = 1): number => {
    const coastMps2 = base.coastDecelMps2(speedMps, load);
    const engineN = drive.forceN(speedMps);
    if (Math.abs(lateralMps2) >= lateralLimitMps2(speedMps, load)) return Math.min(0, engineN / massKg) - coastMps2;
    const extraN = roadLoadN(load);
    const forceN = largestFitting((f) => driveFits(speedMps, lateralMps2, f, coastMps2, extraN), engineN);
    return forceN / massKg - coastMps2;
  };

  const brakeLimitMps2 = (speedMps: number, lateralMps2: number, load = 1): number => {
    const coastMps2 = base.coastDecelMps2(speedMps, load);
    if (Math.abs(lateralMps2) >= lateralLimitMps2(speedMps, load)) return coastMps2;
    const extraN = roadLoadN(load);
    const forceN = largestFitting(
      (f) => brakeFits(speedMps, lateralMps2, f, coastMps2, extraN),
      Math.min(brakeCapN, upperForceN(speedMps, tyre.muLong) + Math.max(0, 2 * tyre.muLong * extraN)),
    );
    return forceN / massKg + coastMps2;
  };

  const gripUse = (speedMps: number, axMps2: number, ayMps2: number): number => {
    const coastMps2 = base.coastDecelMps2(speedMps);
    const tyreForceN = massKg * (axMps2 + coastMps2);
    const s = axleState(p, tyre, downforceN(speedMps), axMps2, ayMps2, scratch);
    const frontLat = share(s.frontLatDemandN, s.frontLatCapN);
    const rearLat = share(s.rearLatDemandN, s.rearLatCapN);
    let frontLong = 0;
    let rearLong = 0;
    // The tyres' share only, the larger of the two axles' ellipse shares; the engine's limit is not grip in use.
    if (tyreForceN >= 0) {
      if (p.drive === 'rear') rearLong = share(tyreForceN, s.rearLongCapN);
      else if (p.drive === 'front') frontLong = share(tyreForceN, s.frontLongCapN);
      else frontLong = rearLong = share(tyreForceN, s.frontLongCapN + s.rearLongCapN);
    } else {
      const cap = Math.min(1, brakeCapN / (s.frontLongCapN + s.rearLongCapN));
      frontLong = share(-bias * tyreForceN, cap * s.frontLongCapN);
      rearLong = share(-(1 - bias) * tyreForceN, cap * s.rearLongCapN);
    }
    return Math.max(combinedShare(frontLong, frontLat, exponent), combinedShare(rearLong, rearLat, exponent));
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
    coastDecelMps2: base.coastDecelMps2,
    gripUse,
    driveLimitMps2: (speedMps) => drive.forceN(speedMps) / massKg,
    gearAt: drive.gearAt,
    lateralLimitingAxle,
  };
}
