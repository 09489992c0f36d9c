// The transient check of a reference lap: the single-track model is integrated in time with odex while the
// driver model follows the reference line and speed; the followed lap time, the largest path deviation and the
// places where an axle saturates tell whether the quasi-steady-state reference is drivable by a car with yaw
// and lateral dynamics. States: station s, lateral error e, heading error, lateral velocity, yaw rate, speed.

import type { Ambient, Car } from '../car/types.js';
import type { LapResult } from './types.js';
import { bicycleParams } from '../car/bicycle-params.js';
import { bicycleEnvelope } from '../car/bicycle-envelope.js';
import type { Envelope } from '../car/envelope.js';
import { understeerGradientRadPerMps2, criticalSpeedMps } from '../car/understeer.js';
import { pointMassEnvelope } from '../car/point-mass.js';
import { driveForceTable } from '../car/drive-force.js';
import { ambientFrom } from '../car/ambient.js';
import { STANDARD_GRAVITY_MPS2, radToDeg } from '../units.js';
import { newOdexSolver } from './transient-odex.js';
import { newSingleTrackForces, pathRates, singleTrackForces, singleTrackModel, type AxleForceLaw, type SingleTrackInput } from './transient-model.js';
import { DEFAULT_DRIVER, newDriver, type DriverSettings, type ReferenceLookup } from './transient-driver.js';

export interface TransientOptions {
  ambient?: Ambient;
  law?: AxleForceLaw;
  driver?: Partial<DriverSettings>;
  /** Largest lateral deviation from the reference line that still counts as following it, m (default 1). */
  deviationLimitM?: number;
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

const SPIN_COURSE_ERROR_RAD = 1;
const LOST_DEVIATION_M = 25;
const MAX_STEP_S = 0.05;

/**
 * The speed the driver aims for: the reference speed, but braking only at `brakingShare` of the envelope's braking
 * limit (a backward pass from each corner, twice round a closed lap), so the car reaches each corner at its speed
 * with some braking in hand; and the acceleration that goes with it.
 */
function driverTarget(result: LapResult, envelope: Envelope, brakingShare: number): { speedMps: Float64Array; axMps2: Float64Array } {
  const t = result.trace;
  const n = t.count;
  const ds = result.path.segmentLengthM;
  const speed = Float64Array.from(t.speedMps);
  const sweeps = t.closed ? 2 * n : n - 1;
  for (let k = 0; k < sweeps; k++) {
    const j = t.closed ? (n - 1 - (k % n) + n) % n : n - 1 - k;
    const i = j === 0 ? n - 1 : j - 1;
    if (!t.closed && j === 0) break;
    const v = speed[j]!;
    const decel = brakingShare * (envelope.brakeLimitMps2(v, v * v * t.curvaturePerM[i]!) - envelope.coastDecelMps2(v)) + envelope.coastDecelMps2(v);
    const reachable = Math.sqrt(v * v + 2 * Math.max(decel, 0) * ds[i]!);
    if (reachable < speed[i]!) speed[i] = reachable;
  }
  const ax = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 < n ? i + 1 : t.closed ? 0 : i;
    ax[i] = j === i ? (i > 0 ? ax[i - 1]! : 0) : (speed[j]! * speed[j]! - speed[i]! * speed[i]!) / (2 * ds[i]!);
  }
  return { speedMps: speed, axMps2: ax };
}

function referenceLookup(result: LapResult, target: { speedMps: Float64Array; axMps2: Float64Array }): ReferenceLookup & { endM: number } {
  const t = result.trace;
  const n = t.count;
  const d = t.distanceM;
  const closed = t.closed;
  const lengthM = result.lengthM;
  const endM = closed ? lengthM : d[n - 1]!;
  let k = 0;
  let next = 1;
  let share = 0;
  const locate = (stationM: number) => {
    let s = stationM;
    if (closed) s = ((s % lengthM) + lengthM) % lengthM;
    else s = Math.min(Math.max(s, 0), endM);
    while (k > 0 && d[k]! > s) k--;
    while (k < n - 1 && d[k + 1]! <= s) k++;
    next = k + 1 < n ? k + 1 : closed ? 0 : k;
    const endOfSegment = k + 1 < n ? d[k + 1]! : lengthM;
    share = endOfSegment > d[k]! ? (s - d[k]!) / (endOfSegment - d[k]!) : 0;
  };
  const read = (values: Float64Array, stationM: number) => {
    locate(stationM);
    return values[k]! + share * (values[next]! - values[k]!);
  };
  return {
    endM,
    curvaturePerM: (s) => read(t.curvaturePerM, s),
    speedMps: (s) => read(target.speedMps, s),
    axMps2: (s) => read(target.axMps2, s),
  };
}

