// Plain-language findings of one lap against another: per corner where the time differs, which lap is quicker, what
// it does differently (with both laps' numbers), and whether that lap is itself near the reference there, so a
// coach knows whether copying it is enough. Ranked by the time at stake.

import type { TextFinding } from '../types.js';
import { cornerLabel } from '../findings.js';
import { mps2ToG } from '../../units.js';
import type { LapCornerFigures } from './lap-corner.js';
import type { CornerPair } from './corner-pair.js';

export interface AgainstFindingOptions {
  maxFindings: number;
  /** Corners where the two laps differ by less than this make no finding, s. */
  minTimeS: number;
  /** Differences from these sizes are named. */
  brakingPointM: number;
  peakBrakingMps2: number;
  brakeBuildS: number;
  brakeReleaseM: number;
  speedKph: number;
  slowestPlaceM: number;
  coastingS: number;
  /** A lap within this of the reference over a corner is "near the reference" there, s. */
  nearReferenceS: number;
}

export const DEFAULT_AGAINST_FINDING_OPTIONS: AgainstFindingOptions = {
  maxFindings: 6,
  minTimeS: 0.01,
  brakingPointM: 3,
  peakBrakingMps2: 1,
  brakeBuildS: 0.1,
  brakeReleaseM: 5,
  speedKph: 2,
  slowestPlaceM: 5,
  coastingS: 0.2,
  nearReferenceS: 0.05,
};

/** A corner of the pair with each lap's time lost to the reference over the same stretch. */
export interface AgainstCorner extends CornerPair {
  driverToReferenceS: number;
  otherToReferenceS: number;
}

const m = (value: number) => `${Math.abs(value).toFixed(0)} m`;
const kph = (value: number) => `${value.toFixed(0)} km/h`;
const g = (mps2: number) => `${mps2ToG(mps2).toFixed(2)} g`;
const apexPlace = (offsetM: number) =>
  Math.abs(offsetM) < 0.5 ? 'at the apex' : `${m(offsetM)} ${offsetM > 0 ? 'after' : 'before'} the apex`;

/** What the quicker lap (fast) does differently from the slower one (slow), each clause with both numbers. */
export function differenceClauses(
  fast: LapCornerFigures,
  slow: LapCornerFigures,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): string[] {
  const clauses: string[] = [];
  if (fast.brakingBeforeTurnInM !== null && slow.brakingBeforeTurnInM !== null) {
    const laterM = slow.brakingBeforeTurnInM - fast.brakingBeforeTurnInM;
    if (Math.abs(laterM) >= options.brakingPointM)
      clauses.push(
        `brakes ${m(laterM)} ${laterM > 0 ? 'later' : 'earlier'} (${fast.brakingBeforeTurnInM.toFixed(0)} m before the turn-in against ${slow.brakingBeforeTurnInM.toFixed(0)} m)`,
      );
  } else if (fast.brakingPointM === null && slow.brakingPointM !== null) {
    clauses.push('does without the brake where the other lap brakes');
  } else if (fast.brakingPointM !== null && slow.brakingPointM === null) {
    clauses.push('brakes where the other lap only lifts');
  }
  if (fast.peakBrakingMps2 !== null && slow.peakBrakingMps2 !== null) {
    const harder = fast.peakBrakingMps2 - slow.peakBrakingMps2;
    if (Math.abs(harder) >= options.peakBrakingMps2)
      clauses.push(
        `brakes ${harder > 0 ? 'harder' : 'more gently'} at its peak (${g(fast.peakBrakingMps2)} against ${g(slow.peakBrakingMps2)})`,
      );
  }
  if (fast.brakeBuildS !== null && slow.brakeBuildS !== null) {
    const sooner = slow.brakeBuildS - fast.brakeBuildS;
    if (Math.abs(sooner) >= options.brakeBuildS)
      clauses.push(
        `builds the braking ${sooner > 0 ? 'faster' : 'more slowly'} (${fast.brakeBuildS.toFixed(2)} s to the peak against ${slow.brakeBuildS.toFixed(2)} s)`,
      );
  }
  if (fast.brakeReleaseFromApexM !== null && slow.brakeReleaseFromApexM !== null) {
    const deeper = fast.brakeReleaseFromApexM - slow.brakeReleaseFromApexM;
    if (Math.abs(deeper) >= options.brakeReleaseM)
      clauses.push(
        `${deeper > 0 ? 'trails the brake' : 'releases the brake'} ${m(deeper)} ${deeper > 0 ? 'further into the corner' : 'sooner'} (off ${apexPlace(fast.brakeReleaseFromApexM)} against ${apexPlace(slow.brakeReleaseFromApexM)})`,
      );
  }
  const slowest = fast.minSpeedKph - slow.minSpeedKph;
  if (Math.abs(slowest) >= options.speedKph)
    clauses.push(
      `${slowest > 0 ? 'carries' : 'is'} ${kph(Math.abs(slowest))} ${slowest > 0 ? 'more' : 'slower'} at the slowest point (${kph(fast.minSpeedKph)} against ${kph(slow.minSpeedKph)})`,
    );
  if (Math.abs(fast.minSpeedOffsetFromApexM - slow.minSpeedOffsetFromApexM) >= options.slowestPlaceM)
    clauses.push(
      `is slowest ${apexPlace(fast.minSpeedOffsetFromApexM)} against ${apexPlace(slow.minSpeedOffsetFromApexM)}`,
    );
  const exit = fast.exitSpeedKph - slow.exitSpeedKph;
  if (Math.abs(exit) >= options.speedKph)
    clauses.push(
      `exits ${kph(Math.abs(exit))} ${exit > 0 ? 'faster' : 'slower'} (${kph(fast.exitSpeedKph)} against ${kph(slow.exitSpeedKph)})`,
    );
  if (fast.coastingS !== null && slow.coastingS !== null) {
    const less = slow.coastingS - fast.coastingS;
    if (Math.abs(less) >= options.coastingS)
      clauses.push(`coasts ${Math.abs(less).toFixed(1)} s ${less > 0 ? 'less' : 'more'}`);
  }
  return clauses;
}

