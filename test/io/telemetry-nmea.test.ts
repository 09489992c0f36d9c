// NMEA 0183 reading: sentences built here as the standard lays them out (NMEA 0183 v4.10, sec. 5.2: '$', talker +
// sentence id, comma-separated fields, '*', checksum = XOR of the characters between '$' and '*' in two hex
// digits), with the checksum computed by a loop written in this test.

import { describe, expect, it } from 'vitest';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { nmeaChecksum } from '../../src/io/telemetry/nmea.js';
import { selectLap } from '../../src/compare/align.js';
import { InputError } from '../../src/errors.js';
import { ringTrack, toLatLon } from '../fixtures/telemetry/tracks.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';

/** Hand-written checksum: XOR of every character code between '$' and '*'. */
function xor(body: string): string {
  let sum = 0;
  for (const character of body) sum ^= character.charCodeAt(0);
  return sum.toString(16).toUpperCase().padStart(2, '0');
}
const sentence = (body: string) => `$${body}*${xor(body)}`;

/** ddmm.mmmmm / dddmm.mmmmm with hemisphere. */
function nmeaAngle(deg: number, degreeDigits: number, positive: string, negative: string): [string, string] {
  const a = Math.abs(deg);
  const d = Math.floor(a);
  const minutes = (a - d) * 60;
  return [
    `${String(d).padStart(degreeDigits, '0')}${minutes.toFixed(5).padStart(8, '0')}`,
    deg >= 0 ? positive : negative,
  ];
}

function hhmmss(secondOfDay: number): string {
  const h = Math.floor(secondOfDay / 3600);
  const m = Math.floor((secondOfDay % 3600) / 60);
  const s = secondOfDay - h * 3600 - m * 60;
  return `${String(h).padStart(2, '0')}${String(m).padStart(2, '0')}${s.toFixed(2).padStart(5, '0')}`;
}

