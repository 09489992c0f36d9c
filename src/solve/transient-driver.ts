// A path-following driver model for the transient check, after the feedback-feedforward steering controller of
// Kapania and Gerdes (Vehicle System Dynamics 53 (2015) 1687-1704) with a single preview point (MacAdam, IEEE SMC 11
// (1981)): steer = the steady-state steer of the curvature just ahead, L kappa + alpha_f - alpha_r (L kappa + K ay
// with linear tyres, Gillespie, SAE 1992, ch. 6), less a gain times the lateral error projected to a look-ahead
// point, e + x_la (heading error + steady-state sideslip), plus (our addition) a feedback that holds the front
// axle's slip at the planned one, as the steering feel lets a driver do. The pedals follow the reference speed
// profile with its acceleration as feedforward and a proportional speed correction, within each axle's friction
// ellipse as the reference's envelope has it (a driver at the threshold, ABS-like, easing off when a tyre slides).

import type { BicycleParams } from '../car/bicycle-params.js';
import type { Car } from '../car/types.js';
import { axleState, newAxleState } from '../car/bicycle-axles.js';
import { remainingShare } from '../car/point-mass.js';
import { axlePeakSlipRad, axleSlipForForceRad, type AxleForceLaw, type SingleTrackInput } from './transient-model.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

export interface DriverSettings {
  /** Look-ahead of the feedback, x_la = max(minPreviewM, previewTimeS u). */
  previewTimeS: number;
  minPreviewM: number;
  /** Steer per metre of look-ahead error, rad/m (Kapania and Gerdes's k_P). */
  lateralGainRadPerM: number;
  /** How far ahead the steering feedforward reads the curvature, s (covers the yaw response lag). */
  feedforwardLeadS: number;
  /** Share of the front axle's course error fed back (1 = the front slip held at the planned one). */
  frontSlipHold: number;
  /** Gain on the speed error, 1/s. */
  speedGainPerS: number;
  /** Share of what an axle's ellipse leaves for the pedals that the driver takes (1 = all of it, like the reference). */
  pedalShare: number;
  /** Largest share of an axle's capacity the steering feedforward plans for (matters for the tanh law only). */
  maxPlannedShare: number;
  /** Slip beyond the planned one, as a share of the axle's sliding angle, at which the pedals are fully eased. */
  slideBand: number;
  /** Largest road-wheel steer, rad. */
  maxSteerRad: number;
}

export const DEFAULT_DRIVER: DriverSettings = {
  previewTimeS: 0.5,
  minPreviewM: 8,
  lateralGainRadPerM: 0.05,
  feedforwardLeadS: 0.05,
  frontSlipHold: 1,
  speedGainPerS: 2,
  pedalShare: 1,
  maxPlannedShare: 0.995,
  slideBand: 3,
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
  law: AxleForceLaw;
  settings: DriverSettings;
  /** Linear understeer gradient, rad per m/s^2 (for the cornering-drag estimate only). */
  understeerGradientRadPerMps2: number;
  halfRhoLift: number;
  brakeCapN: number;
  engineForceN(speedMps: number): number;
  resistanceN(speedMps: number): number;
  reference: ReferenceLookup;
}

export type Driver = (
  stationM: number,
  lateralErrorM: number,
  headingErrorRad: number,
  lateralVelocityMps: number,
  yawRateRadPerS: number,
  speedMps: number,
  out: SingleTrackInput,
) => SingleTrackInput;

/** How far a slip angle goes beyond the planned one, as a share of the sliding angle (0 when within it). */
function excessShare(slipRad: number, plannedRad: number, peakRad: number): number {
  const excess = Math.abs(slipRad) - Math.abs(plannedRad);
  return excess > 0 && peakRad > 0 ? excess / peakRad : 0;
}

