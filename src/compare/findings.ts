// The findings of the per-corner comparison: per corner where time is lost, what it claims (the main cause first,
// each claim with its numbers in SI) and the time at stake, ranked by that time so the biggest opportunity leads.
// The sentences a person reads are composed from these records in src/report/finding-phrases.ts, in their units.

import type { Claim, ClaimKind, CornerComparison, Finding } from './types.js';
import { kphToMps } from '../units.js';

export type { Claim, ClaimKind } from './types.js';

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

/** Speed of the reference where it starts braking, m/s, recovered from the metre and second forms of the gap. */
function brakingSpeedMps(corner: CornerComparison): number {
  const m = corner.brakingPointDeltaM;
  const s = corner.brakingPointDeltaS;
  return m !== null && s !== null && Math.abs(s) > 1e-9 ? m / s : kphToMps(corner.entrySpeedReferenceKph);
}

/** Every kind of claim, in a fixed order (the bit of each in a claim mask, src/uncertainty). */
export const CLAIM_KINDS: readonly ClaimKind[] = [
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
];

/** The clauses that describe a corner with what each claims, most telling first. */
export function cornerClaims(corner: CornerComparison, options: FindingOptions = DEFAULT_FINDING_OPTIONS): Claim[] {
  const clauses: Claim[] = [];
  const braking = corner.brakingPointDeltaM;
  // Over the envelope, and beyond what the reference itself uses there (an envelope whose longitudinal cap
  // includes the power limit puts even the reference above 1 when it accelerates out of a fast corner).
  const overDriven =
    corner.peakGripUse >
    Math.max(options.exceededAbove, (corner.referencePeakGripUse ?? 0) + options.exceededAbove - 1);
  const underSpeed = corner.minSpeedDeltaKph <= -options.speedKph;
  if (braking !== null) {
    const gap = { brakingPointDeltaM: braking, brakingSpeedMps: brakingSpeedMps(corner) };
    if (braking >= options.brakingPointM && (overDriven || underSpeed))
      clauses.push({ kind: 'brakes-late-and-hard', ...gap, overDriven, peakGripUse: corner.peakGripUse });
    else if (braking <= -options.brakingPointM && corner.driverBrakingPointM === null)
      clauses.push({ kind: 'lifts-before-braking-point', ...gap });
    else if (braking <= -options.brakingPointM)
      clauses.push({ kind: 'brakes-early', ...gap, brakingPointDeltaS: corner.brakingPointDeltaS });
    else if (braking >= options.brakingPointM) clauses.push({ kind: 'brakes-late', ...gap });
  }
  const lift = corner.liftPointDeltaM ?? null;
  if (braking === null && corner.driverLiftPointM !== null && corner.driverLiftPointM !== undefined) {
    if (lift === null) clauses.push({ kind: 'lifts-where-flat', liftSpeedMps: kphToMps(corner.entrySpeedDriverKph) });
    else if (lift <= -options.brakingPointM) clauses.push({ kind: 'lifts-early', liftPointDeltaM: lift });
  }
  const coastingBeyond = (corner.coastingS ?? 0) - (corner.referenceCoastingS ?? 0);
  if (corner.coastingS !== null && coastingBeyond >= options.coastingS)
    clauses.push({ kind: 'coasts', coastingS: corner.coastingS });
  if (underSpeed)
    clauses.push({
      kind: 'slowest-point-low',
      minSpeedDeltaMps: kphToMps(corner.minSpeedDeltaKph),
      referenceMinSpeedMps: kphToMps(corner.minSpeedReferenceKph),
    });
  const referenceOffset = corner.referenceMinSpeedOffsetFromApexM ?? 0;
  if (Math.abs(corner.minSpeedOffsetFromApexM - referenceOffset) >= 5)
    clauses.push({
      kind: 'slowest-point-misplaced',
      minSpeedOffsetFromApexM: corner.minSpeedOffsetFromApexM,
      referenceMinSpeedOffsetFromApexM: referenceOffset,
    });
  const exitDeltaKph = corner.exitSpeedDriverKph - corner.exitSpeedReferenceKph;
  if (exitDeltaKph <= -options.speedKph) clauses.push({ kind: 'exit-slow', exitSpeedDeltaMps: kphToMps(exitDeltaKph) });
  const unusedM = corner.stretches.filter((s) => s.kind === 'unused').reduce((sum, s) => sum + stretchLength(s), 0);
  if (unusedM >= 10) clauses.push({ kind: 'grip-unused', unusedLengthM: unusedM });
  if (overDriven && clauses[0]?.kind !== 'brakes-late-and-hard')
    clauses.push({ kind: 'over-the-limit', peakGripUse: corner.peakGripUse });
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
    entryTimeLostS: corner.entryTimeLostS,
    middleTimeLostS: corner.middleTimeLostS,
    exitTimeLostS: corner.exitTimeLostS,
  };
}

/** A corner's finding: its main cause (or where its time goes), then up to two further observations. */
export function cornerFinding(corner: CornerComparison, options: FindingOptions = DEFAULT_FINDING_OPTIONS): Finding {
  const clauses = cornerClaims(corner, options);
  return {
    corner: corner.id,
    cornerName: corner.name,
    timeS: corner.timeLostS,
    claims: clauses.length > 0 ? clauses.slice(0, 3) : [phaseClaim(corner)],
  };
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
    .map((corner) => cornerFinding(corner, options));
}
