// A brake channel in pressure units is pressure: kept in pascals, and braking read as its share of the
// session's 99th percentile. Unit factors: NIST SP 811 (2008) appendix B, 1 bar = 1e5 Pa exactly,
// 1 psi = 6894.757 Pa (6894.757293168 to the digits given there).

import { describe, expect, it } from 'vitest';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';

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
