// The curvature a GPS-only log's lateral acceleration is read on (ay = v^2 kappa with each lap's own speed): the
// driver's own path estimated from the fixes of every complete lap (../compare/driver-line/driver-path.ts), or the
// track's centreline where the log has no positions or they are too sparse or noisy for a path whose curvature is
// worth more than the centreline's.

import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import type { DriverLap } from '../compare/types.js';
import type { LapCut } from '../compare/laps.js';
import { placeSession } from '../compare/place-session.js';
import { driverPath } from '../compare/driver-line/driver-path.js';
import { densityOf, distanceOf, note, speedsOf, type Note } from '../note.js';

/**
 * The largest noise the driver's path may leave in the lateral acceleration, m/s^2 (at the speed where the
 * smoothing's cut-off holds). The centreline's curvature has no noise but is biased for a driver who uses the track's
 * width; the path's noise is scatter that the grip fit averages over the samples near the limit, until it is large
 * enough to lift samples that were inside the boundary onto it. Measured on synthetic GPS-only logs of a driver on a
 * racing line (docs/calibrate.md): the grip held within 2 standard errors up to a stated 1.4 m/s^2 and came out 3-20 %
 * high, or failed, from 2.1 m/s^2; the threshold sits between the two.
 */
export const MAX_PATH_AY_NOISE_MPS2 = 1.75;

export interface LateralPathSummary {
  /** 'driver': the driver's own path from the fixes; 'centreline': the track's centreline. */
  path: 'driver' | 'centreline';
  /** Position scatter across the track about the driver's path, m (null: no path estimated). */
  positionNoiseM: number | null;
  /** The smoother's cut-off wavelength, m, chosen by generalised cross-validation. */
  cutoffM: number | null;
  /** The noise the path leaves in the lateral acceleration, m/s^2 (at the speed where the cut-off holds). */
  ayNoiseMps2: number | null;
  /** Fixes pooled over how many laps. */
  fixes: number;
  laps: number;
}

export interface LateralPath {
  curvaturePerM: Float64Array;
  summary: LateralPathSummary;
  note: Note;
}

export function lateralPath(
  session: TelemetrySession,
  track: TrackGrid,
  cuts: readonly LapCut[],
  laps: readonly DriverLap[],
): LateralPath {
  const centreline = (reason: Note, estimate: Omit<LateralPathSummary, 'path' | 'laps'> | null): LateralPath => ({
    curvaturePerM: track.curvaturePerM,
    summary: {
      path: 'centreline',
      positionNoiseM: estimate?.positionNoiseM ?? null,
      cutoffM: estimate?.cutoffM ?? null,
      ayNoiseMps2: estimate?.ayNoiseMps2 ?? null,
      fixes: estimate?.fixes ?? 0,
      laps: laps.length,
    },
    note: note`no lateral acceleration in the log: taken as the speed squared times the curvature of the track's centreline (${reason}); a driver who uses the track's width turns wider than the centreline, so the grip comes out high`,
  });
  const placed = placeSession(session, track);
  if (!placed) return centreline('the log has no positions', null);
  const n = track.distanceM.length;
  const meanSpeedMps = new Float64Array(n);
  for (const lap of laps) for (let j = 0; j < n; j++) meanSpeedMps[j]! += lap.speedMps[j]! / laps.length;
  const path = driverPath(track, {
    progressM: placed.progressM,
    offsetM: placed.offsetM,
    laps: cuts,
    speedMps: meanSpeedMps,
  });
  if (!path)
    return centreline(
      note`the laps' position fixes are more than ${distanceOf(5)} apart, too sparse for a path of their own`,
      null,
    );
  // The speed at which the smoothing's cut-off holds (v^4 at its mean along the lap, ../compare/driver-line): the
  // noise in v^2 kappa is read there, and changes little elsewhere (the smoothing follows v^4, so the curvature's
  // noise falls about as v^2 rises).
  let meanFourth = 0;
  for (let j = 0; j < n; j++) meanFourth += meanSpeedMps[j]! ** 4 / n;
  const speedMps = Math.sqrt(Math.sqrt(meanFourth));
  const estimate = {
    positionNoiseM: path.noiseM,
    cutoffM: path.cutoffM,
    ayNoiseMps2: path.curvatureSdPerM * speedMps * speedMps,
    fixes: path.fixes,
  };
  const figures = note`positions scatter ${distanceOf(path.noiseM, 2)} across the track, ${densityOf(path.fixesPerM, 1, 'fixes')} over ${laps.length} lap${laps.length > 1 ? 's' : ''}`;
  if (!(estimate.ayNoiseMps2 <= MAX_PATH_AY_NOISE_MPS2))
    return centreline(
      note`${figures}: the driver's own path would carry ${estimate.ayNoiseMps2.toFixed(1)} m/s² of noise at ${speedsOf([speedMps])}, more than the ${MAX_PATH_AY_NOISE_MPS2} m/s² allowed`,
      estimate,
    );
  return {
    curvaturePerM: path.curvaturePerM,
    summary: { path: 'driver', ...estimate, laps: laps.length },
    note: note`no lateral acceleration in the log: taken as the speed squared times the curvature of the driver's own path, estimated from the fixes of every complete lap (${figures}; smoothed to a cut-off wavelength of ${distanceOf(path.cutoffM)}, leaving about ${estimate.ayNoiseMps2.toFixed(2)} m/s² of noise at ${speedsOf([speedMps])})`,
  };
}
