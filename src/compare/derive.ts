// Channels a log lacks, derived from the ones it has: speed from positions (central differences over about
// 0.2 s), longitudinal acceleration from the speed trace (a = v dv/ds on the distance grid, lightly smoothed),
// lateral acceleration as v^2 times the curvature of the driver's own path (heading change over path length,
// smoothed), or of the track's where the path is too noisy to trust.

import { movingAverage } from '../numeric/moving-average.js';
import { lapIndex, wrapIndex } from '../numeric/lap-index.js';

export { movingAverage };

/** Path speed from positions, m/s: distance between samples i - h and i + h over their time apart. */
export function speedFromPositions(
  timeS: Float64Array,
  xM: Float64Array,
  yM: Float64Array,
  windowS = 0.2,
): Float64Array {
  const n = timeS.length;
  const out = new Float64Array(n);
  if (n < 2) return out;
  const dt = (timeS[n - 1]! - timeS[0]!) / (n - 1);
  const h = Math.max(1, Math.round(windowS / dt));
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - h);
    const b = Math.min(n - 1, i + h);
    let length = 0;
    for (let k = a + 1; k <= b; k++) length += Math.hypot(xM[k]! - xM[k - 1]!, yM[k]! - yM[k - 1]!);
    const span = timeS[b]! - timeS[a]!;
    out[i] = span > 0 ? length / span : 0;
  }
  return out;
}

/** Longitudinal acceleration on a uniform distance grid, m/s^2: v dv/ds by central differences, smoothed over ~smoothM. */
export function axFromSpeed(speedMps: Float64Array, stepM: number, closed: boolean, smoothM = 8): Float64Array {
  const n = speedMps.length;
  const raw = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let previous = i - 1;
    let next = i + 1;
    let span = 2 * stepM;
    if (closed) {
      previous = wrapIndex(previous, n);
      next %= n;
    } else if (previous < 0 || next >= n) {
      previous = Math.max(0, previous);
      next = Math.min(n - 1, next);
      span = stepM;
    }
    const v = speedMps[i]!;
    raw[i] = (v * (speedMps[next]! - speedMps[previous]!)) / span;
  }
  return movingAverage(raw, Math.round(smoothM / stepM / 2), closed);
}

/**
 * Signed curvature of the driver's path from positions on the distance grid, 1/m (positive left): the heading of
 * the chord over +-h stations, differenced over its own path length, then smoothed over ~smoothM.
 */
export function pathCurvature(
  xM: Float64Array,
  yM: Float64Array,
  stepM: number,
  closed: boolean,
  chordM = 6,
  smoothM = 16,
): Float64Array {
  const n = xM.length;
  const h = Math.max(1, Math.round(chordM / stepM / 2));
  const index = (i: number) => lapIndex(i, n, closed);
  const heading = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = index(i - h);
    const b = index(i + h);
    heading[i] = Math.atan2(yM[b]! - yM[a]!, xM[b]! - xM[a]!);
  }
  const raw = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = index(i - h);
    const b = index(i + h);
    let turn = heading[b]! - heading[a]!;
    turn -= 2 * Math.PI * Math.round(turn / (2 * Math.PI));
    let length = 0;
    for (let k = i - h; k < i + h; k++)
      length += Math.hypot(xM[index(k + 1)]! - xM[index(k)]!, yM[index(k + 1)]! - yM[index(k)]!);
    raw[i] = length > 0 ? turn / length : 0;
  }
  return movingAverage(raw, Math.round(smoothM / stepM / 2), closed);
}

/** ay = v^2 kappa, m/s^2. */
export function ayFromCurvature(speedMps: Float64Array, curvaturePerM: Float64Array): Float64Array {
  const out = new Float64Array(speedMps.length);
  for (let i = 0; i < out.length; i++) out[i] = speedMps[i]! * speedMps[i]! * curvaturePerM[i]!;
  return out;
}

/** Whether a path's curvature is too noisy to use: its RMS difference from the track's exceeds the track's RMS. */
export function curvatureTooNoisy(pathCurvaturePerM: Float64Array, trackCurvaturePerM: Float64Array): boolean {
  let difference = 0;
  let reference = 0;
  for (let i = 0; i < pathCurvaturePerM.length; i++) {
    const d = pathCurvaturePerM[i]! - trackCurvaturePerM[i]!;
    difference += d * d;
    reference += trackCurvaturePerM[i]! * trackCurvaturePerM[i]!;
  }
  return !(difference <= reference);
}

/** Pearson correlation, for checking a logged channel's sign against the derived one. */
export function correlation(a: Float64Array, b: Float64Array): number {
  const n = a.length;
  let ma = 0;
  let mb = 0;
  for (let i = 0; i < n; i++) {
    ma += a[i]!;
    mb += b[i]!;
  }
  ma /= n;
  mb /= n;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const da = a[i]! - ma;
    const db = b[i]! - mb;
    sab += da * db;
    saa += da * da;
    sbb += db * db;
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : 0;
}
