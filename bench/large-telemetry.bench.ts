// Large driver logs: telemetry CSVs of growing size (64 MB, 256 MB and 1 GB by default) generated on the fly in
// the system's temporary folder and read by the chunked streaming reader (streamTelemetryCsv) with a consumer
// that keeps nothing per row: it counts rows, tracks the speed and lateral acceleration range and finds the
// start/finish crossings from the distance channel. For each size: time, throughput and the peak resident
// memory (sampled every 50 ms during the read); the same peak at every size shows memory does not grow with
// the file. The in-memory session reader (readTelemetryFile) is measured too, on the sizes up to 256 MB, for
// its peak against the size of the channels it keeps. Each file is deleted afterwards.
// REFLAP_BENCH_TELEMETRY_MB=64,256 and REFLAP_BENCH_SESSION_MB=64 choose other sizes (0: none).

import { createWriteStream, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import { readTelemetryFile, streamTelemetryCsv, type TelemetryChunk } from '../src/io/telemetry/read-telemetry.js';
import { linearityVerdict, machineLoad, peakRssMb } from './stats.js';

const MB = 1024 * 1024;
const LAP_M = 2800;

/** Writes a plausible 20 Hz log (time, lap distance, speed, pedals, two accelerations) of about `bytes` bytes. */
async function writeLog(file: string, bytes: number): Promise<number> {
  const out = createWriteStream(file, { highWaterMark: 4 * MB });
  out.write('time_s,lap_distance_m,speed_kph,throttle_pct,brake_pct,ax_g,ay_g\n');
  let written = 0;
  let row = 0;
  let distanceM = 0;
  while (written < bytes) {
    const lines: string[] = [];
    for (let k = 0; k < 20000; k++, row++) {
      const t = row * 0.05;
      const phase = (row % 1800) / 1800;
      const speed = 120 + 60 * Math.sin(2 * Math.PI * phase * 7);
      distanceM += (speed / 3.6) * 0.05;
      if (distanceM >= LAP_M) distanceM -= LAP_M;
      lines.push(
        `${t.toFixed(2)},${distanceM.toFixed(2)},${speed.toFixed(2)},${(50 + 50 * Math.cos(phase * 40)).toFixed(1)},${((phase * 100) % 30).toFixed(1)},${(0.4 * Math.sin(phase * 90)).toFixed(3)},${(1.1 * Math.cos(phase * 60)).toFixed(3)}`,
      );
    }
    const chunk = lines.join('\n') + '\n';
    written += chunk.length;
    if (!out.write(chunk)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  return row;
}

/** What the streamed consumer finds: nothing per row is kept. */
class LapScan {
  rows = 0;
  maxChunkRows = 0;
  minSpeedMps = Infinity;
  maxSpeedMps = -Infinity;
  maxAbsAyMps2 = 0;
  crossings = 0;
  fastestLapS = Infinity;
  private previousDistanceM = NaN;
  private lastCrossingS = NaN;

  add(chunk: TelemetryChunk): void {
    this.rows += chunk.rows;
    this.maxChunkRows = Math.max(this.maxChunkRows, chunk.rows);
    const speed = chunk.speedMps!;
    const ay = chunk.ayMps2!;
    const distance = chunk.distanceM!;
    for (let i = 0; i < chunk.rows; i++) {
      if (speed[i]! < this.minSpeedMps) this.minSpeedMps = speed[i]!;
      if (speed[i]! > this.maxSpeedMps) this.maxSpeedMps = speed[i]!;
      if (Math.abs(ay[i]!) > this.maxAbsAyMps2) this.maxAbsAyMps2 = Math.abs(ay[i]!);
      // The line is crossed where the lap distance drops by more than half a lap.
      if (this.previousDistanceM - distance[i]! > LAP_M / 2) {
        const t = chunk.timeS[i]!;
        if (this.crossings > 0) this.fastestLapS = Math.min(this.fastestLapS, t - this.lastCrossingS);
        this.lastCrossingS = t;
        this.crossings++;
      }
      this.previousDistanceM = distance[i]!;
    }
  }
}

/** Runs `work` with the resident memory sampled every 50 ms: its time, and the RSS before (after a GC) and at the peak, MB. */
export async function sampledPeak<T>(
  work: () => Promise<T>,
): Promise<{ value: T; seconds: number; cpuSeconds: number; baseMb: number; peakMb: number }> {
  (globalThis as { gc?: () => void }).gc?.();
  const baseMb = process.memoryUsage().rss / MB;
  let peakMb = baseMb;
  const sampler = setInterval(() => {
    peakMb = Math.max(peakMb, process.memoryUsage().rss / MB);
  }, 50);
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  try {
    const value = await work();
    const seconds = Number(process.hrtime.bigint() - start) / 1e9;
    const cpu = process.cpuUsage(cpuStart);
    peakMb = Math.max(peakMb, process.memoryUsage().rss / MB);
    return { value, seconds, cpuSeconds: (cpu.user + cpu.system) / 1e6, baseMb, peakMb };
  } finally {
    clearInterval(sampler);
  }
}

/** The streamed read's figures at one file size, for the verdict on memory and cost across sizes. */
interface StreamedFigures {
  fileMb: number;
  rows: number;
  cpuSeconds: number;
  peakIncreaseMb: number;
}

async function measure(sizeMb: number, withSession: boolean): Promise<StreamedFigures> {
  const file = join(tmpdir(), `reflap-bench-log-${process.pid}-${sizeMb}mb.csv`);
  try {
    const rows = await writeLog(file, sizeMb * MB);
    const fileMb = statSync(file).size / MB;
    const scan = new LapScan();
    const streamed = await sampledPeak(() => streamTelemetryCsv(file, { columns: {} }, (chunk) => scan.add(chunk)));
    process.stdout.write(
      `  ${fileMb.toFixed(0).padStart(5)} MB, ${rows.toLocaleString('en')} rows, streamed: ${streamed.seconds.toFixed(1)} s wall, ${streamed.cpuSeconds.toFixed(1)} s CPU ` +
        `(${((streamed.cpuSeconds * 1e9) / rows).toFixed(0)} ns CPU per row), ${(fileMb / streamed.seconds).toFixed(0)} MB/s; ` +
        `RSS before ${streamed.baseMb.toFixed(0)} MB, peak ${streamed.peakMb.toFixed(0)} MB (+${(streamed.peakMb - streamed.baseMb).toFixed(0)} MB); ` +
        `${scan.rows.toLocaleString('en')} rows in chunks of at most ${scan.maxChunkRows}, speed ${(scan.minSpeedMps * 3.6).toFixed(1)}-${(scan.maxSpeedMps * 3.6).toFixed(1)} km/h, ` +
        `|ay| up to ${scan.maxAbsAyMps2.toFixed(2)} m/s^2, ${scan.crossings} line crossings, fastest lap ${scan.fastestLapS.toFixed(2)} s\n`,
    );
    const figures = {
      fileMb,
      rows,
      cpuSeconds: streamed.cpuSeconds,
      peakIncreaseMb: streamed.peakMb - streamed.baseMb,
    };
    if (!withSession) return figures;
    const session = await sampledPeak(() => readTelemetryFile(file, { columns: {} }));
    const s = session.value;
    const channels = [s.timeS, s.distanceM, s.speedMps, s.throttle, s.brake, s.axMps2, s.ayMps2].filter(
      (values) => values !== null,
    );
    const keptMb = channels.reduce((sum, values) => sum + values.byteLength, 0) / MB;
    // The arrays may be views into buffers sized from an estimate of the rows; their spare pages are never written.
    const allocatedMb = channels.reduce((sum, values) => sum + values.buffer.byteLength, 0) / MB;
    process.stdout.write(
      `  ${fileMb.toFixed(0).padStart(5)} MB, session in memory: ${session.seconds.toFixed(1)} s wall, ${session.cpuSeconds.toFixed(1)} s CPU; RSS before ${session.baseMb.toFixed(0)} MB, peak ${session.peakMb.toFixed(0)} MB ` +
        `(+${(session.peakMb - session.baseMb).toFixed(0)} MB) for ${keptMb.toFixed(0)} MB of channels kept (${((session.peakMb - session.baseMb) / keptMb).toFixed(2)}x; ` +
        `arrays allocated ${allocatedMb.toFixed(0)} MB)\n`,
    );
    return figures;
  } finally {
    rmSync(file, { force: true });
  }
}

function sizes(variable: string, fallback: string): number[] {
  return (process.env[variable] ?? fallback)
    .split(',')
    .map(Number)
    .filter((size) => size > 0);
}

export async function run(): Promise<void> {
  const sessionSizes = new Set(sizes('REFLAP_BENCH_SESSION_MB', '256'));
  process.stdout.write('Telemetry CSV read in chunks (streamTelemetryCsv), files generated in the temporary folder:\n');
  const measured: StreamedFigures[] = [];
  for (const size of sizes('REFLAP_BENCH_TELEMETRY_MB', '64,256,1024'))
    measured.push(await measure(size, sessionSizes.has(size)));
  process.stdout.write(`  maxRSS of the process ${peakRssMb().toFixed(0)} MB; ${machineLoad()}\n`);
  if (measured.length < 2) return;
  const smallest = measured[0]!;
  const largest = measured[measured.length - 1]!;
  // Flat memory: the streamed peak grows by less than a tenth of what the file grows (common practice, no source).
  const growthMb = largest.peakIncreaseMb - smallest.peakIncreaseMb;
  const fileGrowthMb = largest.fileMb - smallest.fileMb;
  process.stdout.write(
    `  streamed peak +${smallest.peakIncreaseMb.toFixed(0)} MB at ${smallest.fileMb.toFixed(0)} MB, +${largest.peakIncreaseMb.toFixed(0)} MB at ${largest.fileMb.toFixed(0)} MB: ` +
      `${growthMb < 0.1 * fileGrowthMb ? 'flat' : 'NOT flat'} in the file size (flat: grows by under a tenth of the file's growth)\n`,
  );
  process.stdout.write(
    `  ${linearityVerdict([smallest, largest].map((figures) => (figures.cpuSeconds * 1e9) / figures.rows)).replace('per point', 'per row')}\n`,
  );
}
