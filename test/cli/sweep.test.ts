// `reflap whatif`, `reflap sweep` (with shards and --merge) and `reflap stint` end to end, with bad input.

import { beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../helpers/cli.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { writeHairpin, writeSlickCar, writeTestLoop } from '../report/sweep-fixtures.js';

let folder: string;
let loop: string;
let hairpin: string;
let slick: string;
const car = 'cars/brackle-club.json';

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-sweep-'));
  loop = writeTestLoop(folder);
  hairpin = writeHairpin(folder);
  slick = writeSlickCar(folder);
});

describe('reflap whatif', () => {
  it('moves the braking point by the difference of the kinematic braking distances', () => {
    const run = runCli([
      'whatif',
      '--track',
      hairpin,
      '--car',
      slick,
      '--start-speed-kph',
      '180',
      '--set',
      'tyre.muLong=-20%',
      '--line',
      'centreline',
      '--json',
    ]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.brakingZones).toHaveLength(1);
    // Constant-deceleration kinematics: d = (v1^2 - v2^2) / (2 mu g), v2^2 = muLat g R (steady cornering).
    const v1 = 50;
    const v2sq = 1.2 * g * 20;
    const d = (mu: number) => (v1 * v1 - v2sq) / (2 * mu * g);
    const zone = result.brakingZones[0];
    expect(Math.abs(zone.brakingPointShiftM - -(d(0.96) - d(1.2)))).toBeLessThan(1);
    expect(Math.abs(zone.startM - (600 - d(1.2)))).toBeLessThan(1.5);
    expect(Math.abs(zone.minSpeedDeltaKph)).toBeLessThan(0.1);
    expect(result.lapTimeDeltaS).toBeGreaterThan(0);
  });

  it('prints a table per corner', () => {
    const run = runCli(['whatif', '--track', loop, '--car', car, '--set', 'massKg=+20', 'tyre.muLat=-5%']);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/Lap time .* -> .*\(\+\d\.\d{3} s\)/);
    expect(run.stdout).toContain(
      "Reference path: the minimum-time racing line (the baseline car's, held for every setup)",
    );
    expect(run.stdout).toMatch(/^c4 /m);
    expect(run.stdout).toMatch(/Caution/);
  });

  it('refuses bad changes with one line and exit code 2', () => {
    for (const [args, pattern] of [
      [['--set', 'tyre.mulat=1.3'], /did you mean 'tyre.muLat'/],
      [['--set', 'massKg=-700'], /massKg must be between 20 and 20000 kg/],
      [['--set', 'massKg'], /FIELD=VALUE/],
    ] as const) {
      const run = runCli(['whatif', '--track', loop, '--car', car, ...args]);
      expect(run.code).toBe(2);
      expect(run.stderr.trim().split('\n')).toHaveLength(1);
      expect(run.stderr).toMatch(pattern);
      expect(run.stdout).toBe('');
    }
  });
});

describe('reflap sweep', () => {
  const vary = ['--vary', 'massKg=600:640:20', 'tyre.muLat=-5%:+5%:5%'];
  // The shard checks run on the centreline: one line search per run would add nothing they check.
  const centreline = ['--line', 'centreline'];

  it('writes the runs, and merged shards equal the unsharded CSV byte for byte', () => {
    const whole = join(folder, 'whole.csv');
    const wholeHtml = join(folder, 'whole.html');
    const first = runCli([
      'sweep',
      '--track',
      loop,
      '--car',
      car,
      ...vary,
      ...centreline,
      '--workers',
      '2',
      '--out',
      whole,
      '--html',
      wholeHtml,
    ]);
    expect(first.code).toBe(0);
    expect(first.stdout).toMatch(/Sensitivity around the baseline/);
    const shards = [1, 2, 3].map((i) => {
      const out = join(folder, `part${i}.csv`);
      const run = runCli([
        'sweep',
        '--track',
        loop,
        '--car',
        car,
        ...vary,
        ...centreline,
        '--workers',
        '1',
        '--shard',
        `${i}/3`,
        '--out',
        out,
      ]);
      expect(run.code).toBe(0);
      return out;
    });
    const merged = join(folder, 'merged.csv');
    const mergedHtml = join(folder, 'merged.html');
    const join3 = runCli([
      'sweep',
      '--merge',
      shards[2]!,
      shards[0]!,
      shards[1]!,
      '--out',
      merged,
      '--html',
      mergedHtml,
    ]);
    expect(join3.code).toBe(0);
    expect(join3.stdout).toContain(`Report written to ${mergedHtml}`);
    expect(readFileSync(merged)).toEqual(readFileSync(whole));
    // The report of the merged shards is the report of the unsharded run.
    expect(readFileSync(mergedHtml, 'utf8')).toBe(readFileSync(wholeHtml, 'utf8'));
    expect(readFileSync(mergedHtml, 'utf8')).toContain('data-chart="lap-time-tyre.muLat"');
    const lines = readFileSync(whole, 'utf8').split('\n');
    expect(lines.filter((l) => /^\d/.test(l))).toHaveLength(1 + 4 + 9);
    // Five runs of the CLI, two with workers: more than the default time on a shared machine.
  }, 180_000);

  it('prints JSON with the sensitivities', () => {
    const run = runCli([
      'sweep',
      '--track',
      loop,
      '--car',
      car,
      ...vary,
      '--mode',
      'one-at-a-time',
      '--workers',
      '0',
      '--json',
    ]);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.complete).toBe(true);
    // The loop gives widths: the baseline car's racing line, computed once and held for every setup.
    expect(result.referencePath).toBe('line');
    expect(result.referencePathShared).toBe(true);
    expect(result.sensitivities.map((s: { field: string }) => s.field)).toEqual(['massKg', 'tyre.muLat']);
    expect(result.sensitivities[0].lapTimeSPerUnit).toBeGreaterThan(0);
    expect(run.stderr).toBe('');
  });

  it('refuses a report path that is one of the shards to merge, writing nothing', () => {
    const shard = join(folder, 'lone-shard.csv');
    expect(
      runCli(['sweep', '--track', loop, '--car', car, '--vary', 'massKg=600:620:20', '--workers', '0', '--out', shard])
        .code,
    ).toBe(0);
    const before = readFileSync(shard, 'utf8');
    const out = join(folder, 'never-merged.csv');
    const run = runCli(['sweep', '--merge', shard, '--out', out, '--html', shard]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(readFileSync(shard, 'utf8')).toBe(before);
    expect(existsSync(out)).toBe(false);
  });

  it('refuses bad sweeps with one line and exit code 2, writing nothing', () => {
    const out = join(folder, 'never.csv');
    for (const [args, pattern] of [
      [['--vary', 'massKg=600:640:0'], /step is zero/],
      [['--vary', 'massKg=600:640:-10'], /wrong sign/],
      [['--vary', 'tyre.mu=1:1.2:0.1'], /did you mean 'tyre.muL(at|ong)'/],
      [['--vary', 'massKg=0:40:20'], /massKg must be between 20 and 20000 kg/],
      [['--vary', 'massKg=600:640:20', '--shard', '4/3'], /between 1 and 3/],
    ] as const) {
      const run = runCli(['sweep', '--track', loop, '--car', car, ...args, '--out', out]);
      expect(run.code).toBe(2);
      expect(run.stderr.trim().split('\n')).toHaveLength(1);
      expect(run.stderr).toMatch(pattern);
    }
    expect(existsSync(out)).toBe(false);
  });
});

