// Benchmark of the racing line, which every run on a track with widths now computes. Issue 18's targets, on Monza
// (5.8 km, TUM racetrack-database, LGPL v3, geometry from OpenStreetMap, read from ../shared and skipped with a
// message where absent) at 1 m: the minimum-curvature line under 0.15 s and the minimum-time line under 0.6 s of
// CPU; then the minimum-curvature line's work on the track's own grid at 2, 1 and 0.5 m, whose Gauss-Newton
// iterations must not grow with the grid and whose CPU per point per interior-point step must stay flat.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { trackFromSegments } from '../src/track/segments.js';
import { readTrackFile } from '../src/io/read-track.js';
import { parseCarJson } from '../src/io/read-car.js';
import { buildEnvelope } from '../src/car/build-envelope.js';
import { ambientFrom } from '../src/car/ambient.js';
import { racingLine } from '../src/line/racing-line.js';
import { corridorOf, defaultMarginM } from '../src/line/corridor.js';
import { coarseLevel, prolongOffsets } from '../src/line/coarse-track.js';
import { minimumCurvatureOffsets } from '../src/line/min-curvature.js';
import type { TrackGrid } from '../src/track/types.js';
import type { Car } from '../src/car/types.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { linearityVerdict, machineLoad, medianTimes, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
const openTracks = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks');

const openTrack = (name: string, stepM: number): TrackGrid =>
  readTrackFile(path.join(openTracks, `${name}.csv`), {
    stepM,
    columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
    widthM: null,
    layout: 'auto',
    smoothingM: null,
  });

/** The minimum-curvature line's last stage, on the track's own grid from the coarse grid's line: Gauss-Newton
 * iterations, interior-point steps, and CPU per point per step. */
function fineStage(
  track: TrackGrid,
  car: Car,
): { iterations: number; qpSteps: number; cpuMs: number; nsPerPointStep: number } {
  const marginM = defaultMarginM(car);
  const corridor = corridorOf(track, marginM);
  const coarse = coarseLevel(track, marginM);
  const start = coarse
    ? prolongOffsets(track, corridor, coarse.track, minimumCurvatureOffsets(coarse.track, coarse.corridor).offsetM)
    : undefined;
  let iterations = 0;
  let qpSteps = 0;
  const timing = medianTimes(
    () => {
      ({ iterations, qpSteps } = minimumCurvatureOffsets(track, corridor, start));
    },
    3,
    1,
  );
  const points = track.distanceM.length;
  return { iterations, qpSteps, cpuMs: timing.cpuMs, nsPerPointStep: (timing.cpuMs * 1e6) / points / qpSteps };
}

export async function run(): Promise<void> {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const haveMonza = existsSync(path.join(openTracks, 'Monza.csv'));
  const circuit = (stepM: number): TrackGrid =>
    haveMonza
      ? openTrack('Monza', stepM)
      : trackFromSegments(
          { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
          stepM,
          'benchmark',
        );
  if (!haveMonza)
    process.stdout.write(`(Monza skipped: ${openTracks} is absent; the 5 km benchmark circuit stands in)\n`);

  const track = circuit(1);
  racingLine(circuit(4), car, { objective: 'time', ambient, envelope }); // warm-up
  const targets = { curvature: 150, time: 600 } as const;
  for (const objective of ['curvature', 'time'] as const) {
    let lapS = 0;
    let centreS = 0;
    let laps = 0;
    const timing = medianTimes(
      () => {
        const line = racingLine(track, car, { objective, ambient, envelope });
        lapS = line.lap.lapTimeS;
        centreS = line.centrelineLap.lapTimeS;
        laps = line.lapEvaluations;
      },
      5,
      1,
    );
    process.stdout.write(
      `line ${objective.padEnd(9)} ${track.name} at 1 m, ${(track.lengthM / 1000).toFixed(2)} km, ${track.distanceM.length} points: ` +
        `median ${timing.wallMs.toFixed(0)} ms wall, ${timing.cpuMs.toFixed(0)} ms CPU; lap ${lapS.toFixed(3)} s vs centreline ${centreS.toFixed(3)} s, ${laps} laps driven\n`,
    );
    process.stdout.write(
      `  ${verdict('CPU', timing.cpuMs, targets[objective], 'ms')}; ${verdict('wall', timing.wallMs, targets[objective], 'ms')}\n`,
    );
  }

  // The last stage's iterations and its CPU per point per iteration at 2, 1 and 0.5 m.
  const stages = [2, 1, 0.5].map((stepM) => {
    const grid = circuit(stepM);
    const stage = fineStage(grid, car);
    process.stdout.write(
      `curvature line on the ${stepM} m grid (${grid.distanceM.length} points, warm start from the coarse grid): ` +
        `${stage.iterations} iterations (${stage.qpSteps} interior-point steps), ${stage.cpuMs.toFixed(0)} ms CPU, ${stage.nsPerPointStep.toFixed(0)} ns per point per step\n`,
    );
    return stage;
  });
  const iterations = stages.map((s) => s.iterations);
  // Not growing: the finest grid needs no more iterations than the coarsest plus one (common practice, no source).
  const flat = iterations[2]! <= iterations[0]! + 1;
  process.stdout.write(
    `  iterations ${iterations.join(', ')} at 2, 1, 0.5 m: ${flat ? 'not growing with the grid' : 'GROWING with the grid'} (target: at 0.5 m at most one more than at 2 m)\n`,
  );
  process.stdout.write(`  ${linearityVerdict(stages.map((s) => s.nsPerPointStep))}; ${machineLoad()}\n`);
}
