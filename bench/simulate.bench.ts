// Benchmark of the core solver: one lap of a 5 km circuit at 1 m and 0.25 m step, medians of timed runs once the
// lap has settled (settledTimes below: compiled, and no longer taking page faults).
// Issue 18's targets at 1 m: simulate with every channel under 0.8 ms for a point-mass car without gears and under
// 1.0 ms with gears, the lap-time mode (lap time and braking points) under 0.5 ms, and reflap within 2.5 times a
// plain reference of the same passes written below in tight JavaScript (Brayshaw and Harrison's method, the point
// mass of src/car/point-mass.ts's header). Beside each car's figures, the same lap on a real circuit's centreline,
// whose curvature changes at every sample (the segment circuit's corner limits repeat arc by arc): Monza (5.8 km, TUM
// racetrack-database, LGPL v3, geometry from OpenStreetMap), read from ../shared and skipped with a message where
// absent.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { trackFromSegments, type TrackSegment } from '../src/track/segments.js';
import { readTrackFile } from '../src/io/read-track.js';
import { parseCarJson } from '../src/io/read-car.js';
import { simulate, simulateLapTime } from '../src/solve/simulate.js';
import { driveForceTable } from '../src/car/drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../src/units.js';
import type { Ambient, Car } from '../src/car/types.js';
import type { TrackGrid } from '../src/track/types.js';
import { buildEnvelope } from '../src/car/build-envelope.js';
import { ambientFrom } from '../src/car/ambient.js';
import type { Envelope } from '../src/car/envelope.js';
import {
  linearityVerdict,
  machineLoad,
  medianTimes,
  pairedMedianTimes,
  peakRssMb,
  verdict,
  type Timing,
} from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
export const monzaCsv = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks', 'Monza.csv');

/** Monza's centreline at 1 m (TUM racetrack-database, read from ../shared), or null where ../shared is absent. */
export function monzaCentreline(): TrackGrid | null {
  if (!existsSync(monzaCsv)) return null;
  return readTrackFile(monzaCsv, {
    stepM: 1,
    columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
    widthM: null,
    layout: 'auto',
    smoothingM: null,
  });
}

/** Warm-up of each timing, CPU seconds: V8 compiles the passes on another thread while they run, which on a busy
 * two-core machine took up to a tenth of a second a function, and a new car (fields that held whole numbers
 * before) or a new record shape sends them back for another compile. Twenty runs of a lap of 0.3 ms ended before
 * that and timed the passes half-compiled, at up to twice their settled cost. */
const WARM_UP_CPU_S = 0.3;
/** Most warm-up, CPU seconds, spent waiting for a stretch of laps without page faults (see settledTimes). */
const FAULT_WAIT_CPU_S = 3;
/** Laps in a row without a page fault that count as settled. */
const FAULT_FREE_LAPS = 30;

/**
 * Medians of `runs` timed runs once the work has settled: after WARM_UP_CPU_S of warm-up runs (at least 20), and then
 * until FAULT_FREE_LAPS runs in a row take no page fault (at most FAULT_WAIT_CPU_S). While V8 grows its young
 * generation over the first few hundred laps of a process, about every other stretch of fifteen laps takes 90-150
 * page faults a lap, at about 10 us each on this virtual machine, and a timed window of 40 laps fell on either side
 * of that: the full lap of brackle-club timed from 0.50 to 1.52 ms in ten fresh processes, with the faults (counted
 * by process.resourceUsage()) in the slow laps and none in the fast ones. A sweep or a line search runs thousands
 * of laps. The same for reflap and the plain passes, so the ratio compares settled code with settled code.
 */
function settledTimes(work: () => void, runs = 40) {
  settle(work);
  return medianTimes(work, runs, 0);
}

