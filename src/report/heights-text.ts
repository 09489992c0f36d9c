// What `reflap heights` says of the height profile it built: its range, smoothing and accuracy, in the reader's
// units (metres, or feet under --units imperial; the written track's z_m column stays in metres).

import type { HeightProfile } from '../track/height-profile.js';
import type { TrackGrid } from '../track/types.js';
import { displayUnits, phrasing, type DisplayUnits } from './units.js';

export function heightsText(
  track: TrackGrid,
  profile: HeightProfile,
  out: string,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const length = phrasing(units).distance;
  let low = Infinity;
  let high = -Infinity;
  for (const z of profile.zM) {
    low = Math.min(low, z);
    high = Math.max(high, z);
  }
  const laps = profile.laps === 1 ? '1 whole lap' : `${profile.laps} whole laps`;
  const lapPart = Number.isFinite(profile.lapErrorM)
    ? `; the laps' own profiles, set against each other, leave ±${length(profile.lapErrorM, 2)}`
    : '; under two whole laps, so the drift of the GPS height over time is not measured';
  return (
    `Height profile of ${track.name} from ${profile.fixes} GPS fixes (${laps}): ${length(high - low, 1)} from lowest to highest, ` +
    `smoothed over ${length(profile.smoothingM, 0)}.\n` +
    `Accuracy about ±${length(profile.accuracyM, 2)} (one standard error): the fixes scatter by ${length(profile.scatterM, 2)} about the profile, ` +
    `which leaves ±${length(profile.independentErrorM, 2)} if their errors were independent${lapPart}. ` +
    `The heights are above the receiver's own datum; the grades are what the solver uses.\n` +
    (profile.emptyStations > 0
      ? `${profile.emptyStations} of ${track.distanceM.length} stations had no fix and were filled in by the smoothing.\n`
      : '') +
    `Track with heights (z_m) written to ${out}\n`
  );
}
