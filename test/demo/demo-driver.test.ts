// The demo's invented driver uses the track: its own line lies inside the corridor, runs to the outside before a
// corner and to the inside at the apex, and its logged GPS positions follow that line, not the centreline.

import { describe, expect, it } from 'vitest';
import { arcRanges, circuitCar, testCircuit } from '../compare/fixtures.js';
import { racingLine } from '../../src/line/racing-line.js';
import { simulate } from '../../src/solve/simulate.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { demoDriver, demoDriverPath, demoLogCsv, DEFAULT_DEMO_LOG } from '../../src/demo/demo-driver.js';
import { localPlane } from '../../src/track/geodesy.js';

describe('demo driver line', () => {
  const track = { ...testCircuit(), geoOrigin: { latDeg: 47.1, lonDeg: 8.3 } };
  const car = circuitCar();
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const line = racingLine(track, car, { objective: 'time', ambient, envelope });
  const driver = demoDriverPath(track, line.offsetM);
  const at = (m: number) => Math.round(m / track.stepM) % track.distanceM.length;

  it('stays inside the corridor the line search was given', () => {
    for (let i = 0; i < driver.offsetM.length; i++) {
      expect(driver.offsetM[i]!).toBeLessThanOrEqual(track.widthLeftM![i]! - line.marginM + 1e-9);
      expect(driver.offsetM[i]!).toBeGreaterThanOrEqual(-track.widthRightM![i]! + line.marginM - 1e-9);
    }
  });

  it('runs to the outside before each corner and to the inside at the apex', () => {
    // Outside-inside-outside through a corner (common practice, no source): the offset before turn-in has the
    // opposite sign of the corner's curvature 60 m before the arc (the line crosses over to the inside during its
    // last 40 m of approach, the arcs having no transition curves), at the middle of the arc the same sign.
    const arcs = arcRanges();
    let checked = 0;
    for (const arc of arcs) {
      const side = Math.sign(arc.radiusM);
      const apex = driver.offsetM[at(0.5 * (arc.fromM + arc.toM))]!;
      expect(apex * side).toBeGreaterThan(1.5);
      const before = driver.offsetM[at(arc.fromM - 60)]!;
      expect(before * side).toBeLessThan(-1.5);
      checked++;
    }
    expect(checked).toBe(5);
  });

  it('is slower than the minimum-time line and faster than the centreline', () => {
    // The minimum-time line is the fastest path within the corridor by its definition (up to the optimiser's
    // tolerance); a line that uses the width is faster than the centreline (common practice, no source).
    const onDriverLine = simulate(track, car, { ambient, envelope, path: driver }).lapTimeS;
    expect(onDriverLine).toBeGreaterThan(line.lap.lapTimeS);
    expect(onDriverLine).toBeLessThan(line.centrelineLap.lapTimeS);
  });

  it("logs GPS positions along the driver's own line, about a metre from it", () => {
    const lap = demoDriver(track, car, ambient, envelope, line.offsetM);
    const rows = demoLogCsv(track, lap, DEFAULT_DEMO_LOG).trim().split('\n').slice(1);
    const plane = localPlane(track.geoOrigin);
    const xy = new Float64Array(2);
    const nearest = (xs: Float64Array, ys: Float64Array, x: number, y: number) => {
      let best = Infinity;
      for (let i = 0; i < xs.length; i++) best = Math.min(best, Math.hypot(xs[i]! - x, ys[i]! - y));
      return best;
    };
    const toLine: number[] = [];
    const toCentre: number[] = [];
    for (const row of rows.filter((_, k) => k % 10 === 0)) {
      const [, lat, lon] = row.split(',').map(Number);
      plane.toLocal(lat!, lon!, xy);
      toLine.push(nearest(driver.xM, driver.yM, xy[0]!, xy[1]!));
      toCentre.push(nearest(track.xM, track.yM, xy[0]!, xy[1]!));
    }
    const rms = (values: number[]) => Math.sqrt(values.reduce((sum, v) => sum + v * v, 0) / values.length);
    // The generator's GPS error is a wandering bias of 0.1 / sqrt(1 - 0.98^2) = 0.5 m per axis plus 0.4 m white
    // noise (src/demo/demo-driver.ts, from memory for a consumer receiver): about 0.9 m RMS in the plane.
    expect(rms(toLine)).toBeLessThan(1.5);
    expect(rms(toCentre)).toBeGreaterThan(2 * rms(toLine));
  });
});
