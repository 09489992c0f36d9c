// The corners of a track for people and for editing: a table for the terminal, and the corners file (JSON) a
// user edits (rename, merge, split, add markers and sectors) and passes back with --corners.

import type { TrackGrid } from '../track/types.js';
import type { CornerLayout } from '../track/corner-layout.js';
import { CORNERS_FORMAT } from '../track/corner-spec.js';
import { formatTable } from './text-table.js';
import { roundToDigits } from '../numeric/round.js';

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

export function cornersText(track: TrackGrid, layout: CornerLayout): string {
  const found = layout.source === 'curvature' ? 'found from the curvature' : `from ${layout.source}`;
  const lines = [
    `${track.name} · ${(track.lengthM / 1000).toFixed(3)} km · ${layout.corners.length} corners ${found}`,
    formatTable(
      ['#', 'name', 'direction', 'entry m', 'apex m', 'exit m', 'radius m', 'marker'],
      layout.corners.map((c) => [
        String(c.id),
        c.name ?? '',
        c.side > 0 ? 'left' : 'right',
        c.entryM.toFixed(0),
        c.apexM.toFixed(0),
        c.exitM.toFixed(0),
        Number.isFinite(c.radiusM) ? c.radiusM.toFixed(0) : '',
        c.marker ? `${c.marker.name} at ${c.marker.atM.toFixed(0)} m` : '',
      ]),
    ),
    '',
    'Sectors',
    formatTable(
      ['#', 'name', 'from m', 'to m'],
      layout.sectors.map((s) => [String(s.number), s.name, s.startM.toFixed(0), s.endM.toFixed(0)]),
    ),
  ];
  return lines.join('\n') + '\n';
}
