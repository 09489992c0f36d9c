// The g-g-v envelope a driver has already shown: per speed band, a high quantile (default the 98th percentile,
// robust against single spikes) of the acceleration in each of four directions (braking, accelerating, left,
// right), and the coasting deceleration fitted as c0 + c2 v^2 by least squares where the log has pedals.
// Every step moves continuously with the log, so that a sample more or less, or a speed a little off, moves the
// envelope a little: samples weigh in each band by a triangular kernel of their speed (overlapping bands, Wand and
// Jones, "Kernel Smoothing", 1995) and in each direction by an angular taper across the 45-degree sector
// boundaries; each cell's quantile is the weighted type 7 quantile (src/numeric/weighted-quantile.ts); and a thin
// cell leans on the other side, a wider kernel and then the car model by a weight that grows smoothly with its
// effective sample size instead of switching at a count.

import type { DemonstratedEnvelopeRecord, EnvelopeBand } from '../car/demonstrated-envelope.js';
import type { Envelope } from '../car/envelope.js';
import { note, speedsOf } from '../note.js';
import { quantileSorted } from '../numeric/quantile.js';
import { cellFigures, LATERAL, movingSamples, type CellFigure } from './envelope-cells.js';

export type { DemonstratedEnvelopeRecord, EnvelopeBand };
export type EnvelopeDirection = 'brake' | 'accel' | 'left' | 'right';
export { directionOf, sectorWeights } from './envelope-cells.js';

export interface EnvelopeSamples {
  speedMps: Float64Array;
  axMps2: Float64Array;
  ayMps2: Float64Array;
  throttle: Float64Array | null;
  brake: Float64Array | null;
}

export interface EnvelopeFitOptions {
  quantile: number;
  /** Spacing of the band centres, m/s. */
  bandWidthMps: number;
  /**
   * Effective samples (Kish) at which a cell stands on its own data; below a third of this it borrows entirely,
   * and in between the weight of its own figure rises smoothly (a smoothstep).
   */
  minSamples: number;
  /** Samples slower than this are left out (standing, pit lane), m/s. */
  minSpeedMps: number;
  /** Half-width of the triangular speed kernel of a band, in bands (1: each sample's weights sum to one). */
  kernelBands: number;
  /** Half-width of the wider speed kernel a thin cell borrows from, in bands. */
  poolBands: number;
  /** Half-width of the angular taper across each 45-degree sector boundary, degrees. */
  sectorTaperDeg: number;
}

export const DEFAULT_ENVELOPE_FIT: EnvelopeFitOptions = {
  quantile: 0.98,
  bandWidthMps: 2.5,
  minSamples: 30,
  minSpeedMps: 5,
  kernelBands: 1,
  poolBands: 3,
  sectorTaperDeg: 10,
};

/** Coasting deceleration used when the log has no coasting samples: rolling resistance about 0.013 g plus drag of
 * a road car, 0.5 rho CdA / m with CdA 0.7 m^2 and m 1400 kg (from memory: typical figures). */
export const FALLBACK_COAST = { constantMps2: 0.13, quadraticPerM: 0.0003 };

const DIRECTIONS: EnvelopeDirection[] = ['brake', 'accel', 'left', 'right'];

export class EnvelopeFitError extends Error {}

/** Car model's limit in one direction at a speed: what a thin cell falls back to. */
function modelLimitMps2(model: Envelope, direction: number, speedMps: number): number {
  if (direction === 0) return model.brakeLimitMps2(speedMps, 0);
  if (direction === 1) return model.accelLimitMps2(speedMps, 0);
  return model.lateralLimitMps2(speedMps, direction === 2 ? 1 : -1);
}

const DIRECTION_WORDS = ['braking', 'acceleration', 'left turns', 'right turns'];

/** Weight of a cell's own figure against what it borrows: 0 below a third of minSamples, 1 from minSamples on,
 * a smoothstep between (continuous, with a continuous slope). */
function credibility(effective: number, minSamples: number): number {
  const low = minSamples / 3;
  const t = Math.min(1, Math.max(0, (effective - low) / (minSamples - low)));
  return t * t * (3 - 2 * t);
}

