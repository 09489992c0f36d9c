// Real circuit centrelines as outside reference data: TUM racetrack-database (Chair of Automotive Technology,
// Technical University of Munich, GNU LGPL v3), geometry from OpenStreetMap (ODbL). Each file's length is
// checked against the published circuit length in the folder's README (values the README says are from memory,
// hence 1 %), and the heading change over a closed lap against 2 pi (the turning number of a simple closed
// curve is +-1: Hopf's Umlaufsatz, e.g. do Carmo, Differential Geometry of Curves and Surfaces, 5.7).

import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readTrackFile } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';
import { parseColumnMapping } from '../../src/io/columns.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const dataDir = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks');
const present = existsSync(dataDir);
if (!present) console.warn(`skipping the open-track checks: ${dataDir} is absent`);

/** The README's "| file | length km | note |" table: file -> km, where a number is given. */
function publishedLengths(): Map<string, number> {
  const lengths = new Map<string, number>();
  for (const line of readFileSync(path.join(dataDir, 'README.md'), 'utf8').split('\n')) {
    const match = /^\|\s*([\w.-]+\.csv)\s*\|\s*([0-9.]+)\s*\|/.exec(line);
    const file = match?.[1];
    const km = match?.[2];
    if (file !== undefined && km !== undefined) lengths.set(file, Number(km));
  }
  return lengths;
}

describe.skipIf(!present)('open-track centrelines (TUM racetrack-database, OpenStreetMap)', () => {
  const options: TrackReadOptions = {
    stepM: 1,
    columns: present ? parseColumnMapping('width_left_m=w_tr_left_m,width_right_m=w_tr_right_m', '--columns') : {},
    widthM: null,
    layout: 'auto',
    smoothingM: null,
  };
  const files = present
    ? readdirSync(dataDir)
        .filter((file) => file.endsWith('.csv'))
        .sort()
    : [];
  const lengths = present ? publishedLengths() : new Map<string, number>();

  /** Files the dataset README lists with no published length (its table says "no check value"). */
  const WITHOUT_CHECK_VALUE = new Set(['MoscowRaceway.csv']);

  it('finds the files and the check values', () => {
    expect(files.length).toBeGreaterThan(10);
    expect(lengths.size).toBeGreaterThan(10);
  });

  it.each(files)(
    '%s: closed, length within 1 %% of the published length, lap heading change 2 pi within 1 %%',
    (file) => {
      const track = readTrackFile(path.join(dataDir, file), options);
      expect(track.closed).toBe(true);
      const publishedKm = lengths.get(file);
      // The dataset README gives every circuit a length except the ones marked there with no check value.
      if (WITHOUT_CHECK_VALUE.has(file)) expect(publishedKm).toBeUndefined();
      else expect(Math.abs(track.lengthM / (publishedKm! * 1000) - 1)).toBeLessThan(0.01);
      let turning = 0;
      for (const k of track.curvaturePerM) turning += k * track.stepM;
      expect(Math.abs(Math.abs(turning) / (2 * Math.PI) - 1)).toBeLessThan(0.01);
      expect(track.widthLeftM).not.toBeNull();
      expect(track.widthLeftM!.every((w) => w > 0)).toBe(true);
    },
  );
});
