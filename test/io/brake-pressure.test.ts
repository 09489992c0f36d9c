// A brake channel in pressure units is pressure: kept in pascals, and braking read as its share of the
// session's 99th percentile. Unit factors: NIST SP 811 (2008) appendix B, 1 bar = 1e5 Pa exactly,
// 1 psi = 6894.757 Pa (6894.757293168 to the digits given there).

import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseTelemetryText, streamTelemetryCsv, CHUNK_ROWS } from '../../src/io/telemetry/read-telemetry.js';
import {
  addPressures,
  histogramQuantilePa,
  pressureHistogram,
  PRESSURE_BIN_SHARE,
} from '../../src/io/telemetry/brake-pressure.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

const read = (text: string) => parseTelemetryText(text, 'log.csv', { columns: {} });

/** A 10 Hz log of `pressures` (one per row) with speed, under the given header lines. */
function log(headerLines: string[], pressures: number[], pedal?: number[]): string {
  const rows = pressures.map((p, i) => [
    (i * 0.1).toFixed(1),
    '30',
    p.toFixed(2),
    ...(pedal ? [pedal[i]!.toFixed(2)] : []),
  ]);
  return [...headerLines, ...rows.map((row) => row.join(','))].join('\n') + '\n';
}

/** 300 rows: coasting, then a stop that builds to 60 bar and holds it for 60 rows, and one 300 bar spike. */
function stopWithSpike(): number[] {
  const pressures: number[] = [];
  for (let i = 0; i < 300; i++) pressures.push(i < 100 ? 0 : i < 120 ? (i - 100) * 3 : i < 180 ? 60 : 0);
  pressures[250] = 300;
  return pressures;
}

describe('brake pressure', () => {
  it('reads a Brake column whose units row says bar as pressure in pascals', () => {
    const session = read(log(['time,speed,Brake', 's,km/h,bar'], stopWithSpike()));
    expect(session.brakePressurePa![150]).toBe(60e5);
    expect(session.notes.join('\n')).toMatch(
      /column Brake \[bar\] is brake pressure: braking read as its share of 60\.0 bar/,
    );
  });

  it('sets full braking at the 99th percentile, so one spike does not scale the rest down', () => {
    const pressures = stopWithSpike();
    const session = read(log(['time_s,speed_kph,brake_pressure_bar'], pressures));
    // The 99th percentile by the test's own sort, Hyndman and Fan (1996) type 7: position 0.99 * 299 = 296.01,
    // between the sorted samples 296 and 297, both 60 bar.
    const sorted = [...pressures].sort((a, b) => a - b);
    const full = sorted[296]! + 0.01 * (sorted[297]! - sorted[296]!);
    expect(full).toBe(60);
    expect(session.brake![150]).toBe(1);
    expect(session.brake![110]).toBeCloseTo(30 / 60, 12);
    expect(session.brake![250]).toBe(1);
    expect(session.brake![50]).toBe(0);
  });

  it('reads psi and kPa headers', () => {
    const psi = read(log(['time_s,speed_kph,Brake Pressure (psi)'], [0, 100, 100, 0]));
    expect(psi.brakePressurePa![1]).toBeCloseTo(100 * 6894.757293168, 6);
    const kpa = read(log(['time_s,speed_kph,brake_pressure [kPa]'], [0, 2500, 2500, 0]));
    expect(kpa.brakePressurePa![1]).toBe(2.5e6);
  });

  it('keeps the pedal where the log has one, and the pressure beside it', () => {
    const pedal = [0, 50, 100, 0];
    const session = read(log(['time_s,speed_kph,brake_pressure_bar,brake_pct'], [0, 30, 60, 0], pedal));
    expect(Array.from(session.brake!)).toEqual([0, 0.5, 1, 0]);
    expect(session.brakePressurePa![2]).toBe(60e5);
  });

  it('says so where the pressure never rises', () => {
    const session = read(log(['time_s,speed_kph,brake_pressure_bar'], [0, 0, 0, 0]));
    expect(Array.from(session.brake!)).toEqual([0, 0, 0, 0]);
    expect(session.notes.join('\n')).toMatch(/never rises above 0/);
  });
});

/** Hyndman and Fan (1996) type 7 quantile of the values, by the test's own sort. */
function type7(values: number[], q: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const position = (sorted.length - 1) * q;
  const lo = Math.floor(position);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo]! + (position - lo) * (sorted[hi]! - sorted[lo]!);
}

describe('brake pressure read in chunks', () => {
  it('the binned quantile is within a bin of the sorted one', () => {
    // Random stops (0 between them, 20-120 bar holds with noise) and q from 0.5 (no pressure: exactly 0) to 0.999: the binned value sits in
    // the same logarithmic bin as the exact type 7 value, so within PRESSURE_BIN_SHARE of it.
    const random = seededRandom(5);
    const pressures = Float64Array.from({ length: 40_000 }, (_, i) =>
      i % 400 < 250 ? 0 : (20 + 100 * ((i / 400) % 1)) * 1e5 * (1 + 0.01 * random.gaussian()),
    );
    const histogram = pressureHistogram();
    addPressures(histogram, pressures.subarray(0, 15_000));
    addPressures(histogram, pressures.subarray(15_000));
    for (const q of [0.5, 0.9, 0.99, 0.999]) {
      const exact = type7(Array.from(pressures), q);
      expect(Math.abs(histogramQuantilePa(histogram, q) - exact)).toBeLessThanOrEqual(PRESSURE_BIN_SHARE * exact);
    }
  });

  it('gives the chunks the pedal share of the 99th percentile, as the whole-log reader does', async () => {
    // A log of several chunks: stops building to 40-80 bar and one 300 bar spike; the share of each row is its
    // pressure over the type 7 99th percentile of the test's own sort, within the bins' width.
    const rows = 3 * CHUNK_ROWS + 123;
    const pressures: number[] = [];
    for (let i = 0; i < rows; i++) {
      const phase = i % 500;
      const peak = 40 + (40 * ((Math.floor(i / 500) * 7) % 11)) / 10;
      pressures.push(phase < 400 ? 0 : phase < 420 ? (peak * (phase - 400)) / 20 : peak);
    }
    pressures[1000] = 300;
    const folder = mkdtempSync(path.join(os.tmpdir(), 'reflap-pressure-'));
    const file = path.join(folder, 'stops.csv');
    writeFileSync(file, log(['time_s,speed_kph,brake_pressure_bar'], pressures));
    const fullBar = type7(pressures, 0.99);
    const brake: number[] = [];
    const summary = await streamTelemetryCsv(file, { columns: {} }, (chunk) => {
      expect(chunk.rows).toBeLessThanOrEqual(CHUNK_ROWS);
      brake.push(...chunk.brake!);
    });
    expect(brake.length).toBe(rows);
    expect(summary.channels).toContain('brake');
    for (const i of [0, 405, 410, 450, 1000, rows - 1])
      expect(brake[i]).toBeCloseTo(Math.min(1, pressures[i]! / fullBar), 3);
    expect(summary.notes.join('\n')).toMatch(
      new RegExp(`brake pressure: braking read as its share of ${fullBar.toFixed(1).replace('.', '\\.')} bar`),
    );
  });
});
