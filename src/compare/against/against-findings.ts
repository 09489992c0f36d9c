// The findings of one lap against another: per corner where the time differs, which lap is quicker, what it does
// differently (with both laps' numbers, SI), and whether that lap is itself near the reference there, so a coach
// knows whether copying it is enough. Ranked by the time at stake; the sentences are src/report/against-phrases.ts's.

import { kphToMps } from '../../units.js';
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

/** What the quicker lap does differently from the slower one, each with both laps' numbers (SI, unit in each name). */
export type Difference =
  | {
      kind: 'braking-point';
      /** How much later the quicker lap brakes (negative: earlier), m; each lap's braking point before the turn-in. */
      laterM: number;
      fastBeforeTurnInM: number;
      slowBeforeTurnInM: number;
    }
  | { kind: 'does-without-brake' }
  | { kind: 'brakes-where-other-lifts' }
  | { kind: 'peak-braking'; harderMps2: number; fastPeakMps2: number; slowPeakMps2: number }
  | { kind: 'brake-build'; soonerS: number; fastBuildS: number; slowBuildS: number }
  | { kind: 'brake-release'; deeperM: number; fastFromApexM: number; slowFromApexM: number }
  | { kind: 'slowest-speed'; moreMps: number; fastMinSpeedMps: number; slowMinSpeedMps: number }
  | { kind: 'slowest-place'; fastFromApexM: number; slowFromApexM: number }
  | { kind: 'exit-speed'; fasterMps: number; fastExitSpeedMps: number; slowExitSpeedMps: number }
  | { kind: 'coasting'; lessS: number };

/** A corner where the two laps differ: which is quicker, what it does differently, how near the reference it is. */
export interface AgainstFinding {
  corner: number;
  cornerName: string | null;
  /** The driver's lap minus the other over the corner, s. */
  timeS: number;
  /** The quicker lap's name. */
  fastLabel: string;
  /** Up to three differences, most telling first; none where only the phase times tell the laps apart. */
  differences: Difference[];
  /** The pair's time by phase (driver minus other), s: what the sentence names where no difference does. */
  entryTimeLostS: number;
  middleTimeLostS: number;
  exitTimeLostS: number;
  /** The quicker lap's time to the reference over the corner, s, and whether that is within the options' margin. */
  toReferenceS: number;
  nearReference: boolean;
}

/** What the quicker lap (fast) does differently from the slower one (slow). */
export function differences(
  fast: LapCornerFigures,
  slow: LapCornerFigures,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): Difference[] {
  const found: Difference[] = [];
  if (fast.brakingBeforeTurnInM !== null && slow.brakingBeforeTurnInM !== null) {
    const laterM = slow.brakingBeforeTurnInM - fast.brakingBeforeTurnInM;
    if (Math.abs(laterM) >= options.brakingPointM)
      found.push({
        kind: 'braking-point',
        laterM,
        fastBeforeTurnInM: fast.brakingBeforeTurnInM,
        slowBeforeTurnInM: slow.brakingBeforeTurnInM,
      });
  } else if (fast.brakingPointM === null && slow.brakingPointM !== null) {
    found.push({ kind: 'does-without-brake' });
  } else if (fast.brakingPointM !== null && slow.brakingPointM === null) {
    found.push({ kind: 'brakes-where-other-lifts' });
  }
  if (fast.peakBrakingMps2 !== null && slow.peakBrakingMps2 !== null) {
    const harderMps2 = fast.peakBrakingMps2 - slow.peakBrakingMps2;
    if (Math.abs(harderMps2) >= options.peakBrakingMps2)
      found.push({
        kind: 'peak-braking',
        harderMps2,
        fastPeakMps2: fast.peakBrakingMps2,
        slowPeakMps2: slow.peakBrakingMps2,
      });
  }
  if (fast.brakeBuildS !== null && slow.brakeBuildS !== null) {
    const soonerS = slow.brakeBuildS - fast.brakeBuildS;
    if (Math.abs(soonerS) >= options.brakeBuildS)
      found.push({ kind: 'brake-build', soonerS, fastBuildS: fast.brakeBuildS, slowBuildS: slow.brakeBuildS });
  }
  if (fast.brakeReleaseFromApexM !== null && slow.brakeReleaseFromApexM !== null) {
    const deeperM = fast.brakeReleaseFromApexM - slow.brakeReleaseFromApexM;
    if (Math.abs(deeperM) >= options.brakeReleaseM)
      found.push({
        kind: 'brake-release',
        deeperM,
        fastFromApexM: fast.brakeReleaseFromApexM,
        slowFromApexM: slow.brakeReleaseFromApexM,
      });
  }
  const slowestKph = fast.minSpeedKph - slow.minSpeedKph;
  if (Math.abs(slowestKph) >= options.speedKph)
    found.push({
      kind: 'slowest-speed',
      moreMps: kphToMps(slowestKph),
      fastMinSpeedMps: kphToMps(fast.minSpeedKph),
      slowMinSpeedMps: kphToMps(slow.minSpeedKph),
    });
  if (Math.abs(fast.minSpeedOffsetFromApexM - slow.minSpeedOffsetFromApexM) >= options.slowestPlaceM)
    found.push({
      kind: 'slowest-place',
      fastFromApexM: fast.minSpeedOffsetFromApexM,
      slowFromApexM: slow.minSpeedOffsetFromApexM,
    });
  const exitKph = fast.exitSpeedKph - slow.exitSpeedKph;
  if (Math.abs(exitKph) >= options.speedKph)
    found.push({
      kind: 'exit-speed',
      fasterMps: kphToMps(exitKph),
      fastExitSpeedMps: kphToMps(fast.exitSpeedKph),
      slowExitSpeedMps: kphToMps(slow.exitSpeedKph),
    });
  if (fast.coastingS !== null && slow.coastingS !== null) {
    const lessS = slow.coastingS - fast.coastingS;
    if (Math.abs(lessS) >= options.coastingS) found.push({ kind: 'coasting', lessS });
  }
  return found;
}

/** A corner's finding: the quicker lap, by how much, what it does differently, and how near the reference it is. */
export function againstFinding(
  corner: AgainstCorner,
  driverLabel: string,
  otherLabel: string,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): AgainstFinding {
  const driverFaster = corner.timeLostS < 0;
  const [fast, slow] = driverFaster ? [corner.first, corner.second] : [corner.second, corner.first];
  const toReferenceS = driverFaster ? corner.driverToReferenceS : corner.otherToReferenceS;
  return {
    corner: corner.id,
    cornerName: corner.name,
    timeS: corner.timeLostS,
    fastLabel: driverFaster ? driverLabel : otherLabel,
    differences: differences(fast, slow, options).slice(0, 3),
    entryTimeLostS: corner.entryTimeLostS,
    middleTimeLostS: corner.middleTimeLostS,
    exitTimeLostS: corner.exitTimeLostS,
    toReferenceS,
    nearReference: toReferenceS <= options.nearReferenceS,
  };
}

/** The corners where the laps differ, largest difference first (timeS: the driver's lap minus the other, s). */
export function rankAgainstFindings(
  corners: readonly AgainstCorner[],
  driverLabel: string,
  otherLabel: string,
  options: AgainstFindingOptions = DEFAULT_AGAINST_FINDING_OPTIONS,
): AgainstFinding[] {
  return corners
    .filter((corner) => Math.abs(corner.timeLostS) >= options.minTimeS)
    .sort((a, b) => Math.abs(b.timeLostS) - Math.abs(a.timeLostS) || a.id - b.id)
    .slice(0, options.maxFindings)
    .map((corner) => againstFinding(corner, driverLabel, otherLabel, options));
}
