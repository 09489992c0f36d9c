// Plain-language findings from the per-corner comparison: one line per corner where time is lost, the main
// cause first with its numbers and the time at stake, ranked by that time so the biggest opportunity leads.

import type { CornerComparison, Finding } from './types.js';
import { mpsToKph } from '../units.js';

export interface FindingOptions {
  /** How many findings to keep. */
  maxFindings: number;
  /** Corners losing less than this are not worth a finding, s. */
  minTimeS: number;
  /** Braking point differences from this size are named, m. */
  brakingPointM: number;
  /** Coasting beyond the reference's from this long is named, s. */
  coastingS: number;
  /** Speed differences from this size are named, km/h. */
  speedKph: number;
  /** Grip use above this counts as over the envelope. */
  exceededAbove: number;
}

export const DEFAULT_FINDING_OPTIONS: FindingOptions = {
  maxFindings: 5,
  minTimeS: 0.01,
  brakingPointM: 3,
  coastingS: 0.3,
  speedKph: 2,
  exceededAbove: 1.05,
};

const metres = (value: number) => `${Math.abs(value).toFixed(0)} m`;
const kph = (value: number) => `${Math.abs(value).toFixed(0)} km/h`;
const percent = (share: number) => `${(share * 100).toFixed(0)} %`;

export function cornerLabel(corner: Pick<CornerComparison, 'id' | 'name'>): string {
  return corner.name ? `corner ${corner.id} (${corner.name})` : `corner ${corner.id}`;
}

/** Speed of the reference where it starts braking, km/h, recovered from the metre and second forms of the gap. */
function brakingSpeedKph(corner: CornerComparison): number {
  const m = corner.brakingPointDeltaM;
  const s = corner.brakingPointDeltaS;
  return m !== null && s !== null && Math.abs(s) > 1e-9 ? mpsToKph(m / s) : corner.entrySpeedReferenceKph;
}

/** What a clause of a finding claims, whatever its numbers: the unit in which a finding can hold or not. */
export const CLAIM_KINDS = [
  'brakes-late-and-hard',
  'lifts-before-braking-point',
  'brakes-early',
  'brakes-late',
  'lifts-where-flat',
  'lifts-early',
  'coasts',
  'slowest-point-low',
  'slowest-point-misplaced',
  'exit-slow',
  'grip-unused',
  'over-the-limit',
  'loses-in-entry',
  'loses-in-middle',
  'loses-in-exit',
] as const;
export type ClaimKind = (typeof CLAIM_KINDS)[number];

export interface Claim {
  kind: ClaimKind;
  text: string;
}

/** The clauses that describe a corner, most telling first. */
export function cornerClauses(corner: CornerComparison, options: FindingOptions = DEFAULT_FINDING_OPTIONS): string[] {
  return cornerClaims(corner, options).map((claim) => claim.text);
}