/**
 * The pedals' force on each axle towards `wantedN` (drive or brake), within the engine, the brakes and what each
 * axle's ellipse leaves after the cornering demand; the loads follow the acceleration the pedals give (two
 * passes). Writes out.frontLongN and out.rearLongN and returns the acceleration they give, m/s^2.
 */
function pedalForces(
  context: DriverContext,
  wantedN: number,
  speedMps: number,
  downforceN: number,
  resistanceN: number,
  ayDemandMps2: number,
  scratch: ReturnType<typeof newAxleState>,
  out: SingleTrackInput,
): number {
  const { params: p, tyre, settings } = context;
  const n = tyre.ggExponent;
  const bias = p.brakeFrontBias;
  const m = p.massKg;
  const axBoundMps2 = tyre.muLong * STANDARD_GRAVITY_MPS2 * 2;
  let axMps2 = Math.max(-axBoundMps2, Math.min(axBoundMps2, (wantedN - resistanceN) / m));
  for (let pass = 0; pass < 2; pass++) {
    const s = axleState(p, tyre, downforceN, axMps2, ayDemandMps2, scratch);
    const frontLeftN =
      settings.pedalShare *
      s.frontLongCapN *
      remainingShare(s.frontLatCapN > 0 ? s.frontLatDemandN / s.frontLatCapN : 1, n);
    const rearLeftN =
      settings.pedalShare *
      s.rearLongCapN *
      remainingShare(s.rearLatCapN > 0 ? s.rearLatDemandN / s.rearLatCapN : 1, n);
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
      const limitN = Math.min(
        context.brakeCapN,
        bias > 0 ? frontLeftN / bias : Infinity,
        bias < 1 ? rearLeftN / (1 - bias) : Infinity,
      );
      const brakeN = Math.min(-wantedN, Math.max(0, limitN));
      out.frontLongN = -bias * brakeN;
      out.rearLongN = -(1 - bias) * brakeN;
    }
    axMps2 = (out.frontLongN + out.rearLongN - resistanceN) / m;
  }
  return axMps2;
}

