// Values near the largest double reach the CLI as the user's error (one line naming the field and its range,
// exit 2, nothing written), not as "Lap time n/a (NaN s)" or an internal error. Ranges: src/car/car-ranges.ts.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { projectRoot, runCli } from '../helpers/cli.js';

let folder: string;
const track = join(projectRoot, 'tracks', 'tarnwick-club.json');
const carFile = join(projectRoot, 'cars', 'brackle-club.json');

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-range-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function expectRefused(run: ReturnType<typeof runCli>, pattern: RegExp): void {
  expect(run.code).toBe(2);
  expect(run.stdout).toBe('');
  const lines = run.stderr.trim().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(pattern);
}

describe('numbers at the edge of the double range', () => {
  it('a car file of mass 1e308 or grip 1e-300: the field and its range, nothing written', () => {
    const car = JSON.parse(readFileSync(carFile, 'utf8')) as { massKg: number; tyre: { muLat: number } };
    const heavy = join(folder, 'heavy.json');
    writeFileSync(heavy, JSON.stringify({ ...car, massKg: 1e308 }));
    const out = join(folder, 'lap.csv');
    expectRefused(
      runCli(['simulate', '--track', track, '--car', heavy, '--out', out]),
      /heavy\.json: field massKg must be between 20 and 20000 kg \(got 1e\+308\)$/,
    );
    const slick = join(folder, 'slick.json');
    writeFileSync(slick, JSON.stringify({ ...car, tyre: { ...car.tyre, muLat: 1e-300 } }));
    expectRefused(
      runCli(['simulate', '--track', track, '--car', slick]),
      /field tyre\.muLat must be between 0\.05 and 5/,
    );
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(folder).sort()).toEqual(['heavy.json', 'slick.json']);
  });

  it('whatif --set massKg=1e308 names the setting and the range', () => {
    expectRefused(
      runCli(['whatif', '--track', track, '--car', carFile, '--set', 'massKg=1e308']),
      /--set massKg=1e308 .*field massKg must be between 20 and 20000 kg/,
    );
  });
});
