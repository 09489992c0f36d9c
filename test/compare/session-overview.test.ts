// The session view on a synthetic session of five laps whose corner times are known by construction: the same
// base lap (the reference of an invented car on an invented closed circuit), each lap slowed inside each of the
// four main arcs by its own factor with a smooth sin^2 ramp. The expected times come from the construction alone
// (time over a step = 2 ds / (v + v'), trapezoid rule), never from the program.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { cutLaps } from '../../src/compare/laps.js';
import { sessionOverview } from '../../src/compare/session/session-overview.js';
import { cornerLayoutOf, withCornerLayout } from '../../src/track/corner-layout.js';
import type { TrackGrid } from '../../src/track/types.js';
import { circuitCar } from './fixtures.js';
import { closedCircuit } from './gps-session.js';
import { sessionOf } from '../fixtures/telemetry/tracks.js';

const baseTrack = closedCircuit();
const car = circuitCar();
const ambient = ambientFrom();
const envelope = buildEnvelope(car, ambient);
const n = baseTrack.distanceM.length;
const step = baseTrack.stepM;

/** Runs of one constant non-zero curvature (the circuit's arcs), as station ranges [from, to). */
function arcsOf(track: TrackGrid): { from: number; to: number }[] {
  const arcs: { from: number; to: number }[] = [];
  let i = 0;
  while (i < n) {
    const k = track.curvaturePerM[i]!;
    let j = i;
    while (j < n && track.curvaturePerM[j] === k) j++;
    if (k !== 0) arcs.push({ from: i, to: j });
    i = j;
  }
  return arcs;
}
// The four quarter circles (the kink's two short arcs of 80 m are left alone): the four longest arcs.
const mainArcs = arcsOf(baseTrack)
  .sort((a, b) => b.to - b.from - (a.to - a.from))
  .slice(0, 4)
  .sort((a, b) => a.from - b.from);

/** Slowing factors: lap (row) by arc (column), chosen so that no lap is best everywhere. */
const FACTORS = [
  [1.0, 1.06, 1.04, 1.02],
  [1.05, 1.0, 1.03, 1.06],
  [1.03, 1.04, 1.0, 1.05],
  [1.06, 1.02, 1.05, 1.0],
  [1.04, 1.05, 1.06, 1.04],
];

const stepTime = (v: Float64Array, i: number) => (2 * step) / (v[i % n]! + v[(i + 1) % n]!);

function slowedSpeeds(base: Float64Array, factors: number[]): Float64Array {
  const v = Float64Array.from(base);
  mainArcs.forEach((arc, a) => {
    const length = arc.to - arc.from;
    for (let i = arc.from; i < arc.to; i++) {
      const ramp = Math.sin((Math.PI * (i - arc.from + 0.5)) / length) ** 2;
      v[i] = base[i]! / (1 + (factors[a]! - 1) * ramp);
    }
  });
  return v;
}

/** A log sampled at rateHz from the given laps driven in turn, starting and ending half a lap from the line. */
function sessionFromLaps(track: TrackGrid, laps: Float64Array[], rateHz: number) {
  const stationTimes: number[] = [];
  const stationIndex: number[] = [];
  let clock = 0;
  const all = [laps[0]!, ...laps, laps[0]!];
  all.forEach((v, k) => {
    const from = k === 0 ? n >> 1 : 0;
    const to = k === all.length - 1 ? n >> 1 : n;
    for (let i = from; i < to; i++) {
      stationTimes.push(clock);
      stationIndex.push(i);
      clock += stepTime(v, i);
    }
  });
  const speedAt = (k: number) => {
    const lapOf = k < n - (n >> 1) ? 0 : Math.min(all.length - 1, 1 + Math.floor((k - (n - (n >> 1))) / n));
    return all[lapOf]![stationIndex[k]!]!;
  };
  const times: number[] = [];
  for (let t = 0; t < stationTimes.at(-1)!; t += 1 / rateHz) times.push(t);
  const xM = new Float64Array(times.length);
  const yM = new Float64Array(times.length);
  const speedMps = new Float64Array(times.length);
  let k = 0;
  times.forEach((t, s) => {
    while (stationTimes[k + 1]! <= t) k++;
    const w = (t - stationTimes[k]!) / (stationTimes[k + 1]! - stationTimes[k]!);
    const i = stationIndex[k]!;
    const j = (i + 1) % n;
    xM[s] = track.xM[i]! + w * (track.xM[j]! - track.xM[i]!);
    yM[s] = track.yM[i]! + w * (track.yM[j]! - track.yM[i]!);
    speedMps[s] = speedAt(k) + w * (speedAt(k + 1) - speedAt(k));
  });
  return sessionOf({ source: 'five-lap session', timeS: Float64Array.from(times), xM, yM, speedMps });
}

const sampleSd = (values: number[]) => {
  const mean = values.reduce((s, v) => s + v, 0) / values.length;
  return Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1));
};

