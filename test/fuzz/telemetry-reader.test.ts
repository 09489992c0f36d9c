// Property-based tests of the telemetry readers (parseTelemetryText: CSV, NMEA 0183, GPX): any text gives a
// session or a one-line InputError naming the file; every session is sound (at least 2 samples, time not
// decreasing and advancing, every channel as long as the time and free of NaN, as the TelemetrySession
// contract in src/compare/types.ts states).

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { anyText, csvText, gpxText, lineEnd, nmeaLine, resultOrInputError, runs } from './generators.js';
import { nmeaChecksum } from '../../src/io/telemetry/nmea.js';
import { noteText } from '../../src/report/note-text.js';

function expectSoundSession(session: TelemetrySession): void {
  const n = session.count;
  expect(n).toBeGreaterThanOrEqual(2);
  expect(session.timeS.length).toBe(n);
  for (let i = 1; i < n; i++)
    if (!(session.timeS[i]! >= session.timeS[i - 1]!)) throw new Error(`time decreases at sample ${i}`);
  expect(session.timeS[n - 1]! > session.timeS[0]!).toBe(true);
  const channels = {
    distanceM: session.distanceM,
    speedMps: session.speedMps,
    throttle: session.throttle,
    brake: session.brake,
    axMps2: session.axMps2,
    ayMps2: session.ayMps2,
    steeringDeg: session.steeringDeg,
    gear: session.gear,
    rpm: session.rpm,
    xM: session.xM,
    yM: session.yM,
    timeS: session.timeS,
  };
  for (const [name, values] of Object.entries(channels)) {
    if (!values) continue;
    expect(values.length).toBe(n);
    for (let i = 0; i < n; i++) if (!Number.isFinite(values[i]!)) throw new Error(`${name}[${i}] = ${values[i]}`);
  }
  for (const note of session.notes) expect(noteText(note)).not.toMatch(/[\r\n]/);
}

/** Sessions read per source, so each property can show it is not only exercising the error paths. */
const sessionsRead = new Map<string, number>();

function check(text: string, source: string): void {
  const session = resultOrInputError(() => parseTelemetryText(text, source, { columns: {} }), source);
  if (session) {
    expectSoundSession(session);
    sessionsRead.set(source, (sessionsRead.get(source) ?? 0) + 1);
  }
}

const telemetryHeaders = fc.array(
  fc.constantFrom(
    'time_s',
    'Time',
    'time [ms]',
    'speed_kph',
    'Speed (km/h)',
    'speed',
    'distance_m',
    'throttle',
    'Throttle (%)',
    'brake',
    'lat',
    'lon',
    'x_m',
    'y_m',
    'ax_g',
    'ay',
    'gear',
    'rpm',
    'notes',
    '',
  ),
  { minLength: 0, maxLength: 7 },
);

/** A plausible log: time rising (sometimes with repeats), speed, position; numbers only. */
const plausibleLog = fc
  .record({
    count: fc.integer({ min: 0, max: 60 }),
    dt: fc.constantFrom(0.01, 0.1, 1),
    repeatEvery: fc.integer({ min: 0, max: 7 }),
    withPosition: fc.boolean(),
    decimalComma: fc.boolean(),
  })
  .map(({ count, dt, repeatEvery, withPosition, decimalComma }) => {
    const sep = decimalComma ? ';' : ',';
    const number = (v: number) => (decimalComma ? v.toFixed(3).replace('.', ',') : v.toFixed(3));
    const lines = [
      withPosition ? ['time_s', 'speed_kph', 'x_m', 'y_m'].join(sep) : ['time_s', 'speed_kph', 'throttle'].join(sep),
    ];
    let t = 0;
    for (let i = 0; i < count; i++) {
      if (!(repeatEvery > 0 && i % repeatEvery === 0)) t += dt;
      const angle = i / 10;
      lines.push(
        (withPosition
          ? [t, 100 + 20 * Math.sin(angle), 200 * Math.cos(angle), 200 * Math.sin(angle)]
          : [t, 100 + 20 * Math.sin(angle), 50 + 50 * Math.cos(angle)]
        )
          .map(number)
          .join(sep),
      );
    }
    return lines.join('\n') + '\n';
  });

/** Sentences mostly in time order (a second apart, RMC and GGA of one fix sharing the stamp), sometimes not. */
const nmeaText = fc
  .record({
    lines: fc.array(nmeaLine, { maxLength: 30 }),
    end: lineEnd,
    ordered: fc.oneof({ weight: 4, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
  })
  .map(({ lines, end, ordered }) => {
    if (!ordered) return lines.join(end);
    return lines
      .map((line, i) => {
        const fields = line.split(',');
        const second = 36000 + Math.floor(i / 2);
        fields[1] = `${String(Math.floor(second / 3600)).padStart(2, '0')}${String(Math.floor((second % 3600) / 60)).padStart(2, '0')}${String(second % 60).padStart(2, '0')}.00`;
        const body = fields
          .join(',')
          .slice(1)
          .replace(/\*[^*]*$/, '');
        const star = line.lastIndexOf('*');
        const stated = star < 0 ? '' : line.slice(star + 1);
        const right = nmeaChecksum(line.slice(1, star < 0 ? undefined : star)) === parseInt(stated, 16);
        return `$${body}${star < 0 ? '' : `*${(right ? nmeaChecksum(body) : (nmeaChecksum(body) + 1) & 255).toString(16).toUpperCase().padStart(2, '0')}`}`;
      })
      .join(end);
  });

describe('telemetry reader fuzz', () => {
  it('CSV: any text, CSV-like text of any dialect, plausible logs', () => {
    fc.assert(
      fc.property(fc.oneof(anyText, csvText(telemetryHeaders), csvText(telemetryHeaders), plausibleLog), (text) =>
        check(text, 'fuzz-log.csv'),
      ),
      runs(800, 20260620),
    );
    expect(sessionsRead.get('fuzz-log.csv')).toBeGreaterThan(40);
  });

  it('NMEA 0183: sentences with right, wrong and missing checksums, fixes and no fixes', () => {
    fc.assert(
      fc.property(fc.oneof(nmeaText, nmeaText, anyText), (text) => check(text, 'fuzz-log.nmea')),
      runs(500, 20260621),
    );
    expect(sessionsRead.get('fuzz-log.nmea')).toBeGreaterThan(25);
  });

  it('GPX: documents and near misses, cut short or not XML at all', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          gpxText,
          gpxText,
          anyText.map((text) => `<gpx>${text}`),
        ),
        (text) => check(text, 'fuzz-log.gpx'),
      ),
      runs(400, 20260622),
    );
    expect(sessionsRead.get('fuzz-log.gpx')).toBeGreaterThan(20);
    console.log(`telemetry fuzz: sessions read ${JSON.stringify(Object.fromEntries(sessionsRead))}`);
  });
});