/** The clauses that describe a corner with what each claims, most telling first. */
export function cornerClaims(corner: CornerComparison, options: FindingOptions = DEFAULT_FINDING_OPTIONS): Claim[] {
  const clauses: Claim[] = [];
  const push = (kind: ClaimKind, text: string) => clauses.push({ kind, text });
  const braking = corner.brakingPointDeltaM;
  // Over the envelope, and beyond what the reference itself uses there (an envelope whose longitudinal cap
  // includes the power limit puts even the reference above 1 when it accelerates out of a fast corner).
  const overDriven =
    corner.peakGripUse >
    Math.max(options.exceededAbove, (corner.referencePeakGripUse ?? 0) + options.exceededAbove - 1);
  const underSpeed = corner.minSpeedDeltaKph <= -options.speedKph;
  if (braking !== null && braking >= options.brakingPointM && (overDriven || underSpeed)) {
    const how = overDriven
      ? `grip use peaks at ${percent(corner.peakGripUse)} of the envelope`
      : 'the car is slowed too far';
    push(
      'brakes-late-and-hard',
      `braking begins ${metres(braking)} after the reference at ${kph(brakingSpeedKph(corner))} and too hard: ${how}`,
    );
  } else if (braking !== null && braking <= -options.brakingPointM && corner.driverBrakingPointM === null) {
    push(
      'lifts-before-braking-point',
      `the lift comes ${metres(braking)} before the reference's braking point at ${kph(brakingSpeedKph(corner))}`,
    );
  } else if (braking !== null && braking <= -options.brakingPointM) {
    const seconds =
      corner.brakingPointDeltaS === null ? '' : ` (${Math.abs(corner.brakingPointDeltaS).toFixed(2)} s at that speed)`;
    push(
      'brakes-early',
      `braking begins ${metres(braking)} before the reference at ${kph(brakingSpeedKph(corner))}${seconds}`,
    );
  } else if (braking !== null && braking >= options.brakingPointM) {
    push('brakes-late', `braking begins ${metres(braking)} after the reference at ${kph(brakingSpeedKph(corner))}`);
  }
  const lift = corner.liftPointDeltaM ?? null;
  if (braking === null && corner.driverLiftPointM !== null && corner.driverLiftPointM !== undefined) {
    if (lift === null)
      push(
        'lifts-where-flat',
        `the throttle comes off at ${kph(corner.entrySpeedDriverKph)} where the reference stays flat out`,
      );
    else if (lift <= -options.brakingPointM)
      push('lifts-early', `the lift comes ${metres(lift)} before the reference's`);
  }
  const coastingBeyond = (corner.coastingS ?? 0) - (corner.referenceCoastingS ?? 0);
  if (corner.coastingS !== null && coastingBeyond >= options.coastingS) {
    push('coasts', `${corner.coastingS.toFixed(1)} s spent coasting with neither pedal pressed`);
  }
  if (underSpeed)
    push(
      'slowest-point-low',
      `the slowest point is ${kph(corner.minSpeedDeltaKph)} under the reference's ${corner.minSpeedReferenceKph.toFixed(0)} km/h`,
    );
  const referenceOffset = corner.referenceMinSpeedOffsetFromApexM ?? 0;
  if (Math.abs(corner.minSpeedOffsetFromApexM - referenceOffset) >= 5) {
    const side = corner.minSpeedOffsetFromApexM >= 0 ? 'after' : 'before';
    push(
      'slowest-point-misplaced',
      `the slowest point falls ${metres(corner.minSpeedOffsetFromApexM)} ${side} the apex (reference ${referenceOffset.toFixed(0)} m)`,
    );
  }
  const exitDeltaKph = corner.exitSpeedDriverKph - corner.exitSpeedReferenceKph;
  if (exitDeltaKph <= -options.speedKph) push('exit-slow', `the exit is ${kph(exitDeltaKph)} slower`);
  const unusedM = corner.stretches.filter((s) => s.kind === 'unused').reduce((sum, s) => sum + stretchLength(s), 0);
  if (unusedM >= 10)
    push('grip-unused', `grip is left unused over ${metres(unusedM)} where the reference is on the limit`);
  if (overDriven && clauses[0]?.kind !== 'brakes-late-and-hard')
    push('over-the-limit', `grip use reaches ${percent(corner.peakGripUse)} of the envelope (sliding or locking)`);
  return clauses;
}

function stretchLength(stretch: { startM: number; endM: number; lengthM?: number }): number {
  return stretch.lengthM ?? Math.max(0, stretch.endM - stretch.startM);
}

/** Where most of a corner's time goes, for a corner no clause describes. */
export function phaseClaim(corner: CornerComparison): Claim {
  const phases = [
    ['entry', corner.entryTimeLostS],
    ['middle', corner.middleTimeLostS],
    ['exit', corner.exitTimeLostS],
  ] as const;
  const worst = phases.reduce((a, b) => (b[1] > a[1] ? b : a));
  return {
    kind: `loses-in-${worst[0]}`,
    text: `most of the time goes in the ${worst[0]} phase (entry ${corner.entryTimeLostS.toFixed(2)} s, middle ${corner.middleTimeLostS.toFixed(2)} s, exit ${corner.exitTimeLostS.toFixed(2)} s)`,
  };
}

/** One line for a corner: main cause, the time at stake, then up to two further observations. */
export function cornerFindingText(corner: CornerComparison, options: FindingOptions = DEFAULT_FINDING_OPTIONS): string {
  const clauses = cornerClauses(corner, options);
  const main = clauses[0] ?? phaseClaim(corner).text;
  const rest = clauses.slice(1, 3);
  const worth = `worth about ${corner.timeLostS.toFixed(2)} s`;
  return `${cornerLabel(corner)}: ${main}, ${worth}${rest.length > 0 ? `; ${rest.join('; ')}` : ''}.`;
}

/** The corners that lose time, biggest loss first, each as one finding. */
export function rankFindings(
  corners: readonly CornerComparison[],
  options: FindingOptions = DEFAULT_FINDING_OPTIONS,
): Finding[] {
  return corners
    .filter((corner) => corner.timeLostS >= options.minTimeS)
    .sort((a, b) => b.timeLostS - a.timeLostS || a.id - b.id)
    .slice(0, options.maxFindings)
    .map((corner) => ({ corner: corner.id, timeS: corner.timeLostS, text: cornerFindingText(corner, options) }));
}
