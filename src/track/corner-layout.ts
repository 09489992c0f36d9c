// One corner identity per track: the corners and sectors every command and report numbers the same way, found
// once from the curvature (corners.ts) or given by a corners file the user edited, and the braking zones each
// corner owns.

import type { TrackGrid } from './types.js';
import { detectCorners, type CornerSpan } from './corners.js';

export interface TrackSector {
  /** 1-based, in running order from the start line. */
  number: number;
  name: string;
  /** Stations on the lap, m; endM of the last sector is the lap length. */
  startM: number;
  endM: number;
}

export interface CornerLayout {
  corners: CornerSpan[];
  sectors: TrackSector[];
  /** Where the corners came from: found from the curvature, or read from a corners file (its name). */
  source: string;
}

const detected = new WeakMap<TrackGrid, CornerLayout>();

/** Three equal thirds: the split a track without its own sectors gets (common practice, no source). */
export function equalThirds(lengthM: number): TrackSector[] {
  return [1, 2, 3].map((number) => ({
    number,
    name: `S${number}`,
    startM: ((number - 1) * lengthM) / 3,
    endM: (number * lengthM) / 3,
  }));
}

/**
 * The track's corners and sectors: those the track carries (from a corners file), else the corners found from
 * the curvature and three equal sectors, found once per grid so every caller sees the same numbers.
 */
export function cornerLayoutOf(track: TrackGrid): CornerLayout {
  if (track.cornerLayout) return track.cornerLayout;
  let layout = detected.get(track);
  if (!layout) {
    layout = { corners: detectCorners(track), sectors: equalThirds(track.lengthM), source: 'curvature' };
    detected.set(track, layout);
  }
  return layout;
}

/** The same track carrying this layout, so every command that receives it uses these corners. */
export function withCornerLayout(track: TrackGrid, layout: CornerLayout): TrackGrid {
  return { ...track, cornerLayout: layout };
}

/** Distance from a station to the span [startM, endM] (0 inside it), m. */
function outsideSpanM(atM: number, startM: number, endM: number): number {
  return atM < startM ? startM - atM : atM > endM ? atM - endM : 0;
}

/** Distance from a station to a corner's span (0 inside it), m, around the start line on a closed lap. Called for
 * every corner and braking zone of every lap solved, so it allocates nothing. */
function distanceToSpanM(atM: number, corner: CornerSpan, track: TrackGrid): number {
  const startM = corner.entryIndex * track.stepM;
  const endM = corner.exitIndex * track.stepM;
  const here = outsideSpanM(atM, startM, endM);
  if (!track.closed) return here;
  const lapM = track.lengthM;
  return Math.min(outsideSpanM(atM - lapM, startM, endM), here, outsideSpanM(atM + lapM, startM, endM));
}

/** The corner a braking zone serves: the one whose span holds its slowest point, else the nearest span. */
export function cornerServedBy(minSpeedAtM: number, layout: CornerLayout, track: TrackGrid): CornerSpan | null {
  let best: CornerSpan | null = null;
  let bestDistance = Infinity;
  for (const corner of layout.corners) {
    const d = distanceToSpanM(minSpeedAtM, corner, track);
    if (d < bestDistance) {
      bestDistance = d;
      best = corner;
    }
  }
  return best;
}

/** The sector holding a station. */
export function sectorAt(atM: number, layout: CornerLayout): TrackSector | null {
  for (const sector of layout.sectors) if (atM >= sector.startM && atM < sector.endM) return sector;
  return layout.sectors[layout.sectors.length - 1] ?? null;
}

/** A corner as people read it: its number, and its name where the track gives one ('7 Hollow Bend'). */
export function cornerLabel(corner: { id: number; name: string | null }): string {
  return corner.name ? `${corner.id} ${corner.name}` : String(corner.id);
}

/**
 * Metres from a braking point forward to a place on the lap (the corner's turn-in or a marker), positive when
 * the braking point lies before it; around the start line on a closed lap.
 */
export function metresBeforeM(pointM: number, placeM: number, track: TrackGrid): number {
  let d = placeM - pointM;
  if (track.closed) {
    const L = track.lengthM;
    while (d > L / 2) d -= L;
    while (d <= -L / 2) d += L;
  }
  return d;
}

/** A braking zone as people read it: its corner tag and the corner's name where the track gives one ('c7 Hollow Bend'). */
export function zoneLabel(zone: { tag: string; name: string | null }): string {
  return zone.name ? `${zone.tag} ${zone.name}` : zone.tag;
}
