// The report's track map draws the racing line the reference drove (`--line auto|FILE` on simulate and
// compare), not the centreline: on a ring the fastest line runs along the inner edge, so the drawn reference
// must sit at the inner edge's radius.

import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cli.js';

const car = 'cars/brackle-club.json';
const RADIUS_M = 100;
const WIDTH_M = 20;
// `reflap line` keeps half the car's width (1.6 m) plus 0.3 m from each edge (docs/racing-line.md).
const MARGIN_M = 1.6 / 2 + 0.3;

let folder: string;
let ring: string;
let trace: string;

function mapSource(html: string): string {
  const start = html.lastIndexOf('<svg', html.indexOf('data-chart="map"'));
  return html.slice(start, html.indexOf('</svg>', start));
}

function pointsOf(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

/** Mean distance of a drawn path from the ring's centre, in metres, scaled by the centreline's drawn radius. */
function drawnRadiusM(html: string, pathSelector: RegExp): number {
  const map = mapSource(html);
  const surface = pointsOf(/<path class="track-surface" d="([^"]+)"/.exec(map)![1]!);
  const cx = surface.reduce((s, p) => s + p[0], 0) / surface.length;
  const cy = surface.reduce((s, p) => s + p[1], 0) / surface.length;
  const meanRadius = (points: [number, number][]) =>
    points.reduce((s, [x, y]) => s + Math.hypot(x - cx, y - cy), 0) / points.length;
  const drawn = [...map.matchAll(pathSelector)].flatMap((m) => pointsOf(m[1]!));
  expect(drawn.length).toBeGreaterThan(50);
  // The surface is drawn along the centreline, radius RADIUS_M.
  return (meanRadius(drawn) / meanRadius(surface)) * RADIUS_M;
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-line-map-'));
  ring = join(folder, 'ring.json');
  writeFileSync(
    ring,
    JSON.stringify({
      name: 'test ring',
      closed: true,
      widthM: WIDTH_M,
      segments: [{ kind: 'arc', radiusM: RADIUS_M, angleDeg: 360 }],
    }),
  );
  trace = join(folder, 'trace.csv');
  expect(runCli(['simulate', '--track', ring, '--car', car, '--out', trace]).code).toBe(0);
});

// On a ring at the grip limit v = sqrt(mu g r), so the lap time 2 pi r / v grows as sqrt(r): the smallest
// radius inside the edges, the inner edge less the margin, is the fastest (steady cornering, common practice).
const innerLineRadiusM = RADIUS_M - WIDTH_M / 2 + MARGIN_M;

describe('the map of a lap on a racing line', () => {
  it('simulate --line auto: the reference is drawn along the inner edge', () => {
    const html = join(folder, 'simulate-line.html');
    expect(runCli(['simulate', '--track', ring, '--car', car, '--line', 'auto', '--html', html]).code).toBe(0);
    const radius = drawnRadiusM(readFileSync(html, 'utf8'), /<path class="grip-[a-z]+" d="([^"]+)"/g);
    expect(Math.abs(radius - innerLineRadiusM)).toBeLessThan(0.3);
  });

  it('simulate --line centreline: the reference is drawn on the centreline', () => {
    const html = join(folder, 'simulate-centre.html');
    expect(runCli(['simulate', '--track', ring, '--car', car, '--line', 'centreline', '--html', html]).code).toBe(0);
    const radius = drawnRadiusM(readFileSync(html, 'utf8'), /<path class="grip-[a-z]+" d="([^"]+)"/g);
    expect(Math.abs(radius - RADIUS_M)).toBeLessThan(0.3);
  });

  it('compare --line auto and --line FILE: the reference is drawn along the inner edge', () => {
    const lineCsv = join(folder, 'ring-line.csv');
    expect(runCli(['line', '--track', ring, '--car', car, '--out', lineCsv]).code).toBe(0);
    // A log with positions, driven on the centreline: a line file of the stations alone, every offset zero.
    const stations = readFileSync(lineCsv, 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((l) => l.split(',')[0]);
    const centreLine = join(folder, 'centre-line.csv');
    writeFileSync(centreLine, ['s_m,offset_m', ...stations.map((s) => `${s},0`)].join('\n') + '\n');
    const tracePositions = join(folder, 'trace-positions.csv');
    expect(
      runCli(['simulate', '--track', ring, '--car', car, '--line', centreLine, '--out', tracePositions]).code,
    ).toBe(0);
    expect(readFileSync(tracePositions, 'utf8').split('\n')[0]).toMatch(/x_m,y_m/);
    for (const line of ['auto', lineCsv]) {
      const name = line === 'auto' ? 'auto' : 'file';
      // Without positions in the log, the reference itself is drawn coloured by grip use.
      const bare = join(folder, `compare-${name}.html`);
      const run = runCli([
        'compare',
        '--track',
        ring,
        '--car',
        car,
        '--telemetry',
        trace,
        '--line',
        line,
        '--html',
        bare,
      ]);
      expect(run.code, run.stderr).toBe(0);
      const radius = drawnRadiusM(readFileSync(bare, 'utf8'), /<path class="grip-[a-z]+" d="([^"]+)"/g);
      expect(Math.abs(radius - innerLineRadiusM), `--line ${line}`).toBeLessThan(0.3);
      // With positions, the driver's path is coloured and the reference is the thin line on top.
      const withDriver = join(folder, `compare-${name}-positions.html`);
      expect(
        runCli([
          'compare',
          '--track',
          ring,
          '--car',
          car,
          '--telemetry',
          tracePositions,
          '--line',
          line,
          '--html',
          withDriver,
        ]).code,
      ).toBe(0);
      const page = readFileSync(withDriver, 'utf8');
      expect(
        Math.abs(drawnRadiusM(page, /<path class="reference-line" d="([^"]+)"/g) - innerLineRadiusM),
        `--line ${line}`,
      ).toBeLessThan(0.3);
      expect(Math.abs(drawnRadiusM(page, /<path class="grip-[a-z]+" d="([^"]+)"/g) - RADIUS_M)).toBeLessThan(0.3);
    }
  });
});
