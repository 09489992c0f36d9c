// One setup change for people and programs: the change described in words, the JSON object, and the terminal
// table of how far each braking point moves and what the entry speed, slowest speed and zone time do.

import { zoneLabel } from '../track/corner-layout.js';
import { baseValueOf, type Setting, type SetupBase } from '../sweep/settings.js';
import type { LapComparison } from '../sweep/setup-change.js';
import { unitOf } from '../sweep/fields.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { roundToDigits } from '../numeric/round.js';
import { formatLapTime, kphToMps } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

const signed = (value: number, digits: number) => `${value >= 0 ? '+' : ''}${value.toFixed(digits)}`;

export function describeSettings(base: SetupBase, settings: readonly Setting[], values: readonly number[]): string[] {
  return settings.map((setting, k) => {
    const before = baseValueOf(base, setting.field);
    const unit = unitOf(setting.field);
    return `${setting.field} ${before === null ? '(none)' : before} -> ${values[k]}${unit && unit !== '1' ? ` ${unit}` : ''}`;
  });
}

export function whatifJson(comparison: LapComparison, changes: { field: string; from: number | null; to: number }[]) {
  const r = (v: number | null, digits: number) => (v === null ? null : roundToDigits(v, digits));
  return {
    changes,
    baselineLapTimeS: roundToDigits(comparison.baselineLapTimeS, 4),
    changedLapTimeS: roundToDigits(comparison.changedLapTimeS, 4),
    lapTimeDeltaS: roundToDigits(comparison.lapTimeDeltaS, 4),
    brakingZones: comparison.zones.map((zone) => ({
      corner: zone.corner,
      tag: zone.tag,
      cornerName: zone.cornerName,
      startM: roundToDigits(zone.startM, 2),
      minSpeedAtM: roundToDigits(zone.minSpeedAtM, 2),
      brakingPointM: roundToDigits(zone.brakingPointM, 2),
      changedBrakingPointM: r(zone.changedBrakingPointM, 2),
      brakingPointShiftM: r(zone.brakingPointShiftM, 2),
      entrySpeedDeltaKph: r(zone.entrySpeedDeltaKph, 2),
      minSpeedDeltaKph: r(zone.minSpeedDeltaKph, 2),
      zoneTimeDeltaS: r(zone.zoneTimeDeltaS, 4),
      turnInM: r(zone.turnInM, 2),
      beforeTurnInM: r(zone.beforeTurnInM, 2),
      changedBeforeTurnInM: r(zone.changedBeforeTurnInM, 2),
    })),
    newBrakingZones: comparison.newZones.map((zone) => ({
      startM: roundToDigits(zone.startM, 2),
      minSpeedAtM: roundToDigits(zone.minSpeedAtM, 2),
    })),
  };
}

export function whatifText(
  comparison: LapComparison,
  described: string[],
  trackName: string,
  carName: string,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const m = units.distance;
  const speed = (kph: number) => units.speed(kphToMps(kph));
  const rows = comparison.zones.map((zone) => {
    const shift = zone.brakingPointShiftM === null ? null : m(zone.brakingPointShiftM);
    const moved =
      shift === null
        ? 'no braking now'
        : Math.abs(shift) < 0.05
          ? '0.0'
          : `${signed(shift, 1)} ${shift < 0 ? 'earlier' : 'later'}`;
    return [
      zoneLabel({ tag: zone.tag, name: zone.cornerName }),
      m(zone.minSpeedAtM).toFixed(0),
      m(zone.brakingPointM).toFixed(1),
      zone.beforeTurnInM === null ? '' : m(zone.beforeTurnInM).toFixed(1),
      moved,
      zone.entrySpeedDeltaKph === null ? '' : signed(speed(zone.entrySpeedDeltaKph), 1),
      zone.minSpeedDeltaKph === null ? '' : signed(speed(zone.minSpeedDeltaKph), 1),
      zone.zoneTimeDeltaS === null ? '' : signed(zone.zoneTimeDeltaS, 3),
    ];
  });
  const lines = [
    `${trackName} · ${carName}`,
    `Change: ${described.join('; ')}`,
    `Lap time  ${formatLapTime(comparison.baselineLapTimeS)} -> ${formatLapTime(comparison.changedLapTimeS)}  (${signed(comparison.lapTimeDeltaS, 3)} s)`,
    '',
    formatTable(
      [
        'corner',
        `slowest at ${units.distanceLabel}`,
        `brake at ${units.distanceLabel}`,
        `before turn-in ${units.distanceLabel}`,
        `braking point ${units.distanceLabel}`,
        `entry ${units.speedLabel}`,
        `slowest ${units.speedLabel}`,
        'zone time s',
      ],
      rows,
    ),
  ];
  if (comparison.newZones.length > 0) {
    lines.push(
      '',
      `New braking zones: ${comparison.newZones.map((z) => `brake at ${m(z.startM).toFixed(0)} ${units.distanceLabel} for ${m(z.minSpeedAtM).toFixed(0)} ${units.distanceLabel}`).join(', ')}`,
    );
  }
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}
