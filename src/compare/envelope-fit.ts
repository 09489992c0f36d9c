// The g-g-v envelope a driver has already shown: per speed band, a high quantile (default the 98th percentile,
// robust against single spikes) of the combined acceleration in each of four directions (braking, accelerating,
// left, right: each sample counts for the sector its combined vector points into, by its component along that axis), and the coasting deceleration fitted as c0 + c2 v^2 by least squares where the log has pedals.
// Where a cell is thin even after borrowing from the next band, the car model's figure fills it, with a note.

import type { DemonstratedEnvelopeRecord, EnvelopeBand } from '../car/demonstrated-envelope.js';
import type { Envelope } from '../car/envelope.js';
import { mpsToKph } from '../units.js';
import { quantileSorted } from '../numeric/quantile.js';

export type { DemonstratedEnvelopeRecord, EnvelopeBand };
export type EnvelopeDirection = 'brake' | 'accel' | 'left' | 'right';

export interface EnvelopeSamples {
  speedMps: Float64Array;
  axMps2: Float64Array;
  ayMps2: Float64Array;
  throttle: Float64Array | null;
  brake: Float64Array | null;
}

export interface EnvelopeFitOptions {
  quantile: number;
  bandWidthMps: number;
  /** Cells with fewer samples borrow from the neighbouring bands until they have this many. */
  minSamples: number;
  /** Samples slower than this are left out (standing, pit lane), m/s. */
  minSpeedMps: number;
}

export const DEFAULT_ENVELOPE_FIT: EnvelopeFitOptions = {
  quantile: 0.98,
  bandWidthMps: 2.5,
  minSamples: 30,
  minSpeedMps: 5,
};

/** Coasting deceleration used when the log has no coasting samples: rolling resistance about 0.013 g plus drag of
 * a road car, 0.5 rho CdA / m with CdA 0.7 m^2 and m 1400 kg (from memory: typical figures). */
export const FALLBACK_COAST = { constantMps2: 0.13, quadraticPerM: 0.0003 };

const DIRECTIONS: EnvelopeDirection[] = ['brake', 'accel', 'left', 'right'];

/** Sector of an acceleration vector: within 45 degrees of straight back, ahead, left or right. */
export function directionOf(axMps2: number, ayMps2: number): EnvelopeDirection {
  if (Math.abs(axMps2) >= Math.abs(ayMps2)) return axMps2 < 0 ? 'brake' : 'accel';
  return ayMps2 > 0 ? 'left' : 'right';
}

export class EnvelopeFitError extends Error {}

/** Car model's limit in one direction at a speed: what a thin cell falls back to. */
function modelLimitMps2(model: Envelope, direction: number, speedMps: number): number {
  if (direction === 0) return model.brakeLimitMps2(speedMps, 0);
  if (direction === 1) return model.accelLimitMps2(speedMps, 0);
  return model.lateralLimitMps2(speedMps, direction === 2 ? 1 : -1);
}

const DIRECTION_WORDS = ['braking', 'acceleration', 'left turns', 'right turns'];

/**
 * `carModel`: the envelope a thin cell falls back to (a cell with too few samples in its own band and the next
 * ones); without it, thin cells pool ever further bands, and a direction with too few samples in all is an error.
 */
