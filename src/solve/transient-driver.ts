// A path-following driver model for the transient check: steering is the steady-state steer of the curvature
// a short time ahead (L kappa + K ay, Gillespie, SAE 1992, ch. 6) plus a look-ahead correction that closes the
// lateral and course errors like a critically damped second-order loop of natural frequency u / d (d = preview
// distance); the pedals follow the reference speed with its acceleration as feedforward, never asking an axle for
// more than its friction ellipse leaves after the cornering demand (a driver at the threshold, ABS-like).

import type { BicycleParams } from '../car/bicycle-params.js';
import type { Car } from '../car/types.js';
import { axleState, newAxleState } from '../car/bicycle-axles.js';
import { remainingShare } from '../car/point-mass.js';
import type { SingleTrackInput } from './transient-model.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

export interface DriverSettings {
  /** Look-ahead time of the path correction, s, and its shortest distance, m. */
  previewTimeS: number;
  minPreviewM: number;
  /** How far ahead the steering feedforward reads the curvature, s (covers the yaw response lag). */
  feedforwardLeadS: number;
  /** Gain on the speed error, 1/s, and how far ahead the pedals read the reference speed and acceleration, s. */
  speedGainPerS: number;
  speedLeadS: number;
  /** Share of what an axle's ellipse leaves for the pedals that the driver takes (1 = all of it). */
  pedalShare: number;
  /** Gain on the yaw-rate error, in kinematic steer units (0 = none). */
  yawGain: number;
  /** Share of the envelope's braking limit the driver plans to brake at (braking earlier than the reference). */
  brakingShare: number;
  /** Lateral error beyond which the driver lifts off the throttle, m. */
  liftFromM: number;
  /** Largest road-wheel steer, rad. */
  maxSteerRad: number;
}

export const DEFAULT_DRIVER: DriverSettings = {
  previewTimeS: 0.7,
  minPreviewM: 5,
  feedforwardLeadS: 0.08,
  speedGainPerS: 3,
  speedLeadS: 0.15,
  pedalShare: 0.97,
  yawGain: 1,
  brakingShare: 0.85,
  liftFromM: 0.5,
  maxSteerRad: 0.6,
};

/** What the driver sees of the reference at a station. */
export interface ReferenceLookup {
  curvaturePerM(stationM: number): number;
  speedMps(stationM: number): number;
  axMps2(stationM: number): number;
}

export interface DriverContext {
  params: BicycleParams;
  tyre: Car['tyre'];
  settings: DriverSettings;
  understeerGradientRadPerMps2: number;
  halfRhoLift: number;
  brakeCapN: number;
  engineForceN(speedMps: number): number;
  resistanceN(speedMps: number): number;
  reference: ReferenceLookup;
}

export type Driver = (stationM: number, lateralErrorM: number, headingErrorRad: number, lateralVelocityMps: number, yawRateRadPerS: number, speedMps: number, out: SingleTrackInput) => SingleTrackInput;

/** Share of an axle's lateral capacity its present slip angle asks for, on the saturating law. */
const slipShare = (stiffnessNPerRad: number, slipRad: number, capacityN: number) => (capacityN > 0 ? Math.tanh(Math.abs(stiffnessNPerRad * slipRad) / capacityN) : 1);

/** Slip angle at which the tanh law gives forceN (magnitude), rad; held just short of the capacity. */
function inverseSlipRad(stiffnessNPerRad: number, forceN: number, capacityN: number): number {
  if (!(capacityN > 0)) return 0;
  const share = Math.min(forceN / capacityN, 0.95);
  return (capacityN * Math.atanh(share)) / stiffnessNPerRad;
}