/** The warm-up of settledTimes alone. */
function settle(work: () => void): void {
  const start = process.cpuUsage();
  for (let k = 0; k < 20 || cpuSecondsSince(start) < WARM_UP_CPU_S; k++) work();
  let faultFree = 0;
  while (faultFree < FAULT_FREE_LAPS && cpuSecondsSince(start) < FAULT_WAIT_CPU_S) {
    const faultsBefore = process.resourceUsage().minorPageFault;
    work();
    faultFree = process.resourceUsage().minorPageFault === faultsBefore ? faultFree + 1 : 0;
  }
}

function cpuSecondsSince(start: NodeJS.CpuUsage): number {
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1e6;
}

/** A closed circuit of about 5 km that closes by construction: two equal straights, each with the same S-bend
 * (its sideways shifts cancel), a 180-degree hairpin at one end and a 90-straight-90 bend at the other. */
export function benchmarkCircuitSegments(): TrackSegment[] {
  const straight = (lengthM: number): TrackSegment => ({ kind: 'straight', lengthM });
  const sBend: TrackSegment[] = [
    { kind: 'arc', radiusM: 120, angleDeg: -40 },
    { kind: 'arc', radiusM: 120, angleDeg: 40 },
  ];
  return [
    straight(1450),
    ...sBend,
    straight(720),
    { kind: 'arc', radiusM: 60, angleDeg: 180 },
    straight(1450),
    ...sBend,
    straight(720),
    { kind: 'arc', radiusM: 30, angleDeg: 90 },
    straight(60),
    { kind: 'arc', radiusM: 30, angleDeg: 90 },
  ];
}

/** The same circuit in three dimensions: the straights climb and fall 2 % (the lap closes in height), the
 * hairpin is banked 8 degrees and the S-bends 3, so every road term is at work. */
export function benchmarkCircuitSegments3d(): TrackSegment[] {
  const grades = [2, 0, 0, -2, 0, -2, 0, 0, 2, 0, 0, 0, 0];
  const banks = [0, -3, 3, 0, 8, 0, -3, 3, 0, 4, 0, 4, 0];
  return benchmarkCircuitSegments().map((segment, k) => ({
    ...segment,
    gradePct: grades[k] ?? 0,
    bankDeg: banks[k] ?? 0,
  }));
}

/**
 * The same passes in plain, tight JavaScript, for the ratio: the point mass (normal load with downforce, mu under
 * load, friction ellipse, power or gear table, drag and rolling resistance) inline; corner limit by bisection;
 * forward pass with upshift gaps; backward pass solving each braking step's entry speed (Illinois regula falsi); a
 * flat closed lap. Returns the lap time, which the bench prints beside reflap's.
 */
