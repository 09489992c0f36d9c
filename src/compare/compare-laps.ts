// A driver's lap against the reference lap of the same car, corner by corner, on the track's distance grid.
// The lap is partitioned among the corners (each owns its approach, the corner and the run out of it, split on
// the straights where both laps stop accelerating), so the corners' time losses add up to the lap-time gap.

import type { Envelope } from '../car/envelope.js';
import type { LapResult } from '../solve/types.js';
import type { TrackGrid } from '../track/types.js';
import type { ComparisonResult, CornerComparison, DriverLap } from './types.js';
import { findBrakingZones } from '../solve/braking-zones.js';
import { cornerLayoutOf, metresBeforeM } from '../track/corner-layout.js';
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

export function compareLaps(
  track: TrackGrid,
  car: { name: string },
  reference: LapResult,
  driver: DriverLap,
  envelope: Envelope,
  options: Partial<CompareOptions> = {},
): ComparisonResult {
  const settings = { ...DEFAULT_COMPARE_OPTIONS, ...options };
  const n = track.distanceM.length;
  const step = track.stepM;
  const closed = track.closed;
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
  const ref = reference.trace;
  const deltaS = timeDeltaS(driver.timeS, ref.timeS);
  const notes: string[] = [];

  const driverBrake = driver.brake ?? estimatedPedal(driver, envelope, 'brake');
  if (!driver.brake) notes.push('the log has no brake channel: braking points are estimated from the deceleration');
  const driverGripUse = new Float64Array(n);
  for (let i = 0; i < n; i++)
    driverGripUse[i] = envelope.gripUse(driver.speedMps[i]!, driver.axMps2[i]!, driver.ayMps2[i]!);
  const smoothHalf = Math.round(2.5 / step);
  const driverGripSmooth = movingAverage(driverGripUse, smoothHalf, closed);
  const referenceGripSmooth = movingAverage(ref.gripUse, smoothHalf, closed);

  const drv: LapView = {
    speedMps: driver.speedMps,
    timeS: driver.timeS,
    lapTimeS: driver.lapTimeS,
    brake: driverBrake,
  };
  const refView: LapView = { speedMps: ref.speedMps, timeS: ref.timeS, lapTimeS: reference.lapTimeS, brake: ref.brake };
  const stationM = track.distanceM;
  const driverZones = findBrakingZones({ closed, count: n, speedMps: driver.speedMps, stationM, brake: driverBrake });
  const referenceZones = reference.brakingZones;

  const spans = cornerLayoutOf(track).corners;
  if (spans.length === 0) notes.push('no corners found on this track: the whole lap is reported as one stretch');
  const bounds = ownershipBounds(spans, refView, drv, n, step, closed);
  const at = (values: Float64Array, u: number) => values[wrapIndex(u, n)]!;
  const deltaAt = (u: number) =>
    clockAt(driver.timeS, driver.lapTimeS, u, closed) - clockAt(ref.timeS, reference.lapTimeS, u, closed);

  const corners: CornerComparison[] = spans.map((span, c) => {
    const ownStart = bounds[c]!;
    const ownEnd = bounds[c + 1]!;
    const braking = compareBraking(
      referenceZones,
      driverZones,
      refView,
      drv,
      span,
      ownStart,
      n,
      step,
      settings.pedalThreshold,
    );
    const refBrake = braking.referenceBrake;
    const drvBrake = braking.driverBrake;
    const drvLift = braking.driverLift;
    const refMin = slowestPoint(ref.speedMps, span.entryIndex, span.exitIndex, n);
    const drvMin = slowestPoint(driver.speedMps, span.entryIndex, span.exitIndex, n);
    const lost = phaseTimesLost(span, ownStart, ownEnd, deltaAt);
    const entryLost = lost.entryS;
    const middleLost = lost.middleS;
    const exitLost = lost.exitS;
    const coastingS =
      driver.throttle && driver.brake
        ? coastingTime(
            driver.throttle,
            driver.brake,
            driver.timeS,
            driver.lapTimeS,
            ownStart,
            ownEnd,
            closed,
            settings.pedalThreshold,
          )
        : null;
    const referenceCoastingS =
      coastingS === null
        ? null
        : coastingTime(
            ref.throttle,
            ref.brake,
            ref.timeS,
            reference.lapTimeS,
            ownStart,
            ownEnd,
            closed,
            settings.pedalThreshold,
          );
    const grip = gripFigures(driverGripUse, driverGripSmooth, span.entryIndex, span.exitIndex, n);
    const referenceGrip = gripFigures(ref.gripUse, referenceGripSmooth, span.entryIndex, span.exitIndex, n);
    const fold = (u: number) => lapIndex(u, n, closed) * step;
    const beforeM = (pointM: number | null, placeM: number) =>
      pointM === null ? null : metresBeforeM(pointM, placeM, track);
    const foldM = (u: number | null) =>
      u === null ? null : closed ? wrapDistanceM(u * step, track.lengthM) : u * step;
    return {
      id: span.id,
      name: span.name,
      entryM: span.entryM,
      apexM: span.apexM,
      exitM: span.exitM,
      brakingPointDeltaM: braking.brakingPointDeltaM,
      brakingPointDeltaS: braking.brakingPointDeltaS,
      referenceBrakingPointM: foldM(refBrake),
      driverBrakingPointM: foldM(drvBrake),
      turnInM: span.entryM,
      referenceBeforeTurnInM: beforeM(foldM(refBrake), span.entryM),
      driverBeforeTurnInM: beforeM(foldM(drvBrake), span.entryM),
      markerName: span.marker?.name ?? null,
      driverBeforeMarkerM: span.marker ? beforeM(foldM(drvBrake), span.marker.atM) : null,
      entrySpeedDriverKph: mpsToKph(at(driver.speedMps, span.entryIndex)),
      entrySpeedReferenceKph: mpsToKph(at(ref.speedMps, span.entryIndex)),
      minSpeedDriverKph: mpsToKph(drvMin.value),
      minSpeedReferenceKph: mpsToKph(refMin.value),
      minSpeedDeltaKph: mpsToKph(drvMin.value - refMin.value),
      minSpeedOffsetFromApexM: (drvMin.index - span.apexIndex) * step,
      exitSpeedDriverKph: mpsToKph(at(driver.speedMps, span.exitIndex)),
      exitSpeedReferenceKph: mpsToKph(at(ref.speedMps, span.exitIndex)),
      entryTimeLostS: entryLost,
      middleTimeLostS: middleLost,
      exitTimeLostS: exitLost,
      timeLostS: entryLost + middleLost + exitLost,
      coastingS,
      meanGripUse: grip.mean,
      peakGripUse: grip.peak,
      stretches: gripStretches(driverGripSmooth, referenceGripSmooth, ownStart, ownEnd, n, step, fold, settings),
      ownStartM: fold(ownStart),
      ownEndM: fold(ownEnd),
      referenceMinSpeedOffsetFromApexM: (refMin.index - span.apexIndex) * step,
      driverLiftPointM: foldM(drvLift),
      liftPointDeltaM: braking.liftPointDeltaM,
      referenceCoastingS,
      referenceMeanGripUse: referenceGrip.mean,
      referencePeakGripUse: referenceGrip.peak,
    };
  });

  return {
    trackName: track.name,
    carName: car.name,
    driverLapTimeS: driver.lapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    demonstratedLapTimeS: settings.demonstratedLapTimeS,
    deltaS,
    driverGripUse,
    corners,
    findings: rankFindings(corners, settings.findings),
    notes,
    referenceEnvelopeKind: settings.referenceEnvelopeKind,
    carModelLapTimeS: settings.carModelLapTimeS,
    stepM: step,
  };
}
