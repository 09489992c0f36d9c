// The line on real circuits and on the demo tracks: inside the edges less the margin everywhere, and faster
// than the centreline. Real circuits: TUM racetrack-database (Heilmeier et al., LGPL v3), geometry from
// OpenStreetMap (ODbL), read from ../shared/data/open-tracks/ and skipped where that folder is absent.

import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readTrackFile } from '../../src/io/read-track.js';
import { racingLine } from '../../src/line/racing-line.js';
import type { TrackGrid } from '../../src/track/types.js';
import { openTrackCar } from '../helpers/cars.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const openTracksDir = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks');
const demoTracksDir = path.resolve(projectRoot, 'tracks');
const openTrackFiles = existsSync(openTracksDir)
  ? readdirSync(openTracksDir)
      .filter((f) => f.endsWith('.csv'))
      .sort()
  : [];
const demoTrackFiles = existsSync(demoTracksDir)
  ? readdirSync(demoTracksDir)
      .filter((f) => f.endsWith('.json'))
      .sort()
  : [];
if (openTrackFiles.length === 0) console.warn(`open-tracks line checks skipped: ${openTracksDir} is absent`);

const car = openTrackCar();
const MARGIN_M = 0.8;

function checkLine(track: TrackGrid): void {
  const line = racingLine(track, car, { objective: 'time', marginM: MARGIN_M });
  let worstM = -Infinity;
  for (let i = 0; i < line.offsetM.length; i++) {
    const n = line.offsetM[i]!;
    // Positive excess = outside the edge less the margin.
    worstM = Math.max(worstM, n - (track.widthLeftM![i]! - MARGIN_M), -(track.widthRightM![i]! - MARGIN_M) - n);
    expect(Number.isFinite(line.path.curvaturePerM[i]!)).toBe(true);
  }
  expect(worstM).toBeLessThanOrEqual(1e-9);
  expect(line.lap.lapTimeS).toBeLessThan(line.centrelineLap.lapTimeS);
  expect(line.lap.lapTimeS).toBeLessThanOrEqual(line.curvatureLineLapTimeS);
}

describe.skipIf(openTrackFiles.length === 0)('line on the open circuits at 2 m', () => {
  it.each(openTrackFiles)('%s', (file) => {
    const track = readTrackFile(path.join(openTracksDir, file), {
      stepM: 2,
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    checkLine(track);
  });
});

describe.skipIf(demoTrackFiles.length === 0)('line on the demo tracks at 2 m', () => {
  it.each(demoTrackFiles)('%s', (file) => {
    const track = readTrackFile(path.join(demoTracksDir, file), {
      stepM: 2,
      columns: {},
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    checkLine(track);
  });
});
