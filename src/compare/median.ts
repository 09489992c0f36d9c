// The median of a long channel, from an even sample of at most about 50 000 of its values (a nearest-rank
// median: the upper middle value), so that a log of millions of samples costs one small sort.

export function medianOf(values: Float64Array): number {
  if (values.length === 0) return NaN;
  const step = Math.max(1, Math.floor(values.length / 50000));
  const sample: number[] = [];
  for (let i = 0; i < values.length; i += step) sample.push(values[i]!);
  sample.sort((a, b) => a - b);
  return sample[sample.length >> 1]!;
}
