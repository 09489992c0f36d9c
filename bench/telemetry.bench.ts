// Benchmark of telemetry input: a one-hour session at 100 Hz (360,000 rows, 20 channels) generated in the temp
// folder from a simulated lap of the demo track, then read (streamed CSV), cut into laps and the fastest aligned.
// The read's own peak (resident memory sampled during it) is set against the size of the channels the session
// keeps. Target (issue 4): well under 10 s and under 1 GB peak memory for this part; the whole comparison
// (read + cut + align + compare, under 15 s) is bench/compare.bench.ts. The read is set against pandas' read_csv
// (Debian's python3-pandas) on the same file when it is installed (bench/frame-reader.ts).

import { createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readTrackFile } from '../src/io/read-track.js';
import { readCarFile } from '../src/io/read-car.js';
import { simulate } from '../src/solve/simulate.js';
import { readTelemetryFile } from '../src/io/telemetry/read-telemetry.js';
import { cutLaps } from '../src/compare/laps.js';
import { selectLap } from '../src/compare/align.js';
import { machineLoad, median, peakRssMb, verdict } from './stats.js';
import { sampledPeak } from './large-telemetry.bench.js';
import { timeFrameReader } from './frame-reader.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

const HEADER = [
  'time_s',
  'lap_distance_m',
  'speed_kph',
  'throttle_pct',
  'brake_pct',
  'steering_deg',
  'gear',
  'rpm',
  'x_m',
  'y_m',
  'ax_g',
  'ay_g',
  'yaw_rate_dps',
  'susp_fl_mm',
  'susp_fr_mm',
  'susp_rl_mm',
  'susp_rr_mm',
  'water_temp_c',
  'oil_temp_c',
  'fuel_l',
];

/** The bundled club circuit on a 1 m grid and the club car: the session benches' track and car. */
export function clubTrackAndCar() {
  const track = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), {
    stepM: 1,
    columns: {},
    widthM: null,
    layout: 'auto',
    smoothingM: null,
  });
  const car = readCarFile(path.join(projectRoot, 'cars', 'brackle-club.json'));
  return { track, car };
}

