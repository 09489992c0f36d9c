// A GPS-only session synthesised from a known reference lap: the car drives the lap several times, a receiver
// samples its position and speed at a nominal rate with jittered (irregular) intervals, and adds white noise to
// both. The true accelerations at each sample come from the same lap, for checking what is derived.

import type { LapResult } from '../../src/solve/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import { trackFromCurvature } from '../line/hand-tracks.js';
import { sessionOf } from '../fixtures/telemetry/tracks.js';

/**
 * A closed invented circuit whose positions close on themselves (a GPS log needs that): a rounded rectangle of
 * four left corners of different radii, with a right-left kink on the second straight. The straights are sized
 * by the closure conditions sum dx = 0, sum dy = 0 of straights and quarter arcs.
 */
export function closedCircuit(stepM = 1): TrackGrid {
  const [a, r1, b, r2, r3, r4, kinkR] = [500, 60, 300, 120, 40, 90, 80];
  const kink = Math.PI / 6;
  const c = a + r1 - r2 - r3 + r4 + 2 * kinkR * (1 - Math.cos(kink));
  const d = r1 + b + r2 - r3 - r4 + 2 * kinkR * Math.sin(kink);
  const pieces: [number, number][] = [
    [a, 0],
    [(Math.PI / 2) * r1, 1 / r1],
    [b / 2, 0],
    [kink * kinkR, -1 / kinkR],
    [kink * kinkR, 1 / kinkR],
    [b / 2, 0],
    [(Math.PI / 2) * r2, 1 / r2],
    [c, 0],
    [(Math.PI / 2) * r3, 1 / r3],
    [d, 0],
    [(Math.PI / 2) * r4, 1 / r4],
  ];
  const totalM = pieces.reduce((sum, [length]) => sum + length, 0);
  const n = Math.round(totalM / stepM);
  const scale = totalM / (n * stepM);
  const curvature = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = (i + 0.5) * stepM * scale;
    for (const [length, kappa] of pieces) {
      if (s < length) {
        curvature[i] = kappa;
        break;
      }
      s -= length;
    }
  }
  const track = trackFromCurvature('closed test circuit', true, stepM, curvature, 6, 6);
  // The midpoint rule leaves the end a few metres from the start: spread that gap linearly along the lap (a
  // drift that bends no corner), so the lap closes.
  const last = n - 1;
  const heading = track.headingRad[last]!;
  const gapX = track.xM[last]! + stepM * Math.cos(heading) - track.xM[0]!;
  const gapY = track.yM[last]! + stepM * Math.sin(heading) - track.yM[0]!;
  for (let i = 0; i < n; i++) {
    track.xM[i] = track.xM[i]! - (gapX * i) / n;
    track.yM[i] = track.yM[i]! - (gapY * i) / n;
  }
  return track;
}

export interface GpsSynthesis {
  laps: number;
  rateHz: number;
  positionNoiseM: number;
  speedNoiseMps: number;
  /** Share of the nominal interval each interval varies by (uniform), 0 = regular. */
  jitter: number;
  seed: number;
}

/** Deterministic uniform (0, 1) numbers (mulberry32), so a failing check can be replayed. */
export function uniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal by Box-Muller. */
export function gaussian(next: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}

export function gpsSession(
  reference: LapResult,
  synthesis: GpsSynthesis,
): { session: ReturnType<typeof sessionOf>; trueAxMps2: Float64Array; trueAyMps2: Float64Array } {
  const trace = reference.trace;
  const track = reference.track;
  const n = trace.count;
  const lapTimeS = reference.lapTimeS;
  const random = uniform(synthesis.seed);
  const normal = gaussian(random);
  const times: number[] = [];
  const nominal = 1 / synthesis.rateHz;
  for (let at = 0; at < synthesis.laps * lapTimeS; at += nominal * (1 + synthesis.jitter * (2 * random() - 1)))
    times.push(at);
  const count = times.length;
  const timeS = Float64Array.from(times);
  const xM = new Float64Array(count);
  const yM = new Float64Array(count);
  const speedMps = new Float64Array(count);
  const trueAx = new Float64Array(count);
  const trueAy = new Float64Array(count);
  let j = 0;
  for (let i = 0; i < count; i++) {
    const inLap = timeS[i]! % lapTimeS;
    if (inLap < trace.timeS[j]!) j = 0;
    while (j < n - 1 && trace.timeS[j + 1]! <= inLap) j++;
    const j1 = (j + 1) % n;
    const t1 = j + 1 < n ? trace.timeS[j + 1]! : lapTimeS;
    const w = (inLap - trace.timeS[j]!) / (t1 - trace.timeS[j]!);
    const mix = (values: Float64Array) => values[j]! + w * (values[j1]! - values[j]!);
    xM[i] = mix(track.xM) + synthesis.positionNoiseM * normal();
    yM[i] = mix(track.yM) + synthesis.positionNoiseM * normal();
    speedMps[i] = mix(trace.speedMps) + synthesis.speedNoiseMps * normal();
    trueAx[i] = mix(trace.axMps2);
    trueAy[i] = mix(trace.ayMps2);
  }
  const session = sessionOf({ source: `synthetic ${synthesis.rateHz} Hz GPS log`, timeS, speedMps, xM, yM });
  return { session, trueAxMps2: trueAx, trueAyMps2: trueAy };
}
