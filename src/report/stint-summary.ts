// A stint for people and programs: the per-lap CSV, the JSON object, and the terminal tables of lap times and of
// braking points drifting as the fuel burns off.

import { zoneLabel } from '../track/corner-layout.js';
import type { StintResult } from '../sweep/stint.js';
import { DIGITS } from '../sweep/table.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { formatLapTime } from '../units.js';

const fmt = (value: number, digits: number) => (Number.isFinite(value) ? value.toFixed(digits) : '');
const signed = (value: number, digits: number) =>
  Number.isFinite(value) ? `${value >= 0 ? '+' : ''}${value.toFixed(digits)}` : '-';

export function stintCsv(result: StintResult): string {
  const header = [
    'lap',
    'fuel_kg',
    'lap_time_s',
    ...result.corners.flatMap((c) => [`${c.tag}_brake_m`, `${c.tag}_min_kph`]),
  ];
  const rows = result.laps.map((lap) =>
    [
      String(lap.lap),
      String(lap.fuelKg),
      fmt(lap.lapTimeS, DIGITS.lapTimeS),
      ...lap.brakingPointM.flatMap((m, k) => [fmt(m, DIGITS.brakingPointM), fmt(lap.minSpeedKph[k]!, DIGITS.speedKph)]),
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

export function stintText(result: StintResult, trackName: string, carName: string): string {
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
      ['corner', 'slowest at m', `lap 1 brake m`, `lap ${last.lap} brake m`, 'drift m', 'slowest km/h'],
      result.corners.map((corner, k) => [
        zoneLabel(corner),
        corner.minSpeedAtM.toFixed(0),
        fmt(first.brakingPointM[k]!, 1),
        fmt(last.brakingPointM[k]!, 1) || 'no braking',
        signed(last.brakingPointM[k]! - first.brakingPointM[k]!, 1),
        `${fmt(first.minSpeedKph[k]!, 1)} -> ${fmt(last.minSpeedKph[k]!, 1)}`,
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
