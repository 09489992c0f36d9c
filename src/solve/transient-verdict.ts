// The transient check's judgement of a followed lap: its largest deviation from the reference line, absolute and
// as a share of the room to the track's edge on its side, and the one-line verdict on whether the lap is drivable.

import type { DeviationLimitSource, TransientReference } from './transient-reference.js';
import { distanceOf, note, speedsOf, type Note } from '../note.js';

export interface DeviationFigures {
  maxDeviationM: number;
  maxDeviationAtM: number;
  /** The largest deviation as a share of the room to the edge on its side (1 = at the limit), where, and its figures. */
  maxDeviationShare: number;
  maxDeviationShareAtM: number;
  deviationAtShareM: number;
  roomAtShareM: number;
  /** The followed car's speed there, and the reference's, m/s. */
  speedAtShareMps: number;
  referenceSpeedAtShareMps: number;
}

/** Scans the step records (lap stations, lateral errors, speeds) for the largest deviation and largest share of room. */
export function deviationFigures(
  lapStationsM: Float64Array,
  lateralErrorsM: number[],
  speedsMps: number[],
  reference: TransientReference,
): DeviationFigures {
  const f: DeviationFigures = {
    maxDeviationM: 0,
    maxDeviationAtM: 0,
    maxDeviationShare: 0,
    maxDeviationShareAtM: 0,
    deviationAtShareM: 0,
    roomAtShareM: 0,
    speedAtShareMps: 0,
    referenceSpeedAtShareMps: 0,
  };
  for (let k = 0; k < lapStationsM.length; k++) {
    const station = lapStationsM[k]!;
    const error = lateralErrorsM[k]!;
    if (Math.abs(error) > f.maxDeviationM) {
      f.maxDeviationM = Math.abs(error);
      f.maxDeviationAtM = station;
    }
    const roomM = error >= 0 ? reference.roomLeftM(station) : reference.roomRightM(station);
    if (Math.abs(error) / roomM > f.maxDeviationShare) {
      f.maxDeviationShare = Math.abs(error) / roomM;
      f.maxDeviationShareAtM = station;
      f.deviationAtShareM = error;
      f.roomAtShareM = roomM;
      f.speedAtShareMps = speedsMps[k]!;
      f.referenceSpeedAtShareMps = reference.speedMps(station);
    }
  }
  return f;
}

export interface VerdictInput {
  completed: boolean;
  drivable: boolean;
  /** Why the car was lost, or '' when it was not. */
  lost: Note | '';
  /** Where the integration ended, on the lap, and after how many steps. */
  lastLapStationM: number;
  steps: number;
  limitSource: DeviationLimitSource;
  /** The car's critical speed (null unless it oversteers), and the reference's top speed, m/s. */
  criticalSpeedMps: number | null;
  referenceMaxSpeedMps: number;
}

/** The one-line verdict: not drivable (and why), not drivable as computed (the worst deviation), or drivable. */
export function transientVerdict(v: VerdictInput, d: DeviationFigures): Note {
  const side = d.deviationAtShareM >= 0 ? 'left' : 'right';
  const room = distanceOf(d.roomAtShareM, 2);
  const limitText =
    v.limitSource === 'fixed' ? note`the fixed limit ${room}` : note`the ${room} of room to the ${side} edge`;
  const worst = note`${distanceOf(Math.abs(d.deviationAtShareM), 2)} to the ${side} at ${distanceOf(d.maxDeviationShareAtM)}, ${(100 * d.maxDeviationShare).toFixed(0)} % of ${limitText}`;
  const stalledAt = note`the integration stalled at ${distanceOf(v.lastLapStationM)} after ${v.steps} steps (the driver model's inputs chatter there)`;
  let verdict: Note;
  if (!v.completed) verdict = note`not drivable: ${v.lost || stalledAt}`;
  else if (!v.drivable)
    verdict = note`not drivable as computed: the followed car runs ${worst}, at ${speedsOf([d.speedAtShareMps])} against the reference's ${speedsOf([d.referenceSpeedAtShareMps])}`;
  else verdict = note`drivable: the followed car stays on the track, at most ${worst}`;
  const critical = v.criticalSpeedMps;
  if (critical !== null && v.referenceMaxSpeedMps > critical)
    verdict = note`${verdict}; the car is above its critical speed ${speedsOf([critical])}`;
  return verdict;
}
