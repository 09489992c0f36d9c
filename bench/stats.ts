// Small timing helpers shared by the benchmarks.

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 ? sorted[middle]! : 0.5 * (sorted[middle - 1]! + sorted[middle]!);
}

/** Runs `work` after `warmup` unmeasured runs and returns the median of `runs` timed runs, ms. */
export function medianTimeMs(work: () => void, runs = 20, warmup = 5): number {
  for (let k = 0; k < warmup; k++) work();
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    const start = process.hrtime.bigint();
    work();
    times.push(Number(process.hrtime.bigint() - start) / 1e6);
  }
  return median(times);
}

export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}
