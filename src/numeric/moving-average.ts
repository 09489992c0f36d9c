// Centred moving average on a sample grid (running sum, linear time): the light smoothing used for curvature
// and logged channels before features are picked from them.

import { wrapIndex } from './lap-index.js';

/** Centred moving average over +-half samples; wraps around on a closed lap. Linear time (running sum). */
export function movingAverage(values: Float64Array, half: number, cyclic: boolean): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  if (half <= 0 || n < 3) {
    out.set(values);
    return out;
  }
  if (cyclic) {
    const width = 2 * half + 1;
    let sum = 0;
    for (let k = -half; k <= half; k++) sum += values[wrapIndex(k, n)]!;
    for (let i = 0; i < n; i++) {
      out[i] = sum / width;
      sum += values[(i + half + 1) % n]! - values[wrapIndex(i - half, n)]!;
    }
    return out;
  }
  // Open ends: the window shrinks symmetrically so the ends are not pulled.
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i]! + values[i]!;
  for (let i = 0; i < n; i++) {
    const h = Math.min(half, i, n - 1 - i);
    out[i] = (prefix[i + h + 1]! - prefix[i - h]!) / (2 * h + 1);
  }
  return out;
}
