// The --units flag: mph and feet in printed tables and in the corner CSV a person reads, the unit in every header,
// JSON staying SI. Conversion factors: 1 mph = 0.44704 m/s and 1 ft = 0.3048 m exactly (NIST SP 811, appendix B).

import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../helpers/cli.js';
import { sharedDemoFolder } from '../helpers/shared-demo.js';
import { onSharedLine } from '../helpers/shared-line.js';

/** The demo circuit and car, the reference on the car's racing line computed once for the test run. */
const lap = onSharedLine('tracks/velmora-downs.json', 'cars/tarnfell-gt.json');
let folder: string;
let log: string;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-units-'));
  // The demo's invented log is the driver lap these checks compare.
  log = join(sharedDemoFolder(), 'demo-lap.csv');
});

function csvRows(file: string): Record<string, string>[] {
  const [header, ...lines] = readFileSync(file, 'utf8').trim().split('\n');
  const names = header!.split(',');
  return lines.map((line) => Object.fromEntries(line.split(',').map((cell, k) => [names[k], cell])));
}

describe('--units imperial', () => {
  it('prints the simulate summary in mph, feet and miles, every header with its unit', () => {
    const metric = runCli(['simulate', ...lap]).stdout;
    const imperial = runCli(['simulate', ...lap, '--units', 'imperial']).stdout;
    expect(imperial).toMatch(/brake at ft\s+before turn-in ft\s+entry mph\s+slowest at ft\s+slowest mph\s+braking ft/);
    expect(imperial).not.toMatch(/km\/h/);
    const top = (text: string) => Number(/Top speed\s+([\d.]+)/.exec(text)![1]);
    expect(top(imperial)).toBeCloseTo(top(metric) / 3.6 / 0.44704, 0);
    expect(imperial).toMatch(/over \d\.\d{3} mi\)/);
  });

  it('writes the corner CSV with Mph and Ft columns, converted exactly', () => {
    const metricOut = join(folder, 'metric');
    const imperialOut = join(folder, 'imperial');
    const base = ['compare', ...lap, '--telemetry', log];
    expect(runCli([...base, '--out', metricOut]).code).toBe(0);
    const run = runCli([...base, '--out', imperialOut, '--units', 'imperial']);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(
      /apex ft\s+brake ft\s+before turn-in ft\s+entry mph\s+slowest mph\s+vs apex ft\s+exit mph/,
    );
    const metric = csvRows(join(metricOut, 'corners.csv'));
    const imperial = csvRows(join(imperialOut, 'corners.csv'));
    expect(Object.keys(imperial[0]!)).toEqual(expect.arrayContaining(['apexFt', 'entrySpeedDriverMph']));
    expect(Object.keys(imperial[0]!).some((name) => /Kph$|[a-z]M$/.test(name))).toBe(false);
    metric.forEach((row, k) => {
      expect(Number(imperial[k]!.apexFt)).toBeCloseTo(Number(row.apexM) / 0.3048, 0);
      expect(Number(imperial[k]!.entrySpeedDriverMph)).toBeCloseTo(Number(row.entrySpeedDriverKph) / 3.6 / 0.44704, 1);
    });
  });

  it('keeps JSON in SI whatever the units, and refuses an unknown system', () => {
    const metric = JSON.parse(runCli(['simulate', ...lap, '--json']).stdout);
    const imperial = JSON.parse(runCli(['simulate', ...lap, '--json', '--units', 'imperial']).stdout);
    expect(imperial.maxSpeedMps).toBe(metric.maxSpeedMps);
    const wrong = runCli(['simulate', ...lap, '--units', 'nautical']);
    expect(wrong.code).toBe(2);
  });
});

/** Every number literal in a JSON text, as written. */
const numbersIn = (json: string) => json.match(/-?\d+\.\d+(e-?\d+)?/g) ?? [];
/** Four decimals, or four significant digits below 0.01 (the rounding both commands promise). */
const plainEnough = (text: string) => {
  const value = Math.abs(Number(text));
  const decimals = text.split('.')[1]!.replace(/e.*$/, '').length;
  return value >= 0.01 ? decimals <= 4 : Number(value.toPrecision(4)) === value;
};

describe('envelope and car output', () => {
  it('envelope prints a table with the unit in every header unless --json, and rounds its JSON', () => {
    const table = runCli(['envelope', '--telemetry', log]);
    expect(table.code).toBe(0);
    expect(table.stdout).toMatch(/speed km\/h\s+samples\s+braking g\s+accelerating g\s+left g\s+right g/);
    expect(() => JSON.parse(table.stdout)).toThrow();
    const json = runCli(['envelope', '--telemetry', log, '--json']).stdout;
    expect(JSON.parse(json).bands.length).toBeGreaterThan(3);
    expect(numbersIn(json).filter((n) => !plainEnough(n))).toEqual([]);
  });

  it('car --json has no 17-digit floats', () => {
    const json = runCli(['car', '--car', 'cars/tarnfell-gt.json', '--model', 'bicycle', '--json']).stdout;
    expect(numbersIn(json).length).toBeGreaterThan(10);
    expect(numbersIn(json).filter((n) => !plainEnough(n))).toEqual([]);
  });
});
