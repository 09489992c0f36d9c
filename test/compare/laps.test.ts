// Lap cutting on a synthetic session: out lap from the grid, three flying laps at known constant speeds
// (lap time = L / v by kinematics), and a pit-in lap that leaves the track into a pit lane 30 m to the side.

import { describe, expect, it } from 'vitest';
import { cutLaps } from '../../src/compare/laps.js';
import { selectLap } from '../../src/compare/align.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { InputError } from '../../src/errors.js';
import { pointAt, sessionOf, triangleTrack } from '../fixtures/telemetry/tracks.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from '../report/converted-quantities.js';
import { readTelemetryFile } from '../../src/io/telemetry/read-telemetry.js';
import { kartTrackOf, REAL_KART_LOG, realKartLogPresent } from '../helpers/real-gps.js';

const track = triangleTrack(1);
const L = track.lengthM;

function empty(count: number): TelemetrySession {
  const channel = () => new Float64Array(count);
  return sessionOf({ source: 'session.csv', timeS: channel(), speedMps: channel(), xM: channel(), yM: channel() });
}

/** Out lap from 700 m, laps at 40, 43 and 38 m/s, then a pit-in lap: off into the pit lane at 800 m, stop at 1000 m. */
function threeLapSession(rateHz: number): { session: TelemetrySession; speeds: number[] } {
  const speeds = [30, 40, 43, 38, 30];
  const pieces: Array<{ fromM: number; toM: number; v: number }> = [
    { fromM: 700, toM: L, v: speeds[0]! },
    { fromM: L, toM: 2 * L, v: speeds[1]! },
    { fromM: 2 * L, toM: 3 * L, v: speeds[2]! },
    { fromM: 3 * L, toM: 4 * L, v: speeds[3]! },
    { fromM: 4 * L, toM: 4 * L + 1000, v: speeds[4]! },
  ];
  const t: number[] = [];
  const s: number[] = [];
  let time = 0;
  for (const piece of pieces) {
    for (let position = piece.fromM; position < piece.toM; position += piece.v / rateHz) {
      t.push(time + (position - piece.fromM) / piece.v);
      s.push(position);
    }
    time += (piece.toM - piece.fromM) / piece.v;
  }
  const log = empty(t.length);
  t.forEach((value, i) => {
    log.timeS[i] = value;
    const along = s[i]!;
    // Pit lane: 30 m to the right of the centreline from 800 m into the last lap.
    const pitOffset = along > 4 * L + 800 ? -30 * Math.min(1, (along - 4 * L - 800) / 50) : 0;
    [log.xM![i], log.yM![i]] = pointAt(track, along, pitOffset);
    const piece = pieces.find((p) => along >= p.fromM && along < p.toM)!;
    log.speedMps![i] = piece.v;
  });
  return { session: log, speeds };
}

