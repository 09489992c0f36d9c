// The samples an envelope fit reads from a session: speed and both accelerations (logged or derived), with the
// pedals where the log has them.

import { InputError } from '../errors.js';
import type { TelemetrySession } from '../telemetry/types.js';

/** Samples of the session for the fit; the log must carry speed and both accelerations (logged or derived). */
export function sessionSamples(session: TelemetrySession) {
  const missing = [
    !session.speedMps && 'speed',
    !session.axMps2 && 'longitudinal acceleration',
    !session.ayMps2 && 'lateral acceleration',
  ].filter(Boolean);
  if (missing.length > 0) {
    throw new InputError(
      `${session.source}: fitting an envelope needs ${missing.join(', ')} channels, or positions to derive them from; the log has neither (map them with --telemetry-columns)`,
    );
  }
  return {
    speedMps: session.speedMps!,
    axMps2: session.axMps2!,
    ayMps2: session.ayMps2!,
    throttle: session.throttle,
    brake: session.brake,
  };
}