describe('a synthetic five-lap session with known corner times', () => {
  // Sectors at places of the test's choosing: the lap cut at them.
  const sectorStartsM = [0, 700, 1500, 2300];
  const layout = cornerLayoutOf(baseTrack);
  const track = withCornerLayout(baseTrack, {
    ...layout,
    sectors: sectorStartsM.map((startM, k) => ({
      number: k + 1,
      name: `S${k + 1}`,
      startM,
      endM: sectorStartsM[k + 1] ?? baseTrack.lengthM,
    })),
  });
  const reference = simulate(track, car, { ambient, envelope });
  const base = reference.trace.speedMps;
  const laps = FACTORS.map((factors) => slowedSpeeds(base, factors));
  const session = sessionFromLaps(track, laps, 50);
  const cut = cutLaps(session, track);
  const overview = sessionOverview({
    track,
    session,
    laps: cut.laps,
    reference,
    envelope,
    demonstratedLapTimeS: null,
  });
  const timeOver = (v: Float64Array, from: number, to: number) => {
    let sum = 0;
    for (let i = from; i < to; i++) sum += stepTime(v, i);
    return sum;
  };
  const lapTimes = laps.map((v) => timeOver(v, 0, n));
  // Extra time of each lap in each arc over the base lap (the ramp ends inside the arc, so one step beyond it).
  const extra = laps.map((v) =>
    mainArcs.map((arc) => timeOver(v, arc.from - 1, arc.to + 1) - timeOver(base, arc.from - 1, arc.to + 1)),
  );

  it('lists the five complete laps with their times within 0.01 s, and the partial ones with the reason', () => {
    const complete = overview.laps.filter((lap) => lap.complete);
    expect(complete.map((lap) => lap.lap)).toEqual([1, 2, 3, 4, 5]);
    complete.forEach((lap, k) => expect(Math.abs(lap.lapTimeS - lapTimes[k]!)).toBeLessThan(0.01));
    const left = overview.laps.filter((lap) => !lap.complete);
    expect(left.length).toBeGreaterThanOrEqual(1);
    for (const lap of left) expect(lap.reason).toBeTruthy();
  });

  it('cuts each lap at the sectors: sector times match the construction within 0.01 s and add up to the lap', () => {
    const bounds = [...sectorStartsM.map((m) => Math.round(m / step)), n];
    overview.laps
      .filter((lap) => lap.complete)
      .forEach((lap, k) => {
        const sectors = lap.sectorsS!;
        expect(sectors).toHaveLength(4);
        sectors.forEach((s, q) =>
          expect(Math.abs(s - timeOver(laps[k]!, bounds[q]!, bounds[q + 1]!))).toBeLessThan(0.01),
        );
        expect(Math.abs(sectors.reduce((a, b) => a + b, 0) - lap.lapTimeS)).toBeLessThan(1e-9);
      });
  });

  it('finds the best lap, and the session best as the sum of the best corners', () => {
    const bestLap = lapTimes.indexOf(Math.min(...lapTimes)) + 1;
    expect(overview.bestLap).toBe(bestLap);
    // Outside the arcs every lap is the base lap: the session best is the base lap plus each arc's least extra.
    const sessionBest =
      timeOver(base, 0, n) + mainArcs.reduce((s, _, a) => s + Math.min(...extra.map((e) => e[a]!)), 0);
    expect(Math.abs(overview.sessionBestS - sessionBest)).toBeLessThan(0.01);
    expect(overview.sessionBestS).toBeLessThan(overview.bestLapTimeS - 0.05);
  });

  it('gives each main corner the best lap, the median and the spread the construction gives', () => {
    mainArcs.forEach((arc, a) => {
      const corner = overview.corners.find((c) => c.apexM >= arc.from * step && c.apexM <= arc.to * step)!;
      expect(corner, `arc ${a}`).toBeDefined();
      const extras = extra.map((e) => e[a]!);
      expect(corner.bestLap).toBe(extras.indexOf(Math.min(...extras)) + 1);
      // The reference is the base lap: the corner's times over it differ from the base only by the arc's extra.
      const sorted = [...extras].sort((x, y) => x - y);
      expect(Math.abs(corner.medianTimeS - corner.referenceTimeS - sorted[2]!)).toBeLessThan(0.01);
      expect(Math.abs(corner.bestTimeS - corner.referenceTimeS - sorted[0]!)).toBeLessThan(0.01);
      expect(Math.abs(corner.spreadTimeS - sampleSd(extras))).toBeLessThan(0.005);
    });
  });

  it('ranks by time available and by consistency, and tells a corner driven well once from one never driven well', () => {
    expect(overview.byTimeAvailable).toHaveLength(overview.corners.length);
    expect(new Set(overview.byConsistency)).toEqual(new Set(overview.corners.map((c) => c.id)));
    // Every main arc is driven at the base speed (the reference) on one lap and slower on the others: driven
    // well once, rarely.
    const consistency = overview.verdicts.filter((v) => v.kind === 'consistency').map((v) => v.corner);
    expect(consistency).toHaveLength(4);
  });
});
