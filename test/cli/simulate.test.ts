// The `simulate` and `budget` commands end to end, as a user runs them, including bad input.

import { describe, expect, it, beforeAll } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../helpers/cli.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';

let folder: string;
let stadium: string;
const car = 'cars/brackle-club.json';

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-cli-'));
  stadium = join(folder, 'stadium.json');
  writeFileSync(
    stadium,
    JSON.stringify({
      name: 'test stadium',
      closed: true,
      widthM: 12,
      segments: [
        { kind: 'straight', lengthM: 600 },
        { kind: 'arc', radiusM: 60, angleDeg: 180 },
        { kind: 'straight', lengthM: 600 },
        { kind: 'arc', radiusM: 60, angleDeg: 180 },
      ],
    }),
  );
});

describe('reflap simulate', () => {
  it('prints the JSON summary and writes the trace (on the centreline when asked)', () => {
    const out = join(folder, 'trace.csv');
    const run = runCli(['simulate', '--track', stadium, '--car', car, '--line', 'centreline', '--json', '--out', out]);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    expect(summary.referencePath).toBe('centreline');
    expect(summary.lengthM).toBeCloseTo(1200 + 2 * Math.PI * 60, 0);
    expect(summary.brakingZones).toHaveLength(2);
    // The slowest point of a constant-radius corner without downforce: v = sqrt(mu g R) (Milliken and
    // Milliken, Race Car Vehicle Dynamics, 1995); the club car has muLat 1.3 and no downforce, and drag
    // can only lower the speed a little below that bound.
    const bound = Math.sqrt(1.3 * g * 60);
    expect(summary.minSpeedMps).toBeLessThanOrEqual(bound + 1e-6);
    expect(summary.minSpeedMps).toBeGreaterThan(0.98 * bound);
    const lines = readFileSync(out, 'utf8').trim().split('\n');
    expect(
      lines[0]!.startsWith(
        'distance_m,time_s,speed_mps,speed_kph,ax_mps2,ay_mps2,curvature_1pm,throttle,brake,grip_use',
      ),
    ).toBe(true);
    expect(lines.length - 1).toBe(Math.round(1200 + 2 * Math.PI * 60));
  });

  it('prints a readable summary with the lap time as m:ss.sss and the safety caution, on the racing line by default', () => {
    const run = runCli(['simulate', '--track', stadium, '--car', car]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('Reference path: the minimum-time racing line');
    expect(run.stdout).toMatch(/Lap time\s+\d:\d\d\.\d{3}/);
    expect(run.stdout).toContain('Braking zones (2)');
    expect(run.stdout).toMatch(/Driving at the limit is dangerous/);
  });

  const bad = (name: string, contents: string) => {
    const file = join(folder, name);
    writeFileSync(file, contents);
    return file;
  };

  it.each([
    ['a missing track file', () => ['--track', join(folder, 'nope.json'), '--car', car], /nope\.json/],
    ['a missing car file', () => ['--track', stadium, '--car', join(folder, 'nocar.json')], /nocar\.json: cannot read/],
    [
      'malformed car JSON',
      () => ['--track', stadium, '--car', bad('broken.json', '{"massKg": 600,')],
      /broken\.json: not valid JSON/,
    ],
    [
      'a negative mass',
      () => ['--track', stadium, '--car', bad('neg.json', carJson({ massKg: -5 }))],
      /neg\.json: field massKg/,
    ],
    [
      'zero power',
      () => ['--track', stadium, '--car', bad('zero.json', carJson({ powertrain: { maxPowerW: 0 } }))],
      /zero\.json: field powertrain\.maxPowerW/,
    ],
    [
      'an unknown car key',
      () => ['--track', stadium, '--car', bad('typo.json', carJson({ masKg: 600 }))],
      /typo\.json: unknown field masKg/,
    ],
    [
      'a missing required field',
      () => ['--track', stadium, '--car', bad('nomu.json', carJson({ tyre: { muLat: 1.2 } }))],
      /nomu\.json: missing required field tyre\.muLong/,
    ],
    [
      'a closed track that does not close',
      () => [
        '--track',
        bad(
          'open.json',
          JSON.stringify({
            name: 'x',
            closed: true,
            widthM: 10,
            segments: [
              { kind: 'straight', lengthM: 300 },
              { kind: 'arc', radiusM: 50, angleDeg: 180 },
              { kind: 'straight', lengthM: 280 },
              { kind: 'arc', radiusM: 50, angleDeg: 180 },
            ],
          }),
        ),
        '--car',
        car,
      ],
      /open\.json.*20(\.\d+)? m/,
    ],
    [
      'a non-numeric option',
      () => ['--track', stadium, '--car', car, '--step-m', 'fast'],
      /--step-m: 'fast' is not a number/,
    ],
  ])('rejects %s with one line, exit code 2 and no output', (_name, args, message) => {
    const out = join(folder, `should-not-exist-${Math.random().toString(36).slice(2)}.csv`);
    const run = runCli(['simulate', ...args(), '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
  });

  it('drives the centreline with a one-line note where the track gives no widths', () => {
    const narrowless = bad(
      'no-widths.json',
      JSON.stringify({ ...JSON.parse(readFileSync(stadium, 'utf8')), widthM: undefined, name: 'no widths' }),
    );
    const run = runCli(['simulate', '--track', narrowless, '--car', car, '--json']);
    expect(run.code, run.stderr).toBe(0);
    const summary = JSON.parse(run.stdout);
    expect(summary.referencePath).toBe('centreline');
    expect(summary.referencePathNote).toMatch(/no-widths\.json gives no widths.*--width-m/);
    const text = runCli(['simulate', '--track', narrowless, '--car', car]);
    expect(text.stdout.split('\n').filter((line) => line.startsWith('Note:'))).toHaveLength(1);
  });

  it('refuses to write the trace over an input file', () => {
    const copy = bad('car-copy.json', readFileSync(car, 'utf8'));
    const before = readFileSync(copy, 'utf8');
    const run = runCli(['simulate', '--track', stadium, '--car', copy, '--out', copy]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/refusing to write the output over an input file/);
    expect(readFileSync(copy, 'utf8')).toBe(before);
  });
});

describe('reflap budget', () => {
  it('gives the ellipse and the linear split side by side', () => {
    const run = runCli(['budget', '--car', car, '--speed-kph', '100', '--lateral-g', '0.65', '--json']);
    expect(run.code).toBe(0);
    const budget = JSON.parse(run.stdout);
    // Club car: muLat 1.3 without downforce, so the lateral limit is 1.3 g at any speed (point mass).
    expect(budget.lateralLimitG).toBeCloseTo(1.3, 3);
    expect(budget.lateralShare).toBeCloseTo(0.5, 3);
    expect(budget.brakingAvailableG).toBeGreaterThan(budget.linearSplit.brakingAvailableG);
  });

  it('needs exactly one of --lateral-g and --radius-m', () => {
    const run = runCli(['budget', '--car', car, '--speed-kph', '100']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/exactly one of --lateral-g and --radius-m/);
  });
});

function carJson(change: Record<string, unknown>): string {
  const base = JSON.parse(readFileSync(car, 'utf8'));
  for (const [key, value] of Object.entries(change)) {
    base[key] = typeof value === 'object' && value !== null ? { ...base[key], ...value } : value;
  }
  if ('tyre' in change && !('muLong' in (change.tyre as object))) delete base.tyre.muLong;
  return JSON.stringify(base);
}
