// One lap in the form the lap-against-lap comparison reads: time, speed, longitudinal acceleration and a brake
// share on the track's distance grid, with the places its brakes come on. A driver's lap without a brake channel
// gets one estimated from its deceleration (../estimated-pedal.ts), as the reference comparison does.

import type { Envelope } from '../../car/envelope.js';
import type { LapResult } from '../../solve/types.js';
import type { TrackGrid } from '../../track/types.js';
import { findBrakingZones } from '../../solve/braking-zones.js';
import { estimatedPedal } from '../estimated-pedal.js';
import type { DriverLap } from '../types.js';

export interface PairLap {
  /** How the lap is named in findings ("lap 4", "the reference"). */
  label: string;
  lapTimeS: number;
  /** Elapsed time since station 0 at each station, s. */
  timeS: Float64Array;
  speedMps: Float64Array;
  axMps2: Float64Array;
  /** Brake share 0-1, measured or estimated. */
  brake: Float64Array;
  brakeEstimated: boolean;
  /** Null where the log has no pedal channels (no coasting time then). */
  throttle: Float64Array | null;
  /** Stations where the brakes come on. */
  brakingStarts: readonly { startIndex: number }[];
}

export function pairLapOfDriver(lap: DriverLap, envelope: Envelope, track: TrackGrid, label: string): PairLap {
  const brake = lap.brake ?? estimatedPedal(lap, envelope, 'brake');
  const zones = findBrakingZones({
    closed: track.closed,
    count: track.distanceM.length,
    speedMps: lap.speedMps,
    stationM: track.distanceM,
    brake,
  });
  return {
    label,
    lapTimeS: lap.lapTimeS,
    timeS: lap.timeS,
    speedMps: lap.speedMps,
    axMps2: lap.axMps2,
    brake,
    brakeEstimated: lap.brake === null,
    throttle: lap.brake && lap.throttle ? lap.throttle : null,
    brakingStarts: zones,
  };
}

export function pairLapOfReference(reference: LapResult, label = 'the reference'): PairLap {
  const trace = reference.trace;
  return {
    label,
    lapTimeS: reference.lapTimeS,
    timeS: trace.timeS,
    speedMps: trace.speedMps,
    axMps2: trace.axMps2,
    brake: trace.brake,
    brakeEstimated: false,
    throttle: trace.throttle,
    brakingStarts: reference.brakingZones,
  };
}
