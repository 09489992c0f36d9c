// Tracks built in the sweep tests from a curvature profile: a straight into a hairpin, and a closed loop.

import type { TrackGrid } from '../../src/track/types.js';
import { trackFromCurvature } from '../line/hand-tracks.js';

function gridFromCurvature(name: string, closed: boolean, stepM: number, curvaturePerM: Float64Array): TrackGrid {
  return trackFromCurvature(name, closed, stepM, curvaturePerM, 6, 6);
}

/** Open track: `straightM` of straight, a 180° hairpin of radius `radiusM` starting exactly at straightM, then `exitM` of straight. */
export function straightIntoHairpin(straightM: number, radiusM: number, exitM: number, stepM: number): TrackGrid {
  const arcM = Math.PI * radiusM;
  const n = Math.round((straightM + arcM + exitM) / stepM) + 1;
  const curvature = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = i * stepM;
    if (s >= straightM && s < straightM + arcM) curvature[i] = 1 / radiusM;
  }
  return gridFromCurvature('straight into a hairpin', false, stepM, curvature);
}

/**
 * Closed loop of two straights joined by hairpins of different radii (a stadium with unequal ends),
 * plus a kink on one straight: three braking zones. Length about 2 * straightM + pi * (r1 + r2).
 */
export function stadium(straightM: number, radius1M: number, radius2M: number, stepM: number): TrackGrid {
  const pieces: [number, number][] = [
    [straightM, 0],
    [Math.PI * radius1M, 1 / radius1M],
    [straightM * 0.5, 0],
    [40, 1 / 60],
    [40, -1 / 60],
    [straightM * 0.5, 0],
    [Math.PI * radius2M, 1 / radius2M],
  ];
  const total = pieces.reduce((sum, [length]) => sum + length, 0);
  const n = Math.round(total / stepM);
  const curvature = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = i * stepM;
    for (const [length, kappa] of pieces) {
      if (s < length) {
        curvature[i] = kappa;
        break;
      }
      s -= length;
    }
  }
  return gridFromCurvature('stadium', true, stepM, curvature);
}
