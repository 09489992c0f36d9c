// Benchmark of the racing line: a 5 km circuit at 2 m spacing (about 2,500 points), curvature and time
// objectives (targets: under 2 s and under 20 s), then the curvature objective at 1 m and 0.5 m to show that
// time and memory grow linearly with the number of points. A real circuit from ../shared (TUM
// racetrack-database, LGPL v3, OpenStreetMap geometry) is timed too when present.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { trackFromSegments } from '../src/track/segments.js';
import { readTrackFile } from '../src/io/read-track.js';
import { parseCarJson } from '../src/io/read-car.js';
import { buildEnvelope } from '../src/car/build-envelope.js';
import { ambientFrom } from '../src/car/ambient.js';
import { racingLine } from '../src/line/racing-line.js';
import type { TrackGrid } from '../src/track/types.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { medianTimeMs } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

// Each run is seconds long, so no warm-up runs beyond the one below.
const timeRuns = (work: () => void, runs: number): number => medianTimeMs(work, runs, 0);

const gc = (globalThis as { gc?: () => void }).gc;
const mb = (bytes: number) => (bytes / 1024 / 1024).toFixed(1);

export async function run(): Promise<void> {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const circuit = (stepM: number) =>
    trackFromSegments(
      { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
      stepM,
      'benchmark',
    );
  const report = (label: string, track: TrackGrid, runs: number, objectives: ('curvature' | 'time')[]) => {
    for (const objective of objectives) {
      let lapS = 0;
      let centreS = 0;
      let laps = 0;
      const ms = timeRuns(() => {
        const line = racingLine(track, car, { objective, ambient, envelope });
        lapS = line.lap.lapTimeS;
        centreS = line.centrelineLap.lapTimeS;
        laps = line.lapEvaluations;
      }, runs);
      const target = objective === 'curvature' ? 2000 : 20000;
      process.stdout.write(
        `line ${objective.padEnd(9)} ${label}, ${(track.lengthM / 1000).toFixed(2)} km, ${track.distanceM.length} points: median ${ms.toFixed(0)} ms` +
          ` (target < ${target / 1000} s at ~2,500 points); lap ${lapS.toFixed(3)} s vs centreline ${centreS.toFixed(3)} s, ${laps} laps driven\n`,
      );
    }
  };
  racingLine(circuit(4), car, { objective: 'time', ambient, envelope }); // warm-up
  report('benchmark circuit at 2 m', circuit(2), 5, ['curvature', 'time']);

  const openTracks = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks');
  const catalunya = path.join(openTracks, 'Catalunya.csv');
  if (existsSync(catalunya)) {
    const track = readTrackFile(catalunya, {
      stepM: 2,
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    report('Catalunya (TUM racetrack-database) at 2 m', track, 3, ['curvature', 'time']);
  } else {
    process.stdout.write(`(open-track timing skipped: ${openTracks} is absent)\n`);
  }

  // Linear growth: time per point and the memory the curvature line needs, at 2, 1 and 0.5 m.
  for (const stepM of [2, 1, 0.5]) {
    const track = circuit(stepM);
    gc?.();
    const before = process.memoryUsage();
    let peakHeap = before.heapUsed;
    const ms = timeRuns(() => {
      const line = racingLine(track, car, { objective: 'curvature', ambient, envelope });
      peakHeap = Math.max(peakHeap, process.memoryUsage().heapUsed);
      if (!Number.isFinite(line.lengthM)) throw new Error('no line');
    }, 3);
    const after = process.memoryUsage();
    process.stdout.write(
      `curvature line at ${stepM} m (${track.distanceM.length} points): median ${ms.toFixed(0)} ms, ${((ms * 1e6) / track.distanceM.length / 1000).toFixed(1)} us per point;` +
        ` heap before ${mb(before.heapUsed)} MB, highest seen ${mb(peakHeap)} MB, rss ${mb(after.rss)} MB\n`,
    );
  }
}
