// Every log, whatever its format, is held to the same plausible ranges once read (src/car/plausible.ts): speeds
// from 0 to 200 m/s, finite time and positions. A negative speed or 1e308 knots is a broken file, named with
// the sample and its time, not a number that turns into Infinity further on.

import { InputError } from '../../errors.js';
import { MAX_SPEED_MPS } from '../../car/plausible.js';
import type { TelemetrySession } from '../../telemetry/types.js';

function refuse(session: TelemetrySession, index: number, message: string): never {
  const at = Number.isFinite(session.timeS[index]!) ? ` (t = ${session.timeS[index]!.toFixed(2)} s)` : '';
  throw new InputError(`${session.source}: sample ${index + 1}${at}: ${message}`);
}

/** Returns the session when every sample is within range; otherwise an InputError naming the first that is not. */
export function checkSessionRanges(session: TelemetrySession): TelemetrySession {
  const { timeS, speedMps, xM, yM } = session;
  for (let i = 0; i < session.count; i++) {
    if (!Number.isFinite(timeS[i]!)) refuse(session, i, `time ${timeS[i]} is not a finite number`);
    if (speedMps) {
      const v = speedMps[i]!;
      if (!(v >= 0)) refuse(session, i, `speed ${v} m/s is negative or not a number; speeds run from 0`);
      if (v > MAX_SPEED_MPS)
        refuse(session, i, `speed ${v.toPrecision(4)} m/s is over ${MAX_SPEED_MPS} m/s (${MAX_SPEED_MPS * 3.6} km/h)`);
    }
    if (xM && yM && !(Number.isFinite(xM[i]!) && Number.isFinite(yM[i]!)))
      refuse(session, i, 'the position is not a finite number');
  }
  return session;
}
