// The transient check as the simulate command shows it: a few summary lines, and a JSON record.

import type { TransientCheck } from '../solve/transient.js';
import { formatLapTime } from '../units.js';

export function transientSummaryText(check: TransientCheck): string {
  const lines = [`Transient check (single-track model, driver model following the reference): ${check.verdict}`];
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
  lines.push(
    `  largest deviation ${check.maxDeviationM.toFixed(2)} m at ${check.maxDeviationAtM.toFixed(0)} m; against ${limit}: ${(100 * check.maxDeviationShare).toFixed(0)} % at ${check.maxDeviationShareAtM.toFixed(0)} m`,
  );
  lines.push(`  largest steer ${check.maxSteerDeg.toFixed(1)} deg (road wheels)`);
  if (check.saturation.length === 0) lines.push('  no axle saturates');
  for (const zone of check.saturation.slice(0, 12)) {
    lines.push(
      `  ${zone.axle === 'both' ? 'both axles' : `${zone.axle} axle`} saturated ${zone.fromM.toFixed(0)}-${zone.toM.toFixed(0)} m (peak use ${zone.peakUse.toFixed(2)})`,
    );
  }
  if (check.saturation.length > 12) lines.push(`  ... and ${check.saturation.length - 12} more stretches`);
  return lines.join('\n') + '\n';
}

export function transientJson(check: TransientCheck) {
  return {
    completed: check.completed,
    drivable: check.drivable,
    verdict: check.verdict,
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
  };
}