export function newDriver(context: DriverContext): Driver {
  const { params: p, tyre, settings, reference, law } = context;
  const scratch = newAxleState();
  const n = tyre.ggExponent;
  const m = p.massKg;
  const L = p.wheelbaseM;
  const clampSteer = (steerRad: number) => Math.max(-settings.maxSteerRad, Math.min(settings.maxSteerRad, steerRad));
  return (stationM, lateralErrorM, headingErrorRad, lateralVelocityMps, yawRateRadPerS, speedMps, out) => {
    const u = Math.max(speedMps, 1);
    const downforceN = context.halfRhoLift * speedMps * speedMps;
    const resistance = context.resistanceN(speedMps);
    const kappaHere = reference.curvaturePerM(stationM);
    const kappaAhead = reference.curvaturePerM(stationM + u * settings.feedforwardLeadS);

    // Pedals: the reference's acceleration plus a speed correction, plus what drag, rolling resistance and the
    // front axle's cornering drag (Fyf sin delta, less the m vy r the body gains from the yaw) take away.
    const axWantedMps2 =
      reference.axMps2(stationM) + settings.speedGainPerS * (reference.speedMps(stationM) - speedMps);
    const ayNowMps2 = u * yawRateRadPerS;
    const steerEstimateRad = L * kappaAhead + context.understeerGradientRadPerMps2 * u * u * kappaAhead;
    const corneringDragN =
      Math.abs((m * ayNowMps2 * p.cgToRearAxleM) / L) * Math.abs(Math.sin(steerEstimateRad)) -
      m * lateralVelocityMps * yawRateRadPerS;
    const wantedN = m * axWantedMps2 + resistance + corneringDragN;
    // Each axle's ellipse, after the path's steady cornering demand here or where the steering already aims (not
    // u r: while the sideslip builds, the yaw rate runs ahead of the lateral acceleration).
    const ayDemandMps2 = u * u * Math.max(Math.abs(kappaHere), Math.abs(kappaAhead));
    const axMps2 = pedalForces(context, wantedN, speedMps, downforceN, resistance, ayDemandMps2, scratch, out);

    // Feedforward steer: the steady-state steer delta = L kappa + alpha_f - alpha_r at the curvature just ahead,
    // each slip angle the inverse of the model's tyre law at the axle's share Fyf = m ay b / L, Fyr = m ay a / L of
    // the cornering force and at what its ellipse leaves after the pedals; with linear tyres L kappa + K ay.
    const ayAheadMps2 = u * u * kappaAhead;
    const t = axleState(p, tyre, downforceN, axMps2, ayAheadMps2, scratch);
    const frontCapN =
      t.frontLatCapN * remainingShare(t.frontLongCapN > 0 ? Math.abs(out.frontLongN) / t.frontLongCapN : 1, n);
    const rearCapN =
      t.rearLatCapN * remainingShare(t.rearLongCapN > 0 ? Math.abs(out.rearLongN) / t.rearLongCapN : 1, n);
    const sign = kappaAhead >= 0 ? 1 : -1;
    const frontSlipRad = axleSlipForForceRad(
      p.corneringStiffnessFrontNPerRad,
      sign * t.frontLatDemandN,
      frontCapN,
      law,
      settings.maxPlannedShare,
    );
    const rearSlipRad = axleSlipForForceRad(
      p.corneringStiffnessRearNPerRad,
      sign * t.rearLatDemandN,
      rearCapN,
      law,
      settings.maxPlannedShare,
    );
    const feedforwardRad = L * kappaAhead + frontSlipRad - rearSlipRad;

    // Feedback at the look-ahead point (Kapania and Gerdes's lookahead error with the steady-state sideslip
    // beta_ss = b kappa - alpha_r, so that in steady cornering the car needs no lateral error to hold its heading).
    const previewM = Math.max(settings.minPreviewM, settings.previewTimeS * u);
    const sideslipRad = p.cgToRearAxleM * kappaAhead - Math.tan(rearSlipRad);
    const lookAheadErrorM = lateralErrorM + previewM * Math.sin(headingErrorRad + sideslipRad);
    // Front-axle feedback: the direction the front axle moves in, atan((vy + a r) / u), against the one the steady
    // state plans (L kappa - alpha_r); at 1 the driver holds the front slip at the planned one, as the steering
    // feel of the front tyres lets a driver do, so a turn-in never asks the front for more than the corner needs.
    const frontCourseRad = Math.atan2(lateralVelocityMps + p.frontAxleToCgM * yawRateRadPerS, u);
    const frontCourseCorrectionRad = settings.frontSlipHold * (frontCourseRad - (L * kappaAhead - rearSlipRad));
    out.steerRad = clampSteer(
      feedforwardRad + frontCourseCorrectionRad - settings.lateralGainRadPerM * lookAheadErrorM,
    );

    // A driver at the threshold eases the pedals when an axle slides beyond the slip the steady state plans for
    // (it has then run out of lateral force): fully off once the excess reaches `slideBand` of the axle's sliding
    // angle with no longitudinal force.
    const frontExcess = excessShare(
      out.steerRad - frontCourseRad,
      frontSlipRad,
      axlePeakSlipRad(p.corneringStiffnessFrontNPerRad, t.frontLatCapN, law),
    );
    const rearExcess = excessShare(
      -Math.atan2(lateralVelocityMps - p.cgToRearAxleM * yawRateRadPerS, u),
      rearSlipRad,
      axlePeakSlipRad(p.corneringStiffnessRearNPerRad, t.rearLatCapN, law),
    );
    const ease = Math.max(0, 1 - Math.max(frontExcess, rearExcess) / settings.slideBand);
    // Both axles' forces scale together, so braking keeps the fixed brake balance.
    out.frontLongN *= ease;
    out.rearLongN *= ease;
    return out;
  };
}
