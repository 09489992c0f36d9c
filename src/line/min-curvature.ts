// The minimum-curvature line: the offsets inside the corridor that minimise the sum of the line's squared
// curvature over the grid (Braghin, Cheli, Melzi and Sabbioni, Computers & Structures 86 (2008); Heilmeier et
// al., Vehicle System Dynamics 58 (2020)), solved as a sequence of banded box QPs (optimise-offsets.ts).

import type { TrackGrid } from '../track/types.js';
import type { Corridor } from './corridor.js';
import { optimiseOffsets, type OptimiseResult } from './optimise-offsets.js';
import { prolongOffsets, type CoarseLevel } from './coarse-track.js';

/** Start: the middle of the corridor (the centreline where the margins are even). */
export function corridorMiddle(corridor: Corridor): Float64Array {
  const out = new Float64Array(corridor.lowerM.length);
  for (let i = 0; i < out.length; i++) out[i] = 0.5 * (corridor.lowerM[i]! + corridor.upperM[i]!);
  return out;
}

export function minimumCurvatureOffsets(
  track: TrackGrid,
  corridor: Corridor,
  start: Float64Array = corridorMiddle(corridor),
): OptimiseResult {
  const weights = { curvature: new Float64Array(start.length).fill(1), length: null, lengthWeight: 0 };
  return optimiseOffsets(track, corridor, weights, start);
}

export interface CurvatureLineSearch {
  offsetM: Float64Array;
  /** Gauss-Newton iterations on the track's grid. */
  iterations: number;
  /** The line on the coarse grid and its iterations there; null and 0 without a coarse level. */
  coarseOffsetM: Float64Array | null;
  coarseIterations: number;
}

/** The minimum-curvature line, found on the coarse grid first when there is one (coarse-track.ts). */
export function warmStartedCurvatureLine(
  track: TrackGrid,
  corridor: Corridor,
  coarse: CoarseLevel | null,
): CurvatureLineSearch {
  if (!coarse) {
    const fine = minimumCurvatureOffsets(track, corridor);
    return { offsetM: fine.offsetM, iterations: fine.iterations, coarseOffsetM: null, coarseIterations: 0 };
  }
  const rough = minimumCurvatureOffsets(coarse.track, coarse.corridor);
  const fine = minimumCurvatureOffsets(track, corridor, prolongOffsets(track, corridor, coarse.track, rough.offsetM));
  return {
    offsetM: fine.offsetM,
    iterations: fine.iterations,
    coarseOffsetM: rough.offsetM,
    coarseIterations: rough.iterations,
  };
}
