// Plain-text and JSON summaries of a reference lap for the terminal.

import type { LapResult } from '../solve/types.js';
import { formatLapTime } from '../units.js';
import { displayUnits, METRES_PER_MILE, plainNumber, type DisplayUnits } from './units.js';
import { formatTable } from './text-table.js';
import { zoneLabel } from '../track/corner-layout.js';
import { cornersJson } from './corners-file.js';
import { roadProfileOf } from '../track/road-profile.js';
import { requireFiniteLap } from './finite.js';
import { roundToDigits } from '../numeric/round.js';

export const SAFETY_CAUTION =
  'Caution: this reference lap is a model result, not a driving instruction. Driving at the limit is dangerous; ' +
  "follow the circuit's rules and qualified instruction.";

/** Upshifts of the lap: where each gap in drive begins and the gear it ends in. */
export function gearShifts(result: LapResult): { atM: number; toGear: number }[] {
  const t = result.trace;
  const shifts: { atM: number; toGear: number }[] = [];
  for (let i = 0; i < t.count; i++) {
    if (!t.shift[i] || (i > 0 && t.shift[i - 1])) continue;
    let end = i;
    while (end + 1 < t.count && t.shift[end + 1]) end++;
    shifts.push({ atM: roundToDigits(t.distanceM[i]!, 1), toGear: t.gear[Math.min(end + 1, t.count - 1)]! });
  }
  return shifts;
}

/** Share of the lap's distance spent at the engine's full drive, 0-1. */
function powerLimitedShare(result: LapResult): number {
  const t = result.trace;
  let count = 0;
  for (let i = 0; i < t.count; i++) count += t.powerLimited[i]!;
  return t.count > 0 ? count / t.count : 0;
}

export function lapSummaryJson(result: LapResult, carName: string) {
  requireFiniteLap(result);
  return {
    track: result.track.name,
    car: carName,
    envelope: result.envelopeKind,
    closed: result.trace.closed,
    lapTimeS: roundToDigits(result.lapTimeS, 4),
    lengthM: roundToDigits(result.lengthM, 2),
    stepM: roundToDigits(result.track.stepM, 6),
    maxSpeedMps: roundToDigits(result.maxSpeedMps, 3),
    minSpeedMps: roundToDigits(result.minSpeedMps, 3),
    ...roadSummaryJson(result),
    corners: cornersJson(result.corners),
    sectors: result.corners.sectors.map((s) => ({
      ...s,
      startM: roundToDigits(s.startM, 1),
      endM: roundToDigits(s.endM, 1),
    })),
    brakingZones: result.brakingZones.map((zone) => ({
      corner: zone.corner,
      tag: zone.tag,
      cornerName: zone.cornerName,
      beforeTurnInM: zone.beforeTurnInM === null ? null : roundToDigits(zone.beforeTurnInM, 1),
      startM: roundToDigits(zone.startM, 1),
      entrySpeedMps: roundToDigits(zone.entrySpeedMps, 3),
      minSpeedAtM: roundToDigits(zone.minSpeedAtM, 1),
      minSpeedMps: roundToDigits(zone.minSpeedMps, 3),
      brakingLengthM: roundToDigits(zone.brakingLengthM, 1),
    })),
    powerLimitedShare: roundToDigits(powerLimitedShare(result), 4),
    shifts: gearShifts(result),
  };
}

/** Height range, steepest grades and bank where the track has them; nothing on a flat track. */
function roadSummaryJson(result: LapResult) {
  const road = roadProfileOf(result.track);
  if (!road) return {};
  let zMin = Infinity;
  let zMax = -Infinity;
  let gradeMin = Infinity;
  let gradeMax = -Infinity;
  let bankMax = 0;
  for (let i = 0; i < road.zM.length; i++) {
    zMin = Math.min(zMin, road.zM[i]!);
    zMax = Math.max(zMax, road.zM[i]!);
    gradeMin = Math.min(gradeMin, road.gradeRad[i]!);
    gradeMax = Math.max(gradeMax, road.gradeRad[i]!);
    bankMax = Math.max(bankMax, Math.abs(road.bankRad[i]!));
  }
  return {
    road: {
      heightRangeM: roundToDigits(zMax - zMin, 2),
      steepestClimbPct: roundToDigits(100 * Math.tan(gradeMax), 2),
      steepestDescentPct: roundToDigits(100 * Math.tan(gradeMin), 2),
      steepestBankDeg: roundToDigits((bankMax * 180) / Math.PI, 2),
    },
  };
}

export function lapSummaryText(
  result: LapResult,
  carName: string,
  units: DisplayUnits = displayUnits('metric'),
): string {
  requireFiniteLap(result);
  const speed = (speedMps: number) => plainNumber(units.speed(speedMps), 1);
  const at = (distanceM: number) => plainNumber(units.distance(distanceM), 0);
  const length =
    units.system === 'imperial'
      ? `${plainNumber(result.lengthM / METRES_PER_MILE, 3)} mi`
      : `${plainNumber(result.lengthM / 1000, 3)} km`;
  const lines = [
    `${result.track.name} · ${carName} · ${result.envelopeKind} envelope`,
    `Lap time      ${formatLapTime(result.lapTimeS)}  (${result.lapTimeS.toFixed(3)} s over ${length})`,
    `Top speed     ${speed(result.maxSpeedMps)} ${units.speedLabel}`,
    `Lowest speed  ${speed(result.minSpeedMps)} ${units.speedLabel}`,
    '',
    `Braking zones (${result.brakingZones.length})`,
    formatTable(
      [
        'corner',
        `brake at ${units.distanceLabel}`,
        `before turn-in ${units.distanceLabel}`,
        `entry ${units.speedLabel}`,
        `slowest at ${units.distanceLabel}`,
        `slowest ${units.speedLabel}`,
        `braking ${units.distanceLabel}`,
      ],
      result.brakingZones.map((zone) => [
        zoneLabel({ tag: zone.tag, name: zone.cornerName }),
        at(zone.startM),
        zone.beforeTurnInM === null ? '' : at(zone.beforeTurnInM),
        speed(zone.entrySpeedMps),
        at(zone.minSpeedAtM),
        speed(zone.minSpeedMps),
        at(zone.brakingLengthM),
      ]),
    ),
    '',
    SAFETY_CAUTION,
  ];
  return lines.join('\n') + '\n';
}
