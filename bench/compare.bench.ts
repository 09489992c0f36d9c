// Benchmark of the whole comparison: a one-hour session at 100 Hz (360,000 rows, 20 channels; the generator of
// bench/telemetry.bench.ts, in the temp folder) read, cut into laps, the fastest aligned, the reference laps run
// on the car model and on the demonstrated envelope fitted from the session, and compared corner by corner.
// Target (issue 4): under 15 s and under 1 GB peak memory.

import { mkdtempSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readTrackFile } from '../src/io/read-track.js';
import { readCarFile } from '../src/io/read-car.js';
import { ambientFrom } from '../src/car/ambient.js';
import { readTelemetryFile } from '../src/io/telemetry/read-telemetry.js';
import { compareSession } from '../src/compare/compare-session.js';
import { writeSession } from './telemetry.bench.js';
import { median, peakRssMb } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-compare-bench-'));
  const file = path.join(dir, 'session-1h-100hz.csv');
  try {
    const { rows } = await writeSession(file, 100, 3600);
    process.stdout.write(`generated ${rows} rows x 20 channels (${(statSync(file).size / 1e6).toFixed(0)} MB)\n`);
    const track = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), {
      stepM: 1,
      columns: {},
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    const car = readCarFile(path.join(projectRoot, 'cars', 'brackle-club.json'));
    const ambient = ambientFrom();
    const read: number[] = [];
    const rest: number[] = [];
    const total: number[] = [];
    let summary = '';
    for (let k = 0; k < 3; k++) {
      const t0 = performance.now();
      const session = await readTelemetryFile(file, { columns: {} });
      const t1 = performance.now();
      const comparison = compareSession(track, car, session, { ambient });
      const t2 = performance.now();
      read.push(t1 - t0);
      rest.push(t2 - t1);
      total.push(t2 - t0);
      const r = comparison.result;
      summary = `lap ${comparison.lap.lapNumber}: ${r.driverLapTimeS.toFixed(3)} s against ${r.referenceLapTimeS.toFixed(3)} s, ${r.corners.length} corners, ${r.findings.length} findings`;
    }
    process.stdout.write(`${summary}\n`);
    process.stdout.write(`read (streamed CSV): median ${median(read).toFixed(0)} ms\n`);
    process.stdout.write(
      `cut + align + two reference laps + envelope fit + compare: median ${median(rest).toFixed(0)} ms\n`,
    );
    process.stdout.write(`whole comparison: median ${median(total).toFixed(0)} ms (target under 15000 ms)\n`);
    process.stdout.write(`peak RSS of the process: ${peakRssMb().toFixed(0)} MB (target under 1024 MB)\n`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
