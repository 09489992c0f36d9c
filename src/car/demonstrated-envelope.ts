// An Envelope from a driver's demonstrated limits (a record fitted by src/compare/envelope-fit.ts): the four
// directional limits interpolated linearly between speed bands and joined by the friction ellipse, with the
// longitudinal limits taken as net of the coasting deceleration the way the point-mass model treats drag.

import type { Envelope } from './envelope.js';
import { combinedShare, remainingShare } from './point-mass.js';
import { lerp } from '../numeric/interpolate.js';
import type { Note } from '../note.js';

export interface EnvelopeBand {
  /** Centre of the speed band, m/s. */
  speedMps: number;
  /** Samples in the band (all directions). */
  samples: number;
  /** Demonstrated net acceleration in each direction, m/s^2, positive. */
  brakeMps2: number;
  accelMps2: number;
  leftMps2: number;
  rightMps2: number;
}

/** The fitted record, as written to and read from envelope JSON. */
export interface DemonstratedEnvelopeRecord {
  format: 'reflap-demonstrated-envelope';
  version: 1;
  source: string;
  quantile: number;
  bandWidthMps: number;
  /** Highest speed reached in the data (its 99.9th percentile), m/s: the envelope does not drive faster. */
  topSpeedMps: number;
  /** Coasting deceleration c0 + c2 v^2, m/s^2; `fitted` says whether it came from coasting samples. */
  coast: { constantMps2: number; quadraticPerM: number; fitted: boolean };
  bands: EnvelopeBand[];
  /** Where the fit fell back to the car model (thin data), one each (text in a file, a note with speeds when fitted). */
  notes?: Note[];
}

const ELLIPSE = 2;

export function demonstratedEnvelope(record: DemonstratedEnvelopeRecord): Envelope {
  const bands = [...record.bands].sort((a, b) => a.speedMps - b.speedMps);
  if (bands.length === 0) throw new Error('a demonstrated envelope needs at least one speed band');
  const speeds = Float64Array.from(bands, (b) => b.speedMps);
  const table = (pick: (b: (typeof bands)[number]) => number) => Float64Array.from(bands, pick);
  const brake = table((b) => b.brakeMps2);
  const accel = table((b) => b.accelMps2);
  const left = table((b) => b.leftMps2);
  const right = table((b) => b.rightMps2);
  const top = record.topSpeedMps;
  const taperMps = Math.max(0.5, record.bandWidthMps);

  const lookup = (values: Float64Array, speedMps: number) => {
    if (speedMps <= speeds[0]!) return values[0]!;
    const last = speeds.length - 1;
    if (speedMps >= speeds[last]!) return values[last]!;
    let lo = 0;
    let hi = last;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (speeds[mid]! <= speedMps) lo = mid;
      else hi = mid;
    }
    const w = (speedMps - speeds[lo]!) / (speeds[hi]! - speeds[lo]!);
    return lerp(values[lo]!, values[hi]!, w);
  };
  const coastDecelMps2 = (speedMps: number) =>
    record.coast.constantMps2 + record.coast.quadraticPerM * speedMps * speedMps;
  const lateralLimitMps2 = (speedMps: number, side: number) =>
    Math.max(0.1, lookup(side >= 0 ? left : right, speedMps));
  // Tyre share of forward drive: the demonstrated net value plus the drag it overcame, fading to nothing at the
  // top speed reached, so the envelope never drives faster than the driver has.
  const driveMps2 = (speedMps: number) => {
    const fade = Math.min(1, Math.max(0, (top - speedMps) / taperMps));
    return Math.max(0, (lookup(accel, speedMps) + coastDecelMps2(speedMps)) * fade);
  };
  const tyreBrakeMps2 = (speedMps: number) => Math.max(0.1, lookup(brake, speedMps) - coastDecelMps2(speedMps));

  return {
    kind: 'demonstrated',
    topSpeedMps: top,
    // The driver's grip was shown on the road as it was; off level ground it scales with the road's load.
    lateralLimitMps2: (speedMps, side, load = 1) => lateralLimitMps2(speedMps, side) * load,
    accelLimitMps2(speedMps, lateralMps2, load = 1) {
      const lateralCap = lateralLimitMps2(speedMps, lateralMps2) * load;
      const leftShare = remainingShare(Math.abs(lateralMps2) / lateralCap, ELLIPSE);
      return driveMps2(speedMps) * leftShare - coastDecelMps2(speedMps);
    },
    brakeLimitMps2(speedMps, lateralMps2, load = 1) {
      const lateralCap = lateralLimitMps2(speedMps, lateralMps2) * load;
      const leftShare = remainingShare(Math.abs(lateralMps2) / lateralCap, ELLIPSE);
      return tyreBrakeMps2(speedMps) * load * leftShare + coastDecelMps2(speedMps);
    },
    coastDecelMps2,
    gripUse(speedMps, axMps2, ayMps2) {
      // A log cannot tell the tyres' drive limit from the engine's: the tyres are taken to give forward at least
      // what they give sideways (a friction circle), or the drive shown where that was more.
      const tyreAx = axMps2 + coastDecelMps2(speedMps);
      const lateral = lateralLimitMps2(speedMps, ayMps2);
      const longCap = tyreAx >= 0 ? Math.max(0.1, driveMps2(speedMps), lateral) : tyreBrakeMps2(speedMps);
      return combinedShare(tyreAx / longCap, ayMps2 / lateral, ELLIPSE);
    },
    driveLimitMps2: driveMps2,
    gearAt: () => 0,
  };
}