describe('reflap stint', () => {
  it('burns the fuel off lap by lap', () => {
    const args = ['stint', '--track', loop, '--car', car, '--laps', '5'];
    const run = runCli([...args, '--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    // Brackle club racer: 25 kg of fuel, 1.1 kg a lap.
    expect(result.laps.map((l: { fuelKg: number }) => l.fuelKg)).toEqual([25, 23.9, 22.8, 21.7, 20.6]);
    const times = result.laps.map((l: { lapTimeS: number }) => l.lapTimeS);
    for (let k = 1; k < times.length; k++) expect(times[k]).toBeLessThan(times[k - 1]);

    // Under imperial the braking table and the CSV are in feet and mph: each figure the JSON's metric one converted
    // through 1 ft = 0.3048 m and 1 mph = 0.44704 m/s (NIST SP 811, appendix B), within the rounding written.
    const csvFile = join(folder, 'stint-imperial.csv');
    const imperial = runCli([...args, '--units', 'imperial', '--out', csvFile]);
    expect(imperial.code, imperial.stderr).toBe(0);
    expect(imperial.stdout).toMatch(/slowest at ft +lap 1 brake ft +lap 5 brake ft +drift ft +slowest mph/);
    expect(imperial.stdout).not.toMatch(/ km\/h|brake m\b/);
    const first = result.laps[0];
    const last = result.laps[4];
    const rows = imperial.stdout.split('\n').filter((line) => / -> /.test(line));
    expect(rows).toHaveLength(result.corners.length);
    rows.forEach((row, k) => {
      const cells = row.trim().split(/ {2,}/);
      const [slowestAt, firstBrake, lastBrake] = cells.slice(-5, -2).map(Number);
      const [firstMph, lastMph] = cells.at(-1)!.split(' -> ').map(Number);
      expect(Math.abs(slowestAt! - result.corners[k].minSpeedAtM / 0.3048)).toBeLessThanOrEqual(0.5 + 1e-6);
      expect(Math.abs(firstBrake! - first.brakingPointM[k] / 0.3048)).toBeLessThanOrEqual(0.05 + 1e-6);
      expect(Math.abs(lastBrake! - last.brakingPointM[k] / 0.3048)).toBeLessThanOrEqual(0.05 + 1e-6);
      expect(Math.abs(firstMph! - first.minSpeedKph[k] / 3.6 / 0.44704)).toBeLessThanOrEqual(0.05 + 1e-6);
      expect(Math.abs(lastMph! - last.minSpeedKph[k] / 3.6 / 0.44704)).toBeLessThanOrEqual(0.05 + 1e-6);
    });
    const [header, ...lines] = readFileSync(csvFile, 'utf8').trim().split('\n');
    const tag = result.corners[0].tag;
    const columns = header!.split(',');
    expect(columns).toContain(`${tag}_brake_ft`);
    expect(columns).toContain(`${tag}_min_mph`);
    const cells = lines[0]!.split(',').map(Number);
    expect(Math.abs(cells[columns.indexOf(`${tag}_brake_ft`)]! - first.brakingPointM[0] / 0.3048)).toBeLessThan(3e-3);
    expect(Math.abs(cells[columns.indexOf(`${tag}_min_mph`)]! - first.minSpeedKph[0] / 3.6 / 0.44704)).toBeLessThan(
      2e-3,
    );
  });
  it('refuses a lap count that is not a whole number', () => {
    const run = runCli(['stint', '--track', loop, '--car', car, '--laps', '2.5']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/--laps/);
  });
});
