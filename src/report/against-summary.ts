// The driver's lap against a second lap for the terminal (lap times, a table per corner with both laps' numbers,
// the findings) and as the `against` object of `compare --json`.

import type { AgainstResult } from '../compare/against/lap-against-lap.js';
import type { LapCornerFigures } from '../compare/against/lap-corner.js';
import { formatLapTime, kphToMps, mps2ToG } from '../units.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';
import { formatTable } from './text-table.js';
import { roundToDigits as round } from '../numeric/round.js';
import { againstFindingText } from './against-phrases.js';
import { roundedNumbers } from './json-numbers.js';

const signed = (value: number, digits: number) => plainNumber(value, digits, true);
const maybe = (value: number | null, show: (v: number) => string) => (value === null ? '-' : show(value));
const both = (a: string, b: string) => `${a}/${b}`;

export function againstSummaryText(against: AgainstResult, units: DisplayUnits = displayUnits('metric')): string {
  const d = units.distanceLabel;
  const speed = (kph: number) => plainNumber(units.speed(kphToMps(kph)), 0);
  const distance = (m: number | null) => maybe(m, (v) => plainNumber(units.distance(v), 0));
  const gap = against.driverLapTimeS - against.lapTimeS;
  const otherGap = against.lapTimeS - against.referenceLapTimeS;
  const pairOf =
    (pick: (f: LapCornerFigures) => string) => (c: { first: LapCornerFigures; second: LapCornerFigures }) =>
      both(pick(c.first), pick(c.second));
  const lines = [
    `Against ${against.label}  ${formatLapTime(against.lapTimeS)}  (${against.driverLabel} ${signed(gap, 3)} s; ${against.label} ${signed(otherGap, 3)} s to the reference)`,
    '',
    `Corners, ${against.driverLabel} against ${against.label} (pairs: ${against.driverLabel}/${against.label}; brake = braking-point difference, ${d},`,
    `positive = later; before turn-in in ${d}; peak braking in g and the time it takes to build; brake off = where the brake`,
    `comes off, ${d} from the apex, negative = before; lost = ${against.driverLabel} minus ${against.label}, entry middle exit, s;`,
    'to ref = each lap against the reference over the corner, s)',
    formatTable(
      [
        '#',
        `brake ${d}`,
        `before turn-in ${d}`,
        'peak g',
        'build s',
        `brake off ${d}`,
        `entry ${units.speedLabel}`,
        `slowest ${units.speedLabel}`,
        `exit ${units.speedLabel}`,
        'coast s',
        'lost by phase',
        'lost s',
        'to ref s',
      ],
      against.corners.map((c) => [
        String(c.id),
        maybe(c.brakingPointDeltaM, (v) => signed(units.distance(v), 0)),
        pairOf((f) => distance(f.brakingBeforeTurnInM))(c),
        pairOf((f) => maybe(f.peakBrakingMps2, (v) => mps2ToG(v).toFixed(2)))(c),
        pairOf((f) => maybe(f.brakeBuildS, (v) => v.toFixed(2)))(c),
        pairOf((f) => distance(f.brakeReleaseFromApexM))(c),
        pairOf((f) => speed(f.entrySpeedKph))(c),
        pairOf((f) => speed(f.minSpeedKph))(c),
        pairOf((f) => speed(f.exitSpeedKph))(c),
        pairOf((f) => maybe(f.coastingS, (v) => v.toFixed(1)))(c),
        `${signed(c.entryTimeLostS, 2)} ${signed(c.middleTimeLostS, 2)} ${signed(c.exitTimeLostS, 2)}`,
        signed(c.timeLostS, 3),
        both(signed(c.driverToReferenceS, 2), signed(c.otherToReferenceS, 2)),
      ]),
    ),
    '',
  ];
  if (against.findings.length === 0)
    lines.push('The two laps differ by less than a hundredth of a second in every corner.');
  else {
    lines.push(`Lap against lap (largest difference first):`);
    against.findings.forEach((finding, index) => lines.push(`${index + 1}. ${againstFindingText(finding, units)}`));
  }
  if (against.notes.length > 0) lines.push('', ...against.notes.map((note) => `Note: ${note}`));
  return lines.join('\n') + '\n';
}

const roundOrNull = (value: number | null, digits: number) => (value === null ? null : round(value, digits));

function figuresJson(f: LapCornerFigures) {
  return {
    brakingPointM: roundOrNull(f.brakingPointM, 1),
    brakingBeforeTurnInM: roundOrNull(f.brakingBeforeTurnInM, 1),
    peakBrakingMps2: roundOrNull(f.peakBrakingMps2, 2),
    brakeBuildS: roundOrNull(f.brakeBuildS, 3),
    brakeReleaseFromApexM: roundOrNull(f.brakeReleaseFromApexM, 1),
    trailBrakingM: roundOrNull(f.trailBrakingM, 1),
    entrySpeedKph: round(f.entrySpeedKph, 1),
    minSpeedKph: round(f.minSpeedKph, 1),
    minSpeedOffsetFromApexM: round(f.minSpeedOffsetFromApexM, 1),
    exitSpeedKph: round(f.exitSpeedKph, 1),
    coastingS: roundOrNull(f.coastingS, 2),
    cornerTimeS: round(f.cornerTimeS, 4),
  };
}

/** The `against` object of `compare --json`: differences are the driver's lap minus the other lap. */
export function againstJson(against: AgainstResult) {
  return {
    source: against.source,
    lap: against.lapNumber,
    lapTimeS: round(against.lapTimeS, 4),
    lapTimeDeltaS: round(against.driverLapTimeS - against.lapTimeS, 4),
    otherToReferenceS: round(against.lapTimeS - against.referenceLapTimeS, 4),
    corners: against.corners.map((c) => ({
      id: c.id,
      name: c.name,
      brakingPointDeltaM: roundOrNull(c.brakingPointDeltaM, 1),
      brakingPointDeltaS: roundOrNull(c.brakingPointDeltaS, 3),
      brakeReleaseFromApexM: roundOrNull(c.brakeReleaseDeltaM, 1),
      entrySpeedDeltaKph: round(c.entrySpeedDeltaKph, 1),
      minSpeedDeltaKph: round(c.minSpeedDeltaKph, 1),
      exitSpeedDeltaKph: round(c.exitSpeedDeltaKph, 1),
      entryTimeLostS: round(c.entryTimeLostS, 4),
      middleTimeLostS: round(c.middleTimeLostS, 4),
      exitTimeLostS: round(c.exitTimeLostS, 4),
      timeLostS: round(c.timeLostS, 4),
      driverToReferenceS: round(c.driverToReferenceS, 4),
      otherToReferenceS: round(c.otherToReferenceS, 4),
      driver: figuresJson(c.first),
      other: figuresJson(c.second),
    })),
    findings: against.findings.map((f) => ({
      corner: f.corner,
      timeS: round(f.timeS, 3),
      text: againstFindingText(f),
      fastLap: f.fastLabel,
      differences: roundedNumbers(f.differences),
      toReferenceS: round(f.toReferenceS, 3),
    })),
    notes: against.notes,
  };
}
