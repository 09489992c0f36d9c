// A general-purpose data-frame reader to measure the telemetry read against: pandas' read_csv with its C engine
// (Debian's python3-pandas), timed inside Python on the same file (CPU time by time.process_time, wall by
// time.perf_counter), median of `runs`. The bench installs nothing: without pandas it says how to get it.

import { spawnSync } from 'node:child_process';

export interface FrameReaderTiming {
  reader: string;
  wallMs: number;
  cpuMs: number;
  rows: number;
}

const SCRIPT = `
import json, sys, time, statistics
import pandas
walls, cpus = [], []
for _ in range(int(sys.argv[2])):
    w0, c0 = time.perf_counter(), time.process_time()
    frame = pandas.read_csv(sys.argv[1], engine='c')
    cpus.append(time.process_time() - c0)
    walls.append(time.perf_counter() - w0)
print(json.dumps({'version': pandas.__version__, 'wall': statistics.median(walls), 'cpu': statistics.median(cpus), 'rows': len(frame)}))
`;

/** pandas.read_csv timed on `file`, or the reason it could not run (with how to install it). */
export function timeFrameReader(file: string, runs: number): FrameReaderTiming | string {
  // Debian's interpreter first: a python3 earlier on PATH (a version manager's) may lack Debian's packages.
  for (const python of ['/usr/bin/python3', 'python3']) {
    const result = spawnSync(python, ['-c', SCRIPT, file, String(runs)], { encoding: 'utf8' });
    if (result.status !== 0) continue;
    const figures = JSON.parse(result.stdout) as { version: string; wall: number; cpu: number; rows: number };
    return {
      reader: `pandas ${figures.version} read_csv (C engine)`,
      wallMs: figures.wall * 1000,
      cpuMs: figures.cpu * 1000,
      rows: figures.rows,
    };
  }
  return 'pandas is not installed: apt-get install python3-pandas (Debian) to compare the read with its read_csv';
}
