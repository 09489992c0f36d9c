// Benchmark of `reflap sweep`: 1,000 setups (a 10 x 10 x 10 grid) on a 5 km circuit at 1 m step, in the main thread,
// with one worker thread and with two; target under 10 s, two workers at least 1.6 times as fast as one and never
// slower than the main thread; and a small sweep (eight setups) with the worker count left to the pool, which must
// not be slower than the main thread either (issue 18). At about half a millisecond a run, 1,000 setups are 0.5 s of
// work, of which the workers' start and V8's compiling the solver again in each take a large share; the scaling of
// two workers over one is also timed on 10,000 setups, where the runs are most of the time.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { trackFromSegments } from '../src/track/segments.js';
import { parseCarJson } from '../src/io/read-car.js';
import { ambientFrom } from '../src/car/ambient.js';
import { airInputsOf, parseVariation } from '../src/sweep/settings.js';
import { runSweep } from '../src/sweep/run-sweep.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { availableParallelism as availableCores, loadavg } from 'node:os';
import { peakRssMb, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export async function run(): Promise<void> {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const track = trackFromSegments(
    { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
    1,
    'benchmark',
  );
  const base = { car, air: airInputsOf(ambientFrom()) };
  const variations = [
    parseVariation('massKg=-45:+45:10'),
    parseVariation('tyre.muLat=-9%:+9%:2%'),
    parseVariation('airTempC=0:45:5'),
  ];
  const times: Record<number, number> = {};
  const cpuS: Record<number, number> = {};
  const loadBefore = loadavg()[0]!;
  let runs = 0;
  let csvCheck = '';
  for (const workers of [0, 1, 2]) {
    const started = performance.now();
    const cpuStart = process.cpuUsage();
    const output = await runSweep({ track, base, variations, mode: 'grid' }, { workers });
    times[workers] = (performance.now() - started) / 1000;
    // CPU time of the whole process, worker threads included: what the runs cost whatever else the machine does.
    const cpu = process.cpuUsage(cpuStart);
    cpuS[workers] = (cpu.user + cpu.system) / 1e6;
    runs = output.table.records.length;
    const digest = output.table.records.map((r) => r.lapTimeS).join(',');
    if (csvCheck && csvCheck !== digest) throw new Error('sweep results differ between worker counts');
    csvCheck = digest;
  }
  const ratio = times[1]! / times[2]!;
  const chosenStarted = performance.now();
  await runSweep({ track, base, variations, mode: 'grid' }, {});
  const chosenS = (performance.now() - chosenStarted) / 1000;
  const small = [parseVariation('massKg=-10:+10:20'), parseVariation('tyre.muLat=-2%:+2%:4%')];
  const smallTimes = [0, undefined].map((workers) => {
    const started = performance.now();
    return runSweep({ track, base, variations: small, mode: 'grid' }, workers === 0 ? { workers } : {}).then(
      (output) => ({ runs: output.table.records.length, wallS: (performance.now() - started) / 1000 }),
    );
  });
  const [smallHere, smallChosen] = [await smallTimes[0]!, await smallTimes[1]!];
  // Ten times the setups: where the runs, not the workers' start and warm-up, are most of the time.
  const large = [...variations, parseVariation('fuel.massKg=0:45:5')];
  const largeS: Record<number, number> = {};
  let largeRuns = 0;
  for (const workers of [1, 2]) {
    const started = performance.now();
    largeRuns = (await runSweep({ track, base, variations: large, mode: 'grid' }, { workers })).table.records.length;
    largeS[workers] = (performance.now() - started) / 1000;
  }
  process.stdout.write(
    `sweep: ${runs} runs (1,000 grid setups + baseline and difference pairs) on ${(track.lengthM / 1000).toFixed(2)} km at 1 m step\n` +
      `  1 worker   ${times[1]!.toFixed(2)} s wall, ${cpuS[1]!.toFixed(2)} s CPU (${((cpuS[1]! * 1000) / runs).toFixed(2)} ms CPU per run)\n` +
      `  2 workers  ${times[2]!.toFixed(2)} s wall, ${cpuS[2]!.toFixed(2)} s CPU\n` +
      `  main thread ${times[0]!.toFixed(2)} s wall, ${cpuS[0]!.toFixed(2)} s CPU\n` +
      `  ${verdict('speed-up of 2 workers over the main thread, wall', times[0]! / times[2]!, 1, 'x', false)}\n` +
      `  workers left to the pool ${chosenS.toFixed(2)} s wall\n` +
      `  ${verdict('left to the pool / main thread, wall', chosenS / times[0]!, 1.1, 'x')}\n` +
      `  small sweep (${smallHere.runs} runs): main thread ${smallHere.wallS.toFixed(2)} s wall, workers left to the pool ${smallChosen.wallS.toFixed(2)} s\n` +
      `  ${verdict('small sweep, left to the pool / main thread, wall', smallChosen.wallS / smallHere.wallS, 1.25, 'x')}\n` +
      `  ${verdict('2 workers, wall', times[2]!, 10, 's')}\n` +
      `  ${verdict('speed-up of 2 workers over 1, wall', ratio, 1.6, 'x', false)}` +
      ` (holds only on an otherwise idle machine: load ${loadBefore.toFixed(1)} before, ${loadavg()[0]!.toFixed(1)} after on ${availableCores()} cores)\n` +
      `  ${largeRuns} runs (10,000 setups): 1 worker ${largeS[1]!.toFixed(2)} s wall, 2 workers ${largeS[2]!.toFixed(2)} s wall\n` +
      `  ${verdict('speed-up of 2 workers over 1 on 10,000 setups, wall', largeS[1]! / largeS[2]!, 1.6, 'x', false)}\n` +
      `  peak RSS   ${peakRssMb().toFixed(0)} MB (main thread's process)\n`,
  );
}