function plainLapTimeS(track: TrackGrid, car: Car, ambient: Ambient): number {
  const n = track.distanceM.length;
  const k = track.curvaturePerM;
  const ds = track.stepM;
  const m = car.massKg + car.fuel.massKg;
  const weight = m * STANDARD_GRAVITY_MPS2;
  const lift = 0.5 * ambient.airDensityKgPerM3 * car.aero.liftAreaM2;
  const drag = 0.5 * ambient.airDensityKgPerM3 * car.aero.dragAreaM2;
  const e = car.tyre.ggExponent;
  const sens = car.tyre.loadSensitivity;
  const frontAero = car.aero.frontDownforceFraction ?? car.frontWeightFraction;
  const brakeCap = car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2;
  const engine = driveForceTable(car, ambient.powerFactor);
  const load = (v: number) => Math.max(0.1 * weight, weight + lift * v * v);
  const mu = (base: number, l: number) =>
    sens === 0 ? base : base * Math.max(0.2, 1 - (sens * (l - weight)) / weight);
  const lateral = (v: number) => (mu(car.tyre.muLat, load(v)) * load(v)) / m;
  const left = (v: number, ay: number) => {
    const used = Math.abs(ay) / lateral(v);
    if (used >= 1) return 0;
    if (used <= 0) return 1;
    return e === 2 ? Math.sqrt(1 - used * used) : Math.exp(Math.log(1 - Math.exp(e * Math.log(used))) / e);
  };
  const coast = (v: number) => (drag * v * v + car.rollingResistanceCoeff * load(v)) / m;
  const driven = (v: number) => {
    const l = load(v);
    const front = weight * car.frontWeightFraction + (l - weight) * frontAero;
    return car.powertrain.drive === 'all' ? l : car.powertrain.drive === 'front' ? front : l - front;
  };
  const accel = (v: number, ay: number) =>
    Math.min((mu(car.tyre.muLong, load(v)) * driven(v) * left(v, ay)) / m, engine.forceN(v) / m) - coast(v);
  const brake = (v: number, ay: number) =>
    Math.min(brakeCap, (mu(car.tyre.muLong, load(v)) * load(v)) / m) * left(v, ay) + coast(v);
  let top = 250;
  if (!(accel(top, 0) > 0)) {
    let lo = 0.5;
    for (let it = 0; it < 60; it++) {
      const mid = 0.5 * (lo + top);
      if (accel(mid, 0) > 0) lo = mid;
      else top = mid;
    }
    top = lo;
  }
  const limit = new Float64Array(n);
  let first = 0;
  for (let i = 0; i < n; i++) {
    const kappa = Math.abs(k[i]!);
    let v = top;
    if (kappa >= 1e-7 && top * top * kappa > lateral(top)) {
      let lo = 0;
      let hi = top;
      for (let it = 0; it < 40 && hi - lo >= 1e-6; it++) {
        const mid = 0.5 * (lo + hi);
        if (mid * mid * kappa <= lateral(mid)) lo = mid;
        else hi = mid;
      }
      v = lo;
    }
    limit[i] = v;
    if (v < limit[first]!) first = i;
  }
  const speed = new Float64Array(n);
  const shiftTimeS = car.powertrain.gearing?.shiftTimeS ?? 0;
  let start = limit[first]!;
  for (let lap = 0; lap < 20; lap++) {
    speed[first] = start;
    let gear = engine.gearAt(start);
    let shiftLeftS = 0;
    for (let step = 0, i = first; step < n; step++) {
      const j = i + 1 === n ? 0 : i + 1;
      const v = speed[i]!;
      let a = accel(v, v * v * k[i]!);
      const shifting = shiftLeftS > 0;
      if (shifting) {
        const share = Math.min(1, shiftLeftS / (ds / Math.max(v, 0.5)));
        a = -share * coast(v) + (1 - share) * a;
        shiftLeftS -= ds / Math.max(v, 0.5);
      }
      const next = Math.min(Math.sqrt(Math.max(0, v * v + 2 * a * ds)), limit[j]!);
      if (shiftTimeS > 0 && !shifting) {
        const g = engine.gearAt(next);
        if (g > gear && next > v) shiftLeftS = shiftTimeS;
        if (g > gear || next < v - 1e-6) gear = g;
      }
      speed[j] = next;
      i = j;
    }
    if (speed[first]! >= start - 1e-6) break;
    start = speed[first]!;
  }
  // Backward from the slowest corner, each entry speed the root of v = sqrt(v_exit^2 + 2 b(v) ds);
  // the lap takes the lower of the two passes as it goes, and its time.
  let exit = limit[first]!;
  let lapTimeS = 0;
  let after = Math.min(speed[first]!, exit);
  for (let step = 0, j = first; step < n; step++) {
    const h = j === 0 ? n - 1 : j - 1;
    const entry = (v: number) => Math.sqrt(Math.max(0, exit * exit + 2 * brake(v, v * v * k[h]!) * ds));
    let v = entry(exit);
    let fHi = entry(v) - v;
    if (v > exit && fHi < 0) {
      let lo = exit;
      let hi = v;
      let fLo = hi - lo;
      for (let it = 0, kept = 0; it < 100 && hi - lo > 1e-13 * hi; it++) {
        const mid = hi - (fHi * (hi - lo)) / (fHi - fLo);
        if (!(mid > lo && mid < hi)) break;
        const f = entry(mid) - mid;
        if (f > 0) [lo, fLo, fHi, kept] = [mid, f, kept === 1 ? fHi / 2 : fHi, 1];
        else if (f < 0) [hi, fHi, fLo, kept] = [mid, f, kept === -1 ? fLo / 2 : fLo, -1];
        else [lo, hi] = [mid, mid];
      }
      v = lo;
    }
    exit = Math.min(v, limit[h]!);
    const here = Math.min(speed[h]!, exit);
    lapTimeS += (2 * ds) / (here + after);
    after = here;
    j = h;
  }
  return lapTimeS;
}

