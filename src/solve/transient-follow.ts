// The followed lap of the transient check: the single-track model and the driver model integrated in time with odex
// (Hairer and Wanner's ODEX) from a steady state until the lap ends or the car is lost, recorded at every accepted step.
// States: station s, lateral error e, heading error, lateral velocity, yaw rate, speed.

import type { Ambient, Car } from '../car/types.js';
import type { BicycleParams } from '../car/bicycle-params.js';
import type { LapResult } from './types.js';
import { pointMassEnvelope } from '../car/point-mass.js';
import { driveForceTable } from '../car/drive-force.js';
import { axleState, newAxleState } from '../car/bicycle-axles.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';
import { distanceOf, note, type Note } from '../note.js';
import { newOdexSolver } from './transient-odex.js';
import {
  axleSlipForForceRad,
  newSingleTrackForces,
  pathRates,
  singleTrackForces,
  singleTrackModel,
  type AxleForceLaw,
  type SingleTrackInput,
} from './transient-model.js';
import { newDriver, type DriverSettings } from './transient-driver.js';
import type { TransientReference } from './transient-reference.js';

const SPIN_HEADING_ERROR_RAD = 1;
/** Sideslip beyond which the car counts as spinning (about 30 deg; common practice, no source). */
const SPIN_SIDESLIP_RAD = 0.5;
const LOST_DEVIATION_M = 25;
const MAX_STEP_S = 0.05;

export interface FollowSetup {
  ambient: Ambient;
  law: AxleForceLaw;
  settings: DriverSettings;
  params: BicycleParams;
  understeerGradientRadPerMps2: number;
  reference: TransientReference;
}

/** The step records of a followed lap, one entry per accepted step, stations increasing from the start. */
export interface FollowedLap {
  timesS: number[];
  stationsM: number[];
  lateralErrorsM: number[];
  speedsMps: number[];
  steersRad: number[];
  frontUses: number[];
  rearUses: number[];
  /** Why the car was lost (spin, off the line, stopped), or '' when it was not. */
  lost: Note | '';
  /** The grid sample the lap was followed from. */
  startIndex: number;
  /** The station at which the lap ends, and the lap length by which stations wrap (Infinity on an open lap). */
  endM: number;
  wrapM: number;
  steps: number;
  evaluations: number;
}

/** Why the followed car counts as lost at state y, or '' while it still follows the line. */
function lostReason(y: number[], wrapM: number): Note | '' {
  // A spin shows as a large sideslip or heading error (the course, heading plus sideslip, can stay on the path).
  const sideslip = Math.atan2(y[3]!, Math.max(y[5]!, 1));
  const at = distanceOf(y[0]! % wrapM);
  if (
    Math.abs(sideslip) > SPIN_SIDESLIP_RAD ||
    Math.abs(y[2]!) > SPIN_HEADING_ERROR_RAD ||
    Math.abs(y[2]! + sideslip) > SPIN_HEADING_ERROR_RAD
  )
    return note`the car spins at ${at}`;
  if (Math.abs(y[1]!) > LOST_DEVIATION_M)
    return note`the car leaves the line by more than ${distanceOf(LOST_DEVIATION_M)} at ${at}`;
  if (y[5]! < 0.5) return note`the car stops at ${at}`;
  return '';
}

/**
 * Where and how the follow starts. A closed lap is followed from a calm point (mid-way along the longest stretch
 * of straight-line acceleration), so the car starts in a steady state; an open one from its start. The state is
 * steady cornering: r = u kappa, and the lateral velocity that gives the rear axle its share m ay a / L on the tyre
 * law (vy = b r - u tan alpha_r), heading error -sideslip so that the car moves along the line.
 */
function steadyStart(
  result: LapResult,
  car: Car,
  setup: FollowSetup,
  halfRhoLift: number,
): { startIndex: number; startM: number; y0: number[] } {
  const { params: p, law, reference } = setup;
  const startIndex = result.trace.closed ? calmStartIndex(result) : 0;
  const startM = result.trace.distanceM[startIndex]!;
  const startSpeed = Math.max(result.trace.speedMps[startIndex]!, 2);
  const startYawRate = startSpeed * reference.curvaturePerM(startM);
  const startAxles = axleState(
    p,
    car.tyre,
    halfRhoLift * startSpeed * startSpeed,
    0,
    startSpeed * startYawRate,
    newAxleState(),
  );
  const rearSlipRad = axleSlipForForceRad(
    p.corneringStiffnessRearNPerRad,
    Math.sign(startYawRate) * startAxles.rearLatDemandN,
    startAxles.rearLatCapN,
    law,
    0.995,
  );
  const startVy = p.cgToRearAxleM * startYawRate - startSpeed * Math.tan(rearSlipRad);
  return { startIndex, startM, y0: [startM, 0, -Math.atan2(startVy, startSpeed), startVy, startYawRate, startSpeed] };
}

