// A logged session made from a simulated reference lap: the lap driven again and again at a fixed logging rate,
// each sample holding the state of the nearest grid step as the solver put it on the car's envelope, with the noise
// of a club data logger added (seeded).
// Nothing here calls the calibration code.
//
// Noise levels (from memory, typical of a consumer GPS receiver with a MEMS accelerometer, no source): speed
// 0.1 m/s white; accelerations 0.2 m/s^2 white plus a slow drift of 0.05 m/s^2 (2 s time constant); GPS position
// 0.4 m white plus a wandering bias of about 0.7 m; throttle 1 % white.

import type { TelemetrySession } from '../../src/telemetry/types.js';
import type { LapResult } from '../../src/solve/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

export interface SyntheticLogOptions {
  seed: number;
  rateHz: number;
  laps: number;
  /** Multiplies every noise level (0 = a clean log). */
  noise: number;
  /** Log the accelerometer channels (else the log has speed and positions only, as a GPS logger). */
  accelerometer: boolean;
  throttle: boolean;
}

export const DEFAULT_SYNTHETIC: SyntheticLogOptions = {
  seed: 1,
  rateHz: 20,
  laps: 2,
  noise: 1,
  accelerometer: true,
  throttle: true,
};

/** Samples the reference lap (piecewise constant acceleration between grid stations, as the solver steps it). */
export function syntheticSession(
  track: TrackGrid,
  lap: LapResult,
  overrides: Partial<SyntheticLogOptions> = {},
): TelemetrySession {
  const options = { ...DEFAULT_SYNTHETIC, ...overrides };
  const { gaussian } = seededRandom(options.seed);
  const trace = lap.trace;
  const n = trace.count;
  const lapTimeS = lap.lapTimeS;
  const total = Math.floor(options.laps * lapTimeS * options.rateHz);
  const timeS = new Float64Array(total);
  const speedMps = new Float64Array(total);
  const axMps2 = new Float64Array(total);
  const ayMps2 = new Float64Array(total);
  const throttle = new Float64Array(total);
  const brake = new Float64Array(total);
  const gear = new Float64Array(total);
  const xM = new Float64Array(total);
  const yM = new Float64Array(total);
  const noise = options.noise;
  const driftDecay = Math.exp(-1 / (2 * options.rateHz));
  const driftStep = 0.05 * Math.sqrt(1 - driftDecay * driftDecay);
  const wanderDecay = 0.98;
  const wanderStep = 0.7 * Math.sqrt(1 - wanderDecay * wanderDecay);
  let driftX = 0;
  let driftY = 0;
  let wanderX = 0;
  let wanderY = 0;
  let j = 0;
  for (let k = 0; k < total; k++) {
    const t = k / options.rateHz;
    const laps = Math.floor(t / lapTimeS);
    const inLap = t - laps * lapTimeS;
    if (k === 0 || inLap < trace.timeS[j]!) j = 0;
    while (j + 1 < n && trace.timeS[j + 1]! <= inLap) j++;
    const next = j + 1 < n ? j + 1 : 0;
    // The place within the step, for the positions; the motion channels are those of the nearest station, where
    // the solver puts the car exactly on its envelope (between stations it would be a little inside or outside,
    // an artefact of the grid, not of the car).
    const v0 = trace.speedMps[j]!;
    const dt = inLap - trace.timeS[j]!;
    const s = v0 * dt + 0.5 * trace.axMps2[j]! * dt * dt;
    const share = Math.min(1, Math.max(0, s / track.stepM));
    const mix = (values: ArrayLike<number>) => values[j]! + share * (values[next]! - values[j]!);
    const at = share < 0.5 ? j : next;
    // The solver evaluates the envelope at a step's start when it speeds up and at its end when it brakes: that is
    // the speed whose limit the step's acceleration is.
    const braking = trace.brake[at]! > 0 && trace.axMps2[at]! < 0;
    const v = trace.speedMps[braking ? (at + 1) % n : at]!;
    const a = trace.axMps2[at]!;
    const ay = v * v * trace.curvaturePerM[at]!;
    driftX = driftDecay * driftX + driftStep * gaussian();
    driftY = driftDecay * driftY + driftStep * gaussian();
    wanderX = wanderDecay * wanderX + wanderStep * gaussian();
    wanderY = wanderDecay * wanderY + wanderStep * gaussian();
    timeS[k] = t;
    speedMps[k] = v + noise * 0.1 * gaussian();
    axMps2[k] = a + noise * (0.2 * gaussian() + driftX);
    ayMps2[k] = ay + noise * (0.2 * gaussian() + driftY);
    throttle[k] = Math.min(1, Math.max(0, trace.throttle[at]! + noise * 0.01 * gaussian()));
    brake[k] = trace.brake[at]! > 0.01 ? Math.min(1, Math.max(0, trace.brake[at]! + noise * 0.01 * gaussian())) : 0;
    gear[k] = trace.gear[at]!;
    xM[k] = mix(track.xM) + noise * (wanderX + 0.4 * gaussian());
    yM[k] = mix(track.yM) + noise * (wanderY + 0.4 * gaussian());
  }
  return {
    source: `synthetic log (seed ${options.seed})`,
    count: total,
    timeS,
    distanceM: null,
    speedMps,
    throttle: options.throttle ? throttle : null,
    brake: options.throttle ? brake : null,
    axMps2: options.accelerometer ? axMps2 : null,
    ayMps2: options.accelerometer ? ayMps2 : null,
    steeringDeg: null,
    gear: lap.trace.hasGears ? gear : null,
    rpm: null,
    xM,
    yM,
    geoOrigin: null,
    notes: [],
  };
}
