import { describe, expect, it } from 'vitest';
import { trackFromSegments, type TrackSegment } from '../../src/track/segments.js';
import { simulate } from '../../src/solve/simulate.js';
import { checkTransient } from '../../src/solve/transient.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { clubCar } from '../car/bicycle-fixtures.js';
import type { Car } from '../../src/car/types.js';

const ambient = ambientFrom();
const closedTrack = (segments: TrackSegment[]) => trackFromSegments({ name: 'hand track', closed: true, widthM: 12, segments }, 1, 'hand track');
/** The same car with less grip: its reference leaves the full car a margin. */
const gentler = (car: Car, share: number): Car => ({ ...car, tyre: { ...car.tyre, muLat: car.tyre.muLat * share, muLong: car.tyre.muLong * share } });

describe('transient check', () => {
  it('follows a steady ring well inside the limit: on the line, at the reference lap time', () => {
    // Steady cornering at 70 % of the grip: the linear range of the tyres (Gillespie, SAE 1992, ch. 6), so a
    // path-following driver should hold the line to a few centimetres once the start transient has gone.
    const car = clubCar();
    const track = closedTrack([{ kind: 'arc', radiusM: 80, angleDeg: 360 }]);
    const lap = simulate(track, gentler(car, 0.7), { ambient });
    const check = checkTransient(lap, car, { ambient });
    expect(check.completed).toBe(true);
    expect(check.drivable).toBe(true);
    expect(check.maxDeviationM).toBeLessThan(0.6);
    // After the first half lap the start transient has died away.
    for (let i = Math.floor(lap.trace.count / 2); i < lap.trace.count; i++) expect(Math.abs(check.lateralErrorM[i]!)).toBeLessThan(0.05);
    expect(Math.abs(check.followedLapTimeS - lap.lapTimeS)).toBeLessThan(0.01 * lap.lapTimeS);
    expect(check.saturation).toEqual([]);
    // Half-way round, the followed car is at the reference speed (within 0.5 %).
    const half = Math.floor(lap.trace.count / 2);
    expect(Math.abs(check.followedSpeedMps[half]! / lap.trace.speedMps[half]! - 1)).toBeLessThan(0.005);
  });

  it('on a limit lap the axles saturate in the corners, not on the straights', () => {
    const car = clubCar({ brakes: { maxDecelG: null, frontBias: 0.72 } });
    const segments: TrackSegment[] = [
      { kind: 'straight', lengthM: 400 },
      { kind: 'arc', radiusM: 50, angleDeg: 180 },
      { kind: 'straight', lengthM: 400 },
      { kind: 'arc', radiusM: 50, angleDeg: 180 },
    ];
    const track = closedTrack(segments);
    const lap = simulate(track, car, { ambient });
    const check = checkTransient(lap, car, { ambient });
    expect(check.completed).toBe(true);
    expect(check.followedLapTimeS).toBeGreaterThan(lap.lapTimeS);
    expect(check.saturation.length).toBeGreaterThan(0);
    const arcLength = Math.PI * 50;
    // Corners span [400, 400 + arc] and [800 + arc, 800 + 2 arc]; saturation may start in the braking zone before.
    const nearCorner = (m: number) => (m > 250 && m < 400 + arcLength + 60) || (m > 650 + arcLength && m < 800 + 2 * arcLength + 60) || m < 60;
    for (const zone of check.saturation) {
      expect(nearCorner(zone.fromM)).toBe(true);
    }
    expect(check.lateralErrorM.length).toBe(lap.trace.count);
  });

  it('names every missing bicycle field before integrating anything', () => {
    const car = clubCar({ cgHeightM: null, trackFrontM: null });
    const track = closedTrack([{ kind: 'arc', radiusM: 80, angleDeg: 360 }]);
    const lap = simulate(track, { ...car, model: 'point-mass' }, { ambient });
    expect(() => checkTransient(lap, car, { ambient })).toThrow(/cgHeightM, trackFrontM/);
  });
});