function phaseClause(corner: CornerPair): string {
  const phases = [
    ['entry', Math.abs(corner.entryTimeLostS)],
    ['middle', Math.abs(corner.middleTimeLostS)],
    ['exit', Math.abs(corner.exitTimeLostS)],
  ] as const;
  const most = phases.reduce((a, b) => (b[1] > a[1] ? b : a));
  return `gains most in the ${most[0]} (entry ${corner.entryTimeLostS.toFixed(2)} s, middle ${corner.middleTimeLostS.toFixed(2)} s, exit ${corner.exitTimeLostS.toFixed(2)} s)`;
}

/** One line for a corner: the quicker lap, by how much, what it does differently, and how near the reference it is. */
export function againstCornerText(
  corner: AgainstCorner,
  driverLabel: string,
  otherLabel: string,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): string {
  const driverFaster = corner.timeLostS < 0;
  const fastLabel = driverFaster ? driverLabel : otherLabel;
  const [fast, slow] = driverFaster ? [corner.first, corner.second] : [corner.second, corner.first];
  const clauses = differenceClauses(fast, slow, options).slice(0, 3);
  const what = clauses.length > 0 ? clauses.join(', ') : phaseClause(corner);
  const toReference = driverFaster ? corner.driverToReferenceS : corner.otherToReferenceS;
  const near =
    toReference <= options.nearReferenceS
      ? `${fastLabel} is itself within ${Math.max(0, toReference).toFixed(2)} s of the reference here, so copying it is enough`
      : `${fastLabel} itself still leaves ${toReference.toFixed(2)} s to the reference here, so copying it is not the whole answer`;
  return `${cornerLabel(corner)}: ${fastLabel} is ${Math.abs(corner.timeLostS).toFixed(2)} s quicker here; it ${what}; ${near}.`;
}

/** The corners where the laps differ, largest difference first (timeS: the driver's lap minus the other, s). */
export function rankAgainstFindings(
  corners: readonly AgainstCorner[],
  driverLabel: string,
  otherLabel: string,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): TextFinding[] {
  return corners
    .filter((corner) => Math.abs(corner.timeLostS) >= options.minTimeS)
    .sort((a, b) => Math.abs(b.timeLostS) - Math.abs(a.timeLostS) || a.id - b.id)
    .slice(0, options.maxFindings)
    .map((corner) => ({
      corner: corner.id,
      timeS: corner.timeLostS,
      text: againstCornerText(corner, driverLabel, otherLabel, options),
    }));
}
