// An invented driver for the demo: a line of its own that uses the track (the racing line's shape, not all of its
// width), the car's lap on that line driven a little inside the tyres' grip, with four faults a coach
// would recognise (brakes too early at one corner, too late and too hard at another, coasts through a third, lifts
// early at a fast one), logged at 20 Hz with sensor noise and GPS noise (seeded, reproducible).

import type { Envelope } from '../car/envelope.js';
import type { Ambient, Car } from '../car/types.js';
import { simulate } from '../solve/simulate.js';
import type { LapResult } from '../solve/types.js';
import type { Path, TrackGrid } from '../track/types.js';
import { linePath, linePositions } from '../line/geometry.js';
import { localPlane } from '../track/geodesy.js';
import type { CornerSpan } from '../track/corners.js';
import { cornerLayoutOf } from '../track/corner-layout.js';
import { mps2ToG, mpsToKph, kphToMps } from '../units.js';
import { seededRandom } from '../numeric/seeded-random.js';
import { wrapIndex } from '../numeric/lap-index.js';
import { interpolateOnLap, lerp } from '../numeric/interpolate.js';

export interface DemoFault {
  kind: 'early-braking' | 'late-hard-braking' | 'coasting' | 'early-lift';
  cornerId: number;
  cornerName: string | null;
}

/** Where the invented driver drives, on the track's grid. */
export interface DemoDriverPath extends Path {
  /** Lateral offset from the centreline, m, positive to the left. */
  offsetM: Float64Array;
  xM: Float64Array;
  yM: Float64Array;
}

/**
 * Share of the racing line's offsets the driver uses: towards the outside before a corner and towards the apex,
 * but never as far as the line does, so the driver's path is tighter everywhere and slower through a chicane that
 * the line straightens (an invented habit, not a measured one).
 */
const LINE_SHARE = 0.92;

/** The driver's own line from a racing line's offsets; without one (a track without widths) the centreline. */
export function demoDriverPath(track: TrackGrid, lineOffsetM: Float64Array | undefined): DemoDriverPath {
  const offsetM = new Float64Array(track.distanceM.length);
  if (lineOffsetM) for (let i = 0; i < offsetM.length; i++) offsetM[i] = LINE_SHARE * lineOffsetM[i]!;
  return { ...linePath(track, offsetM), ...linePositions(track, offsetM), offsetM };
}

export interface DemoDriverLap {
  /** On the track grid: speed, pedals (0-1), acceleration and time, as the invented driver drives them. */
  speedMps: Float64Array;
  throttle: Float64Array;
  brake: Float64Array;
  timeS: Float64Array;
  lapTimeS: number;
  faults: DemoFault[];
  /** The driver's own line. */
  path: DemoDriverPath;
}

/**
 * Share of the tyres' grip the driver uses (a little below the limit): 0.985^2, so the corners go at 98.5 % of the
 * car's speed on the driver's line, while the straights are the car's own full-throttle acceleration.
 */
export const DEMO_GRIP_SHARE = 0.985 ** 2;

/** The car's lap on the driver's line with the driver's share of the grip: what the faults are made from. */
export function demoDriverReference(track: TrackGrid, car: Car, ambient: Ambient, path: DemoDriverPath): LapResult {
  const tyre = { ...car.tyre, muLat: car.tyre.muLat * DEMO_GRIP_SHARE, muLong: car.tyre.muLong * DEMO_GRIP_SHARE };
  return simulate(track, { ...car, tyre }, { ambient, path });
}

/** The invented driver's lap, whole: its own line from a racing line's offsets (the centreline without them), the
 * car's lap on that line at the driver's share of the grip, and the four faults made from it. */
export function demoDriver(
  track: TrackGrid,
  car: Car,
  ambient: Ambient,
  envelope: Envelope,
  lineOffsetM: Float64Array | undefined,
): DemoDriverLap {
  const path = demoDriverPath(track, lineOffsetM);
  return demoDriverLap(track, demoDriverReference(track, car, ambient, path), envelope, path);
}

