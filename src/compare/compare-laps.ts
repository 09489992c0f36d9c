// A driver's lap against the reference lap of the same car, corner by corner, on the track's distance grid.
// The lap is partitioned among the corners (each owns its approach, the corner and the run out of it, split on
// the straights where both laps stop accelerating), so the corners' time losses add up to the lap-time gap.

import type { Envelope } from '../car/envelope.js';
import type { LapResult } from '../solve/types.js';
import type { TrackGrid } from '../track/types.js';
import type { ComparisonResult, CornerComparison, DriverLap } from './types.js';
import { findBrakingZones } from '../solve/braking-zones.js';
import { cornerLayoutOf, metresBeforeM } from '../track/corner-layout.js';
import type { CornerSpan } from '../track/corners.js';
import { movingAverage } from './derive.js';
import { clockAt, timeDeltaS } from './delta.js';
import { rankFindings } from './findings.js';
import { mpsToKph } from '../units.js';
import { DEFAULT_COMPARE_OPTIONS, type CompareOptions } from './compare-options.js';
import { estimatedPedal } from './estimated-pedal.js';
import { slowestPoint, type LapView } from './lap-samples.js';
import { coastingTime, ownershipBounds, phaseTimesLost } from './corner-phases.js';
import { compareBraking } from './braking-points.js';
import { gripFigures, gripStretches } from './grip-use.js';
import { lapIndex, wrapDistanceM, wrapIndex } from '../numeric/lap-index.js';

/** What every corner's comparison reads: both laps on the grid, their braking zones, grip use and the clock gap. */
interface LapPair {
  track: TrackGrid;
  settings: CompareOptions;
  driver: DriverLap;
  reference: LapResult;
  drv: LapView;
  refView: LapView;
  driverZones: readonly { startIndex: number }[];
  driverGripUse: Float64Array;
  driverGripSmooth: Float64Array;
  referenceGripSmooth: Float64Array;
  /** Driver's clock minus the reference's at fractional station u. */
  deltaAt: (u: number) => number;
}

function assertOnGrid(track: TrackGrid, reference: LapResult, driver: DriverLap): void {
  const n = track.distanceM.length;
  for (const [name, values] of [
    ['time', driver.timeS],
    ['speed', driver.speedMps],
    ['ax', driver.axMps2],
    ['ay', driver.ayMps2],
  ] as const) {
    if (values.length !== n)
      throw new Error(`driver lap ${name} has ${values.length} stations but the track grid has ${n}`);
  }
  if (reference.trace.count !== n)
    throw new Error(`reference lap has ${reference.trace.count} samples but the track grid has ${n}`);
}

/** Coasting time of the driver (where the log has both pedals) and of the reference over [ownStart, ownEnd]. */
function cornerCoasting(pair: LapPair, ownStart: number, ownEnd: number) {
  const { driver, reference, track, settings } = pair;
  if (!driver.throttle || !driver.brake) return { coastingS: null, referenceCoastingS: null };
  const ref = reference.trace;
  const threshold = settings.pedalThreshold;
  return {
    coastingS: coastingTime(
      driver.throttle,
      driver.brake,
      driver.timeS,
      driver.lapTimeS,
      ownStart,
      ownEnd,
      track.closed,
      threshold,
    ),
    referenceCoastingS: coastingTime(
      ref.throttle,
      ref.brake,
      ref.timeS,
      reference.lapTimeS,
      ownStart,
      ownEnd,
      track.closed,
      threshold,
    ),
  };
}

