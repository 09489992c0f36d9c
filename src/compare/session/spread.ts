// The spread of one quantity across the laps of a session: the sample standard deviation (n - 1 in the
// denominator; 0 for one lap). The median is the project's one (numeric/quantile.ts).

export function sampleStandardDeviation(values: readonly number[]): number {
  const n = values.length;
  if (n < 2) return 0;
  let mean = 0;
  for (const v of values) mean += v / n;
  let sum = 0;
  for (const v of values) sum += (v - mean) * (v - mean);
  return Math.sqrt(sum / (n - 1));
}
