// Small timing helpers shared by the benchmarks. Every figure is printed as wall time beside CPU time: the machine
// is often shared, and CPU time is what the work itself cost whatever else runs.

import { readFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 ? sorted[middle]! : 0.5 * (sorted[middle - 1]! + sorted[middle]!);
}

/** Runs `work` after `warmup` unmeasured runs and returns the median of `runs` timed runs, ms. */
export function medianTimeMs(work: () => void, runs = 20, warmup = 5): number {
  return medianTimes(work, runs, warmup).wallMs;
}

export interface Timing {
  /** Median wall time of one run, ms. */
  wallMs: number;
  /** Median CPU time (user + system, this process and its threads) of one run, ms. */
  cpuMs: number;
}

/** Runs `work` after `warmup` unmeasured runs; the medians of `runs` timed runs, wall and CPU. */
export function medianTimes(work: () => void, runs = 20, warmup = 5): Timing {
  for (let k = 0; k < warmup; k++) work();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let k = 0; k < runs; k++) {
    const cpuStart = process.cpuUsage();
    const start = process.hrtime.bigint();
    work();
    wall.push(Number(process.hrtime.bigint() - start) / 1e6);
    const used = process.cpuUsage(cpuStart);
    cpu.push((used.user + used.system) / 1000);
  }
  return { wallMs: median(wall), cpuMs: median(cpu) };
}

/** Median wall and CPU times of two pieces of work timed in turn, run for run, so that a shared machine's load
 * weighs on both alike when they are compared (one after the other, a change of load between them reads as a cost). */
export function pairedMedianTimes(first: () => void, second: () => void, runs = 20, warmup = 5): [Timing, Timing] {
  for (let k = 0; k < warmup; k++) {
    first();
    second();
  }
  const samples = [first, second].map(() => ({ wall: [] as number[], cpu: [] as number[] }));
  for (let k = 0; k < runs; k++)
    [first, second].forEach((work, j) => {
      const cpuStart = process.cpuUsage();
      const start = process.hrtime.bigint();
      work();
      samples[j]!.wall.push(Number(process.hrtime.bigint() - start) / 1e6);
      const used = process.cpuUsage(cpuStart);
      samples[j]!.cpu.push((used.user + used.system) / 1000);
    });
  const [a, b] = samples.map(({ wall, cpu }) => ({ wallMs: median(wall), cpuMs: median(cpu) }));
  return [a!, b!];
}

/** Wall and CPU time of one awaited piece of work, ms. */
export async function timeOnce<T>(work: () => Promise<T> | T): Promise<{ value: T } & Timing> {
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  const value = await work();
  const wallMs = performance.now() - start;
  const used = process.cpuUsage(cpuStart);
  return { value, wallMs, cpuMs: (used.user + used.system) / 1000 };
}

/** CPU seconds used so far by this process's finished children (Linux /proc; null elsewhere). */
export function childCpuS(): number | null {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    // Fields after the command name (which may hold spaces) start at "state"; cutime and cstime are fields 16-17.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticksPerS = 100; // USER_HZ, 100 on every Linux architecture Node runs on
    return (Number(fields[13]) + Number(fields[14])) / ticksPerS;
  } catch {
    return null;
  }
}

/** The verdict on a target: the figure, the target, and whether it was met, computed from the numbers. */
export function verdict(label: string, value: number, limit: number, unit: string, below = true): string {
  const met = below ? value < limit : value >= limit;
  return `${label} ${value.toFixed(value < 10 ? 2 : 0)} ${unit} (target ${below ? '<' : '>='} ${limit} ${unit}): ${met ? 'met' : 'NOT met'}`;
}

/** Linear cost judged from CPU time per point at two sizes: within 25 % of each other (common practice, no source). */
export function linearityVerdict(costPerPointNs: number[]): string {
  const low = Math.min(...costPerPointNs);
  const high = Math.max(...costPerPointNs);
  const spread = high / low - 1;
  return `CPU cost per point ${costPerPointNs.map((ns) => ns.toFixed(0)).join(' and ')} ns: ${spread <= 0.25 ? 'linear' : 'NOT linear'} (spread ${(100 * spread).toFixed(0)} %, linear within 25 %)`;
}

export function machineLoad(): string {
  return `load average ${loadavg()[0]!.toFixed(1)} on ${cpus().length} cores`;
}

export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}
