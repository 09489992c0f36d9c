// Benchmark of track input: reading, resampling and smoothing a ~5 km centreline CSV at 1 m (target: well
// under 50 ms), building the demo segment track, and the cyclic pentadiagonal solver at 2,500 points.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseTrackText } from '../src/io/read-track.js';
import type { TrackReadOptions } from '../src/io/track-read-options.js';
import { factorCyclicBanded } from '../src/numeric/banded.js';
import { machineLoad, medianTimes, peakRssMb, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

/** A ~5 km centreline CSV: the open dataset's Silverstone file when ../shared is there, else the demo circuit sampled every 5 m. */
function centrelineCsv(): { text: string; source: string; columns: Record<string, string> } {
  const shared = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Silverstone.csv');
  if (existsSync(shared)) {
    return {
      text: readFileSync(shared, 'utf8'),
      source: 'Silverstone.csv (TUM racetrack-database, OpenStreetMap)',
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
    };
  }
  const demo = parseTrackText(
    readFileSync(path.join(projectRoot, 'tracks', 'velmora-downs.json'), 'utf8'),
    'velmora-downs.json',
    { stepM: 5, columns: {}, widthM: null, layout: 'auto', smoothingM: null },
  );
  const rows = ['x_m,y_m'];
  for (let i = 0; i < demo.xM.length; i++) rows.push(`${demo.xM[i]!.toFixed(3)},${demo.yM[i]!.toFixed(3)}`);
  return { text: rows.join('\n'), source: 'velmora-downs sampled every 5 m', columns: {} };
}

export async function run(): Promise<void> {
  const csv = centrelineCsv();
  const options: TrackReadOptions = { stepM: 1, columns: csv.columns, widthM: null, layout: 'auto', smoothingM: null };
  let points = 0;
  const csvTime = medianTimes(
    () => {
      points = parseTrackText(csv.text, 'bench.csv', options).xM.length;
    },
    30,
    5,
  );
  process.stdout.write(
    `centreline CSV ${csv.source}: read + resample + smooth at 1 m, ${points} points: median ${csvTime.wallMs.toFixed(2)} ms wall, ${csvTime.cpuMs.toFixed(2)} ms CPU (${((csvTime.cpuMs * 1e6) / points).toFixed(0)} ns CPU per point)\n` +
      `  ${verdict('CPU', csvTime.cpuMs, 50, 'ms')}\n`,
  );

  const demoText = readFileSync(path.join(projectRoot, 'tracks', 'velmora-downs.json'), 'utf8');
  const segmentTime = medianTimes(
    () => {
      points = parseTrackText(demoText, 'velmora-downs.json', { ...options, columns: {} }).xM.length;
    },
    30,
    5,
  );
  process.stdout.write(
    `segment JSON velmora-downs at 1 m, ${points} points: median ${segmentTime.wallMs.toFixed(2)} ms wall, ${segmentTime.cpuMs.toFixed(2)} ms CPU (${((segmentTime.cpuMs * 1e6) / points).toFixed(0)} ns CPU per point)\n`,
  );

  const n = 2500;
  const lambda = 1e4;
  const penalty = [6, -4, 1];
  const entry = (_i: number, k: number) => (k === 0 ? 1 : 0) + lambda * penalty[k]!;
  const rhs = new Float64Array(n).map((_, i) => Math.sin(i / 10));
  const out = new Float64Array(n);
  const factorTime = medianTimes(
    () => {
      factorCyclicBanded(n, 2, entry).solve(rhs, out);
    },
    50,
    10,
  );
  const factor = factorCyclicBanded(n, 2, entry);
  const solveTime = medianTimes(
    () => {
      factor.solve(rhs, out);
    },
    200,
    20,
  );
  process.stdout.write(
    `cyclic pentadiagonal n = ${n}: factor + solve median ${factorTime.wallMs.toFixed(3)} ms wall, ${factorTime.cpuMs.toFixed(3)} ms CPU; ` +
      `solve alone ${solveTime.wallMs.toFixed(3)} ms wall, ${solveTime.cpuMs.toFixed(3)} ms CPU (${((solveTime.cpuMs * 1e6) / n).toFixed(0)} ns CPU per point)\n`,
  );
  process.stdout.write(`peak RSS ${peakRssMb().toFixed(0)} MB; ${machineLoad()}\n`);
}
