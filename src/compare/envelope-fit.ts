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
import { mpsToKph } from '../units.js';
import { quantileSorted } from '../numeric/quantile.js';
import { quantileWindow, windowShare } from '../numeric/weighted-quantile.js';

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
/** Axis of each direction's sector, rad from straight ahead, positive to the left. */
const AXIS_RAD = [Math.PI, 0, Math.PI / 2, -Math.PI / 2];

/** Sector of an acceleration vector: within 45 degrees of straight back, ahead, left or right. */
export function directionOf(axMps2: number, ayMps2: number): EnvelopeDirection {
  if (Math.abs(axMps2) >= Math.abs(ayMps2)) return axMps2 < 0 ? 'brake' : 'accel';
  return ayMps2 > 0 ? 'left' : 'right';
}

/**
 * Weight of an acceleration vector in each direction's sector (into `out`): 1 well inside a sector, falling
 * linearly to 0 across the taper around each 45-degree boundary, so the two sectors' weights always sum to one.
 */
export function sectorWeights(
  axMps2: number,
  ayMps2: number,
  taperRad: number,
  out: Float64Array,
  offset = 0,
): Float64Array {
  const angle = Math.atan2(ayMps2, axMps2);
  for (let d = 0; d < 4; d++) {
    let off = Math.abs(angle - AXIS_RAD[d]!);
    if (off > Math.PI) off = 2 * Math.PI - off;
    out[offset + d] = taperRad > 0 ? Math.min(1, Math.max(0, (Math.PI / 4 + taperRad - off) / (2 * taperRad))) : 0;
  }
  if (!(taperRad > 0)) out[offset + DIRECTIONS.indexOf(directionOf(axMps2, ayMps2))] = 1;
  return out;
}

/** Largest sample count whose index fits beside the value in one sort key. */
const PACKED_INDICES = 2 ** 22;

/**
 * Indices of non-negative values in increasing order of value. The native numeric sort of one key per sample (the
 * value to 2^-20, about 1e-6, above the index: exact in a double for values under 256 and up to 2^22 samples) is
 * several times faster than a sort with a comparator; ties closer than 1e-6 keep index order, which no quantile
 * can tell apart. Longer logs take the comparator.
 */
function increasingOrder(values: Float64Array): Uint32Array {
  const n = values.length;
  if (n > PACKED_INDICES) return Uint32Array.from(values.keys()).sort((a, b) => values[a]! - values[b]!);
  const keys = new Float64Array(n);
  for (let i = 0; i < n; i++) keys[i] = Math.floor(Math.min(values[i]!, 255.999) * 2 ** 20) * PACKED_INDICES + i;
  keys.sort();
  const order = new Uint32Array(n);
  for (let k = 0; k < n; k++) order[k] = keys[k]! % PACKED_INDICES;
  return order;
}

export class EnvelopeFitError extends Error {}

/** Car model's limit in one direction at a speed: what a thin cell falls back to. */
function modelLimitMps2(model: Envelope, direction: number, speedMps: number): number {
  if (direction === 0) return model.brakeLimitMps2(speedMps, 0);
  if (direction === 1) return model.accelLimitMps2(speedMps, 0);
  return model.lateralLimitMps2(speedMps, direction === 2 ? 1 : -1);
}

const DIRECTION_WORDS = ['braking', 'acceleration', 'left turns', 'right turns'];

/** Cell kinds: the four directions, and left and right turns together. */
const LATERAL = 4;
const KINDS = 5;

/** A cell's figure: its weighted quantile, Kish's effective sample size and its total weight. */
interface CellFigure {
  value: number;
  effective: number;
  total: number;
}

/** Weight of sample i in a kind's cell, before its speed weight. */
function kindWeight(samples: MovingSamples, i: number, kind: number): number {
  const w = samples.sectorWeight;
  return kind === LATERAL ? w[4 * i + 2]! + w[4 * i + 3]! : w[4 * i + kind]!;
}

/** The kernels a fit reads: half-widths in bands (Infinity: one band holding every sample at full weight). */
interface Kernels {
  bandCount: number;
  widthMps: number;
  halfWidthBands: number[];
}

/** Cells (flat index) and weights of sample i in one kind under every kernel, into `out`; returns how many. */
function cellsOf(samples: MovingSamples, i: number, kind: number, kernels: Kernels, out: CellBuffer): number {
  const sector = kindWeight(samples, i, kind);
  if (!(sector > 0)) return 0;
  const position = samples.speedMps[i]! / kernels.widthMps - 0.5;
  let count = 0;
  let offset = 0;
  for (const halfWidth of kernels.halfWidthBands) {
    const bands = Number.isFinite(halfWidth) ? kernels.bandCount : 1;
    const first = Number.isFinite(halfWidth) ? Math.max(0, Math.ceil(position - halfWidth)) : 0;
    const last = Number.isFinite(halfWidth) ? Math.min(bands - 1, Math.floor(position + halfWidth)) : 0;
    for (let b = first; b <= last; b++) {
      const weight = Number.isFinite(halfWidth) ? sector * (1 - Math.abs(position - b) / halfWidth) : sector;
      if (!(weight > 0)) continue;
      out.cells[count] = (offset + b) * KINDS + kind;
      out.weights[count++] = weight;
    }
    offset += bands;
  }
  return count;
}

interface CellBuffer {
  cells: Int32Array;
  weights: Float64Array;
}

