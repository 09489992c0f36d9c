// The transient check of a reference lap: the single-track model is integrated in time while the driver model
// follows the reference line and speed (transient-follow); the followed lap time, the largest path deviation
// against the room to the edge (transient-verdict) and the places where an axle saturates (transient-saturation)
// tell whether the quasi-steady-state reference is drivable by a car with yaw and lateral dynamics.

import type { Ambient, Car } from '../car/types.js';
import type { LapResult } from './types.js';
import { bicycleParams } from '../car/bicycle-params.js';
import { understeerGradientRadPerMps2, criticalSpeedMps } from '../car/understeer.js';
import { ambientFrom } from '../car/ambient.js';
import { radToDeg } from '../units.js';
import type { Note } from '../note.js';
import type { AxleForceLaw } from './transient-model.js';
import { DEFAULT_DRIVER, type DriverSettings } from './transient-driver.js';
import { deviationRoom, referenceLookup, type DeviationLimitSource } from './transient-reference.js';
import { followLap, followedLapTimeS, lapStationsM, resampleOnGrid } from './transient-follow.js';
import { deviationFigures, transientVerdict, type DeviationFigures } from './transient-verdict.js';
import { saturationZones, type SaturationZone } from './transient-saturation.js';

export type { DeviationLimitSource } from './transient-reference.js';
export type { SaturationZone } from './transient-saturation.js';

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

/** The deviation figures (largest deviation, and largest share of the room to the edge) are those of transient-verdict. */
export interface TransientCheck extends DeviationFigures {
  /** The followed car reached the end of the lap without spinning or leaving the line by more than 25 m. */
  completed: boolean;
  drivable: boolean;
  /** The verdict with its distances and speeds as quantities (src/report/note-text.ts writes it in any units). */
  verdict: Note;
  referenceLapTimeS: number;
  /** Lap time of the followed lap (NaN when it did not complete). */
  followedLapTimeS: number;
  /** Where the limit comes from: the room to the track's edge, or a fixed distance. */
  deviationLimitSource: DeviationLimitSource;
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

/** Follows the reference lap with the single-track model and a driver model; see the module comment. */
export function checkTransient(result: LapResult, car: Car, options: TransientOptions = {}): TransientCheck {
  const p = bicycleParams(car);
  const room = deviationRoom(result, car, options.deviationLimitM, options.pathOffsetM);
  const reference = referenceLookup(result, room.leftM, room.rightM);
  const gradient = understeerGradientRadPerMps2(p);
  const lap = followLap(result, car, {
    ambient: options.ambient ?? ambientFrom(),
    law: options.law ?? 'brush',
    settings: { ...DEFAULT_DRIVER, ...options.driver },
    params: p,
    understeerGradientRadPerMps2: gradient,
    reference,
  });

  const count = lap.timesS.length;
  const lastStation = lap.stationsM[count - 1]!;
  const completed = !lap.lost && lastStation >= lap.endM;
  const stationsOnLapM = lapStationsM(lap);
  const deviation = deviationFigures(stationsOnLapM, lap.lateralErrorsM, lap.speedsMps, reference);
  let maxSteerRad = 0;
  for (const steerRad of lap.steersRad) maxSteerRad = Math.max(maxSteerRad, Math.abs(steerRad));
  const saturation = saturationZones(stationsOnLapM, lap.frontUses, lap.rearUses, options.saturationUse ?? 0.95);

  const n = result.trace.count;
  const lateralErrorM = new Float64Array(n);
  const followedSpeedMps = new Float64Array(n);
  const steerDeg = new Float64Array(n);
  const frontUse = new Float64Array(n);
  const rearUse = new Float64Array(n);
  resampleOnGrid(
    result.trace.distanceM,
    lap.startIndex,
    result.lengthM,
    lap.stationsM,
    [lap.lateralErrorsM, lap.speedsMps, lap.steersRad, lap.frontUses, lap.rearUses],
    [lateralErrorM, followedSpeedMps, steerDeg, frontUse, rearUse],
  );
  for (let i = 0; i < n; i++) steerDeg[i] = radToDeg(steerDeg[i]!);

  const drivable = completed && deviation.maxDeviationShare <= 1;
  const verdict = transientVerdict(
    {
      completed,
      drivable,
      lost: lap.lost,
      lastLapStationM: lastStation % lap.wrapM,
      steps: lap.steps,
      limitSource: room.source,
      criticalSpeedMps: criticalSpeedMps(p.wheelbaseM, gradient),
      referenceMaxSpeedMps: result.maxSpeedMps,
    },
    deviation,
  );

  return {
    completed,
    drivable,
    verdict,
    referenceLapTimeS: result.lapTimeS,
    followedLapTimeS: followedLapTimeS(lap, completed),
    maxDeviationM: deviation.maxDeviationM,
    maxDeviationAtM: deviation.maxDeviationAtM,
    deviationLimitSource: room.source,
    maxDeviationShare: deviation.maxDeviationShare,
    maxDeviationShareAtM: deviation.maxDeviationShareAtM,
    deviationAtShareM: deviation.deviationAtShareM,
    roomAtShareM: deviation.roomAtShareM,
    speedAtShareMps: deviation.speedAtShareMps,
    referenceSpeedAtShareMps: deviation.referenceSpeedAtShareMps,
    maxSteerDeg: radToDeg(maxSteerRad),
    saturation,
    lateralErrorM,
    followedSpeedMps,
    steerDeg,
    frontUse,
    rearUse,
    steps: lap.steps,
    evaluations: lap.evaluations,
  };
}
