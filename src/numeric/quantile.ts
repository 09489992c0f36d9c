// Quantiles and the median, one definition for the project: linear interpolation between order statistics,
// Hyndman and Fan (1996) type 7 (the default of R and NumPy). Its median is the middle value of an odd count and
// the mean of the two middle values of an even count, the textbook median, which favours neither side.

/** Quantile q (0-1) of values sorted in increasing order; NaN when there are none. */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const count = sorted.length;
  if (count === 0) return NaN;
  const position = (count - 1) * q;
  const lo = Math.floor(position);
  const hi = Math.min(count - 1, lo + 1);
  return sorted[lo]! + (position - lo) * (sorted[hi]! - sorted[lo]!);
}

/** Median of values in any order (a sorted copy; the input is left as it is); NaN when there are none. */
export function median(values: ArrayLike<number>): number {
  return quantileSorted(Float64Array.from(values).sort(), 0.5);
}

/** Values kept from a long channel for its median: an even sample of at most about this many. */
const MEDIAN_SAMPLE = 50_000;

/** Median of a long channel from an even sample of it, so that a log of millions of samples costs one small sort. */
export function sampledMedian(values: ArrayLike<number>): number {
  const step = Math.max(1, Math.floor(values.length / MEDIAN_SAMPLE));
  const sample = new Float64Array(Math.ceil(values.length / step));
  for (let i = 0, k = 0; i < values.length; i += step, k++) sample[k] = values[i]!;
  return median(sample);
}
