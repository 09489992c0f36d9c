// Values outside their plausible range (src/car/plausible.ts) are refused by every telemetry reader alike, with
// the file, the place and the range in one line: positions off the globe, negative speeds, speeds near the
// largest double.

import { describe, expect, it } from 'vitest';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { nmeaChecksum } from '../../src/io/telemetry/nmea.js';
import { inputErrorMessage as messageOf } from '../helpers/input-error.js';

function sentence(body: string): string {
  return `$${body}*${nmeaChecksum(body).toString(16).toUpperCase().padStart(2, '0')}`;
}

/** Three RMC fixes a second apart; `knots` and the position of the second fix are the test's. */
function nmea(second: { lat: string; ns: string; lon: string; ew: string; knots: string }): string {
  const fix = (time: string, lat: string, ns: string, lon: string, ew: string, knots: string) =>
    sentence(`GPRMC,${time},A,${lat},${ns},${lon},${ew},${knots},90.0,060222,,,A`);
  return [
    fix('091533.00', '2824.71975', 'N', '08122.77114', 'W', '40.0'),
    fix('091534.00', second.lat, second.ns, second.lon, second.ew, second.knots),
    fix('091535.00', '2824.72075', 'N', '08122.77114', 'W', '40.0'),
  ].join('\n');
}

const read = (text: string, source: string) => () => parseTelemetryText(text, source, { columns: {} });

describe('NMEA 0183 positions and speeds', () => {
  const good = { lat: '2824.72025', ns: 'N', lon: '08122.77114', ew: 'W', knots: '40.0' };
  it('reads the good log', () => {
    expect(parseTelemetryText(nmea(good), 'log.nmea', { columns: {} }).count).toBe(3);
  });

  it('refuses latitude 95 and longitude 181 as the CSV reader does, naming the line', () => {
    // ddmm.mmmm: 9500.0000 is 95 degrees; dddmm.mmmm: 18100.0000 is 181 degrees (NMEA 0183 field layout).
    expect(messageOf(read(nmea({ ...good, lat: '9500.00000' }), 'log.nmea'))).toBe(
      'log.nmea: line 2: GPRMC position 95.00000, -81.37952 is outside latitude -90 to 90 and longitude -180 to 180',
    );
    expect(messageOf(read(nmea({ ...good, lon: '18100.00000' }), 'log.nmea'))).toMatch(
      /^log\.nmea: line 2: GPRMC position 28\.41200, -181\.00000 is outside/,
    );
  });

  it('refuses a speed of 1e308 knots with the sample, its time and the range', () => {
    expect(messageOf(read(nmea({ ...good, knots: '1e308' }), 'log.nmea'))).toMatch(
      /^log\.nmea: sample 2 \(t = 1\.00 s\): speed [0-9.e+]+ m\/s is over 200 m\/s \(720 km\/h\)$/,
    );
  });
});

describe('negative speeds are refused by every reader', () => {
  it('CSV', () => {
    expect(messageOf(read('time_s,speed_kph\n0,100\n0.1,-5\n0.2,100\n', 'log.csv'))).toMatch(
      /^log\.csv: sample 2 \(t = 0\.10 s\): speed -1\.38\d* m\/s is negative or not a number; speeds run from 0$/,
    );
  });

  it('GPX', () => {
    const point = (i: number, speed: number) =>
      `<trkpt lat="28.41${i}" lon="-81.37"><time>2026-01-01T00:00:0${i}Z</time><extensions><speed>${speed}</speed></extensions></trkpt>`;
    const gpx = `<?xml version="1.0"?><gpx version="1.1"><trk><trkseg>${point(1, 10)}${point(2, -3)}${point(3, 10)}</trkseg></trk></gpx>`;
    expect(messageOf(read(gpx, 'log.gpx'))).toBe(
      'log.gpx: sample 2 (t = 1.00 s): speed -3 m/s is negative or not a number; speeds run from 0',
    );
  });
});
