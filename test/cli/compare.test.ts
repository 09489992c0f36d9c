// `reflap compare` and `reflap envelope` end to end on the bundled demo circuit and car: a reference trace read
// back as telemetry, a uniformly slower copy of it, and bad input (one-line errors, exit 2, nothing written). The
// reference trace drives the default line (--line auto); the comparisons whose subject is not the line drive the
// same car's racing line from the file computed once for the test run (test/helpers/shared-line.ts).

import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { writeOffTrackLog } from '../helpers/logs.js';
import { onSharedLine, sharedLineArgs, sharedLineFile } from '../helpers/shared-line.js';

const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const car = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const work = mkdtempSync(path.join(tmpdir(), 'reflap-compare-'));
const trace = path.join(work, 'trace.csv');
let referenceLapTimeS = 0;

beforeAll(() => {
  const run = runCli(['simulate', '--track', track, '--car', car, '--out', trace, '--json']);
  expect(run.code).toBe(0);
  referenceLapTimeS = JSON.parse(run.stdout).lapTimeS;
});

/** The arguments, after the shared racing line's unless they choose a --line of their own. */
const onSharedLineUnless = (extra: string[]) =>
  extra.includes('--line') ? extra : [...sharedLineArgs(track, car), ...extra];
/** compare on the demo circuit and car: on the shared racing line unless the arguments choose a --line. */
const compare = (telemetry: string, extra: string[] = []) =>
  runCli(['compare', '--track', track, '--car', car, '--telemetry', telemetry, ...onSharedLineUnless(extra)]);

