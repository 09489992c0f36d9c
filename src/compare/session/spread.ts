// Summary figures of one quantity across the laps of a session: the median (mean of the two middle values for an
// even count) and the spread as the sample standard deviation (n - 1 in the denominator; 0 for one lap).

export function medianOfList(values: readonly number[]): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

export function sampleStandardDeviation(values: readonly number[]): number {
  const n = values.length;
  if (n < 2) return 0;
  let mean = 0;
  for (const v of values) mean += v / n;
  let sum = 0;
  for (const v of values) sum += (v - mean) * (v - mean);
  return Math.sqrt(sum / (n - 1));
}
