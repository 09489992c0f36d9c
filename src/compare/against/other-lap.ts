// The second lap of a lap-against-lap comparison: a lap of the driver's own session or of another log, cut and
// aligned exactly as the driver's lap is (../laps.ts, ../align.ts), with one-line errors that name the option.

import { InputError } from '../../errors.js';
import type { TrackGrid } from '../../track/types.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { formatLapTime } from '../../units.js';
import type { DriverLap } from '../types.js';
import { cutLaps, type LapCut } from '../laps.js';
import { alignLapWithNotes } from '../align.js';
import { metricNoteText } from '../../note.js';
import { deriveSessionAccelerations } from '../derive-session.js';

export interface OtherLapOptions {
  /** The lap to take; default: the fastest complete lap. */
  lap?: number;
  /** The option that chose it, for the errors ('--against-lap'). */
  optionName: string;
  startFinish?: { xM: number; yM: number };
  /** The session's laps where already cut (the driver's own session). */
  laps?: LapCut[];
}

export function otherLapOf(
  loggedSession: TelemetrySession,
  track: TrackGrid,
  options: OtherLapOptions,
): { lap: DriverLap; notes: string[] } {
  const session = deriveSessionAccelerations(loggedSession).session;
  const laps =
    options.laps ?? cutLaps(session, track, options.startFinish ? { startFinish: options.startFinish } : {}).laps;
  let chosen: LapCut | undefined;
  const notes: string[] = [];
  if (options.lap !== undefined) {
    chosen = laps.find((lap) => lap.lapNumber === options.lap);
    if (!chosen)
      throw new InputError(
        `${session.source}: ${options.optionName} ${options.lap}: no such lap (laps found: ${laps.map((lap) => lap.lapNumber).join(', ') || 'none'})`,
      );
    if (!chosen.complete)
      throw new InputError(
        `${session.source}: ${options.optionName} ${options.lap} is not a complete lap: ${metricNoteText(chosen.reason ?? 'incomplete')}`,
      );
  } else {
    const complete = laps.filter((lap) => lap.complete);
    if (complete.length === 0)
      throw new InputError(
        `${session.source}: no complete lap to compare against on track ${track.name} (${laps.map((lap) => `lap ${lap.lapNumber}: ${metricNoteText(lap.reason ?? 'incomplete')}`).join('; ') || 'no laps'})`,
      );
    chosen = complete.reduce((best, lap) => (lap.lapTimeS < best.lapTimeS ? lap : best));
    notes.push(
      `compared against lap ${chosen.lapNumber} of ${session.source}, its fastest (${formatLapTime(chosen.lapTimeS)})`,
    );
  }
  const aligned = alignLapWithNotes(session, chosen, track);
  return { lap: aligned.lap, notes: [...notes, ...aligned.notes] };
}
