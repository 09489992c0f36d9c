// Linear scales and round-number axis ticks for the report's charts. niceTicks is self-contained on purpose:
// the page's script embeds its compiled source (Function.prototype.toString), so server and browser agree.

import { quantileSorted } from '../../numeric/quantile.js';

export interface LinearScale {
  (value: number): number;
  domain: readonly [number, number];
  range: readonly [number, number];
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0 || 1;
  const scale = ((value: number) => r0 + ((value - d0) / span) * (r1 - r0)) as LinearScale;
  scale.domain = domain;
  scale.range = range;
  return scale;
}

/** About `count` ticks on 1, 2 or 5 times a power of ten covering [start, stop] (common practice, as in d3-array's ticks). */
export function niceTicks(start: number, stop: number, count: number): number[] {
  if (!(stop > start) || !(count > 0)) return [start];
  const rawStep = (stop - start) / count;
  const power = Math.pow(10, Math.floor(Math.log10(rawStep)));
  const ratio = rawStep / power;
  // Thresholds at the geometric middles sqrt(50), sqrt(10), sqrt(2), as d3-array's tickIncrement uses.
  const step = (ratio >= Math.sqrt(50) ? 10 : ratio >= Math.sqrt(10) ? 5 : ratio >= Math.sqrt(2) ? 2 : 1) * power;
  const ticks: number[] = [];
  const first = Math.ceil(start / step - 1e-9);
  const last = Math.floor(stop / step + 1e-9);
  for (let k = first; k <= last; k++) ticks.push(Number((k * step).toPrecision(12)));
  return ticks;
}

/** A domain widened to round numbers and a margin, for a y axis. */
export function paddedDomain(min: number, max: number, paddingShare = 0.05): [number, number] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [0, 1];
  if (max - min < 1e-9) return [min - 1, max + 1];
  const pad = (max - min) * paddingShare;
  return [min - pad, max + pad];
}

/** Number text for SVG coordinates: one decimal, no trailing zero. */
export function coord(value: number): string {
  const rounded = Math.round(value * 10) / 10;
  return Object.is(rounded, -0) ? '0' : String(rounded);
}

/** The quantile `share` of the finite samples (numeric/quantile.ts), for axis ranges that ignore a few spikes. */
export function quantileOf(series: (ArrayLike<number> | null | undefined)[], share: number, absolute = false): number {
  const values: number[] = [];
  for (const values_ of series) {
    if (!values_) continue;
    for (let i = 0; i < values_.length; i++) {
      const v = absolute ? Math.abs(values_[i]!) : values_[i]!;
      if (Number.isFinite(v)) values.push(v);
    }
  }
  values.sort((a, b) => a - b);
  return quantileSorted(values, share);
}
