// The transient check of a reference lap: the single-track model is integrated in time with odex while the
// driver model follows the reference line and speed; the followed lap time, the largest path deviation and the
// places where an axle saturates tell whether the quasi-steady-state reference is drivable by a car with yaw
// and lateral dynamics. States: station s, lateral error e, heading error, lateral velocity, yaw rate, speed.

import type { Ambient, Car } from '../car/types.js';
import type { LapResult } from './types.js';
import { bicycleParams } from '../car/bicycle-params.js';
import { understeerGradientRadPerMps2, criticalSpeedMps } from '../car/understeer.js';
import { pointMassEnvelope } from '../car/point-mass.js';
import { driveForceTable } from '../car/drive-force.js';
import { ambientFrom } from '../car/ambient.js';
import { STANDARD_GRAVITY_MPS2, mpsToKph, radToDeg } from '../units.js';
import { newOdexSolver } from './transient-odex.js';
import { axleState, newAxleState } from '../car/bicycle-axles.js';
import { axleSlipForForceRad, newSingleTrackForces, pathRates, singleTrackForces, singleTrackModel, type AxleForceLaw, type SingleTrackInput } from './transient-model.js';
import { DEFAULT_DRIVER, newDriver, type DriverSettings } from './transient-driver.js';
import { deviationRoom, referenceLookup, type DeviationLimitSource } from './transient-reference.js';

export type { DeviationLimitSource } from './transient-reference.js';

export interface TransientOptions {
  ambient?: Ambient;
  law?: AxleForceLaw;
  driver?: Partial<DriverSettings>;
  /**
   * A fixed largest lateral deviation from the reference line, m, on both sides; by default the room to the track's
   * edge at each point (less half the car's width), or 1 m where the track gives no widths.
   */
  deviationLimitM?: number;
  /** When the reference drives a racing line: its offset from the centreline on the track's grid, m, positive left. */
  pathOffsetM?: Float64Array;
  /** Axle use from which a stretch counts as saturated (default 0.95). */
  saturationUse?: number;
}

export interface SaturationZone {
  fromM: number;
  toM: number;
  axle: 'front' | 'rear' | 'both';
  peakUse: number;
}

export interface TransientCheck {
  /** The followed car reached the end of the lap without spinning or leaving the line by more than 25 m. */
  completed: boolean;
  drivable: boolean;
  verdict: string;
  referenceLapTimeS: number;
  /** Lap time of the followed lap (NaN when it did not complete). */
  followedLapTimeS: number;
  maxDeviationM: number;
  maxDeviationAtM: number;
  /** Where the limit comes from: the room to the track's edge, or a fixed distance. */
  deviationLimitSource: DeviationLimitSource;
  /** The largest deviation as a share of the room to the edge on its side (1 = at the limit), where, and its figures. */
  maxDeviationShare: number;
  maxDeviationShareAtM: number;
  deviationAtShareM: number;
  roomAtShareM: number;
  /** The followed car's speed there, and the reference's, m/s. */
  speedAtShareMps: number;
  referenceSpeedAtShareMps: number;
  maxSteerDeg: number;
  saturation: SaturationZone[];
  /** On the reference's grid (path distance): the followed car's lateral error, speed and steer. */
  lateralErrorM: Float64Array;
  followedSpeedMps: Float64Array;
  steerDeg: Float64Array;
  /** Combined friction use of the front and rear axle (1 = saturated). */
  frontUse: Float64Array;
  rearUse: Float64Array;
  /** Integrator work, for the benchmark. */
  steps: number;
  evaluations: number;
}

const SPIN_HEADING_ERROR_RAD = 1;
/** Sideslip beyond which the car counts as spinning (about 30 deg; common practice, no source). */
const SPIN_SIDESLIP_RAD = 0.5;
const LOST_DEVIATION_M = 25;
const MAX_STEP_S = 0.05;

