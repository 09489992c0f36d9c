// Benchmark of `reflap sweep`: 1,000 setups (a 10 x 10 x 10 grid) on a 5 km circuit at 1 m step, in the main thread,
// with one worker thread and with two; target under 10 s, two workers at least 1.6 times as fast as one and never
// slower than the main thread; and a small sweep (eight setups) with the worker count left to the pool, which must
// not be slower than the main thread either (issue 18).
// Timed two ways. In a fresh process, as one `reflap sweep` runs: at about half a millisecond a run, 1,000 setups are
// 0.5 s of work, of which each worker's start and V8's compiling the solver again in it take a large share (so the
// 10,000-setup sweep is timed fresh too). The 1,000 setups are timed fresh on Monza's centreline as well, where a
// run costs about three times as much (from ../shared, skipped with a message where absent). With threads started
// once: the pool keeps its threads between sweeps, so a script's later sweeps run on threads already started and
// compiled, which is where the scaling itself shows.

import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { trackFromSegments } from '../src/track/segments.js';
import { parseCarJson } from '../src/io/read-car.js';
import { ambientFrom } from '../src/car/ambient.js';
import { airInputsOf, parseVariation } from '../src/sweep/settings.js';
import { runSweep } from '../src/sweep/run-sweep.js';
import { stopWorkerThreads } from '../src/sweep/threads.js';
import { benchmarkCircuitSegments, monzaCentreline, monzaCsv } from './simulate.bench.js';
import { availableParallelism as availableCores, loadavg } from 'node:os';
import { median, peakRssMb, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
/** Fresh processes per configuration; their medians are printed. */
const FRESH_PROCESSES = 3;
/** Sweeps per configuration on threads started once; their medians are printed. */
const KEPT_ROUNDS = 5;
/** Rounds of the small sweep, a few milliseconds each: enough that a collection in one round does not decide. */
const SMALL_ROUNDS = 21;

type Workers = number | 'pool';
/** The 5 km circuit of arcs, or Monza's centreline: a real circuit's curvature changes at every sample, so a run
 * costs about three times as much and a worker's start weighs less against it. */
type Circuit = 'arcs' | 'monza';

interface SweepTiming {
  wallS: number;
  cpuS: number;
  runs: number;
  /** The lap times, joined: every way of running a sweep must give the same. */
  digest: string;
}

function sweepInput(setups: 8 | 1000 | 10000, circuit: Circuit) {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const track =
    circuit === 'monza'
      ? monzaCentreline()!
      : trackFromSegments(
          { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
          1,
          'benchmark',
        );
  const base = { car, air: airInputsOf(ambientFrom()) };
  const grid = [
    parseVariation('massKg=-45:+45:10'),
    parseVariation('tyre.muLat=-9%:+9%:2%'),
    parseVariation('airTempC=0:45:5'),
  ];
  const variations =
    setups === 8
      ? [parseVariation('massKg=-10:+10:20'), parseVariation('tyre.muLat=-2%:+2%:4%')]
      : setups === 1000
        ? grid
        : [...grid, parseVariation('fuel.massKg=0:45:5')];
  return { track, base, variations, mode: 'grid' as const };
}

/** One sweep, wall and CPU time of the whole process (worker threads included). */
async function timeSweep(setups: 8 | 1000 | 10000, workers: Workers, circuit: Circuit = 'arcs'): Promise<SweepTiming> {
  const input = sweepInput(setups, circuit);
  const started = performance.now();
  const cpuStart = process.cpuUsage();
  const output = await runSweep(input, workers === 'pool' ? {} : { workers });
  const cpu = process.cpuUsage(cpuStart);
  const records = output.table.records;
  return {
    wallS: (performance.now() - started) / 1000,
    cpuS: (cpu.user + cpu.system) / 1e6,
    runs: records.length,
    digest: records.map((r) => r.lapTimeS).join(','),
  };
}

/** One sweep in a process of its own (this file run with --one-sweep). */
function freshSweep(setups: 1000 | 10000, workers: Workers, circuit: Circuit = 'arcs'): SweepTiming {
  const args = [fileURLToPath(import.meta.url), '--one-sweep', String(setups), String(workers), circuit];
  const child = spawnSync(process.execPath, args, { encoding: 'utf8' });
  if (child.status !== 0) throw new Error(`sweep bench child failed: ${child.stderr}`);
  return JSON.parse(child.stdout) as SweepTiming;
}

function medianTiming(timings: SweepTiming[]): SweepTiming {
  const digests = new Set(timings.map((t) => t.digest));
  if (digests.size !== 1) throw new Error('sweep results differ between runs');
  return {
    wallS: median(timings.map((t) => t.wallS)),
    cpuS: median(timings.map((t) => t.cpuS)),
    runs: timings[0]!.runs,
    digest: timings[0]!.digest,
  };
}

/** 1,000 setups in fresh processes, main thread, 1 and 2 workers and left to the pool, taken in turn so that a change
 * in the machine's load weighs on all alike. */
function freshConfigurations(circuit: Circuit) {
  const fresh: Record<string, SweepTiming[]> = { 0: [], 1: [], 2: [], pool: [] };
  for (let k = 0; k < FRESH_PROCESSES; k++)
    for (const workers of [0, 1, 2, 'pool'] as const) fresh[workers]!.push(freshSweep(1000, workers, circuit));
  const [here, one, two, chosen] = [0, 1, 2, 'pool'].map((w) => medianTiming(fresh[w]!)) as [
    SweepTiming,
    SweepTiming,
    SweepTiming,
    SweepTiming,
  ];
  if (new Set([here, one, two, chosen].map((t) => t.digest)).size !== 1)
    throw new Error('sweep results differ between worker counts');
  return { here, one, two, chosen };
}

const line = (label: string, t: SweepTiming) =>
  `  ${label.padEnd(26)} ${t.wallS.toFixed(2)} s wall, ${t.cpuS.toFixed(2)} s CPU\n`;

function freshReport(circuit: string, t: ReturnType<typeof freshConfigurations>): string {
  return (
    `sweep: ${t.here.runs} runs (1,000 grid setups + baseline) on ${circuit} at 1 m step, ` +
    `each in a fresh process (median of ${FRESH_PROCESSES})\n` +
    line('main thread', t.here) +
    line('1 worker', t.one) +
    line('2 workers', t.two) +
    line('workers left to the pool', t.chosen) +
    `  ${verdict('2 workers, wall', t.two.wallS, 10, 's')}\n` +
    `  ${verdict('speed-up of 2 workers over 1, fresh process, wall', t.one.wallS / t.two.wallS, 1.6, 'x', false)}\n` +
    `  ${verdict('speed-up of 2 workers over the main thread, fresh process, wall', t.here.wallS / t.two.wallS, 1, 'x', false)}\n` +
    `  ${verdict('left to the pool / main thread, fresh process, wall', t.chosen.wallS / t.here.wallS, 1.1, 'x')}\n`
  );
}

export async function run(): Promise<void> {
  const loadBefore = loadavg()[0]!;
  const { here, one, two, chosen } = freshConfigurations('arcs');
  const real = existsSync(monzaCsv) ? freshConfigurations('monza') : null;
  // A single 10,000-setup timing each read anywhere from 1.45x to 1.87x (two over one) in a morning's bench runs.
  const largeRuns: Record<string, SweepTiming[]> = { 1: [], 2: [], pool: [] };
  for (let k = 0; k < FRESH_PROCESSES; k++)
    for (const workers of [1, 2, 'pool'] as const) largeRuns[workers]!.push(freshSweep(10000, workers));
  const large = {
    one: medianTiming(largeRuns[1]!),
    two: medianTiming(largeRuns[2]!),
    chosen: medianTiming(largeRuns['pool']!),
  };

  // Threads started once: a first sweep starts two, then each configuration runs in turn on threads already
  // started (the main thread, likewise, has compiled the solver by then).
  await timeSweep(1000, 2);
  const kept: Record<string, SweepTiming[]> = { 0: [], 1: [], 2: [] };
  for (let k = 0; k < KEPT_ROUNDS; k++)
    for (const workers of [0, 1, 2] as const) kept[workers]!.push(await timeSweep(1000, workers));
  const [keptHere, keptOne, keptTwo] = [0, 1, 2].map((w) => medianTiming(kept[w]!));
  await stopWorkerThreads();

  const smallRounds: { here: SweepTiming[]; chosen: SweepTiming[] } = { here: [], chosen: [] };
  for (let k = 0; k < SMALL_ROUNDS; k++) {
    smallRounds.here.push(await timeSweep(8, 0));
    smallRounds.chosen.push(await timeSweep(8, 'pool'));
  }
  const small = { here: medianTiming(smallRounds.here), chosen: medianTiming(smallRounds.chosen) };
  await stopWorkerThreads();

  process.stdout.write(
    freshReport('a 5.00 km circuit of arcs', { here, one, two, chosen }) +
      `  10,000 setups (${large.one.runs} runs), fresh process (median of ${FRESH_PROCESSES}): 1 worker ${large.one.wallS.toFixed(2)} s wall, ` +
      `2 workers ${large.two.wallS.toFixed(2)} s wall, left to the pool ${large.chosen.wallS.toFixed(2)} s wall\n` +
      `  ${verdict('speed-up of 2 workers over 1 on 10,000 setups, fresh process, wall', large.one.wallS / large.two.wallS, 1.6, 'x', false)}\n` +
      (real
        ? freshReport("Monza's centreline, 5.79 km (TUM racetrack-database)", real)
        : `sweep on a real centreline: skipped (${monzaCsv} is absent)\n`) +
      `sweep of 1,000 setups on threads started once (median of ${KEPT_ROUNDS} sweeps after a first one)\n` +
      line('main thread', keptHere!) +
      line('1 worker', keptOne!) +
      line('2 workers', keptTwo!) +
      `  ${verdict('speed-up of 2 workers over 1, threads started once, wall', keptOne!.wallS / keptTwo!.wallS, 1.6, 'x', false)}\n` +
      `  ${verdict('speed-up of 2 workers over the main thread, threads started once, wall', keptHere!.wallS / keptTwo!.wallS, 1, 'x', false)}\n` +
      `  small sweep (${small.here.runs} runs, median of ${SMALL_ROUNDS}): main thread ${(small.here.wallS * 1000).toFixed(1)} ms wall, ` +
      `workers left to the pool ${(small.chosen.wallS * 1000).toFixed(1)} ms\n` +
      `  ${verdict('small sweep, left to the pool / main thread, wall', small.chosen.wallS / small.here.wallS, 1.25, 'x')}\n` +
      `  (the scaling holds only on an otherwise idle machine: load ${loadBefore.toFixed(1)} before, ` +
      `${loadavg()[0]!.toFixed(1)} after on ${availableCores()} cores)\n` +
      `  peak RSS   ${peakRssMb().toFixed(0)} MB (this process)\n`,
  );
}

if (
  process.argv[1] &&
  import.meta.url === pathToFileURL(process.argv[1]).href &&
  process.argv.includes('--one-sweep')
) {
  const [setups, workers, circuit] = process.argv.slice(process.argv.indexOf('--one-sweep') + 1);
  const timing = await timeSweep(
    Number(setups) as 1000 | 10000,
    workers === 'pool' ? 'pool' : Number(workers),
    circuit as Circuit,
  );
  process.stdout.write(JSON.stringify(timing) + '\n');
}
