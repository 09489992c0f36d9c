// `--uncertainty` on simulate and compare end to end: draws through the worker pool, the plain answer when nothing is
// uncertain, the band and the robustness column in the report, and the refusals. Every reference drives the demo
// car's racing line, computed once for the test run (the line a draw holds is the baseline car's in any case).

import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { sharedDemoFolder } from '../helpers/shared-demo.js';
import { sharedLineArgs } from '../helpers/shared-line.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-uncertainty-'));
const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const carFile = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const certain = path.join(work, 'certain.json');
const uncertain = path.join(work, 'uncertain.json');
let log: string;
let line: string[];
/** The demo circuit with a car file, the reference on the demo car's shared line. */
const withCar = (car: string) => ['--track', track, ...line, '--car', car];

beforeAll(() => {
  const car = JSON.parse(readFileSync(carFile, 'utf8'));
  writeFileSync(
    certain,
    JSON.stringify({ ...car, uncertainty: { sd: { 'tyre.muLat': 0, 'powertrain.maxPowerW': 0 } } }),
  );
  writeFileSync(
    uncertain,
    JSON.stringify({
      ...car,
      uncertainty: {
        sd: { 'tyre.muLat': 0.06, 'tyre.muLong': 0.06, 'aero.liftAreaM2': 0.4 },
        correlation: [{ fields: ['tyre.muLat', 'tyre.muLong'], r: 0.8 }],
      },
    }),
  );
  log = path.join(sharedDemoFolder(), 'demo-lap.csv');
  line = sharedLineArgs(track, carFile);
});

describe('simulate --uncertainty', () => {
  it('gives exactly the plain lap when nothing is uncertain', () => {
    const plain = JSON.parse(runCli(['simulate', ...withCar(carFile), '--json']).stdout);
    const run = runCli(['simulate', ...withCar(certain), '--uncertainty', '6', '--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.lapTimeS).toBe(plain.lapTimeS);
    expect(result.uncertainty.lapTimeS).toEqual({ median: plain.lapTimeS, low: plain.lapTimeS, high: plain.lapTimeS });
  });

  it('draws a band that holds the plain lap, and writes the band into the trace and the report', () => {
    const trace = path.join(work, 'trace.csv');
    const html = path.join(work, 'sim.html');
    const run = runCli([
      'simulate',
      ...withCar(uncertain),
      '--uncertainty',
      '16',
      '--json',
      '--out',
      trace,
      '--html',
      html,
    ]);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    const band = result.uncertainty.lapTimeS;
    expect(band.low).toBeLessThan(band.high);
    expect(band.low).toBeLessThanOrEqual(result.lapTimeS);
    expect(band.high).toBeGreaterThanOrEqual(result.lapTimeS);
    expect(result.uncertainty.draws).toBe(16);
    expect(readFileSync(trace, 'utf8').split('\n')[0]).toMatch(/speed_p05_kph,speed_median_kph,speed_p95_kph$/);
    const page = readFileSync(html, 'utf8');
    expect(page).toMatch(/class="range"/);
    expect(page).toMatch(/90 % band over 16 draws/);
  });

  it('refuses a number of draws that is not one, and --envelope with --uncertainty', () => {
    const bad = runCli(['simulate', ...withCar(uncertain), '--uncertainty', 'many']);
    expect(bad.code).toBe(2);
    expect(bad.stderr.trim()).toBe(
      "reflap: option --uncertainty: 'many' is not a number of draws (a whole number from 2 to 5000)",
    );
    const envelope = path.join(work, 'envelope.json');
    expect(runCli(['envelope', '--telemetry', log, '--out', envelope]).code).toBe(0);
    const both = runCli(['simulate', ...withCar(uncertain), '--uncertainty', '--envelope', envelope]);
    expect(both.code).toBe(2);
    expect(both.stderr.trim()).toBe(
      "reflap: option --uncertainty draws the car file's uncertain fields; it cannot be combined with --envelope",
    );
  });
});

describe('compare --uncertainty', () => {
  it('gives each finding the share of draws in which it holds, ranked by time, with the robustness column', () => {
    const html = path.join(work, 'compare.html');
    const run = runCli([
      'compare',
      ...withCar(uncertain),
      '--telemetry',
      log,
      '--uncertainty',
      '24',
      '--json',
      '--html',
      html,
    ]);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout);
    const findings = result.uncertainty.findings;
    expect(findings.length).toBeGreaterThan(0);
    for (let k = 0; k < findings.length; k++) {
      expect(findings[k].holds).toBeGreaterThanOrEqual(0);
      expect(findings[k].holds).toBeLessThanOrEqual(1);
      expect(findings[k].uncertain).toBe(findings[k].holds < 0.5);
      if (k > 0) expect(findings[k].timeS.median).toBeLessThanOrEqual(findings[k - 1].timeS.median);
    }
    expect(result.uncertainty.corners).toHaveLength(result.corners.length);
    const text = runCli(['compare', ...withCar(uncertain), '--telemetry', log, '--uncertainty', '24']).stdout;
    expect(text).toMatch(/holds in \d+ % of draws/);
    expect(text).toMatch(/ holds\n/);
    const page = readFileSync(html, 'utf8');
    expect(page).toMatch(/finding holds in/);
    expect(page).toMatch(/class="range"/);
  });
});
