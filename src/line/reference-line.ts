// Which path the reference lap drives: the minimum-time line wherever the track gives widths (a driver uses the
// track, so a centreline reference is slower than real laps), the centreline where asked or where the track
// gives no room, or a given line. The search itself is racing-line.ts; this decides and says what it did.

import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { Path, TrackGrid } from '../track/types.js';
import type { LapResult } from '../solve/types.js';
import { isInputError } from '../errors.js';
import { defaultMarginM } from './corridor.js';
import { lineFromOffsets, racingLine } from './racing-line.js';

export type ReferencePathKind = 'line' | 'centreline' | 'file';

/** 'auto': the minimum-time line (the default); 'centreline'; or the offsets of a given line on the track's grid. */
export type ReferencePathChoice = 'auto' | 'centreline' | { offsetM: Float64Array };

export interface ReferenceLineOptions {
  /** What to drive (default 'auto'). */
  choice?: ReferencePathChoice;
  /** True when the caller asked for 'auto' by name: a track without room for a line is then an error. */
  explicit?: boolean;
  ambient?: Ambient;
  envelope?: Envelope;
  startSpeedMps?: number;
  marginM?: number;
}

export interface ReferenceLine {
  kind: ReferencePathKind;
  /** The path for simulate(); undefined on the centreline. */
  path: Path | undefined;
  offsetM: Float64Array | undefined;
  xM: Float64Array | undefined;
  yM: Float64Array | undefined;
  /** The lap the line search already drove on this path (same car, air, envelope, start speed), when it ran. */
  lap: LapResult | undefined;
  /** One line for the user when the default could not be followed (e.g. no widths), else null. */
  note: string | null;
}

const centreline = (note: string | null): ReferenceLine => ({
  kind: 'centreline',
  path: undefined,
  offsetM: undefined,
  xM: undefined,
  yM: undefined,
  lap: undefined,
  note,
});

/** The note for a track without widths: what happened and how to give widths. */
export function noWidthsNote(track: TrackGrid): string {
  return `${track.source} gives no widths, so the reference drives the centreline (slower than a line that uses the track); give widths with --width-m <m> or width columns (width_left_m, width_right_m) for the racing line`;
}

/**
 * The reference's path for one run. Computed once; a sweep, stint or what-if passes the result's path to every
 * setup. simulate(track, car) itself always drives the centreline unless given a path.
 */
export function referenceLine(track: TrackGrid, car: Car, options: ReferenceLineOptions = {}): ReferenceLine {
  const choice = options.choice ?? 'auto';
  if (choice === 'centreline') return centreline(null);
  if (choice !== 'auto') {
    const geometry = lineFromOffsets(track, choice.offsetM);
    return {
      kind: 'file',
      path: geometry.path,
      offsetM: choice.offsetM,
      xM: geometry.xM,
      yM: geometry.yM,
      lap: undefined,
      note: null,
    };
  }
  if (!options.explicit && (!track.widthLeftM || !track.widthRightM)) return centreline(noWidthsNote(track));
  try {
    const line = racingLine(track, car, {
      objective: 'time',
      marginM: options.marginM ?? defaultMarginM(car),
      ...(options.ambient ? { ambient: options.ambient } : {}),
      ...(options.envelope ? { envelope: options.envelope } : {}),
      ...(options.startSpeedMps !== undefined ? { startSpeedMps: options.startSpeedMps } : {}),
    });
    return {
      kind: 'line',
      path: line.path,
      offsetM: line.offsetM,
      xM: line.xM,
      yM: line.yM,
      lap: line.lap,
      note: null,
    };
  } catch (error) {
    // By default a track whose widths leave no room for a line still gets its centreline reference, with why.
    if (options.explicit || !isInputError(error)) throw error;
    return centreline(`no racing line (${error.message}), so the reference drives the centreline`);
  }
}
