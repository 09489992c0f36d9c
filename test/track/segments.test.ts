// Segment tracks: exact curvature, lengths and closure, checked against circle geometry (circumference 2 pi R,
// curvature 1/R: any geometry text, e.g. do Carmo, Differential Geometry of Curves and Surfaces, 1.5) and the
// clothoid's Fresnel-integral coordinates (Abramowitz and Stegun, Handbook of Mathematical Functions, 7.3).

import { describe, expect, it } from 'vitest';
import { trackFromSegments, VERTICAL_CURVE_M, type SegmentTrackSpec } from '../../src/track/segments.js';
import { HEIGHT_SMOOTHING_M, roadProfileOf } from '../../src/track/road-profile.js';
import { InputError } from '../../src/errors.js';

function spec(segments: SegmentTrackSpec['segments'], closed = true): SegmentTrackSpec {
  return { name: 'test', closed, widthM: 10, segments };
}

describe('trackFromSegments', () => {
  it('a ring of radius R has curvature exactly 1/R, length 2 pi R, and every point at distance R from the centre', () => {
    const radiusM = 80;
    const track = trackFromSegments(spec([{ kind: 'arc', radiusM, angleDeg: 360 }]), 1, 'ring');
    expect(track.lengthM).toBeCloseTo(2 * Math.PI * radiusM, 9);
    expect(track.curvaturePerM.every((k) => k === 1 / radiusM)).toBe(true);
    // Start at the origin heading east, turning left: the centre is (0, R).
    let worst = 0;
    for (let i = 0; i < track.xM.length; i++)
      worst = Math.max(worst, Math.abs(Math.hypot(track.xM[i]!, track.yM[i]! - radiusM) - radiusM));
    expect(worst).toBeLessThan(1e-6);
    expect(track.headingRad[track.headingRad.length - 1]! + track.stepM / radiusM - track.headingRad[0]!).toBeCloseTo(
      2 * Math.PI,
      9,
    );
  });

  it('a stadium (straight, half circle, straight, half circle) closes and has length 2 L + 2 pi R', () => {
    const track = trackFromSegments(
      spec([
        { kind: 'straight', lengthM: 300 },
        { kind: 'arc', radiusM: 60, angleDeg: 180 },
        { kind: 'straight', lengthM: 300 },
        { kind: 'arc', radiusM: 60, angleDeg: 180 },
      ]),
      1,
      'stadium',
    );
    expect(track.lengthM).toBeCloseTo(600 + 2 * Math.PI * 60, 9);
    const n = track.xM.length;
    // The last sample lies one step back along the closing arc: the gap to the first is the chord 2 R sin(h / 2R).
    expect(Math.hypot(track.xM[0]! - track.xM[n - 1]!, track.yM[0]! - track.yM[n - 1]!)).toBeCloseTo(
      120 * Math.sin(track.stepM / 120),
      9,
    );
    // Far straight runs west at y = 2R.
    const mid = Math.round((300 + 60 * Math.PI + 150) / track.stepM);
    expect(track.yM[mid]).toBeCloseTo(120, 6);
  });

  it('uses the grid rules: closed n = round(L / step), actual step L / n; open n = round(L / step) + 1', () => {
    const closed = trackFromSegments(spec([{ kind: 'arc', radiusM: 100, angleDeg: 360 }]), 1.5, 'c');
    expect(closed.xM.length).toBe(Math.round((200 * Math.PI) / 1.5));
    expect(closed.stepM * closed.xM.length).toBeCloseTo(200 * Math.PI, 9);
    const open = trackFromSegments(spec([{ kind: 'straight', lengthM: 100.4 }], false), 1, 'o');
    expect(open.xM.length).toBe(101);
    expect(open.lengthM).toBeCloseTo(100.4, 12);
    expect(open.distanceM[100]).toBeCloseTo(100.4, 12);
  });

  it('a transition from straight follows the clothoid: end point from the Fresnel integrals', () => {
    // Curvature k = s / A^2 with A^2 = L / k1; x = A sqrt(pi) C(t), y = A sqrt(pi) S(t), t = L / (A sqrt(pi)),
    // C(t) = int_0^t cos(pi u^2 / 2) du, S likewise (Abramowitz and Stegun 7.3.1, 7.3.2); integrated here by
    // the series C(t) = sum (-1)^n (pi/2)^(2n) t^(4n+1) / ((2n)! (4n+1)), S(t) = sum (-1)^n (pi/2)^(2n+1) t^(4n+3) / ((2n+1)! (4n+3)).
    const lengthM = 120;
    const endCurvature = 1 / 40;
    const a = Math.sqrt(lengthM / endCurvature);
    const t = lengthM / (a * Math.sqrt(Math.PI));
    let c = 0;
    let s = 0;
    let factorial = 1;
    for (let k = 0; k < 30; k++) {
      if (k > 0) factorial *= 2 * k * (2 * k - 1);
      c += ((-1) ** k * (Math.PI / 2) ** (2 * k) * t ** (4 * k + 1)) / (factorial * (4 * k + 1));
      s += ((-1) ** k * (Math.PI / 2) ** (2 * k + 1) * t ** (4 * k + 3)) / (factorial * (2 * k + 1) * (4 * k + 3));
    }
    const track = trackFromSegments(
      spec([{ kind: 'transition', lengthM, startCurvature: 0, endCurvature }], false),
      1,
      'clothoid',
    );
    const n = track.xM.length;
    expect(track.xM[n - 1]).toBeCloseTo(a * Math.sqrt(Math.PI) * c, 6);
    expect(track.yM[n - 1]).toBeCloseTo(a * Math.sqrt(Math.PI) * s, 6);
    expect(track.headingRad[n - 1]).toBeCloseTo((lengthM * endCurvature) / 2, 12);
    expect(track.curvaturePerM[60]).toBeCloseTo(endCurvature / 2, 12);
  });

  it('right turns have negative curvature and a start heading rotates the layout', () => {
    const track = trackFromSegments(
      { ...spec([{ kind: 'arc', radiusM: 50, angleDeg: -90 }], false), startHeadingDeg: 90 },
      1,
      'right',
    );
    expect(track.curvaturePerM[10]).toBe(-1 / 50);
    const n = track.xM.length;
    // Heading north, turning right by 90 degrees about the centre (50, 0): ends at (50, 50) heading east.
    expect(track.xM[n - 1]).toBeCloseTo(50, 6);
    expect(track.yM[n - 1]).toBeCloseTo(50, 6);
    expect(track.headingRad[n - 1]).toBeCloseTo(0, 9);
  });

  it('refuses a closed list that does not close, saying by how many metres and degrees', () => {
    const segments = [
      { kind: 'straight' as const, lengthM: 300 },
      { kind: 'arc' as const, radiusM: 60, angleDeg: 180 },
      { kind: 'straight' as const, lengthM: 290 },
      { kind: 'arc' as const, radiusM: 60, angleDeg: 175 },
    ];
    let message = '';
    try {
      trackFromSegments(spec(segments), 1, 'open-stadium.json');
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      message = (error as Error).message;
    }
    // 5 degrees short, and the end is off by about 10 m along the straight plus the missing arc.
    expect(message).toMatch(
      /^open-stadium\.json: segments: the closed track does not close: it ends \d+\.\d\d m from its start .* heading off by -5\.00 degrees/,
    );
    expect(message).not.toContain('\n');
  });

  it('names the corner that lies outside the track', () => {
    expect(() =>
      trackFromSegments(
        { ...spec([{ kind: 'arc', radiusM: 10, angleDeg: 360 }]), corners: [{ atM: 100, name: 'Far' }] },
        1,
        'ring.json',
      ),
    ).toThrow(/^ring\.json: corners\[0\]\.atM: 100 m is outside the track/);
  });
});

