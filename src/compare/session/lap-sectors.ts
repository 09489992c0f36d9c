// A lap's sector times: its clock where each sector of the track's layout (../../track/corner-layout.ts: the
// corners file's sectors, else three equal thirds) begins and ends. The sectors tile the lap, so they add up to it.

import type { TrackGrid } from '../../track/types.js';
import type { TrackSector } from '../../track/corner-layout.js';
import { clockBetween } from '../against/lap-corner.js';
import type { PairLap } from '../against/pair-lap.js';

export function sectorTimesS(lap: PairLap, sectors: readonly TrackSector[], track: TrackGrid): number[] {
  const toIndex = (atM: number) => atM / track.stepM;
  return sectors.map(
    (sector) =>
      clockBetween(lap, toIndex(sector.endM), track.closed) - clockBetween(lap, toIndex(sector.startM), track.closed),
  );
}
