// `reflap heights` on a GPX log built here on a known hill: a closed invented circuit whose height is a given
// function of the distance round it, driven three times with the altitude and position noise of a consumer GPS
// receiver, must give back that hill within the accuracy the command states; a log without altitudes is refused.

import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { localPlane } from '../../src/track/geodesy.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-heights-'));
/**
 * An invented circuit without symmetry (a symmetric one could be placed on itself turned round): a rounded rectangle
 * with quarter turns to the left of radii 50, 120, 80 and 60 m, each after a straight; heading east, north, west and
 * south in turn it closes when L1 + R1 - R2 - L3 - R3 + R4 = 0 and R1 + L2 + R2 - R3 - L4 - R4 = 0, so with
 * L1 = 500 and L2 = 300, L3 = 410 and L4 = 330.
 */
const RADII_M = [50, 120, 80, 60];
const STRAIGHTS_M = [500, 300, 410, 330];
const LENGTH_M = STRAIGHTS_M.reduce((a, b) => a + b, 0) + (Math.PI / 2) * RADII_M.reduce((a, b) => a + b, 0);

/** The centreline at distance s from the start (the start of the first straight, heading east). */
function pointAt(s: number): [number, number] {
  let u = ((s % LENGTH_M) + LENGTH_M) % LENGTH_M;
  let x = 0;
  let y = 0;
  let heading = 0;
  for (let k = 0; k < 4; k++) {
    const straight = STRAIGHTS_M[k]!;
    if (u < straight) return [x + u * Math.cos(heading), y + u * Math.sin(heading)];
    u -= straight;
    x += straight * Math.cos(heading);
    y += straight * Math.sin(heading);
    const r = RADII_M[k]!;
    const cx = x - r * Math.sin(heading);
    const cy = y + r * Math.cos(heading);
    const arc = (Math.PI / 2) * r;
    if (u < arc) {
      const turned = heading + u / r;
      return [cx + r * Math.sin(turned), cy - r * Math.cos(turned)];
    }
    u -= arc;
    heading += Math.PI / 2;
    x = cx + r * Math.sin(heading);
    y = cy - r * Math.cos(heading);
  }
  return [x, y];
}

/** The known hill: 10 m up and down once a lap with a 3 m ripple three times a lap (invented). */
const heightAt = (s: number) =>
  10 * Math.sin((2 * Math.PI * s) / LENGTH_M) + 3 * Math.cos((6 * Math.PI * s) / LENGTH_M);

function writeTrack(file: string): void {
  const rows = ['x_m,y_m,width_left_m,width_right_m'];
  for (let s = 0; s < LENGTH_M - 2.5; s += 5) {
    const [x, y] = pointAt(s);
    rows.push(`${x.toFixed(3)},${y.toFixed(3)},6,6`);
  }
  writeFileSync(file, rows.join('\n') + '\n');
}

/**
 * Three laps at 30 m/s, 5 fixes a second. Noise (from memory, typical of a consumer receiver, no source): altitude
 * 1.5 m white plus a drift of 2 m that wanders with a 60 s time constant; positions 0.5 m white.
 */
function writeGpx(file: string, withHeights: boolean): void {
  const { gaussian } = seededRandom(14);
  const plane = localPlane({ latDeg: 46.8, lonDeg: 7.15 });
  const geo = new Float64Array(2);
  const rateHz = 5;
  const speedMps = 30;
  const count = Math.floor(((3 * LENGTH_M) / speedMps) * rateHz);
  const decay = Math.exp(-1 / (60 * rateHz));
  let drift = 0;
  const points: string[] = [];
  const start = Date.UTC(2026, 4, 2, 10, 0, 0);
  for (let k = 0; k < count; k++) {
    const s = (k * speedMps) / rateHz;
    const [x, y] = pointAt(s);
    drift = decay * drift + 2 * Math.sqrt(1 - decay * decay) * gaussian();
    plane.toGeodetic(x + 0.5 * gaussian(), y + 0.5 * gaussian(), geo);
    const ele = withHeights ? `<ele>${(420 + heightAt(s) + drift + 1.5 * gaussian()).toFixed(2)}</ele>` : '';
    const time = new Date(start + (k * 1000) / rateHz).toISOString();
    points.push(`<trkpt lat="${geo[0]!.toFixed(8)}" lon="${geo[1]!.toFixed(8)}">${ele}<time>${time}</time></trkpt>`);
  }
  writeFileSync(
    file,
    `<?xml version="1.0" encoding="UTF-8"?>\n<gpx version="1.1" creator="reflap tests" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>\n${points.join('\n')}\n</trkseg></trk></gpx>\n`,
  );
}

