// `compare --against FILE` and `--against-lap N`: the second lap of a lap-against-lap comparison, from another log
// or from the driver's own session, read and cut as the driver's log is.

import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { numberOption } from './options.js';
import { loadSession, type TelemetryOptionValues } from './telemetry-options.js';
import type { SessionComparison } from '../compare/compare-session.js';
import type { TrackGrid } from '../track/types.js';
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

/** The lap-against-lap comparison the options ask for, or null when they ask for none. */
export async function againstFromOptions(
  track: TrackGrid,
  comparison: SessionComparison,
  values: AgainstOptionValues & TelemetryOptionValues,
  startFinish: { xM: number; yM: number } | undefined,
): Promise<{ result: AgainstResult; other: DriverLap } | null> {
  const lap = againstLapNumber(values);
  if (values.against === undefined && lap === undefined) return null;
  const optionName = values.against === undefined ? '--against-lap' : '--against';
  const session =
    values.against === undefined ? comparison.session : await loadSession({ ...values, telemetry: values.against });
  if (!session) throw new Error('the comparison kept no session for --against-lap');
  const other = otherLapOf(session, track, {
    ...(lap !== undefined ? { lap } : {}),
    optionName: lap !== undefined ? '--against-lap' : optionName,
    ...(startFinish ? { startFinish } : {}),
    ...(values.against === undefined && comparison.laps ? { laps: comparison.laps } : {}),
  });
  const result = lapAgainstLap(track, comparison.reference, comparison.lap, other.lap, comparison.envelope);
  result.notes.unshift(...other.notes);
  return { result, other: other.lap };
}
