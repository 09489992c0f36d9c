// The optimised solver against a plain, obviously correct statement of the same quasi-steady-state method, written
// here with its own point-mass physics: the corner-limit speed, a forward pass under the acceleration limit and a
// backward pass under the braking limit, the lower of the two (Brayshaw and Harrison, Proc. IMechE Part D 219
// (2005)); the point mass with downforce, drag, rolling resistance, load-sensitive mu and the friction ellipse
// |ax/axMax|^n + |ay/ayMax|^n = 1 as that paper and src/car/point-mass.ts's header state it, through Math.pow.
// They must agree to 1e-9 relative (issue 18) on the demo tracks and on the shared open circuits (TUM
// racetrack-database, LGPL v3, geometry from OpenStreetMap (ODbL), read from ../shared/data/open-tracks/ and
// skipped with a message where that folder is absent).

import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readTrackFile } from '../../src/io/read-track.js';
import { readCarFile } from '../../src/io/read-car.js';
import { simulate, simulateLapTime } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { driveForceTable } from '../../src/car/drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../../src/units.js';
import { roadProfileOf } from '../../src/track/road-profile.js';
import type { Ambient, Car } from '../../src/car/types.js';
import type { TrackGrid } from '../../src/track/types.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const openTracksDir = path.resolve(projectRoot, '..', 'shared', 'data', 'open-tracks');
const openTrackFiles = existsSync(openTracksDir) ? readdirSync(openTracksDir).filter((f) => f.endsWith('.csv')) : [];
if (openTrackFiles.length === 0) console.warn(`open-track solver agreement skipped: ${openTracksDir} is absent`);
const demoTrackFiles = readdirSync(path.join(projectRoot, 'tracks')).filter((f) => f.endsWith('.json'));
const cars = ['tarnfell-gt', 'brackle-club'].map((name) => readCarFile(path.join(projectRoot, 'cars', `${name}.json`)));

/** The point mass of Brayshaw and Harrison, written out: every limit from the normal load at this speed. */
function plainPointMass(car: Car, ambient: Ambient) {
  const m = car.massKg + car.fuel.massKg;
  const weight = m * STANDARD_GRAVITY_MPS2;
  const halfRho = 0.5 * ambient.airDensityKgPerM3;
  const n = car.tyre.ggExponent;
  const engine = driveForceTable(car, ambient.powerFactor);
  // l: the road's normal force as a share of the weight on level ground (1 on a flat road).
  const normal = (v: number, l = 1) => Math.max(0.1 * weight, weight * l + halfRho * car.aero.liftAreaM2 * v * v);
  const mu = (base: number, load: number) =>
    car.tyre.loadSensitivity === 0
      ? base
      : base * Math.max(0.2, 1 - (car.tyre.loadSensitivity * (load - weight)) / weight);
  const lateral = (v: number, l = 1) => (mu(car.tyre.muLat, normal(v, l)) * normal(v, l)) / m;
  const drivenLoad = (v: number, l: number) => {
    const downforce = normal(v, l) - weight * l;
    const front =
      weight * l * car.frontWeightFraction + downforce * (car.aero.frontDownforceFraction ?? car.frontWeightFraction);
    return car.powertrain.drive === 'all'
      ? normal(v, l)
      : car.powertrain.drive === 'front'
        ? front
        : normal(v, l) - front;
  };
  const coast = (v: number, l = 1) =>
    (halfRho * car.aero.dragAreaM2 * v * v + car.rollingResistanceCoeff * normal(v, l)) / m;
  // The share of the tyre left for the other direction on the ellipse: (1 - u^n)^(1/n).
  const left = (v: number, ay: number, l: number) => {
    const used = Math.abs(ay) / lateral(v, l);
    return used >= 1 ? 0 : Math.pow(1 - Math.pow(used, n), 1 / n);
  };
  const brakeCap = car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2;
  const accel = (v: number, ay: number, l = 1) =>
    Math.min((mu(car.tyre.muLong, normal(v, l)) * drivenLoad(v, l) * left(v, ay, l)) / m, engine.forceN(v) / m) -
    coast(v, l);
  // Top speed: where the net acceleration on a straight reaches zero, by bisection.
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
  return {
    top,
    lateral,
    accel,
    brake: (v: number, ay: number, l = 1) =>
      Math.min(brakeCap, (mu(car.tyre.muLong, normal(v, l)) * normal(v, l)) / m) * left(v, ay, l) + coast(v, l),
    coast,
    gearAt: (speedMps: number) => engine.gearAt(speedMps),
  };
}

