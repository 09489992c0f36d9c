// From a speed profile to the traces a driver reads: time, longitudinal and lateral acceleration, throttle and
// brake as shares of what the envelope has available, grip use and gear. One pass, no allocation per sample.

import type { Envelope } from '../car/envelope.js';
import type { Path } from '../track/types.js';
import type { LapTrace } from './types.js';

export function lapChannels(
  path: Path,
  envelope: Envelope,
  speedMps: Float64Array,
  cornerLimitMps: Float64Array,
  stationM: Float64Array,
): { trace: LapTrace; lapTimeS: number; lengthM: number } {
  const n = speedMps.length;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  const distanceM = new Float64Array(n);
  const timeS = new Float64Array(n);
  const axMps2 = new Float64Array(n);
  const ayMps2 = new Float64Array(n);
  const throttle = new Float64Array(n);
  const brake = new Float64Array(n);
  const gripUse = new Float64Array(n);
  const gear = new Int8Array(n);
  let hasGears = false;
  let elapsedS = 0;
  let travelledM = 0;
  const segments = path.closed ? n : n - 1;
  for (let i = 0; i < n; i++) {
    distanceM[i] = travelledM;
    timeS[i] = elapsedS;
    const speed = speedMps[i]!;
    const ay = speed * speed * kappa[i]!;
    ayMps2[i] = ay;
    let ax = 0;
    if (i < segments) {
      const j = i + 1 === n ? 0 : i + 1;
      const next = speedMps[j]!;
      const lengthM = ds[i]!;
      ax = (next * next - speed * speed) / (2 * lengthM);
      elapsedS += (2 * lengthM) / Math.max(speed + next, 1e-9);
      travelledM += lengthM;
    } else if (i > 0) {
      // The last sample of an open stage has no step after it: carry the previous step's acceleration,
      // clipped to what the envelope allows at this sample's own lateral demand.
      const coastHere = envelope.coastDecelMps2(speed);
      ax = Math.min(
        Math.max(axMps2[i - 1]!, -envelope.brakeLimitMps2(speed, ay)),
        Math.max(envelope.accelLimitMps2(speed, ay), -coastHere),
      );
    }
    axMps2[i] = ax;
    const coast = envelope.coastDecelMps2(speed);
    const tyreAx = ax + coast;
    if (tyreAx >= 0) {
      const available = envelope.accelLimitMps2(speed, ay) + coast;
      throttle[i] = available > 1e-9 ? Math.min(1, tyreAx / available) : tyreAx > 1e-9 ? 1 : 0;
    } else {
      const available = envelope.brakeLimitMps2(speed, ay) - coast;
      brake[i] = available > 1e-9 ? Math.min(1, -tyreAx / available) : 1;
    }
    gripUse[i] = envelope.gripUse(speed, ax, ay);
    const g = envelope.gearAt(speed);
    gear[i] = g;
    if (g > 0) hasGears = true;
  }
  const trace: LapTrace = {
    closed: path.closed,
    count: n,
    distanceM,
    stationM,
    timeS,
    speedMps,
    axMps2,
    ayMps2,
    curvaturePerM: kappa,
    throttle,
    brake,
    gripUse,
    cornerLimitMps,
    gear,
    hasGears,
  };
  return { trace, lapTimeS: elapsedS, lengthM: travelledM };
}
