// The whole comparison from a logged session: pick and align the lap, run the reference lap on the car model's
// envelope and on the driver's demonstrated one (fitted from the session unless given), and compare the lap
// against the chosen reference. No I/O: the CLI, the demo and scripts call this with records already read.

import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { LapResult } from '../solve/types.js';
import type { Path, TrackGrid } from '../track/types.js';
import type { ComparisonResult, DriverLap, TelemetrySession } from './types.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { demonstratedEnvelope, type DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';
import { simulate } from '../solve/simulate.js';
import { selectLap } from './align.js';
import { compareLaps } from './compare-laps.js';
import type { CompareOptions } from './compare-options.js';
import { fitEnvelope, EnvelopeFitError, type EnvelopeSamples } from './envelope-fit.js';

export interface CompareSessionOptions {
  ambient: Ambient;
  /** Lap number to compare (default: the fastest complete lap). */
  lap?: number;
  startFinish?: { xM: number; yM: number };
  /** A racing line to run the reference on (default: the centreline). */
  path?: Path;
  /** A demonstrated envelope to use as the reference instead of the car model's. */
  envelopeRecord?: DemonstratedEnvelopeRecord;
  startSpeedMps?: number;
  compare?: Partial<CompareOptions>;
}

export interface SessionComparison {
  result: ComparisonResult;
  lap: DriverLap;
  /** The reference the corners are compared against, and the envelope it ran on. */
  reference: LapResult;
  envelope: Envelope;
  carModelLap: LapResult;
  demonstratedLap: LapResult | null;
  demonstratedRecord: DemonstratedEnvelopeRecord | null;
  notes: string[];
}

/** Samples for the envelope fit: the session's own channels when it logged both accelerations, else the aligned lap. */
export function envelopeSamplesOf(session: TelemetrySession, lap: DriverLap): EnvelopeSamples {
  if (session.speedMps && session.axMps2 && session.ayMps2) {
    return {
      speedMps: session.speedMps,
      axMps2: session.axMps2,
      ayMps2: session.ayMps2,
      throttle: session.throttle,
      brake: session.brake,
    };
  }
  return { speedMps: lap.speedMps, axMps2: lap.axMps2, ayMps2: lap.ayMps2, throttle: lap.throttle, brake: lap.brake };
}

export function compareSession(
  track: TrackGrid,
  car: Car,
  session: TelemetrySession,
  options: CompareSessionOptions,
): SessionComparison {
  const selected = selectLap(session, track, {
    ...(options.lap !== undefined ? { lap: options.lap } : {}),
    ...(options.startFinish ? { startFinish: options.startFinish } : {}),
  });
  const notes = [...selected.notes];
  const lap = selected.lap;
  const drive = {
    ambient: options.ambient,
    ...(options.path ? { path: options.path } : {}),
    startSpeedMps: options.startSpeedMps ?? 0,
  };
  const carEnvelope = buildEnvelope(car, options.ambient);
  const carModelLap = simulate(track, car, { ...drive, envelope: carEnvelope });
  let record = options.envelopeRecord ?? null;
  if (!record) {
    try {
      record = fitEnvelope(envelopeSamplesOf(session, lap), session.source);
    } catch (error) {
      if (!(error instanceof EnvelopeFitError)) throw error;
      notes.push(`no demonstrated envelope: ${error.message}`);
    }
  }
  const demoEnvelope = record ? demonstratedEnvelope(record) : null;
  const demonstratedLap = demoEnvelope ? simulate(track, car, { ...drive, envelope: demoEnvelope }) : null;
  const useDemonstrated = Boolean(options.envelopeRecord && demoEnvelope && demonstratedLap);
  const reference = useDemonstrated ? demonstratedLap! : carModelLap;
  const envelope = useDemonstrated ? demoEnvelope! : carEnvelope;
  const result = compareLaps(track, car, reference, lap, envelope, {
    ...options.compare,
    demonstratedLapTimeS: demonstratedLap?.lapTimeS ?? null,
    carModelLapTimeS: carModelLap.lapTimeS,
    referenceEnvelopeKind: useDemonstrated ? 'demonstrated' : `car model (${carEnvelope.kind})`,
  });
  result.notes.unshift(...notes);
  return {
    result,
    lap,
    reference,
    envelope,
    carModelLap,
    demonstratedLap,
    demonstratedRecord: record,
    notes: result.notes,
  };
}
