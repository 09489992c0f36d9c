// The sentences of the lap-against-lap findings (src/compare/against/against-findings.ts) in the units a person
// reads: which lap is quicker in a corner, what it does differently with both laps' numbers, and whether copying it
// is enough. Speeds and distances follow the units; seconds and g stay.

import type { AgainstFinding, Difference } from '../compare/against/against-findings.js';
import { mps2ToG } from '../units.js';
import { findingCornerLabel } from './finding-phrases.js';
import { displayUnits, phrasing, type DisplayUnits, type Phrasing } from './units.js';

const g = (mps2: number) => `${mps2ToG(mps2).toFixed(2)} g`;

/** Where a point falls against the apex: at it (within half a metre), or a distance before or after it. */
function apexPlace(say: Phrasing, fromApexM: number): string {
  return Math.abs(fromApexM) < 0.5
    ? 'at the apex'
    : `${say.distance(fromApexM)} ${fromApexM > 0 ? 'after' : 'before'} the apex`;
}

/** One difference as words, the quicker lap's number first. */
export function differenceText(difference: Difference, units: DisplayUnits = displayUnits('metric')): string {
  const say = phrasing(units);
  switch (difference.kind) {
    case 'braking-point': {
      const { laterM } = difference;
      return `brakes ${say.distance(laterM)} ${laterM > 0 ? 'later' : 'earlier'} (${say.signedDistance(difference.fastBeforeTurnInM)} before the turn-in against ${say.signedDistance(difference.slowBeforeTurnInM)})`;
    }
    case 'does-without-brake':
      return 'does without the brake where the other lap brakes';
    case 'brakes-where-other-lifts':
      return 'brakes where the other lap only lifts';
    case 'peak-braking':
      return `brakes ${difference.harderMps2 > 0 ? 'harder' : 'more gently'} at its peak (${g(difference.fastPeakMps2)} against ${g(difference.slowPeakMps2)})`;
    case 'brake-build':
      return `builds the braking ${difference.soonerS > 0 ? 'faster' : 'more slowly'} (${difference.fastBuildS.toFixed(2)} s to the peak against ${difference.slowBuildS.toFixed(2)} s)`;
    case 'brake-release': {
      const deeper = difference.deeperM > 0;
      return `${deeper ? 'trails the brake' : 'releases the brake'} ${say.distance(difference.deeperM)} ${deeper ? 'further into the corner' : 'sooner'} (off ${apexPlace(say, difference.fastFromApexM)} against ${apexPlace(say, difference.slowFromApexM)})`;
    }
    case 'slowest-speed': {
      const more = difference.moreMps > 0;
      return `${more ? 'carries' : 'is'} ${say.speed(difference.moreMps)} ${more ? 'more' : 'slower'} at the slowest point (${say.signedSpeed(difference.fastMinSpeedMps)} against ${say.signedSpeed(difference.slowMinSpeedMps)})`;
    }
    case 'slowest-place':
      return `is slowest ${apexPlace(say, difference.fastFromApexM)} against ${apexPlace(say, difference.slowFromApexM)}`;
    case 'exit-speed':
      return `exits ${say.speed(difference.fasterMps)} ${difference.fasterMps > 0 ? 'faster' : 'slower'} (${say.signedSpeed(difference.fastExitSpeedMps)} against ${say.signedSpeed(difference.slowExitSpeedMps)})`;
    case 'coasting':
      return `coasts ${Math.abs(difference.lessS).toFixed(1)} s ${difference.lessS > 0 ? 'less' : 'more'}`;
  }
}

/** Where the quicker lap gains most, for a corner no difference describes. */
function phaseText(finding: AgainstFinding): string {
  const phases = [
    ['entry', Math.abs(finding.entryTimeLostS)],
    ['middle', Math.abs(finding.middleTimeLostS)],
    ['exit', Math.abs(finding.exitTimeLostS)],
  ] as const;
  const most = phases.reduce((a, b) => (b[1] > a[1] ? b : a));
  return `gains most in the ${most[0]} (entry ${finding.entryTimeLostS.toFixed(2)} s, middle ${finding.middleTimeLostS.toFixed(2)} s, exit ${finding.exitTimeLostS.toFixed(2)} s)`;
}

/** One line for a corner: the quicker lap, by how much, what it does differently, and how near the reference it is. */
export function againstFindingText(finding: AgainstFinding, units: DisplayUnits = displayUnits('metric')): string {
  const { fastLabel, toReferenceS } = finding;
  const what =
    finding.differences.length > 0
      ? finding.differences.map((difference) => differenceText(difference, units)).join(', ')
      : phaseText(finding);
  const near = finding.nearReference
    ? `${fastLabel} is itself within ${Math.max(0, toReferenceS).toFixed(2)} s of the reference here, so copying it is enough`
    : `${fastLabel} itself still leaves ${toReferenceS.toFixed(2)} s to the reference here, so copying it is not the whole answer`;
  const label = findingCornerLabel({ id: finding.corner, name: finding.cornerName });
  return `${label}: ${fastLabel} is ${Math.abs(finding.timeS).toFixed(2)} s quicker here; it ${what}; ${near}.`;
}
