// --units imperial in every report page and in the CSVs a person reads: mph and feet in axes, tables, tiles, the
// read-out and the map's scale bar, the unit in every header, and the numbers converted. Every imperial figure is
// checked against the metric run of the same command through the exact definitions 1 mph = 0.44704 m/s and
// 1 ft = 0.3048 m (NIST SP 811, appendix B), never against the program's own imperial output.

import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cli.js';
import { sharedDemoFolder } from '../helpers/shared-demo.js';
import { onSharedLine } from '../helpers/shared-line.js';
import { scaleBarOf } from '../../src/report/html/track-map.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from './converted-quantities.js';

const MPS_PER_MPH = 0.44704; // NIST SP 811, appendix B (exact)
const M_PER_FT = 0.3048; // NIST SP 811, appendix B (exact)
const kphToMph = (kph: number) => kph / 3.6 / MPS_PER_MPH;

// Each circuit and car with the reference on the car's racing line, computed once for the test run.
const gt = onSharedLine('tracks/velmora-downs.json', 'cars/tarnfell-gt.json');
const club = onSharedLine('tracks/tarnwick-club.json', 'cars/brackle-club.json');
let folder: string;
let log: string;

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'reflap-imperial-'));
  // The demo's invented session is the driver's log of the comparison pages.
  log = path.join(sharedDemoFolder(), 'demo-lap.csv');
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

type Units = 'metric' | 'imperial';
interface UnitsRun {
  stdout: string;
  /** The text of a file the run wrote into its folder. */
  read: (name: string) => string;
}

/** The runs of a command in both systems of units, each written into a folder of its own ({out} in the arguments);
 * the tests that read the same command's outputs share its two runs instead of each running it again. */
const runsInBothUnits = new Map<string, Record<Units, UnitsRun>>();
function both(name: string, args: string[]): Record<Units, UnitsRun> {
  const run = (units: Units): UnitsRun => {
    const out = path.join(folder, name, units);
    mkdirSync(out, { recursive: true });
    const result = runCli([...args.map((arg) => arg.replaceAll('{out}', out)), '--units', units]);
    expect(result.code, result.stderr).toBe(0);
    return { stdout: result.stdout, read: (file) => readFileSync(path.join(out, file), 'utf8') };
  };
  let runs = runsInBothUnits.get(name);
  if (runs === undefined) {
    runs = { metric: run('metric'), imperial: run('imperial') };
    runsInBothUnits.set(name, runs);
  }
  return runs;
}

/** The reference lap's trace CSV and page, in both units. */
const simulateGt = () => both('simulate', ['simulate', ...gt, '--out', '{out}/trace.csv', '--html', '{out}/page.html']);
/** The driver's lap against the reference: aligned traces, page and terminal text, in both units. */
const compareGt = () =>
  both('compare', ['compare', ...gt, '--telemetry', log, '--out', '{out}/aligned', '--html', '{out}/page.html']);
/** Both units' page of a command whose only output read here is its page. */
const pages = (name: string, args: string[]) => {
  const runs = both(name, [...args, '--html', '{out}/page.html']);
  return { metric: runs.metric.read('page.html'), imperial: runs.imperial.read('page.html') };
};

function csvColumns(text: string): Record<string, number[]> {
  const [header, ...lines] = text.trim().split('\n');
  const names = header!.split(',');
  const columns: Record<string, number[]> = Object.fromEntries(names.map((name) => [name, []]));
  for (const line of lines) line.split(',').forEach((cell, k) => columns[names[k]!]!.push(Number(cell)));
  return columns;
}

function pageData(html: string): {
  length: number;
  d: number[];
  labels: { distance: string; speed: string };
  series: Record<string, number[] | null>;
} {
  return JSON.parse(/<script type="application\/json" id="lap-data">([\s\S]*?)<\/script>/.exec(html)![1]!);
}

/** The page without its script and data: what a reader sees. */
const visible = (html: string) => html.replace(/<script[\s\S]*?<\/script>/g, '');
/** Each place a pattern occurs, with a little text either side (short failure messages on long pages). */
const placesOf = (html: string, pattern: RegExp) =>
  [...html.matchAll(new RegExp(pattern.source, 'g'))].map((m) => html.slice(Math.max(0, m.index - 60), m.index + 20));

