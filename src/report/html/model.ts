// What the lap report draws, gathered once from the solver's and the comparison's records and converted to
// display units (km/h or mph, %, g), so the chart builders only map numbers to pixels.

import type { Envelope } from '../../car/envelope.js';
import type { ComparisonResult, DriverLap } from '../../compare/types.js';
import type { AgainstResult } from '../../compare/against/lap-against-lap.js';
import type { SessionReportPart } from './session-sections.js';
import type { LapResult } from '../../solve/types.js';
import { kphToMps, STANDARD_GRAVITY_MPS2 } from '../../units.js';
import { displayUnits, type DisplayUnits } from '../units.js';
import type { UncertainReference } from '../../uncertainty/uncertain-reference.js';

export interface ReportInput {
  reference: LapResult;
  carName: string;
  /** The car model's envelope, drawn on the g-g diagram. */
  envelope: Envelope;
  /** Positions of the racing line the reference drives, on the track grid; the centreline when omitted. */
  linePositions?: { xM: Float64Array; yM: Float64Array };
  comparison?: {
    result: ComparisonResult;
    driver: DriverLap;
    /** The envelope fitted to the driver's own data, when there is one. */
    demonstratedEnvelope?: Envelope;
  };
  /** A second lap the driver's lap is set against (`compare --against`): drawn as a third trace, with the
   * driver's delta to it and the map coloured by where the driver gains or loses against it. */
  against?: {
    result: AgainstResult;
    other: DriverLap;
  };
  /** The whole session (`session --html`): its laps, corners and small multiples, above the best lap's report. */
  session?: SessionReportPart;
  /** The reference over draws of the car's uncertain fields: the speed is drawn as a band, the corners carry how often
   * their findings hold. */
  uncertainty?: UncertainReference;
  /** The units the page shows (metric when omitted); the page's data stays SI inside. */
  units?: DisplayUnits;
}

/** A stretch of the lap the page can zoom to: a corner of the comparison, or a braking zone of the reference. */
export interface ReportCorner {
  id: number;
  name: string | null;
  entryM: number;
  apexM: number;
  exitM: number;
}

export interface LapChannels {
  /** Speed in the page's units (ReportModel.units.speedLabel). */
  speedShown: Float64Array;
  /** 0-100 %, null where the log has no such channel. */
  throttlePct: Float64Array | null;
  brakePct: Float64Array | null;
  gripUsePct: Float64Array;
  /** 0/1 states of the reference (null for a driver's lap): the engine's full drive in use, an upshift's gap. */
  powerLimited: Uint8Array | null;
  shift: Uint8Array | null;
  axG: Float64Array;
  ayG: Float64Array;
  xM: Float64Array | null;
  yM: Float64Array | null;
}

/** A second logged lap as drawn: the channels the log gives, no grip use (its envelope is the driver's). */
export type OtherLapChannels = Pick<
  LapChannels,
  'speedShown' | 'throttlePct' | 'brakePct' | 'axG' | 'ayG' | 'xM' | 'yM'
>;

export interface ReportModel {
  input: ReportInput;
  units: DisplayUnits;
  lengthM: number;
  closed: boolean;
  stationM: Float64Array;
  reference: LapChannels;
  driver: (LapChannels & { deltaS: Float64Array }) | null;
  /** The other lap of `compare --against`, with the driver's delta to it (driver minus other lap, s). */
  other: (OtherLapChannels & { label: string; driverDeltaS: Float64Array }) | null;
  corners: ReportCorner[];
}

function scaled(values: ArrayLike<number>, factor: number): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i]! * factor;
  return out;
}

function requireLength(name: string, values: ArrayLike<number> | null, count: number): void {
  if (values && values.length !== count)
    throw new Error(`lap report: ${name} has ${values.length} samples but the track grid has ${count}`);
}

/** The track's corners for a page without a driver, each from the brake point that serves it (else its turn-in)
 * to its exit, so a corner without braking keeps its number. */
function referenceCorners(result: LapResult): ReportCorner[] {
  return result.corners.corners.map((corner) => {
    let entryM = corner.entryM;
    for (const zone of result.brakingZones)
      if (zone.corner === corner.id && zone.startM < entryM && zone.startM <= corner.apexM) entryM = zone.startM;
    return { id: corner.id, name: corner.name, entryM, apexM: corner.apexM, exitM: corner.exitM };
  });
}

