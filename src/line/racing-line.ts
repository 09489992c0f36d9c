// The library entry for the racing line: validates the corridor, finds the minimum-curvature line, and for
// the time objective lowers the lap time from there with the solver in the loop.

import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { TrackGrid } from '../track/types.js';
import { ambientFrom } from '../car/ambient.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { simulate } from '../solve/simulate.js';
import { corridorOf, defaultMarginM } from './corridor.js';
import { linePath, linePositions } from './geometry.js';
import { warmStartedCurvatureLine } from './min-curvature.js';
import {
  driveLine,
  driveLineLapTime,
  minimumTimeOffsets,
  type DrivenLap,
  type MinimumTimeOptions,
} from './min-time.js';
import { coarseLevel, prolongOffsets } from './coarse-track.js';
import type { LineGeometry, LineObjective, RacingLine } from './types.js';
import { validateCar } from '../car/validate.js';
import { validateTrackGrid } from '../track/validate-grid.js';

export interface RacingLineOptions {
  /** 'time' (default) or 'curvature'. */
  objective?: LineObjective;
  /** Distance kept from each edge, m; default half the car's width plus 0.3 m, or 0.8 m. */
  marginM?: number;
  ambient?: Ambient;
  envelope?: Envelope;
  /** Speed at the start of an open track, m/s (default 0). */
  startSpeedMps?: number;
}

/** Geometry and summary figures of the line with these offsets on this track. */
export function lineFromOffsets(track: TrackGrid, offsetM: Float64Array): LineGeometry {
  const path = linePath(track, offsetM);
  const { xM, yM } = linePositions(track, offsetM);
  let lengthM = 0;
  for (let i = 0; i < path.segmentLengthM.length; i++) lengthM += path.segmentLengthM[i]!;
  let maxCurvature = 0;
  let maxAt = 0;
  let maxOffsetM = 0;
  for (let i = 0; i < offsetM.length; i++) {
    const k = Math.abs(path.curvaturePerM[i]!);
    if (k > maxCurvature) {
      maxCurvature = k;
      maxAt = i;
    }
    maxOffsetM = Math.max(maxOffsetM, Math.abs(offsetM[i]!));
  }
  return {
    stationM: track.distanceM,
    offsetM,
    xM,
    yM,
    path,
    lengthM,
    minRadiusM: maxCurvature > 0 ? 1 / maxCurvature : Infinity,
    minRadiusAtM: track.distanceM[maxAt] ?? 0,
    maxOffsetM,
  };
}

export function racingLine(track: TrackGrid, car: Car, options: RacingLineOptions = {}): RacingLine {
  validateTrackGrid(track, 'racingLine: track');
  validateCar(car, 'racingLine: car');
  const objective = options.objective ?? 'time';
  const marginM = options.marginM ?? defaultMarginM(car);
  const corridor = corridorOf(track, marginM);
  const ambient = options.ambient ?? ambientFrom();
  const envelope = options.envelope ?? buildEnvelope(car, ambient);
  const startSpeedMps = options.startSpeedMps ?? 0;
  const drive = { ambient, envelope, startSpeedMps };
  const centrelineLap = simulate(track, car, drive);
  // Both searches start on a coarse grid where the track's grid is fine (coarse-track.ts).
  const coarse = coarseLevel(track, marginM);
  const curvatureSearch = warmStartedCurvatureLine(track, corridor, coarse);
  const curvatureLine = curvatureSearch.offsetM;
  const curvatureLap = driveLine(track, car, curvatureLine, drive);
  let offsetM = curvatureLine;
  let lap = curvatureLap;
  let lapEvaluations = 1;
  if (objective === 'time') {
    let search: MinimumTimeOptions = drive;
    let startLap: DrivenLap = curvatureLap;
    if (coarse && curvatureSearch.coarseOffsetM) {
      // The whole search on the coarse grid; its line, carried over, starts the fine grid's last round when it
      // beats the fine minimum-curvature line there, with the length weights that won on the coarse grid.
      const rough = minimumTimeOffsets(coarse.track, car, coarse.corridor, curvatureSearch.coarseOffsetM, drive);
      lapEvaluations += rough.evaluations;
      if (rough.lengthWeight !== null) {
        const carried = prolongOffsets(track, corridor, coarse.track, rough.offsetM);
        const carriedLap = driveLineLapTime(track, car, carried, drive);
        lapEvaluations++;
        if (carriedLap.lapTimeS < startLap.lapTimeS) {
          offsetM = carried;
          startLap = carriedLap;
        }
        search = { ...drive, rounds: 1, lengthWeights: [rough.lengthWeight, rough.lengthWeight / 2] };
      }
    }
    const best = minimumTimeOffsets(track, car, corridor, offsetM, search, startLap);
    offsetM = best.offsetM;
    lap = best.lap;
    lapEvaluations += best.evaluations;
  }
  return {
    ...lineFromOffsets(track, offsetM),
    objective,
    marginM,
    lap,
    centrelineLap,
    curvatureLineLapTimeS: curvatureLap.lapTimeS,
    lapEvaluations,
  };
}
