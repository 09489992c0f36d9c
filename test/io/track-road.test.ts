// Heights and banks in track files: the centreline CSV's z_m and bank_deg (by name or through --columns), the
// segment JSON's gradePct and bankDeg, what the solver reads back from them, and the one-line errors.

import { describe, expect, it } from 'vitest';
import { parseTrackText } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';
import { InputError } from '../../src/errors.js';
import { roadProfileOf } from '../../src/track/road-profile.js';
import { simulate } from '../../src/solve/simulate.js';
import { traceCsv } from '../../src/report/trace-csv.js';
import { testCar } from '../helpers/cars.js';

const defaults: TrackReadOptions = { stepM: 1, columns: {}, widthM: null, layout: 'auto', smoothingM: null };

/** A straight open stage along x every 5 m, climbing `grade`, banked `bankDeg`, with the given header names. */
function stageCsv(grade: number, bankDeg: number, header = 'x_m,y_m,z_m,bank_deg', rows = 81): string {
  const lines = [header];
  for (let i = 0; i < rows; i++) lines.push(`${i * 5},0,${(grade * i * 5).toFixed(4)},${bankDeg}`);
  return lines.join('\n');
}

function refused(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    expect((error as Error).message).not.toContain('\n');
    return (error as Error).message;
  }
  throw new Error('accepted');
}

describe('centreline CSV heights and banks', () => {
  it('reads z_m and bank_deg: the grade is the rise over the run, the bank in radians', () => {
    const track = parseTrackText(stageCsv(0.06, 12), 'hill.csv', defaults);
    const road = roadProfileOf(track)!;
    const mid = Math.floor(track.distanceM.length / 2);
    // A uniform climb of 6 in 100: tan(grade) = 0.06; 12 degrees = 0.20944 rad.
    expect(Math.tan(road.gradeRad[mid]!)).toBeCloseTo(0.06, 6);
    expect(road.bankRad[mid]!).toBeCloseTo((12 * Math.PI) / 180, 9);
    expect(road.zM[mid]!).toBeCloseTo(0.06 * track.distanceM[mid]!, 2);
  });

  it('finds them under other names through --columns', () => {
    const text = stageCsv(0.03, 0, 'x_m,y_m,alt,cant');
    const track = parseTrackText(text, 'hill.csv', { ...defaults, columns: { z_m: 'alt', bank_deg: 'cant' } });
    expect(Math.tan(roadProfileOf(track)!.gradeRad[100]!)).toBeCloseTo(0.03, 6);
  });

  it('writes z_m, grade_pct and bank_deg into the trace', () => {
    const track = parseTrackText(stageCsv(0.06, 12), 'hill.csv', defaults);
    const csv = traceCsv(simulate(track, testCar(), { startSpeedMps: 10 }));
    const [header, , , row] = csv.split('\n');
    const cells = header!.split(',');
    expect(cells).toEqual(expect.arrayContaining(['z_m', 'grade_pct', 'bank_deg']));
    const values = row!.split(',');
    expect(Number(values[cells.indexOf('grade_pct')])).toBeCloseTo(6, 2);
    expect(Number(values[cells.indexOf('bank_deg')])).toBeCloseTo(12, 6);
  });

  it('leaves a flat file flat: no road profile, no extra trace columns', () => {
    const track = parseTrackText(stageCsv(0, 0, 'x_m,y_m,a,b'), 'flat.csv', defaults);
    expect(roadProfileOf(track)).toBeNull();
    expect(traceCsv(simulate(track, testCar(), { startSpeedMps: 10 })).split('\n')[0]).not.toContain('z_m');
  });

  it('refuses a height that jumps more than the stated grade between neighbours, naming the row', () => {
    const lines = stageCsv(0, 0).split('\n');
    lines[11] = '50,0,2.5,0';
    expect(refused(() => parseTrackText(lines.join('\n'), 'jump.csv', defaults))).toMatch(
      /^jump\.csv: row 12, column z_m: the height jumps 2\.50 m over 5\.00 m from row 11 \(a grade over 40 %\)$/,
    );
  });

  it('refuses a bank over 45 degrees, naming the row', () => {
    const lines = stageCsv(0, 0).split('\n');
    lines[4] = '15,0,0,50';
    expect(refused(() => parseTrackText(lines.join('\n'), 'steep.csv', defaults))).toMatch(
      /^steep\.csv: row 5, column bank_deg: bank 50 degrees is over 45 degrees$/,
    );
  });
});

describe('segment JSON grades and banks', () => {
  const track = (segments: unknown[], closed = false) =>
    parseTrackText(JSON.stringify({ name: 'hill', closed, widthM: 10, segments }), 'hill.json', defaults);

  it('integrates the grade into heights and rounds the change of grade into a vertical curve', () => {
    const t = track([
      { kind: 'straight', lengthM: 300, gradePct: 5 },
      { kind: 'straight', lengthM: 300, gradePct: -5, bankDeg: 6 },
    ]);
    const road = roadProfileOf(t)!;
    // 5 % over 300 m rises 15 m (rise = grade x run); the crest between is a vertical curve of 50 m, so its
    // curvature is the change of grade over that length: -0.10 / 50 = -0.002 1/m (parabolic vertical curve,
    // AASHTO, A Policy on Geometric Design of Highways and Streets, ch. 3; from memory).
    expect(Math.max(...road.zM)).toBeCloseTo(15 - (0.1 * 50) / 8, 1);
    expect(road.verticalCurvaturePerM[300]!).toBeCloseTo(-0.002, 4);
    expect(road.bankRad[450]!).toBeCloseTo((6 * Math.PI) / 180, 9);
    expect(road.bankRad[100]!).toBe(0);
  });

  it('refuses grades that do not close a closed lap, and banks over 45 degrees, naming the segment', () => {
    const square = (grade: number) =>
      [0, 1, 2, 3].flatMap(() => [
        { kind: 'straight', lengthM: 100, gradePct: grade },
        { kind: 'arc', radiusM: 30, angleDeg: 90 },
      ]);
    expect(refused(() => track(square(2), true))).toMatch(/^hill\.json: segments: the grades do not close the lap/);
    expect(refused(() => track([{ kind: 'straight', lengthM: 100, bankDeg: 60 }]))).toMatch(
      /^hill\.json: segments\[0\]\.bankDeg: 60 degrees is over 45 degrees$/,
    );
  });
});
