// The sweep and what-if report pages, written by the built CLI: self-contained (no network address, no
// script), the expected charts with one series per corner, escaped input text, plotted lap times that are
// the CSV's and a separate `simulate` run's, and standalone SVG files that are well-formed XML.
// The runs drive the centreline (--line centreline), where the loop's four corners give four braking zones.

import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { XMLValidator } from 'fast-xml-parser';
import { runCli } from '../helpers/cli.js';
import { parseSweepCsv } from '../../src/sweep/csv.js';
import { sweepReportHtml } from '../../src/report/sweep-page.js';
import { SAFETY_CAUTION } from '../../src/report/lap-summary.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { writeHairpin, writeSlickCar, writeTestLoop } from './sweep-fixtures.js';

const HOSTILE_CAR = '<img src=x onerror=alert(1)> & <script>window.__sweepInjected=1</script>';
const HOSTILE_FIELD = '<img src=x onerror=alert(2)>';
const vary = ['--vary', 'massKg=600:640:20', 'tyre.muLat=-5%:+5%:5%'];

let folder: string;
let loop: string;
let hostileCar: string;
let oatPage: string;
let gridPage: string;
let oatCsv: string;
let svgFolder: string;

function chartNames(html: string): string[] {
  return [...html.matchAll(/<svg[^>]*\bdata-chart="([^"]+)"/g)].map((m) => m[1]!);
}

function chartSource(html: string, name: string): string {
  const start = html.indexOf(`data-chart="${name}"`);
  expect(start, `chart ${name}`).toBeGreaterThan(0);
  return html.slice(html.lastIndexOf('<svg', start), html.indexOf('</svg>', start) + 6);
}

/** The polylines of a chart's series (class="series"), with their legend labels. */
function seriesOf(svg: string): { label: string; d: string }[] {
  return [...svg.matchAll(/<path class="series" data-series="\d+" data-label="([^"]*)" d="([^"]*)"/g)].map((m) => ({
    label: m[1]!,
    d: m[2]!,
  }));
}

function pointsOf(svg: string, series: number): { cy: number; x: number; y: number }[] {
  const group = svg.slice(svg.indexOf(`<g class="points" data-series="${series}"`));
  const body = group.slice(0, group.indexOf('</g>'));
  return [...body.matchAll(/cy="([^"]+)"[^>]*data-x="([^"]+)" data-y="([^"]+)"/g)].map((m) => ({
    cy: Number(m[1]),
    x: Number(m[2]),
    y: Number(m[3]),
  }));
}

/** The y axis as drawn: tick label value against its pixel row, from two ticks; and the value of one pixel. */
function yAxisMap(svg: string): { toValue: (pixel: number) => number; perPixel: number } {
  const axis = svg.slice(svg.indexOf('<g class="y-axis">'));
  const ticks = [
    ...axis.slice(0, axis.indexOf('</g>')).matchAll(/<line[^>]*y1="([^"]+)"[^>]*\/><text[^>]*>([^<]+)<\/text>/g),
  ].map((m) => ({ px: Number(m[1]), value: Number(m[2]!.replace('−', '-')) }));
  expect(ticks.length).toBeGreaterThanOrEqual(2);
  const a = ticks[0]!;
  const b = ticks[ticks.length - 1]!;
  return {
    toValue: (pixel) => a.value + ((pixel - a.px) / (b.px - a.px)) * (b.value - a.value),
    perPixel: Math.abs((b.value - a.value) / (b.px - a.px)),
  };
}

function csvRows(file: string): Record<string, string>[] {
  const lines = readFileSync(file, 'utf8')
    .split('\n')
    .filter((l) => l && !l.startsWith('#'));
  const header = lines[0]!.split(',');
  return lines.slice(1).map((line) => Object.fromEntries(line.split(',').map((cell, k) => [header[k]!, cell])));
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-sweep-html-'));
  loop = writeTestLoop(folder);
  const car = JSON.parse(readFileSync('cars/brackle-club.json', 'utf8')) as Record<string, unknown>;
  hostileCar = join(folder, 'hostile-car.json');
  writeFileSync(hostileCar, JSON.stringify({ ...car, name: HOSTILE_CAR }));
  oatCsv = join(folder, 'oat.csv');
  svgFolder = join(folder, 'svg');
  const oat = runCli([
    'sweep',
    '--track',
    loop,
    '--car',
    hostileCar,
    '--line',
    'centreline',
    ...vary,
    '--mode',
    'one-at-a-time',
    '--workers',
    '1',
    '--out',
    oatCsv,
    '--html',
    join(folder, 'oat.html'),
    '--svg',
    svgFolder,
  ]);
  expect(oat.stderr).toBe('');
  expect(oat.code).toBe(0);
  expect(oat.stdout).toContain(`Report written to ${join(folder, 'oat.html')}`);
  const grid = runCli([
    'sweep',
    '--track',
    loop,
    '--car',
    'cars/brackle-club.json',
    '--line',
    'centreline',
    ...vary,
    '--workers',
    '1',
    '--html',
    join(folder, 'grid.html'),
  ]);
  expect(grid.code).toBe(0);
  oatPage = readFileSync(join(folder, 'oat.html'), 'utf8');
  gridPage = readFileSync(join(folder, 'grid.html'), 'utf8');
});

