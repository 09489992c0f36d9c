// A stint for people and programs: the per-lap CSV, the JSON object, and the terminal tables of lap times and of
// braking points drifting as the fuel burns off. The CSV and the tables are in the reader's units (km/h and m, or
// mph and ft, the unit in every header); the JSON stays in its keys' units.

import { zoneLabel } from '../track/corner-layout.js';
import type { StintResult } from '../sweep/stint.js';
import { DIGITS } from '../sweep/table.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { formatLapTime, kphToMps } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

const fmt = (value: number, digits: number) => (Number.isFinite(value) ? value.toFixed(digits) : '');
const signed = (value: number, digits: number) =>
  Number.isFinite(value) ? `${value >= 0 ? '+' : ''}${value.toFixed(digits)}` : '-';

/** A speed the stint keeps in km/h, in the reader's speed unit (km/h untouched, so no rounding through m/s). */
const speedIn = (units: DisplayUnits, speedKph: number) =>
  units.system === 'metric' ? speedKph : units.speed(kphToMps(speedKph));

export function stintCsv(result: StintResult, units: DisplayUnits = displayUnits('metric')): string {
  const header = [
    'lap',
    'fuel_kg',
    'lap_time_s',
    ...result.corners.flatMap((c) => [`${c.tag}_brake_${units.distanceSuffix}`, `${c.tag}_min_${units.speedSuffix}`]),
  ];
  const rows = result.laps.map((lap) =>
    [
      String(lap.lap),
      String(lap.fuelKg),
      fmt(lap.lapTimeS, DIGITS.lapTimeS),
      ...lap.brakingPointM.flatMap((m, k) => [
        fmt(units.distance(m), DIGITS.brakingPointM),
        fmt(speedIn(units, lap.minSpeedKph[k]!), DIGITS.speedKph),
      ]),
    ].join(','),
  );
  return [header.join(','), ...rows].join('\n') + '\n';
}

export function stintJson(result: StintResult) {
  const nan = (v: number) => (Number.isFinite(v) ? v : null);
  return {
    corners: result.corners,
    emptyFromLap: result.emptyFromLap,
    totalTimeS: Number(result.totalTimeS.toFixed(DIGITS.lapTimeS)),
    laps: result.laps.map((lap) => ({
      ...lap,
      brakingPointM: lap.brakingPointM.map(nan),
      minSpeedKph: lap.minSpeedKph.map(nan),
    })),
  };
}

export function stintText(
  result: StintResult,
  trackName: string,
  carName: string,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const d = units.distanceLabel;
  const first = result.laps[0]!;
  const last = result.laps[result.laps.length - 1]!;
  const lines = [
    `${trackName} · ${carName} · stint of ${result.laps.length} laps, ${formatLapTime(result.totalTimeS)} in all`,
    '',
    formatTable(
      ['lap', 'fuel kg', 'lap time', 'to lap 1 s'],
      result.laps.map((lap) => [
        String(lap.lap),
        lap.fuelKg.toFixed(1),
        formatLapTime(lap.lapTimeS),
        signed(lap.lapTimeS - first.lapTimeS, 3),
      ]),
    ),
    '',
    `Braking points, lap 1 against lap ${last.lap} (negative = earlier)`,
    formatTable(
      [
        'corner',
        `slowest at ${d}`,
        `lap 1 brake ${d}`,
        `lap ${last.lap} brake ${d}`,
        `drift ${d}`,
        `slowest ${units.speedLabel}`,
      ],
      result.corners.map((corner, k) => [
        zoneLabel(corner),
        units.distance(corner.minSpeedAtM).toFixed(0),
        fmt(units.distance(first.brakingPointM[k]!), 1),
        fmt(units.distance(last.brakingPointM[k]!), 1) || 'no braking',
        signed(units.distance(last.brakingPointM[k]! - first.brakingPointM[k]!), 1),
        `${fmt(speedIn(units, first.minSpeedKph[k]!), 1)} -> ${fmt(speedIn(units, last.minSpeedKph[k]!), 1)}`,
      ]),
    ),
  ];
  if (result.emptyFromLap !== null)
    lines.push(
      '',
      `The tank is empty from lap ${result.emptyFromLap} on (fuel.massKg / fuel.burnKgPerLap); later laps run at zero fuel.`,
    );
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}