/** Follows the reference lap with the single-track model and a driver model; see the module comment. */
export function checkTransient(result: LapResult, car: Car, options: TransientOptions = {}): TransientCheck {
  const ambient = options.ambient ?? ambientFrom();
  const p = bicycleParams(car);
  const settings: DriverSettings = { ...DEFAULT_DRIVER, ...options.driver };
  const room = deviationRoom(result, car, options.deviationLimitM, options.pathOffsetM);
  const saturationUse = options.saturationUse ?? 0.95;
  const pointMass = pointMassEnvelope(car, ambient);
  const resistanceN = (speedMps: number) => p.massKg * pointMass.coastDecelMps2(speedMps);
  const drive = driveForceTable(car, ambient.powerFactor);
  const reference = referenceLookup(result, room.leftM, room.rightM);
  const law = options.law ?? 'brush';
  const model = singleTrackModel(p, car, ambient.airDensityKgPerM3, law, resistanceN);
  const gradient = understeerGradientRadPerMps2(p);
  const driver = newDriver({
    params: p,
    tyre: car.tyre,
    law,
    settings,
    understeerGradientRadPerMps2: gradient,
    halfRhoLift: model.halfRhoLift,
    brakeCapN: car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2 * p.massKg,
    engineForceN: drive.forceN,
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
    return [kinematics[0]!, kinematics[1]!, kinematics[2]!, forces.lateralVelocityRate, forces.yawAcceleration, forces.speedRate];
  };

  // Recorded at every accepted step.
  const times: number[] = [];
  const stations: number[] = [];
  const errors: number[] = [];
  const speeds: number[] = [];
  const steers: number[] = [];
  const frontUses: number[] = [];
  const rearUses: number[] = [];
  let lost = '';
  const record = (t: number, y: number[]) => {
    evaluate(y);
    times.push(t);
    stations.push(y[0]!);
    errors.push(y[1]!);
    speeds.push(y[5]!);
    steers.push(input.steerRad);
    frontUses.push(forces.frontUse);
    rearUses.push(forces.rearUse);
    // A spin shows as a large sideslip or heading error (the course, heading plus sideslip, can stay on the path).
    const sideslip = Math.atan2(y[3]!, Math.max(y[5]!, 1));
    const at = (y[0]! % wrapM).toFixed(0);
    if (Math.abs(sideslip) > SPIN_SIDESLIP_RAD || Math.abs(y[2]!) > SPIN_HEADING_ERROR_RAD || Math.abs(y[2]! + sideslip) > SPIN_HEADING_ERROR_RAD) lost = `the car spins at ${at} m`;
    else if (Math.abs(y[1]!) > LOST_DEVIATION_M) lost = `the car leaves the line by more than ${LOST_DEVIATION_M} m at ${at} m`;
    else if (y[5]! < 0.5) lost = `the car stops at ${at} m`;
  };

  // A closed lap is followed from a calm point (mid-way along the longest stretch of straight-line acceleration),
  // so the car starts in a steady state; an open one from its start.
  const startIndex = result.trace.closed ? calmStartIndex(result) : 0;
  const startM = result.trace.distanceM[startIndex]!;
  const startSpeed = Math.max(result.trace.speedMps[startIndex]!, 2);
  // Start in steady cornering: r = u kappa, and the lateral velocity that gives the rear axle its share m ay a / L
  // on the tyre law (vy = b r - u tan alpha_r), heading error -sideslip so that the car moves along the line.
  const startYawRate = startSpeed * reference.curvaturePerM(startM);
  const startAxles = axleState(p, car.tyre, model.halfRhoLift * startSpeed * startSpeed, 0, startSpeed * startYawRate, newAxleState());
  const rearSlipRad = axleSlipForForceRad(p.corneringStiffnessRearNPerRad, Math.sign(startYawRate) * startAxles.rearLatDemandN, startAxles.rearLatCapN, law, 0.995);
  const startVy = p.cgToRearAxleM * startYawRate - startSpeed * Math.tan(rearSlipRad);
  const y0 = [startM, 0, -Math.atan2(startVy, startSpeed), startVy, startYawRate, startSpeed];
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

  const count = times.length;
  const lastStation = stations[count - 1]!;
  const completed = !lost && lastStation >= endM;
  let followedLapTimeS = NaN;
  if (completed) {
    const before = count >= 2 ? count - 2 : 0;
    const span = stations[count - 1]! - stations[before]!;
    followedLapTimeS = span > 0 ? times[before]! + ((endM - stations[before]!) / span) * (times[count - 1]! - times[before]!) : times[count - 1]!;
  }

  let maxDeviationM = 0;
  let maxDeviationAtM = 0;
  let maxDeviationShare = 0;
  let maxDeviationShareAtM = 0;
  let deviationAtShareM = 0;
  let roomAtShareM = 0;
  let speedAtShareMps = 0;
  let referenceSpeedAtShareMps = 0;
  let maxSteerRad = 0;
  const saturation: SaturationZone[] = [];
  let open: SaturationZone | null = null;
  let frontPeak = 0;
  let rearPeak = 0;
  for (let k = 0; k < count; k++) {
    const station = Math.min(stations[k]!, endM) % wrapM;
    if (Math.abs(errors[k]!) > maxDeviationM) {
      maxDeviationM = Math.abs(errors[k]!);
      maxDeviationAtM = station;
    }
    const roomM = errors[k]! >= 0 ? reference.roomLeftM(station) : reference.roomRightM(station);
    if (Math.abs(errors[k]!) / roomM > maxDeviationShare) {
      maxDeviationShare = Math.abs(errors[k]!) / roomM;
      maxDeviationShareAtM = station;
      deviationAtShareM = errors[k]!;
      roomAtShareM = roomM;
      speedAtShareMps = speeds[k]!;
      referenceSpeedAtShareMps = reference.speedMps(station);
    }
    maxSteerRad = Math.max(maxSteerRad, Math.abs(steers[k]!));
    const front = frontUses[k]!;
    const rear = rearUses[k]!;
    if (Math.max(front, rear) >= saturationUse) {
      if (!open) {
        open = { fromM: station, toM: station, axle: 'front', peakUse: 0 };
        frontPeak = rearPeak = 0;
      }
      open.toM = station;
      frontPeak = Math.max(frontPeak, front);
      rearPeak = Math.max(rearPeak, rear);
    } else if (open) {
      saturation.push(closeZone(open, frontPeak, rearPeak, saturationUse));
      open = null;
    }
  }
  if (open) saturation.push(closeZone(open, frontPeak, rearPeak, saturationUse));

  const n = result.trace.count;
  const lateralErrorM = new Float64Array(n);
  const followedSpeedMps = new Float64Array(n);
  const steerDeg = new Float64Array(n);
  const frontUse = new Float64Array(n);
  const rearUse = new Float64Array(n);
  resampleOnGrid(result.trace.distanceM, startIndex, result.lengthM, stations, [errors, speeds, steers, frontUses, rearUses], [lateralErrorM, followedSpeedMps, steerDeg, frontUse, rearUse]);
  for (let i = 0; i < n; i++) steerDeg[i] = radToDeg(steerDeg[i]!);

  const drivable = completed && maxDeviationShare <= 1;
  const critical = criticalSpeedMps(p.wheelbaseM, gradient);
  const side = deviationAtShareM >= 0 ? 'left' : 'right';
  const limitText = room.source === 'fixed' ? `the fixed limit ${roomAtShareM.toFixed(2)} m` : `the ${roomAtShareM.toFixed(2)} m of room to the ${side} edge`;
  const worst = `${Math.abs(deviationAtShareM).toFixed(2)} m to the ${side} at ${maxDeviationShareAtM.toFixed(0)} m, ${(100 * maxDeviationShare).toFixed(0)} % of ${limitText}`;
  let verdict: string;
  const stalledAt = `the integration stalled at ${(lastStation % wrapM).toFixed(0)} m after ${outcome.nStep} steps (the driver model's inputs chatter there)`;
  if (!completed) verdict = `not drivable: ${lost || stalledAt}`;
  else if (!drivable) verdict = `not drivable as computed: the followed car runs ${worst}, at ${mpsToKph(speedAtShareMps).toFixed(0)} km/h against the reference's ${mpsToKph(referenceSpeedAtShareMps).toFixed(0)} km/h`;
  else verdict = `drivable: the followed car stays on the track, at most ${worst}`;
  if (critical !== null && result.maxSpeedMps > critical) verdict += `; the car is above its critical speed ${mpsToKph(critical).toFixed(0)} km/h`;

  return {
    completed,
    drivable,
    verdict,
    referenceLapTimeS: result.lapTimeS,
    followedLapTimeS,
    maxDeviationM,
    maxDeviationAtM,
    deviationLimitSource: room.source,
    maxDeviationShare,
    maxDeviationShareAtM,
    deviationAtShareM,
    roomAtShareM,
    speedAtShareMps,
    referenceSpeedAtShareMps,
    maxSteerDeg: radToDeg(maxSteerRad),
    saturation,
    lateralErrorM,
    followedSpeedMps,
    steerDeg,
    frontUse,
    rearUse,
    steps: outcome.nStep,
    evaluations: outcome.nEval + count,
  };
}

function closeZone(zone: SaturationZone, frontPeak: number, rearPeak: number, threshold: number): SaturationZone {
  const axle = frontPeak >= threshold && rearPeak >= threshold ? 'both' : frontPeak >= rearPeak ? 'front' : 'rear';
  return { ...zone, axle, peakUse: Math.max(frontPeak, rearPeak) };
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
function resampleOnGrid(gridM: Float64Array, startIndex: number, lengthM: number, stations: number[], columns: number[][], outs: Float64Array[]): void {
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
