// Units that a log's header leaves open, decided from the data as docs/telemetry.md documents: speed against
// the distance covered, pedals by their range, accelerations by their 99th percentile; and the GPS plane's
// origin (the mean fix). The evidence is gathered chunk by chunk, so the streamed and the in-memory readers
// decide alike without holding the log.

import { STANDARD_GRAVITY_MPS2 } from '../../units.js';
import type { TelemetryChannel, TelemetryChunk } from './chunk.js';
import { localPlane, type GeoOrigin, type LocalPlane } from '../../track/geodesy.js';

/** What a read delivers before the units are decided. */
export interface ChannelLayout {
  channels: TelemetryChannel[];
  /** Where positions come from; 'latlon' chunks carry degrees in xM (latitude) and yM (longitude) until projected. */
  positions: 'xy' | 'latlon' | null;
  /** Channels still in the file's units, because the header gave none. */
  pending: TelemetryChannel[];
  /** The file's header of each channel, for notes. */
  headers: Partial<Record<TelemetryChannel, string>>;
}

/** Factors to SI for the pending channels, and the plane's origin for GPS positions. */
export interface DecidedUnits {
  factors: Partial<Record<TelemetryChannel, number>>;
  notes: Partial<Record<TelemetryChannel, string>>;
  geoOrigin: GeoOrigin | null;
}

/** Above this, |a| is read as m/s^2; the 99th percentile of a lap logged in g stays below it. */
const G_LIMIT = 3.5;

export class UnitEvidence {
  private latSum = 0;
  private lonSum = 0;
  private fixes = 0;
  private readonly pedalMax: Partial<Record<TelemetryChannel, number>> = {};
  private readonly withinG: Partial<Record<TelemetryChannel, number>> = {};
  private samples = 0;
  private travelledM = 0;
  private speedTimeIntegral = 0;
  private previous: { t: number; v: number; x: number; y: number; d: number } | null = null;
  private plane: LocalPlane | null = null;
  private readonly point = new Float64Array(2);

  constructor(private readonly layout: ChannelLayout) {}

  /** Takes one chunk as delivered before the units are decided (pending channels in file units, GPS in degrees). */
  add(chunk: TelemetryChunk): void {
    const { layout } = this;
    const n = chunk.rows;
    this.samples += n;
    if (layout.positions === 'latlon') {
      for (let i = 0; i < n; i++) {
        this.latSum += chunk.xM![i]!;
        this.lonSum += chunk.yM![i]!;
      }
      this.fixes += n;
    }
    for (const field of layout.pending) {
      const values = chunk[field]!;
      if (field === 'throttle' || field === 'brake') {
        let max = this.pedalMax[field] ?? -Infinity;
        for (let i = 0; i < n; i++) if (values[i]! > max) max = values[i]!;
        this.pedalMax[field] = max;
      } else if (field === 'axMps2' || field === 'ayMps2') {
        let within = this.withinG[field] ?? 0;
        for (let i = 0; i < n; i++) if (Math.abs(values[i]!) <= G_LIMIT) within++;
        this.withinG[field] = within;
      } else if (field === 'speedMps') this.addSpeed(chunk);
    }
  }

  private addSpeed(chunk: TelemetryChunk): void {
    const positions = this.layout.positions;
    const speed = chunk.speedMps!;
    for (let i = 0; i < chunk.rows; i++) {
      const t = chunk.timeS[i]!;
      const v = speed[i]!;
      let x = NaN;
      let y = NaN;
      if (positions === 'xy') {
        x = chunk.xM![i]!;
        y = chunk.yM![i]!;
      } else if (positions === 'latlon') {
        // The distance covered is measured in a plane about the first fix (the mean fix is not known yet).
        this.plane ??= localPlane({ latDeg: chunk.xM![i]!, lonDeg: chunk.yM![i]! });
        this.plane.toLocal(chunk.xM![i]!, chunk.yM![i]!, this.point);
        x = this.point[0]!;
        y = this.point[1]!;
      }
      const d = chunk.distanceM ? chunk.distanceM[i]! : NaN;
      const previous = this.previous;
      if (previous) {
        if (positions !== null) this.travelledM += Math.hypot(x - previous.x, y - previous.y);
        else if (chunk.distanceM) {
          const step = d - previous.d;
          if (step > 0) this.travelledM += step;
        }
        this.speedTimeIntegral += 0.5 * (v + previous.v) * (t - previous.t);
        previous.t = t;
        previous.v = v;
        previous.x = x;
        previous.y = y;
        previous.d = d;
      } else this.previous = { t, v, x, y, d };
    }
  }

