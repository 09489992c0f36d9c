// The transient check as the simulate command shows it: a few summary lines, and a JSON record.
// The axle-saturation stretches are merged for reading: a driver thinks of one corner, not of its flickers.

import { roundedNumbers } from './json-numbers.js';
import type { SaturationZone, TransientCheck } from '../solve/transient.js';
import { formatLapTime } from '../units.js';
import { noteText } from './note-text.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

/** Stretches closer than this are one event for a reader (a flicker below the threshold mid-corner). */
const MERGE_GAP_M = 10;
/** Stretches shorter than this round to "1758-1758 m" and say nothing. */
const SHORTEST_SHOWN_M = 1;
/** The longest few are listed; the rest are counted. */
const LISTED_STRETCHES = 5;

/** Merges saturation stretches less than `gapM` apart (axles joined) and drops those shorter than `shortestM`. */
export function mergedSaturation(
  zones: readonly SaturationZone[],
  gapM = MERGE_GAP_M,
  shortestM = SHORTEST_SHOWN_M,
): SaturationZone[] {
  const merged: SaturationZone[] = [];
  for (const zone of zones) {
    const last = merged[merged.length - 1];
    if (last && zone.fromM - last.toM < gapM) {
      merged[merged.length - 1] = {
        fromM: last.fromM,
        toM: Math.max(last.toM, zone.toM),
        axle: last.axle === zone.axle ? last.axle : 'both',
        peakUse: Math.max(last.peakUse, zone.peakUse),
      };
    } else {
      merged.push({ ...zone });
    }
  }
  return merged.filter((zone) => zone.toM - zone.fromM >= shortestM);
}

function axleWords(axle: SaturationZone['axle']): string {
  return axle === 'both' ? 'both axles' : `${axle} axle`;
}

/** The check in a few lines, distances and speeds in the reader's units. */
export function transientSummaryText(check: TransientCheck, units: DisplayUnits = displayUnits('metric')): string {
  const at = phrasing(units).distance;
  const lines = [
    `Transient check (single-track model, driver model following the reference): ${noteText(check.verdict, units)}`,
  ];
  if (check.completed) {
    const delta = check.followedLapTimeS - check.referenceLapTimeS;
    lines.push(
      `  followed lap ${formatLapTime(check.followedLapTimeS)} (${delta >= 0 ? '+' : ''}${delta.toFixed(3)} s on the reference)`,
    );
  }
  const limit =
    check.deviationLimitSource === 'fixed'
      ? 'a fixed limit (the track gives no widths)'
      : `the room to the edge (${check.deviationLimitSource})`;
  // The verdict of a completed run already names the place where the most room is used; the largest deviation
  // gets its own line only where it is elsewhere, or when the run did not complete.
  const samePlace = Math.round(check.maxDeviationAtM) === Math.round(check.maxDeviationShareAtM);
  if (!check.completed || !samePlace) {
    lines.push(
      `  largest deviation ${at(check.maxDeviationM, 2)} at ${at(check.maxDeviationAtM)}; most of ${limit} used: ${(100 * check.maxDeviationShare).toFixed(0)} % at ${at(check.maxDeviationShareAtM)}`,
    );
  }
  lines.push(`  largest steer ${check.maxSteerDeg.toFixed(1)} deg (road wheels)`);
  const stretches = mergedSaturation(check.saturation);
  if (stretches.length === 0) {
    lines.push('  no axle saturates');
  } else {
    const longest = [...stretches]
      .sort((a, b) => b.toM - b.fromM - (a.toM - a.fromM))
      .slice(0, LISTED_STRETCHES)
      .sort((a, b) => a.fromM - b.fromM);
    lines.push(
      `  axle saturation in ${stretches.length} stretch${stretches.length === 1 ? '' : 'es'}${stretches.length > longest.length ? `; the ${longest.length} longest` : ''}:`,
    );
    for (const zone of longest) {
      lines.push(
        `    ${units.distance(zone.fromM).toFixed(0)}-${at(zone.toM)}  ${axleWords(zone.axle)} (peak use ${zone.peakUse.toFixed(2)})`,
      );
    }
    const rest = stretches.length - longest.length;
    if (rest > 0) lines.push(`    ... and ${rest} shorter stretch${rest === 1 ? '' : 'es'}`);
  }
  return lines.join('\n') + '\n';
}

export function transientJson(check: TransientCheck) {
  return roundedNumbers({
    completed: check.completed,
    drivable: check.drivable,
    verdict: noteText(check.verdict),
    referenceLapTimeS: check.referenceLapTimeS,
    followedLapTimeS: check.completed ? check.followedLapTimeS : null,
    maxDeviationM: check.maxDeviationM,
    maxDeviationAtM: check.maxDeviationAtM,
    deviationLimitSource: check.deviationLimitSource,
    maxDeviationShare: check.maxDeviationShare,
    maxDeviationShareAtM: check.maxDeviationShareAtM,
    deviationAtShareM: check.deviationAtShareM,
    roomAtShareM: check.roomAtShareM,
    speedAtShareMps: check.speedAtShareMps,
    referenceSpeedAtShareMps: check.referenceSpeedAtShareMps,
    maxSteerDeg: check.maxSteerDeg,
    saturation: check.saturation,
  });
}