/** The lap by the method as published: corner limits, forward pass, backward pass, the lower of the two. On a
 * road with grade a, bank t and vertical curvature kv (roadProfileOf's) each limit takes the road's load share
 * l = cos a cos t + v^2 (k sin t + kv cos t) / g and the lateral force v^2 (k cos t - kv sin t) - g cos a sin t, and
 * gravity pulls g sin a back along the path (the inclined-plane and banked-curve balances; any mechanics textbook). */
function plainLap(track: TrackGrid, car: Car): { speeds: number[]; lapTimeS: number } {
  const physics = plainPointMass(car, ambientFrom());
  const count = track.distanceM.length;
  const k = Array.from(track.curvaturePerM);
  const ds = track.stepM;
  const top = physics.top;
  const g = STANDARD_GRAVITY_MPS2;
  const road = roadProfileOf(track);
  const grade = (i: number) => road?.gradeRad[i] ?? 0;
  const bank = (i: number) => road?.bankRad[i] ?? 0;
  const crest = (i: number) => road?.verticalCurvaturePerM[i] ?? 0;
  const load = (i: number, v: number) =>
    Math.cos(grade(i)) * Math.cos(bank(i)) + (v * v * (k[i]! * Math.sin(bank(i)) + crest(i) * Math.cos(bank(i)))) / g;
  const sideways = (i: number, v: number) =>
    v * v * (k[i]! * Math.cos(bank(i)) - crest(i) * Math.sin(bank(i))) - g * Math.cos(grade(i)) * Math.sin(bank(i));
  const pull = (i: number) => g * Math.sin(grade(i));
  // Corner limit: the largest v whose lateral force fits the lateral limit under its load, by bisection until the
  // bracket cannot shrink.
  const fits = (i: number, v: number) => load(i, v) > 0 && Math.abs(sideways(i, v)) <= physics.lateral(v, load(i, v));
  const limit = k.map((_, i) => {
    if (fits(i, top)) return top;
    let lo = 0;
    let hi = top;
    for (let it = 0; it < 2000; it++) {
      const mid = 0.5 * (lo + hi);
      if (mid <= lo || mid >= hi) break;
      if (fits(i, mid)) lo = mid;
      else hi = mid;
    }
    return lo;
  });
  const next = (i: number) => (i + 1) % count;
  const before = (i: number) => (i - 1 + count) % count;
  // Both passes start at the slowest corner, where the speed must equal its limit.
  let first = 0;
  for (let i = 1; i < count; i++) if (limit[i]! < limit[first]!) first = i;
  const shiftTimeS = car.powertrain.gearing?.shiftTimeS ?? 0;
  // Forward: v_{i+1}^2 = v_i^2 + 2 a ds, a the acceleration limit at v_i (less drive during an upshift's gap), capped
  // by the corner limit; repeated from where the lap comes back until it closes on itself.
  const forward = new Array<number>(count).fill(0);
  const forwardFrom = (startMps: number) => {
    forward[first] = startMps;
    let gear = physics.gearAt(startMps);
    let shiftLeftS = 0;
    for (let step = 0, i = first; step < count; step++, i = next(i)) {
      const v = forward[i]!;
      let a = physics.accel(v, sideways(i, v), load(i, v));
      const shifting = shiftLeftS > 0;
      if (shifting) {
        const coastShare = Math.min(1, shiftLeftS / (ds / Math.max(v, 0.5)));
        a = -coastShare * physics.coast(v, load(i, v)) + (1 - coastShare) * a;
        shiftLeftS -= ds / Math.max(v, 0.5);
      }
      const reached = Math.min(Math.sqrt(Math.max(0, v * v + 2 * (a - pull(i)) * ds)), limit[next(i)]!);
      if (shiftTimeS > 0 && !shifting) {
        const nextGear = physics.gearAt(reached);
        if (nextGear > gear && reached > v) shiftLeftS = shiftTimeS;
        if (nextGear > gear || reached < v - 1e-6) gear = nextGear;
      }
      forward[next(i)] = reached;
    }
  };
  let startMps = limit[first]!;
  for (let lap = 0; lap < 20; lap++) {
    forwardFrom(startMps);
    if (forward[first]! >= startMps - 1e-6) break;
    startMps = forward[first]!;
  }
  // Backward: the entry speed v of each braking step solves v = sqrt(v_exit^2 + 2 b(v, v^2 k) ds), by bisection.
  const backward = new Array<number>(count).fill(0);
  backward[first] = limit[first]!;
  for (let step = 0, j = first; step < count; step++, j = before(j)) {
    const h = before(j);
    const exit = backward[j]!;
    const entry = (v: number) =>
      Math.sqrt(Math.max(0, exit * exit + 2 * (physics.brake(v, sideways(h, v), load(h, v)) + pull(h)) * ds));
    let v = entry(exit);
    if (v > exit && entry(v) < v) {
      // The braking limit falls with speed here (lateral demand grows as v^2): the root lies between.
      let lo = exit;
      let hi = v;
      for (let it = 0; it < 200 && hi - lo > 1e-13 * hi; it++) {
        const mid = 0.5 * (lo + hi);
        if (entry(mid) > mid) lo = mid;
        else hi = mid;
      }
      v = lo;
    }
    backward[h] = Math.min(v, limit[h]!);
  }
  const speeds = forward.map((v, i) => Math.min(v, backward[i]!));
  let lapTimeS = 0;
  for (let i = 0; i < count; i++) lapTimeS += (2 * ds) / (speeds[i]! + speeds[next(i)]!);
  return { speeds, lapTimeS };
}

