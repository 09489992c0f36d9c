// A brake channel logged as line pressure (bar, psi, kPa) is pressure, not a pedal share: braking is detected
// from the pressure over the session's own high quantile (the 99th percentile, so that a single spike does not
// set the scale; the project's one quantile definition, numeric/quantile.ts), and the pressure itself is kept
// beside it for the aligned output.

import { quantileSorted } from '../../numeric/quantile.js';

/** The quantile of the pressure that counts as full braking. Common practice, no source: high enough to be the driver's hard stops, low enough to skip a spike. */
export const FULL_BRAKING_QUANTILE = 0.99;

/** The brake share (0-1) of each sample and the pressure taken as full braking, Pa (0 when the log never brakes). */
export function brakeShareFromPressure(pressurePa: Float64Array): { brake: Float64Array; fullPa: number } {
  const fullPa =
    pressurePa.length > 0 ? quantileSorted(Float64Array.from(pressurePa).sort(), FULL_BRAKING_QUANTILE) : 0;
  return { brake: shareOfPressure(pressurePa, fullPa, new Float64Array(pressurePa.length)), fullPa };
}

/** The note that says how a pressure column was read. */
export function brakePressureNote(header: string, fullPa: number): string {
  return fullPa > 0
    ? `column ${header} is brake pressure: braking read as its share of ${(fullPa / 1e5).toFixed(1)} bar (the session's 99th percentile); the pressure is kept in the aligned traces`
    : `column ${header} is brake pressure but never rises above 0; no braking read from it`;
}

/** Relative width of the streamed reader's pressure bins: the full-braking pressure it finds is within this share
 * of the session reader's (our choice: far below a pressure sensor's own accuracy). */
export const PRESSURE_BIN_SHARE = 5e-4;
const LOG_BIN = Math.log1p(PRESSURE_BIN_SHARE);
/** Pressures from 1 Pa to 10^9 Pa (10,000 bar) get a bin each; below 1 Pa counts as no pressure. */
const BIN_COUNT = Math.ceil(Math.log(1e9) / LOG_BIN) + 1;

/**
 * The pressures of a log seen once, in logarithmic bins, for its high quantile in memory that does not grow with
 * the log: the quantile is found as the session reader finds it (Hyndman and Fan 1996 type 7, position (n - 1) q)
 * with each rank's value placed within its bin by its share of the bin's count.
 */
export interface PressureHistogram {
  count: number;
  zeros: number;
  bins: Uint32Array;
}

export function pressureHistogram(): PressureHistogram {
  return { count: 0, zeros: 0, bins: new Uint32Array(BIN_COUNT) };
}

export function addPressures(histogram: PressureHistogram, pressurePa: Float64Array): void {
  const { bins } = histogram;
  for (let i = 0; i < pressurePa.length; i++) {
    const p = pressurePa[i]!;
    if (!(p >= 1)) histogram.zeros++;
    else bins[Math.min(BIN_COUNT - 1, Math.floor(Math.log(p) / LOG_BIN))]!++;
  }
  histogram.count += pressurePa.length;
}

/** The value of rank r (0-based, ascending) as the histogram places it. */
function valueOfRank(histogram: PressureHistogram, rank: number): number {
  if (rank < histogram.zeros) return 0;
  let below = histogram.zeros;
  const { bins } = histogram;
  for (let b = 0; b < BIN_COUNT; b++) {
    const inBin = bins[b]!;
    if (rank < below + inBin) return Math.exp((b + (rank - below + 0.5) / inBin) * LOG_BIN);
    below += inBin;
  }
  return Math.exp(BIN_COUNT * LOG_BIN);
}

/** The histogram's quantile q, Pa (0 for an empty one). */
export function histogramQuantilePa(histogram: PressureHistogram, q: number): number {
  if (histogram.count === 0) return 0;
  const position = (histogram.count - 1) * q;
  const lo = Math.floor(position);
  const low = valueOfRank(histogram, lo);
  const high = lo + 1 < histogram.count ? valueOfRank(histogram, lo + 1) : low;
  return low + (position - lo) * (high - low);
}

/** Pressure as a share (0-1) of full braking, into `out`. */
export function shareOfPressure(pressurePa: Float64Array, fullPa: number, out: Float64Array): Float64Array {
  for (let i = 0; i < pressurePa.length; i++)
    out[i] = fullPa > 0 ? Math.min(1, Math.max(0, pressurePa[i]! / fullPa)) : 0;
  return out;
}
