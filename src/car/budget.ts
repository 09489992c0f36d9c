// The friction-circle arithmetic a coach teaches: at a given speed and lateral demand, how much of the lateral
// limit is in use and how much braking and acceleration is left, on the friction ellipse and on the naive
// linear split (lateral share + longitudinal share = 100 %), side by side.

import type { Envelope } from './envelope.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

export interface GripBudget {
  speedMps: number;
  lateralDemandMps2: number;
  lateralLimitG: number;
  /** Lateral demand over the lateral limit (1 = on the limit, above 1 = beyond it). */
  lateralShare: number;
  /** Net deceleration still available (tyres plus drag), g, on the envelope. */
  brakingAvailableG: number;
  /** Net forward acceleration still available (after drag, power-limited), g, on the envelope; 0 where drag takes
   * all the tyres leave (full throttle would still slow the car, so nothing is available to speed up with). */
  accelAvailableG: number;
  /** The same two by the linear split: (1 - lateral share) times the straight-line capacity. */
  linearBrakingAvailableG: number;
  linearAccelAvailableG: number;
  /** Straight-line capacities at this speed, g. */
  brakingStraightG: number;
  accelStraightG: number;
}

export function gripBudget(envelope: Envelope, speedMps: number, lateralDemandMps2: number): GripBudget {
  const g = STANDARD_GRAVITY_MPS2;
  const lateralLimit = envelope.lateralLimitMps2(speedMps, Math.sign(lateralDemandMps2) || 1);
  const lateralShare = Math.abs(lateralDemandMps2) / lateralLimit;
  const coast = envelope.coastDecelMps2(speedMps);
  const brakingStraight = envelope.brakeLimitMps2(speedMps, 0);
  const accelStraight = envelope.accelLimitMps2(speedMps, 0);
  const beyond = lateralShare > 1;
  const linearShareLeft = Math.max(0, 1 - lateralShare);
  return {
    speedMps,
    lateralDemandMps2,
    lateralLimitG: lateralLimit / g,
    lateralShare,
    brakingAvailableG: beyond ? 0 : envelope.brakeLimitMps2(speedMps, lateralDemandMps2) / g,
    accelAvailableG: beyond ? 0 : Math.max(0, envelope.accelLimitMps2(speedMps, lateralDemandMps2) / g),
    // The linear split shares the tyre's part only; drag and the power limit stay what they are.
    linearBrakingAvailableG: beyond ? 0 : ((brakingStraight - coast) * linearShareLeft + coast) / g,
    linearAccelAvailableG: beyond
      ? 0
      : Math.max(0, Math.min(accelStraight, (accelStraight + coast) * linearShareLeft - coast) / g),
    brakingStraightG: brakingStraight / g,
    accelStraightG: accelStraight / g,
  };
}

/** The shares of the lateral limit a coach steps through to teach the friction circle: 0 to 100 % by 20 %. */
export const LATERAL_LOAD_SHARES: readonly number[] = [0, 0.2, 0.4, 0.6, 0.8, 1];

/** The budget at one speed across lateral loads given as shares of the lateral limit at that speed. */
export function lateralLoadTable(
  envelope: Envelope,
  speedMps: number,
  shares: readonly number[] = LATERAL_LOAD_SHARES,
): GripBudget[] {
  const lateralLimit = envelope.lateralLimitMps2(speedMps, 1);
  return shares.map((share) => gripBudget(envelope, speedMps, share * lateralLimit));
}