function expectAgreement(track: TrackGrid): void {
  expect(track.closed).toBe(true);
  for (const car of cars) {
    const reference = plainLap(track, car);
    const lap = simulate(track, car);
    let worst = 0;
    for (let i = 0; i < track.distanceM.length; i++)
      worst = Math.max(worst, Math.abs(lap.trace.speedMps[i]! / reference.speeds[i]! - 1));
    // Issue 18: the optimised passes agree with the plain ones to 1e-9 relative.
    expect(worst).toBeLessThan(1e-9);
    expect(Math.abs(lap.lapTimeS / reference.lapTimeS - 1)).toBeLessThan(1e-9);
    // The lap-time mode is the same lap: the same time and the same places where the brakes come on.
    const quick = simulateLapTime(track, car);
    expect(quick.lapTimeS).toBe(lap.lapTimeS);
    expect(quick.brakingZones.map((z) => z.startIndex)).toEqual(lap.brakingZones.map((z) => z.startIndex));
    expect(quick.brakingZones.length).toBeGreaterThan(0);
  }
}

describe('the solver against the plain method on the demo tracks (1 m)', () => {
  it.each(demoTrackFiles)('%s', (file) => {
    expectAgreement(readTrackFile(path.join(projectRoot, 'tracks', file), { stepM: 1 }));
  });
});

/** The track with heights and banks as a surveyed centreline file would give them: three hills a lap whose descents
 * reach 12 % (steeper than drag and rolling resistance hold the car on at low speed, so the backward pass must ask
 * whether the brakes can), and a bank rocking between 5.7 degrees each way. */
function hillyAndBanked(track: TrackGrid): TrackGrid {
  const lapM = track.lengthM;
  const wave = (s: number, waves: number) => (2 * Math.PI * waves * s) / lapM;
  return {
    ...track,
    zM: track.distanceM.map((s) => ((0.12 * lapM) / (2 * Math.PI * 3)) * Math.sin(wave(s, 3))),
    bankRad: track.distanceM.map((s) => 0.1 * Math.sin(wave(s, 2))),
  };
}

describe('the solver against the plain method on the demo tracks with hills and banks (1 m)', () => {
  it.each(demoTrackFiles)('%s', (file) => {
    expectAgreement(hillyAndBanked(readTrackFile(path.join(projectRoot, 'tracks', file), { stepM: 1 })));
  });
});

describe.skipIf(openTrackFiles.length === 0)('the solver against the plain method on the open circuits (2 m)', () => {
  it.each(openTrackFiles)('%s', (file) => {
    expectAgreement(
      readTrackFile(path.join(openTracksDir, file), {
        stepM: 2,
        columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
        widthM: null,
        layout: 'auto',
        smoothingM: null,
      }),
    );
  });
});
