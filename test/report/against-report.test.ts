// The report and the aligned traces of `compare --against`: two laps written by `simulate` for two cars that differ
// only in tyre.muLong on the bundled demo circuit, and a lap set against itself. The other lap's columns are checked
// against the other lap's own file, the deltas against their definition (driver minus other lap elapsed time).

import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { readTrace, sharedGripPair, writeSessionLog } from '../helpers/logs.js';
import { onSharedLine } from '../helpers/shared-line.js';
import { gainClasses } from '../../src/report/html/track-map.js';

const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const carFile = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const work = mkdtempSync(path.join(tmpdir(), 'reflap-against-report-'));
// The laps and every run drive the demo car's racing line, computed once for the test run.
const { highGrip, lowGrip } = sharedGripPair(track, carFile, 1.2);

function csvColumns(file: string): Record<string, number[]> {
  const [head, ...rows] = readFileSync(file, 'utf8').trim().split('\n');
  const names = head!.split(',');
  const columns: Record<string, number[]> = Object.fromEntries(names.map((name) => [name, []]));
  for (const row of rows)
    row.split(',').forEach((cell, k) => columns[names[k]!]!.push(cell === '' ? NaN : Number(cell)));
  return columns;
}

function chartSource(html: string, name: string): string {
  const start = html.search(new RegExp(`<svg[^>]*data-chart="${name}"`));
  expect(start, `chart ${name}`).toBeGreaterThan(-1);
  return html.slice(start, html.indexOf('</svg>', start) + 6);
}

const compare = (telemetry: string, extra: string[]) =>
  runCli(['compare', ...onSharedLine(track, carFile), '--telemetry', telemetry, ...extra]);

