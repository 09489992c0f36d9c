// The line the driver drove, where the log has positions: the lateral offset along the lap, each corner's turn-in,
// apex and exit offsets against the reference line's and another lap's, and findings in plain words. Line
// differences smaller than the log's own position scatter allows are not reported (lateral-offset.ts).

import type { TrackGrid } from '../../track/types.js';
import { wrapIndex } from '../../numeric/lap-index.js';
import type { DriverLap } from '../types.js';
import { cornerLayoutOf } from '../../track/corner-layout.js';
import { cornerLine, type CornerLine } from './corner-line.js';
import { lateralOffsetM, smoothedOffset } from './lateral-offset.js';

/** Brake share from which braking counts as hard (common practice, no source). */
const HARD_BRAKE = 0.5;
/** The reference takes a corner "from the outside" when it turns in within this of the outside edge, m (common practice). */
const OUTSIDE_EDGE_M = 1;
/** Line differences are reported from twice the scatter's standard deviation (about 95 % of single readings). */
const RESOLUTION_SDS = 2;
/** Absolute error of a consumer GPS receiver's position, m (from memory: a few metres); it bounds a GPS line
 * against the track's edges and the reference line, which the scatter within one lap does not show. */
const GPS_ABSOLUTE_M = 3;

export interface CornerLineComparison {
  id: number;
  name: string | null;
  driver: CornerLine;
  reference: CornerLine | null;
  other: CornerLine | null;
  /** Brake share at the driver's turn-in, and how far the car moves towards the inside while still braking hard after it, m. */
  brakeAtTurnIn: number | null;
  driftUnderBrakingM: number | null;
}

export interface DriverLineResult {
  /** Scatter of the driver's offset about its running mean (standard deviation), m, and the smallest difference reported. */
  scatterM: number;
  resolutionM: number;
  /** The smallest difference reported against the track's edges and the reference line (GPS: its absolute error). */
  placedResolutionM: number;
  /** The driver's offset from the centreline (running mean), m, positive = left. */
  offsetM: Float64Array;
  corners: CornerLineComparison[];
  findings: LineFinding[];
  /** Whether the positions are GPS fixes (then held to the receiver's absolute error against the edges). */
  fromGps: boolean;
}

/** A corner's line finding, with its numbers (m; the sentence is src/report/line-phrases.ts's). */
export type LineFinding = { corner: number; cornerName: string | null } & (
  | {
      /** Turns in while still braking hard and drifts inward under braking: a diagonal line into the corner. */
      kind: 'diagonal-entry';
      brakeAtTurnIn: number;
      driftUnderBrakingM: number;
    }
  | { kind: 'turns-in-inside'; insideOfReferenceM: number }
  | { kind: 'misses-apex'; wideM: number; apexMissM: number | null }
);

export interface DriverLineInputs {
  track: TrackGrid;
  lap: DriverLap;
  /** Brake share of the driver's lap (measured or estimated) on the grid. */
  brake: Float64Array | null;
  /** The reference line's positions on the grid, where the reference drove one. */
  referenceLine?: { xM: Float64Array; yM: Float64Array } | null;
  other?: DriverLap | null;
  /** Position scatter known from elsewhere (the GPS derivation), m: the larger of it and the lap's own is used. */
  knownScatterM?: number | null;
  fromGps?: boolean;
}

export function driverLine(inputs: DriverLineInputs): DriverLineResult | null {
  const { track, lap } = inputs;
  if (!lap.xM || !lap.yM) return null;
  const n = track.distanceM.length;
  const read = smoothedOffset(lateralOffsetM(track, lap.xM, lap.yM), track.stepM, track.closed);
  const offsetM = read.smoothM;
  const scatterM = Math.max(read.scatterM, inputs.knownScatterM ?? 0);
  const resolutionM = RESOLUTION_SDS * scatterM;
  const placedResolutionM = inputs.fromGps ? Math.max(resolutionM, GPS_ABSOLUTE_M) : resolutionM;
  const referenceOffset = inputs.referenceLine
    ? lateralOffsetM(track, inputs.referenceLine.xM, inputs.referenceLine.yM)
    : null;
  const otherOffset =
    inputs.other?.xM && inputs.other.yM ? lateralOffsetM(track, inputs.other.xM, inputs.other.yM) : null;
  const wrap = (u: number) => wrapIndex(u, n);
  const corners = cornerLayoutOf(track).corners.map((span): CornerLineComparison => {
    const driver = cornerLine(offsetM, span, track, resolutionM);
    let brakeAtTurnIn: number | null = null;
    let driftUnderBrakingM: number | null = null;
    if (inputs.brake) {
      const turnIn = span.apexIndex - Math.round(driver.turnInBeforeApexM / track.stepM);
      brakeAtTurnIn = inputs.brake[wrap(turnIn)]!;
      let last = turnIn;
      while (last < span.apexIndex && inputs.brake[wrap(last + 1)]! >= HARD_BRAKE) last++;
      driftUnderBrakingM = span.side * (offsetM[wrap(last)]! - offsetM[wrap(turnIn)]!);
    }
    return {
      id: span.id,
      name: span.name,
      driver,
      reference: referenceOffset ? cornerLine(referenceOffset, span, track) : null,
      other: otherOffset ? cornerLine(otherOffset, span, track, resolutionM) : null,
      brakeAtTurnIn,
      driftUnderBrakingM,
    };
  });
  const findings: LineFinding[] = [];
  for (const corner of corners) {
    const where = { corner: corner.id, cornerName: corner.name };
    const side = cornerLayoutOf(track).corners.find((c) => c.id === corner.id)!.side;
    if (
      corner.brakeAtTurnIn !== null &&
      corner.brakeAtTurnIn >= HARD_BRAKE &&
      corner.driftUnderBrakingM !== null &&
      corner.driftUnderBrakingM >= resolutionM
    )
      findings.push({
        ...where,
        kind: 'diagonal-entry',
        brakeAtTurnIn: corner.brakeAtTurnIn,
        driftUnderBrakingM: corner.driftUnderBrakingM,
      });
    const reference = corner.reference;
    if (reference && reference.turnInFromOutsideM !== null && reference.turnInFromOutsideM <= OUTSIDE_EDGE_M) {
      const insideOfReference = side * (corner.driver.turnInOffsetM - reference.turnInOffsetM);
      if (insideOfReference >= placedResolutionM)
        findings.push({ ...where, kind: 'turns-in-inside', insideOfReferenceM: insideOfReference });
    }
    if (reference) {
      const wide = side * (reference.apexOffsetM - corner.driver.apexOffsetM);
      if (wide >= placedResolutionM)
        findings.push({ ...where, kind: 'misses-apex', wideM: wide, apexMissM: corner.driver.apexMissM });
    }
  }
  return { scatterM, resolutionM, placedResolutionM, offsetM, corners, findings, fromGps: inputs.fromGps ?? false };
}