describe('CSVs a person reads', () => {
  it('the trace CSV has feet and mph columns, each converted from the metric trace', () => {
    const runs = simulateGt();
    const m = csvColumns(runs.metric.read('trace.csv'));
    const i = csvColumns(runs.imperial.read('trace.csv'));
    const names = Object.keys(i);
    expect(names).toEqual(expect.arrayContaining(['distance_ft', 'speed_mph', 'time_s', 'x_ft', 'y_ft']));
    // No metre or km/h column is left, and the speed is written once.
    expect(names.filter((name) => /_(m|kph|mps)$/.test(name))).toEqual([]);
    expect(names.filter((name) => name.startsWith('speed_'))).toEqual(['speed_mph']);
    expect(i.distance_ft!.length).toBe(m.distance_m!.length);
    for (let k = 0; k < m.distance_m!.length; k += 97) {
      expect(i.distance_ft![k]!).toBeCloseTo(m.distance_m![k]! / M_PER_FT, 2);
      expect(i.speed_mph![k]!).toBeCloseTo(m.speed_mps![k]! / MPS_PER_MPH, 3);
      expect(i.time_s![k]).toBe(m.time_s![k]);
    }
  });

  it('the aligned compare CSV has station_ft and every speed in mph', () => {
    const runs = compareGt();
    const m = csvColumns(runs.metric.read('aligned/aligned.csv'));
    const i = csvColumns(runs.imperial.read('aligned/aligned.csv'));
    expect(Object.keys(i)).toEqual(
      expect.arrayContaining(['station_ft', 'speed_driver_mph', 'speed_reference_mph', 'delta_s']),
    );
    expect(Object.keys(i).filter((name) => /_(m|kph|mps)$/.test(name))).toEqual([]);
    for (let k = 0; k < m.station_m!.length; k += 113) {
      expect(i.station_ft![k]!).toBeCloseTo(m.station_m![k]! / M_PER_FT, 1);
      // km/h written to 0.01, so the converted value agrees within 0.01 mph.
      expect(Math.abs(i.speed_driver_mph![k]! - kphToMph(m.speed_driver_kph![k]!))).toBeLessThan(0.011);
      expect(i.delta_s![k]).toBe(m.delta_s![k]);
    }
  });
});

