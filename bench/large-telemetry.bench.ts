// Large driver logs: telemetry CSVs of growing size (up to 1 GB by default) generated on the fly in the
// system's temporary folder, read through the streaming telemetry reader (readTelemetryFile), with the
// throughput and the peak memory (resident set size sampled every 50 ms during the read, and the process's
// maxRSS) for each size, so that memory growth with the file shows. Each file is deleted afterwards.
// REFLAP_BENCH_TELEMETRY_MB=64,256 chooses other sizes.

import { createWriteStream, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import { readTelemetryFile } from '../src/io/telemetry/read-telemetry.js';
import { peakRssMb } from './stats.js';

const MB = 1024 * 1024;

/** Writes a plausible 20 Hz log (time, speed, throttle, brake, two accelerations) of about `bytes` bytes. */
async function writeLog(file: string, bytes: number): Promise<number> {
  const out = createWriteStream(file, { highWaterMark: 4 * MB });
  out.write('time_s,speed_kph,throttle_pct,brake_pct,ax_g,ay_g\n');
  let written = 0;
  let row = 0;
  while (written < bytes) {
    const lines: string[] = [];
    for (let k = 0; k < 20000; k++, row++) {
      const t = row * 0.05;
      const phase = (row % 1800) / 1800;
      const speed = 120 + 60 * Math.sin(2 * Math.PI * phase * 7);
      lines.push(`${t.toFixed(2)},${speed.toFixed(2)},${(50 + 50 * Math.cos(phase * 40)).toFixed(1)},${(phase * 100 % 30).toFixed(1)},${(0.4 * Math.sin(phase * 90)).toFixed(3)},${(1.1 * Math.cos(phase * 60)).toFixed(3)}`);
    }
    const chunk = lines.join('\n') + '\n';
    written += chunk.length;
    if (!out.write(chunk)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  return row;
}

async function measure(sizeMb: number): Promise<void> {
  const file = join(tmpdir(), `reflap-bench-log-${process.pid}-${sizeMb}mb.csv`);
  try {
    const rows = await writeLog(file, sizeMb * MB);
    const fileMb = statSync(file).size / MB;
    (globalThis as { gc?: () => void }).gc?.();
    const baseRssMb = process.memoryUsage().rss / MB;
    let sampledPeakMb = baseRssMb;
    const sampler = setInterval(() => {
      sampledPeakMb = Math.max(sampledPeakMb, process.memoryUsage().rss / MB);
    }, 50);
    const start = process.hrtime.bigint();
    const session = await readTelemetryFile(file, { columns: {} });
    const seconds = Number(process.hrtime.bigint() - start) / 1e9;
    clearInterval(sampler);
    sampledPeakMb = Math.max(sampledPeakMb, process.memoryUsage().rss / MB);
    process.stdout.write(
      `  ${fileMb.toFixed(0).padStart(5)} MB, ${rows.toLocaleString('en')} rows: ${seconds.toFixed(1)} s, ${(fileMb / seconds).toFixed(0)} MB/s; ` +
        `RSS before ${baseRssMb.toFixed(0)} MB, peak ${sampledPeakMb.toFixed(0)} MB (+${(sampledPeakMb - baseRssMb).toFixed(0)} MB), maxRSS so far ${peakRssMb().toFixed(0)} MB; ${session.count} samples kept\n`,
    );
  } finally {
    rmSync(file, { force: true });
  }
}

export async function run(): Promise<void> {
  const sizes = (process.env['REFLAP_BENCH_TELEMETRY_MB'] ?? '64,256,1024').split(',').map(Number).filter((size) => size > 0);
  process.stdout.write('Streaming telemetry CSV reader (readTelemetryFile), files generated in the temporary folder:\n');
  for (const size of sizes) await measure(size);
  process.stdout.write('  Memory that does not grow with the file shows as the same peak at every size.\n');
}