describe('a simulated lap read back as telemetry', () => {
  it('matches the reference within 0.02 s, with no finding worth more than 0.02 s', () => {
    const run = compare(trace, ['--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(Math.abs(result.driverLapTimeS - result.referenceLapTimeS)).toBeLessThan(0.02);
    expect(result.corners.length).toBeGreaterThanOrEqual(7);
    for (const corner of result.corners) expect(Math.abs(corner.timeLostS)).toBeLessThan(0.02);
    for (const finding of result.findings) expect(finding.timeS).toBeLessThanOrEqual(0.02);
    for (const key of ['id', 'apexM', 'brakingPointDeltaM', 'minSpeedDeltaKph', 'minSpeedOffsetFromApexM', 'timeLostS'])
      expect(result.corners[0]).toHaveProperty(key);
  });

  it('writes the aligned traces and the corner table with --out', () => {
    const out = path.join(work, 'aligned-out');
    const run = compare(trace, ['--out', out]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/Caution/);
    const lines = readFileSync(path.join(out, 'aligned.csv'), 'utf8').trim().split('\n');
    expect(lines[0]).toMatch(/^station_m,time_driver_s,time_reference_s,delta_s/);
    expect(existsSync(path.join(out, 'corners.csv'))).toBe(true);
  });
});

describe('a logger export with the brake as pressure', () => {
  it('finds the same braking points from the pressure and keeps the pressure in the aligned traces', () => {
    // The reference trace's brake share (0-1) written as 0-80 bar under a units row: braking detected from the
    // pressure's share of its 99th percentile must fall where the share itself fell.
    const [header, ...rows] = readFileSync(trace, 'utf8').trim().split('\n');
    const names = header!.split(',');
    const brake = names.indexOf('brake');
    const units = names.map((_, k) => (k === brake ? 'bar' : ''));
    names[brake] = 'Brake';
    const pressureRows = rows.map((row) => {
      const cells = row.split(',');
      cells[brake] = (Number(cells[brake]) * 80).toFixed(2);
      return cells.join(',');
    });
    const log = path.join(work, 'pressure.csv');
    writeFileSync(log, [names.join(','), units.join(','), ...pressureRows].join('\n') + '\n');
    const out = path.join(work, 'pressure-out');
    const run = compare(log, ['--json', '--out', out]);
    expect(run.code).toBe(0);
    for (const corner of JSON.parse(run.stdout).corners)
      if (corner.brakingPointDeltaM !== null) expect(Math.abs(corner.brakingPointDeltaM)).toBeLessThanOrEqual(2);
    const [alignedHeader, ...alignedRows] = readFileSync(path.join(out, 'aligned.csv'), 'utf8').trim().split('\n');
    const column = alignedHeader!.split(',').indexOf('brake_pressure_driver_bar');
    expect(column).toBeGreaterThan(0);
    const peakBar = Math.max(...alignedRows.map((row) => Number(row.split(',')[column])));
    expect(peakBar).toBeGreaterThan(79);
    expect(peakBar).toBeLessThanOrEqual(80);
  });
});

describe('a lap 2 % slower everywhere', () => {
  it('ends with a delta equal to the lap-time difference, 0.02 T, within 0.01 s', () => {
    // Every time stretched by 1.02 and every speed divided by it: the same lap, 2 % slower; the finish delta
    // is then 0.02 T for the reference lap time T (time = distance / speed).
    const lines = readFileSync(trace, 'utf8').trim().split('\n');
    const header = lines[0]!.split(',');
    const time = header.indexOf('time_s');
    const speeds = ['speed_mps', 'speed_kph'].map((name) => header.indexOf(name));
    const accels = ['ax_mps2', 'ay_mps2'].map((name) => header.indexOf(name));
    const slower = [header.join(',')];
    for (const line of lines.slice(1)) {
      const cells = line.split(',');
      cells[time] = (Number(cells[time]) * 1.02).toFixed(4);
      for (const s of speeds) cells[s] = (Number(cells[s]) / 1.02).toFixed(4);
      for (const a of accels) cells[a] = (Number(cells[a]) / 1.02 ** 2).toFixed(4);
      slower.push(cells.join(','));
    }
    const file = path.join(work, 'slower.csv');
    writeFileSync(file, slower.join('\n') + '\n');
    const out = path.join(work, 'slower-out');
    const run = compare(file, ['--out', out, '--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    const aligned = readFileSync(path.join(out, 'aligned.csv'), 'utf8').trim().split('\n');
    const lastDelta = Number(aligned[aligned.length - 1]!.split(',')[3]);
    expect(Math.abs(lastDelta - 0.02 * referenceLapTimeS)).toBeLessThan(0.01);
    expect(Math.abs(result.lapTimeDeltaS - 0.02 * referenceLapTimeS)).toBeLessThan(0.01);
    const sum = result.corners.reduce((s: number, c: { timeLostS: number }) => s + c.timeLostS, 0);
    expect(Math.abs(sum - result.lapTimeDeltaS)).toBeLessThan(0.005);
  });
});

describe('bad input', () => {
  const failsCleanly = (file: string, pattern: RegExp) => {
    const out = path.join(work, `never-${path.basename(file)}`);
    const run = compare(file, ['--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(pattern);
    expect(existsSync(out)).toBe(false);
  };

  it('names the columns it found when none is usable', () => {
    const file = path.join(work, 'unknown.csv');
    writeFileSync(file, 'foo,bar\n1,2\n3,4\n');
    failsCleanly(file, /foo.*bar|bar.*foo/);
  });

  it('says so when the session holds no complete lap', () => {
    const file = path.join(work, 'partial.csv');
    const lines = readFileSync(trace, 'utf8').trim().split('\n');
    writeFileSync(file, lines.slice(0, Math.round(lines.length * 0.4)).join('\n') + '\n');
    failsCleanly(file, /complete lap/);
  });

  it('refuses positions that do not belong to the track', () => {
    const file = writeOffTrackLog(path.join(work, 'elsewhere.csv'));
    failsCleanly(file, /track/);
  });

  it('names the row where time runs backwards', () => {
    const file = path.join(work, 'backwards.csv');
    const lines = readFileSync(trace, 'utf8').trim().split('\n');
    const header = lines[0]!.split(',');
    const time = header.indexOf('time_s');
    const cells = lines[50]!.split(',');
    cells[time] = '0.0001';
    lines[50] = cells.join(',');
    writeFileSync(file, lines.join('\n') + '\n');
    failsCleanly(file, /row|line/);
  });

  it('names the bad field of an envelope file', () => {
    const file = path.join(work, 'bad-envelope.json');
    writeFileSync(file, JSON.stringify({ format: 'reflap-demonstrated-envelope', version: 1 }));
    const run = compare(trace, ['--envelope', file]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/bad-envelope\.json: field/);
  });
});

describe('the demonstrated envelope', () => {
  it('is fitted by `envelope`, and `simulate --envelope` and `compare --envelope` drive on it', () => {
    const envelopeFile = path.join(work, 'envelope.json');
    const fit = runCli(['envelope', '--telemetry', trace, '--out', envelopeFile]);
    expect(fit.code).toBe(0);
    const record = JSON.parse(readFileSync(envelopeFile, 'utf8'));
    expect(record.bands.length).toBeGreaterThan(5);
    const lap = runCli(['simulate', ...onSharedLine(track, car), '--envelope', envelopeFile, '--json']);
    expect(lap.code).toBe(0);
    const lapTimeS = JSON.parse(lap.stdout).lapTimeS;
    // The grip a lap shows is the grip of that lap: driving on it again should land within a few per cent.
    expect(Math.abs(lapTimeS - referenceLapTimeS) / referenceLapTimeS).toBeLessThan(0.03);
    const run = compare(trace, ['--envelope', envelopeFile, '--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.referenceEnvelope).toBe('demonstrated');
    expect(result.carModelLapTimeS).toBeCloseTo(referenceLapTimeS, 2);
    expect(result.referenceLapTimeS).toBeCloseTo(lapTimeS, 3);
  });
});

describe('the reference on a racing line (--line auto | centreline | FILE)', () => {
  it('is quicker than on the centreline, and a line file from `reflap line --out` drives the same lap as --line auto', () => {
    const auto = compare(trace, ['--line', 'auto', '--json']);
    expect(auto.code, auto.stderr).toBe(0);
    const onLine = JSON.parse(auto.stdout);
    expect(onLine.referencePath).toBe('line');
    // Without --line the reference drives the same line (the default) and reports the same lap.
    expect(onLine.referenceLapTimeS).toBeCloseTo(referenceLapTimeS, 3);
    const centre = compare(trace, ['--line', 'centreline', '--json']);
    expect(centre.code, centre.stderr).toBe(0);
    const onCentre = JSON.parse(centre.stdout);
    expect(onCentre.referencePath).toBe('centreline');
    // The time-optimal line is chosen among lines that include the centreline (zero offset everywhere), so it
    // can be no slower; on a circuit with real corners it is clearly quicker (racing lines use the track
    // width to open the corners: common practice).
    expect(onLine.referenceLapTimeS).toBeLessThan(onCentre.referenceLapTimeS - 0.5);
    // Against the centreline reference, the driver (this log is the line's reference lap) is quicker by that much.
    expect(onCentre.driverLapTimeS - onCentre.referenceLapTimeS).toBeLessThan(-0.5);

    // The line file of this car and circuit that `reflap line --out` wrote for the test run.
    const fromFile = compare(trace, ['--line', sharedLineFile(track, car), '--json']);
    expect(fromFile.code, fromFile.stderr).toBe(0);
    const onFileLine = JSON.parse(fromFile.stdout);
    expect(onFileLine.referencePath).toBe('file');
    // The file keeps the offsets to a micrometre; the line's curvature, recomputed from them by differences over a
    // 1 m step, picks up that rounding, which can move the lap by a few milliseconds (simulate --line the same).
    // 0.02 s is 0.03 % of the lap, far below the 0.5 s the line gains.
    expect(Math.abs(onFileLine.referenceLapTimeS - onLine.referenceLapTimeS)).toBeLessThan(0.02);
    expect(onFileLine.corners.length).toBe(onLine.corners.length);
  });

  it('refuses a line file of another track with one line, exit 2', () => {
    const other = path.join(work, 'other-line.csv');
    writeFileSync(other, 's_m,offset_m\n0,0\n1,0\n2,0\n');
    const run = compare(trace, ['--line', other]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('other-line.csv');
  });
});

// Real circuit: TUM racetrack-database (Heilmeier et al., LGPL v3), geometry from OpenStreetMap (ODbL), read from
// ../shared/data/open-tracks/ and skipped where that folder is absent.
const norisring = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Norisring.csv');
if (!existsSync(norisring)) console.warn(`open-track compare check skipped: ${norisring} is absent`);

describe.skipIf(!existsSync(norisring))('on an open-dataset circuit with widths (Norisring)', () => {
  it('compare without --line reports the reference lap of simulate --line auto, faster than the centreline lap', () => {
    const trackArgs = ['--track', norisring, '--columns', 'width_left_m=w_tr_left_m,width_right_m=w_tr_right_m'];
    const log = path.join(work, 'norisring-centreline.csv');
    const centre = runCli(['simulate', ...trackArgs, '--car', car, '--line', 'centreline', '--out', log, '--json']);
    expect(centre.code, centre.stderr).toBe(0);
    const auto = runCli(['simulate', ...trackArgs, '--car', car, '--line', 'auto', '--json']);
    expect(auto.code, auto.stderr).toBe(0);
    const run = runCli(['compare', ...trackArgs, '--car', car, '--telemetry', log, '--json']);
    expect(run.code, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.referencePath).toBe('line');
    expect(result.referenceLapTimeS).toBeCloseTo(JSON.parse(auto.stdout).lapTimeS, 3);
    expect(result.referenceLapTimeS).toBeLessThan(JSON.parse(centre.stdout).lapTimeS);
  });
});
