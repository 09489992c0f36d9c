// The whole comparison from a logged session: pick and align the lap, run the reference lap on the car model's
// envelope and on the driver's demonstrated one (fitted from the session unless given), and compare the lap
// against the chosen reference. No I/O: the CLI, the demo and scripts call this with records already read.

import { validateCar } from '../car/validate.js';
import { validateTrackGrid } from '../track/validate-grid.js';
import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { LapResult } from '../solve/types.js';
import type { Path, TrackGrid } from '../track/types.js';
import type { ComparisonResult, DriverLap } from './types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { demonstratedEnvelope, type DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';
import { simulate } from '../solve/simulate.js';
import { alignLap, selectLap } from './align.js';
import { compareLaps } from './compare-laps.js';
import type { CompareOptions } from './compare-options.js';
import { fitEnvelope, EnvelopeFitError, type EnvelopeSamples } from './envelope-fit.js';
import { deriveSessionAccelerations, derivationNote } from './derive-session.js';
import type { LapCut } from './laps.js';
import { honestyChecks } from './envelope-honesty.js';
import type { Note } from '../note.js';

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
  notes: Note[];
  /** The session the lap was cut from, with any accelerations derived from its positions (for its other laps). */
  session?: TelemetrySession;
  /** Every lap the session was cut into. */
  laps?: LapCut[];
}

/**
 * Samples for the envelope fit from every complete lap of the session: the session's own samples inside those laps
 * where it has both accelerations (logged or derived from GPS), else each lap aligned onto the track's grid.
 */
export function envelopeSamplesOf(session: TelemetrySession, laps: LapCut[], track: TrackGrid): EnvelopeSamples {
  const complete = laps.filter((lap) => lap.complete && lap.startTimeS !== undefined && lap.endTimeS !== undefined);
  if (session.speedMps && session.axMps2 && session.ayMps2) {
    const inLap = new Uint8Array(session.count);
    for (const lap of complete) {
      for (let i = lap.startIndex; i <= lap.endIndex; i++) {
        const t = session.timeS[i]!;
        if (t >= lap.startTimeS! && t <= lap.endTimeS!) inLap[i] = 1;
      }
    }
    const pick = (values: Float64Array | null) => (values ? values.filter((_, i) => inLap[i] === 1) : null);
    return {
      speedMps: pick(session.speedMps)!,
      axMps2: pick(session.axMps2)!,
      ayMps2: pick(session.ayMps2)!,
      throttle: pick(session.throttle),
      brake: pick(session.brake),
    };
  }
  const aligned = complete.map((lap) => alignLap(session, lap, track));
  const join = (pick: (lap: DriverLap) => Float64Array | null) => {
    const parts = aligned.map(pick);
    if (parts.some((part) => part === null)) return null;
    const out = new Float64Array(parts.reduce((sum, part) => sum + part!.length, 0));
    let at = 0;
    for (const part of parts) {
      out.set(part!, at);
      at += part!.length;
    }
    return out;
  };
  return {
    speedMps: join((lap) => lap.speedMps)!,
    axMps2: join((lap) => lap.axMps2)!,
    ayMps2: join((lap) => lap.ayMps2)!,
    throttle: join((lap) => lap.throttle),
    brake: join((lap) => lap.brake),
  };
}

export function compareSession(
  track: TrackGrid,
  car: Car,
  loggedSession: TelemetrySession,
  options: CompareSessionOptions,
): SessionComparison {
  validateTrackGrid(track, 'compareSession: track');
  validateCar(car, 'compareSession: car');
  // One derivation of a GPS-only log's accelerations, for the lap, the envelope fit and the report alike.
  const derivation = deriveSessionAccelerations(loggedSession);
  const session = derivation.session;
  const selected = selectLap(session, track, {
    ...(options.lap !== undefined ? { lap: options.lap } : {}),
    ...(options.startFinish ? { startFinish: options.startFinish } : {}),
  });
  const notes: Note[] = [...selected.notes];
  const lap = selected.lap;
  const quality = derivation.quality;
  if (quality) {
    for (const channel of derivation.derived)
      if (!lap.derivedChannels.includes(channel)) lap.derivedChannels.push(channel);
    notes.push(derivationNote(quality, derivation.derived));
  }
  const untrusted = quality !== null && quality.problems.length > 0;
  const drive = {
    ambient: options.ambient,
    ...(options.path ? { path: options.path } : {}),
    startSpeedMps: options.startSpeedMps ?? 0,
  };
  const carEnvelope = buildEnvelope(car, options.ambient);
  const carModelLap = simulate(track, car, { ...drive, envelope: carEnvelope });
  let record = options.envelopeRecord ?? null;
  if (!record && untrusted) {
    notes.push(
      `no demonstrated envelope: the derived accelerations cannot be trusted (${quality.problems.join('; ')})`,
    );
  } else if (!record) {
    try {
      record = fitEnvelope(envelopeSamplesOf(session, selected.laps, track), session.source, undefined, carEnvelope);
      notes.push(...(record.notes ?? []));
    } catch (error) {
      if (!(error instanceof EnvelopeFitError)) throw error;
      notes.push(`no demonstrated envelope: ${error.message}`);
    }
  }
  let demoEnvelope = record ? demonstratedEnvelope(record) : null;
  let demonstratedLap = demoEnvelope ? simulate(track, car, { ...drive, envelope: demoEnvelope }) : null;
  let caveat: string | null = null;
  if (record && demonstratedLap && !options.envelopeRecord) {
    const checked = honestyChecks({
      track,
      car,
      drive,
      record,
      demonstratedLap,
      driverLap: lap,
      carEnvelope,
      carModelLap,
      derivedAccelerations: quality !== null,
    });
    record = checked.record;
    demoEnvelope = checked.envelope;
    demonstratedLap = checked.demonstratedLap;
    caveat = checked.caveat;
    notes.push(...checked.notes);
  }
  const useDemonstrated = Boolean(options.envelopeRecord && demoEnvelope && demonstratedLap);
  const reference = useDemonstrated ? demonstratedLap! : carModelLap;
  const envelope = useDemonstrated ? demoEnvelope! : carEnvelope;
  const result = compareLaps(track, car, reference, lap, envelope, {
    ...options.compare,
    demonstratedLapTimeS: demonstratedLap?.lapTimeS ?? null,
    carModelLapTimeS: carModelLap.lapTimeS,
    referenceEnvelopeKind: useDemonstrated ? 'demonstrated' : `car model (${carEnvelope.kind})`,
  });
  if (caveat) result.demonstratedCaveat = caveat;
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
    session,
    laps: selected.laps,
  };
}
