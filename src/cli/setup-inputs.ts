// What the setup commands (`sweep`, `stint`, `whatif`) share: the track, the base car and air with fixed changes,
// the reference path held for every setup, and the --workers option.

import {
  loadCar,
  loadTrack,
  numberOption,
  startSpeedMps,
  type CarOptionValues,
  type TrackOptionValues,
} from './options.js';
import { resolveReferenceLine } from './reference-path.js';
import { setupBaseFrom, type Setting, type SetupBase } from '../sweep/settings.js';
import type { TrackGrid } from '../track/types.js';
import type { ReferenceLine } from '../line/reference-line.js';
import { ambientFrom } from '../car/ambient.js';
import { InputError } from '../errors.js';

export type SetupOptionValues = TrackOptionValues & CarOptionValues & { line?: string };

/** Track, base car and air (with fixed --set changes) and start speed: what every setup run shares. */
export function loadSetupInputs(
  values: SetupOptionValues,
  fixed: readonly Setting[],
): { track: TrackGrid; base: SetupBase; start: number } {
  const track = loadTrack(values);
  const { car, ambient } = loadCar(values);
  return { track, base: setupBaseFrom(car, ambient, fixed), start: startSpeedMps(values) };
}

/**
 * The reference's path for every setup: computed once, for the baseline car, and held for every setup (the line
 * search is the costly part of a run). Called after the cheap checks of the input, so bad input fails fast.
 */
export function setupReference(
  values: SetupOptionValues,
  inputs: { track: TrackGrid; base: SetupBase; start: number },
): ReferenceLine {
  const { track, base, start } = inputs;
  return resolveReferenceLine(track, base.car, ambientFrom(base.air), values.line, { startSpeedMps: start });
}

/** The --workers option's text, as `sweep` and `stint` show it. */
export const WORKERS_OPTION_TEXT =
  'worker threads (default: where the runs take long enough to pay for starting them, one per core but this one, ' +
  'beside this thread; 0 = in this thread)';

/** Parses --workers: 0 = in the calling thread; left out, undefined: the pool starts workers where they pay. */
export function workerCount(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const workers = numberOption(text, '--workers', 1);
  if (!Number.isInteger(workers) || workers < 0 || workers > 256)
    throw new InputError(`option --workers: ${text} should be a whole number from 0 to 256`);
  return workers;
}