export async function writeSession(
  file: string,
  rateHz: number,
  durationS: number,
): Promise<{ rows: number; laps: number }> {
  const { track, car } = clubTrackAndCar();
  const lap = simulate(track, car);
  const trace = lap.trace;
  const n = trace.count;
  const out = createWriteStream(file);
  const write = (text: string) =>
    new Promise<void>((resolve) => (out.write(text) ? resolve() : out.once('drain', () => resolve())));
  await write(HEADER.join(',') + '\n');
  const rows = Math.round(durationS * rateHz);
  let lapStart = 0;
  let lapIndex = 0;
  // Each lap a little slower or faster than the reference (time scaled by 1.00 to 1.04).
  let stretch = 1.02;
  let j = 0;
  let chunk = '';
  for (let k = 0; k < rows; k++) {
    const t = k / rateHz;
    let inLap = (t - lapStart) / stretch;
    if (inLap >= lap.lapTimeS) {
      lapStart += lap.lapTimeS * stretch;
      lapIndex++;
      stretch = 1 + 0.04 * (((lapIndex * 7) % 10) / 10);
      inLap = (t - lapStart) / stretch;
      j = 0;
    }
    while (j + 1 < n && trace.timeS[j + 1]! <= inLap) j++;
    const next = j + 1 < n ? j + 1 : 0;
    const nextT = j + 1 < n ? trace.timeS[j + 1]! : lap.lapTimeS;
    const w = Math.min(1, (inLap - trace.timeS[j]!) / (nextT - trace.timeS[j]!));
    const mix = (a: ArrayLike<number>) => a[j]! + w * (a[next]! - a[j]!);
    const s = trace.stationM[j]! + w * track.stepM;
    const v = mix(trace.speedMps) / stretch;
    const x = mix(track.xM);
    const y = mix(track.yM);
    const curvature = mix(track.curvaturePerM);
    chunk +=
      [
        t.toFixed(2),
        s.toFixed(2),
        (v * 3.6).toFixed(2),
        (mix(trace.throttle) * 100).toFixed(1),
        (mix(trace.brake) * 100).toFixed(1),
        (curvature * 2.6 * 15 * 57.2958).toFixed(1),
        String(Math.max(1, trace.gear[j]!)),
        (v * 95).toFixed(0),
        x.toFixed(3),
        y.toFixed(3),
        (mix(trace.axMps2) / 9.80665).toFixed(3),
        (mix(trace.ayMps2) / 9.80665).toFixed(3),
        (v * curvature * 57.2958).toFixed(2),
        (30 + Math.sin(t)).toFixed(1),
        (30 + Math.cos(t)).toFixed(1),
        (28 + Math.sin(t * 1.3)).toFixed(1),
        (28 + Math.cos(t * 1.3)).toFixed(1),
        (88 + t / 600).toFixed(1),
        (101 + t / 500).toFixed(1),
        (45 - t / 120).toFixed(2),
      ].join(',') + '\n';
    if (chunk.length > 1 << 20) {
      await write(chunk);
      chunk = '';
    }
  }
  await write(chunk);
  await new Promise<void>((resolve) => out.end(() => resolve()));
  return { rows, laps: lapIndex };
}

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-telemetry-bench-'));
  const file = path.join(dir, 'session-1h-100hz.csv');
  try {
    const { rows, laps } = await writeSession(file, 100, 3600);
    process.stdout.write(
      `generated ${rows} rows x ${HEADER.length} channels (${(statSync(file).size / 1e6).toFixed(0)} MB, ~${laps} laps)\n`,
    );
    const track = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), {
      stepM: 1,
      columns: {},
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    const read: number[] = [];
    const cut: number[] = [];
    const align: number[] = [];
    const total: number[] = [];
    const cpu: number[] = [];
    const readCpu: number[] = [];
    let summary = '';
    const readPeak: string[] = [];
    for (let run = 0; run < 3; run++) {
      const cpu0 = process.cpuUsage();
      const t0 = performance.now();
      const measured = await sampledPeak(() => readTelemetryFile(file, { columns: {} }));
      const session = measured.value;
      const t1 = performance.now();
      const readUsed = process.cpuUsage(cpu0);
      readCpu.push((readUsed.user + readUsed.system) / 1000);
      const keptMb =
        [
          session.timeS,
          session.distanceM,
          session.speedMps,
          session.throttle,
          session.brake,
          session.axMps2,
          session.ayMps2,
          session.steeringDeg,
          session.gear,
          session.rpm,
          session.xM,
          session.yM,
        ].reduce((sum, values) => sum + (values?.byteLength ?? 0), 0) /
        (1024 * 1024);
      readPeak.push(
        `+${(measured.peakMb - measured.baseMb).toFixed(0)} MB over ${measured.baseMb.toFixed(0)} MB for ${keptMb.toFixed(1)} MB of channels kept`,
      );
      const { laps: cuts } = cutLaps(session, track, {});
      const t2 = performance.now();
      const { lap } = selectLap(session, track);
      const t3 = performance.now();
      read.push(t1 - t0);
      cut.push(t2 - t1);
      align.push(t3 - t2);
      total.push(t3 - t0);
      const used = process.cpuUsage(cpu0);
      cpu.push((used.user + used.system) / 1000);
      summary = `${cuts.filter((c) => c.complete).length} complete laps of ${cuts.length}; fastest lap ${lap.lapNumber}, ${lap.lapTimeS.toFixed(3)} s`;
    }
    process.stdout.write(`${summary}\n`);
    process.stdout.write(
      `read (streamed CSV): median ${median(read).toFixed(0)} ms wall, ${median(readCpu).toFixed(0)} ms CPU (${((median(readCpu) * 1e6) / rows).toFixed(0)} ns CPU per row); ` +
        `resident memory during the read, runs 1-3: ${readPeak.join('; ')}\n`,
    );
    // The same file read by a general-purpose data-frame reader (target: reflap within 1.5 times of it).
    const frame = timeFrameReader(file, 3);
    if (typeof frame === 'string') process.stdout.write(`  data-frame reader: skipped: ${frame}\n`);
    else {
      const cpuRatio = median(readCpu) / frame.cpuMs;
      process.stdout.write(
        `  ${frame.reader}, same file, ${frame.rows} rows: median ${frame.wallMs.toFixed(0)} ms wall, ${frame.cpuMs.toFixed(0)} ms CPU\n` +
          `  ${verdict('reflap read over the data-frame reader, CPU', cpuRatio, 1.5, 'x')}; wall ${(median(read) / frame.wallMs).toFixed(2)} x\n`,
      );
    }
    process.stdout.write(`cut into laps (projection of every sample): median ${median(cut).toFixed(0)} ms wall\n`);
    process.stdout.write(`select + align fastest lap: median ${median(align).toFixed(0)} ms wall\n`);
    process.stdout.write(
      `read + cut + align: median ${median(total).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU (user + system)\n`,
    );
    process.stdout.write(`  ${verdict('CPU', median(cpu), 10000, 'ms')}; ${machineLoad()}\n`);
    process.stdout.write(`  ${verdict('peak RSS of the process', peakRssMb(), 1024, 'MB')}\n`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
