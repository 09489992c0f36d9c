// The driver-against-reference comparison for the terminal (a table per corner and the ranked findings), as a
// JSON object, and the two laps' aligned traces as CSV on the shared distance grid.

import type { ComparisonResult, CornerComparison } from '../compare/types.js';
import { formatLapTime, kphToMps } from '../units.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { roundToDigits } from '../numeric/round.js';
import type { UncertainReference } from '../uncertainty/uncertain-reference.js';
import { findingText } from './finding-phrases.js';
import { roundedNumbers } from './json-numbers.js';
import { drawsLine, lapBandLine, percentText, robustFindingsText } from './uncertainty-summary.js';
import { noteText } from './note-text.js';

const signed = (value: number, digits: number) => plainNumber(value, digits, true);
const orDash = (value: number | null | undefined, digits: number, sign = true) =>
  value === null || value === undefined || !Number.isFinite(value)
    ? '-'
    : sign
      ? signed(value, digits)
      : plainNumber(value, digits);

/** The gaps a driver reads first: to the reference used, and to the other envelope when it is known. */
function gapLines(result: ComparisonResult): string[] {
  const gap = result.driverLapTimeS - result.referenceLapTimeS;
  const lines = [
    `Driver lap      ${formatLapTime(result.driverLapTimeS)}`,
    `Reference lap   ${formatLapTime(result.referenceLapTimeS)}  (${result.referenceEnvelopeKind ?? 'car model'} envelope; gap ${signed(gap, 3)} s)`,
  ];
  if (result.referenceEnvelopeKind !== 'demonstrated' && result.demonstratedLapTimeS !== null) {
    const demo = result.driverLapTimeS - result.demonstratedLapTimeS;
    const caveat = result.demonstratedCaveat ? `  [doubtful: ${result.demonstratedCaveat}; see notes]` : '';
    lines.push(
      `With the grip already shown  ${formatLapTime(result.demonstratedLapTimeS)}  (gap ${signed(demo, 3)} s)${caveat}`,
    );
  }
  if (
    result.referenceEnvelopeKind === 'demonstrated' &&
    result.carModelLapTimeS !== null &&
    result.carModelLapTimeS !== undefined
  ) {
    const model = result.driverLapTimeS - result.carModelLapTimeS;
    lines.push(`On the car model's envelope  ${formatLapTime(result.carModelLapTimeS)}  (gap ${signed(model, 3)} s)`);
  }
  return lines;
}

function cornerRow(corner: CornerComparison, units: DisplayUnits): string[] {
  const speeds = (driverKph: number, referenceKph: number) =>
    `${plainNumber(units.speed(kphToMps(driverKph)), 0)}/${plainNumber(units.speed(kphToMps(referenceKph)), 0)}`;
  const distance = (distanceM: number | null | undefined) =>
    distanceM === null || distanceM === undefined ? distanceM : units.distance(distanceM);
  return [
    String(corner.id),
    corner.name ?? '',
    plainNumber(units.distance(corner.apexM), 0),
    orDash(distance(corner.brakingPointDeltaM), 0),
    `${orDash(distance(corner.driverBeforeTurnInM), 0, false)}/${orDash(distance(corner.referenceBeforeTurnInM), 0, false)}`,
    speeds(corner.entrySpeedDriverKph, corner.entrySpeedReferenceKph),
    speeds(corner.minSpeedDriverKph, corner.minSpeedReferenceKph),
    signed(units.distance(corner.minSpeedOffsetFromApexM), 0),
    speeds(corner.exitSpeedDriverKph, corner.exitSpeedReferenceKph),
    orDash(corner.coastingS, 1, false),
    `${(corner.meanGripUse * 100).toFixed(0)}/${(corner.peakGripUse * 100).toFixed(0)}`,
    `${signed(corner.entryTimeLostS, 2)} ${signed(corner.middleTimeLostS, 2)} ${signed(corner.exitTimeLostS, 2)}`,
    signed(corner.timeLostS, 3),
  ];
}

/** With `uncertainty` (an uncertain reference over the same comparison), the corner table gains the share of draws
 * in which each corner's finding holds, and the findings are those over the draws. */