describe('report pages', () => {
  it('the reference lap page: axes, tiles, table, read-out and data in mph and feet, no km/h', () => {
    const runs = simulateGt();
    const [metric, imperial] = [runs.metric.read('page.html'), runs.imperial.read('page.html')];
    expect(placesOf(imperial, /km\/h/)).toEqual([]);
    expect(imperial).toContain('speed, mph');
    expect(imperial).toContain('distance, ft');
    expect(imperial).toMatch(/<th>brakes at, ft<\/th>/);
    const tile = (html: string, label: string) =>
      Number(new RegExp(`${label}</div><div class="tile-value">([\\d.]+)`).exec(html)![1]);
    // Tiles to 0.1: the converted metric figure within half a step of each rounding.
    expect(Math.abs(tile(imperial, 'Top speed') - kphToMph(tile(metric, 'Top speed')))).toBeLessThan(0.09);
    // Length in miles: 1 mi = 1609.344 m (NIST SP 811, appendix B).
    expect(tile(imperial, 'Length')).toBeCloseTo((tile(metric, 'Length') * 1000) / 1609.344, 2);
    const m = pageData(metric);
    const i = pageData(imperial);
    expect(i.labels).toEqual({ distance: 'ft', speed: 'mph' });
    expect(i.length).toBeCloseTo(m.length / M_PER_FT, 6);
    for (let k = 0; k < m.d.length; k += 101) {
      expect(Math.abs(i.d[k]! - m.d[k]! / M_PER_FT)).toBeLessThan(0.5);
      expect(Math.abs(i.series.vR![k]! - kphToMph(m.series.vR![k]!))).toBeLessThan(0.1);
    }
    // The first braking zone's entry speed, to 0.1 in each unit.
    const entry = (html: string) =>
      Number(/<tr class="corner-row"[^>]*>.*?<\/td><td>[^<]*<\/td><td>[^<]*<\/td><td>([\d.]+)<\/td>/.exec(html)![1]);
    expect(Math.abs(entry(imperial) - kphToMph(entry(metric)))).toBeLessThan(0.1);
  });

  it('the driver and session pages: every table header, axis and tile in mph and feet', () => {
    for (const imperial of [
      compareGt().imperial.read('page.html'),
      pages('session', ['session', ...gt, '--telemetry', log]).imperial,
    ]) {
      // The notes on laps left out or extrapolated are still written in metres (the lap cutting's own sentences);
      // everything else the page draws is checked, the findings and the envelope fit's notes included.
      const drawn = visible(imperial).replace(/<li>lap \d+ [^<]*<\/li>/g, '');
      const headers = [...drawn.matchAll(/<th>([^<]*)<\/th>/g)].map((m) => m[1]!);
      expect(headers.filter((h) => /km\/h|, m$|, m\b/.test(h))).toEqual([]);
      expect(headers).toEqual(expect.arrayContaining(['slowest, mph', 'brake point Δ, ft']));
      expect(placesOf(drawn, /km\/h/)).toEqual([]);
      expect(drawn).toMatch(/envelope at [\d, ]+ mph/);
      expect(drawn).toMatch(/<li>braking at [\d, ]+ mph: too few samples in the log/);
    }
  });

  it('the findings in mph and feet, each number the metric finding’s converted', () => {
    const runs = compareGt();
    const [metric, imperial] = [runs.metric.read('page.html'), runs.imperial.read('page.html')];
    const findings = (html: string) =>
      [...html.matchAll(/<span class="finding-text">([\s\S]*?)<\/span>/g)].map((m) => m[1]!.replace(/&#39;/g, "'"));
    const metricFindings = findings(metric);
    expect(metricFindings.length).toBeGreaterThan(2);
    const imperialFindings = findings(imperial);
    expect(imperialFindings).toHaveLength(metricFindings.length);
    for (const text of imperialFindings) expect(text).not.toMatch(/km\/h| m\b/);
    imperialFindings.forEach((text, k) => expectConverted(metricFindings[k]!, text));
    // The terminal's findings (of the same runs) say the same as the page's.
    const printed = (units: Units) => {
      const block = runs[units].stdout.split('Where the time is (largest first):\n')[1]!.split('\n\n')[0]!;
      return block.split('\n').map((line) => line.replace(/^\d+\. /, ''));
    };
    expect(printed('imperial')).toEqual(imperialFindings);
    expect(printed('metric')).toEqual(metricFindings);
  });

  it('the lap-against-lap and line findings in mph and feet, each number the metric one’s converted', () => {
    const other = path.join(folder, 'bicycle-lap.csv');
    expect(runCli(['simulate', ...gt, '--model', 'bicycle', '--out', other]).code).toBe(0);
    const runs = both('against', [
      'compare',
      ...gt,
      '--telemetry',
      log,
      '--against',
      other,
      '--html',
      '{out}/page.html',
    ]);
    const [metric, imperial] = [runs.metric.read('page.html'), runs.imperial.read('page.html')];
    const section = (html: string) => /<section class="findings against">[\s\S]*?<\/section>/.exec(html)![0];
    const findings = (html: string) =>
      [...section(html).matchAll(/<span class="finding-text">([\s\S]*?)<\/span>/g)].map((m) => m[1]!);
    const metricFindings = findings(metric);
    expect(metricFindings.length).toBeGreaterThan(2);
    expect(findings(imperial)).toHaveLength(metricFindings.length);
    expect(placesOf(section(imperial).replace(/<ul class="notes">[\s\S]*?<\/ul>/g, ''), /km\/h| m\b/)).toEqual([]);
    findings(imperial).forEach((text, k) => expectConverted(metricFindings[k]!, text));
    // The terminal's line findings (a numbered list after the line's table) and its resolution note, of the same runs.
    const lineBlock = (units: Units) => {
      const after = runs[units].stdout.split('The line (offsets from the centreline')[1]!;
      return after.split('\n').filter((line) => /^\d+\. corner|^Note: line:/.test(line));
    };
    const metricLine = lineBlock('metric');
    const imperialLine = lineBlock('imperial');
    expect(metricLine.length).toBeGreaterThan(1);
    expect(imperialLine).toHaveLength(metricLine.length);
    for (const text of imperialLine) expect(text).not.toMatch(/km\/h| m\b/);
    imperialLine.forEach((text, k) => expectConverted(metricLine[k]!, text));
  });

  it('the what-if, sweep, car and budget pages show mph and feet', () => {
    const whatif = pages('whatif', ['whatif', ...club, '--set', 'massKg=+20']);
    expect(whatif.imperial).toContain('shift, ft (− = earlier)');
    expect(whatif.imperial).toContain('<th>braking point shift, ft</th>');
    const sweep = pages('sweep', ['sweep', ...club, '--vary', 'massKg=600:640:20', '--workers', '1']);
    expect(sweep.imperial).toContain('shift from baseline, ft');
    expect(sweep.imperial).toMatch(/track [\d.]+ mi at a [\d.]+ ft step/);
    const car = pages('car', ['car', '--car', 'cars/brackle-club.json']);
    expect(car.imperial).toMatch(/\d+ mph/);
    const budget = pages('budget', [
      'budget',
      '--car',
      'cars/brackle-club.json',
      '--speed-kph',
      '80',
      '--radius-m',
      '60',
    ]);
    for (const page of [whatif, sweep, car, budget])
      expect(placesOf(visible(page.imperial), /km\/h|, m\b| m step/)).toEqual([]);
    // The what-if table's shifts: the metric metres converted to feet, each to 0.1.
    const shifts = (html: string) =>
      [...html.matchAll(/<td class="strong">([+−-][\d.]+)<\/td>/g)].map((m) => Number(m[1]!.replace('−', '-')));
    const metricShifts = shifts(whatif.metric);
    expect(metricShifts.length).toBeGreaterThan(2);
    shifts(whatif.imperial).forEach((feet, k) =>
      expect(Math.abs(feet - metricShifts[k]! / M_PER_FT)).toBeLessThan(0.05 + 0.05 / M_PER_FT),
    );
  });
});

describe('the map scale bar', () => {
  it('is a round number of feet whose drawn width is that many feet at the map scale', () => {
    const pxPerM = 0.37;
    const bar = scaleBarOf(pxPerM, displayUnits('imperial'));
    const feet = Number(bar.label.replace(' ft', ''));
    // 1, 2 or 5 times a power of ten (common practice for scale bars), at most about 90 px.
    expect(feet / 10 ** Math.floor(Math.log10(feet))).toSatisfy((lead: number) => [1, 2, 5].includes(lead));
    expect(bar.widthPx).toBeCloseTo(feet * M_PER_FT * pxPerM, 9);
    expect(bar.widthPx).toBeLessThanOrEqual(90);
    expect(bar.widthPx).toBeGreaterThan(90 / 2.5);
  });
});
