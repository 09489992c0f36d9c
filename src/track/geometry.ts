// Differential geometry of a sampled plane curve: heading and signed curvature by central differences
// (kappa = (x'y'' - y'x'') / (x'^2 + y'^2)^1.5, any parametrisation; do Carmo, Differential Geometry of Curves
// and Surfaces, 1.5), arc length, and linear resampling onto a uniform distance grid. Linear cost throughout.

import { lerp } from '../numeric/interpolate.js';

/** Wraps an angle difference into (-pi, pi]. */
export function wrapAngleRad(angleRad: number): number {
  return angleRad - 2 * Math.PI * Math.ceil((angleRad - Math.PI) / (2 * Math.PI));
}

/**
 * Heading (unwrapped, rad) and curvature (1/m, positive = left) of points sampled at equal parameter steps.
 * Closed curves wrap round; open ends use second-order one-sided differences.
 */
export function headingAndCurvature(
  x: Float64Array,
  y: Float64Array,
  closed: boolean,
  outHeadingRad: Float64Array,
  outCurvaturePerM: Float64Array,
): void {
  const n = x.length;
  for (let i = 0; i < n; i++) {
    let dx: number, dy: number, ddx: number, ddy: number;
    if (closed || (i > 0 && i < n - 1)) {
      const p = i === 0 ? n - 1 : i - 1;
      const q = i === n - 1 ? 0 : i + 1;
      dx = 0.5 * (x[q]! - x[p]!);
      dy = 0.5 * (y[q]! - y[p]!);
      ddx = x[q]! - 2 * x[i]! + x[p]!;
      ddy = y[q]! - 2 * y[i]! + y[p]!;
    } else if (i === 0) {
      dx = 0.5 * (-3 * x[0]! + 4 * x[1]! - x[2]!);
      dy = 0.5 * (-3 * y[0]! + 4 * y[1]! - y[2]!);
      ddx = 2 * x[0]! - 5 * x[1]! + 4 * x[2]! - x[3]!;
      ddy = 2 * y[0]! - 5 * y[1]! + 4 * y[2]! - y[3]!;
    } else {
      dx = 0.5 * (3 * x[i]! - 4 * x[i - 1]! + x[i - 2]!);
      dy = 0.5 * (3 * y[i]! - 4 * y[i - 1]! + y[i - 2]!);
      ddx = 2 * x[i]! - 5 * x[i - 1]! + 4 * x[i - 2]! - x[i - 3]!;
      ddy = 2 * y[i]! - 5 * y[i - 1]! + 4 * y[i - 2]! - y[i - 3]!;
    }
    const speed2 = dx * dx + dy * dy;
    outCurvaturePerM[i] = (dx * ddy - dy * ddx) / (speed2 * Math.sqrt(speed2));
    const heading = Math.atan2(dy, dx);
    outHeadingRad[i] = i === 0 ? heading : outHeadingRad[i - 1]! + wrapAngleRad(heading - outHeadingRad[i - 1]!);
  }
}

/**
 * Cumulative arc length at each point (0 at the first) and the total (to the first point again when closed).
 * Each chord c is lengthened to the arc of a circle of the mean curvature, c (1 + (kappa c)^2 / 24).
 */
export function arcLengths(
  x: Float64Array,
  y: Float64Array,
  curvaturePerM: Float64Array,
  closed: boolean,
): { distanceM: Float64Array; totalM: number } {
  const n = x.length;
  const distanceM = new Float64Array(n);
  let total = 0;
  const count = closed ? n : n - 1;
  for (let i = 0; i < count; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const chord = Math.hypot(x[j]! - x[i]!, y[j]! - y[i]!);
    const kc = 0.5 * (curvaturePerM[i]! + curvaturePerM[j]!) * chord;
    total += chord * (1 + (kc * kc) / 24);
    if (j !== 0) distanceM[j] = total;
  }
  return { distanceM, totalM: total };
}

export interface ResampleChannel {
  values: Float64Array;
  out: Float64Array;
  /** Closed curves: the value after a full lap is values[0] + lapOffset (the heading's total turning). */
  lapOffset?: number;
}

/**
 * Linearly interpolates channels given at increasing distances sourceDistanceM (first = 0, total totalM) onto
 * the uniform grid i * stepM, i = 0..count-1. One forward pass.
 */
export function resampleLinear(
  sourceDistanceM: Float64Array,
  totalM: number,
  closed: boolean,
  stepM: number,
  count: number,
  channels: ResampleChannel[],
): void {
  const m = sourceDistanceM.length;
  let j = 0;
  for (let i = 0; i < count; i++) {
    const s = Math.min(i * stepM, totalM);
    while (j < m - 2 && sourceDistanceM[j + 1]! <= s) j++;
    if (j === m - 2 && closed && sourceDistanceM[m - 1]! <= s) j = m - 1;
    const wraps = j === m - 1;
    const s0 = sourceDistanceM[j]!;
    const s1 = wraps ? totalM : sourceDistanceM[j + 1]!;
    const f = s1 > s0 ? (s - s0) / (s1 - s0) : 0;
    for (const channel of channels) {
      const v0 = channel.values[j]!;
      const v1 = wraps ? channel.values[0]! + (channel.lapOffset ?? 0) : channel.values[j + 1]!;
      channel.out[i] = lerp(v0, v1, f);
    }
  }
}
