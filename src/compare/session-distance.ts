// A session's motion without the track: its distance channel (or speed integrated over time where it has none)
// and the speed at one sample, for logs placed by distance and for extrapolating a lap's ragged ends.

import { InputError } from '../errors.js';
import type { TelemetrySession } from '../telemetry/types.js';
import type { PlacedSession } from './place-session.js';

/** Speed at sample i: the speed channel, or the step to a neighbouring sample over the time between them, m/s (NaN if unknown). */
export function sampleSpeed(session: TelemetrySession, placed: PlacedSession | null, i: number): number {
  if (session.speedMps) return session.speedMps[i]!;
  const j = i > 0 ? i - 1 : i + 1;
  const dt = Math.abs(session.timeS[i]! - session.timeS[j]!);
  if (!(dt > 0)) return NaN;
  if (placed) return Math.hypot(placed.xM[i]! - placed.xM[j]!, placed.yM[i]! - placed.yM[j]!) / dt;
  if (session.distanceM) return Math.abs(session.distanceM[i]! - session.distanceM[j]!) / dt;
  return NaN;
}

const distanceCache = new WeakMap<TelemetrySession, Float64Array>();

/** The distance channel, or speed integrated over time (trapezoid rule) where the log has none. */
export function sessionDistance(session: TelemetrySession): Float64Array {
  if (session.distanceM) return session.distanceM;
  const cached = distanceCache.get(session);
  if (cached) return cached;
  if (!session.speedMps)
    throw new InputError(`${session.source}: no positions, distance or speed to place the samples along the track`);
  const t = session.timeS;
  const v = session.speedMps;
  const d = new Float64Array(session.count);
  for (let i = 1; i < d.length; i++) d[i] = d[i - 1]! + 0.5 * (v[i]! + v[i - 1]!) * (t[i]! - t[i - 1]!);
  distanceCache.set(session, d);
  return d;
}
