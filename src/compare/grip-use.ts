// Grip use over a corner (the logged acceleration's share of the envelope's limit): its mean and smoothed peak, and
// the stretches where the driver leaves grip unused while the reference is on the limit, or exceeds the envelope.

import type { GripStretch } from './types.js';
import type { CompareOptions } from './compare-options.js';
import { wrapIndex } from '../numeric/lap-index.js';

export function gripFigures(
  raw: Float64Array,
  smooth: Float64Array,
  from: number,
  to: number,
  n: number,
): { mean: number; peak: number } {
  let sum = 0;
  let peak = 0;
  let count = 0;
  for (let u = from; u <= to; u++) {
    const i = wrapIndex(u, n);
    const value = raw[i]!;
    if (!Number.isFinite(value)) continue;
    sum += value;
    count++;
    if (smooth[i]! > peak) peak = smooth[i]!;
  }
  return { mean: count > 0 ? sum / count : 0, peak };
}

export function gripStretches(
  driverSmooth: Float64Array,
  referenceGrip: Float64Array,
  from: number,
  to: number,
  n: number,
  step: number,
  fold: (u: number) => number,
  settings: CompareOptions,
): GripStretch[] {
  const stretches: GripStretch[] = [];
  const minSamples = Math.max(1, Math.round(settings.minStretchM / step));
  let kind: GripStretch['kind'] | null = null;
  let start = from;
  let sum = 0;
  const close = (end: number) => {
    if (kind && end - start >= minSamples)
      stretches.push({
        startM: fold(start),
        endM: fold(end),
        kind,
        meanGripUse: sum / (end - start),
        lengthM: (end - start) * step,
      });
  };
  for (let u = from; u <= to; u++) {
    const i = wrapIndex(u, n);
    const driverUse = driverSmooth[i]!;
    const current: GripStretch['kind'] | null =
      u === to
        ? null
        : driverUse > Math.max(settings.exceededAbove, referenceGrip[i]! + settings.exceededAbove - 1)
          ? 'exceeded'
          : driverUse < settings.unusedBelow && referenceGrip[i]! >= settings.referenceOnLimit
            ? 'unused'
            : null;
    if (current !== kind) {
      close(u);
      kind = current;
      start = u;
      sum = 0;
    }
    if (kind) sum += driverUse;
  }
  return stretches;
}
