// One corner identity across commands: `reflap corners` writes the file, the user merges two corners and renames
// one, and simulate, whatif, sweep, stint and compare all report the same corner numbers and names with
// --corners; a bad corners file is one line naming the entry, exit code 2, nothing written. The references drive the
// demo car's racing line, computed once for the test run.

import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { sharedLineArgs } from '../helpers/shared-line.js';

const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const car = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const work = mkdtempSync(path.join(tmpdir(), 'reflap-corners-'));
const detectedFile = path.join(work, 'detected.json');
const editedFile = path.join(work, 'edited.json');
const trace = path.join(work, 'trace.csv');
const line = sharedLineArgs(track, car);

interface FileCorner {
  number: number;
  name: string | null;
  entryM: number;
  apexM: number;
  exitM: number;
}
let edited: FileCorner[] = [];

beforeAll(() => {
  const run = runCli(['corners', '--track', track, '--out', detectedFile]);
  expect(run.code).toBe(0);
  const file = JSON.parse(readFileSync(detectedFile, 'utf8'));
  const corners: FileCorner[] = file.corners;
  // The chicane is found as two corners of opposite sense; merge them into one and rename another.
  const chicane = corners.findIndex((c) => c.name === 'Tansy Chicane');
  expect(chicane).toBeGreaterThan(0);
  const merged = { ...corners[chicane]!, exitM: corners[chicane + 1]!.exitM };
  edited = [
    ...corners.slice(0, chicane),
    merged,
    ...corners.slice(chicane + 2).map((c) => ({ ...c, name: c.name ?? 'Unnamed Bend' })),
  ];
  edited[0] = { ...edited[0]!, name: 'First Hairpin' };
  writeFileSync(editedFile, JSON.stringify({ ...file, corners: edited }, null, 2));
  expect(runCli(['simulate', '--track', track, '--car', car, ...line, '--out', trace]).code).toBe(0);
});

const common = ['--track', track, '--car', car, ...line, '--corners', editedFile];
const json = (args: string[]) => {
  const run = runCli(args);
  expect(run.stderr).toBe('');
  expect(run.code).toBe(0);
  return JSON.parse(run.stdout);
};

describe('the same corner numbers and names in every command', () => {
  it('lists the edited corners', () => {
    const listed = json(['corners', '--track', track, '--corners', editedFile, '--json']);
    expect(listed.corners.map((c: FileCorner) => [c.number, c.name])).toEqual(edited.map((c) => [c.number, c.name]));
  });

  it('simulate, whatif, sweep, stint and compare agree with the corners file', () => {
    const known = new Map(edited.map((c) => [c.number, c.name]));
    const simulated = json(['simulate', ...common, '--json']);
    const zones: { corner: number; cornerName: string | null; tag: string }[] = simulated.brakingZones;
    expect(zones.length).toBeGreaterThan(3);
    for (const zone of zones) {
      expect(known.has(zone.corner)).toBe(true);
      expect(zone.cornerName).toBe(known.get(zone.corner));
    }
    expect(simulated.corners.map((c: FileCorner) => c.number)).toEqual([...known.keys()]);

    const whatif = json(['whatif', ...common, '--set', 'massKg=+20', '--json']);
    expect(whatif.brakingZones.map((z: { corner: number; tag: string }) => [z.corner, z.tag])).toEqual(
      zones.map((z) => [z.corner, z.tag]),
    );

    const sweepCsv = path.join(work, 'sweep.csv');
    const sweep = runCli(['sweep', ...common, '--vary', 'massKg=1400:1500:100', '--out', sweepCsv]);
    expect(sweep.code).toBe(0);
    const header = readFileSync(sweepCsv, 'utf8')
      .split('\n')
      .find((line) => line.startsWith('run,'))!;
    expect(header.split(',').filter((h) => h.endsWith('_brake_m'))).toEqual(zones.map((z) => `${z.tag}_brake_m`));

    const stint = json(['stint', ...common, '--laps', '2', '--json']);
    expect(stint.corners.map((c: { corner: number }) => c.corner)).toEqual(zones.map((z) => z.corner));

    const compared = json(['compare', ...common, '--telemetry', trace, '--json']);
    expect(compared.corners.map((c: { id: number; name: string | null }) => [c.id, c.name])).toEqual(
      edited.map((c) => [c.number, c.name]),
    );
  });
});

describe('the corners table under --units imperial', () => {
  it('names every distance in feet and the lap in miles, the metric figures converted', () => {
    // 1 ft = 0.3048 m and 1 mile = 1609.344 m (NIST SP 811, appendix B); each side rounded to what it shows.
    const metric = runCli(['corners', '--track', track]);
    const imperial = runCli(['corners', '--track', track, '--units', 'imperial']);
    expect(imperial.code, imperial.stderr).toBe(0);
    const km = Number(/ · ([\d.]+) km · /.exec(metric.stdout)![1]);
    const miles = Number(/ · ([\d.]+) mi · /.exec(imperial.stdout)![1]);
    expect(Math.abs(miles - (km * 1000) / 1609.344)).toBeLessThanOrEqual(0.0005 * (1000 / 1609.344) + 0.0005 + 1e-9);
    expect(imperial.stdout).toMatch(/entry ft +apex ft +exit ft +radius ft/);
    expect(imperial.stdout).toMatch(/from ft +to ft/);
    // Every row's figures: the corners' entry, apex, exit and radius, then the sectors' bounds.
    const figures = (text: string) =>
      text
        .split('\n')
        .filter((row) => /^\d+ /.test(row))
        .map((row) =>
          row
            .trim()
            .split(/ {2,}/)
            .filter((cell) => /^\d+$/.test(cell))
            .map(Number),
        );
    const metricRows = figures(metric.stdout);
    const imperialRows = figures(imperial.stdout);
    expect(imperialRows.map((row) => row.length)).toEqual(metricRows.map((row) => row.length));
    expect(metricRows.flat().length).toBeGreaterThan(20);
    metricRows.forEach((row, r) =>
      row.forEach((metres, k) => {
        // The leading number is the corner's or sector's own, not a distance.
        if (k === 0) return expect(imperialRows[r]![k]).toBe(metres);
        expect(Math.abs(imperialRows[r]![k]! - metres / 0.3048)).toBeLessThanOrEqual(0.5 / 0.3048 + 0.5 + 1e-9);
      }),
    );
  });
});

describe('a bad corners file', () => {
  it('is one line naming the entry, exit code 2, and nothing is written', () => {
    const bad = path.join(work, 'bad.json');
    const overlapping = [edited[0], { ...edited[1]!, entryM: edited[0]!.apexM }];
    writeFileSync(bad, JSON.stringify({ format: 'reflap corners 1', corners: overlapping }));
    const out = path.join(work, 'never.csv');
    const run = runCli(['simulate', '--track', track, '--car', car, '--corners', bad, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/bad\.json: corners\[1\]: overlaps corners\[0\]/);
    expect(existsSync(out)).toBe(false);
  });
});
