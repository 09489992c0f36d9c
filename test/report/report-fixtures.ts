// Laps for the report tests: a reference lap simulated on an invented segment track, and a hand-built
// driver lap and comparison around it (the comparison's own code is tested elsewhere; here it is only drawn).

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCarJson } from '../../src/io/read-car.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments, type TrackSegment } from '../../src/track/segments.js';
import type { Car } from '../../src/car/types.js';
import type { ComparisonResult, CornerComparison, DriverLap } from '../../src/compare/types.js';
import type { ReportInput } from '../../src/report/html/model.js';
import type { LapResult } from '../../src/solve/types.js';
import type { Envelope } from '../../src/car/envelope.js';
import { readTrackFile } from '../../src/io/read-track.js';
import { compareLaps } from '../../src/compare/compare-laps.js';
import { driverLapFromSpeeds } from '../compare/fixtures.js';
import { lapAgainstLap } from '../../src/compare/against/lap-against-lap.js';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export const HOSTILE_CAR_NAME = '<img src=x onerror="window.__reportInjected=1">';
export const HOSTILE_CORNER_NAME = '</script><script>window.__reportInjected=2</script>';
export const HOSTILE_TRACK_NAME = 'Ferncombe "loop" <svg onload="window.__reportInjected=3">';

export function demoCar(name?: string): Car {
  const file = path.join(projectRoot, 'cars', 'brackle-club.json');
  const car = parseCarJson(readFileSync(file, 'utf8'), file);
  return name ? { ...car, name } : car;
}

/** A closed invented circuit: two hairpins joined by straights and an S-bend; it closes by symmetry. */
export function loopSegments(straightM: number): TrackSegment[] {
  return [
    { kind: 'straight', lengthM: straightM },
    { kind: 'arc', radiusM: 40, angleDeg: 90 },
    { kind: 'straight', lengthM: 120 },
    { kind: 'arc', radiusM: 60, angleDeg: 90 },
    { kind: 'straight', lengthM: straightM / 2 },
    { kind: 'arc', radiusM: 90, angleDeg: -45 },
    { kind: 'arc', radiusM: 90, angleDeg: 45 },
    { kind: 'straight', lengthM: straightM / 2 - 2 * 90 * Math.sin(Math.PI / 4) * 0 },
    { kind: 'arc', radiusM: 35, angleDeg: 90 },
    { kind: 'straight', lengthM: 120 },
    { kind: 'arc', radiusM: 50, angleDeg: 90 },
  ];
}

export function referenceInput(
  options: { stepM?: number; straightM?: number; carName?: string; trackName?: string; cornerName?: string } = {},
): ReportInput {
  const car = demoCar(options.carName);
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const track = trackFromSegments(
    {
      name: options.trackName ?? 'Ferncombe test loop (invented)',
      closed: false,
      widthM: 12,
      segments: loopSegments(options.straightM ?? 400),
      corners: options.cornerName ? [{ atM: (options.straightM ?? 400) + 30, name: options.cornerName }] : [],
    },
    options.stepM ?? 1,
    'test loop',
  );
  const reference = simulate(track, car, { ambient, envelope, startSpeedMps: 30 });
  return { reference, carName: car.name, envelope };
}

/** A driver a little slower than the reference, braking later and lifting earlier, with positions beside the line. */
export function syntheticDriver(
  reference: LapResult,
  envelope: Envelope,
): { driver: DriverLap; deltaS: Float64Array; gripUse: Float64Array } {
  const trace = reference.trace;
  const track = reference.track;
  const n = trace.count;
  const speedMps = new Float64Array(n);
  const throttle = new Float64Array(n);
  const brake = new Float64Array(n);
  const xM = new Float64Array(n);
  const yM = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = trace.stationM[i]!;
    speedMps[i] = trace.speedMps[i]! * (0.94 + 0.05 * Math.sin(s / 90));
    throttle[i] = trace.throttle[Math.max(0, i - 6)]! * 0.9;
    brake[i] = trace.brake[Math.min(n - 1, i + 4)]! * 0.8;
    const offsetM = 1.5 * Math.sin(s / 60);
    xM[i] = track.xM[i]! - Math.sin(track.headingRad[i]!) * offsetM;
    yM[i] = track.yM[i]! + Math.cos(track.headingRad[i]!) * offsetM;
  }
  const lap = driverLapFromSpeeds(track, speedMps, throttle, brake, 'session-03.csv');
  // driverLapFromSpeeds closes the loop; an open stage ends at its last sample.
  const lapTimeS = track.closed ? lap.lapTimeS : lap.timeS[n - 1]!;
  const driver: DriverLap = { ...lap, lapNumber: 2, lapTimeS, xM, yM, derivedChannels: ['longitudinal acceleration'] };
  const gripUse = new Float64Array(n);
  const deltaS = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    gripUse[i] = envelope.gripUse(speedMps[i]!, driver.axMps2[i]!, driver.ayMps2[i]!);
    deltaS[i] = driver.timeS[i]! - trace.timeS[i]!;
  }
  return { driver, deltaS, gripUse };
}