/** Issue 14's target: a 3D lap costs at most 1.3 times the flat lap, CPU and wall, at 1 m. */
function roadCost(
  car: Parameters<typeof simulate>[1],
  ambient: ReturnType<typeof ambientFrom>,
  envelope: ReturnType<typeof buildEnvelope>,
): void {
  const lapOf = (segments: TrackSegment[]) =>
    trackFromSegments({ name: 'benchmark circuit', closed: true, widthM: 12, segments }, 1, 'benchmark');
  const flat = lapOf(benchmarkCircuitSegments());
  const hilly = lapOf(benchmarkCircuitSegments3d());
  let flatLapS = 0;
  let hillyLapS = 0;
  const [flatTiming, hillyTiming] = pairedMedianTimes(
    () => (flatLapS = simulate(flat, car, { ambient, envelope }).lapTimeS),
    () => (hillyLapS = simulate(hilly, car, { ambient, envelope }).lapTimeS),
    60,
    20,
  );
  process.stdout.write(
    `simulate 3D: flat ${flatTiming.wallMs.toFixed(2)} ms wall / ${flatTiming.cpuMs.toFixed(2)} ms CPU (lap ${flatLapS.toFixed(3)} s); ` +
      `grades and banks ${hillyTiming.wallMs.toFixed(2)} ms wall / ${hillyTiming.cpuMs.toFixed(2)} ms CPU (lap ${hillyLapS.toFixed(3)} s)\n`,
  );
  process.stdout.write(`  ${verdict('3D / flat CPU', hillyTiming.cpuMs / flatTiming.cpuMs, 1.3, 'x')}\n`);
  process.stdout.write(`  ${verdict('3D / flat wall', hillyTiming.wallMs / flatTiming.wallMs, 1.3, 'x')}\n`);
}

/** Issue 18's targets for one car at 1 m: every channel, lap-time mode, and the ratio to the plain passes; then the
 * same car on the real centreline. */
