// `compare --against FILE` and `--against-lap N`: the second lap of a lap-against-lap comparison, from another log
// or from the driver's own session, read and cut as the driver's log is.

import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { numberOption } from './options.js';
import { loadSession, type TelemetryOptionValues } from './telemetry-options.js';
import type { SessionComparison } from '../compare/compare-session.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import type { DriverLap } from '../compare/types.js';
import { otherLapOf } from '../compare/against/other-lap.js';
import { lapAgainstLap, type AgainstResult } from '../compare/against/lap-against-lap.js';

export interface AgainstOptionValues {
  against?: string;
  againstLap?: string;
}

export function addAgainstOptions(command: Command): Command {
  return command
    .option('--against <file>', 'a second log to set the lap against, corner by corner (any format --telemetry reads)')
    .option(
      '--against-lap <n>',
      'the lap to set it against: of the --against log, else of the same session (default: the fastest of --against)',
    );
}

function againstLapNumber(values: AgainstOptionValues): number | undefined {
  const lap = numberOption(values.againstLap, '--against-lap', null);
  if (lap === null) return undefined;
  if (!Number.isInteger(lap) || lap < 1)
    throw new InputError(`option --against-lap: ${lap} is not a lap number (1, 2, ...)`);
  return lap;
}

/** What --against and --against-lap ask for, the other log already read. */
export interface AgainstRequest {
  lap: number | undefined;
  /** The --against log; undefined where the other lap is the driver's own session's. */
  session: TelemetrySession | undefined;
}

/**
 * Reads what the options ask for, or null when they ask for none: before the comparison computes anything (its
 * racing line takes seconds), so a bad --against file or lap number is a one-line error at once.
 */
export async function readAgainstOptions(
  values: AgainstOptionValues & TelemetryOptionValues,
): Promise<AgainstRequest | null> {
  const lap = againstLapNumber(values);
  if (values.against === undefined && lap === undefined) return null;
  const session =
    values.against === undefined ? undefined : await loadSession({ ...values, telemetry: values.against });
  return { lap, session };
}

/** The lap-against-lap comparison of a request (readAgainstOptions) with the driver's comparison. */
export function againstFromOptions(
  track: TrackGrid,
  comparison: SessionComparison,
  request: AgainstRequest,
  startFinish: { xM: number; yM: number } | undefined,
): { result: AgainstResult; other: DriverLap } {
  const { lap } = request;
  const optionName = request.session === undefined ? '--against-lap' : '--against';
  const session = request.session ?? comparison.session;
  if (!session) throw new Error('the comparison kept no session for --against-lap');
  const other = otherLapOf(session, track, {
    ...(lap !== undefined ? { lap } : {}),
    optionName: lap !== undefined ? '--against-lap' : optionName,
    ...(startFinish ? { startFinish } : {}),
    ...(request.session === undefined && comparison.laps ? { laps: comparison.laps } : {}),
  });
  const result = lapAgainstLap(track, comparison.reference, comparison.lap, other.lap, comparison.envelope);
  result.notes.unshift(...other.notes);
  return { result, other: other.lap };
}