/** The synthetic driver with a hand-built comparison (fixed corner numbers and findings) around it. */
export function comparisonInput(options: Parameters<typeof referenceInput>[0] = {}): ReportInput {
  const base = referenceInput(options);
  const { reference, envelope } = base;
  const trace = reference.trace;
  const track = reference.track;
  const n = trace.count;
  const { driver, deltaS, gripUse } = syntheticDriver(reference, envelope);
  const speedMps = driver.speedMps;
  const corners: CornerComparison[] = reference.brakingZones.map((zone, index) => {
    const apex = zone.minSpeedIndex;
    const exit = Math.min(n - 1, apex + 80);
    return {
      id: index + 1,
      name: index === 0 ? (options.cornerName ?? null) : null,
      entryM: zone.startM,
      apexM: zone.minSpeedAtM,
      exitM: trace.stationM[exit]!,
      brakingPointDeltaM: -4,
      brakingPointDeltaS: -0.1,
      referenceBrakingPointM: zone.startM,
      driverBrakingPointM: zone.startM - 4,
      entrySpeedDriverKph: speedMps[zone.startIndex]! * 3.6,
      entrySpeedReferenceKph: zone.entrySpeedMps * 3.6,
      minSpeedDriverKph: speedMps[apex]! * 3.6,
      minSpeedReferenceKph: zone.minSpeedMps * 3.6,
      minSpeedDeltaKph: (speedMps[apex]! - zone.minSpeedMps) * 3.6,
      minSpeedOffsetFromApexM: 3,
      exitSpeedDriverKph: speedMps[exit]! * 3.6,
      exitSpeedReferenceKph: trace.speedMps[exit]! * 3.6,
      entryTimeLostS: 0.1,
      middleTimeLostS: 0.2,
      exitTimeLostS: 0.15,
      timeLostS: 0.45,
      coastingS: 0.3,
      meanGripUse: 0.8,
      peakGripUse: 1.05,
      stretches: [],
    };
  });
  const result: ComparisonResult = {
    trackName: track.name,
    carName: base.carName,
    driverLapTimeS: driver.lapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    demonstratedLapTimeS: null,
    deltaS,
    driverGripUse: gripUse,
    corners,
    findings: [
      {
        corner: 1,
        cornerName: options.cornerName ?? null,
        timeS: 0.45,
        claims: [
          { kind: 'brakes-early', brakingPointDeltaM: -4, brakingSpeedMps: 40, brakingPointDeltaS: -0.1 },
          { kind: 'coasts', coastingS: 0.3 },
        ],
      },
      { corner: null, cornerName: null, timeS: 0.2, claims: [{ kind: 'grip-unused', unusedLengthM: 120 }] },
      {
        corner: corners.length > 1 ? 2 : 1,
        cornerName: null,
        timeS: 0.6,
        claims: [{ kind: 'exit-slow', exitSpeedDeltaMps: -2 }],
      },
    ],
    notes: ['Positions from the log; speeds measured.'],
  };
  // The driver demonstrated 90 % of the tyre's friction: a second, smaller envelope for the g-g diagram.
  const car = demoCar(options.carName);
  const demonstratedEnvelope = buildEnvelope(
    { ...car, tyre: { ...car.tyre, muLong: car.tyre.muLong * 0.9, muLat: car.tyre.muLat * 0.9 } },
    ambientFrom(),
  );
  result.demonstratedLapTimeS = reference.lapTimeS * 1.04;
  return { ...base, comparison: { result, driver, demonstratedEnvelope } };
}

/**
 * The report's input through the library as a user's script would build it: the bundled demo track and car,
 * the reference from simulate, and the synthetic driver compared by compareLaps. Names may be replaced.
 */
export function pipelineInput(names: { carName?: string; trackName?: string; cornerName?: string } = {}): ReportInput {
  const car = demoCar(names.carName);
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const read = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), {
    stepM: 1,
    columns: {},
    widthM: null,
    layout: 'auto',
    smoothingM: null,
  });
  const track = {
    ...read,
    name: names.trackName ?? read.name,
    corners: read.corners.map((corner, index) =>
      index === 0 && names.cornerName ? { ...corner, name: names.cornerName } : corner,
    ),
  };
  const reference = simulate(track, car, { ambient, envelope });
  const { driver } = syntheticDriver(reference, envelope);
  const result = compareLaps(track, car, reference, driver, envelope);
  const demonstratedEnvelope = buildEnvelope(
    { ...car, tyre: { ...car.tyre, muLong: car.tyre.muLong * 0.9, muLat: car.tyre.muLat * 0.9 } },
    ambient,
  );
  return { reference, carName: car.name, envelope, comparison: { result, driver, demonstratedEnvelope } };
}

/**
 * The pipeline's driver set against a second lap through the library (lapAgainstLap): the reference's speeds
 * scaled by 0.97 with its pedals, a steadier lap than the driver's, lap 4 of another invented log.
 */
export function againstInput(): ReportInput {
  const base = pipelineInput();
  const comparison = base.comparison!;
  const reference = base.reference;
  const track = reference.track;
  const trace = reference.trace;
  const speedMps = trace.speedMps.map((v) => v * 0.97);
  const lap = driverLapFromSpeeds(track, speedMps, trace.throttle.slice(), trace.brake.slice(), 'teammate-07.csv');
  const lapTimeS = track.closed ? lap.lapTimeS : lap.timeS[trace.count - 1]!;
  const other: DriverLap = { ...lap, lapNumber: 4, lapTimeS };
  const result = lapAgainstLap(track, reference, comparison.driver, other, base.envelope);
  return { ...base, against: { result, other } };
}
