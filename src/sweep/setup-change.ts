// What a setup change does to the lap: the lap time change and, corner by corner, how far the braking
// point moves, how the entry and slowest speeds change and what the braking zone costs or gains in time.

import type { BrakingZone, CornerZone, LapResult } from '../solve/types.js';
import { mpsToKph } from '../units.js';
import { DEFAULT_MATCH_TOLERANCE_M, matchBrakingZones, signedLapShiftM } from './match-zones.js';
import { brakingPointM } from './braking-point.js';
import type { TrackGrid } from '../track/types.js';
import { metresBeforeM } from '../track/corner-layout.js';

export interface ZoneChange {
  /** Number of the corner the baseline zone serves, in the track's corner numbering. */
  corner: number;
  /** Unique label of the baseline zone: 'c3', or 'c3b' for a second zone of corner 3. */
  tag: string;
  cornerName: string | null;
  /** The corner's turn-in, m along the centreline; null where the track has no corners. */
  turnInM: number | null;
  /** Baseline and changed braking points (between samples) as metres before the turn-in, m. */
  beforeTurnInM: number | null;
  changedBeforeTurnInM: number | null;
  /** Baseline braking zone's first braking sample and slowest point, m along the lap. */
  startM: number;
  minSpeedAtM: number;
  /** Baseline braking point between grid samples (see braking-point.ts), m. */
  brakingPointM: number;
  /** The changed car's braking point between grid samples, m; null when the corner needs no braking any more. */
  changedBrakingPointM: number | null;
  /** Changed braking point minus the baseline's, m along the lap (between-sample points): negative = brake earlier. */
  brakingPointShiftM: number | null;
  entrySpeedDeltaKph: number | null;
  minSpeedDeltaKph: number | null;
  /** Time change over the zone (from the earlier braking point to the later slowest point), s. */
  zoneTimeDeltaS: number | null;
  baseline: CornerZone;
  changed: BrakingZone | null;
}

export interface LapComparison {
  baselineLapTimeS: number;
  changedLapTimeS: number;
  lapTimeDeltaS: number;
  zones: ZoneChange[];
  /** Braking zones the changed car has where the baseline had none. */
  newZones: BrakingZone[];
}

/** Time from sample i0 to sample i1 along the trace, going forward; across the start line on a closed lap. */
function elapsedS(result: LapResult, i0: number, i1: number): number {
  const time = result.trace.timeS;
  const span = time[i1]! - time[i0]!;
  return i1 >= i0 ? span : span + result.lapTimeS;
}

/** Whether sample a comes before sample b within half a lap (so the earlier of two braking points is found across the line). */
function before(a: number, b: number, count: number, closed: boolean): boolean {
  if (!closed) return a <= b;
  const forward = (b - a + count) % count;
  return forward <= count / 2;
}

function cornerOf(
  zone: CornerZone,
  track: TrackGrid,
  basePointM: number,
  changedPointM: number | null,
): Pick<ZoneChange, 'corner' | 'tag' | 'cornerName' | 'turnInM' | 'beforeTurnInM' | 'changedBeforeTurnInM'> {
  const turnInM = zone.turnInM;
  const before = (pointM: number | null) =>
    turnInM === null || pointM === null ? null : metresBeforeM(pointM, turnInM, track);
  return {
    corner: zone.corner,
    tag: zone.tag,
    cornerName: zone.cornerName,
    turnInM,
    beforeTurnInM: before(basePointM),
    changedBeforeTurnInM: before(changedPointM),
  };
}

/** One baseline zone against the changed car's matching zone (null: the changed car does not brake there). */
function zoneChange(baseline: LapResult, changed: LapResult, zone: CornerZone, other: BrakingZone | null): ZoneChange {
  const closed = baseline.trace.closed;
  const count = baseline.trace.count;
  const basePointM = brakingPointM(baseline, zone);
  const changedPointM = other ? brakingPointM(changed, other) : null;
  let deltas: Pick<ZoneChange, 'brakingPointShiftM' | 'entrySpeedDeltaKph' | 'minSpeedDeltaKph' | 'zoneTimeDeltaS'> = {
    brakingPointShiftM: null,
    entrySpeedDeltaKph: null,
    minSpeedDeltaKph: null,
    zoneTimeDeltaS: null,
  };
  if (other && changedPointM !== null) {
    // The zone's time runs from the earlier of the two braking points to the later of the two slowest points.
    const i0 = before(zone.startIndex, other.startIndex, count, closed) ? zone.startIndex : other.startIndex;
    const i1 = before(zone.minSpeedIndex, other.minSpeedIndex, count, closed)
      ? other.minSpeedIndex
      : zone.minSpeedIndex;
    deltas = {
      brakingPointShiftM: signedLapShiftM(basePointM, changedPointM, baseline.track.lengthM, closed),
      entrySpeedDeltaKph: mpsToKph(other.entrySpeedMps - zone.entrySpeedMps),
      minSpeedDeltaKph: mpsToKph(other.minSpeedMps - zone.minSpeedMps),
      zoneTimeDeltaS: elapsedS(changed, i0, i1) - elapsedS(baseline, i0, i1),
    };
  }
  return {
    ...cornerOf(zone, baseline.track, basePointM, changedPointM),
    startM: zone.startM,
    minSpeedAtM: zone.minSpeedAtM,
    brakingPointM: basePointM,
    changedBrakingPointM: changedPointM,
    ...deltas,
    baseline: zone,
    changed: other,
  };
}

/** Compares two laps on the same track and grid (same sample count). */
export function compareSetupChange(
  baseline: LapResult,
  changed: LapResult,
  toleranceM = DEFAULT_MATCH_TOLERANCE_M,
): LapComparison {
  const closed = baseline.trace.closed;
  const lengthM = baseline.track.lengthM;
  const matching = matchBrakingZones(baseline.brakingZones, changed.brakingZones, lengthM, closed, toleranceM);
  const zones = baseline.brakingZones.map((zone, b) => {
    const c = matching.changedIndexOf[b]!;
    return zoneChange(baseline, changed, zone, c >= 0 ? changed.brakingZones[c]! : null);
  });
  return {
    baselineLapTimeS: baseline.lapTimeS,
    changedLapTimeS: changed.lapTimeS,
    lapTimeDeltaS: changed.lapTimeS - baseline.lapTimeS,
    zones,
    newZones: matching.unmatchedChanged.map((c) => changed.brakingZones[c]!),
  };
}