export function fitEnvelope(
  samples: EnvelopeSamples,
  source: string,
  options: EnvelopeFitOptions = DEFAULT_ENVELOPE_FIT,
  carModel: Envelope | null = null,
): DemonstratedEnvelopeRecord {
  const { speedMps, axMps2, ayMps2 } = samples;
  const n = speedMps.length;
  const speeds: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = speedMps[i]!;
    if (v >= options.minSpeedMps && Number.isFinite(v) && Number.isFinite(axMps2[i]!) && Number.isFinite(ayMps2[i]!))
      speeds.push(v);
  }
  if (speeds.length < options.minSamples)
    throw new EnvelopeFitError(
      `only ${speeds.length} moving samples; at least ${options.minSamples} are needed to fit an envelope`,
    );
  const sortedSpeeds = Float64Array.from(speeds).sort();
  const topSpeedMps = quantileSorted(sortedSpeeds, 0.999);
  const bandCount = Math.max(1, Math.ceil(topSpeedMps / options.bandWidthMps));
  // Magnitudes per band and direction, collected in plain arrays (a few per cell), sorted once.
  const cells: number[][][] = Array.from({ length: bandCount }, () => DIRECTIONS.map(() => [] as number[]));
  const counts = new Int32Array(bandCount);
  for (let i = 0; i < n; i++) {
    const v = speedMps[i]!;
    const ax = axMps2[i]!;
    const ay = ayMps2[i]!;
    if (!(v >= options.minSpeedMps) || !Number.isFinite(ax) || !Number.isFinite(ay)) continue;
    const band = Math.min(bandCount - 1, Math.floor(v / options.bandWidthMps));
    // The component along the sector's axis: on a friction ellipse it peaks on the axis at the pure limit, where the
    // magnitude would overstate the lesser axis with the greater one's combined points.
    const direction = directionOf(ax, ay);
    cells[band]![DIRECTIONS.indexOf(direction)]!.push(
      direction === 'brake' || direction === 'accel' ? Math.abs(ax) : Math.abs(ay),
    );
    counts[band]!++;
  }
  const sortedCells = cells.map((band) => band.map((values) => Float64Array.from(values).sort()));
  const totals = DIRECTIONS.map((_, d) => sortedCells.reduce((sum, band) => sum + band[d]!.length, 0));
  if (!carModel) {
    for (const [d, total] of totals.entries()) {
      if (total < options.minSamples)
        throw new EnvelopeFitError(
          `only ${total} samples of ${DIRECTION_WORDS[d]}; at least ${options.minSamples} are needed (or give the car, whose model fills thin parts)`,
        );
    }
  }
  const bands: EnvelopeBand[] = [];
  const fromModel: string[][] = DIRECTIONS.map(() => []);
  for (let b = 0; b < bandCount; b++) {
    if (counts[b]! === 0) continue;
    const speedMps = (b + 0.5) * options.bandWidthMps;
    const reach = carModel ? 1 : cells.length;
    const limit = DIRECTIONS.map((_, d) => pooledQuantile(sortedCells, b, d, options, reach));
    // A side short of samples in this band borrows the other side's figure before the neighbouring bands'.
    const own = (d: number) => sortedCells[b]![d]!.length >= options.minSamples;
    if (!own(2) && own(3)) limit[2] = limit[3]!;
    if (!own(3) && own(2)) limit[3] = limit[2]!;
    if (carModel) {
      for (let d = 0; d < DIRECTIONS.length; d++) {
        if (Number.isFinite(limit[d]!) && totals[d]! >= options.minSamples) continue;
        limit[d] = modelLimitMps2(carModel, d, speedMps);
        fromModel[d]!.push(mpsToKph(speedMps).toFixed(0));
      }
    }
    bands.push({
      speedMps: (b + 0.5) * options.bandWidthMps,
      samples: counts[b]!,
      brakeMps2: limit[0]!,
      accelMps2: limit[1]!,
      leftMps2: limit[2]!,
      rightMps2: limit[3]!,
    });
  }
  const notes = fromModel.flatMap((speeds, d) =>
    speeds.length > 0
      ? [
          `${DIRECTION_WORDS[d]} at ${speeds.length === bands.length ? 'every speed' : `${speeds.join(', ')} km/h`}: too few samples in the log, the car model's limit used`,
        ]
      : [],
  );
  return {
    format: 'reflap-demonstrated-envelope',
    version: 1,
    source,
    quantile: options.quantile,
    bandWidthMps: options.bandWidthMps,
    topSpeedMps,
    coast: fitCoast(samples, options.minSpeedMps),
    bands,
    ...(notes.length > 0 ? { notes } : {}),
  };
}

/** Quantile of one cell, pooling the nearest bands (up to maxReach away) while the cell is short of samples;
 * NaN when even the pool is short and the reach is limited. */
function pooledQuantile(
  cells: Float64Array[][],
  band: number,
  direction: number,
  options: EnvelopeFitOptions,
  maxReach: number,
): number {
  const own = cells[band]![direction]!;
  if (own.length >= options.minSamples) return quantileSorted(own, options.quantile);
  const pooled: number[] = Array.from(own);
  for (let reach = 1; reach <= maxReach && reach < cells.length && pooled.length < options.minSamples; reach++) {
    for (const b of [band - reach, band + reach]) {
      if (b < 0 || b >= cells.length) continue;
      for (const value of cells[b]![direction]!) pooled.push(value);
    }
  }
  if (maxReach < cells.length && pooled.length < options.minSamples) return NaN;
  const sorted = Float64Array.from(pooled).sort();
  return sorted.length > 0 ? quantileSorted(sorted, options.quantile) : NaN;
}

/** Least-squares c0 + c2 v^2 through the deceleration of samples with neither pedal pressed (5 % threshold). */
function fitCoast(samples: EnvelopeSamples, minSpeedMps: number): DemonstratedEnvelopeRecord['coast'] {
  const { throttle, brake, speedMps, axMps2 } = samples;
  if (!throttle || !brake) return { ...FALLBACK_COAST, fitted: false };
  let count = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < speedMps.length; i++) {
    const v = speedMps[i]!;
    if (v < minSpeedMps || throttle[i]! > 0.05 || brake[i]! > 0.05 || !Number.isFinite(axMps2[i]!)) continue;
    const x = v * v;
    const y = -axMps2[i]!;
    count++;
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  const det = count * sxx - sx * sx;
  if (count < 50 || !(Math.abs(det) > 1e-9 * Math.max(1, count * sxx))) return { ...FALLBACK_COAST, fitted: false };
  const quadraticPerM = (count * sxy - sx * sy) / det;
  const constantMps2 = (sy - quadraticPerM * sx) / count;
  if (!(quadraticPerM >= 0 && constantMps2 >= 0 && quadraticPerM < 0.01 && constantMps2 < 3))
    return { ...FALLBACK_COAST, fitted: false };
  return { constantMps2, quadraticPerM, fitted: true };
}
