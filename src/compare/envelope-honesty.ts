// Checks on every demonstrated envelope fitted from a log. The driver drove inside the grip they showed, so the
// lap on that envelope cannot be slower than the driven lap: where it is, the fit has under-read the log and its
// limits are raised by one common factor, found by the Illinois method, to the least that matches the driven lap.
// It can be faster only by what the driver left on the table: a lap more than 3 % faster than the car model's, or a
// driver's peak grip use over 130 % of the car model, points at the data or the car file, and the numbers carry
// that caveat.

import type { Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import { demonstratedEnvelope, type DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';
import { simulate, type SimulateOptions } from '../solve/simulate.js';
import type { LapResult } from '../solve/types.js';
import type { TrackGrid } from '../track/types.js';
import type { DriverLap } from './types.js';
import { formatLapTime } from '../units.js';

export const FASTER_THAN_MODEL_LIMIT = 0.03;
export const PEAK_GRIP_USE_LIMIT = 1.3;
/** Largest factor the limits are raised by; beyond it the mismatch is not the fit's. */
const MAX_RAISE = 1.5;
const RAISE_STEPS = 12;
/** How close below the driven lap the raised lap lands, s. */
const RAISE_TOLERANCE_S = 0.001;

interface RaisedRun<T> {
  factor: number;
  lap: LapResult;
  scaled: T;
  scaledEnvelope: Envelope;
}

/**
 * The least common factor whose lap is no slower than the driven lap, to within RAISE_TOLERANCE_S below it: the
 * root of lap(factor) - driven by the Illinois variant of regula falsi (Dowell and Jarratt, BIT 11, 1971), which
 * keeps the bracket and converges superlinearly on a smooth, monotone lap time. The raised lap lands on the
 * driven lap however far the fit was off, so the result moves continuously with the log.
 */
function leastRaise<T>(
  run: (factor: number) => RaisedRun<T>,
  low: { factor: number; gapS: number },
  top: RaisedRun<T>,
  drivenS: number,
): RaisedRun<T> {
  let lo = low.factor;
  let gapLo = low.gapS;
  let hi = top;
  let gapHi = top.lap.lapTimeS - drivenS;
  let side = 0;
  for (let k = 0; k < RAISE_STEPS && gapHi < -RAISE_TOLERANCE_S; k++) {
    const factor = hi.factor - (gapHi * (hi.factor - lo)) / (gapHi - gapLo);
    const tried = run(Math.min(hi.factor, Math.max(lo, factor)));
    const gap = tried.lap.lapTimeS - drivenS;
    if (gap > 0) {
      lo = tried.factor;
      gapLo = gap;
      if (side === -1) gapHi /= 2;
      side = -1;
    } else {
      hi = tried;
      gapHi = gap;
      if (side === 1) gapLo /= 2;
      side = 1;
    }
  }
  return hi;
}

export interface HonestyInput {
  track: TrackGrid;
  car: Car;
  drive: SimulateOptions;
  record: DemonstratedEnvelopeRecord;
  demonstratedLap: LapResult;
  driverLap: DriverLap;
  carEnvelope: Envelope;
  carModelLap: LapResult;
  /** Whether the log's accelerations were derived from GPS positions (the likeliest cause of an optimistic fit). */
  derivedAccelerations: boolean;
}

export interface HonestyResult {
  record: DemonstratedEnvelopeRecord;
  envelope: Envelope;
  demonstratedLap: LapResult;
  /** Short reason the demonstrated figures are doubtful, or null. */
  caveat: string | null;
  notes: string[];
}

/** The record with every directional limit multiplied by factor. */
export function scaledRecord(record: DemonstratedEnvelopeRecord, factor: number): DemonstratedEnvelopeRecord {
  return {
    ...record,
    bands: record.bands.map((band) => ({
      ...band,
      brakeMps2: band.brakeMps2 * factor,
      accelMps2: band.accelMps2 * factor,
      leftMps2: band.leftMps2 * factor,
      rightMps2: band.rightMps2 * factor,
    })),
  };
}

/** Highest grip use of the driver's lap over an envelope. */
export function peakGripUse(lap: DriverLap, envelope: Envelope): number {
  let peak = 0;
  for (let i = 0; i < lap.speedMps.length; i++) {
    const use = envelope.gripUse(lap.speedMps[i]!, lap.axMps2[i]!, lap.ayMps2[i]!);
    if (use > peak) peak = use;
  }
  return peak;
}

export function honestyChecks(input: HonestyInput): HonestyResult {
  const { track, car, drive, driverLap, carModelLap } = input;
  let record = input.record;
  let envelope = demonstratedEnvelope(record);
  let lap = input.demonstratedLap;
  const notes: string[] = [];
  const drivenS = driverLap.lapTimeS;

  if (lap.lapTimeS > drivenS) {
    const run = (factor: number) => {
      const scaled = scaledRecord(input.record, factor);
      const scaledEnvelope = demonstratedEnvelope(scaled);
      return { factor, scaled, scaledEnvelope, lap: simulate(track, car, { ...drive, envelope: scaledEnvelope }) };
    };
    const fitS = lap.lapTimeS;
    // First try the factor a grip-limited lap asks for (time as 1 / sqrt(grip): uniform circular motion); it
    // usually brackets the root with the fit itself, and the search rarely needs the largest raise.
    const guess = run(Math.min(MAX_RAISE, (fitS / drivenS) ** 2));
    const guessFits = guess.lap.lapTimeS <= drivenS;
    const top = guessFits ? guess : run(MAX_RAISE);
    const low = guessFits
      ? { factor: 1, gapS: fitS - drivenS }
      : { factor: guess.factor, gapS: guess.lap.lapTimeS - drivenS };
    if (top.lap.lapTimeS > drivenS) {
      notes.push(
        `the lap on the grip already shown (${formatLapTime(fitS)}) is slower than the driven lap (${formatLapTime(drivenS)}) even with its limits raised by ${((MAX_RAISE - 1) * 100).toFixed(0)} %: the driver's path or the track file does not match the reference's`,
      );
    } else {
      const best = leastRaise(run, low, top, drivenS);
      record = best.scaled;
      envelope = best.scaledEnvelope;
      lap = best.lap;
      notes.push(
        `the envelope fitted from the log drove ${formatLapTime(fitS)}, slower than the driven ${formatLapTime(drivenS)}, so the fit under-read the log (peaks smoothed away or too few samples): its limits were raised by ${((best.factor - 1) * 100).toFixed(1)} %, the least that matches the driven lap`,
      );
    }
  }

  // A list, not a sentence split at commas: the causes carry commas inside their brackets.
  const causes = input.derivedAccelerations
    ? ['noisy accelerations derived from GPS positions', 'a wrong car file (grip, power or mass too low)']
    : [
        'a wrong unit in the log (accelerations in m/s^2 read as g, or the reverse)',
        'noisy accelerometer channels',
        'a wrong car file (grip, power or mass too low)',
      ];
  const problems: string[] = [];
  const fasterShare = 1 - lap.lapTimeS / carModelLap.lapTimeS;
  if (fasterShare > FASTER_THAN_MODEL_LIMIT)
    problems.push(
      `the lap on the grip already shown (${formatLapTime(lap.lapTimeS)}) is ${(fasterShare * 100).toFixed(1)} % faster than the car model's reference (${formatLapTime(carModelLap.lapTimeS)})`,
    );
  const peak = peakGripUse(driverLap, input.carEnvelope);
  if (peak > PEAK_GRIP_USE_LIMIT)
    problems.push(`the driver's grip use peaks at ${(peak * 100).toFixed(0)} % of the car model's limit`);
  let caveat: string | null = null;
  if (problems.length > 0) {
    caveat = `likely ${causes[0]}`;
    notes.push(
      `doubtful: ${problems.join(', and ')}; likely causes: ${causes.join(', ')}. The figures are shown with this caveat`,
    );
  }
  return { record, envelope, demonstratedLap: lap, caveat, notes };
}
