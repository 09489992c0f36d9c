// An uncertain reference for the terminal and as JSON: what was drawn, the lap time's median and 90 % band, the
// braking zones' bands, and each finding with the share of draws in which it holds (uncertain below half).

import type { Band, UncertainFinding, UncertainReference } from '../uncertainty/uncertain-reference.js';
import { formatLapTime } from '../units.js';
import { formatTable } from './text-table.js';
import { roundToDigits } from '../numeric/round.js';
import { claimText, findingText } from './finding-phrases.js';
import { roundedNumbers } from './json-numbers.js';
import { displayUnits, type DisplayUnits } from './units.js';

export const percentText = (share: number): string => `${Math.round(share * 100)} %`;

function fieldText(field: { field: string; value: number; sd: number }): string {
  return `${field.field} ${Number(field.value.toPrecision(5))} ± ${Number(field.sd.toPrecision(2))}`;
}

/** What was drawn, one line. */
export function drawsLine(u: UncertainReference): string {
  const what =
    u.fields.length > 0
      ? u.fields.map(fieldText).join(', ')
      : 'nothing: the car file gives no uncertainty, so every draw is the plain answer';
  const clamped = u.clamped > 0 ? ` (${u.clamped} drawn values held inside their field's range)` : '';
  return `Uncertainty: ${u.draws} draws (${u.design}, seed ${u.seed}) of ${what}${clamped}`;
}

export function lapBandLine(label: string, band: Band): string {
  return `${label} median ${formatLapTime(band.median)}, 90 % band ${formatLapTime(band.low)} to ${formatLapTime(band.high)}`;
}

const range = (band: Band | null, scale: (v: number) => number, digits: number) =>
  band
    ? `${scale(band.median).toFixed(digits)} (${scale(band.low).toFixed(digits)} to ${scale(band.high).toFixed(digits)})`
    : '-';

/** The reference alone over the draws: lap time and braking zones (braking point and slowest speed in the units). */
export function uncertainReferenceText(u: UncertainReference, units: DisplayUnits = displayUnits('metric')): string {
  const lines = [
    drawsLine(u),
    lapBandLine('Lap time over the draws:', u.lapTimeS),
    '',
    'Braking zones over the draws (median, 90 % band in brackets)',
    formatTable(
      ['#', `brake at ${units.distanceLabel}`, `slowest ${units.speedLabel}`, 'found in'],
      u.zones.map((zone, index) => [
        String(index + 1),
        range(zone.brakingPointM, units.distance, 0),
        range(zone.minSpeedMps, units.speed, 1),
        percentText(zone.foundShare),
      ]),
    ),
  ];
  return lines.join('\n') + '\n';
}

export function findingRobustnessText(finding: UncertainFinding, units: DisplayUnits = displayUnits('metric')): string {
  const flag = finding.uncertain ? '[uncertain] ' : '';
  const time = `${finding.timeS.median.toFixed(2)} s (90 % band ${finding.timeS.low.toFixed(2)} to ${finding.timeS.high.toFixed(2)} s)`;
  const head = `${flag}${findingText(finding.finding, units)} Over the draws: ${time}; holds in ${percentText(finding.holds)} of draws.`;
  const rest = finding.clauses
    .slice(1)
    .map((clause) => `   - ${claimText(clause.claim, units)}: holds in ${percentText(clause.holds)}`);
  return [head, ...rest].join('\n');
}

/** The findings ranked by their time over the draws, each with how often it holds. */
export function robustFindingsText(u: UncertainReference, units: DisplayUnits = displayUnits('metric')): string[] {
  if (u.findings.length === 0) return ['No corner costs more than a hundredth of a second against the reference.'];
  return [
    'Where the time is, over the draws (largest first; [uncertain] = holds in fewer than half of them):',
    ...u.findings.map((finding, index) => `${index + 1}. ${findingRobustnessText(finding, units)}`),
  ];
}

const bandJson = (band: Band | null, digits: number) =>
  band
    ? {
        median: roundToDigits(band.median, digits),
        low: roundToDigits(band.low, digits),
        high: roundToDigits(band.high, digits),
      }
    : null;

export function uncertaintyJson(u: UncertainReference) {
  return {
    draws: u.draws,
    design: u.design,
    seed: u.seed,
    fields: u.fields,
    clamped: u.clamped,
    lapTimeS: bandJson(u.lapTimeS, 4),
    brakingZones: u.zones.map((zone) => ({
      brakingPointM: bandJson(zone.brakingPointM, 1),
      minSpeedMps: bandJson(zone.minSpeedMps, 3),
      foundShare: roundToDigits(zone.foundShare, 3),
    })),
    corners: u.corners.map((corner) => ({
      id: corner.id,
      timeLostS: bandJson(corner.timeLostS, 4),
      claim: corner.claim,
      holds: corner.holds === null ? null : roundToDigits(corner.holds, 3),
    })),
    findings: u.findings.map((finding) => ({
      corner: finding.corner,
      text: findingText(finding.finding),
      nominalTimeS: roundToDigits(finding.nominalTimeS, 3),
      timeS: bandJson(finding.timeS, 3),
      holds: roundToDigits(finding.holds, 3),
      uncertain: finding.uncertain,
      clauses: finding.clauses.map((clause) => ({
        ...roundedNumbers(clause.claim),
        text: claimText(clause.claim),
        holds: roundToDigits(clause.holds, 3),
      })),
    })),
  };
}
