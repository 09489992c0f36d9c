// The road profile from a track's heights: a straight line of heights has one slope and no curvature (analytic
// geometry), to the last bit, and a parabola's curvature is its second derivative.

import { describe, expect, it } from 'vitest';
import { trackFromSegments } from '../../src/track/segments.js';
import { roadProfileOf } from '../../src/track/road-profile.js';
import type { TrackGrid } from '../../src/track/types.js';

const straight = (closed = false): TrackGrid =>
  trackFromSegments(
    { name: 'straight', closed, widthM: 10, segments: [{ kind: 'straight', lengthM: 800 }] },
    1,
    'straight',
  );

describe('the road profile from heights', () => {
  it('gives a constant grade exactly one grade and no vertical curvature', () => {
    // A slope that no binary fraction holds (3.17 %), from a datum that is not zero: every difference of the heights
    // carries rounding of its own.
    const track = straight();
    const slope = 0.0317;
    const profile = roadProfileOf({ ...track, zM: track.distanceM.map((s) => 41.3 + slope * s) })!;
    expect(new Set(profile.gradeRad).size).toBe(1);
    expect(Math.abs(profile.gradeRad[0]! - Math.atan(slope))).toBeLessThan(1e-12);
    expect(profile.verticalCurvaturePerM.every((k) => k === 0)).toBe(true);
  });

  it('keeps a level road exactly level beside a climb', () => {
    const track = straight();
    // Level for 300 m, then a 4 % climb: far from the join (beyond the smoothing), grade and curvature are exact.
    const profile = roadProfileOf({
      ...track,
      zM: track.distanceM.map((s) => (s < 300 ? 7.7 : 7.7 + 0.04 * (s - 300))),
    })!;
    for (let i = 0; i < 280; i++) {
      expect(profile.gradeRad[i]).toBe(0);
      expect(profile.verticalCurvaturePerM[i]).toBe(0);
    }
    for (let i = 330; i < 790; i++) expect(profile.verticalCurvaturePerM[i]).toBe(0);
    expect(new Set(profile.gradeRad.subarray(330, 790)).size).toBe(1);
  });

  it('reads a parabola of known radius as that vertical curvature, not as rounding', () => {
    // z = -(s - 400)^2 / (2 Rv): curvature z'' / (1 + z'^2)^(3/2), -1 / Rv at the top (calculus).
    const track = straight();
    const Rv = 2e5;
    const profile = roadProfileOf({ ...track, zM: track.distanceM.map((s) => -((s - 400) ** 2) / (2 * Rv)) })!;
    expect(Math.abs(profile.verticalCurvaturePerM[400]! * Rv + 1)).toBeLessThan(1e-3);
  });
});
