// The sentences of the driver's line (src/compare/driver-line/driver-line.ts) in the units a person reads: the
// findings per corner (a diagonal line into it, a turn-in from inside the reference's, a missed apex) and the notes
// on the resolution the log's positions allow. Line distances are small, so they keep one decimal.

import type { DriverLineResult, LineFinding } from '../compare/driver-line/driver-line.js';
import { findingCornerLabel } from './finding-phrases.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

/** One line finding as a sentence. */
export function lineFindingText(finding: LineFinding, units: DisplayUnits = displayUnits('metric')): string {
  const say = phrasing(units);
  const metres = (distanceM: number) => say.distance(distanceM, 1);
  const label = findingCornerLabel({ id: finding.corner, name: finding.cornerName });
  switch (finding.kind) {
    case 'diagonal-entry':
      return `${label}: turns in while still braking hard (brake ${(finding.brakeAtTurnIn * 100).toFixed(0)} %) and drifts ${metres(finding.driftUnderBrakingM)} towards the inside under braking: a diagonal line into the corner.`;
    case 'turns-in-inside':
      return `${label}: turns in ${metres(finding.insideOfReferenceM)} inside the reference's line, not from the outside edge where the reference starts the corner.`;
    case 'misses-apex':
      return `${label}: misses the apex by ${metres(finding.wideM)} against the reference line${finding.apexMissM !== null ? ` (${metres(finding.apexMissM)} from the inside edge)` : ''}.`;
  }
}

/** The resolution notes: what the positions' scatter allows, and for GPS what the receiver's absolute error allows. */
export function lineNotes(line: DriverLineResult, units: DisplayUnits = displayUnits('metric')): string[] {
  const say = phrasing(units);
  const notes = [
    `line: the log's positions scatter by ${say.distance(line.scatterM, 2)} across the track, so line differences under ${say.distance(line.resolutionM, 1)} are not reported`,
  ];
  if (line.fromGps)
    notes.push(
      `line: GPS positions also carry the receiver's absolute error (a few metres for consumer receivers, from memory): the line against the track's edges and the reference line is reported only from ${say.distance(line.placedResolutionM, 1)}`,
    );
  return notes;
}