describe('sweep report page', () => {
  it('refers to no address, loads nothing and runs no script', () => {
    for (const page of [oatPage, gridPage]) {
      expect(page.startsWith('<!DOCTYPE html>')).toBe(true);
      expect(page).not.toMatch(/https?:/i);
      expect(page).not.toMatch(/<[^>]*\s(src|href|xlink:href)\s*=/i);
      expect(page).not.toMatch(/<link\b|@import|url\(/i);
      expect(page).not.toMatch(/<script\b/);
      const csp = /http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(page)![1]!;
      expect(csp).toContain("default-src 'none'");
      expect(csp).toContain("script-src 'none'");
      const style = /<style>([\s\S]*?)<\/style>/.exec(page)![1]!;
      expect(csp).toContain(`style-src 'sha256-${createHash('sha256').update(style, 'utf8').digest('base64')}'`);
      expect(page).toContain(SAFETY_CAUTION.replace(/'/g, '&#39;'));
      expect(page).toContain('Sensitivity around the baseline');
    }
  });

  it('has a lap-time chart and a braking-shift chart per field, one shift series per corner', () => {
    const expected = ['lap-time-massKg', 'braking-shift-massKg', 'lap-time-tyre.muLat', 'braking-shift-tyre.muLat'];
    expect(chartNames(oatPage)).toEqual(expected);
    expect(chartNames(gridPage)).toEqual(expected);
    for (const page of [oatPage, gridPage]) {
      for (const name of expected) {
        const svg = chartSource(page, name);
        expect(svg).toContain('class="legend"');
        for (const series of seriesOf(svg))
          expect(series.d, `${name} ${series.label}`).toMatch(/^M[\d.,-]+(L[\d.,-]+)+$/);
        // Two axis titles with their units; the field's axis names it in words, not by its key.
        expect(svg).toMatch(name.startsWith('lap-time') ? /lap time, s/ : /shift from baseline, m/);
        expect(svg).toMatch(name.endsWith('massKg') ? />mass, kg</ : />lateral grip</);
        expect(svg).not.toMatch(/>(massKg, kg|tyre\.muLat)</);
      }
      // The loop has four bends, so four braking zones: four series, c1 to c4.
      for (const name of ['braking-shift-massKg', 'braking-shift-tyre.muLat']) {
        expect(seriesOf(chartSource(page, name)).map((s) => s.label)).toEqual(['c1', 'c2', 'c3', 'c4']);
      }
    }
    // One at a time: the line through the runs that vary massKg alone (three values).
    const oatLap = seriesOf(chartSource(oatPage, 'lap-time-massKg'));
    expect(oatLap.map((s) => s.label)).toEqual(['massKg alone']);
    expect(oatLap[0]!.d.split('L')).toHaveLength(3);
    // A grid: one line per value of the other field (tyre.muLat 1.3 ± 5 %: three values).
    const gridLap = seriesOf(chartSource(gridPage, 'lap-time-massKg'));
    expect(gridLap.map((s) => s.label)).toEqual(['tyre.muLat 1.235', 'tyre.muLat 1.3', 'tyre.muLat 1.365']);
  });

  it('shows a grid with many combinations of the other fields as its points and the line nearest the baseline', () => {
    const html = join(folder, 'grid3.html');
    const run = runCli([
      'sweep',
      '--track',
      loop,
      '--car',
      'cars/brackle-club.json',
      '--line',
      'centreline',
      '--vary',
      'massKg=600:640:20',
      'tyre.muLat=-5%:+5%:5%',
      'tyre.muLong=-5%:+5%:5%',
      '--workers',
      '1',
      '--html',
      html,
    ]);
    expect(run.code).toBe(0);
    const svg = chartSource(readFileSync(html, 'utf8'), 'lap-time-massKg');
    // 3 x 3 x 3 runs: nine combinations of the other two fields, more than the lines a chart can tell apart.
    expect(pointsOf(svg, 0)).toHaveLength(27);
    expect(seriesOf(svg).map((s) => s.label)).toEqual(['others nearest the baseline']);
    expect(pointsOf(svg, 1).map((p) => p.x)).toEqual([600, 620, 640]);
  });

  it('plots the lap times of the CSV, where the y axis says they are', () => {
    const svg = chartSource(oatPage, 'lap-time-massKg');
    const points = pointsOf(svg, 0);
    const rows = csvRows(oatCsv).filter((r) => r.kind === 'oat' && r.varies === 'massKg');
    expect(points.map((p) => p.x)).toEqual(rows.map((r) => Number(r.massKg)).sort((a, b) => a - b));
    const { toValue, perPixel } = yAxisMap(svg);
    for (const point of points) {
      const row = rows.find((r) => Number(r.massKg) === point.x)!;
      expect(point.y).toBe(Number(row.lap_time_s));
      // The marker's drawn height read back through the axis ticks, within the 0.1 px rounding of the coordinates.
      expect(Math.abs(toValue(point.cy) - point.y)).toBeLessThan(0.15 * perPixel);
    }
    // Lap times rise with mass (the car has the same power and grip to move more of it; common practice).
    expect(points[2]!.y).toBeGreaterThan(points[0]!.y);
  });

  it('plots at massKg 640 the lap time a separate simulate of that car gives', () => {
    const car = JSON.parse(readFileSync(hostileCar, 'utf8')) as Record<string, unknown>;
    const heavier = join(folder, 'heavier.json');
    writeFileSync(heavier, JSON.stringify({ ...car, massKg: 640 }));
    const run = runCli(['simulate', '--track', loop, '--car', heavier, '--line', 'centreline', '--json']);
    expect(run.code).toBe(0);
    const simulated = JSON.parse(run.stdout).lapTimeS as number;
    const point = pointsOf(chartSource(oatPage, 'lap-time-massKg'), 0).find((p) => p.x === 640)!;
    // simulate --json rounds to 0.1 ms, the sweep CSV to 1 µs.
    expect(Math.abs(point.y - simulated)).toBeLessThan(1e-4 + 1e-6);
  });

  it('shows a hostile car name as text', () => {
    expect(oatPage).not.toContain('<img');
    expect(oatPage).not.toContain('<script>window');
    expect(oatPage).toContain(
      '&lt;img src=x onerror=alert(1)&gt; &amp; &lt;script&gt;window.__sweepInjected=1&lt;/script&gt;',
    );
  });

  it('escapes a hostile field name from a sweep CSV', () => {
    const text = readFileSync(oatCsv, 'utf8').replaceAll('massKg', HOSTILE_FIELD);
    const page = sweepReportHtml(parseSweepCsv(text, 'hostile.csv'));
    expect(page).not.toMatch(/<img/);
    expect(page).toContain('&lt;img src=x onerror=alert(2)&gt;');
    // The chart's name (an attribute and the --svg file name) keeps letters, digits, dots and dashes only.
    expect(chartNames(page)).toContain('lap-time-_img_src_x_onerror_alert_2_');
  });

  it('writes each chart as a well-formed standalone SVG file', () => {
    expect(readdirSync(svgFolder).sort()).toEqual([
      'braking-shift-massKg.svg',
      'braking-shift-tyre.muLat.svg',
      'lap-time-massKg.svg',
      'lap-time-tyre.muLat.svg',
    ]);
    for (const file of readdirSync(svgFolder)) {
      const svg = readFileSync(join(svgFolder, file), 'utf8');
      expect(XMLValidator.validate(svg), file).toBe(true);
      expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
    }
  });
});

describe('whatif report page', () => {
  it('draws the braking-point shift of a straight into a hairpin as the kinematic braking distances predict', () => {
    const hairpin = writeHairpin(folder);
    const slick = writeSlickCar(folder);
    const html = join(folder, 'whatif.html');
    const run = runCli([
      'whatif',
      '--track',
      hairpin,
      '--car',
      slick,
      '--line',
      'centreline',
      '--start-speed-kph',
      '180',
      '--set',
      'tyre.muLong=-20%',
      '--html',
      html,
    ]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain(`Report written to ${html}`);
    const page = readFileSync(html, 'utf8');
    expect(page).not.toMatch(/https?:|<script\b/i);
    expect(chartNames(page)).toEqual(['braking-shift']);
    const bars = [...page.matchAll(/<path class="bar" data-value="([^"]+)"/g)].map((m) => Number(m[1]));
    expect(bars).toHaveLength(1);
    // Constant-deceleration kinematics: d = (v1^2 - v2^2) / (2 mu g), v2^2 = muLat g R (steady cornering).
    const v1 = 50;
    const v2sq = 1.2 * g * 20;
    const d = (mu: number) => (v1 * v1 - v2sq) / (2 * mu * g);
    expect(Math.abs(bars[0]! - -(d(0.96) - d(1.2)))).toBeLessThan(1);
    expect(page).toContain(SAFETY_CAUTION.replace(/'/g, '&#39;'));
  });
});
