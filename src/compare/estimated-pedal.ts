// Pedal shares for logs without pedal channels: the logged longitudinal acceleration (less coasting drag) as a share
// of what the envelope allows at that speed and lateral load.

import type { Envelope } from '../car/envelope.js';
import type { DriverLap } from './types.js';
import { movingAverage } from './derive.js';

/** Throttle or brake share estimated from the logged acceleration, for logs without pedal channels. */
export function estimatedPedal(driver: DriverLap, envelope: Envelope, pedal: 'throttle' | 'brake'): Float64Array {
  const n = driver.speedMps.length;
  const ax = movingAverage(driver.axMps2, 2, true);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const speed = driver.speedMps[i]!;
    const ay = driver.ayMps2[i]!;
    const coast = envelope.coastDecelMps2(speed);
    const tyreAx = ax[i]! + coast;
    if (pedal === 'brake' && tyreAx < 0) {
      const available = envelope.brakeLimitMps2(speed, ay) - coast;
      out[i] = available > 1e-9 ? Math.min(1, -tyreAx / available) : 1;
    } else if (pedal === 'throttle' && tyreAx > 0) {
      const available = envelope.accelLimitMps2(speed, ay) + coast;
      out[i] = available > 1e-9 ? Math.min(1, tyreAx / available) : 1;
    }
  }
  return out;
}