/** Integrates the single-track model with the driver following the reference; see the module comment. */
export function followLap(result: LapResult, car: Car, setup: FollowSetup): FollowedLap {
  const { ambient, law, settings, params: p, reference } = setup;
  const pointMass = pointMassEnvelope(car, ambient);
  const resistanceN = (speedMps: number) => p.massKg * pointMass.coastDecelMps2(speedMps);
  const drive = driveForceTable(car, ambient.powerFactor);
  const model = singleTrackModel(p, car, ambient.airDensityKgPerM3, law, resistanceN);
  const driver = newDriver({
    params: p,
    tyre: car.tyre,
    law,
    settings,
    understeerGradientRadPerMps2: setup.understeerGradientRadPerMps2,
    halfRhoLift: model.halfRhoLift,
    brakeCapN: car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2 * p.massKg,
    engineForceN: (speedMps) => drive.forceN(speedMps),
    resistanceN,
    reference,
  });
  const input: SingleTrackInput = { steerRad: 0, frontLongN: 0, rearLongN: 0 };
  const forces = newSingleTrackForces();
  const kinematics = new Float64Array(3);

  const evaluate = (y: number[]) => {
    const [s, e, psi, vy, r, u] = y as [number, number, number, number, number, number];
    driver(s, e, psi, vy, r, u, input);
    singleTrackForces(model, vy, r, u, input, forces);
    pathRates(u, vy, r, e, psi, reference.curvaturePerM(s), kinematics);
  };
  const derivative = (_t: number, y: number[]): number[] => {
    evaluate(y);
    return [
      kinematics[0]!,
      kinematics[1]!,
      kinematics[2]!,
      forces.lateralVelocityRate,
      forces.yawAcceleration,
      forces.speedRate,
    ];
  };

  // Recorded at every accepted step.
  const times: number[] = [];
  const stations: number[] = [];
  const errors: number[] = [];
  const speeds: number[] = [];
  const steers: number[] = [];
  const frontUses: number[] = [];
  const rearUses: number[] = [];
  let lost: Note | '' = '';
  const record = (t: number, y: number[]) => {
    evaluate(y);
    times.push(t);
    stations.push(y[0]!);
    errors.push(y[1]!);
    speeds.push(y[5]!);
    steers.push(input.steerRad);
    frontUses.push(forces.frontUse);
    rearUses.push(forces.rearUse);
    const reason = lostReason(y, wrapM);
    if (reason) lost = reason;
  };

  const { startIndex, startM, y0 } = steadyStart(result, car, setup, model.halfRhoLift);
  const solver = newOdexSolver(6);
  solver.denseOutput = false;
  // A lap takes some thousands of steps; far more means the inputs chatter (bounded so the check stays quick).
  solver.maxSteps = Math.max(20_000, Math.ceil((40 * (2 * result.lapTimeS + 60)) / MAX_STEP_S));
  solver.maxStepSize = MAX_STEP_S;
  solver.initialStepSize = 1e-3;
  solver.absoluteTolerance = [1e-3, 1e-4, 1e-5, 1e-4, 1e-5, 1e-4];
  solver.relativeTolerance = 1e-6;
  const endM = reference.endM + startM;
  const wrapM = result.trace.closed ? result.lengthM : Infinity;
  const tEnd = 2 * result.lapTimeS + 60;
  const outcome = solver.solve(derivative, 0, y0, tEnd, (_step, _tOld, t, y) => {
    record(t, y);
    if (lost) return false;
    if (y[0]! >= endM) return false;
  });

  return {
    timesS: times,
    stationsM: stations,
    lateralErrorsM: errors,
    speedsMps: speeds,
    steersRad: steers,
    frontUses,
    rearUses,
    lost,
    startIndex,
    endM,
    wrapM,
    steps: outcome.nStep,
    evaluations: outcome.nEval + times.length,
  };
}

/** The time at which the followed car crosses the lap's end, interpolated between the last two steps (NaN if it did not). */
export function followedLapTimeS(lap: FollowedLap, completed: boolean): number {
  if (!completed) return NaN;
  const { timesS: times, stationsM: stations, endM } = lap;
  const count = times.length;
  const before = count >= 2 ? count - 2 : 0;
  const span = stations[count - 1]! - stations[before]!;
  return span > 0
    ? times[before]! + ((endM - stations[before]!) / span) * (times[count - 1]! - times[before]!)
    : times[count - 1]!;
}

/** The stations of the step records on the lap (wrapped, and held at the lap's end). */
export function lapStationsM(lap: FollowedLap): Float64Array {
  const out = new Float64Array(lap.stationsM.length);
  for (let k = 0; k < out.length; k++) out[k] = Math.min(lap.stationsM[k]!, lap.endM) % lap.wrapM;
  return out;
}

/** The middle of the longest (cyclic) run of samples that accelerate with little lateral demand. */
function calmStartIndex(result: LapResult): number {
  const t = result.trace;
  const n = t.count;
  const calm = (i: number) => Math.abs(t.ayMps2[i]!) < 1 && t.axMps2[i]! >= 0;
  let bestStart = 0;
  let bestLength = 0;
  let runStart = -1;
  for (let k = 0; k < 2 * n; k++) {
    const i = k % n;
    if (calm(i)) {
      if (runStart < 0) runStart = k;
      const length = k - runStart + 1;
      if (length > bestLength && length <= n) {
        bestLength = length;
        bestStart = runStart;
      }
    } else runStart = -1;
  }
  return bestLength > 0 ? (bestStart + Math.floor(bestLength / 2)) % n : 0;
}

/**
 * Linear interpolation of step records (by station, increasing from the start sample) onto the grid, taking the
 * grid in driving order from startIndex; beyond the records, the last value.
 */
export function resampleOnGrid(
  gridM: Float64Array,
  startIndex: number,
  lengthM: number,
  stations: number[],
  columns: number[][],
  outs: Float64Array[],
): void {
  let k = 0;
  const last = stations.length - 1;
  const n = gridM.length;
  for (let j = 0; j < n; j++) {
    const i = (startIndex + j) % n;
    const s = i < startIndex ? gridM[i]! + lengthM : gridM[i]!;
    while (k < last && stations[k + 1]! < s) k++;
    const k1 = Math.min(k + 1, last);
    const span = stations[k1]! - stations[k]!;
    const share = span > 0 ? Math.min(1, Math.max(0, (s - stations[k]!) / span)) : 0;
    for (let c = 0; c < columns.length; c++) {
      const column = columns[c]!;
      outs[c]![i] = column[k]! + share * (column[k1]! - column[k]!);
    }
  }
}