export function newDriver(context: DriverContext): Driver {
  const { params: p, tyre, settings, reference } = context;
  const scratch = newAxleState();
  const n = tyre.ggExponent;
  const bias = p.brakeFrontBias;
  return (stationM, lateralErrorM, headingErrorRad, lateralVelocityMps, yawRateRadPerS, speedMps, out) => {
    const u = Math.max(speedMps, 1);
    const kappaAhead = reference.curvaturePerM(stationM + u * settings.feedforwardLeadS);
    const feedforward = p.wheelbaseM * kappaAhead + context.understeerGradientRadPerMps2 * u * u * kappaAhead;
    const previewM = Math.max(settings.minPreviewM, settings.previewTimeS * u);
    const courseErrorRad = headingErrorRad + Math.atan2(lateralVelocityMps, u);
    // Yaw-rate error, in units of the kinematic steer L r / u: damps a slide the path loop alone is too slow for.
    const yawCorrection = (settings.yawGain * p.wheelbaseM * (u * kappaAhead - yawRateRadPerS)) / u;
    const correction = yawCorrection - p.wheelbaseM * (lateralErrorM / (previewM * previewM) + (2 * courseErrorRad) / previewM);
    const clampSteer = (steerRad: number) => Math.max(-settings.maxSteerRad, Math.min(settings.maxSteerRad, steerRad));
    out.steerRad = clampSteer(feedforward + correction);

    const resistance = context.resistanceN(speedMps);
    const aheadM = stationM + u * settings.speedLeadS;
    // Running wide, the driver lifts off the throttle (but still brakes where the reference does).
    // Feedforward: the reference acceleration, drag and rolling resistance, and the front axle's cornering drag.
    const corneringDragN = Math.abs(p.massKg * u * u * kappaAhead * (p.cgToRearAxleM / p.wheelbaseM) * Math.sin(out.steerRad));
    const followN = p.massKg * (reference.axMps2(aheadM) + settings.speedGainPerS * (reference.speedMps(aheadM) - speedMps)) + resistance + corneringDragN;
    const wantedN = Math.abs(lateralErrorM) > settings.liftFromM ? Math.min(followN, 0) : followN;
    // The pedals leave each axle what its ellipse has after the larger of the steady cornering demand and what
    // the present slip angle asks for, so a correction or a slide is not made worse by the throttle or brake.
    // The loads follow the deceleration the pedals give, not the one asked for: two fixed-point passes.
    const frontSlip = out.steerRad - Math.atan2(lateralVelocityMps + p.frontAxleToCgM * yawRateRadPerS, u);
    const rearSlip = -Math.atan2(lateralVelocityMps - p.cgToRearAxleM * yawRateRadPerS, u);
    const axBoundMps2 = tyre.muLong * STANDARD_GRAVITY_MPS2;
    let axMps2 = Math.max(-axBoundMps2, Math.min(axBoundMps2, (wantedN - resistance) / p.massKg));
    for (let pass = 0; pass < 2; pass++) {
      const s = axleState(p, tyre, context.halfRhoLift * speedMps * speedMps, axMps2, u * yawRateRadPerS, scratch);
      const frontLat = Math.max(s.frontLatCapN > 0 ? s.frontLatDemandN / s.frontLatCapN : 1, slipShare(p.corneringStiffnessFrontNPerRad, frontSlip, s.frontLatCapN));
      const rearLat = Math.max(s.rearLatCapN > 0 ? s.rearLatDemandN / s.rearLatCapN : 1, slipShare(p.corneringStiffnessRearNPerRad, rearSlip, s.rearLatCapN));
      const frontLeftN = settings.pedalShare * s.frontLongCapN * remainingShare(frontLat, n);
      const rearLeftN = settings.pedalShare * s.rearLongCapN * remainingShare(rearLat, n);
      if (wantedN >= 0) {
        const engineN = context.engineForceN(speedMps);
        if (p.drive === 'rear') {
          out.frontLongN = 0;
          out.rearLongN = Math.min(wantedN, engineN, rearLeftN);
        } else if (p.drive === 'front') {
          out.frontLongN = Math.min(wantedN, engineN, frontLeftN);
          out.rearLongN = 0;
        } else {
          const total = Math.min(wantedN, engineN, frontLeftN + rearLeftN);
          const frontShare = frontLeftN + rearLeftN > 0 ? frontLeftN / (frontLeftN + rearLeftN) : 0.5;
          out.frontLongN = total * frontShare;
          out.rearLongN = total - out.frontLongN;
        }
      } else {
        const limitN = Math.min(context.brakeCapN, bias > 0 ? frontLeftN / bias : Infinity, bias < 1 ? rearLeftN / (1 - bias) : Infinity);
        const brakeN = Math.min(-wantedN, Math.max(0, limitN));
        out.frontLongN = -bias * brakeN;
        out.rearLongN = -(1 - bias) * brakeN;
      }
      axMps2 = (out.frontLongN + out.rearLongN - resistance) / p.massKg;
    }

    // Steady-state steer of the saturating tyres, delta = L kappa + alpha_f - alpha_r (Gillespie, SAE 1992, ch. 6),
    // each slip angle the inverse of the tanh law at the axle's force Fyf = m ay b/L, Fyr = m ay a/L and at what its
    // ellipse leaves after the pedals; with linear tyres this is L kappa + K ay.
    const ayAhead = u * u * kappaAhead;
    const t = axleState(p, tyre, context.halfRhoLift * speedMps * speedMps, (out.frontLongN + out.rearLongN - resistance) / p.massKg, ayAhead, scratch);
    const frontCap = t.frontLatCapN * remainingShare(t.frontLongCapN > 0 ? Math.abs(out.frontLongN) / t.frontLongCapN : 1, n);
    const rearCap = t.rearLatCapN * remainingShare(t.rearLongCapN > 0 ? Math.abs(out.rearLongN) / t.rearLongCapN : 1, n);
    const sign = Math.sign(kappaAhead);
    const frontSlipNeeded = sign * inverseSlipRad(p.corneringStiffnessFrontNPerRad, t.frontLatDemandN, frontCap);
    const rearSlipNeeded = sign * inverseSlipRad(p.corneringStiffnessRearNPerRad, t.rearLatDemandN, rearCap);
    out.steerRad = clampSteer(p.wheelbaseM * kappaAhead + frontSlipNeeded - rearSlipNeeded + correction);
    return out;
  };
}