describe('compare --against: the aligned traces and the page', () => {
  const out = path.join(work, 'pair');
  const html = path.join(work, 'pair.html');
  const run = compare(lowGrip, ['--against', highGrip, '--out', out, '--html', html]);

  it('writes the other lap beside the driver and the reference, its delta by definition', () => {
    expect(run.code, run.stderr).toBe(0);
    const aligned = csvColumns(path.join(out, 'aligned.csv'));
    for (const name of [
      'time_other_s',
      'delta_other_s',
      'speed_other_kph',
      'throttle_other',
      'brake_other',
      'ax_other_mps2',
      'ay_other_mps2',
    ])
      expect(aligned[name], name).toBeDefined();
    const n = aligned.station_m!.length;
    for (let i = 0; i < n; i++) {
      // Issue 13: the delta is the driver's elapsed time minus the other lap's at the same station.
      expect(aligned.delta_other_s![i]!).toBeCloseTo(aligned.time_driver_s![i]! - aligned.time_other_s![i]!, 3);
    }
    // The other lap's speeds are the high-grip lap's own (its simulate trace, m/s times 3.6 by the definition of the
    // km/h): its top and slowest speeds agree, whatever the two files' distance axes (the trace's runs along the
    // line it drove, the aligned one along the centreline).
    const other = readTrace(highGrip);
    const speed = other.header.indexOf('speed_mps');
    const ownKph = other.rows.map((row) => row[speed]! * 3.6);
    expect(Math.abs(Math.max(...aligned.speed_other_kph!) - Math.max(...ownKph))).toBeLessThan(1);
    expect(Math.abs(Math.min(...aligned.speed_other_kph!) - Math.min(...ownKph))).toBeLessThan(1);
    // The low-grip lap is the slower: its delta to the high-grip lap at the last station is its lap-time difference.
    const lastTime = (file: string) => {
      const trace = readTrace(file);
      return trace.rows.at(-1)![trace.header.indexOf('time_s')]!;
    };
    expect(Math.abs(aligned.delta_other_s![n - 1]! - (lastTime(lowGrip) - lastTime(highGrip)))).toBeLessThan(0.05);
  });

  it('draws three traces, both deltas of the driver and the map coloured by gain and loss', () => {
    const page = readFileSync(html, 'utf8');
    const speed = chartSource(page, 'speed');
    expect(speed).toContain('lap 1 of high.csv');
    expect(speed.match(/<path class="series"/g)).toHaveLength(3);
    const delta = chartSource(page, 'delta');
    expect(delta).toContain('driver − reference');
    expect(delta).toContain('driver − lap 1 of high.csv');
    expect(delta.match(/<path class="series"/g)).toHaveLength(2);
    // The y axes that follow a zoom name their series; the pedals keep their 0-100 % scale.
    expect(speed).toMatch(/data-y-keys="vR vD vO vLo vHi"/);
    expect(delta).toMatch(/data-y-keys="dt dtO"[^>]*data-y-zero=""/);
    expect(chartSource(page, 'pedals')).not.toMatch(/data-y-keys/);
    const gain = chartSource(page, 'map-gain');
    // The low-grip lap loses under braking: more of its path is drawn as loss than as gain.
    const pathLength = (cls: string) =>
      [...gain.matchAll(new RegExp(`class="gain-${cls}" d="([^"]+)"`, 'g'))].reduce(
        (sum, m) => sum + m[1]!.split('L').length,
        0,
      );
    expect(pathLength('loss')).toBeGreaterThan(2 * pathLength('gain'));
    expect(page).toContain('Corner by corner against lap 1 of high.csv');
    const data = JSON.parse(/<script type="application\/json" id="lap-data">([\s\S]*?)<\/script>/.exec(page)![1]!);
    expect(data.series.vO.length).toBe(data.d.length);
    expect(data.series.dtO.length).toBe(data.d.length);
  });

  it('draws each corner small for both laps and the reference, the low-grip lap braking first', () => {
    // Braking distance (v1^2 - v2^2) / (2 mu g) grows as the braking grip falls (any mechanics textbook): the lap of
    // the car with muLong 1.2 starts braking no later than the bundled car's wherever both brake in a corner's
    // window, and earlier in at least one (in others both already brake where the window starts).
    const page = readFileSync(html, 'utf8');
    const charts = [...page.matchAll(/<svg[^>]*data-corner-multiple="(\d+)"[\s\S]*?<\/svg>/g)].map((m) => m[0]);
    expect(charts.length).toBeGreaterThan(3);
    const firstBrakeX = (svg: string, lap: number): number | null => {
      const group = new RegExp(`data-lap="${lap}"[\\s\\S]*?class="brake" d="([^"]+)"`).exec(svg);
      expect(group, `lap ${lap} drawn`).not.toBeNull();
      const points = [...group![1]!.matchAll(/(-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
      const bottom = Math.max(...points.map((p) => p[1]!));
      // A brake share above 5 % of the chart's 0-100 % height (50 px) is braking.
      const first = points.find((p) => p[1]! < bottom - 2.5);
      return first ? first[0]! : null;
    };
    let earlier = 0;
    for (const svg of charts) {
      expect(svg).toMatch(/<title>driver<\/title>/);
      expect(svg).toMatch(/<title>lap 1 of high\.csv<\/title>/);
      expect(svg).toContain('class="reference-trace"');
      const driverX = firstBrakeX(svg, 1);
      const otherX = firstBrakeX(svg, 2);
      if (driverX === null || otherX === null) continue;
      expect(driverX, 'the low-grip lap brakes first').toBeLessThanOrEqual(otherX + 0.5);
      if (driverX < otherX - 1) earlier++;
    }
    expect(earlier).toBeGreaterThanOrEqual(1);
  });
});

it('a lap set against itself has zero delta everywhere in the aligned traces', () => {
  // Issue 13: a lap compared against itself, all deltas zero.
  const log = writeSessionLog(path.join(work, 'session.csv'), [lowGrip, highGrip, lowGrip]);
  const out = path.join(work, 'self');
  const run = compare(log, ['--lap', '2', '--against-lap', '2', '--out', out]);
  expect(run.code, run.stderr).toBe(0);
  const aligned = csvColumns(path.join(out, 'aligned.csv'));
  expect(aligned.delta_other_s!.every((v) => v === 0)).toBe(true);
  expect(aligned.speed_other_kph).toEqual(aligned.speed_driver_kph);
});

describe('the gain map classes', () => {
  it('follow a delta built to rise over one stretch and fall over another', () => {
    // By construction: 1 m stations; the delta climbs 0.2 s over 200-260 m (losing), falls 0.2 s over 500-560 m
    // (gaining), and is flat elsewhere.
    const n = 800;
    const delta = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const rise = Math.min(1, Math.max(0, (i - 200) / 60));
      const fall = Math.min(1, Math.max(0, (i - 500) / 60));
      delta[i] = 0.2 * rise - 0.2 * fall;
    }
    const classes = gainClasses(delta, [100, 230, 400, 530, 700], 1);
    expect(classes).toEqual(['even', 'loss', 'even', 'gain', 'even']);
  });
});
