// One check of a track grid (and of a path driven on it) for the library's entry points: a script that builds or
// changes a grid in code gets an InputError naming the field and the sample, never a TypeError or a NaN lap.
// The readers build grids that pass by construction; this guards records that did not come from them.

import { isRecord } from '../is-record.js';
import { InputError } from '../errors.js';
import type { Path, TrackGrid } from './types.js';

/** Tighter than any car turns: a radius under 0.5 m (segment tracks stop at 1 m, segments.ts). */
export const MAX_GRID_CURVATURE_PER_M = 2;
/** Heights and widths beyond a few kilometres are a unit mix-up, not a circuit (from memory: no circuit climbs 1 km). */
const MAX_EXTENT_M = 1e7;

/** Grids checked already: a sweep simulates one grid thousands of times, and the check costs a pass over it. */
const checkedGrids = new WeakSet<object>();

function firstBadSample(values: Float64Array, limit: number, nonNegative: boolean): number {
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!(Math.abs(v) <= limit) || (nonNegative && v < 0)) return i;
  }
  return -1;
}

function checkSamples(
  record: Record<string, unknown>,
  field: string,
  count: number,
  limit: number,
  problems: string[],
  { optional = false, nonNegative = false } = {},
): void {
  const values = record[field];
  if (optional && (values === null || values === undefined)) return;
  if (!(values instanceof Float64Array)) {
    problems.push(`field ${field} must be a Float64Array`);
    return;
  }
  if (values.length !== count) {
    problems.push(`field ${field} has ${values.length} samples where ${count} are needed`);
    return;
  }
  const bad = firstBadSample(values, limit, nonNegative);
  if (bad >= 0)
    problems.push(
      `field ${field} at sample ${bad} must be ${nonNegative ? 'between 0 and' : 'within +/-'} ${limit} (got ${values[bad]})`,
    );
}

/** Every problem of a track grid, as message parts; empty when it can be driven. */
export function trackGridProblems(track: unknown): string[] {
  if (!isRecord(track)) return [`a track must be a grid record (got ${track === null ? 'null' : typeof track})`];
  const problems: string[] = [];
  if (typeof track['closed'] !== 'boolean') problems.push('field closed must be true or false');
  const stepM = track['stepM'];
  if (!(typeof stepM === 'number' && stepM > 0 && stepM <= 1000))
    problems.push(`field stepM must be above 0 and at most 1000 m (got ${String(stepM)})`);
  const distanceM = track['distanceM'];
  if (!(distanceM instanceof Float64Array) || distanceM.length < 3) {
    problems.push('field distanceM must be a Float64Array of at least 3 samples');
    return problems;
  }
  const count = distanceM.length;
  for (let i = 0; i < count; i++) {
    const d = distanceM[i]!;
    if (!Number.isFinite(d) || (i > 0 && !(d > distanceM[i - 1]!))) {
      problems.push(`field distanceM at sample ${i} must be finite and increase (got ${d})`);
      break;
    }
  }
  checkSamples(track, 'xM', count, MAX_EXTENT_M, problems);
  checkSamples(track, 'yM', count, MAX_EXTENT_M, problems);
  checkSamples(track, 'curvaturePerM', count, MAX_GRID_CURVATURE_PER_M, problems);
  checkSamples(track, 'widthLeftM', count, MAX_EXTENT_M, problems, { optional: true, nonNegative: true });
  checkSamples(track, 'widthRightM', count, MAX_EXTENT_M, problems, { optional: true, nonNegative: true });
  checkSamples(track, 'zM', count, MAX_EXTENT_M, problems, { optional: true });
  checkSamples(track, 'bankRad', count, Math.PI / 3, problems, { optional: true });
  if (!Array.isArray(track['corners'])) problems.push('field corners must be an array (empty when none)');
  return problems;
}

/** Checks a track grid once per record; throws one InputError naming every wrong field. */
export function validateTrackGrid(track: TrackGrid, source: string): TrackGrid {
  if (checkedGrids.has(track)) return track;
  const problems = trackGridProblems(track);
  if (problems.length > 0) throw new InputError(`${source}: ${problems.join('; ')}`);
  checkedGrids.add(track);
  return track;
}

/** Checks a path against the grid it is driven on (same count, finite curvature and segment lengths). */
export function validatePath(path: Path, count: number, source: string): Path {
  if (checkedGrids.has(path)) return path;
  const record = path as unknown;
  const problems: string[] = [];
  if (!isRecord(record)) problems.push('a path must be a record');
  else {
    checkSamples(record, 'curvaturePerM', count, MAX_GRID_CURVATURE_PER_M, problems);
    // An open path has one segment fewer than samples.
    const segments = record['closed'] === false ? count - 1 : count;
    checkSamples(record, 'segmentLengthM', segments, 1e4, problems, { nonNegative: true });
  }
  if (problems.length > 0) throw new InputError(`${source}: ${problems.join('; ')}`);
  checkedGrids.add(path);
  return path;
}