export function compareSummaryText(
  result: ComparisonResult,
  uncertainty?: UncertainReference,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const d = units.distanceLabel;
  const holds = (index: number) => {
    const share = uncertainty?.corners[index]?.holds;
    return share === null || share === undefined ? '-' : percentText(share);
  };
  const lines = [
    `${result.trackName} · ${result.carName}`,
    ...gapLines(result),
    ...(uncertainty ? [lapBandLine('Reference over the draws:', uncertainty.lapTimeS), drawsLine(uncertainty)] : []),
    '',
    `Corners (speeds driver/reference in ${units.speedLabel}; brake = driver minus reference braking point, ${d}, negative = earlier;`,
    `before turn-in = driver/reference braking point, ${d} before the corner turns in;`,
    `slowest vs apex in ${d}, positive = after; grip = mean/peak % of the envelope; lost = entry middle exit, s${uncertainty ? ';' : ')'}`,
    ...(uncertainty ? ["holds = share of the draws in which the corner's finding holds)"] : []),
    formatTable(
      [
        '#',
        'name',
        `apex ${d}`,
        `brake ${d}`,
        `before turn-in ${d}`,
        `entry ${units.speedLabel}`,
        `slowest ${units.speedLabel}`,
        `vs apex ${d}`,
        `exit ${units.speedLabel}`,
        'coast s',
        'grip %',
        'lost by phase',
        'lost s',
        ...(uncertainty ? ['holds'] : []),
      ],
      result.corners.map((corner, index) => [...cornerRow(corner, units), ...(uncertainty ? [holds(index)] : [])]),
    ),
    '',
  ];
  if (uncertainty) lines.push(...robustFindingsText(uncertainty, units));
  else if (result.findings.length === 0)
    lines.push('No corner costs more than a hundredth of a second against the reference.');
  else {
    lines.push('Where the time is (largest first):');
    result.findings.forEach((finding, index) => lines.push(`${index + 1}. ${findingText(finding, units)}`));
  }
  if (result.notes.length > 0) lines.push('', ...result.notes.map((note) => `Note: ${noteText(note, units)}`));
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}

const roundOrNull = (value: number | null | undefined, digits: number) =>
  value === null || value === undefined ? null : roundToDigits(value, digits);

export function compareSummaryJson(result: ComparisonResult) {
  return {
    track: result.trackName,
    car: result.carName,
    referenceEnvelope: result.referenceEnvelopeKind ?? 'car model',
    driverLapTimeS: roundToDigits(result.driverLapTimeS, 4),
    referenceLapTimeS: roundToDigits(result.referenceLapTimeS, 4),
    lapTimeDeltaS: roundToDigits(result.driverLapTimeS - result.referenceLapTimeS, 4),
    demonstratedLapTimeS: roundOrNull(result.demonstratedLapTimeS, 4),
    demonstratedCaveat: result.demonstratedCaveat ?? null,
    carModelLapTimeS: roundOrNull(result.carModelLapTimeS, 4),
    corners: result.corners.map((c) => ({
      id: c.id,
      name: c.name,
      entryM: roundToDigits(c.entryM, 1),
      apexM: roundToDigits(c.apexM, 1),
      exitM: roundToDigits(c.exitM, 1),
      brakingPointDeltaM: roundOrNull(c.brakingPointDeltaM, 1),
      brakingPointDeltaS: roundOrNull(c.brakingPointDeltaS, 3),
      referenceBrakingPointM: roundOrNull(c.referenceBrakingPointM, 1),
      driverBrakingPointM: roundOrNull(c.driverBrakingPointM, 1),
      turnInM: roundOrNull(c.turnInM, 1),
      referenceBeforeTurnInM: roundOrNull(c.referenceBeforeTurnInM, 1),
      driverBeforeTurnInM: roundOrNull(c.driverBeforeTurnInM, 1),
      ...(c.markerName ? { marker: c.markerName, driverBeforeMarkerM: roundOrNull(c.driverBeforeMarkerM, 1) } : {}),
      entrySpeedDriverKph: roundToDigits(c.entrySpeedDriverKph, 1),
      entrySpeedReferenceKph: roundToDigits(c.entrySpeedReferenceKph, 1),
      minSpeedDriverKph: roundToDigits(c.minSpeedDriverKph, 1),
      minSpeedReferenceKph: roundToDigits(c.minSpeedReferenceKph, 1),
      minSpeedDeltaKph: roundToDigits(c.minSpeedDeltaKph, 1),
      minSpeedOffsetFromApexM: roundToDigits(c.minSpeedOffsetFromApexM, 1),
      exitSpeedDriverKph: roundToDigits(c.exitSpeedDriverKph, 1),
      exitSpeedReferenceKph: roundToDigits(c.exitSpeedReferenceKph, 1),
      entryTimeLostS: roundToDigits(c.entryTimeLostS, 4),
      middleTimeLostS: roundToDigits(c.middleTimeLostS, 4),
      exitTimeLostS: roundToDigits(c.exitTimeLostS, 4),
      timeLostS: roundToDigits(c.timeLostS, 4),
      coastingS: roundOrNull(c.coastingS, 2),
      meanGripUse: roundToDigits(c.meanGripUse, 3),
      peakGripUse: roundToDigits(c.peakGripUse, 3),
      stretches: c.stretches.map((s) => ({
        kind: s.kind,
        startM: roundToDigits(s.startM, 1),
        endM: roundToDigits(s.endM, 1),
        meanGripUse: roundToDigits(s.meanGripUse, 3),
      })),
    })),
    findings: result.findings.map((f) => ({
      corner: f.corner,
      timeS: roundToDigits(f.timeS, 3),
      text: findingText(f),
      claims: roundedNumbers(f.claims),
    })),
    notes: result.notes.map((note) => noteText(note)),
  };
}
