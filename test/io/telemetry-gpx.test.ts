// GPX 1.1 reading (topografix.com/GPX/1/1) and the local plane: a hand-made file with points on a circle of
// radius 100 m, and the length of one degree of latitude on WGS 84.

import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readTelemetryFile, parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { localPlane, reprojectPlane } from '../../src/track/geodesy.js';
import { InputError } from '../../src/errors.js';
import { wgs84Radii } from '../fixtures/telemetry/tracks.js';
import { noteText } from '../../src/report/note-text.js';

const fixtures = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', 'fixtures', 'telemetry');

describe('GPX 1.1', () => {
  it('projects a circle of radius 100 m to a circle of that radius (within 1 %), with times and speeds', async () => {
    const session = await readTelemetryFile(path.join(fixtures, 'circle.gpx'), { columns: {} });
    expect(session.count).toBe(72);
    expect(session.timeS[71]).toBe(71);
    let cx = 0;
    let cy = 0;
    for (let i = 0; i < session.count; i++) {
      cx += session.xM![i]!;
      cy += session.yM![i]!;
    }
    cx /= session.count;
    cy /= session.count;
    for (let i = 0; i < session.count; i++) {
      const radius = Math.hypot(session.xM![i]! - cx, session.yM![i]! - cy);
      expect(Math.abs(radius - 100)).toBeLessThan(1);
    }
    // Speed from <extensions> on every other point (2 pi 100 m / 72 s), filled between.
    expect(session.speedMps![0]).toBeCloseTo((2 * Math.PI * 100) / 72, 3);
    expect(session.speedMps![1]).toBeCloseTo((2 * Math.PI * 100) / 72, 3);
  });

  it('keeps <ele> as the altitude and names the track point elements it does not use', () => {
    // GPX 1.1 (topografix.com/GPX/1/1): <ele> is the elevation in metres; <sat> and vendor extensions such as a
    // heart rate are elements the reader has no use for.
    const point = (i: number, inner: string) =>
      `<trkpt lat="${47 + i * 1e-4}" lon="8"><time>2026-01-01T10:00:0${i}Z</time>${inner}</trkpt>`;
    const text = `<?xml version="1.0"?><gpx version="1.1"><trk><trkseg>${[
      point(0, '<ele>412.5</ele><sat>9</sat>'),
      point(1, '<ele>413.0</ele><extensions><x:hr>120</x:hr><x:speed>11</x:speed></extensions>'),
      point(2, '<extensions><x:speed>11</x:speed></extensions>'),
    ].join('')}</trkseg></trk></gpx>`;
    const session = parseTelemetryText(text, 'ele.gpx', { columns: {} });
    expect(Array.from(session.altitudeM!)).toEqual([412.5, 413, 413]);
    expect(session.notes).toContain('track point elements not used: sat, x:hr');
    expect(
      session.notes.some((note) =>
        /^GPS altitude \(<ele>\) read on 2 of 3 fixes, 412\.5 to 413\.0 m/.test(noteText(note)),
      ),
    ).toBe(true);
  });

  it('refuses a .gpx that is not XML in one line naming the file', async () => {
    const read = readTelemetryFile(path.join(fixtures, 'broken.gpx'), { columns: {} });
    await expect(read).rejects.toThrow(InputError);
    await expect(readTelemetryFile(path.join(fixtures, 'broken.gpx'), { columns: {} })).rejects.toThrow(
      /broken\.gpx: not a GPX file \(not valid XML/,
    );
  });

  it('refuses track points without time', () => {
    const text =
      '<?xml version="1.0"?><gpx version="1.1"><trk><trkseg><trkpt lat="1" lon="2"/><trkpt lat="1.0001" lon="2"/></trkseg></trk></gpx>';
    expect(() => parseTelemetryText(text, 'notime.gpx', { columns: {} })).toThrow(
      /notime\.gpx: track point 1: no readable <time>/,
    );
  });
});

describe('local plane on WGS 84', () => {
  it('one degree of latitude at 45 N is about 111.13 km (from memory: meridian degree tables, 111.132 km)', () => {
    const plane = localPlane({ latDeg: 45, lonDeg: 0 });
    const out = new Float64Array(2);
    plane.toLocal(45.5, 0, out);
    const north = out[1]!;
    plane.toLocal(44.5, 0, out);
    expect((north - out[1]!) / 1000).toBeCloseTo(111.13, 1);
  });

  it('one degree of longitude on the equator is about 111.32 km (from memory: a = 6378.137 km, 2 pi a / 360)', () => {
    const plane = localPlane({ latDeg: 0, lonDeg: 0 });
    const out = new Float64Array(2);
    plane.toLocal(0, 0.01, out);
    // 0.01 degree, close enough to the origin that the tangent plane and the arc agree to 1e-9.
    expect(out[0]! * 100).toBeCloseTo((2 * Math.PI * 6378137) / 360, 0);
  });

  it("moves points between two origins' planes: the second origin lands on (0, 0)", () => {
    const from = { latDeg: 47.2, lonDeg: 8.1 };
    const to = { latDeg: 47.201, lonDeg: 8.102 };
    // East/north of `to` in the plane about `from`, by the small-area rule with WGS 84 radii (written in the test).
    const { meridianM, primeM } = wgs84Radii(from.latDeg);
    const east = (((to.lonDeg - from.lonDeg) * Math.PI) / 180) * primeM * Math.cos((from.latDeg * Math.PI) / 180);
    const north = (((to.latDeg - from.latDeg) * Math.PI) / 180) * meridianM;
    const moved = reprojectPlane(Float64Array.of(east), Float64Array.of(north), from, to);
    expect(Math.abs(moved.xM[0]!)).toBeLessThan(0.01);
    expect(Math.abs(moved.yM[0]!)).toBeLessThan(0.01);
  });
});