/** Weight of a cell's own figure over what it borrows (none where it has no figure). */
function ownWeight(cell: CellFigure, minSamples: number): number {
  return Number.isFinite(cell.value) ? credibility(cell.effective, minSamples) : 0;
}

/**
 * `carModel`: the envelope a thin cell leans on at last (a cell with few samples in its band, on its other side
 * and in the wider kernel); without it, the direction's figure over all speeds, and a direction with too few
 * samples in all is an error.
 */
export function fitEnvelope(
  samples: EnvelopeSamples,
  source: string,
  options: EnvelopeFitOptions = DEFAULT_ENVELOPE_FIT,
  carModel: Envelope | null = null,
): DemonstratedEnvelopeRecord {
  const moving = movingSamples(samples, options.minSpeedMps, options.sectorTaperDeg);
  if (moving.speedMps.length < options.minSamples)
    throw new EnvelopeFitError(
      `only ${moving.speedMps.length} moving samples; at least ${options.minSamples} are needed to fit an envelope`,
    );
  const sortedSpeeds = Float64Array.from(moving.speedMps).sort();
  const topSpeedMps = quantileSorted(sortedSpeeds, 0.999);
  const bandCount = Math.max(1, Math.ceil(topSpeedMps / options.bandWidthMps));
  const q = options.quantile;
  const [own, pool, everySpeed] = cellFigures(
    moving,
    { bandCount, widthMps: options.bandWidthMps, halfWidthBands: [options.kernelBands, options.poolBands, Infinity] },
    q,
  ) as [CellFigure[][], CellFigure[][], CellFigure[][]];
  const all = everySpeed[0]!;
  if (!carModel) {
    for (let d = 0; d < 4; d++) {
      const total = all[d]!.total;
      if (total < options.minSamples)
        throw new EnvelopeFitError(
          `only ${Math.round(total)} samples of ${DIRECTION_WORDS[d]}; at least ${options.minSamples} are needed (or give the car, whose model fills thin parts)`,
        );
    }
  }
  const bands: EnvelopeBand[] = [];
  const fromModel: number[][] = DIRECTIONS.map(() => []);
  for (let b = 0; b < bandCount; b++) {
    const weightInBand = own[b]![0]!.total + own[b]![1]!.total + own[b]![2]!.total + own[b]![3]!.total;
    if (!(weightInBand > 0)) continue;
    const speedMps = (b + 0.5) * options.bandWidthMps;
    const last = (d: number) => (carModel ? modelLimitMps2(carModel, d, speedMps) : all[d < 2 ? d : LATERAL]!.value);
    const limit = [0, 0, 0, 0];
    for (let d = 0; d < 4; d++) {
      const lateral = d >= 2;
      // From the most local figure to the least: this side in this band, both sides in this band (a side short
      // of samples borrows the other side's figure before the neighbouring speeds'), the wider kernel, the last.
      const chain = [own[b]![d]!, ...(lateral ? [own[b]![LATERAL]!] : []), pool[b]![lateral ? LATERAL : d]!];
      let value = last(d);
      let fallbackShare = 1;
      for (let k = chain.length - 1; k >= 0; k--) {
        const weight = ownWeight(chain[k]!, options.minSamples);
        if (weight > 0) value = weight * chain[k]!.value + (1 - weight) * value;
        fallbackShare *= 1 - weight;
      }
      limit[d] = value;
      if (carModel && fallbackShare >= 0.5) fromModel[d]!.push(speedMps);
    }
    bands.push({
      speedMps,
      samples: Math.round(weightInBand),
      brakeMps2: limit[0]!,
      accelMps2: limit[1]!,
      leftMps2: limit[2]!,
      rightMps2: limit[3]!,
    });
  }
  const notes = fromModel.flatMap((speeds, d) =>
    speeds.length > 0
      ? [
          speeds.length === bands.length
            ? `${DIRECTION_WORDS[d]} at every speed: too few samples in the log, mostly the car model's limit`
            : note`${DIRECTION_WORDS[d]!} at ${speedsOf(speeds)}: too few samples in the log, mostly the car model's limit`,
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
