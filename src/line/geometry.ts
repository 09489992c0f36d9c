// Geometry of a racing line given as lateral offsets n_i (positive left) from the centreline at each grid sample.
// Curvilinear (Frenet) coordinates, as in the curvilinear lap-time formulations (Lot and Biral, "A curvilinear
// abscissa approach for the lap time optimization of racing vehicles", IFAC 2014): with a = 1 - n kc and
// n' = dn/ds, the offset curve has ds_line = sqrt(a^2 + n'^2) ds and the exact signed curvature
//   k = [kc (a^2 + n'^2) + a n'' + n' (n' kc + n kc')] / (a^2 + n'^2)^(3/2),
// which is kc / (1 - n kc) on a circle and kc itself on the centreline. n', n'' and kc' are central differences
// on the grid. The line's Path uses these same formulas, so the centreline (n = 0) gives back exactly the
// centreline's own curvature and step, and the optimiser and the solver see one and the same curvature.

import type { Path, TrackGrid } from '../track/types.js';

/** The grid a line's geometry needs: its step, whether it closes, and the centreline's curvature. */
export type OffsetGrid = Pick<TrackGrid, 'closed' | 'stepM' | 'curvaturePerM'>;

/** Curvature of the offset curve from n, n', n'' and the centreline's kc, kc' (module header). */
export function offsetCurvature(n: number, dn: number, ddn: number, kc: number, dkc: number): number {
  const a = 1 - n * kc;
  const big = a * a + dn * dn;
  return (kc * big + a * ddn + dn * (dn * kc + n * dkc)) / (big * Math.sqrt(big));
}

/** Partial derivatives of offsetCurvature with respect to n, n' and n'', written into out[0..2]. */
export function offsetCurvaturePartials(
  n: number,
  dn: number,
  ddn: number,
  kc: number,
  dkc: number,
  out: Float64Array,
): void {
  const a = 1 - n * kc;
  const big = a * a + dn * dn;
  const num = kc * big + a * ddn + dn * (dn * kc + n * dkc);
  const inv15 = 1 / (big * Math.sqrt(big));
  const inv25 = inv15 / big;
  // d(big)/dn = -2 a kc; d(num)/dn = kc d(big)/dn - kc ddn + dn dkc
  const dBigDn = -2 * a * kc;
  const dNumDn = kc * dBigDn - kc * ddn + dn * dkc;
  out[0] = dNumDn * inv15 - 1.5 * num * inv25 * dBigDn;
  // d(big)/dn' = 2 dn; d(num)/dn' = kc 2 dn + 2 dn kc + n dkc
  const dBigDdn = 2 * dn;
  const dNumDdn = 4 * dn * kc + n * dkc;
  out[1] = dNumDdn * inv15 - 1.5 * num * inv25 * dBigDdn;
  out[2] = a * inv15;
}

/** Derivative of the centreline curvature along s (central differences; one-sided at open ends). */
export function centrelineCurvatureSlope(track: OffsetGrid): Float64Array {
  const kc = track.curvaturePerM;
  const n = kc.length;
  const h = track.stepM;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (track.closed) {
      out[i] = (kc[(i + 1) % n]! - kc[(i - 1 + n) % n]!) / (2 * h);
    } else if (n < 2) {
      out[i] = 0;
    } else if (i === 0) {
      out[i] = (kc[1]! - kc[0]!) / h;
    } else if (i === n - 1) {
      out[i] = (kc[n - 1]! - kc[n - 2]!) / h;
    } else {
      out[i] = (kc[i + 1]! - kc[i - 1]!) / (2 * h);
    }
  }
  return out;
}

/** Offset of the sample before i: on an open grid the line continues straight past the first sample. */
export function previousOffset(offsetM: Float64Array, i: number, closed: boolean): number {
  if (i > 0) return offsetM[i - 1]!;
  const n = offsetM.length;
  if (closed) return offsetM[n - 1]!;
  return n < 2 ? offsetM[0]! : 2 * offsetM[0]! - offsetM[1]!;
}

/** Offset of the sample after i: on an open grid the line continues straight past the last sample. */
export function nextOffset(offsetM: Float64Array, i: number, closed: boolean): number {
  const n = offsetM.length;
  if (i < n - 1) return offsetM[i + 1]!;
  if (closed) return offsetM[0]!;
  return n < 2 ? offsetM[0]! : 2 * offsetM[n - 1]! - offsetM[n - 2]!;
}

/** Signed curvature of the line at every sample, 1/m. */
export function lineCurvature(
  track: OffsetGrid,
  offsetM: Float64Array,
  curvatureSlope: Float64Array = centrelineCurvatureSlope(track),
  out: Float64Array = new Float64Array(offsetM.length),
): Float64Array {
  const h = track.stepM;
  const kc = track.curvaturePerM;
  for (let i = 0; i < offsetM.length; i++) {
    const prev = previousOffset(offsetM, i, track.closed);
    const next = nextOffset(offsetM, i, track.closed);
    const n = offsetM[i]!;
    out[i] = offsetCurvature(n, (next - prev) / (2 * h), (next - 2 * n + prev) / (h * h), kc[i]!, curvatureSlope[i]!);
  }
  return out;
}

/** Mean centreline curvature over segment i (to i + 1, wrapping on a closed grid). */
export function segmentCurvature(kc: Float64Array, i: number): number {
  const j = i + 1 === kc.length ? 0 : i + 1;
  return 0.5 * (kc[i]! + kc[j]!);
}

/** Path length of each segment: h sqrt(a^2 + n'^2) with a and n' taken at the segment's middle. */
export function lineSegmentLengths(
  track: OffsetGrid,
  offsetM: Float64Array,
  out: Float64Array = new Float64Array(Math.max(track.closed ? offsetM.length : offsetM.length - 1, 0)),
): Float64Array {
  const count = offsetM.length;
  const segments = track.closed ? count : count - 1;
  const h = track.stepM;
  for (let i = 0; i < segments; i++) {
    const j = i + 1 === count ? 0 : i + 1;
    const a = 1 - 0.5 * (offsetM[i]! + offsetM[j]!) * segmentCurvature(track.curvaturePerM, i);
    const b = (offsetM[j]! - offsetM[i]!) / h;
    out[i] = h * Math.sqrt(a * a + b * b);
  }
  return out;
}

/** The line as a Path for the solver, on the track's grid. */
export function linePath(track: TrackGrid, offsetM: Float64Array): Path {
  return {
    closed: track.closed,
    curvaturePerM: lineCurvature(track, offsetM),
    segmentLengthM: lineSegmentLengths(track, offsetM),
  };
}

/** Plane positions of the line: centreline point plus n times the left normal (-sin psi, cos psi). */
export function linePositions(track: TrackGrid, offsetM: Float64Array): { xM: Float64Array; yM: Float64Array } {
  const count = offsetM.length;
  const xM = new Float64Array(count);
  const yM = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const psi = track.headingRad[i]!;
    xM[i] = track.xM[i]! - offsetM[i]! * Math.sin(psi);
    yM[i] = track.yM[i]! + offsetM[i]! * Math.cos(psi);
  }
  return { xM, yM };
}
