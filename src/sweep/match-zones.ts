// Pairs the braking zones of two laps on the same track by the corner they serve: the place of the
// slowest point, not the zone's position in the list (a change can add or remove a lift before a kink).

import type { BrakingZone } from '../solve/types.js';

/** Default largest distance between the two slowest points of one corner, m. */
export const DEFAULT_MATCH_TOLERANCE_M = 100;

/** Distance between two places on the lap; around the start line on a closed lap. */
export function lapDistanceM(aM: number, bM: number, lapLengthM: number, closed: boolean): number {
  const d = Math.abs(aM - bM);
  return closed ? Math.min(d, lapLengthM - d) : d;
}

/** b - a along the lap; on a closed lap folded into (-L/2, L/2] so a shift across the start line stays small. */
export function signedLapShiftM(fromM: number, toM: number, lapLengthM: number, closed: boolean): number {
  let shift = toM - fromM;
  if (closed && lapLengthM > 0) {
    while (shift > lapLengthM / 2) shift -= lapLengthM;
    while (shift <= -lapLengthM / 2) shift += lapLengthM;
  }
  return shift;
}

export interface ZoneMatching {
  /** For each baseline zone, the index of the changed lap's zone serving the same corner, or -1. */
  changedIndexOf: Int32Array;
  /** Indices of changed-lap zones that serve no baseline corner (new braking zones). */
  unmatchedChanged: number[];
}

/**
 * One-to-one matching, nearest pairs first, of zones whose slowest points lie within `toleranceM`.
 * Greedy nearest-first is enough here: corners are far apart compared with how far a setup change moves
 * the slowest point, so no pair competes for the same partner.
 */
export function matchBrakingZones(
  baseline: readonly BrakingZone[],
  changed: readonly BrakingZone[],
  lapLengthM: number,
  closed: boolean,
  toleranceM = DEFAULT_MATCH_TOLERANCE_M,
): ZoneMatching {
  const candidates: { b: number; c: number; d: number }[] = [];
  for (let b = 0; b < baseline.length; b++) {
    for (let c = 0; c < changed.length; c++) {
      const d = lapDistanceM(baseline[b]!.minSpeedAtM, changed[c]!.minSpeedAtM, lapLengthM, closed);
      if (d <= toleranceM) candidates.push({ b, c, d });
    }
  }
  candidates.sort((x, y) => x.d - y.d || x.b - y.b || x.c - y.c);
  const changedIndexOf = new Int32Array(baseline.length).fill(-1);
  const taken = new Uint8Array(changed.length);
  for (const { b, c } of candidates) {
    if (changedIndexOf[b] !== -1 || taken[c]) continue;
    changedIndexOf[b] = c;
    taken[c] = 1;
  }
  const unmatchedChanged: number[] = [];
  for (let c = 0; c < changed.length; c++) if (!taken[c]) unmatchedChanged.push(c);
  return { changedIndexOf, unmatchedChanged };
}
