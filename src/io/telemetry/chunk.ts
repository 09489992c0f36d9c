// The unit of the streamed telemetry reader: a bounded run of rows of the detected channels, in SI units, in
// typed arrays that the reader reuses, so that reading a log of any length needs the same memory.

import type { TelemetrySession } from '../../telemetry/types.js';
import type { Quantity } from './columns.js';

/** Rows per chunk: 8,192 rows of 14 channels are under 1 MB. */
export const CHUNK_ROWS = 8192;

/** The channels of a session, by their TelemetrySession field names. */
export type TelemetryChannel =
  | 'timeS'
  | 'distanceM'
  | 'speedMps'
  | 'throttle'
  | 'brake'
  | 'brakePressurePa'
  | 'axMps2'
  | 'ayMps2'
  | 'steeringDeg'
  | 'gear'
  | 'rpm'
  | 'xM'
  | 'yM';

export const CHANNELS: readonly TelemetryChannel[] = [
  'timeS',
  'distanceM',
  'speedMps',
  'throttle',
  'brake',
  'brakePressurePa',
  'axMps2',
  'ayMps2',
  'steeringDeg',
  'gear',
  'rpm',
  'xM',
  'yM',
];

/** Which session field a file's column fills (latitude and longitude become the plane's x and y). */
export const FIELD_OF: Record<Quantity, TelemetryChannel> = {
  time: 'timeS',
  distance: 'distanceM',
  speed: 'speedMps',
  throttle: 'throttle',
  brake: 'brake',
  brakePressure: 'brakePressurePa',
  steering: 'steeringDeg',
  gear: 'gear',
  rpm: 'rpm',
  x: 'xM',
  y: 'yM',
  lat: 'xM',
  lon: 'yM',
  ax: 'axMps2',
  ay: 'ayMps2',
};

/** The channel arrays of a session or a chunk, by field. */
export type ChannelArrays = Pick<TelemetrySession, TelemetryChannel>;

/** Every channel field from `get` (null where the log lacks the channel; time is always there). */
export function channelArrays(get: (field: TelemetryChannel) => Float64Array | null): ChannelArrays {
  const arrays = {} as Record<TelemetryChannel, Float64Array | null>;
  for (const field of CHANNELS) arrays[field] = get(field);
  return arrays as ChannelArrays;
}

/**
 * Rows `firstRow` to `firstRow + rows - 1` (data rows counted from 0) of every channel the log has, each array
 * exactly `rows` long, NaN-free and in SI units (positions from latitude/longitude already in the local plane),
 * under the session's field names (null where the log lacks the channel). The arrays are views into buffers
 * that the reader reuses once the callback returns: copy what you keep.
 */
export interface TelemetryChunk extends ChannelArrays {
  firstRow: number;
  rows: number;
}

/** What a streamed read found, once the whole file has been read. */
export interface TelemetryStreamSummary {
  source: string;
  /** Data rows read (the samples of the session). */
  rows: number;
  /** Channels delivered in every chunk. */
  channels: TelemetryChannel[];
  /** Time of the first and the last row, s. */
  startTimeS: number;
  endTimeS: number;
  /** Latitude/longitude origin of the local plane when positions came from GPS, degrees. */
  geoOrigin: { latDeg: number; lonDeg: number } | null;
  /** The same notes the session reader gives (guessed units, filled gaps, unused columns). */
  notes: string[];
}