describe('reflap heights', () => {
  const trackFile = path.join(work, 'circuit.csv');
  writeTrack(trackFile);

  it('gives back a known hill from noisy GPS altitudes, within the accuracy it states', () => {
    const log = path.join(work, 'hill.gpx');
    const out = path.join(work, 'circuit-heights.csv');
    writeGpx(log, true);
    const run = runCli(['heights', '--track', trackFile, '--telemetry', log, '--out', out]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const accuracy = Number(/Accuracy about ±([\d.]+) m/.exec(run.stdout)?.[1]);
    expect(accuracy).toBeGreaterThan(0);
    const rows = readFileSync(out, 'utf8').trim().split('\n');
    expect(rows[0]).toBe('x_m,y_m,width_left_m,width_right_m,z_m');
    const cells = rows.slice(1).map((row) => row.split(',').map(Number));
    // Distance round the written centreline, from its first row (the track's start, where the hill's s = 0).
    let s = 0;
    const errors: number[] = [];
    cells.forEach((cell, j) => {
      if (j > 0) s += Math.hypot(cell[0]! - cells[j - 1]![0]!, cell[1]! - cells[j - 1]![1]!);
      errors.push(cell[4]! - 420 - heightAt(s));
    });
    // The datum is free (the receiver's drift over the session shifts every height alike): the mean error is removed.
    const mean = errors.reduce((a, b) => a + b, 0) / errors.length;
    const rms = Math.sqrt(errors.reduce((a, b) => a + (b - mean) ** 2, 0) / errors.length);
    // The hill is about 25 m from lowest to highest; the profile follows it within two of the standard errors the command
    // states (a normal error strays further in 5 % of stations; standard normal tables), and the stated accuracy is
    // no more than three times the error it had (an honest, not a padded, figure).
    expect(rms).toBeLessThan(2 * accuracy);
    expect(accuracy).toBeLessThan(3 * rms);
    // Read back by the track reader: the z_m column is taken as the track's height.
    const readBack = runCli([
      'simulate',
      '--track',
      out,
      '--car',
      path.join(projectRoot, 'cars', 'tarnfell-gt.json'),
      '--json',
    ]);
    expect(readBack.code).toBe(0);
    // The solver's road object carries the height range of the track it read (docs/tracks.md).
    expect(JSON.parse(readBack.stdout).road.heightRangeM).toBeGreaterThan(15);

    // The same profile told in feet under --units imperial (1 ft = 0.3048 m exactly, NIST SP 811, appendix B); the
    // written track keeps its z_m column in metres, byte for byte.
    const outFt = path.join(work, 'circuit-heights-ft.csv');
    const imperial = runCli([
      'heights',
      '--track',
      trackFile,
      '--telemetry',
      log,
      '--out',
      outFt,
      '--units',
      'imperial',
    ]);
    expect(imperial.code).toBe(0);
    expect(readFileSync(outFt, 'utf8')).toBe(readFileSync(out, 'utf8'));
    /** Each figure with its unit, and half a unit of its last decimal (its rounding). */
    const figures = (text: string, unit: string) =>
      [...text.matchAll(new RegExp(`([\\d.]+) ${unit}\\b`, 'g'))].map((match) => ({
        value: Number(match[1]),
        rounding: 0.5 * 10 ** -(match[1]!.split('.')[1]?.length ?? 0),
      }));
    const metres = figures(run.stdout, 'm');
    const feet = figures(imperial.stdout, 'ft');
    expect(feet.length).toBe(metres.length);
    expect(metres.length).toBeGreaterThanOrEqual(5);
    expect(figures(imperial.stdout, 'm')).toEqual([]);
    metres.forEach((m, k) => {
      const ft = feet[k]!;
      expect(Math.abs(ft.value * 0.3048 - m.value)).toBeLessThanOrEqual(m.rounding + ft.rounding * 0.3048 + 1e-9);
    });
  });

  it('refuses a log without altitudes in one line, exit code 2, and writes nothing', () => {
    const log = path.join(work, 'flat.gpx');
    const out = path.join(work, 'never.csv');
    writeGpx(log, false);
    const run = runCli(['heights', '--track', trackFile, '--telemetry', log, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/flat\.gpx: the log has no altitudes/);
    expect(existsSync(out)).toBe(false);
  });
});
