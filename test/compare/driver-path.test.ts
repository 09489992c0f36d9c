// The driver's path from position fixes placed on the centreline: its curvature against two exact cases, a circle
// seen from another circle and a sine wave beside a straight, and its stated noise against the noise put in.

import { describe, expect, it } from 'vitest';
import { driverPath } from '../../src/compare/driver-line/driver-path.js';
import { projectPath } from '../../src/track/project.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';
import type { TrackGrid } from '../../src/track/types.js';
import { ring, trackFromCurvature } from '../line/hand-tracks.js';

/** Fixes along a curve given as points, placed on the track as src/compare/place-session.ts places a session. */
function fixesOn(track: TrackGrid, xM: Float64Array, yM: Float64Array) {
  const placed = projectPath(track, xM, yM);
  return { progressM: placed.alongM, offsetM: placed.offsetM, laps: [{ startIndex: 0, endIndex: xM.length - 1 }] };
}

describe('the curvature of the driver path', () => {
  it('is 1/r all round on a circle of radius r off the centre of a ring (exact)', () => {
    // Centreline: a circle of radius 100 m about (0, 100) (the ring helper). Driver: a circle of radius 96 m about a
    // point 2 m from the ring's centre, so its offset from the centreline varies from 2 to 6 m round the lap while
    // its curvature is 1/96 everywhere (a circle's curvature is the inverse of its radius).
    const R = 100;
    const r = 96;
    const track = ring(R, 14, 1);
    const count = 4000;
    const xM = new Float64Array(count);
    const yM = new Float64Array(count);
    for (let k = 0; k < count; k++) {
      const theta = (2 * Math.PI * k) / count;
      xM[k] = 2 + r * Math.sin(theta);
      yM[k] = R - r * Math.cos(theta);
    }
    const path = driverPath(track, fixesOn(track, xM, yM))!;
    expect(path).not.toBeNull();
    let spread = 0;
    for (const offset of path.offsetM) spread = Math.max(spread, offset);
    expect(spread).toBeGreaterThan(5.5);
    for (let i = 0; i < path.curvaturePerM.length; i++)
      expect(Math.abs(path.curvaturePerM[i]! * r - 1), `station ${i}`).toBeLessThan(2e-3);
  });

  it('is f″ / (1 + f′²)^(3/2) for a sine beside a straight (curvature of a plane graph)', () => {
    // The curvature of the graph y = f(x) is f'' / (1 + f'^2)^(3/2) (any calculus text, e.g. Stewart, Calculus, 8th
    // ed., section 13.3, from memory). Centreline: a straight 1 km along x (the helper starts it at the origin,
    // heading along x); driver: 3 m sine of 150 m wavelength beside it.
    const track = trackFromCurvature('straight', false, 1, new Float64Array(1001), 6, 6);
    const amplitude = 3;
    const k = (2 * Math.PI) / 150;
    const count = 5000;
    const xM = Float64Array.from({ length: count }, (_, i) => (1000 * i) / (count - 1));
    const yM = Float64Array.from(xM, (x) => amplitude * Math.sin(k * x));
    const path = driverPath(track, fixesOn(track, xM, yM))!;
    const peak = amplitude * k * k;
    for (let i = 100; i <= 900; i++) {
      const slope = amplitude * k * Math.cos(k * i);
      const exact = (-amplitude * k * k * Math.sin(k * i)) / (1 + slope * slope) ** 1.5;
      expect(Math.abs(path.curvaturePerM[i]! - exact), `at ${i} m`).toBeLessThan(0.01 * peak);
    }
  });
});

describe('the stated noise', () => {
  it('reads the scatter of the fixes about the path to within 10 % on white noise', () => {
    // Five laps of the ring driven 3 m inside the centreline, fixes every 0.8 m with 0.8 m of white noise across
    // and along the track: the scatter across the track is the noise put in (the sample standard deviation of 5,000
    // fixes is within 2 % of the true one with probability about 0.95, chi-square tables; the rest is the smoother's
    // degrees of freedom).
    const track = ring(100, 14, 1);
    const { gaussian } = seededRandom(7);
    const count = Math.round((5 * 2 * Math.PI * 100) / 0.8);
    const xM = new Float64Array(count);
    const yM = new Float64Array(count);
    for (let k = 0; k < count; k++) {
      const theta = (10 * Math.PI * k) / count;
      xM[k] = 97 * Math.sin(theta) + 0.8 * gaussian();
      yM[k] = 100 - 97 * Math.cos(theta) + 0.8 * gaussian();
    }
    const path = driverPath(track, fixesOn(track, xM, yM))!;
    expect(path.noiseM / 0.8).toBeGreaterThan(0.9);
    expect(path.noiseM / 0.8).toBeLessThan(1.1);
    // A circle 3 m inside: the curvature 1/97 within the stated noise of the curvature (3 of them).
    let mean = 0;
    for (const c of path.curvaturePerM) mean += c / path.curvaturePerM.length;
    expect(Math.abs(mean - 1 / 97)).toBeLessThan(1e-4);
    let worst = 0;
    for (const c of path.curvaturePerM) worst = Math.max(worst, Math.abs(c - 1 / 97));
    expect(worst).toBeLessThan(5 * path.curvatureSdPerM);
  });

  it('gives no path where the fixes are more than 5 m apart', () => {
    const track = ring(100, 14, 1);
    const count = Math.round((2 * Math.PI * 100) / 8);
    const xM = Float64Array.from({ length: count }, (_, k) => 97 * Math.sin((2 * Math.PI * k) / count));
    const yM = Float64Array.from({ length: count }, (_, k) => 100 - 97 * Math.cos((2 * Math.PI * k) / count));
    expect(driverPath(track, fixesOn(track, xM, yM))).toBeNull();
  });
});