describe('heights of a closed lap', () => {
  // A stadium whose straights climb and fall 3 % and whose level half circles are banked; the straights' ends fall
  // between grid samples, so the sampled grades leave a few centimetres of the lap's height to close.
  const climbM = 300.4;
  const gradePct = 3;
  const track = trackFromSegments(
    spec([
      { kind: 'straight', lengthM: climbM, gradePct },
      { kind: 'arc', radiusM: 60, angleDeg: 180, bankDeg: 5 },
      { kind: 'straight', lengthM: climbM, gradePct: -gradePct },
      { kind: 'arc', radiusM: 60, angleDeg: 180, bankDeg: 5 },
    ]),
    1,
    'hill-stadium',
  );
  const arcM = 60 * Math.PI;
  const z = track.zM!;
  const road = roadProfileOf(track)!;
  /** Indices of the samples of [fromM, toM], clear of the vertical curves that round the changes of grade and of
   * the profile's smoothing of the heights beside them. */
  const levelSamples = (fromM: number, toM: number) => {
    const clearM = VERTICAL_CURVE_M / 2 + HEIGHT_SMOOTHING_M + 2 * track.stepM;
    return Array.from(track.distanceM.keys()).filter(
      (i) => track.distanceM[i]! > fromM + clearM && track.distanceM[i]! < toM - clearM,
    );
  };
  const topArc = levelSamples(climbM, climbM + arcM);
  const bottomArc = levelSamples(2 * climbM + arcM, 2 * climbM + 2 * arcM);

  it('keeps the level half circles exactly level while the lap closes in height', () => {
    // Zero grade is zero rise (rise = grade x run; AASHTO, A Policy on Geometric Design of Highways and Streets,
    // ch. 3; from memory): every level sample has one height, and the road profile reads an exactly level road.
    expect(topArc.length).toBeGreaterThan(100);
    expect(bottomArc.length).toBeGreaterThan(100);
    for (const level of [topArc, bottomArc])
      for (const i of level) {
        expect(z[i]).toBe(z[level[0]!]);
        expect(road.gradeRad[i]).toBe(0);
        expect(road.verticalCurvaturePerM[i]).toBe(0);
      }
    // The climb rises 3 % of its run; what the lap had to close (the grid samples each straight's grade up to a step
    // off its ends: at most 3 % of 1 m at each of four ends) is shared by the two straights.
    const riseM = z[topArc[0]!]! - z[bottomArc[0]!]!;
    expect(Math.abs(riseM - (gradePct / 100) * climbM)).toBeLessThan((4 * (gradePct / 100) * track.stepM) / 2);
  });

  it('joins the lap where it starts: the grade there is that of the middle of a vertical curve', () => {
    // A parabolic vertical curve's grade changes linearly along it, so at its middle (the change of grade, here the
    // start of the lap) it is the mean of the two grades (AASHTO, ch. 3; from memory): 0 and 3 % give 1.5 %.
    expect(Math.tan(road.gradeRad[0]!)).toBeCloseTo(gradePct / 100 / 2, 3);
  });
});
