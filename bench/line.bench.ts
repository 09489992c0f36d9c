// Benchmark of the racing line, which every run on a track with widths now computes. Issue 18's targets, on Monza
// (5.8 km, TUM racetrack-database, LGPL v3, geometry from OpenStreetMap, read from ../shared and skipped with a
// message where absent) at 1 m: the minimum-curvature line under 0.15 s and the minimum-time line under 0.6 s of
// CPU; then the minimum-curvature line's work on the track's own grid at 2, 1 and 0.5 m, whose Gauss-Newton
// iterations must not grow with the grid and whose CPU per point per interior-point step must stay flat. Last, the
// first call in a fresh process (what every command on the default racing line pays: V8 compiles the solver's steps
// while they run) beside the second, each in child processes.

import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
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
import { linearityVerdict, machineLoad, median, medianTimes, verdict } from './stats.js';

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

const haveMonza = existsSync(path.join(openTracks, 'Monza.csv'));

/** Monza at this step, or the 5 km benchmark circuit where ../shared is absent. */
const circuit = (stepM: number): TrackGrid =>
  haveMonza
    ? openTrack('Monza', stepM)
    : trackFromSegments(
        { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
        stepM,
        'benchmark',
      );

const tarnfell = (): Car =>
  parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');

/** Processes the first call is timed in (median of their figures). */
const FIRST_CALL_PROCESSES = 3;

interface CallTiming {
  wallMs: number;
  /** CPU of every thread of the process: V8 compiles on threads beside the main one. */
  cpuMs: number;
}

/** The child's work: the time-objective line at 1 m twice, as a command computes it (its own envelope), each call's
 * wall and CPU time as one JSON line. */
function firstCallsInThisProcess(): void {
  const car = tarnfell();
  const track = circuit(1);
  const calls: CallTiming[] = [];
  for (let k = 0; k < 2; k++) {
    const cpuStart = process.cpuUsage();
    const started = performance.now();
    racingLine(track, car);
    const cpu = process.cpuUsage(cpuStart);
    calls.push({ wallMs: performance.now() - started, cpuMs: (cpu.user + cpu.system) / 1000 });
  }
  process.stdout.write(JSON.stringify(calls) + '\n');
}

/** The first and second call's medians over FIRST_CALL_PROCESSES fresh processes. */
function firstCalls(): { first: CallTiming; second: CallTiming } {
  const runs: CallTiming[][] = [];
  for (let k = 0; k < FIRST_CALL_PROCESSES; k++) {
    const child = spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--first-call'], { encoding: 'utf8' });
    if (child.status !== 0) throw new Error(`line bench child failed: ${child.stderr}`);
    runs.push(JSON.parse(child.stdout) as CallTiming[]);
  }
  const medianOf = (call: number): CallTiming => ({
    wallMs: median(runs.map((calls) => calls[call]!.wallMs)),
    cpuMs: median(runs.map((calls) => calls[call]!.cpuMs)),
  });
  return { first: medianOf(0), second: medianOf(1) };
}

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
  const car = tarnfell();
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
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

  const { first, second } = firstCalls();
  process.stdout.write(
    `line time      ${track.name} at 1 m in a fresh process (median of ${FIRST_CALL_PROCESSES}): first call ${first.wallMs.toFixed(0)} ms wall, ${first.cpuMs.toFixed(0)} ms CPU; ` +
      `second call ${second.wallMs.toFixed(0)} ms wall, ${second.cpuMs.toFixed(0)} ms CPU (first / second CPU ${(first.cpuMs / second.cpuMs).toFixed(2)} x; ${machineLoad()})\n`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href && process.argv.includes('--first-call'))
  firstCallsInThisProcess();
