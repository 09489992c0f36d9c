// Gives each braking zone of a lap to the corner it serves, in the track's one corner numbering, so a braking
// point reads the same in the reference, a what-if, a sweep and a comparison.

import type { TrackGrid } from '../track/types.js';
import { cornerLayoutOf, cornerServedBy, metresBeforeM } from '../track/corner-layout.js';
import type { BrakingZone, CornerZone } from './types.js';

export function zonesByCorner(zones: readonly BrakingZone[], track: TrackGrid): CornerZone[] {
  const layout = cornerLayoutOf(track);
  const seen = new Map<number, number>();
  return zones.map((zone, index) => {
    const corner = cornerServedBy(zone.minSpeedAtM, layout, track);
    if (!corner)
      return { ...zone, corner: 0, cornerName: null, tag: `z${index + 1}`, turnInM: null, beforeTurnInM: null };
    const count = (seen.get(corner.id) ?? 0) + 1;
    seen.set(corner.id, count);
    const suffix = count === 1 ? '' : String.fromCharCode(96 + Math.min(count, 26));
    return {
      ...zone,
      corner: corner.id,
      cornerName: corner.name,
      tag: `c${corner.id}${suffix}`,
      turnInM: corner.entryM,
      beforeTurnInM: metresBeforeM(zone.startM, corner.entryM, track),
    };
  });
}