/** One corner of the lap, owned from station ownStart to ownEnd: braking, speeds, time by phase, grip. */
function compareCorner(pair: LapPair, span: CornerSpan, ownStart: number, ownEnd: number): CornerComparison {
  const { track, settings, driver, reference, drv, refView } = pair;
  const n = track.distanceM.length;
  const step = track.stepM;
  const closed = track.closed;
  const ref = reference.trace;
  const at = (values: Float64Array, u: number) => values[wrapIndex(u, n)]!;
  const braking = compareBraking(
    reference.brakingZones,
    pair.driverZones,
    refView,
    drv,
    span,
    ownStart,
    n,
    step,
    settings.pedalThreshold,
  );
  const refMin = slowestPoint(ref.speedMps, span.entryIndex, span.exitIndex, n);
  const drvMin = slowestPoint(driver.speedMps, span.entryIndex, span.exitIndex, n);
  const lost = phaseTimesLost(span, ownStart, ownEnd, pair.deltaAt);
  const { coastingS, referenceCoastingS } = cornerCoasting(pair, ownStart, ownEnd);
  const grip = gripFigures(pair.driverGripUse, pair.driverGripSmooth, span.entryIndex, span.exitIndex, n);
  const referenceGrip = gripFigures(ref.gripUse, pair.referenceGripSmooth, span.entryIndex, span.exitIndex, n);
  const fold = (u: number) => lapIndex(u, n, closed) * step;
  const beforeM = (pointM: number | null, placeM: number) =>
    pointM === null ? null : metresBeforeM(pointM, placeM, track);
  const foldM = (u: number | null) => (u === null ? null : closed ? wrapDistanceM(u * step, track.lengthM) : u * step);
  const referenceBrakingPointM = foldM(braking.referenceBrake);
  const driverBrakingPointM = foldM(braking.driverBrake);
  return {
    id: span.id,
    name: span.name,
    entryM: span.entryM,
    apexM: span.apexM,
    exitM: span.exitM,
    brakingPointDeltaM: braking.brakingPointDeltaM,
    brakingPointDeltaS: braking.brakingPointDeltaS,
    referenceBrakingPointM,
    driverBrakingPointM,
    turnInM: span.entryM,
    referenceBeforeTurnInM: beforeM(referenceBrakingPointM, span.entryM),
    driverBeforeTurnInM: beforeM(driverBrakingPointM, span.entryM),
    markerName: span.marker?.name ?? null,
    driverBeforeMarkerM: span.marker ? beforeM(driverBrakingPointM, span.marker.atM) : null,
    entrySpeedDriverKph: mpsToKph(at(driver.speedMps, span.entryIndex)),
    entrySpeedReferenceKph: mpsToKph(at(ref.speedMps, span.entryIndex)),
    minSpeedDriverKph: mpsToKph(drvMin.value),
    minSpeedReferenceKph: mpsToKph(refMin.value),
    minSpeedDeltaKph: mpsToKph(drvMin.value - refMin.value),
    minSpeedOffsetFromApexM: (drvMin.index - span.apexIndex) * step,
    exitSpeedDriverKph: mpsToKph(at(driver.speedMps, span.exitIndex)),
    exitSpeedReferenceKph: mpsToKph(at(ref.speedMps, span.exitIndex)),
    entryTimeLostS: lost.entryS,
    middleTimeLostS: lost.middleS,
    exitTimeLostS: lost.exitS,
    timeLostS: lost.entryS + lost.middleS + lost.exitS,
    coastingS,
    meanGripUse: grip.mean,
    peakGripUse: grip.peak,
    stretches: gripStretches(
      pair.driverGripSmooth,
      pair.referenceGripSmooth,
      ownStart,
      ownEnd,
      n,
      step,
      fold,
      settings,
    ),
    ownStartM: fold(ownStart),
    ownEndM: fold(ownEnd),
    referenceMinSpeedOffsetFromApexM: (refMin.index - span.apexIndex) * step,
    driverLiftPointM: foldM(braking.driverLift),
    liftPointDeltaM: braking.liftPointDeltaM,
    referenceCoastingS,
    referenceMeanGripUse: referenceGrip.mean,
    referencePeakGripUse: referenceGrip.peak,
  };
}

export function compareLaps(
  track: TrackGrid,
  car: { name: string },
  reference: LapResult,
  driver: DriverLap,
  envelope: Envelope,
  options: Partial<CompareOptions> = {},
): ComparisonResult {
  const settings = { ...DEFAULT_COMPARE_OPTIONS, ...options };
  assertOnGrid(track, reference, driver);
  const n = track.distanceM.length;
  const step = track.stepM;
  const closed = track.closed;
  const ref = reference.trace;
  const notes: string[] = [];

  const driverBrake = driver.brake ?? estimatedPedal(driver, envelope, 'brake');
  if (!driver.brake) notes.push('the log has no brake channel: braking points are estimated from the deceleration');
  const driverGripUse = new Float64Array(n);
  for (let i = 0; i < n; i++)
    driverGripUse[i] = envelope.gripUse(driver.speedMps[i]!, driver.axMps2[i]!, driver.ayMps2[i]!);
  const smoothHalf = Math.round(2.5 / step);
  const drv: LapView = {
    speedMps: driver.speedMps,
    timeS: driver.timeS,
    lapTimeS: driver.lapTimeS,
    brake: driverBrake,
  };
  const refView: LapView = { speedMps: ref.speedMps, timeS: ref.timeS, lapTimeS: reference.lapTimeS, brake: ref.brake };
  const pair: LapPair = {
    track,
    settings,
    driver,
    reference,
    drv,
    refView,
    driverZones: findBrakingZones({
      closed,
      count: n,
      speedMps: driver.speedMps,
      stationM: track.distanceM,
      brake: driverBrake,
    }),
    driverGripUse,
    driverGripSmooth: movingAverage(driverGripUse, smoothHalf, closed),
    referenceGripSmooth: movingAverage(ref.gripUse, smoothHalf, closed),
    deltaAt: (u: number) =>
      clockAt(driver.timeS, driver.lapTimeS, u, closed) - clockAt(ref.timeS, reference.lapTimeS, u, closed),
  };

  const spans = cornerLayoutOf(track).corners;
  if (spans.length === 0) notes.push('no corners found on this track: the whole lap is reported as one stretch');
  const bounds = ownershipBounds(spans, refView, drv, n, step, closed);
  const corners = spans.map((span, c) => compareCorner(pair, span, bounds[c]!, bounds[c + 1]!));

  return {
    trackName: track.name,
    carName: car.name,
    driverLapTimeS: driver.lapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    demonstratedLapTimeS: settings.demonstratedLapTimeS,
    deltaS: timeDeltaS(driver.timeS, ref.timeS),
    driverGripUse,
    corners,
    findings: rankFindings(corners, settings.findings),
    notes,
    referenceEnvelopeKind: settings.referenceEnvelopeKind,
    carModelLapTimeS: settings.carModelLapTimeS,
    stepM: step,
  };
}