function againstTargets(name: string, fullTargetMs: number, ambient: Ambient): void {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/${name}.json`, 'utf8'), `cars/${name}.json`);
  const envelope = buildEnvelope(car, ambient);
  const track = trackFromSegments(
    { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
    1,
    'benchmark',
  );
  let fullS = 0;
  let quickS = 0;
  let plainS = 0;
  const full = settledTimes(() => (fullS = simulate(track, car, { ambient, envelope }).lapTimeS));
  const quick = settledTimes(() => (quickS = simulateLapTime(track, car, { ambient, envelope }).lapTimeS));
  const plain = settledTimes(() => (plainS = plainLapTimeS(track, car, ambient)));
  const gears = car.powertrain.gearing ? 'with gears' : 'no gears';
  process.stdout.write(
    `${name} (${gears}), 5 km at 1 m: simulate ${full.wallMs.toFixed(2)} ms wall / ${full.cpuMs.toFixed(2)} ms CPU (lap ${fullS.toFixed(4)} s); ` +
      `lap-time mode ${quick.wallMs.toFixed(2)} / ${quick.cpuMs.toFixed(2)} ms (lap ${quickS.toFixed(4)} s); ` +
      `plain passes ${plain.wallMs.toFixed(2)} / ${plain.cpuMs.toFixed(2)} ms (lap ${plainS.toFixed(4)} s)\n`,
  );
  process.stdout.write(
    `  ${verdict('simulate CPU', full.cpuMs, fullTargetMs, 'ms')}; ${verdict('wall', full.wallMs, fullTargetMs, 'ms')}\n`,
  );
  process.stdout.write(
    `  ${verdict('lap-time mode CPU', quick.cpuMs, 0.5, 'ms')}; ${verdict('wall', quick.wallMs, 0.5, 'ms')}\n`,
  );
  process.stdout.write(
    `  ${verdict('simulate / plain passes, CPU', full.cpuMs / plain.cpuMs, 2.5, 'x')}; ${verdict('lap-time mode / plain passes, CPU', quick.cpuMs / plain.cpuMs, 2.5, 'x')}\n`,
  );
  onRealCentreline(car, ambient, envelope, full, quick);
}

/** One car's lap on Monza's centreline at 1 m (as `reflap simulate --line centreline` reads it), every channel and
 * lap-time mode, beside the segment circuit's figures. */
function onRealCentreline(car: Car, ambient: Ambient, envelope: Envelope, segmentFull: Timing, segmentQuick: Timing) {
  const track = monzaCentreline();
  if (!track) {
    process.stdout.write(`  real centreline: skipped (${monzaCsv} is absent)\n`);
    return;
  }
  let fullS = 0;
  let quickS = 0;
  const full = settledTimes(() => (fullS = simulate(track, car, { ambient, envelope }).lapTimeS));
  const quick = settledTimes(() => (quickS = simulateLapTime(track, car, { ambient, envelope }).lapTimeS));
  const figures = (real: Timing, segment: Timing) =>
    `${real.wallMs.toFixed(2)} ms wall / ${real.cpuMs.toFixed(2)} ms CPU (segment circuit ${segment.wallMs.toFixed(2)} / ${segment.cpuMs.toFixed(2)} ms, ` +
    `${(real.cpuMs / segment.cpuMs).toFixed(1)}x its CPU)`;
  process.stdout.write(
    `  Monza's centreline, ${(track.lengthM / 1000).toFixed(2)} km at 1 m: simulate ${figures(full, segmentFull)} (lap ${fullS.toFixed(4)} s); ` +
      `lap-time mode ${figures(quick, segmentQuick)} (lap ${quickS.toFixed(4)} s)\n`,
  );
}

export async function run(): Promise<void> {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  againstTargets('brackle-club', 0.8, ambient);
  againstTargets('tarnfell-gt', 1.0, ambient);
  // The two grids settled each, then timed run for run in turn: timed one after the other, a change in the shared
  // machine's speed between them (its plain passes' time moved by 1.7x within one bench run) read as a cost per point.
  const grids = [1, 0.25].map((stepM) => {
    const track = trackFromSegments(
      { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
      stepM,
      'benchmark',
    );
    const grid = {
      stepM,
      track,
      lapTimeS: 0,
      lap: () => (grid.lapTimeS = simulate(track, car, { ambient, envelope }).lapTimeS),
    };
    settle(grid.lap);
    return grid;
  });
  const timings = pairedMedianTimes(grids[0]!.lap, grids[1]!.lap, 20, 0);
  const perPointNs = grids.map(({ stepM, track, lapTimeS }, k) => {
    const timing = timings[k]!;
    process.stdout.write(
      `simulate: ${(track.lengthM / 1000).toFixed(2)} km at ${stepM} m step (${track.distanceM.length} points): median ${timing.wallMs.toFixed(2)} ms wall, ${timing.cpuMs.toFixed(2)} ms CPU per lap; lap ${lapTimeS.toFixed(3)} s\n`,
    );
    return (timing.cpuMs * 1e6) / track.distanceM.length;
  });
  process.stdout.write(`${linearityVerdict(perPointNs)}; ${machineLoad()}\n`);
  roadCost(car, ambient, envelope);
  process.stdout.write(`peak RSS ${peakRssMb().toFixed(0)} MB\n`);
}
