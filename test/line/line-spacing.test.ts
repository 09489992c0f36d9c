// A line written on one spacing and read on another drives the same lap, and a published line from outside the
// project (x_m, y_m alone) is read for its circuit. The line is computed once per grid for the whole file.
// Invented demo circuit and car from tracks/ and cars/; published lines and circuits: TUM racetrack-database
// (Heilmeier et al., Vehicle System Dynamics 58 (2020); LGPL v3), geometry from OpenStreetMap (ODbL), read
// from ../shared/data/ and skipped where that folder is absent.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import { readTrackFile } from '../../src/io/read-track.js';
import { readCarFile } from '../../src/io/read-car.js';
import { parseLineCsv } from '../../src/io/read-line.js';
import { lineCsv } from '../../src/line/line-csv.js';
import { linePath } from '../../src/line/geometry.js';
import { racingLine } from '../../src/line/racing-line.js';
import { simulate } from '../../src/solve/simulate.js';
import type { TrackGrid } from '../../src/track/types.js';
import type { Car } from '../../src/car/types.js';
import { openTrackCar } from '../helpers/cars.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const sharedData = path.resolve(projectRoot, '..', 'shared', 'data');
const published = ['Monza', 'Silverstone', 'Budapest'].filter((name) =>
  existsSync(path.join(sharedData, 'racelines', `${name}.csv`)),
);
if (published.length === 0) console.warn(`published-line checks skipped: ${sharedData}/racelines is absent`);

const drive = (track: TrackGrid, car: Car, offsetM: Float64Array) =>
  simulate(track, car, { path: linePath(track, offsetM) }).lapTimeS;

describe('a line CSV written at 2 m and at 5 m, read onto a 1 m grid (Tarnwick club circuit)', () => {
  const trackFile = path.join(projectRoot, 'tracks', 'tarnwick-club.json');
  let car: Car;
  let lineLapS = 0;
  let fine: TrackGrid;
  beforeAll(() => {
    car = readCarFile(path.join(projectRoot, 'cars', 'brackle-club.json'));
    fine = readTrackFile(trackFile, { stepM: 1 });
    lineLapS = racingLine(fine, car, { objective: 'time' }).lap.lapTimeS;
  });

  it.each([2, 5])('written at %i m: the lap within 0.5 per cent of the line driven at 1 m', (stepM) => {
    const coarse = readTrackFile(trackFile, { stepM });
    const file = lineCsv(racingLine(coarse, car, { objective: 'time' }));
    // Issue 11: linear resampling put kinks into the curvature and drove +19 % at 5 m; the bound is the issue's.
    const lapS = drive(fine, car, parseLineCsv(file, `line-${stepM}m.csv`, fine));
    expect(Math.abs(lapS / lineLapS - 1)).toBeLessThan(0.005);
    // The same line from its positions alone (the x_m, y_m columns), projected onto the 1 m grid.
    const positions = file
      .split('\n')
      .map((row) => row.split(',').slice(2, 4).join(','))
      .join('\n');
    const fromPositions = drive(fine, car, parseLineCsv(positions, `xy-${stepM}m.csv`, fine));
    expect(Math.abs(fromPositions / lineLapS - 1)).toBeLessThan(0.005);
  });
});

describe.skipIf(published.length === 0)('published minimum-curvature lines (x_m, y_m only, about 5 m apart)', () => {
  const car = openTrackCar();
  it.each(published)('%s: read for its circuit, a lap within 3 per cent of our own minimum-curvature line', (name) => {
    const track = readTrackFile(path.join(sharedData, 'open-tracks', `${name}.csv`), {
      stepM: 2,
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
    const file = path.join(sharedData, 'racelines', `${name}.csv`);
    const offsetM = parseLineCsv(readFileSync(file, 'utf8'), file, track);
    const own = racingLine(track, car, { objective: 'curvature' });
    const lapS = drive(track, car, offsetM);
    // Both minimise curvature inside the edges, but the published lines keep 0.5-0.65 m from the edges (the
    // data set's README) where ours keeps 0.8 m, and ours follows our smoothed centreline (30 m): a few per cent
    // either way, far inside the 7-25 % a centreline lap loses (issue 11).
    expect(Math.abs(lapS / own.lap.lapTimeS - 1)).toBeLessThan(0.03);
    expect(lapS).toBeLessThan(0.97 * own.centrelineLap.lapTimeS);
  });
});
