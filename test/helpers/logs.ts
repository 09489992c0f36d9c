// Logs written to files for tests that run the CLI: a circle of positions far from any bundled track, and a session
// of several laps made of traces that `simulate --out` wrote.

import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { runCli } from './cli.js';
import { writtenOncePerRun } from './once-per-run.js';
import { sharedLineArgs } from './shared-line.js';

/** 200 s at 10 Hz round a 100 m circle centred 5 km from the origin: a log that belongs to no test track. */
export function writeOffTrackLog(file: string): string {
  const rows = ['time_s,x_m,y_m,speed_mps'];
  for (let k = 0; k < 2000; k++)
    rows.push(
      `${(k * 0.1).toFixed(1)},${(5000 + 100 * Math.cos(k / 100)).toFixed(2)},${(5000 + 100 * Math.sin(k / 100)).toFixed(2)},30`,
    );
  writeFileSync(file, rows.join('\n') + '\n');
  return file;
}

export interface TraceRows {
  header: string[];
  rows: number[][];
}

/** A CSV trace as its header and rows of numbers. */
export function readTrace(file: string): TraceRows {
  const lines = readFileSync(file, 'utf8').trim().split('\n');
  return { header: lines[0]!.split(','), rows: lines.slice(1).map((line) => line.split(',').map(Number)) };
}

/**
 * One log of several laps: each trace driven in turn, its times running on from the previous lap's end (its last
 * row plus one 0.02 s step); of the last trace only the first `lastShare` of the rows.
 */
export function writeSessionLog(file: string, traces: string[], lastShare = 1): string {
  const lines: string[] = [];
  let offsetS = 0;
  traces.forEach((traceFile, k) => {
    const trace = readTrace(traceFile);
    const time = trace.header.indexOf('time_s');
    if (k === 0) lines.push(trace.header.join(','));
    const rows = k === traces.length - 1 ? trace.rows.slice(0, Math.round(trace.rows.length * lastShare)) : trace.rows;
    for (const row of rows)
      lines.push(row.map((v, c) => (c === time ? (v + offsetS).toFixed(4) : String(v))).join(','));
    offsetS += trace.rows.at(-1)![time]! + 0.02;
  });
  writeFileSync(file, lines.join('\n') + '\n');
  return file;
}

/**
 * Two reference laps of one car on one track written by `simulate --out` into `folder`: the car as its file gives
 * it (high.csv) and a copy whose tyre.muLong is `lowMuLong` (low.csv), so the two differ only in braking grip.
 * `simulateArgs` go to both runs (the same `--line` for both keeps them on one path).
 */
export function writeGripPair(
  folder: string,
  track: string,
  carFile: string,
  lowMuLong: number,
  simulateArgs: string[] = [],
): { highGrip: string; lowGrip: string; highMuLong: number } {
  const car = JSON.parse(readFileSync(carFile, 'utf8'));
  const highMuLong: number = car.tyre.muLong;
  car.tyre.muLong = lowMuLong;
  const lowCar = path.join(folder, 'low-grip-car.json');
  writeFileSync(lowCar, JSON.stringify(car));
  const highGrip = path.join(folder, 'high.csv');
  const lowGrip = path.join(folder, 'low.csv');
  for (const [file, carPath] of [
    [highGrip, carFile],
    [lowGrip, lowCar],
  ] as const) {
    const run = runCli(['simulate', '--track', track, '--car', carPath, ...simulateArgs, '--out', file]);
    if (run.code !== 0) throw new Error(`simulate failed: ${run.stderr}`);
  }
  return { highGrip, lowGrip, highMuLong };
}

/**
 * writeGripPair's two laps, written once per test run into a folder every test file reads, both on the car's shared
 * racing line (test/helpers/shared-line.ts): the reference a `compare --line` of that line file drives.
 */
export function sharedGripPair(
  track: string,
  carFile: string,
  lowMuLong: number,
): { highGrip: string; lowGrip: string; highMuLong: number } {
  const line = sharedLineArgs(track, carFile);
  const name = `grip-pair-${path.basename(track, '.json')}-${path.basename(carFile, '.json')}-${lowMuLong}`;
  const folder = writtenOncePerRun(name, (partial) => {
    mkdirSync(partial);
    writeGripPair(partial, track, carFile, lowMuLong, line);
  });
  const highMuLong: number = JSON.parse(readFileSync(carFile, 'utf8')).tyre.muLong;
  return { highGrip: path.join(folder, 'high.csv'), lowGrip: path.join(folder, 'low.csv'), highMuLong };
}
