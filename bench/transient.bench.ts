// Benchmark of the transient check: the single-track model integrated with odex over a 5 km lap while the
// driver model follows the reference (target under 5 s per lap), median of 5 runs after one warm-up.
// Also a real circuit centreline where ../shared is present (TUM racetrack-database, geometry from OpenStreetMap, ODbL).

import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import { trackFromSegments } from '../src/track/segments.js';
import { readTrackFile } from '../src/io/read-track.js';
import { parseColumnMapping } from '../src/io/columns.js';
import { parseCarJson } from '../src/io/read-car.js';
import { simulate } from '../src/solve/simulate.js';
import { ambientFrom } from '../src/car/ambient.js';
import { checkTransient, type TransientCheck } from '../src/solve/transient.js';
import type { TrackGrid } from '../src/track/types.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { machineLoad, medianTimes, peakRssMb, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

function benchOne(label: string, track: TrackGrid): void {
  const car = {
    ...parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json'),
    model: 'bicycle' as const,
  };
  const ambient = ambientFrom();
  const lap = simulate(track, car, { ambient });
  let check: TransientCheck | null = null;
  const timing = medianTimes(
    () => {
      check = checkTransient(lap, car, { ambient });
    },
    5,
    1,
  );
  const c = check! as TransientCheck;
  process.stdout.write(
    `transient check, ${label} (${(track.lengthM / 1000).toFixed(2)} km, ${track.distanceM.length} points): median ${(timing.wallMs / 1000).toFixed(3)} s wall, ${(timing.cpuMs / 1000).toFixed(3)} s CPU per lap; ` +
      `${c.steps} odex steps, ${c.evaluations} evaluations; reference ${lap.lapTimeS.toFixed(3)} s, ` +
      `followed ${c.completed ? c.followedLapTimeS.toFixed(3) + ' s' : 'did not finish'}, largest deviation ${c.maxDeviationM.toFixed(2)} m, ` +
      `${(100 * c.maxDeviationShare).toFixed(0)} % of the room to the edge (${c.deviationLimitSource}); ${c.drivable ? 'drivable' : 'not drivable'}\n` +
      `  ${verdict('CPU per lap', timing.cpuMs / 1000, 5, 's')}\n`,
  );
}

export async function run(): Promise<void> {
  benchOne(
    'benchmark circuit',
    trackFromSegments(
      { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
      1,
      'benchmark',
    ),
  );
  const monza = resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Monza.csv');
  if (existsSync(monza)) {
    benchOne(
      'Monza centreline',
      readTrackFile(monza, {
        stepM: 1,
        columns: parseColumnMapping('width_left_m=w_tr_left_m,width_right_m=w_tr_right_m', '--columns'),
        widthM: null,
        layout: 'auto',
        smoothingM: null,
      }),
    );
  } else {
    process.stdout.write('transient check on a real circuit: skipped (../shared/data/open-tracks is absent)\n');
  }
  process.stdout.write(`peak RSS ${peakRssMb().toFixed(0)} MB; ${machineLoad()}\n`);
}
