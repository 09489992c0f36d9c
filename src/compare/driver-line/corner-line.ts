// The line a lap takes through each corner, from its lateral offset (lateral-offset.ts; positive to the left): where
// it turns in (the last point before the apex where it is furthest to the outside), its offset there, at the
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

export function cornerLine(offsetM: Float64Array, span: CornerSpan, track: TrackGrid): CornerLine {
  const n = offsetM.length;
  const step = track.stepM;
  const side = span.side;
  const from = Math.max(span.entryIndex - Math.round(TURN_IN_SEARCH_M / step), track.closed ? -Infinity : 0);
  // Furthest to the outside (least towards the inside) before the apex: the last such point is the turn-in.
  let turnIn = span.apexIndex;
  let outermost = Infinity;
  for (let u = from; u <= span.apexIndex; u++) {
    const inward = side * offsetM[wrapIndex(u, n)]!;
    if (inward <= outermost) {
      outermost = inward;
      turnIn = u;
    }
  }
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