/** The driver's lap on the grid, made by the four faults from its lap on its own line (demoDriverReference). */
export function demoDriverLap(
  track: TrackGrid,
  reference: LapResult,
  envelope: Envelope,
  path: DemoDriverPath = demoDriverPath(track, undefined),
): DemoDriverLap {
  const n = track.distanceM.length;
  const step = track.stepM;
  const segmentM = path.segmentLengthM;
  const ref = reference.trace;
  const speed = ref.speedMps.slice();
  const coastMask = new Uint8Array(n);
  const corners = cornerLayoutOf(track).corners;
  const zones = reference.brakingZones;
  // Corners by what the reference does there: the braking ones by entry speed, the fast ones by their slowest speed.
  const braked = corners
    .map((corner) => ({ corner, zone: zones.find((z) => near(z.minSpeedIndex, corner, n)) }))
    .filter((entry): entry is { corner: CornerSpan; zone: (typeof zones)[number] } => entry.zone !== undefined)
    .sort((a, b) => b.zone.entrySpeedMps - a.zone.entrySpeedMps);
  // The fast corner for the early lift: the quickest apex among the corners the other faults leave alone.
  const fast = corners
    .filter((corner) => !braked.slice(0, 3).some((entry) => entry.corner === corner))
    .sort((a, b) => ref.speedMps[b.apexIndex]! - ref.speedMps[a.apexIndex]!);
  const faults: DemoFault[] = [];
  const note = (kind: DemoFault['kind'], corner: CornerSpan) =>
    faults.push({ kind, cornerId: corner.id, cornerName: corner.name });

  // Mean deceleration of the reference over a braking zone, from v^2 = v0^2 - 2 a d.
  const meanDecel = (zone: (typeof zones)[number]) =>
    Math.max(2, (zone.entrySpeedMps ** 2 - zone.minSpeedMps ** 2) / (2 * Math.max(step, zone.brakingLengthM)));
  if (braked[0]) {
    // Too early: the braking starts 45 m before the reference's, at 80 % of its deceleration, then holds the speed.
    const { corner, zone } = braked[0];
    earlyBraking(
      speed,
      zone.startIndex - Math.round(45 / step),
      unwrapAfter(zone.minSpeedIndex, zone.startIndex, n),
      0.8 * meanDecel(zone),
      segmentM,
      n,
    );
    note('early-braking', corner);
  }
  if (braked[1]) {
    // Too late and too hard: 12 m after the reference, 15 % beyond the car's braking limit (at the lateral load of the
    // driver's line), slowing 8 km/h too far.
    const { corner, zone } = braked[1];
    const floor = zone.minSpeedMps - kphToMps(8);
    const end = lateBraking(
      speed,
      zone.startIndex,
      unwrapAfter(zone.minSpeedIndex, zone.startIndex, n),
      Math.round(12 / step),
      (v, k) => 1.15 * envelope.brakeLimitMps2(v, v * v * path.curvaturePerM[k]!),
      floor,
      segmentM,
      n,
    );
    recoverFrom(speed, end, envelope, path, n);
    note('late-hard-braking', corner);
  }
  if (braked[2]) {
    // Coasting: after the slowest point 1.5 s with neither pedal before the throttle comes back.
    const { corner, zone } = braked[2];
    const end = coastFor(speed, coastMask, zone.minSpeedIndex, 1.5, envelope, segmentM);
    recoverFrom(speed, end, envelope, path, n);
    note('coasting', corner);
  }
  const liftCorner = fast.find((corner) => ref.speedMps[corner.apexIndex]! > 25);
  if (liftCorner) {
    // Early lift: off the throttle 150 m before the apex, coasting down, back on at the apex.
    liftBefore(
      speed,
      coastMask,
      liftCorner.apexIndex - Math.round(150 / step),
      liftCorner.apexIndex,
      envelope,
      segmentM,
    );
    recoverFrom(speed, liftCorner.apexIndex, envelope, path, n);
    note('early-lift', liftCorner);
  }
  const { throttle, brake } = pedalsFor(speed, path, envelope, coastMask);
  const { timeS, lapTimeS } = lapClock(speed, segmentM);
  return { speedMps: speed, throttle, brake, timeS, lapTimeS, faults, path };
}

/** Time at each point of a closed lap and the lap time, at the mean speed of each segment. */
function lapClock(speed: Float64Array, segmentM: Float64Array): { timeS: Float64Array; lapTimeS: number } {
  const n = speed.length;
  const timeS = new Float64Array(n);
  let elapsed = 0;
  for (let i = 0; i < n; i++) {
    timeS[i] = elapsed;
    elapsed += (2 * segmentM[i]!) / (speed[i]! + speed[(i + 1) % n]!);
  }
  return { timeS, lapTimeS: elapsed };
}

/** Neither pedal from `start` for `durationS`, the car slowing by its coasting drag alone; returns the last index
 * coasted (unwrapped). */
