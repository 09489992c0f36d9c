// Alignment of synthetic laps driven along the centreline: the pass time at each station is s / v exactly
// for a constant speed v (kinematics), whatever the sampling.

import { describe, expect, it } from 'vitest';
import { alignLap, selectLap } from '../../src/compare/align.js';
import { cutLaps } from '../../src/compare/laps.js';
import { InputError } from '../../src/errors.js';
import { pointAt, ringTrack, sessionOf, triangleTrack } from '../fixtures/telemetry/tracks.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';

const session = sessionOf;

/** Samples at rateHz along the centreline at constant speed, starting startM along the track. */
function constantSpeedLog(
  track: ReturnType<typeof triangleTrack>,
  speedMps: number,
  rateHz: number,
  durationS: number,
  startM: number,
  withSpeed = true,
) {
  const count = Math.floor(durationS * rateHz) + 1;
  const timeS = new Float64Array(count);
  const xM = new Float64Array(count);
  const yM = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    timeS[i] = 100 + i / rateHz;
    [xM[i], yM[i]] = pointAt(track, startM + (speedMps * i) / rateHz);
  }
  return session({ timeS, xM, yM, speedMps: withSpeed ? new Float64Array(count).fill(speedMps) : null });
}

describe('alignLap', () => {
  it('gives time s / v at every station and lap time L / v for a constant-speed lap (kinematics)', () => {
    const track = triangleTrack(1);
    const v = 37.3;
    // Starts 200 m before the line, runs 1.5 laps at 20 Hz: one full lap between two crossings.
    const log = constantSpeedLog(track, v, 20, (1.6 * track.lengthM) / v, track.lengthM - 200);
    const { laps } = cutLaps(log, track, {});
    const complete = laps.filter((lap) => lap.complete);
    expect(complete).toHaveLength(1);
    const lap = alignLap(log, complete[0]!, track);
    expect(lap.lapTimeS).toBeCloseTo(track.lengthM / v, 3);
    let worst = 0;
    for (let j = 0; j < track.distanceM.length; j++)
      worst = Math.max(worst, Math.abs(lap.timeS[j]! - track.distanceM[j]! / v));
    expect(worst).toBeLessThan(1e-3);
    expect(lap.timeS[0]).toBe(0);
    expect(lap.speedMps.every((speed) => Math.abs(speed - v) < 1e-9)).toBe(true);
    // Constant speed: no longitudinal acceleration; lateral = v^2 / R = 37.3^2 / 30 in the arcs (circular motion).
    expect(Math.max(...lap.axMps2.map(Math.abs))).toBeLessThan(1e-6);
    // The first arc starts at 297.574 m (400 m less the 30 m and 72.426 m pieces laid out in test/fixtures/telemetry/tracks.ts).
    const arcMiddle = Math.round((297.574 + (30 * Math.PI) / 4) / track.stepM);
    expect(lap.ayMps2[arcMiddle]!).toBeCloseTo((v * v) / 30, -0.5);
    expect(lap.derivedChannels).toEqual(['axMps2', 'ayMps2']);
  });

  it('numbers a log that starts 3 m after the line from 1, timing the missing metres at the first speed', () => {
    const track = triangleTrack(1);
    const v = 40;
    const log = constantSpeedLog(track, v, 20, (2.5 * track.lengthM) / v, 3);
    const { laps } = cutLaps(log, track, {});
    expect(laps.map((lap) => [lap.lapNumber, lap.complete])).toEqual([
      [1, true],
      [2, true],
      [3, false],
    ]);
    expect(noteText(laps[0]!.reason!)).toMatch(/the log starts 3\.0 m after the line; start time extrapolated/);
    // Under imperial in feet: 3.0 m / 0.3048 = 9.84 ft (NIST SP 811, appendix B), to the same tenth.
    expect(noteText(laps[0]!.reason!, displayUnits('imperial'))).toMatch(
      /the log starts 9\.8 ft after the line; start time extrapolated/,
    );
    expect(laps[0]!.lapTimeS).toBeCloseTo(track.lengthM / v, 3);
  });

  it('derives speed from positions when the log has none', () => {
    const track = triangleTrack(1);
    const v = 30;
    const log = constantSpeedLog(track, v, 10, (1.3 * track.lengthM) / v, track.lengthM - 100, false);
    const { lap } = selectLap(log, track);
    expect(lap.derivedChannels).toContain('speedMps');
    // Mid-straight the path speed is exactly v (chords along a straight line).
    const onStraight = Math.round(150 / track.stepM);
    expect(lap.speedMps[onStraight]!).toBeCloseTo(v, 6);
    expect(lap.lapTimeS).toBeCloseTo(track.lengthM / v, 3);
  });

  it('reads a lap from station 0 round when the line is elsewhere, keeping the lap time', () => {
    const track = ringTrack(150, 1);
    const v = 25;
    const log = constantSpeedLog(track as never, v, 50, (2.2 * track.lengthM) / v, 10);
    // Line at a quarter of the ring, (0, 150).
    const { lap, laps } = selectLap(log, track, { startFinish: { xM: 0, yM: 150 } });
    expect(laps.filter((l) => l.complete).length).toBeGreaterThanOrEqual(1);
    expect(lap.lapTimeS).toBeCloseTo(track.lengthM / v, 3);
    expect(lap.timeS[0]).toBe(0);
    for (const j of [1, 100, 400, 700, track.distanceM.length - 1])
      expect(lap.timeS[j]!).toBeCloseTo(track.distanceM[j]! / v, 3);
  });

  it('uses the distance channel scaled to the track length when there are no positions', () => {
    const track = ringTrack(100, 1);
    const v = 20;
    const scale = 1.02; // the logger's wheel-speed distance reads 2 % long
    const rate = 25;
    const count = Math.floor(((3.5 * track.lengthM) / v) * rate);
    const timeS = new Float64Array(count);
    const distanceM = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      timeS[i] = i / rate;
      const s = v * timeS[i]! + 0.3 * track.lengthM;
      distanceM[i] = (s % track.lengthM) * scale;
    }
    const log = session({ timeS, distanceM, speedMps: new Float64Array(count).fill(v) });
    const { lap, laps } = selectLap(log, track);
    // From 0.3 to 3.8 laps: crossings at 1, 2 and 3 laps give two laps between crossings.
    expect(laps.filter((l) => l.complete)).toHaveLength(2);
    expect(lap.lapTimeS).toBeCloseTo(track.lengthM / v, 2);
    expect(lap.timeS[300]!).toBeCloseTo(track.distanceM[300]! / v, 2);
  });

  it('refuses telemetry that lies far from the track, naming the median distance', () => {
    const track = triangleTrack(1);
    const log = constantSpeedLog(track, 30, 10, 60, 0);
    for (let i = 0; i < log.count; i++) log.xM![i] = log.xM![i]! + 500;
    expect(() => selectLap(log, track)).toThrow(InputError);
    expect(() => selectLap(log, track)).toThrow(
      /does not match track test triangle: its median distance to the centreline is \d+ m/,
    );
  });
});
