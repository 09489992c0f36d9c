// The sentences of the comparison's findings, composed from their records (src/compare/findings.ts) in the units a
// person reads: km/h and metres, or mph and feet. Time stays in seconds and grip in per cent in both.

import type { Claim, Finding } from '../compare/types.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

const METRIC = displayUnits('metric');

/** A corner as a finding names it: 'corner 3 (Quillon Bend)', or 'corner 3' where the track gives no name. */
export function findingCornerLabel(corner: { id: number; name: string | null }): string {
  return corner.name ? `corner ${corner.id} (${corner.name})` : `corner ${corner.id}`;
}

const percent = (share: number) => `${(share * 100).toFixed(0)} %`;

/** One clause of a finding as words. */
export function claimText(claim: Claim, units: DisplayUnits = METRIC): string {
  const say = phrasing(units);
  switch (claim.kind) {
    case 'brakes-late-and-hard': {
      const how = claim.overDriven
        ? `grip use peaks at ${percent(claim.peakGripUse)} of the envelope`
        : 'the car is slowed too far';
      return `braking begins ${say.distance(claim.brakingPointDeltaM)} after the reference at ${say.speed(claim.brakingSpeedMps)} and too hard: ${how}`;
    }
    case 'lifts-before-braking-point':
      return `the lift comes ${say.distance(claim.brakingPointDeltaM)} before the reference's braking point at ${say.speed(claim.brakingSpeedMps)}`;
    case 'brakes-early': {
      const seconds =
        claim.brakingPointDeltaS === null ? '' : ` (${Math.abs(claim.brakingPointDeltaS).toFixed(2)} s at that speed)`;
      return `braking begins ${say.distance(claim.brakingPointDeltaM)} before the reference at ${say.speed(claim.brakingSpeedMps)}${seconds}`;
    }
    case 'brakes-late':
      return `braking begins ${say.distance(claim.brakingPointDeltaM)} after the reference at ${say.speed(claim.brakingSpeedMps)}`;
    case 'lifts-where-flat':
      return `the throttle comes off at ${say.speed(claim.liftSpeedMps)} where the reference stays flat out`;
    case 'lifts-early':
      return `the lift comes ${say.distance(claim.liftPointDeltaM)} before the reference's`;
    case 'coasts':
      return `${claim.coastingS.toFixed(1)} s spent coasting with neither pedal pressed`;
    case 'slowest-point-low':
      return `the slowest point is ${say.speed(claim.minSpeedDeltaMps)} under the reference's ${say.signedSpeed(claim.referenceMinSpeedMps)}`;
    case 'slowest-point-misplaced': {
      const side = claim.minSpeedOffsetFromApexM >= 0 ? 'after' : 'before';
      return `the slowest point falls ${say.distance(claim.minSpeedOffsetFromApexM)} ${side} the apex (reference ${say.signedDistance(claim.referenceMinSpeedOffsetFromApexM)})`;
    }
    case 'exit-slow':
      return `the exit is ${say.speed(claim.exitSpeedDeltaMps)} slower`;
    case 'grip-unused':
      return `grip is left unused over ${say.distance(claim.unusedLengthM)} where the reference is on the limit`;
    case 'over-the-limit':
      return `grip use reaches ${percent(claim.peakGripUse)} of the envelope (sliding or locking)`;
    case 'loses-in-entry':
    case 'loses-in-middle':
    case 'loses-in-exit':
      return `most of the time goes in the ${claim.kind.slice('loses-in-'.length)} phase (entry ${claim.entryTimeLostS.toFixed(2)} s, middle ${claim.middleTimeLostS.toFixed(2)} s, exit ${claim.exitTimeLostS.toFixed(2)} s)`;
  }
}

/** One line for a finding: the corner, its main cause, the time at stake, then its further observations. */
export function findingText(finding: Finding, units: DisplayUnits = METRIC): string {
  const [main, ...rest] = finding.claims.map((claim) => claimText(claim, units));
  const where =
    finding.corner === null ? 'the whole lap' : findingCornerLabel({ id: finding.corner, name: finding.cornerName });
  const worth = `worth about ${finding.timeS.toFixed(2)} s`;
  return `${where}: ${main ?? 'no single cause'}, ${worth}${rest.length > 0 ? `; ${rest.join('; ')}` : ''}.`;
}
