// Turns raw numeric columns (in file units, NaN for empty cells) into a TelemetrySession in SI units:
// units that the header left open are decided from the data, gaps are filled, time order is checked.

import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../compare/types.js';
import type { Quantity } from './columns.js';
import { projectLatLon } from './geo.js';

export interface RawChannel {
  values: Float64Array;
  header: string;
  /** Factor to SI, or null when the header gave no unit. */
  scale: number | null;
}

export interface RawSession {
  source: string;
  channels: Map<Quantity, RawChannel>;
  /** Names a sample for messages, e.g. "row 12" or "line 40". */
  placeOfSample: (index: number) => string;
  /** The file's headers, listed when a needed column is missing. */
  found: string[];
  notes: string[];
}

export function buildSession(raw: RawSession): TelemetrySession {
  const { source, channels, notes } = raw;
  // A header of garbage or one line of megabytes must not become a message of megabytes.
  const listed = raw.found.join(', ');
  const foundText = listed.length > 200 ? `${listed.slice(0, 200)}... (${raw.found.length} columns)` : listed;
  const time = channels.get('time');
  if (!time) throw new InputError(`${source}: no time column (found: ${foundText || 'nothing'}); name it time_s or map it with --telemetry-columns time_s=NAME`);
  const count = time.values.length;
  if (count === 0) throw new InputError(`${source}: no data rows`);
  if (count < 2) throw new InputError(`${source}: only one data row; a lap needs many`);
  const timeS = scaled(time.values, time.scale ?? 1);
  for (let i = 0; i < count; i++) {
    if (Number.isNaN(timeS[i]!)) throw new InputError(`${source}: ${raw.placeOfSample(i)}, column ${time.header}: empty time`);
    if (i > 0 && timeS[i]! < timeS[i - 1]!) {
      throw new InputError(`${source}: ${raw.placeOfSample(i)}, column ${time.header}: time runs backwards (${timeS[i]} after ${timeS[i - 1]})`);
    }
  }
  if (!(timeS[count - 1]! > timeS[0]!)) throw new InputError(`${source}: column ${time.header}: time does not advance`);

  const filled = (quantity: Quantity): RawChannel | null => {
    const channel = channels.get(quantity);
    if (!channel) return null;
    const gaps = fillGaps(channel.values, timeS);
    if (gaps === null) {
      notes.push(`column ${channel.header} is empty; left out`);
      return null;
    }
    if (gaps > 0) notes.push(`column ${channel.header}: ${gaps} empty cells filled by interpolation`);
    return channel;
  };

  const distance = filled('distance');
  const distanceM = distance ? scaled(distance.values, distance.scale ?? 1) : null;

  let xM: Float64Array | null = null;
  let yM: Float64Array | null = null;
  let geoOrigin: TelemetrySession['geoOrigin'] = null;
  const x = filled('x');
  const y = filled('y');
  const lat = filled('lat');
  const lon = filled('lon');
  if ((x === null) !== (y === null)) throw new InputError(`${source}: column ${(x ?? y)!.header} has no partner; positions need both x_m and y_m`);
  if ((lat === null) !== (lon === null)) throw new InputError(`${source}: column ${(lat ?? lon)!.header} has no partner; GPS positions need both latitude and longitude`);
  if (x && y) {
    xM = scaled(x.values, 1);
    yM = scaled(y.values, 1);
  } else if (lat && lon) {
    checkRange(lat, -90, 90, source, raw);
    checkRange(lon, -180, 180, source, raw);
    const projected = projectLatLon(lat.values, lon.values);
    xM = projected.xM;
    yM = projected.yM;
    geoOrigin = projected.origin;
  }

  const speed = filled('speed');
  let speedMps: Float64Array | null = null;
  if (speed) {
    const factor = speed.scale ?? speedUnitFromData(speed.values, timeS, distanceM, xM, yM, speed.header, notes);
    speedMps = scaled(speed.values, factor);
  }
  if (!speedMps && !distanceM && !xM) {
    throw new InputError(`${source}: no position, distance or speed column (found: ${foundText}); map one with --telemetry-columns`);
  }

  const pedal = (quantity: 'throttle' | 'brake'): Float64Array | null => {
    const channel = filled(quantity);
    if (!channel) return null;
    let factor = channel.scale;
    if (factor === null) {
      // Documented rule: without a unit in the header, a maximum above 1.5 means percent.
      factor = maxOf(channel.values) > 1.5 ? 0.01 : 1;
      notes.push(`column ${channel.header}: no unit in the header; read as ${factor === 1 ? '0-1' : 'percent'} from its range`);
    }
    const values = scaled(channel.values, factor);
    for (let i = 0; i < values.length; i++) values[i] = Math.min(1, Math.max(0, values[i]!));
    return values;
  };

  const acceleration = (quantity: 'ax' | 'ay'): Float64Array | null => {
    const channel = filled(quantity);
    if (!channel) return null;
    let factor = channel.scale;
    if (factor === null) {
      // Documented rule: without a unit, a 99th percentile of |a| at or below 3.5 means g (no road or race
      // car logs more than 3.5 g on most of a lap; in m/s^2 a lap at speed passes 3.5 easily).
      factor = percentileAbs(channel.values, 0.99) <= 3.5 ? 9.80665 : 1;
      notes.push(`column ${channel.header}: no unit in the header; read as ${factor === 1 ? 'm/s^2' : 'g'} from its range`);
    }
    return scaled(channel.values, factor);
  };

  const plain = (quantity: Quantity): Float64Array | null => {
    const channel = filled(quantity);
    return channel ? scaled(channel.values, channel.scale ?? 1) : null;
  };

  return {
    source,
    count,
    timeS,
    distanceM,
    speedMps,
    throttle: pedal('throttle'),
    brake: pedal('brake'),
    axMps2: acceleration('ax'),
    ayMps2: acceleration('ay'),
    steeringDeg: plain('steering'),
    gear: plain('gear'),
    rpm: plain('rpm'),
    xM,
    yM,
    geoOrigin,
    notes,
  };
}

