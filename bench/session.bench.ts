// Benchmark of the session view and of lap against lap on a one-hour session at 100 Hz (the generator of
// bench/telemetry.bench.ts, in the temp folder): `session` = read, cut, the best lap against the reference (for
// the envelope and the four answers), then every complete lap aligned and measured corner by corner;
// `compare --against-lap` = read, the comparison, and a second lap of the session set against it.
// Targets (issue 13): session under 5 s wall, compare --against-lap under 3 s wall, memory flat in the laps.

import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ambientFrom } from '../src/car/ambient.js';
import { readTelemetryFile } from '../src/io/telemetry/read-telemetry.js';
import { compareSession } from '../src/compare/compare-session.js';
import { sessionOverview } from '../src/compare/session/session-overview.js';
import { otherLapOf } from '../src/compare/against/other-lap.js';
import { lapAgainstLap } from '../src/compare/against/lap-against-lap.js';
import { clubTrackAndCar, writeSession } from './telemetry.bench.js';
import { machineLoad, median, peakRssMb, timeOnce, verdict } from './stats.js';

/** Heap held after a full collection, MB (needs node --expose-gc, as `npm run bench` gives it). */
function heapAfterGcMb(): number {
  (globalThis as { gc?: () => void }).gc?.();
  return process.memoryUsage().heapUsed / 1e6;
}

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-session-bench-'));
  const file = path.join(dir, 'session-1h-100hz.csv');
  try {
    const { rows, laps } = await writeSession(file, 100, 3600);
    process.stdout.write(`generated ${rows} rows, ${laps} laps\n`);
    const { track, car } = clubTrackAndCar();
    const ambient = ambientFrom();
    const sessionWall: number[] = [];
    const sessionCpu: number[] = [];
    const againstWall: number[] = [];
    const againstCpu: number[] = [];
    let summary = '';
    let heapGrowthMb = 0;
    for (let k = 0; k < 3; k++) {
      const whole = await timeOnce(async () => {
        const log = await readTelemetryFile(file, { columns: {} });
        const comparison = compareSession(track, car, log, { ambient });
        const inputs = {
          track,
          session: comparison.session!,
          laps: comparison.laps!,
          reference: comparison.reference,
          envelope: comparison.envelope,
          demonstratedLapTimeS: comparison.demonstratedLap?.lapTimeS ?? null,
        };
        return { overview: sessionOverview(inputs), inputs };
      });
      sessionWall.push(whole.wallMs);
      sessionCpu.push(whole.cpuMs);
      const { overview, inputs } = whole.value;
      if (k === 0) {
        // Memory flat in the laps: the heap held while the view of half the laps is alive, against all of them.
        const complete = inputs.laps.filter((lap) => lap.complete);
        const before = heapAfterGcMb();
        const half = sessionOverview({ ...inputs, laps: complete.slice(0, complete.length >> 1) });
        const halfHeap = heapAfterGcMb() - before;
        const all = sessionOverview({ ...inputs, laps: complete });
        heapGrowthMb = heapAfterGcMb() - before - halfHeap - halfHeap;
        void [half, all];
      }
      summary = `${overview.laps.filter((lap) => lap.complete).length} complete laps, best ${overview.bestLapTimeS.toFixed(3)} s, session best ${overview.sessionBestS.toFixed(3)} s, reference ${overview.referenceLapTimeS.toFixed(3)} s`;
      const paired = await timeOnce(async () => {
        const log = await readTelemetryFile(file, { columns: {} });
        const comparison = compareSession(track, car, log, { ambient });
        const other = otherLapOf(comparison.session!, track, {
          lap: overview.bestLap === 2 ? 3 : 2,
          optionName: '--against-lap',
          laps: comparison.laps!,
        });
        return lapAgainstLap(track, comparison.reference, comparison.lap, other.lap, comparison.envelope);
      });
      againstWall.push(paired.wallMs);
      againstCpu.push(paired.cpuMs);
    }
    const figures = (wall: number[], cpu: number[]) =>
      `median ${median(wall).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU`;
    process.stdout.write(`${summary}\n`);
    process.stdout.write(`session (read + compare + every lap): ${figures(sessionWall, sessionCpu)}\n`);
    process.stdout.write(
      `  ${verdict('CPU', median(sessionCpu), 5000, 'ms')}; ${verdict('wall', median(sessionWall), 5000, 'ms')}\n`,
    );
    process.stdout.write(
      `compare --against-lap (read + compare + a second lap): ${figures(againstWall, againstCpu)}\n`,
    );
    process.stdout.write(
      `  ${verdict('CPU', median(againstCpu), 3000, 'ms')}; ${verdict('wall', median(againstWall), 3000, 'ms')}\n`,
    );
    process.stdout.write(
      `  ${verdict('heap held by the view of all laps over half of them', heapGrowthMb, 5, 'MB')}; ${verdict('peak RSS of the process', peakRssMb(), 1024, 'MB')}; ${machineLoad()}\n`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