function coastFor(
  speed: Float64Array,
  coastMask: Uint8Array,
  start: number,
  durationS: number,
  envelope: Envelope,
  segmentM: Float64Array,
): number {
  const n = speed.length;
  let i = start;
  let v = speed[wrapIndex(i, n)]!;
  let elapsed = 0;
  while (elapsed < durationS) {
    const k = wrapIndex(i, n);
    speed[k] = Math.min(speed[k]!, v);
    coastMask[k] = 1;
    const decel = envelope.coastDecelMps2(v);
    const next = Math.sqrt(Math.max(1, v * v - 2 * decel * segmentM[k]!));
    elapsed += (2 * segmentM[k]!) / (v + next);
    v = next;
    i++;
  }
  return i - 1;
}

/** Off the throttle from `start` to `apex` (unwrapped indices), slowing by the coasting drag and a light 0.8 m/s^2
 * of engine braking. */
function liftBefore(
  speed: Float64Array,
  coastMask: Uint8Array,
  start: number,
  apex: number,
  envelope: Envelope,
  segmentM: Float64Array,
): void {
  const n = speed.length;
  let v = speed[wrapIndex(start, n)]!;
  for (let i = start; i <= apex; i++) {
    const k = wrapIndex(i, n);
    v = Math.min(v, speed[k]!);
    speed[k] = v;
    coastMask[k] = 1;
    v = Math.sqrt(Math.max(1, v * v - 2 * (envelope.coastDecelMps2(v) + 0.8) * segmentM[k]!));
  }
}

function near(index: number, corner: CornerSpan, n: number): boolean {
  for (const shift of [-n, 0, n])
    if (index + shift >= corner.entryIndex - 40 && index + shift <= corner.exitIndex + 10) return true;
  return false;
}

const unwrapAfter = (index: number, from: number, n: number) => (index < from ? index + n : index);

/** Braking from `start` at a constant deceleration, never faster than planned, held at the slowest planned speed. */
function earlyBraking(
  speed: Float64Array,
  start: number,
  minIndex: number,
  decelMps2: number,
  segmentM: Float64Array,
  n: number,
): void {
  const floor = speed[wrapIndex(minIndex, n)]!;
  let v = speed[wrapIndex(start, n)]!;
  for (let i = start; i <= minIndex; i++) {
    const k = wrapIndex(i, n);
    speed[k] = Math.min(speed[k]!, Math.max(floor, v));
    v = Math.sqrt(Math.max(0, v * v - 2 * decelMps2 * segmentM[k]!));
  }
}

/** Holds the braking-point speed `lateSamples` further, then brakes at `decelMps2` down to `floor`, held to the
 * slowest point; returns the index where the driver starts to accelerate again. */
function lateBraking(
  speed: Float64Array,
  start: number,
  minIndex: number,
  lateSamples: number,
  decelMps2: (speedMps: number, index: number) => number,
  floor: number,
  segmentM: Float64Array,
  n: number,
): number {
  const peak = speed[wrapIndex(start, n)]!;
  let i = start;
  for (; i < start + lateSamples; i++) speed[wrapIndex(i, n)] = Math.max(speed[wrapIndex(i, n)]!, peak);
  let v = peak;
  for (; v > floor; i++) {
    speed[wrapIndex(i, n)] = Math.max(floor, v);
    v = Math.sqrt(Math.max(0, v * v - 2 * decelMps2(v, wrapIndex(i, n)) * segmentM[wrapIndex(i, n)]!));
  }
  for (; i <= minIndex; i++) speed[wrapIndex(i, n)] = floor;
  speed[wrapIndex(i, n)] = floor;
  return i;
}

/** From index `from`, accelerates on the car's envelope until the speed meets the driver's profile again. */
function recoverFrom(speed: Float64Array, from: number, envelope: Envelope, path: Path, n: number): void {
  let v = speed[wrapIndex(from, n)]!;
  for (let i = from + 1; i < from + n; i++) {
    const k = wrapIndex(i, n);
    const ay = v * v * path.curvaturePerM[k]!;
    const a = Math.max(0, envelope.accelLimitMps2(v, ay)) * 0.95;
    v = Math.sqrt(v * v + 2 * a * path.segmentLengthM[wrapIndex(k - 1, n)]!);
    if (v >= speed[k]!) return;
    speed[k] = v;
  }
}

