// The corners of a track for people and for editing: a table for the terminal, and the corners file (JSON) a
// user edits (rename, merge, split, add markers and sectors) and passes back with --corners. The table is in the
// reader's units (metres or feet, the lap's length in km or miles); the file stays in metres.

import type { TrackGrid } from '../track/types.js';
import type { CornerLayout } from '../track/corner-layout.js';
import { CORNERS_FORMAT } from '../track/corner-spec.js';
import { formatTable } from './text-table.js';
import { roundToDigits } from '../numeric/round.js';
import { displayUnits, type DisplayUnits } from './units.js';

/** The track's corners as the corners command and every JSON output list them. */
export function cornersJson(layout: CornerLayout) {
  return layout.corners.map((c) => ({
    number: c.id,
    name: c.name,
    direction: c.side > 0 ? 'left' : 'right',
    entryM: roundToDigits(c.entryM, 1),
    apexM: roundToDigits(c.apexM, 1),
    exitM: roundToDigits(c.exitM, 1),
    radiusM: Number.isFinite(c.radiusM) ? roundToDigits(c.radiusM, 1) : null,
    ...(c.marker ? { marker: { name: c.marker.name, atM: roundToDigits(c.marker.atM, 1) } } : {}),
  }));
}

export function cornersFileJson(track: TrackGrid, layout: CornerLayout) {
  return {
    format: CORNERS_FORMAT,
    track: track.name,
    lengthM: roundToDigits(track.lengthM, 1),
    corners: cornersJson(layout),
    sectors: layout.sectors.map((s) => ({ name: s.name, startM: roundToDigits(s.startM, 1) })),
  };
}

export function cornersText(
  track: TrackGrid,
  layout: CornerLayout,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const found = layout.source === 'curvature' ? 'found from the curvature' : `from ${layout.source}`;
  const d = units.distanceLabel;
  const at = (distanceM: number) => units.distance(distanceM).toFixed(0);
  const lines = [
    `${track.name} · ${units.length(track.lengthM).toFixed(3)} ${units.lengthLabel} · ${layout.corners.length} corners ${found}`,
    formatTable(
      ['#', 'name', 'direction', `entry ${d}`, `apex ${d}`, `exit ${d}`, `radius ${d}`, 'marker'],
      layout.corners.map((c) => [
        String(c.id),
        c.name ?? '',
        c.side > 0 ? 'left' : 'right',
        at(c.entryM),
        at(c.apexM),
        at(c.exitM),
        Number.isFinite(c.radiusM) ? at(c.radiusM) : '',
        c.marker ? `${c.marker.name} at ${at(c.marker.atM)} ${d}` : '',
      ]),
    ),
    '',
    'Sectors',
    formatTable(
      ['#', 'name', `from ${d}`, `to ${d}`],
      layout.sectors.map((s) => [String(s.number), s.name, at(s.startM), at(s.endM)]),
    ),
  ];
  return lines.join('\n') + '\n';
}
