// Cells of a demonstrated envelope: every sample's weight in each speed band (triangular kernel, Wand and Jones,
// "Kernel Smoothing", 1995) and direction (sectors tapered across their 45-degree boundaries), and each cell's
// weighted type 7 quantile (Akinshin 2023, src/numeric/weighted-quantile.ts) summed in one walk down the samples
// sorted by acceleration, so that only the top of each cell is read and nothing is allocated per sample.

import { quantileWindow, windowShare } from '../numeric/weighted-quantile.js';

/** Axis of each direction's sector, rad from straight ahead, positive to the left. */
const SECTOR_ORDER = ['brake', 'accel', 'left', 'right'];
const AXIS_RAD = [Math.PI, 0, Math.PI / 2, -Math.PI / 2];

/** Sector of an acceleration vector: within 45 degrees of straight back, ahead, left or right. */
export function directionOf(axMps2: number, ayMps2: number): 'brake' | 'accel' | 'left' | 'right' {
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
  if (!(taperRad > 0)) out[offset + SECTOR_ORDER.indexOf(directionOf(axMps2, ayMps2))] = 1;
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

/** Cell kinds: the four directions, and left and right turns together. */
export const LATERAL = 4;
export const KINDS = 5;

/** A cell's figure: its weighted quantile, Kish's effective sample size and its total weight. */
export interface CellFigure {
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
export interface Kernels {
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
export function cellFigures(samples: MovingSamples, kernels: Kernels, q: number): CellFigure[][][] {
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

export interface MovingSamples {
  speedMps: Float64Array;
  axMps2: Float64Array;
  ayMps2: Float64Array;
  /** Four sector weights per sample. */
  sectorWeight: Float64Array;
  /** Sample indices in increasing order of |ax| and of |ay|. */
  byAx: Uint32Array;
  byAy: Uint32Array;
}

export function movingSamples(
  samples: { speedMps: Float64Array; axMps2: Float64Array; ayMps2: Float64Array },
  minSpeedMps: number,
  sectorTaperDeg: number,
): MovingSamples {
  const { speedMps, axMps2, ayMps2 } = samples;
  let count = 0;
  const keep = new Uint32Array(speedMps.length);
  for (let i = 0; i < speedMps.length; i++) {
    const v = speedMps[i]!;
    if (v >= minSpeedMps && Number.isFinite(v) && Number.isFinite(axMps2[i]!) && Number.isFinite(ayMps2[i]!))
      keep[count++] = i;
  }
  const speed = new Float64Array(count);
  const ax = new Float64Array(count);
  const ay = new Float64Array(count);
  const sectorWeight = new Float64Array(4 * count);
  const taperRad = (sectorTaperDeg * Math.PI) / 180;
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