export function reportModel(input: ReportInput): ReportModel {
  const { reference } = input;
  const { trace, track } = reference;
  const count = trace.count;
  const g = 1 / STANDARD_GRAVITY_MPS2;
  const units = input.units ?? displayUnits('metric');
  const speedFactor = units.speed(1);
  const xM = input.linePositions?.xM ?? track.xM;
  const yM = input.linePositions?.yM ?? track.yM;
  requireLength('line positions', xM, count);
  requireLength('line positions', yM, count);
  const referenceChannels: LapChannels = {
    speedShown: scaled(trace.speedMps, speedFactor),
    throttlePct: scaled(trace.throttle, 100),
    brakePct: scaled(trace.brake, 100),
    gripUsePct: scaled(trace.gripUse, 100),
    powerLimited: trace.powerLimited,
    shift: trace.hasGears ? trace.shift : null,
    axG: scaled(trace.axMps2, g),
    ayG: scaled(trace.ayMps2, g),
    xM,
    yM,
  };
  let driver: ReportModel['driver'] = null;
  let corners = referenceCorners(reference);
  const comparison = input.comparison;
  if (comparison) {
    const lap = comparison.driver;
    const result = comparison.result;
    for (const [name, values] of [
      ['driver speed', lap.speedMps],
      ['driver throttle', lap.throttle],
      ['driver brake', lap.brake],
      ['driver positions', lap.xM],
      ['time delta', result.deltaS],
      ['driver grip use', result.driverGripUse],
    ] as const) {
      requireLength(name, values, count);
    }
    driver = {
      speedShown: scaled(lap.speedMps, speedFactor),
      throttlePct: lap.throttle ? scaled(lap.throttle, 100) : null,
      brakePct: lap.brake ? scaled(lap.brake, 100) : null,
      gripUsePct: scaled(result.driverGripUse, 100),
      powerLimited: null,
      shift: null,
      axG: scaled(lap.axMps2, g),
      ayG: scaled(lap.ayMps2, g),
      xM: lap.xM,
      yM: lap.yM,
      deltaS: Float64Array.from(result.deltaS),
    };
    corners = result.corners.map((corner) => ({
      id: corner.id,
      name: corner.name,
      entryM: corner.entryM,
      apexM: corner.apexM,
      exitM: corner.exitM,
    }));
  }
  return {
    input,
    units,
    lengthM: track.lengthM,
    closed: track.closed,
    stationM: trace.stationM,
    reference: referenceChannels,
    driver,
    other: driver ? otherChannels(input, count, speedFactor) : null,
    corners,
  };
}

function otherChannels(input: ReportInput, count: number, speedFactor: number): ReportModel['other'] {
  const against = input.against;
  if (!against) return null;
  const lap = against.other;
  for (const [name, values] of [
    ['other lap speed', lap.speedMps],
    ['other lap throttle', lap.throttle],
    ['other lap brake', lap.brake],
    ['delta to the other lap', against.result.deltaS],
  ] as const)
    requireLength(name, values, count);
  return {
    label: against.result.label,
    speedShown: scaled(lap.speedMps, speedFactor),
    throttlePct: lap.throttle ? scaled(lap.throttle, 100) : null,
    brakePct: lap.brake ? scaled(lap.brake, 100) : null,
    axG: scaled(lap.axMps2, 1 / STANDARD_GRAVITY_MPS2),
    ayG: scaled(lap.ayMps2, 1 / STANDARD_GRAVITY_MPS2),
    xM: lap.xM,
    yM: lap.yM,
    driverDeltaS: Float64Array.from(against.result.deltaS),
  };
}

/** The distance range a corner zooms to: the corner and a margin either side, inside the lap. */
export function cornerRangeM(corner: ReportCorner, lengthM: number): [number, number] {
  const start = Math.min(corner.entryM, corner.apexM);
  const end = Math.max(corner.exitM, corner.apexM);
  const margin = Math.max(40, 0.25 * (end - start));
  const from = Math.max(0, start - margin);
  const to = Math.min(lengthM, end + margin);
  return to - from > 20 ? [from, to] : [Math.max(0, from - 10), Math.min(lengthM, to + 10)];
}

/** Converters of the comparison's km/h and m figures into the page's units, a missing value kept missing. */
export function shownUnits(model: ReportModel): {
  speedOfKph: (kph: number | null | undefined) => number | null;
  distanceOfM: (m: number | null | undefined) => number | null;
} {
  const units = model.units;
  return {
    speedOfKph: (kph) => (kph === null || kph === undefined ? null : units.speed(kphToMps(kph))),
    distanceOfM: (m) => (m === null || m === undefined ? null : units.distance(m)),
  };
}
