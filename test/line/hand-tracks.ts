// Tracks built by hand from a curvature profile, for the line tests: a ring and a corner between straights.

import type { TrackGrid } from '../../src/track/types.js';

/** Integrates heading and position from curvature on a uniform grid (midpoint rule). */
export function trackFromCurvature(
  name: string,
  closed: boolean,
  stepM: number,
  curvature: Float64Array,
  widthLeftM: number,
  widthRightM: number,
): TrackGrid {
  const n = curvature.length;
  const distanceM = new Float64Array(n);
  const xM = new Float64Array(n);
  const yM = new Float64Array(n);
  const headingRad = new Float64Array(n);
  for (let i = 1; i < n; i++) {
    distanceM[i] = i * stepM;
    const turn = 0.5 * (curvature[i - 1]! + curvature[i]!) * stepM;
    headingRad[i] = headingRad[i - 1]! + turn;
    const mid = headingRad[i - 1]! + 0.5 * turn;
    xM[i] = xM[i - 1]! + stepM * Math.cos(mid);
    yM[i] = yM[i - 1]! + stepM * Math.sin(mid);
  }
  return {
    name,
    closed,
    stepM,
    lengthM: closed ? n * stepM : (n - 1) * stepM,
    distanceM,
    xM,
    yM,
    headingRad,
    curvaturePerM: curvature,
    widthLeftM: new Float64Array(n).fill(widthLeftM),
    widthRightM: new Float64Array(n).fill(widthRightM),
    geoOrigin: null,
    corners: [],
    source: `${name} (built in the test)`,
  };
}

/** A closed ring of centreline radius radiusM turning left, sampled at about stepM. */
export function ring(radiusM: number, widthM: number, stepM: number): TrackGrid {
  const n = Math.round((2 * Math.PI * radiusM) / stepM);
  const exactStep = (2 * Math.PI * radiusM) / n;
  const track = trackFromCurvature(
    'ring',
    true,
    exactStep,
    new Float64Array(n).fill(1 / radiusM),
    widthM / 2,
    widthM / 2,
  );
  // Exact positions on the circle (centre at (0, R)), rather than the integrated ones.
  for (let i = 0; i < n; i++) {
    const theta = (i * exactStep) / radiusM;
    track.xM[i] = radiusM * Math.sin(theta);
    track.yM[i] = radiusM * (1 - Math.cos(theta));
    track.headingRad[i] = theta;
  }
  return track;
}

/** An open track: straight, a left turn of `angleRad` on centreline radius radiusM, straight. */
export function cornerBetweenStraights(
  straightM: number,
  radiusM: number,
  angleRad: number,
  widthM: number,
  stepM: number,
): TrackGrid {
  const arcM = radiusM * angleRad;
  const n = Math.round((2 * straightM + arcM) / stepM) + 1;
  const curvature = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = i * stepM;
    curvature[i] = s > straightM && s < straightM + arcM ? 1 / radiusM : 0;
  }
  // Scale so the integrated heading change is exactly angleRad on this grid.
  let turn = 0;
  for (let i = 1; i < n; i++) turn += 0.5 * (curvature[i - 1]! + curvature[i]!) * stepM;
  for (let i = 0; i < n; i++) curvature[i] = (curvature[i]! * angleRad) / turn;
  return trackFromCurvature('corner', false, stepM, curvature, widthM / 2, widthM / 2);
}
