// The racing line as the library returns it: offsets from the centreline on the track's grid, its geometry
// as a Path for the solver, and the laps on it and on the centreline.

import type { Path } from '../track/types.js';
import type { LapResult } from '../solve/types.js';

export type LineObjective = 'curvature' | 'time';

export const LINE_OBJECTIVES: readonly LineObjective[] = ['curvature', 'time'];

/** A line's geometry, from its offsets alone. */
export interface LineGeometry {
  /** Distance along the centreline of each sample, m (the track's grid). */
  stationM: Float64Array;
  /** Lateral offset from the centreline, m, positive to the left. */
  offsetM: Float64Array;
  xM: Float64Array;
  yM: Float64Array;
  path: Path;
  /** Length of the line, m. */
  lengthM: number;
  /** Smallest radius of curvature on the line, m (Infinity on a straight line), and where it is (station). */
  minRadiusM: number;
  minRadiusAtM: number;
  /** Largest distance from the centreline, m. */
  maxOffsetM: number;
}

export interface RacingLine extends LineGeometry {
  objective: LineObjective;
  marginM: number;
  /** The lap on the line and the lap on the centreline, same car and air. */
  lap: LapResult;
  centrelineLap: LapResult;
  /** Lap time on the minimum-curvature line, s (the time objective's starting point and upper bound). */
  curvatureLineLapTimeS: number;
  /** Laps the solver drove on candidate lines (1 for curvature: the line itself). */
  lapEvaluations: number;
}
