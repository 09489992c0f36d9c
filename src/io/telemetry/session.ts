// Sessions in memory: a CSV log assembled from the chunks of the shared row pipeline (pipeline.ts) into one
// array per channel, trimmed and scaled in place; and sessions of GPS fixes
// (NMEA, GPX), with the gap filling they share.

import type { TelemetrySession } from '../../telemetry/types.js';
import { channelArrays, CHANNELS, CHUNK_ROWS, type TelemetryChannel, type TelemetryChunk } from './chunk.js';
import { localPlane, projectLatLon } from '../../track/geodesy.js';
import type { PipelineResult } from './pipeline.js';
import { composeNotes } from './read-notes.js';
import { brakePressureNote, brakeShareFromPressure } from './brake-pressure.js';
import { applyFactor, projectInPlace, UnitEvidence, type ChannelLayout, type DecidedUnits } from './units-from-data.js';
import { lerp } from '../../numeric/interpolate.js';
import { distanceRangeOf, note } from '../../note.js';

/**
 * Appends every chunk to one array per channel, sized up front from an estimate of the rows (grown by a quarter
 * when the estimate falls short), so that a session costs little more than its channels: at the end each array
 * is trimmed with a view, or copied once to its exact size when the estimate overshot by more than 25 %.
 */
export class SessionAssembler {
  private readonly arrays = new Map<TelemetryChannel, Float64Array>();
  private capacity: number;
  private rows = 0;
  private evidence: UnitEvidence | null = null;

  constructor(
    private readonly source: string,
    expectedRows: number,
  ) {
    this.capacity = Math.max(CHUNK_ROWS, Math.ceil(expectedRows));
  }

  add(chunk: TelemetryChunk, layout: ChannelLayout): void {
    if (layout.pending.length > 0) (this.evidence ??= new UnitEvidence(layout)).add(chunk);
    if (this.rows + chunk.rows > this.capacity) {
      this.capacity = Math.max(this.rows + chunk.rows, Math.ceil(this.capacity * 1.25));
      for (const [field, values] of this.arrays) {
        const grown = new Float64Array(this.capacity);
        grown.set(values.subarray(0, this.rows));
        this.arrays.set(field, grown);
      }
    }
    for (const field of layout.channels) {
      let values = this.arrays.get(field);
      if (!values) this.arrays.set(field, (values = new Float64Array(this.capacity)));
      values.set(chunk[field]!, this.rows);
    }
    this.rows += chunk.rows;
  }

  finish(result: PipelineResult): TelemetrySession {
    const { layout, rows } = result;
    const decided: DecidedUnits | null = this.evidence ? this.evidence.decide() : null;
    const channels: Partial<Record<TelemetryChannel, Float64Array>> = {};
    // A view keeps the estimate's spare rows; a copy would briefly hold both until the collector frees the old
    // arrays, so only an estimate far off (over a quarter) is worth it.
    const exact = this.capacity > rows * 1.25;
    for (const field of CHANNELS) {
      const held = this.arrays.get(field);
      if (!held) continue;
      const values = exact ? held.slice(0, rows) : held.subarray(0, rows);
      this.arrays.delete(field);
      const factor = decided?.factors[field];
      if (factor !== undefined) applyFactor(values, field, factor);
      channels[field] = values;
    }
    const notes = composeNotes(result, decided);
    // A pressure column stands in for the brake pedal where the log has no pedal channel.
    if (channels.brakePressurePa && !channels.brake) {
      const { brake, fullPa } = brakeShareFromPressure(channels.brakePressurePa);
      channels.brake = brake;
      notes.push(brakePressureNote(layout.headers.brakePressurePa ?? 'brake pressure', fullPa));
    }
    if (layout.positions === 'latlon' && decided?.geoOrigin)
      projectInPlace(channels.xM!, channels.yM!, localPlane(decided.geoOrigin));
    return {
      source: this.source,
      count: rows,
      ...channelArrays((field) => channels[field] ?? null),
      geoOrigin: decided?.geoOrigin ?? null,
      notes,
    };
  }
}

/** Fills NaN runs in place by linear interpolation in time (held at the ends); null when all are NaN. */
export function fillGaps(values: Float64Array, timeS: Float64Array): number | null {
  let gaps = 0;
  let previous = -1;
  for (let i = 0; i < values.length; i++) {
    if (!Number.isNaN(values[i]!)) {
      if (i - previous > 1) {
        for (let j = previous + 1; j < i; j++) {
          if (previous < 0) values[j] = values[i]!;
          else {
            const span = timeS[i]! - timeS[previous]!;
            const w = span > 0 ? (timeS[j]! - timeS[previous]!) / span : 0;
            values[j] = lerp(values[previous]!, values[i]!, w);
          }
          gaps++;
        }
      }
      previous = i;
    }
  }
  if (previous < 0) return null;
  for (let j = previous + 1; j < values.length; j++) {
    values[j] = values[previous]!;
    gaps++;
  }
  return gaps;
}

/** A session of GPS fixes only: positions projected about their mean, speed where the log gave one. */
/**
 * The session with the GPS altitude where at least one fix has one (gaps filled by interpolation in time, as the
 * speed's are), and a note that says it was read and what it is good for; the session as it is otherwise.
 */
export function withAltitude(
  session: TelemetrySession,
  altitudeM: Float64Array,
  samples: number,
  origin: string,
): TelemetrySession {
  if (samples === 0) return session;
  fillGaps(altitudeM, session.timeS);
  let low = Infinity;
  let high = -Infinity;
  for (const value of altitudeM) {
    low = Math.min(low, value);
    high = Math.max(high, value);
  }
  const on = samples < altitudeM.length ? ` on ${samples} of ${altitudeM.length} fixes` : '';
  const altitudeNote = note`GPS altitude (${origin}) read${on}, ${distanceRangeOf(low, high, 1)}, but not used: the comparison works in the plane, and GPS heights scatter several metres`;
  return { ...session, altitudeM, notes: [...session.notes, altitudeNote] };
}

export function gpsSession(
  source: string,
  timeS: Float64Array,
  latDeg: Float64Array,
  lonDeg: Float64Array,
  speedMps: Float64Array | null,
  notes: string[],
): TelemetrySession {
  const projected = projectLatLon(latDeg, lonDeg);
  return {
    source,
    count: timeS.length,
    timeS,
    distanceM: null,
    speedMps,
    throttle: null,
    brake: null,
    axMps2: null,
    ayMps2: null,
    steeringDeg: null,
    gear: null,
    rpm: null,
    xM: projected.xM,
    yM: projected.yM,
    geoOrigin: projected.origin,
    notes,
  };
}
