// `reflap calibrate` end to end on the demo's invented log (a driver a little inside the limit, with sensor and GPS
// noise), from a guessed car, and the refusals: one line, exit code 2, nothing written.

import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { sharedDemoFolder } from '../helpers/shared-demo.js';
import { parseCarJson, readCarFile } from '../../src/io/read-car.js';
import { readTrackFile } from '../../src/io/read-track.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { demoDriver, demoLogCsv, DEFAULT_DEMO_LOG } from '../../src/demo/demo-driver.js';
import { FITTED_CAR_CAUTION } from '../../src/report/calibration-summary.js';
import { expectConverted } from '../report/converted-quantities.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-calibrate-'));
let log: string;
const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const guess = path.join(work, 'guess.json');

beforeAll(() => {
  log = path.join(sharedDemoFolder(), 'demo-lap.csv');
  // The demo car with power, drag, grip and downforce guessed wrong.
  const car = JSON.parse(readFileSync(path.join(projectRoot, 'cars', 'tarnfell-gt.json'), 'utf8'));
  car.name = 'Tarnfell guessed';
  car.tyre.muLat = 1.3;
  car.tyre.muLong = 1.3;
  car.aero.liftAreaM2 = 1.5;
  car.aero.dragAreaM2 = 0.7;
  car.powertrain.maxPowerW = 330000;
  writeFileSync(guess, JSON.stringify(car));
});

