// The windows of a session's small multiples: stations inside each corner's stretch about 2 m apart, ends included,
// and each lap's channels picked at those stations (checked on channels built from the station itself).

import { describe, expect, it } from 'vitest';
import { cornerTracesCollector, CORNER_TRACE_STEP_M } from '../../src/compare/session/corner-traces.js';
import { referenceInput } from '../report/report-fixtures.js';

describe('corner traces', () => {
  it('keeps each window at about 2 m and picks every lap at its stations', () => {
    const { reference } = referenceInput({ stepM: 0.5 });
    const track = reference.track;
    const windows = [
      { id: 1, fromM: 100.2, toM: 180.9 },
      { id: 2, fromM: 0, toM: 30 },
    ];
    const collector = cornerTracesCollector(track, windows, reference);
    // By construction: speed = station / 10, brake = 1 where the station is past 150 m.
    const speedMps = track.distanceM.map((s) => s / 10);
    const brake = track.distanceM.map((s) => (s > 150 ? 1 : 0));
    collector.add(3, { speedMps, brake, brakeEstimated: false });
    collector.add(5, { speedMps: speedMps.map((v) => 2 * v), brake, brakeEstimated: true });
    const [first, second] = collector.traces;
    // The grid's step is the track's length over a whole number of steps, close to the 0.5 m asked for.
    const step = track.stepM;
    expect(first!.stationM[0]).toBeCloseTo(Math.ceil(100.2 / step) * step, 9);
    expect(first!.stationM.at(-1)).toBeCloseTo(Math.floor(180.9 / step) * step, 9);
    for (let k = 1; k < first!.stationM.length; k++) {
      const gap = first!.stationM[k]! - first!.stationM[k - 1]!;
      expect(gap).toBeGreaterThan(0);
      expect(gap).toBeLessThanOrEqual(CORNER_TRACE_STEP_M + 1e-9);
    }
    expect(first!.laps.map((lap) => lap.lap)).toEqual([3, 5]);
    first!.stationM.forEach((s, k) => {
      expect(first!.laps[0]!.speedMps[k]).toBeCloseTo(s / 10, 9);
      expect(first!.laps[1]!.speedMps[k]).toBeCloseTo(s / 5, 9);
      expect(first!.laps[0]!.brake[k]).toBe(s > 150 ? 1 : 0);
    });
    expect(first!.laps[1]!.brakeEstimated).toBe(true);
    expect(second!.stationM[0]).toBe(0);
    expect(second!.stationM.at(-1)).toBeCloseTo(Math.floor(30 / step) * step, 9);
    expect(Array.from(second!.reference.speedMps)).toEqual(
      Array.from(second!.stationM, (s) => reference.trace.speedMps[Math.round(s / track.stepM)]!),
    );
  });
});
