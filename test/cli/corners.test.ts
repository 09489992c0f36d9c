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
