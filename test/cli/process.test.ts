// Every command once as a user's shell runs it: node starting bin/reflap.js in a process of its own, so the bin
// script, the lazy loading of each command and the exit status of a real process stay covered while the other CLI
// tests call the same `main` in-process (test/helpers/cli.ts). Exit codes 0, 2 and 1 as docs/robustness.md states
// them; a process ends by the signal that interrupted it (exit status 128 + signal, POSIX shell convention).

import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { commandEntries } from '../../src/cli/main.js';
import { projectRoot, runCli, runCliProcess } from '../helpers/cli.js';
import { writeTestOval } from '../helpers/tracks.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-process-'));
const car = path.join(projectRoot, 'cars', 'brackle-club.json');
const oval = writeTestOval(work);
const log = path.join(work, 'lap.csv');
/** The circle the GPX fixture drives, as a centreline CSV (a point every 5 degrees). */
const ring = path.join(work, 'ring.csv');
writeFileSync(
  ring,
  [
    'x_m,y_m',
    ...Array.from(
      { length: 72 },
      (_, k) => `${100 * Math.cos((k * Math.PI) / 36)},${100 * Math.sin((k * Math.PI) / 36)}`,
    ),
  ].join('\n') + '\n',
);
const out = (name: string) => path.join(work, 'out', name);

/** What a process adds is its start, so the commands that drive a reference take the centreline: the racing line's
 * own run is `line`'s below, and the line's checks are library tests (test/line/). */
const centreline = ['--line', 'centreline'];

/** One cheap run of each command, with words its output must hold (from the inputs where they carry a number). */
const runs: Record<string, { args: string[]; shows: RegExp }> = {
  simulate: { args: ['--track', oval, '--car', car, ...centreline], shows: /lap time/i },
  // (120 km/h)^2 / 90 m = 12.35 m/s^2 = 1.26 g: uniform circular motion, v^2/r (from memory, any mechanics text).
  budget: { args: ['--car', car, '--speed-kph', '120', '--radius-m', '90'], shows: /1\.26 g lateral/ },
  // The car file's 620 kg, plus the change.
  whatif: {
    args: ['--track', oval, '--car', car, '--set', 'massKg=+20', ...centreline],
    shows: /massKg 620 -> 640 kg/,
  },
  sweep: {
    args: ['--track', oval, '--car', car, '--vary', 'massKg=600:620:20', '--workers', '1', ...centreline],
    shows: /massKg/,
  },
  stint: {
    args: ['--track', oval, '--car', car, '--laps', '2', '--workers', '0', ...centreline],
    shows: /stint of 2 laps/,
  },
  compare: { args: ['--track', oval, '--car', car, '--telemetry', log, ...centreline], shows: /Driver lap/ },
  session: { args: ['--track', oval, '--car', car, '--telemetry', log, ...centreline], shows: /session of .*lap\.csv/ },
  envelope: { args: ['--telemetry', log, '--car', car], shows: /speed/ },
  calibrate: { args: ['--telemetry', log, '--car', car, '--out', out('fitted.json')], shows: /fitted\.json/ },
  line: { args: ['--track', oval, '--car', car], shows: /Lap on the line/ },
  // The oval is two half circles joined by straights (test/helpers/tracks.ts).
  corners: { args: ['--track', oval], shows: /2 corners/ },
  // The car file's 620 kg and 25 kg of fuel.
  car: { args: ['--car', car], shows: /Mass with fuel 645 kg/ },
  check: { args: [car], shows: /ok/ },
  // The fixture's 72 fixes on a circle of radius 100 m at a constant 512 m (test/fixtures/telemetry/circle.gpx).
  heights: {
    args: [
      '--track',
      ring,
      '--telemetry',
      path.join(projectRoot, 'test/fixtures/telemetry/circle.gpx'),
      '--out',
      out('ring.csv'),
    ],
    shows: /from 72 GPS fixes/,
  },
  demo: { args: ['--out', out('demo')], shows: /report/ },
};

beforeAll(() => {
  const lap = runCli(['simulate', '--track', oval, '--car', car, ...centreline, '--out', log]);
  expect(lap.code, lap.stderr).toBe(0);
});

describe('each command in a process of its own', () => {
  it('has a run here', () => {
    expect(Object.keys(runs).sort()).toEqual(commandEntries.map((entry) => entry.name).sort());
  });

  for (const entry of commandEntries) {
    it(`reflap ${entry.name}: exit 0 and its output`, () => {
      const { args, shows } = runs[entry.name]!;
      const run = runCliProcess([entry.name, ...args], { cwd: work });
      expect(run.stderr).toBe('');
      expect(run.code).toBe(0);
      expect(run.stdout).toMatch(shows);
    });
  }
});

describe('exit status', () => {
  it('2 with one line for bad input, and nothing written', () => {
    const run = runCliProcess(['simulate', '--track', oval, '--car', oval, '--out', out('refused.csv')]);
    expect(run.code).toBe(2);
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('oval.json');
    expect(readdirSync(path.join(work, 'out'))).not.toContain('refused.csv');
  });

  it('2 for an unknown command, 0 for the help', () => {
    expect(runCliProcess(['no-such-command']).code).toBe(2);
    const help = runCliProcess(['--help']);
    expect(help.code).toBe(0);
    for (const entry of commandEntries) expect(help.stdout).toContain(entry.name);
  });
});
