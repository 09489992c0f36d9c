// The reference's path by default: the minimum-time line where the track gives widths, the centreline with a
// note where it does not. Real circuit: TUM racetrack-database (Heilmeier et al., LGPL v3), geometry from
// OpenStreetMap (ODbL), read from ../shared/data/open-tracks/ and skipped where that folder is absent.

import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import { readTrackFile } from '../../src/io/read-track.js';
import { referenceLine } from '../../src/line/reference-line.js';
import { simulate } from '../../src/solve/simulate.js';
import { isInputError } from '../../src/errors.js';
import type { TrackGrid } from '../../src/track/types.js';
import { openTrackCar } from '../helpers/cars.js';
import { testCircuit } from '../compare/fixtures.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const norisring = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Norisring.csv');
if (!existsSync(norisring)) console.warn(`open-track reference-path check skipped: ${norisring} is absent`);

const car = openTrackCar();

describe.skipIf(!existsSync(norisring))('on an open-dataset circuit with widths (Norisring, 1 m)', () => {
  let track: TrackGrid;
  beforeAll(() => {
    track = readTrackFile(norisring, {
      stepM: 1,
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
      widthM: null,
      layout: 'auto',
      smoothingM: null,
    });
  });

  it('drives the minimum-time line by default, faster than the centreline', () => {
    const reference = referenceLine(track, car);
    expect(reference.kind).toBe('line');
    expect(reference.note).toBeNull();
    // The lap the solver drives on the returned path is the lap the search reported for it.
    const driven = simulate(track, car, { path: reference.path! });
    expect(driven.lapTimeS).toBeCloseTo(reference.lap!.lapTimeS, 9);
    // A racing line uses the width to open the corners, so it beats the centreline (common practice; issue 11
    // measured 7-25 % on the open circuits, so at least 3 % here is a loose floor).
    const centre = simulate(track, car);
    expect(reference.lap!.lapTimeS).toBeLessThan(0.97 * centre.lapTimeS);
  });
});

describe('without room for a line', () => {
  const noWidths = (): TrackGrid => {
    const track = testCircuit(2);
    return { ...track, widthLeftM: null, widthRightM: null, source: 'plain.csv' };
  };

  it('drives the centreline with a note naming the track and how to give widths', () => {
    const reference = referenceLine(noWidths(), car);
    expect(reference.kind).toBe('centreline');
    expect(reference.path).toBeUndefined();
    expect(reference.note).toMatch(/^plain\.csv gives no widths.*--width-m <m>.*width_left_m, width_right_m/);
    expect(reference.note).not.toContain('\n');
  });

  it('is an input error when the line was asked for by name', () => {
    let caught: unknown;
    try {
      referenceLine(noWidths(), car, { explicit: true });
    } catch (error) {
      caught = error;
    }
    expect(isInputError(caught)).toBe(true);
    expect((caught as Error).message).toMatch(/plain\.csv: the track gives no widths/);
  });

  it('falls back to the centreline with the reason where the margin does not fit', () => {
    const reference = referenceLine(testCircuit(2), car, { marginM: 7 });
    expect(reference.kind).toBe('centreline');
    expect(reference.note).toMatch(/less than twice the margin of 7 m.*reference drives the centreline/);
  });

  it('drives the centreline when asked, with no note', () => {
    const reference = referenceLine(testCircuit(2), car, { choice: 'centreline' });
    expect(reference).toMatchObject({ kind: 'centreline', note: null, path: undefined });
  });
});
