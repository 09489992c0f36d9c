// Memory of one fine lap: a 5 km circuit at 0.1 m step (about 50,000 points) simulated with every channel, in a
// fresh process so that the figure is the lap's own peak resident memory and not what earlier benchmarks left.
// Target (issue 18): under 120 MB RSS.

import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { trackFromSegments } from '../src/track/segments.js';
import { parseCarJson } from '../src/io/read-car.js';
import { simulate } from '../src/solve/simulate.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { machineLoad, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
const STEP_M = 0.1;

/** The child's work: one lap, then its own peak RSS and CPU time as one JSON line. */
function lapInThisProcess(): void {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const cpuStart = process.cpuUsage();
  const track = trackFromSegments(
    { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
    STEP_M,
    'benchmark',
  );
  const lap = simulate(track, car);
  const cpu = process.cpuUsage(cpuStart);
  process.stdout.write(
    JSON.stringify({
      points: track.distanceM.length,
      lengthM: track.lengthM,
      lapTimeS: lap.lapTimeS,
      cpuMs: (cpu.user + cpu.system) / 1000,
      maxRssMb: process.resourceUsage().maxRSS / 1024,
    }) + '\n',
  );
}

export async function run(): Promise<void> {
  const started = performance.now();
  const child = spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--lap'], { encoding: 'utf8' });
  const wallMs = performance.now() - started;
  if (child.status !== 0) throw new Error(`memory bench child failed: ${child.stderr}`);
  const figures = JSON.parse(child.stdout) as {
    points: number;
    lengthM: number;
    lapTimeS: number;
    cpuMs: number;
    maxRssMb: number;
  };
  process.stdout.write(
    `one lap of ${(figures.lengthM / 1000).toFixed(2)} km at ${STEP_M} m (${figures.points} points), every channel, in a fresh process: ` +
      `track + lap ${figures.cpuMs.toFixed(0)} ms CPU, whole process ${wallMs.toFixed(0)} ms wall; lap ${figures.lapTimeS.toFixed(3)} s\n` +
      `  ${verdict('peak RSS', figures.maxRssMb, 120, 'MB')}; ${machineLoad()}\n`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href && process.argv.includes('--lap'))
  lapInThisProcess();
