// The lap-cutting reasons and the derivation note in the reader's units: under imperial every distance is the
// metric one converted through the exact definition 1 ft = 0.3048 m (NIST SP 811, appendix B), within the rounding
// of both numbers, and the metric text reads as it always has.

import { describe, expect, it } from 'vitest';
import {
  distanceEdgeCheck,
  distanceLapProblem,
  positionLapProblems,
  type PositionCoverage,
} from '../../src/compare/lap-coverage.js';
import { derivationNote, type DerivationQuality } from '../../src/compare/derive-session.js';
import { metricNoteText, type Note } from '../../src/note.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from '../report/converted-quantities.js';

const metric = displayUnits('metric');
const imperial = displayUnits('imperial');

/** The note in both systems, checked converted pair by pair; the metric text and the imperial text. */
function bothWays(note: Note): { metricText: string; imperialText: string } {
  const metricText = noteText(note, metric);
  const imperialText = noteText(note, imperial);
  expectConverted(metricText, imperialText);
  // The text for errors (metric, below the report) is the report's metric text.
  expect(metricNoteText(note)).toBe(metricText);
  return { metricText, imperialText };
}

const whole: PositionCoverage = { coverage: 1, worstOffM: 0, worstOffAtM: 0 };

describe("a lap's reasons in feet", () => {
  it('an out lap that starts into the lap, ending short of the line', () => {
    const [start, end] = positionLapProblems(0, false, 700, 412.6, whole, 25);
    // 700 m / 0.3048 = 2296.6 ft; 412.6 m / 0.3048 = 1353.7 ft (NIST SP 811 factor, worked by hand).
    expect(bothWays(start!)).toEqual({
      metricText: 'out lap: the log starts 700 m after the line',
      imperialText: 'out lap: the log starts 2297 ft after the line',
    });
    expect(bothWays(end!)).toEqual({
      metricText: 'the log ends 413 m before the line',
      imperialText: 'the log ends 1354 ft before the line',
    });
    // A lap other than the out lap says it started into the lap.
    expect(noteText(positionLapProblems(3, false, 80, 0, whole, 25)[0]!, imperial)).toBe(
      // 80 m / 0.3048 = 262.5 ft.
      'the log starts 262 ft into the lap',
    );
  });

  it('a lap that leaves the track, and one that covers too little of it', () => {
    const reasons = positionLapProblems(2, false, 0, 0, { coverage: 0.6, worstOffM: 104, worstOffAtM: 1570 }, 25);
    expect(reasons).toHaveLength(2);
    // The share stays a per cent in both systems.
    expect(bothWays(reasons[0]!).imperialText).toMatch(/^covers 60 % of the track/);
    // 104 m / 0.3048 = 341.2 ft; 1570 m / 0.3048 = 5150.9 ft.
    expect(bothWays(reasons[1]!).imperialText).toBe('leaves the track for 341 ft at 5151 ft');
  });

  it('a lap measured by the distance channel, and the ends of such a log', () => {
    const problem = distanceLapProblem(2400, 3800, 3800)!;
    // 2400 m / 0.3048 = 7874.0 ft; 3800 m / 0.3048 = 12467.2 ft.
    expect(bothWays(problem).imperialText).toBe('measures 7874 ft by the distance channel, laps measure 12467 ft');
    const outLap = distanceEdgeCheck(300, 3800, 300, 0, 3800, 25);
    expect(outLap.complete).toBe(false);
    // 300 m / 0.3048 = 984.3 ft.
    expect(bothWays(outLap.reason!).imperialText).toBe('out lap: starts 984 ft into the lap');
    const inLap = distanceEdgeCheck(0, 3700, 0, 100, 3800, 25);
    // 100 m / 0.3048 = 328.1 ft.
    expect(bothWays(inLap.reason!).imperialText).toBe('the log ends 328 ft before the line');
    // The last of several laps, which the log ends inside, is the in lap (common practice: the lap back to the pits).
    const lastOfSeveral = distanceEdgeCheck(0, 3700, 0, 100, 3800, 25, true);
    expect(bothWays(lastOfSeveral.reason!).imperialText).toBe('in lap: the log ends 328 ft before the line');
  });

  it('the in lap: the last of several laps, which the log ends inside', () => {
    // 412.6 m / 0.3048 = 1353.7 ft.
    expect(bothWays(positionLapProblems(4, true, 0, 412.6, whole, 25)[0]!)).toEqual({
      metricText: 'in lap: the log ends 413 m before the line',
      imperialText: 'in lap: the log ends 1354 ft before the line',
    });
    // A log that is one partial lap has no in lap: its lap 0 is the out lap.
    expect(noteText(positionLapProblems(0, true, 0, 412.6, whole, 25)[0]!)).toBe('the log ends 413 m before the line');
  });
});

describe("the derivation's note in feet", () => {
  const quality: DerivationQuality = {
    meanRateHz: 25,
    longestGapS: 0.04,
    longestGapAtS: 0,
    positionNoiseM: 0.4,
    speedNoiseMps: null,
    lateralHalfWindowS: 0.75,
    longitudinalHalfWindowS: 0.5,
    lateralCutoffHz: 0.61,
    lateralNoiseMps2: 0.33,
    longitudinalNoiseMps2: 0.2,
    problems: [],
  };

  it('names the position noise in feet; the window, the rate and the acceleration noise unchanged', () => {
    const { metricText, imperialText } = bothWays(derivationNote(quality, ['axMps2', 'ayMps2']));
    expect(metricText).toBe(
      'axMps2, ayMps2 derived from the GPS positions and speed (Savitzky-Golay, 1.5 s window, cut-off about 0.61 Hz, ' +
        'for 0.40 m of position noise at 25 Hz; about 0.33 m/s^2 of noise left)',
    );
    // 0.4 m / 0.3048 = 1.312 ft; the acceleration stays in m/s^2 in both systems.
    expect(imperialText).toContain('for 1.31 ft of position noise at 25 Hz; about 0.33 m/s^2 of noise left');
  });
});
