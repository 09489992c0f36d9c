// The line a lap takes through each corner, from its lateral offset (lateral-offset.ts; positive to the left): where
// it turns in (the last point before the apex still within the log's resolution of its furthest to the outside: the
// end of the run along the outside, so a noisy or flat approach does not put the turn-in at a random wiggle, and a
// line that never moves inward by more than the resolution turns in at the apex itself), its offset there, at the
// corner's geometric apex and at the exit (the track used), and how far it stays from the inside edge at the apex
// (the apex missed). The corner's side: +1 left (the inside is the left), -1 right.

import type { CornerSpan } from '../../track/corners.js';
import type { TrackGrid } from '../../track/types.js';
import { wrapIndex } from '../../numeric/lap-index.js';

/** How far before the corner's entry the turn-in is looked for, m. */
const TURN_IN_SEARCH_M = 60;

export interface CornerLine {
  /** The turn-in, m along the lap, and as metres before the geometric apex. */
  turnInM: number;
  turnInBeforeApexM: number;
  /** Offsets from the centreline, m (positive = left). */
  turnInOffsetM: number;
  apexOffsetM: number;
  exitOffsetM: number;
  /** Gap between the car and the inside edge at the apex, m (null without track widths). */
  apexMissM: number | null;
  /** Gap between the car and the outside edge at the turn-in, m (null without track widths). */
  turnInFromOutsideM: number | null;
}

/** The line through one corner; offsets within toleranceM of the outermost count as at the outside (the log's resolution). */
export function cornerLine(offsetM: Float64Array, span: CornerSpan, track: TrackGrid, toleranceM = 0): CornerLine {
  const n = offsetM.length;
  const step = track.stepM;
  const side = span.side;
  const from = Math.max(span.entryIndex - Math.round(TURN_IN_SEARCH_M / step), track.closed ? -Infinity : 0);
  // Furthest to the outside (least towards the inside) before the apex, then the last point still within the
  // tolerance of it: the turn-in.
  let outermost = Infinity;
  for (let u = from; u <= span.apexIndex; u++) outermost = Math.min(outermost, side * offsetM[wrapIndex(u, n)]!);
  let turnIn = from;
  for (let u = from; u <= span.apexIndex; u++)
    if (side * offsetM[wrapIndex(u, n)]! <= outermost + toleranceM) turnIn = u;
  const at = (u: number) => offsetM[wrapIndex(u, n)]!;
  const insideWidth = (u: number) => {
    const widths = side > 0 ? track.widthLeftM : track.widthRightM;
    return widths ? widths[wrapIndex(u, n)]! : null;
  };
  const outsideWidth = (u: number) => {
    const widths = side > 0 ? track.widthRightM : track.widthLeftM;
    return widths ? widths[wrapIndex(u, n)]! : null;
  };
  const apexInside = insideWidth(span.apexIndex);
  const turnInOutside = outsideWidth(turnIn);
  return {
    turnInM: wrapIndex(turnIn, n) * step,
    turnInBeforeApexM: (span.apexIndex - turnIn) * step,
    turnInOffsetM: at(turnIn),
    apexOffsetM: at(span.apexIndex),
    exitOffsetM: at(span.exitIndex),
    apexMissM: apexInside === null ? null : apexInside - side * at(span.apexIndex),
    turnInFromOutsideM: turnInOutside === null ? null : turnInOutside + side * at(turnIn),
  };
}