/** Follows the reference lap with the single-track model and a driver model; see the module comment. */
export function checkTransient(result: LapResult, car: Car, options: TransientOptions = {}): TransientCheck {
  const ambient = options.ambient ?? ambientFrom();
  const p = bicycleParams(car);
  const settings: DriverSettings = { ...DEFAULT_DRIVER, ...options.driver };
  const deviationLimitM = options.deviationLimitM ?? 1;
  const saturationUse = options.saturationUse ?? 0.95;
  const pointMass = pointMassEnvelope(car, ambient);
  const resistanceN = (speedMps: number) => p.massKg * pointMass.coastDecelMps2(speedMps);
  const drive = driveForceTable(car, ambient.powerFactor);
  const reference = referenceLookup(result, driverTarget(result, bicycleEnvelope(car, ambient), settings.brakingShare));
  const model = singleTrackModel(p, car, ambient.airDensityKgPerM3, options.law ?? 'saturating', resistanceN);
  const gradient = understeerGradientRadPerMps2(p);
  const driver = newDriver({
    params: p,
    tyre: car.tyre,
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
    const course = y[2]! + Math.atan2(y[3]!, Math.max(y[5]!, 1));
    const at = (y[0]! % wrapM).toFixed(0);
    if (Math.abs(course) > SPIN_COURSE_ERROR_RAD) lost = `the car spins at ${at} m`;
    else if (Math.abs(y[1]!) > LOST_DEVIATION_M) lost = `the car leaves the line by more than ${LOST_DEVIATION_M} m at ${at} m`;
    else if (y[5]! < 0.5) lost = `the car stops at ${at} m`;
  };

  // A closed lap is followed from a calm point (mid-way along the longest stretch of straight-line acceleration),
  // so the car starts in a steady state; an open one from its start.
  const startIndex = result.trace.closed ? calmStartIndex(result) : 0;
  const startM = result.trace.distanceM[startIndex]!;
  const startSpeed = Math.max(result.trace.speedMps[startIndex]!, 2);
  // Start in steady cornering: r = u kappa, and the lateral velocity that gives the rear axle its share m ay a / L
  // on its linear stiffness (vy = b r - u alpha_r).
  const startYawRate = startSpeed * reference.curvaturePerM(startM);
  const rearSlipRad = (p.massKg * startSpeed * startYawRate * p.frontAxleToCgM) / p.wheelbaseM / p.corneringStiffnessRearNPerRad;
  const y0 = [startM, 0, 0, p.cgToRearAxleM * startYawRate - startSpeed * rearSlipRad, startYawRate, startSpeed];
  const solver = newOdexSolver(6);
  solver.denseOutput = false;
  solver.maxSteps = 2_000_000;
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

  const drivable = completed && maxDeviationM <= deviationLimitM;
  const critical = criticalSpeedMps(p.wheelbaseM, gradient);
  let verdict: string;
  if (!completed) verdict = `not drivable: ${lost || 'the integration stopped before the end of the lap'}`;
  else if (!drivable) verdict = `not drivable as computed: the followed car strays ${maxDeviationM.toFixed(2)} m from the line at ${maxDeviationAtM.toFixed(0)} m (limit ${deviationLimitM} m)`;
  else verdict = `drivable: the followed car stays within ${maxDeviationM.toFixed(2)} m of the line`;
  if (critical !== null && result.maxSpeedMps > critical) verdict += `; the car is above its critical speed ${(critical * 3.6).toFixed(0)} km/h`;

  return {
    completed,
    drivable,
    verdict,
    referenceLapTimeS: result.lapTimeS,
    followedLapTimeS,
    maxDeviationM,
    maxDeviationAtM,
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
