// Series thinned for drawing: per bucket of samples, the smallest and the largest value in the order they
// occur (the min/max decimation common in plotting tools), so peaks and dips survive at a fraction of the points.

/** Indices to draw for a series of `count` samples at about `bucket` samples per bucket (≥ 1). */
export function minMaxIndices(values: ArrayLike<number>, bucket: number): number[] {
  const count = values.length;
  if (count === 0) return [];
  const size = Math.max(1, Math.floor(bucket));
  if (size <= 2) return Array.from({ length: count }, (_, i) => i);
  const indices: number[] = [];
  for (let start = 0; start < count; start += size) {
    const end = Math.min(count, start + size);
    let minIndex = start;
    let maxIndex = start;
    for (let i = start + 1; i < end; i++) {
      const value = values[i]!;
      if (value < values[minIndex]!) minIndex = i;
      if (value > values[maxIndex]!) maxIndex = i;
    }
    if (minIndex === maxIndex) indices.push(minIndex);
    else if (minIndex < maxIndex) indices.push(minIndex, maxIndex);
    else indices.push(maxIndex, minIndex);
  }
  if (indices[indices.length - 1] !== count - 1) indices.push(count - 1);
  return indices;
}

/** Every `stride`-th index, always including the last one. */
export function strideIndices(count: number, stride: number): number[] {
  const step = Math.max(1, Math.floor(stride));
  const indices: number[] = [];
  for (let i = 0; i < count; i += step) indices.push(i);
  if (count > 0 && indices[indices.length - 1] !== count - 1) indices.push(count - 1);
  return indices;
}