describe('cutLaps', () => {
  it('finds the three flying laps, leaves out the out lap and the pit-in lap with a message, picks the fastest', () => {
    const { session } = threeLapSession(20);
    const { laps, notes } = cutLaps(session, track, {});
    const complete = laps.filter((lap) => lap.complete);
    expect(complete.map((lap) => lap.lapNumber)).toEqual([1, 2, 3]);
    // Lap times L / v (kinematics), to the millisecond.
    expect(complete[0]!.lapTimeS).toBeCloseTo(L / 40, 3);
    expect(complete[1]!.lapTimeS).toBeCloseTo(L / 43, 3);
    expect(complete[2]!.lapTimeS).toBeCloseTo(L / 38, 3);
    const out = laps.find((lap) => lap.lapNumber === 0)!;
    const pitIn = laps.find((lap) => lap.lapNumber === 4)!;
    expect(out.complete).toBe(false);
    expect(noteText(out.reason!)).toMatch(/out lap: the log starts 700 m after the line/);
    expect(pitIn.complete).toBe(false);
    expect(noteText(pitIn.reason!)).toMatch(/the log ends \d+ m before the line/);
    expect(noteText(pitIn.reason!)).toMatch(/covers \d+ % of the track/);
    expect(notes.some((note) => noteText(note).startsWith('lap 4 left out:'))).toBe(true);

    const selected = selectLap(session, track);
    expect(selected.lap.lapNumber).toBe(2);
    expect(selected.lap.lapTimeS).toBeCloseTo(L / 43, 3);
    expect(selected.notes.some((note) => /lap 2 chosen: the fastest of 3 complete laps/.test(noteText(note)))).toBe(
      true,
    );
  });

  it('picks a chosen lap, and refuses an incomplete or missing one', () => {
    const { session } = threeLapSession(10);
    expect(selectLap(session, track, { lap: 3 }).lap.lapTimeS).toBeCloseTo(L / 38, 3);
    expect(() => selectLap(session, track, { lap: 4 })).toThrow(/--lap 4 is not a complete lap/);
    expect(() => selectLap(session, track, { lap: 9 })).toThrow(/no such lap \(laps found: 0, 1, 2, 3, 4\)/);
  });

  it('marks a lap that cuts across the infield as leaving the track', () => {
    const { session } = threeLapSession(20);
    // In lap 2, swing 20 m off to the left for 100 m of the long straight (well beyond the 5 m half-width).
    for (let i = 0; i < session.count; i++) {
      const t = session.timeS[i]!;
      const lapStart = (L - 700) / 30 + L / 40;
      const along = (t - lapStart) * 43;
      if (along > 100 && along < 200) {
        const [x, y] = pointAt(track, along + 2 * L, 20);
        session.xM![i] = x;
        session.yM![i] = y;
      }
    }
    const lap2 = cutLaps(session, track, {}).laps.find((lap) => lap.lapNumber === 2)!;
    expect(lap2.complete).toBe(false);
    const stretch = /leaves the track for (\d+) m at (\d+) m/.exec(noteText(lap2.reason ?? ''));
    expect(stretch).not.toBeNull();
    // 100 m swung out, counted from the last sample on the track (20 Hz at 43 m/s: 2.15 m apart).
    expect(Number(stretch![1])).toBeGreaterThanOrEqual(98);
    expect(Number(stretch![1])).toBeLessThanOrEqual(106);
    expect(Math.abs(Number(stretch![2]) - 100)).toBeLessThanOrEqual(3);
  });

  it('says so when no lap is complete', () => {
    const { session } = threeLapSession(10);
    const short = {
      ...session,
      count: 200,
      timeS: session.timeS.subarray(0, 200),
      xM: session.xM!.subarray(0, 200),
      yM: session.yM!.subarray(0, 200),
      speedMps: session.speedMps!.subarray(0, 200),
    };
    expect(() => selectLap(short, track)).toThrow(InputError);
    expect(() => selectLap(short, track)).toThrow(
      /no complete lap in the session on track test triangle \(lap 0: out lap/,
    );
  });

  it('cuts a GPS session on a track without a geo origin after a rigid fit (ICP + Kabsch)', () => {
    const { session } = threeLapSession(10);
    // The same path in a GPS plane turned by 73 degrees and shifted by (1200, -800) m.
    const angle = (73 * Math.PI) / 180;
    const gps = {
      ...session,
      xM: new Float64Array(session.count),
      yM: new Float64Array(session.count),
      geoOrigin: { latDeg: 50, lonDeg: 10 },
    };
    for (let i = 0; i < session.count; i++) {
      const x = session.xM![i]!;
      const y = session.yM![i]!;
      gps.xM[i] = Math.cos(angle) * x - Math.sin(angle) * y + 1200;
      gps.yM[i] = Math.sin(angle) * x + Math.cos(angle) * y - 800;
    }
    const { laps, notes } = cutLaps(gps, track, {});
    expect(noteText(notes[0]!)).toMatch(/rigid fit \(turned -73\.0 deg, median gap 0\.0 m\)/);
    expect(noteText(notes[0]!, displayUnits('imperial'))).toMatch(
      /rigid fit \(turned -73\.0 deg, median gap 0\.0 ft\)/,
    );
    expect(laps.filter((lap) => lap.complete).map((lap) => lap.lapNumber)).toEqual([1, 2, 3]);
    expect(laps.find((lap) => lap.lapNumber === 2)!.lapTimeS).toBeCloseTo(L / 43, 2);
  });
});

describe('the notes of a cut session under --units imperial', () => {
  it('name every distance in feet, the metric figure converted (1 ft = 0.3048 m, NIST SP 811, appendix B)', () => {
    const { session } = threeLapSession(20);
    const { laps, notes } = cutLaps(session, track, {});
    const texts = [...notes, ...laps.flatMap((lap) => (lap.reason ? [lap.reason] : []))].map((note) => ({
      metric: noteText(note, displayUnits('metric')),
      imperial: noteText(note, displayUnits('imperial')),
    }));
    for (const { metric, imperial } of texts) expectConverted(metric, imperial);
    expect(texts.map(({ imperial }) => imperial).join('\n')).not.toMatch(/\d m\b/);
    // The out lap starts 700 m after the line: 700 / 0.3048 = 2296.6 ft.
    expect(texts.map(({ imperial }) => imperial)).toContainEqual(
      expect.stringMatching(/^lap 0 left out: out lap: the log starts 2297 ft after the line/),
    );
  });
});

describe('a time gap inside a lap', () => {
  it('over 5 s makes the lap incomplete, with the gap in the reason; the other laps stay complete', () => {
    const { session } = threeLapSession(20);
    // The logger stopped for 1e9 s in the middle of lap 2 (a sample about halfway round), positions unchanged.
    const startOfLap2 = L / 30 - 700 / 30 + L / 40;
    const middle = session.timeS.findIndex((t) => t > startOfLap2 + L / 43 / 2);
    for (let i = middle; i < session.count; i++) session.timeS[i] = session.timeS[i]! + 1e9;
    const { laps, notes } = cutLaps(session, track, {});
    const lap2 = laps.find((lap) => lap.lapNumber === 2)!;
    expect(lap2.complete).toBe(false);
    expect(noteText(lap2.reason!)).toMatch(/^a gap of 1000000000\.\d s in the log at \d+\.\d s \(over 5 s\)$/);
    expect(notes.some((note) => noteText(note).startsWith('lap 2 left out: a gap of'))).toBe(true);
    expect(laps.filter((lap) => lap.complete).map((lap) => lap.lapNumber)).toEqual([1, 3]);
    // Lap 3's time is still L / v (kinematics).
    expect(laps.find((lap) => lap.lapNumber === 3)!.lapTimeS).toBeCloseTo(L / 38, 3);
  });
});

describe.skipIf(!realKartLogPresent)('the real one-lap GPS log', () => {
  it('is one complete lap, with no note on a gap too short to name', async () => {
    // The kart's log ends a few centimetres before the point it started from, the line of a track made from its own
    // path: the lap is timed over that gap, and a note saying it ends "0.0 m" before the line would tell nothing.
    const session = await readTelemetryFile(REAL_KART_LOG, { columns: {} });
    const { laps, notes } = cutLaps(session, kartTrackOf(session));
    expect(laps.filter((lap) => lap.complete)).toHaveLength(1);
    for (const text of [...laps.map((lap) => lap.reason ?? ''), ...notes].map((note) => noteText(note)))
      expect(text).not.toMatch(/\b0\.0 m\b/);
  });
});