function scaled(values: Float64Array, factor: number): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i]! * factor;
  return out;
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
            values[j] = values[previous]! + w * (values[i]! - values[previous]!);
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

function maxOf(values: Float64Array): number {
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i]! > max) max = values[i]!;
  return max;
}

function percentileAbs(values: Float64Array, q: number): number {
  const step = Math.max(1, Math.floor(values.length / 20000));
  const sample: number[] = [];
  for (let i = 0; i < values.length; i += step) sample.push(Math.abs(values[i]!));
  sample.sort((a, b) => a - b);
  return sample[Math.min(sample.length - 1, Math.floor(q * sample.length))] ?? 0;
}

function checkRange(channel: RawChannel, min: number, max: number, source: string, raw: RawSession): void {
  for (let i = 0; i < channel.values.length; i++) {
    const v = channel.values[i]!;
    if (v < min || v > max) throw new InputError(`${source}: ${raw.placeOfSample(i)}, column ${channel.header}: ${v} is not a latitude/longitude in degrees`);
  }
}

/**
 * A speed column without a unit: compare its mean with the mean speed the distance or positions imply
 * (m/s, km/h, mph, knots); when neither exists, km/h is assumed (the common logger default) with a note.
 */
function speedUnitFromData(values: Float64Array, timeS: Float64Array, distanceM: Float64Array | null, xM: Float64Array | null, yM: Float64Array | null, header: string, notes: string[]): number {
  let travelled = 0;
  for (let i = 1; i < values.length; i++) {
    if (xM && yM) travelled += Math.hypot(xM[i]! - xM[i - 1]!, yM[i]! - yM[i - 1]!);
    else if (distanceM) {
      const step = distanceM[i]! - distanceM[i - 1]!;
      if (step > 0) travelled += step;
    }
  }
  let sum = 0;
  for (let i = 1; i < values.length; i++) sum += 0.5 * (values[i]! + values[i - 1]!) * (timeS[i]! - timeS[i - 1]!);
  const candidates: Array<[string, number]> = [['m/s', 1], ['km/h', 1 / 3.6], ['mph', 0.44704], ['knots', 1852 / 3600]];
  if (travelled > 0 && sum > 0) {
    const ratio = travelled / sum;
    const best = candidates.reduce((a, b) => (Math.abs(Math.log(ratio / b[1])) < Math.abs(Math.log(ratio / a[1])) ? b : a));
    if (Math.abs(Math.log(ratio / best[1])) < 0.15) {
      notes.push(`column ${header}: no unit in the header; read as ${best[0]} (it matches the distance travelled)`);
      return best[1];
    }
  }
  notes.push(`column ${header}: no unit in the header; km/h assumed`);
  return 1 / 3.6;
}

/** A session of GPS fixes only: positions projected about their mean, speed where the log gave one. */
export function gpsSession(source: string, timeS: Float64Array, latDeg: Float64Array, lonDeg: Float64Array, speedMps: Float64Array | null, notes: string[]): TelemetrySession {
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
