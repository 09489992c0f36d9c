// `reflap line` and `simulate --line` end to end, as a user runs them, including bad input.

import { beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../helpers/cli.js';
import { expectConverted } from '../report/converted-quantities.js';

let folder: string;
let ringTrack: string;
let bareTrack: string;
let foldTrack: string;
const car = 'cars/brackle-club.json';

function segmentTrack(file: string, spec: object): string {
  const path = join(folder, file);
  writeFileSync(path, JSON.stringify(spec));
  return path;
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-line-'));
  ringTrack = segmentTrack('ring.json', {
    name: 'test ring',
    closed: true,
    widthM: 10,
    segments: [{ kind: 'arc', radiusM: 100, angleDeg: 360 }],
  });
  bareTrack = segmentTrack('bare.json', {
    name: 'no widths',
    closed: true,
    segments: [{ kind: 'arc', radiusM: 100, angleDeg: 360 }],
  });
  foldTrack = segmentTrack('fold.json', {
    name: 'too wide',
    closed: true,
    widthM: 230,
    segments: [{ kind: 'arc', radiusM: 100, angleDeg: 360 }],
  });
});

describe('reflap line', () => {
  it('prints the minimum-curvature line of a ring: the outer edge, radius 105 m', () => {
    const run = runCli([
      'line',
      '--track',
      ringTrack,
      '--car',
      car,
      '--objective',
      'curvature',
      '--margin-m',
      '0',
      '--step-m',
      '2',
      '--json',
    ]);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    // Outer edge of a 100 m ring 10 m wide: radius 105 m, length 2 pi 105 (geometry), within 1 %.
    expect(Math.abs(summary.minRadiusM / 105 - 1)).toBeLessThan(0.01);
    expect(Math.abs(summary.lengthM / (2 * Math.PI * 105) - 1)).toBeLessThan(0.01);
    expect(summary.maxOffsetM).toBeCloseTo(5, 1);
    for (const key of ['lapTimeCentrelineS', 'lapTimeLineS', 'lengthM', 'minRadiusM', 'maxOffsetM'])
      expect(typeof summary[key]).toBe('number');
  });

  it('writes the time line as CSV, and simulate --line drives it', () => {
    const out = join(folder, 'line.csv');
    const run = runCli([
      'line',
      '--track',
      ringTrack,
      '--car',
      car,
      '--margin-m',
      '0',
      '--step-m',
      '2',
      '--json',
      '--out',
      out,
    ]);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    // Inner edge: radius 95 m (T = 2 pi sqrt(R / (mu g)) falls with R), within 1 %.
    expect(Math.abs(summary.minRadiusM / 95 - 1)).toBeLessThan(0.01);
    expect(summary.lapTimeLineS).toBeLessThan(summary.lapTimeCentrelineS);
    const lines = readFileSync(out, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('s_m,offset_m,x_m,y_m,curvature_1pm');
    expect(lines.length - 1).toBe(Math.round((2 * Math.PI * 100) / 2));

    const trace = join(folder, 'trace.csv');
    const sim = runCli([
      'simulate',
      '--track',
      ringTrack,
      '--car',
      car,
      '--step-m',
      '2',
      '--line',
      out,
      '--json',
      '--out',
      trace,
    ]);
    expect(sim.code).toBe(0);
    // The same line read back (offsets rounded to 0.1 mm) gives the same lap.
    expect(JSON.parse(sim.stdout).lapTimeS).toBeCloseTo(summary.lapTimeLineS, 2);
    const header = readFileSync(trace, 'utf8').split('\n')[0]!.split(',');
    expect(header).toEqual(expect.arrayContaining(['offset_m', 'x_m', 'y_m']));
  });

  it('simulate --line auto computes the line first', () => {
    const ring = (line: string) =>
      runCli(['simulate', '--track', ringTrack, '--car', car, '--step-m', '2', '--line', line, '--json']);
    const sim = ring('auto');
    const centre = ring('centreline');
    expect(sim.code).toBe(0);
    expect(JSON.parse(sim.stdout).lapTimeS).toBeLessThan(JSON.parse(centre.stdout).lapTimeS);
  });

  it('prints a text summary with the caution', () => {
    const args = ['line', '--track', ringTrack, '--car', car, '--objective', 'curvature', '--step-m', '4'];
    const run = runCli(args);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/Lap on the line/);
    expect(run.stdout).toMatch(/Caution: /);
    // Under imperial the margin, lengths, radius and offset read feet, each the metric figure converted through
    // 1 ft = 0.3048 m (NIST SP 811, appendix B) within both roundings; the times unchanged.
    const imperial = runCli([...args, '--units', 'imperial']);
    expect(imperial.code, imperial.stderr).toBe(0);
    expectConverted(run.stdout, imperial.stdout);
    expect(imperial.stdout).toMatch(/Line length +\d+\.\d ft \(centreline \d+\.\d ft\)/);
  });
});

describe('reflap line: bad input', () => {
  it('says the track has no widths and how to give them', () => {
    const run = runCli(['line', '--track', bareTrack, '--car', car, '--step-m', '4']);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/no widths.*--width-m/);
  });

  it('names the first distance where the margin does not fit', () => {
    const run = runCli(['line', '--track', ringTrack, '--car', car, '--margin-m', '6', '--step-m', '4']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/at 0\.0 m the track is 10\.00 m wide, less than twice the margin/);
  });

  it('names where the edges fold over themselves', () => {
    const run = runCli(['line', '--track', foldTrack, '--car', car, '--margin-m', '0', '--step-m', '4']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/at 0\.0 m the left edge folds over itself/);
  });

  it('refuses to write over an input and leaves no file behind on error', () => {
    const run = runCli(['line', '--track', ringTrack, '--car', car, '--step-m', '4', '--out', ringTrack]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/refusing to write the output over an input file/);
    const out = join(folder, 'never.csv');
    const bad = runCli(['line', '--track', bareTrack, '--car', car, '--step-m', '4', '--out', out]);
    expect(bad.code).toBe(2);
    expect(existsSync(out)).toBe(false);
  });

  it('refuses a line file made for another track', () => {
    const other = segmentTrack('other.json', {
      name: 'other',
      closed: true,
      widthM: 10,
      segments: [{ kind: 'arc', radiusM: 60, angleDeg: 360 }],
    });
    const out = join(folder, 'other-line.csv');
    expect(
      runCli(['line', '--track', other, '--car', car, '--objective', 'curvature', '--step-m', '2', '--out', out]).code,
    ).toBe(0);
    const sim = runCli(['simulate', '--track', ringTrack, '--car', car, '--step-m', '2', '--line', out]);
    expect(sim.code).toBe(2);
    expect(sim.stderr).toMatch(/other-line\.csv: .*another track/);
  });
});