describe('reflap calibrate', () => {
  it('writes an ordinary car file with the standard errors and the origin of each value', () => {
    const out = path.join(work, 'fitted.json');
    const run = runCli(['calibrate', '--telemetry', log, '--car', guess, '--out', out, '--json']);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    const fitted = parseCarJson(readFileSync(out, 'utf8'), out);
    for (const f of summary.fitted) {
      expect(fitted.uncertainty!.sd[f.field]).toBe(f.sd);
      expect(fitted.origin![f.field]).toMatch(/^fitted from /);
    }
    // The demo driver uses 0.985^2 of the Tarnfell's grip (src/demo/demo-driver.ts), so the grip the log shows is
    // about 0.985^2 of the car file's 1.5: the fit must land there, not at the guess of 1.3.
    const muLat = summary.fitted.find((f: { field: string }) => f.field === 'tyre.muLat');
    expect(Math.abs(muLat.value - 1.5 * 0.985 ** 2)).toBeLessThan(3 * muLat.sd + 0.02);
    // Drag area is the car file's 0.85 (the demo driver's full-throttle stretches follow the car's own).
    const drag = summary.fitted.find((f: { field: string }) => f.field === 'aero.dragAreaM2');
    expect(Math.abs(drag.value - 0.85)).toBeLessThan(3 * drag.sd);
    // Every command takes the fitted file, and --uncertainty draws its standard errors.
    const simulate = runCli(['simulate', '--track', track, '--car', out, '--uncertainty', '8', '--json']);
    expect(simulate.code).toBe(0);
    const lap = JSON.parse(simulate.stdout);
    expect(lap.uncertainty.fields.map((f: { field: string }) => f.field).sort()).toEqual(
      summary.fitted.map((f: { field: string }) => f.field).sort(),
    );
    expect(lap.uncertainty.lapTimeS.low).toBeLessThanOrEqual(lap.uncertainty.lapTimeS.high);
  });

  it('needs --track for a log without accelerometer channels, and works with it', () => {
    // Without an accelerometer the lateral acceleration is v^2 times the curvature of the driver's own path, estimated
    // from the log's positions (docs/calibrate.md): this log's invented driver is the demo's, driving the centreline.
    const demoTrack = readTrackFile(track);
    const demoCar = readCarFile(path.join(projectRoot, 'cars', 'tarnfell-gt.json'));
    const ambient = ambientFrom();
    const centrelineLap = demoDriver(demoTrack, demoCar, ambient, buildEnvelope(demoCar, ambient), undefined);
    // Three laps: the lap before and after the flying lap logged as well (the same lap, fresh noise).
    const laps = { ...DEFAULT_DEMO_LOG, leadInM: demoTrack.lengthM + 400, leadOutM: demoTrack.lengthM + 300 };
    const csv = demoLogCsv(demoTrack, centrelineLap, laps).split('\n');
    const header = csv[0]!.split(',');
    const keep = header.map((name, i) => (name === 'ax_g' || name === 'ay_g' ? -1 : i)).filter((i) => i >= 0);
    const gpsOnly = path.join(work, 'gps-only.csv');
    writeFileSync(gpsOnly, csv.map((line) => (line ? keep.map((i) => line.split(',')[i]).join(',') : line)).join('\n'));
    const out = path.join(work, 'gps-fitted.json');
    const refused = runCli(['calibrate', '--telemetry', gpsOnly, '--car', guess, '--out', out]);
    expect(refused.code).toBe(2);
    expect(refused.stderr.trim().split('\n')).toHaveLength(1);
    expect(refused.stderr).toMatch(/no longitudinal and lateral acceleration channel; give --track/);
    expect(existsSync(out)).toBe(false);
    const run = runCli(['calibrate', '--telemetry', gpsOnly, '--car', guess, '--track', track, '--out', out, '--json']);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    // The lateral acceleration comes from the driver's own path, and the summary says so with the noise it read.
    expect(summary.lateralAcceleration.from).toBe('driver path');
    expect(summary.lateralAcceleration.positionNoiseM).toBeGreaterThan(0);
    expect(summary.lateralAcceleration.laps).toBeGreaterThan(0);
    expect(summary.notes.join('\n')).toMatch(/curvature of the driver's own path/);
    // The same grip as the demo driver shows with the accelerometer (0.985^2 of the car file's 1.5), to within the
    // looser errors of derived accelerations.
    const muLat = summary.fitted.find((f: { field: string }) => f.field === 'tyre.muLat');
    expect(Math.abs(muLat.value - 1.5 * 0.985 ** 2)).toBeLessThan(3 * muLat.sd + 0.02);
    expect(existsSync(out)).toBe(true);
    // The same fit read in mph and feet: every note's figures are the JSON's metric notes converted (1 ft = 0.3048 m,
    // 1 mph = 0.44704 m/s: NIST SP 811, appendix B), and the full-throttle speeds the JSON's m/s in mph.
    const imperial = runCli([
      'calibrate',
      '--telemetry',
      gpsOnly,
      '--car',
      guess,
      '--track',
      track,
      '--out',
      out,
      '--units',
      'imperial',
    ]);
    expect(imperial.code).toBe(0);
    const imperialNotes = imperial.stdout
      .split('\n')
      .flatMap((line) => (line.startsWith('Note: ') ? [line.slice(6)] : []));
    expect(imperialNotes).toHaveLength(summary.notes.length);
    summary.notes.forEach((metricText: string, k: number) => expectConverted(metricText, imperialNotes[k]!));
    expect(imperialNotes.join('\n')).toMatch(/positions scatter \d+\.\d+ ft across the track/);
    // The caution speaks of the fitted car, not of a lap (the car page's way), and still of the danger at the limit.
    expect(imperial.stdout).toContain(FITTED_CAR_CAUTION);
    expect(imperial.stdout).not.toMatch(/reference lap is a model result/);
    const fullThrottle = /Full throttle: .*, (\d+) to (\d+) mph, residual/.exec(imperial.stdout)!;
    summary.fullThrottle.speedRangeMps.forEach((speedMps: number, k: number) =>
      expect(Math.abs(Number(fullThrottle[k + 1]) - speedMps / 0.44704)).toBeLessThanOrEqual(0.5 + 0.02),
    );
  });

  it('refuses a log without a long enough full-throttle stretch, saying how long is needed, and writes nothing', () => {
    const csv = readFileSync(log, 'utf8').split('\n');
    const throttle = csv[0]!.split(',').indexOf('throttle_pct');
    // Off the throttle for a moment every second.
    const lifted = csv.map((line, row) => {
      if (row === 0 || !line) return line;
      const cells = line.split(',');
      if (Math.floor(Number(cells[0]) * 1) % 2 === 1) cells[throttle] = '40';
      return cells.join(',');
    });
    const file = path.join(work, 'lifting.csv');
    writeFileSync(file, lifted.join('\n'));
    const out = path.join(work, 'never.json');
    const run = runCli(['calibrate', '--telemetry', file, '--car', guess, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(
      /no full-throttle stretch long enough to fit power and drag: at least one of 2 s in a straight line is needed \(the longest found is 1\.\d s\)/,
    );
    expect(existsSync(out)).toBe(false);
  });

  it('refuses a bicycle-model car without the aero balance the downforce fit needs', () => {
    const out = path.join(work, 'never3.json');
    const run = runCli([
      'calibrate',
      '--telemetry',
      log,
      '--car',
      path.join(projectRoot, 'cars', 'brackle-club.json'),
      '--model',
      'bicycle',
      '--out',
      out,
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(
      /calibrating with the bicycle model fits the downforce, which needs field aero\.frontDownforceFraction/,
    );
    expect(existsSync(out)).toBe(false);
  });

  it('refuses a base car file that fails validation, naming the field', () => {
    const bad = path.join(work, 'bad.json');
    writeFileSync(
      bad,
      JSON.stringify({
        massKg: 900,
        tyre: { muLat: 1.2 },
        aero: { dragAreaM2: 0.7, liftAreaM2: 0 },
        powertrain: { maxPowerW: 100000 },
      }),
    );
    const out = path.join(work, 'never2.json');
    const run = runCli(['calibrate', '--telemetry', log, '--car', bad, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim()).toBe(`reflap: ${bad}: missing required field tyre.muLong`);
    expect(existsSync(out)).toBe(false);
  });
});