describe('NMEA 0183', () => {
  it('checksums match published examples (from memory: the RMC/GGA examples widely quoted with the standard)', () => {
    // From memory: "$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A" and the GGA "...*47".
    const rmc = 'GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W';
    const gga = 'GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,';
    expect(xor(rmc)).toBe('6A');
    expect(xor(gga)).toBe('47');
    expect(nmeaChecksum(rmc)).toBe(0x6a);
    expect(nmeaChecksum(gga)).toBe(0x47);
  });

  it('reads the published example: position in degrees and minutes, speed in knots (1 kn = 1852/3600 m/s, SI brochure)', () => {
    const text = [
      '$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47',
      '$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A',
      sentence('GPGGA,123520,4807.050,N,01131.010,E,1,08,0.9,545.4,M,46.9,M,,'),
      sentence('GPRMC,123520,A,4807.050,N,01131.010,E,022.6,084.4,230394,003.1,W'),
    ].join('\r\n');
    const session = parseTelemetryText(text, 'example.nmea', { columns: {} });
    expect(session.count).toBe(2);
    expect(session.timeS[1]).toBe(1);
    expect(session.speedMps![0]).toBeCloseTo((22.4 * 1852) / 3600, 9);
    // 48 deg 07.038' N = 48.1173 deg; the origin is the mean of the two fixes.
    expect(session.geoOrigin!.latDeg).toBeCloseTo((48 + 7.038 / 60 + 48 + 7.05 / 60) / 2, 9);
    // 0.012' of latitude = 0.012 * 1852 m (a nautical mile is one minute of arc, from memory), within 1 %.
    expect(session.yM![1]! - session.yM![0]!).toBeCloseTo(0.012 * 1852, 0);
  });

  it("keeps GGA's altitude (field 9, metres) and names the sentence types it does not use", () => {
    // The published GGA example (from memory, as above) gives an antenna altitude of 545.4 M; the second fix's
    // GGA is written here 2.5 m higher, the third fix has no GGA and takes the altitude by interpolation in time.
    const text = [
      '$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47',
      '$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A',
      sentence('GPGSV,1,1,01,01,40,083,46'),
      sentence('GPGGA,123520,4807.050,N,01131.010,E,1,08,0.9,547.9,M,46.9,M,,'),
      sentence('GPRMC,123520,A,4807.050,N,01131.010,E,022.6,084.4,230394,003.1,W'),
      sentence('GPVTG,084.4,T,,M,022.6,N,041.9,K'),
      sentence('GPRMC,123521,A,4807.062,N,01131.020,E,022.6,084.4,230394,003.1,W'),
    ].join('\r\n');
    const session = parseTelemetryText(text, 'altitude.nmea', { columns: {} });
    expect(Array.from(session.altitudeM!)).toEqual([545.4, 547.9, 547.9]);
    expect(session.notes).toContain('sentences not used: GSV, VTG');
    expect(
      session.notes.some((note) =>
        /^GPS altitude \(GGA\) read on 2 of 3 fixes, 545\.4 to 547\.9 m/.test(noteText(note)),
      ),
    ).toBe(true);
    // In feet under imperial: 545.4 m / 0.3048 = 1789.4 ft, 547.9 m / 0.3048 = 1797.6 ft (NIST SP 811, appendix B).
    expect(session.notes.map((note) => noteText(note, displayUnits('imperial')))).toContainEqual(
      expect.stringMatching(/^GPS altitude \(GGA\) read on 2 of 3 fixes, 1789\.4 to 1797\.6 ft, but not used/),
    );
  });

  it('skips and counts sentences with a wrong checksum, ignores fixes without a fix, any talker id', () => {
    const good1 = sentence('GNRMC,100000.00,A,4807.000,N,01131.000,E,010.0,000.0,010125,,,A');
    const bad = `$GNRMC,100000.10,A,4807.001,N,01131.000,E,010.0,000.0,010125,,,A*${xor('GNRMC,100000.10,A,4807.001,N,01131.000,E,010.0,000.0,010125,,,A') === '00' ? '01' : '00'}`;
    const corrupted = sentence('GLGGA,100000.20,4807.002,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,').replace(
      '4807.002',
      '4807.003',
    );
    const noFix = sentence('GPGGA,100000.30,4807.003,N,01131.000,E,0,00,99.9,,M,,M,,');
    const void_ = sentence('GPRMC,100000.30,V,,,,,,,010125,,,N');
    const good2 = sentence('GPGGA,100000.40,4807.004,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,');
    const session = parseTelemetryText([good1, bad, corrupted, noFix, void_, good2].join('\n'), 'log.nmea', {
      columns: {},
    });
    expect(session.count).toBe(2);
    expect(session.notes).toContain('skipped 2 sentences with bad checksums');
    expect(session.notes).toContain('ignored 2 sentences without a GPS fix');
    expect(session.timeS[1]).toBeCloseTo(0.4, 9);
  });

  it('names the line where time runs backwards, and refuses a file with no fix', () => {
    const a = sentence('GPGGA,100001.00,4807.000,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,');
    const b = sentence('GPGGA,100000.00,4807.001,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,');
    expect(() => parseTelemetryText(`${a}\n${b}\n`, 'back.nmea', { columns: {} })).toThrow(
      /back\.nmea: line 2: time 100000\.00 runs backwards/,
    );
    const none = sentence('GPGGA,100000.30,4807.003,N,01131.000,E,0,00,99.9,,M,,M,,');
    expect(() => parseTelemetryText(none, 'nofix.nmea', { columns: {} })).toThrow(InputError);
  });

  it('a 10 Hz RMC + GGA log round a 100 m ring with a geo origin gives lap time 2 pi R / v', () => {
    const origin = { latDeg: 47.2, lonDeg: 8.1 };
    const track = ringTrack(100, 1, origin);
    const v = 25;
    const lines: string[] = [];
    const start = 36000;
    for (let k = 0; k <= 420; k++) {
      const t = k / 10;
      const angle = -0.5 + (v * t) / 100;
      const [lat, lon] = toLatLon(origin, 100 * Math.cos(angle), 100 * Math.sin(angle));
      const [la, ns] = nmeaAngle(lat, 2, 'N', 'S');
      const [lo, ew] = nmeaAngle(lon, 3, 'E', 'W');
      const time = hhmmss(start + t);
      lines.push(sentence(`GPGGA,${time},${la},${ns},${lo},${ew},1,09,0.8,420.0,M,47.0,M,,`));
      lines.push(sentence(`GPRMC,${time},A,${la},${ns},${lo},${ew},${((v * 3600) / 1852).toFixed(3)},90.0,150625,,,A`));
    }
    const session = parseTelemetryText(lines.join('\n'), 'ring.nmea', { columns: {} });
    expect(session.count).toBe(421);
    const { lap } = selectLap(session, track);
    // Circle circumference over speed (kinematics); the polyline of 1 m chords is 3e-6 shorter than the circle.
    expect(lap.lapTimeS).toBeCloseTo((2 * Math.PI * 100) / v, 2);
    expect(lap.speedMps[10]!).toBeCloseTo(v, 2);
  });
});