/**
 * Figures of every cell under every kernel (indexed [kernel][band][kind]). Each cell's quantile is the weighted
 * type 7 quantile of src/numeric/weighted-quantile.ts, with its coefficients summed in one walk down each axis's
 * sorted values: a cell is done once the walk is below its window, so only the top few per cent of each cell are
 * read, and nothing is allocated per sample.
 */
function cellFigures(samples: MovingSamples, kernels: Kernels, q: number): CellFigure[][][] {
  const sizes = kernels.halfWidthBands.map((h) => (Number.isFinite(h) ? kernels.bandCount : 1));
  const cellCount = sizes.reduce((sum, size) => sum + size, 0) * KINDS;
  const total = new Float64Array(cellCount);
  const squares = new Float64Array(cellCount);
  const fromTop = new Float64Array(cellCount);
  const value = new Float64Array(cellCount);
  const done = new Uint8Array(cellCount);
  const capacity = kernels.halfWidthBands.reduce((sum, h) => sum + (Number.isFinite(h) ? 2 * Math.ceil(h) + 1 : 1), 0);
  const buffer: CellBuffer = { cells: new Int32Array(capacity), weights: new Float64Array(capacity) };
  const n = samples.speedMps.length;
  for (let i = 0; i < n; i++) {
    for (let kind = 0; kind < KINDS; kind++) {
      const count = cellsOf(samples, i, kind, kernels, buffer);
      for (let j = 0; j < count; j++) {
        const c = buffer.cells[j]!;
        const w = buffer.weights[j]!;
        total[c] = total[c]! + w;
        squares[c] = squares[c]! + w * w;
      }
    }
  }
  const windows = Array.from(total, (sum, c) => quantileWindow(sum > 0 ? (sum * sum) / squares[c]! : 0, q));
  for (let c = 0; c < cellCount; c++) if (!(total[c]! > 0)) done[c] = 1;
  for (const [order, values, kinds] of [
    [samples.byAx, samples.axMps2, [0, 1]],
    [samples.byAy, samples.ayMps2, [2, 3, LATERAL]],
  ] as const) {
    for (let k = n - 1; k >= 0; k--) {
      const i = order[k]!;
      for (const kind of kinds) {
        const count = cellsOf(samples, i, kind, kernels, buffer);
        for (let j = 0; j < count; j++) {
          const c = buffer.cells[j]!;
          if (done[c]) continue;
          const above = fromTop[c]!;
          const below = above + buffer.weights[j]!;
          fromTop[c] = below;
          const lowShare = below >= total[c]! ? 0 : 1 - below / total[c]!;
          const lowWindow = windowShare(windows[c]!, lowShare);
          value[c] = value[c]! + (windowShare(windows[c]!, 1 - above / total[c]!) - lowWindow) * values[i]!;
          if (lowWindow <= 0) done[c] = 1;
        }
      }
    }
  }
  let offset = 0;
  return sizes.map((size) => {
    const figures = Array.from({ length: size }, (_, b) =>
      Array.from({ length: KINDS }, (_, kind) => {
        const c = (offset + b) * KINDS + kind;
        const sum = total[c]!;
        return { value: sum > 0 ? value[c]! : NaN, effective: windows[c]!.effective, total: sum };
      }),
    );
    offset += size;
    return figures;
  });
}

interface MovingSamples {
  speedMps: Float64Array;
  axMps2: Float64Array;
  ayMps2: Float64Array;
  /** Four sector weights per sample. */
  sectorWeight: Float64Array;
  /** Sample indices in increasing order of |ax| and of |ay|. */
  byAx: Uint32Array;
  byAy: Uint32Array;
}

function movingSamples(samples: EnvelopeSamples, options: EnvelopeFitOptions): MovingSamples {
  const { speedMps, axMps2, ayMps2 } = samples;
  let count = 0;
  const keep = new Uint32Array(speedMps.length);
  for (let i = 0; i < speedMps.length; i++) {
    const v = speedMps[i]!;
    if (v >= options.minSpeedMps && Number.isFinite(v) && Number.isFinite(axMps2[i]!) && Number.isFinite(ayMps2[i]!))
      keep[count++] = i;
  }
  const speed = new Float64Array(count);
  const ax = new Float64Array(count);
  const ay = new Float64Array(count);
  const sectorWeight = new Float64Array(4 * count);
  const taperRad = (options.sectorTaperDeg * Math.PI) / 180;
  for (let k = 0; k < count; k++) {
    const i = keep[k]!;
    speed[k] = speedMps[i]!;
    ax[k] = Math.abs(axMps2[i]!);
    ay[k] = Math.abs(ayMps2[i]!);
    sectorWeights(axMps2[i]!, ayMps2[i]!, taperRad, sectorWeight, 4 * k);
  }
  return {
    speedMps: speed,
    axMps2: ax,
    ayMps2: ay,
    sectorWeight,
    byAx: increasingOrder(ax),
    byAy: increasingOrder(ay),
  };
}

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
  const moving = movingSamples(samples, options);
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
  const fromModel: string[][] = DIRECTIONS.map(() => []);
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
      if (carModel && fallbackShare >= 0.5) fromModel[d]!.push(mpsToKph(speedMps).toFixed(0));
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
          `${DIRECTION_WORDS[d]} at ${speeds.length === bands.length ? 'every speed' : `${speeds.join(', ')} km/h`}: too few samples in the log, mostly the car model's limit`,
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
