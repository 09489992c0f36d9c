// Benchmark of the core solver: one lap of a 5 km circuit at 1 m and 0.25 m step, median of 20 runs after warm-up.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { trackFromSegments, type TrackSegment } from '../src/track/segments.js';
import { parseCarJson } from '../src/io/read-car.js';
import { simulate } from '../src/solve/simulate.js';
import { buildEnvelope } from '../src/car/build-envelope.js';
import { ambientFrom } from '../src/car/ambient.js';
import { linearityVerdict, machineLoad, medianTimes, peakRssMb, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

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
  const flatTiming = medianTimes(() => (flatLapS = simulate(flat, car, { ambient, envelope }).lapTimeS), 20, 5);
  const hillyTiming = medianTimes(() => (hillyLapS = simulate(hilly, car, { ambient, envelope }).lapTimeS), 20, 5);
  process.stdout.write(
    `simulate 3D: flat ${flatTiming.wallMs.toFixed(2)} ms wall / ${flatTiming.cpuMs.toFixed(2)} ms CPU (lap ${flatLapS.toFixed(3)} s); ` +
      `grades and banks ${hillyTiming.wallMs.toFixed(2)} ms wall / ${hillyTiming.cpuMs.toFixed(2)} ms CPU (lap ${hillyLapS.toFixed(3)} s)\n`,
  );
  process.stdout.write(`  ${verdict('3D / flat CPU', hillyTiming.cpuMs / flatTiming.cpuMs, 1.3, 'x')}\n`);
  process.stdout.write(`  ${verdict('3D / flat wall', hillyTiming.wallMs / flatTiming.wallMs, 1.3, 'x')}\n`);
}

export async function run(): Promise<void> {
  const car = parseCarJson(readFileSync(`${projectRoot}cars/tarnfell-gt.json`, 'utf8'), 'cars/tarnfell-gt.json');
  const ambient = ambientFrom();
  const envelope = buildEnvelope(car, ambient);
  const perPointNs: number[] = [];
  for (const stepM of [1, 0.25]) {
    const track = trackFromSegments(
      { name: 'benchmark circuit', closed: true, widthM: 12, segments: benchmarkCircuitSegments() },
      stepM,
      'benchmark',
    );
    let lapTimeS = 0;
    const timing = medianTimes(
      () => {
        lapTimeS = simulate(track, car, { ambient, envelope }).lapTimeS;
      },
      20,
      5,
    );
    perPointNs.push((timing.cpuMs * 1e6) / track.distanceM.length);
    process.stdout.write(
      `simulate: ${(track.lengthM / 1000).toFixed(2)} km at ${stepM} m step (${track.distanceM.length} points): median ${timing.wallMs.toFixed(2)} ms wall, ${timing.cpuMs.toFixed(2)} ms CPU per lap; lap ${lapTimeS.toFixed(3)} s\n`,
    );
    // Issue 18's target for a car with gears, every channel computed.
    if (stepM === 1) process.stdout.write(`  ${verdict('CPU per lap', timing.cpuMs, 1.0, 'ms')}\n`);
  }
  process.stdout.write(`${linearityVerdict(perPointNs)}; ${machineLoad()}\n`);
  roadCost(car, ambient, envelope);
  process.stdout.write(`peak RSS ${peakRssMb().toFixed(0)} MB\n`);
}
