// The driver's lap against a second lap (another lap of the session, or another log) and against the reference,
// on the track's one distance grid: the pair's corner differences (corner-pair.ts), each lap's time to the
// reference over the same corner stretches, and the findings in plain words.

import type { Envelope } from '../../car/envelope.js';
import type { LapResult } from '../../solve/types.js';
import type { TrackGrid } from '../../track/types.js';
import type { DriverLap } from '../types.js';
import { timeDeltaS } from '../delta.js';
import { DEFAULT_COMPARE_OPTIONS } from '../compare-options.js';
import { pairCorners, stretchTimesLostS } from './corner-pair.js';
import { pairLapOfDriver, pairLapOfReference } from './pair-lap.js';
import {
  DEFAULT_AGAINST_FINDING_OPTIONS,
  rankAgainstFindings,
  type AgainstCorner,
  type AgainstFinding,
  type AgainstFindingOptions,
} from './against-findings.js';

export interface AgainstResult {
  /** The other lap: its log, its number in that log's session, and how findings name it. */
  source: string;
  lapNumber: number;
  label: string;
  driverLabel: string;
  lapTimeS: number;
  driverLapTimeS: number;
  referenceLapTimeS: number;
  /** Driver minus other lap elapsed time at each station, s. */
  deltaS: Float64Array;
  /** Other lap minus reference at each station, s. */
  otherToReferenceS: Float64Array;
  /** Per corner, driver (first) minus other lap (second). */
  corners: AgainstCorner[];
  findings: AgainstFinding[];
  notes: string[];
}

export interface AgainstOptions {
  pedalThreshold: number;
  findings: AgainstFindingOptions;
  driverLabel?: string;
  otherLabel?: string;
}

/** How a lap is named: its number, and its log where that differs from the driver's. */
export function lapLabel(lap: DriverLap, driverSource: string): string {
  const fileName = lap.source.split(/[\\/]/).pop() || lap.source;
  return lap.source === driverSource ? `lap ${lap.lapNumber}` : `lap ${lap.lapNumber} of ${fileName}`;
}

export function lapAgainstLap(
  track: TrackGrid,
  reference: LapResult,
  driver: DriverLap,
  other: DriverLap,
  envelope: Envelope,
  options: Partial<AgainstOptions> = {},
): AgainstResult {
  const pedalThreshold = options.pedalThreshold ?? DEFAULT_COMPARE_OPTIONS.pedalThreshold;
  const findingOptions = options.findings ?? DEFAULT_AGAINST_FINDING_OPTIONS;
  const driverLabel = options.driverLabel ?? lapLabel(driver, driver.source);
  let otherLabel = options.otherLabel ?? lapLabel(other, driver.source);
  if (otherLabel === driverLabel) otherLabel = `the other ${otherLabel}`;
  const a = pairLapOfDriver(driver, envelope, track, driverLabel);
  const b = pairLapOfDriver(other, envelope, track, otherLabel);
  const ref = pairLapOfReference(reference);
  const pair = pairCorners(track, a, b, { pedalThreshold });
  const driverToReference = stretchTimesLostS(track, a, ref, pair.bounds);
  const otherToReference = stretchTimesLostS(track, b, ref, pair.bounds);
  const corners: AgainstCorner[] = pair.corners.map((corner, c) => ({
    ...corner,
    driverToReferenceS: driverToReference[c]!,
    otherToReferenceS: otherToReference[c]!,
  }));
  const notes: string[] = [];
  if (a.brakeEstimated || b.brakeEstimated)
    notes.push(
      `${[a, b]
        .filter((lap) => lap.brakeEstimated)
        .map((lap) => lap.label)
        .join(' and ')}: no brake channel, braking points estimated from the deceleration`,
    );
  return {
    source: other.source,
    lapNumber: other.lapNumber,
    label: otherLabel,
    driverLabel,
    lapTimeS: other.lapTimeS,
    driverLapTimeS: driver.lapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    deltaS: timeDeltaS(driver.timeS, other.timeS),
    otherToReferenceS: timeDeltaS(other.timeS, reference.trace.timeS),
    corners,
    findings: rankAgainstFindings(corners, driverLabel, otherLabel, findingOptions),
    notes,
  };
}