/** Throttle and brake shares that produce the speed profile on this envelope (none where the driver coasts). */
function pedalsFor(
  speed: Float64Array,
  path: Path,
  envelope: Envelope,
  coastMask: Uint8Array,
): { throttle: Float64Array; brake: Float64Array } {
  const n = speed.length;
  const throttle = new Float64Array(n);
  const brake = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (coastMask[i]) continue;
    const v = speed[i]!;
    const next = speed[(i + 1) % n]!;
    const ax = (next * next - v * v) / (2 * path.segmentLengthM[i]!);
    const ay = v * v * path.curvaturePerM[i]!;
    const tyreAx = ax + envelope.coastDecelMps2(v);
    if (tyreAx >= 0)
      throttle[i] = Math.min(1, tyreAx / Math.max(1e-6, envelope.accelLimitMps2(v, ay) + envelope.coastDecelMps2(v)));
    else brake[i] = Math.min(1, -tyreAx / Math.max(1e-6, envelope.brakeLimitMps2(v, ay) - envelope.coastDecelMps2(v)));
  }
  return { throttle, brake };
}

export interface DemoLogOptions {
  rateHz: number;
  seed: number;
  /** Logging starts this far before the start line and ends this far after it, m (a flying lap in the middle). */
  leadInM: number;
  leadOutM: number;
}

export const DEFAULT_DEMO_LOG: DemoLogOptions = { rateHz: 20, seed: 20261202, leadInM: 400, leadOutM: 300 };

/** The lap as a data logger would record it: CSV with time, GPS position, speed, pedals, accelerations, noise included. */
export function demoLogCsv(track: TrackGrid, lap: DemoDriverLap, options: DemoLogOptions = DEFAULT_DEMO_LOG): string {
  if (!track.geoOrigin) throw new Error(`${track.source}: the demo track needs a geo origin for the GPS columns`);
  const plane = localPlane(track.geoOrigin);
  const { gaussian } = seededRandom(options.seed);
  const n = track.distanceM.length;
  const L = track.lengthM;
  const step = track.stepM;
  // Continuous clock over lead-in, lap and lead-out: the same lap repeated either side of the line.
  const clockAt = (s: number) => {
    const laps = Math.floor(s / L);
    const within = s - laps * L;
    const u = within / step;
    const i = Math.floor(u);
    const t0 = lap.timeS[i % n]!;
    const t1 = i + 1 >= n ? lap.lapTimeS : lap.timeS[i + 1]!;
    return laps * lap.lapTimeS + lerp(t0, t1, u - i);
  };
  const sample = (values: Float64Array, s: number) => {
    return interpolateOnLap(values, (((s % L) + L) % L) / step, n);
  };
  const startS = -options.leadInM;
  const endS = L + options.leadOutM;
  const t0 = clockAt(startS);
  const tEnd = clockAt(endS);
  const lines = ['time_s,lat_deg,lon_deg,speed_kph,throttle_pct,brake_pct,ax_g,ay_g'];
  const geo = new Float64Array(2);
  let s = startS;
  let biasX = 0;
  let biasY = 0;
  for (let k = 0; ; k++) {
    const t = t0 + k / options.rateHz;
    if (t > tEnd) break;
    // Advance s until its clock reaches t (speed is positive everywhere, so the clock is monotone in s).
    while (clockAt(s + step) < t) s += step;
    const ta = clockAt(s);
    const tb = clockAt(s + step);
    const at = s + ((t - ta) / Math.max(1e-9, tb - ta)) * step;
    const v = sample(lap.speedMps, at);
    const vNext = sample(lap.speedMps, at + step);
    const ax = (vNext * vNext - v * v) / (2 * sample(lap.path.segmentLengthM, at));
    const ay = v * v * sample(lap.path.curvaturePerM, at);
    // GPS: a slowly wandering bias plus white noise, about a metre in all (a consumer receiver, from memory).
    biasX = 0.98 * biasX + 0.1 * gaussian();
    biasY = 0.98 * biasY + 0.1 * gaussian();
    const x = sample(lap.path.xM, at) + biasX + 0.4 * gaussian();
    const y = sample(lap.path.yM, at) + biasY + 0.4 * gaussian();
    plane.toGeodetic(x, y, geo);
    const throttlePct = clampPct(sample(lap.throttle, at) * 100 + 0.4 * gaussian());
    const brakeShare = sample(lap.brake, at);
    const brakePct = brakeShare > 0.01 ? clampPct(brakeShare * 100 + 0.8 * gaussian()) : 0;
    lines.push(
      [
        (t - t0).toFixed(3),
        geo[0]!.toFixed(7),
        geo[1]!.toFixed(7),
        (mpsToKph(v) + 0.3 * gaussian()).toFixed(2),
        throttlePct.toFixed(1),
        brakePct.toFixed(1),
        (mps2ToG(ax) + 0.02 * gaussian()).toFixed(3),
        (mps2ToG(ay) + 0.02 * gaussian()).toFixed(3),
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}

const clampPct = (value: number) => Math.min(100, Math.max(0, value));
