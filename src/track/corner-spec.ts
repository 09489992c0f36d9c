// A corner layout given by the user (a corners file, edited: corners renamed, merged, split, markers and sectors
// added) checked against the track and turned into the same spans the curvature detection gives.

import { InputError } from '../errors.js';
import type { TrackGrid } from './types.js';
import type { CornerSpan } from './corners.js';
import type { CornerLayout, TrackSector } from './corner-layout.js';
import { equalThirds } from './corner-layout.js';
import { wrapIndex } from '../numeric/lap-index.js';

/** The `format` key of every corners file, so a file of another kind is refused with a clear message. */
export const CORNERS_FORMAT = 'reflap corners 1';

export interface CornerSpecEntry {
  number?: number | undefined;
  name?: string | null | undefined;
  entryM: number;
  apexM: number;
  exitM: number;
  marker?: { name: string; atM: number } | undefined;
}

export interface CornerSpec {
  corners: CornerSpecEntry[];
  sectors?: { name?: string | undefined; startM: number }[] | undefined;
}

const fixed = (m: number) => `${Number(m.toFixed(1))} m`;

/** Builds the layout; each problem is one line naming the file and the entry (corners[k] or sectors[k]). */
export function cornerLayoutFromSpec(track: TrackGrid, spec: CornerSpec, source: string): CornerLayout {
  const L = track.lengthM;
  const n = track.distanceM.length;
  const step = track.stepM;
  // Half a step of slack: a file written at one grid step is read back at another.
  const slackM = track.stepM / 2 + 1e-6;
  const inside = (m: number) => m >= -slackM && m <= L + slackM;
  const clamp = (m: number) => Math.min(Math.max(m, 0), track.closed ? L - 1e-9 : L);
  const numbers = new Set<number>();
  const spans: { span: CornerSpan; row: number; startM: number; endM: number }[] = [];
  spec.corners.forEach((entry, row) => {
    const where = `${source}: corners[${row}]`;
    for (const key of ['entryM', 'apexM', 'exitM'] as const) {
      if (!inside(entry[key]))
        throw new InputError(`${where}: ${key} ${fixed(entry[key])} falls outside the track (0 to ${fixed(L)})`);
    }
    const number = entry.number ?? row + 1;
    if (numbers.has(number)) throw new InputError(`${where}: corner number ${number} is used twice`);
    numbers.add(number);
    const entryM = clamp(entry.entryM);
    let apexM = clamp(entry.apexM);
    let exitM = clamp(entry.exitM);
    // A corner across the start line of a closed track runs past its length.
    const wraps = exitM < entryM;
    if (wraps && !track.closed)
      throw new InputError(`${where}: exitM ${fixed(exitM)} comes before entryM ${fixed(entryM)} on an open track`);
    if (wraps) exitM += L;
    if (apexM < entryM && wraps) apexM += L;
    if (apexM < entryM || apexM > exitM)
      throw new InputError(`${where}: apexM ${fixed(entry.apexM)} is not between entryM and exitM`);
    let entryIndex = Math.round(entryM / step);
    let exitIndex = Math.round(exitM / step);
    let apexIndex = Math.round(apexM / step);
    // Unwrapped as the detection gives them: the apex on the grid, the ends around it.
    if (apexIndex >= n) {
      apexIndex -= n;
      entryIndex -= n;
      exitIndex -= n;
    }
    let peak = 0;
    let turn = 0;
    for (let j = entryIndex; j <= exitIndex; j++) {
      const kappa = track.curvaturePerM[wrapIndex(j, n)]!;
      if (Math.abs(kappa) > peak) peak = Math.abs(kappa);
      turn += kappa;
    }
    const marker = entry.marker;
    if (marker && !inside(marker.atM))
      throw new InputError(`${where}: marker.atM ${fixed(marker.atM)} falls outside the track (0 to ${fixed(L)})`);
    spans.push({
      row,
      startM: entryM,
      endM: exitM,
      span: {
        id: number,
        name: entry.name ?? null,
        side: turn >= 0 ? 1 : -1,
        entryIndex,
        apexIndex,
        exitIndex,
        entryM,
        apexM: apexIndex * step,
        exitM: exitM >= L ? exitM - L : exitM,
        peakCurvaturePerM: peak,
        radiusM: peak > 0 ? 1 / peak : Infinity,
        marker: marker ? { name: marker.name, atM: clamp(marker.atM) } : null,
      },
    });
  });
  const ordered = [...spans].sort((a, b) => a.startM - b.startM);
  for (let k = 0; k + 1 < ordered.length; k++) {
    const a = ordered[k]!;
    const b = ordered[k + 1]!;
    if (a.endM > b.startM)
      throw new InputError(`${source}: corners[${b.row}]: overlaps corners[${a.row}] (they share ${fixed(b.startM)})`);
  }
  const first = ordered[0];
  const last = ordered[ordered.length - 1];
  if (first && last && last !== first && track.closed && last.endM - L > first.startM)
    throw new InputError(`${source}: corners[${last.row}]: overlaps corners[${first.row}] across the start line`);
  return {
    corners: spans.map((s) => s.span).sort((a, b) => a.apexIndex - b.apexIndex),
    sectors: spec.sectors ? sectorsFromSpec(spec.sectors, L, source) : equalThirds(L),
    source,
  };
}

function sectorsFromSpec(sectors: NonNullable<CornerSpec['sectors']>, L: number, source: string): TrackSector[] {
  if (sectors.length === 0) throw new InputError(`${source}: sectors: give at least one sector, or leave the key out`);
  sectors.forEach((sector, row) => {
    const where = `${source}: sectors[${row}]`;
    if (row === 0 && sector.startM !== 0) throw new InputError(`${where}: the first sector must start at 0 m`);
    if (sector.startM < 0 || sector.startM >= L)
      throw new InputError(`${where}: startM ${fixed(sector.startM)} falls outside the track (0 to ${fixed(L)})`);
    if (row > 0 && sector.startM <= sectors[row - 1]!.startM)
      throw new InputError(`${where}: startM ${fixed(sector.startM)} does not come after the previous sector's`);
  });
  return sectors.map((sector, k) => ({
    number: k + 1,
    name: sector.name ?? `S${k + 1}`,
    startM: sector.startM,
    endM: sectors[k + 1]?.startM ?? L,
  }));
}
