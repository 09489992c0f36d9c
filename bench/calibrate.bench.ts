// Benchmarks of issue 15: `reflap calibrate` on a one-hour session at 100 Hz (the generator of
// bench/telemetry.bench.ts: 360,000 rows, 20 channels, in the temp folder), read and fitted from a guessed car
// (target under 5 s); and `compare --uncertainty 64` on the 5 km benchmark circuit with two workers: the log read,
// the plain comparison and 64 draws of an uncertain car, each compared corner by corner (target under 3 s).
// Wall time and CPU time (user + system of the whole process, worker threads included) are both reported.

import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readCarFile, parseCarJson } from '../src/io/read-car.js';
import { readTelemetryFile } from '../src/io/telemetry/read-telemetry.js';
import { ambientFrom } from '../src/car/ambient.js';
import { buildEnvelope } from '../src/car/build-envelope.js';
import { calibrationSamples } from '../src/calibrate/samples.js';
import { calibrateCar } from '../src/calibrate/calibrate-car.js';
import { trackFromSegments } from '../src/track/segments.js';
import {
  demoDriverLap,
  demoDriverPath,
  demoDriverReference,
  demoLogCsv,
  DEFAULT_DEMO_LOG,
} from '../src/demo/demo-driver.js';
import { compareSession } from '../src/compare/compare-session.js';
import { uncertainComparison } from '../src/uncertainty/uncertain-reference.js';
import { benchmarkCircuitSegments } from './simulate.bench.js';
import { clubTrackAndCar, writeSession } from './telemetry.bench.js';
import { machineLoad, median, peakRssMb, timeOnce, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

async function calibrateBench(dir: string): Promise<void> {
  const file = path.join(dir, 'session-1h-100hz.csv');
  const { rows } = await writeSession(file, 100, 3600);
  const truth = readCarFile(path.join(projectRoot, 'cars', 'brackle-club.json'));
  const guess = {
    ...truth,
    tyre: { ...truth.tyre, muLat: 1.1, muLong: 1.1 },
    aero: { ...truth.aero, dragAreaM2: 0.5 },
    powertrain: { ...truth.powertrain, maxPowerW: 90_000 },
  };
  const ambient = ambientFrom();
  const wall: number[] = [];
  const cpu: number[] = [];
  const fit: number[] = [];
  let summary = '';
  for (let run = 0; run < 3; run++) {
    const measured = await timeOnce(async () => {
      const session = await readTelemetryFile(file, { columns: {} });
      const t0 = performance.now();
      const result = calibrateCar(guess, ambient, calibrationSamples(session, null));
      fit.push(performance.now() - t0);
      return result;
    });
    wall.push(measured.wallMs);
    cpu.push(measured.cpuMs);
    summary = measured.value.fitted.map((f) => `${f.field} ${Number(f.value.toPrecision(4))} ± ${f.sd}`).join(', ');
  }
  process.stdout.write(`calibrate: ${rows} rows at 100 Hz; ${summary}\n`);
  process.stdout.write(
    `  read + fit: median ${median(wall).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU; the fit alone ${median(fit).toFixed(0)} ms wall\n`,
  );
  // Issue 15's target, one thread: on an idle machine its wall time is its CPU time.
  process.stdout.write(`  ${verdict('CPU', median(cpu), 5000, 'ms')}; ${verdict('wall', median(wall), 5000, 'ms')}\n`);

  // The same session as a GPS logger would give it (no accelerometer channels), on the club circuit: laps cut and
  // aligned, the driver's path smoothed from every fix of every lap, the lateral acceleration read on it.
  const { track } = clubTrackAndCar();
  const logged = await readTelemetryFile(file, { columns: {} });
  const gpsOnly = { ...logged, axMps2: null, ayMps2: null };
  const gpsWall: number[] = [];
  const gpsCpu: number[] = [];
  let lateral = '';
  for (let run = 0; run < 3; run++) {
    const measured = await timeOnce(async () => {
      const samples = calibrationSamples(gpsOnly, track);
      calibrateCar(guess, ambient, samples);
      return samples;
    });
    gpsWall.push(measured.wallMs);
    gpsCpu.push(measured.cpuMs);
    const path = measured.value.lateralPath;
    lateral = path ? `lateral from the ${path.path} (${path.fixes} fixes over ${path.laps} laps)` : 'lateral measured';
  }
  process.stdout.write(
    `calibrate GPS-only, fit alone: median ${median(gpsWall).toFixed(0)} ms wall, ${median(gpsCpu).toFixed(0)} ms CPU; ${lateral}\n`,
  );
  process.stdout.write(
    `  ${verdict('CPU', median(gpsCpu), 5000, 'ms')}; ${verdict('wall', median(gpsWall), 5000, 'ms')}\n`,
  );
}

async function uncertaintyBench(dir: string): Promise<void> {
  const car = parseCarJson(
    readFileSync(path.join(projectRoot, 'cars', 'tarnfell-gt.json'), 'utf8'),
    'cars/tarnfell-gt.json',
  );
  const uncertain = {
    ...car,
    uncertainty: {
      sd: {
        'tyre.muLat': 0.05,
        'tyre.muLong': 0.05,
        'aero.liftAreaM2': 0.3,
        'aero.dragAreaM2': 0.03,
        'powertrain.maxPowerW': 10_000,
      },
      correlation: [{ fields: ['tyre.muLat', 'tyre.muLong'] as const, r: 0.7 }],
    },
  };
  // The benchmark circuit is invented in a local plane; a geo origin lets the demo driver's log carry GPS columns.
  const track = {
    ...trackFromSegments(
      { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
      1,
      'benchmark',
    ),
    geoOrigin: { latDeg: 39.36, lonDeg: -2.59 },
  };
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const log = path.join(dir, 'bench-lap.csv');
  writeFileSync(
    log,
    demoLogCsv(
      track,
      demoDriverLap(track, demoDriverReference(track, car, ambient, demoDriverPath(track, undefined)), envelope),
      DEFAULT_DEMO_LOG,
    ),
  );
  const wall: number[] = [];
  const cpu: number[] = [];
  let summary = '';
  for (let run = 0; run < 3; run++) {
    const measured = await timeOnce(async () => {
      const session = await readTelemetryFile(log, { columns: {} });
      const comparison = compareSession(track, uncertain, session, { ambient });
      return uncertainComparison(comparison, uncertain, ambient, { draws: 64, workers: 2 });
    });
    wall.push(measured.wallMs);
    cpu.push(measured.cpuMs);
    const u = measured.value;
    summary = `${u.draws} draws, lap ${u.lapTimeS.median.toFixed(2)} s (${u.lapTimeS.low.toFixed(2)} to ${u.lapTimeS.high.toFixed(2)}), ${u.findings.length} findings, ${u.findings.filter((f) => f.uncertain).length} uncertain`;
  }
  process.stdout.write(`compare --uncertainty 64 on ${(track.lengthM / 1000).toFixed(2)} km: ${summary}\n`);
  process.stdout.write(
    `  read + compare + 64 draws on 2 workers: median ${median(wall).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU\n`,
  );
  // Issue 15's target is wall time on two cores; the CPU of the process and its two workers, spread over those two
  // cores, is what that wall time comes to on an idle machine.
  process.stdout.write(
    `  ${verdict('CPU over 2 cores', median(cpu) / 2, 3000, 'ms')}; ${verdict('wall', median(wall), 3000, 'ms')}\n`,
  );
}

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-calibrate-bench-'));
  try {
    await calibrateBench(dir);
    await uncertaintyBench(dir);
    process.stdout.write(
      `  ${machineLoad()} (a shared machine: wall times hold only when it is idle); peak RSS ${peakRssMb().toFixed(0)} MB\n`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
