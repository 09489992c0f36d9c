// The real GPS log in ../shared/data/real-gps/: one lap of a kart on an outdoor kart circuit, NMEA 0183 at an
// irregular 10-25 Hz, position and speed only. Source: the test fixtures of the open-source DovesLapTimer library
// (TheAngryRaven/DovesLapTimer, file examples/real_track_data_debug/gps_race_data_long_lap.h), GNU GPL v3; read
// from there, never copied into the repository. No track file comes with it: its track is the log's own path.

import { existsSync } from 'node:fs';
import path from 'node:path';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import { trackFromCentreline } from '../../src/track/resample.js';
import { projectRoot } from './cli.js';

export const REAL_KART_LOG = path.resolve(
  projectRoot,
  '..',
  'shared',
  'data',
  'real-gps',
  'kart-circuit-long-layout.nmea',
);
export const realKartLogPresent = existsSync(REAL_KART_LOG);

/** An open stage along the log's own path: every fifth fix and the last. */
export function kartTrackOf(session: TelemetrySession): TrackGrid {
  const picks: number[] = [];
  for (let i = 0; i < session.count; i += 5) picks.push(i);
  picks.push(session.count - 1);
  return trackFromCentreline(
    {
      xM: Float64Array.from(picks, (i) => session.xM![i]!),
      yM: Float64Array.from(picks, (i) => session.yM![i]!),
      widthLeftM: null,
      widthRightM: null,
    },
    { name: 'kart lap', closed: false, stepM: 1, smoothingM: 10, source: 'the kart log', geoOrigin: session.geoOrigin },
  );
}
