// The driver's line for the terminal (a table of turn-in, apex and exit offsets per corner against the reference
// line and the other lap, the findings and the resolution note) and as the `line` object of `compare --json`.

import type { DriverLineResult } from '../compare/driver-line/driver-line.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';
import { formatTable } from './text-table.js';
import { roundToDigits as round } from '../numeric/round.js';
import { lineFindingText, lineNotes } from './line-phrases.js';
import { roundedNumbers } from './json-numbers.js';

export function lineSummaryText(line: DriverLineResult, units: DisplayUnits = displayUnits('metric')): string {
  const d = units.distanceLabel;
  const offset = (m: number | null | undefined) =>
    m === null || m === undefined ? '-' : plainNumber(units.distance(m), 1, true);
  const hasReference = line.corners.some((c) => c.reference !== null);
  const hasOther = line.corners.some((c) => c.other !== null);
  const lines = [
    `The line (offsets from the centreline in ${d}, positive = left; turn-in = where the car leaves the outside before the apex, within the resolution;`,
    `apex miss = gap to the inside edge at the apex${hasReference ? '; ref = the reference line' : ''}${hasOther ? '; other = the other lap' : ''})`,
    formatTable(
      [
        '#',
        `turn-in before apex ${d}`,
        'turn-in',
        'apex',
        'exit',
        `apex miss ${d}`,
        ...(hasReference ? ['ref turn-in', 'ref apex'] : []),
        ...(hasOther ? ['other apex'] : []),
        'brake at turn-in',
      ],
      line.corners.map((c) => [
        String(c.id),
        plainNumber(units.distance(c.driver.turnInBeforeApexM), 0),
        offset(c.driver.turnInOffsetM),
        offset(c.driver.apexOffsetM),
        offset(c.driver.exitOffsetM),
        c.driver.apexMissM === null ? '-' : plainNumber(units.distance(c.driver.apexMissM), 1),
        ...(hasReference ? [offset(c.reference?.turnInOffsetM), offset(c.reference?.apexOffsetM)] : []),
        ...(hasOther ? [offset(c.other?.apexOffsetM)] : []),
        c.brakeAtTurnIn === null ? '-' : `${(c.brakeAtTurnIn * 100).toFixed(0)} %`,
      ]),
    ),
  ];
  if (line.findings.length > 0)
    lines.push('', ...line.findings.map((f, k) => `${k + 1}. ${lineFindingText(f, units)}`));
  lines.push('', ...lineNotes(line, units).map((note) => `Note: ${note}`));
  return lines.join('\n') + '\n';
}

const roundOrNull = (value: number | null | undefined, digits: number) =>
  value === null || value === undefined ? null : round(value, digits);

export function lineJson(line: DriverLineResult) {
  return {
    scatterM: round(line.scatterM, 3),
    resolutionM: round(line.resolutionM, 3),
    placedResolutionM: round(line.placedResolutionM, 3),
    corners: line.corners.map((c) => ({
      id: c.id,
      name: c.name,
      turnInM: round(c.driver.turnInM, 1),
      turnInBeforeApexM: round(c.driver.turnInBeforeApexM, 1),
      turnInOffsetM: round(c.driver.turnInOffsetM, 2),
      apexOffsetM: round(c.driver.apexOffsetM, 2),
      exitOffsetM: round(c.driver.exitOffsetM, 2),
      apexMissM: roundOrNull(c.driver.apexMissM, 2),
      referenceTurnInOffsetM: roundOrNull(c.reference?.turnInOffsetM, 2),
      referenceApexOffsetM: roundOrNull(c.reference?.apexOffsetM, 2),
      otherApexOffsetM: roundOrNull(c.other?.apexOffsetM, 2),
      brakeAtTurnIn: roundOrNull(c.brakeAtTurnIn, 3),
      driftUnderBrakingM: roundOrNull(c.driftUnderBrakingM, 2),
    })),
    findings: line.findings.map((f) => {
      const { corner, ...claim } = roundedNumbers(f);
      return { corner, text: lineFindingText(f), ...claim };
    }),
    notes: lineNotes(line),
  };
}