  /** The documented rules, applied to everything seen. */
  decide(): DecidedUnits {
    const { layout } = this;
    const decided: DecidedUnits = { factors: {}, notes: {}, geoOrigin: null };
    if (layout.positions === 'latlon')
      decided.geoOrigin = { latDeg: this.latSum / this.fixes, lonDeg: this.lonSum / this.fixes };
    for (const field of layout.pending) {
      const header = layout.headers[field]!;
      if (field === 'throttle' || field === 'brake') {
        const factor = (this.pedalMax[field] ?? 0) > 1.5 ? 0.01 : 1;
        decided.factors[field] = factor;
        decided.notes[field] =
          `column ${header}: no unit in the header; read as ${factor === 1 ? '0-1' : 'percent'} from its range`;
      } else if (field === 'axMps2' || field === 'ayMps2') {
        // The 99th percentile (the sorted sample at index floor(0.99 n)) is at or below the limit exactly when
        // more than that many samples are.
        const rank = Math.min(this.samples - 1, Math.floor(0.99 * this.samples));
        const factor = (this.withinG[field] ?? 0) >= rank + 1 ? STANDARD_GRAVITY_MPS2 : 1;
        decided.factors[field] = factor;
        decided.notes[field] =
          `column ${header}: no unit in the header; read as ${factor === 1 ? 'm/s^2' : 'g'} from its range`;
      } else if (field === 'speedMps') {
        const [name, factor] = this.speedUnit();
        decided.factors[field] = factor;
        decided.notes[field] =
          name === null
            ? `column ${header}: no unit in the header; km/h assumed`
            : `column ${header}: no unit in the header; read as ${name} (it matches the distance travelled)`;
      }
    }
    return decided;
  }

  /** The nearest of m/s, km/h, mph and knots within 15 % of the distance covered; null name = km/h assumed. */
  private speedUnit(): [string | null, number] {
    const candidates: Array<[string, number]> = [
      ['m/s', 1],
      ['km/h', 1 / 3.6],
      ['mph', 0.44704],
      ['knots', 1852 / 3600],
    ];
    const travelled = this.travelledM;
    const sum = this.speedTimeIntegral;
    if (travelled > 0 && sum > 0) {
      const ratio = travelled / sum;
      const best = candidates.reduce((a, b) =>
        Math.abs(Math.log(ratio / b[1])) < Math.abs(Math.log(ratio / a[1])) ? b : a,
      );
      if (Math.abs(Math.log(ratio / best[1])) < 0.15) return best;
    }
    return [null, 1 / 3.6];
  }
}

/** Scales one pending channel to SI in place (pedals then clipped to 0-1). */
export function applyFactor(
  values: Float64Array,
  field: TelemetryChannel,
  factor: number,
  from = 0,
  to = values.length,
): void {
  const pedal = field === 'throttle' || field === 'brake';
  if (factor !== 1) for (let i = from; i < to; i++) values[i] = values[i]! * factor;
  if (pedal) for (let i = from; i < to; i++) values[i] = Math.min(1, Math.max(0, values[i]!));
}

/** Latitude (in x) and longitude (in y), degrees, to east and north in the plane, m, in place. */
export function projectInPlace(x: Float64Array, y: Float64Array, plane: LocalPlane, from = 0, to = x.length): void {
  const point = new Float64Array(2);
  for (let i = from; i < to; i++) {
    plane.toLocal(x[i]!, y[i]!, point);
    x[i] = point[0]!;
    y[i] = point[1]!;
  }
}
