// The library's entry points refuse wrong records the way the readers refuse wrong files: an InputError of one
// line naming the field (and the range), never a TypeError from inside, a NaN lap or a lap of 8e12 s.

import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { racingLine } from '../../src/line/racing-line.js';
import { trackFromSegments } from '../../src/track/segments.js';
import type { Car } from '../../src/car/types.js';
import type { TrackGrid } from '../../src/track/types.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';
import { inputErrorMessage as messageOf } from '../helpers/input-error.js';

const radiusM = 80;
const ring = trackFromSegments(
  { name: 'ring', closed: true, widthM: 10, segments: [{ kind: 'arc', radiusM, angleDeg: 360 }] },
  1,
  'ring',
);

/** A record as a script might hand it over, typed loosely on purpose. */
const looseCar = (change: (car: Record<string, unknown>) => void): Car => {
  const car = structuredClone(testCar({ mu: 1.2 })) as unknown as Record<string, unknown>;
  change(car);
  return car as unknown as Car;
};

describe('simulate as a script calls it', () => {
  it('drives a good record to the closed form, so the checks refuse nothing they should take', () => {
    // Steady cornering at v = sqrt(mu g R) (Milliken and Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 2):
    // a lap of the ring takes 2 pi R / v.
    const lap = simulate(ring, testCar({ mu: 1.2 }));
    expect(lap.lapTimeS).toBeCloseTo((2 * Math.PI * radiusM) / Math.sqrt(1.2 * g * radiusM), 1);
  });

  it('refuses a missing track or car by name, not with a TypeError', () => {
    expect(messageOf(() => simulate(null as unknown as TrackGrid, testCar()))).toBe(
      'simulate: track: a track must be a grid record (got null)',
    );
    expect(messageOf(() => simulate(ring, null as unknown as Car))).toBe(
      'simulate: car: a car must be a record (got null)',
    );
    expect(
      messageOf(() =>
        simulate(
          ring,
          looseCar((car) => delete car['tyre']),
        ),
      ),
    ).toMatch(/field tyre must be a record/);
    expect(messageOf(() => simulate({} as TrackGrid, testCar()))).toMatch(/field closed must be true or false/);
  });

  it('refuses a mass given as a string instead of concatenating it', () => {
    // "620" + 1000 would be "6201000": a number field must hold a number.
    expect(
      messageOf(() =>
        simulate(
          ring,
          looseCar((car) => (car['massKg'] = '620')),
        ),
      ),
    ).toBe('simulate: car: field massKg must be a number (got "620")');
  });

  it('refuses negative, NaN and absurd values with the field and its range', () => {
    expect(messageOf(() => simulate(ring, testCar({ massKg: -5 })))).toBe(
      'simulate: car: field massKg must be between 20 and 20000 kg (got -5)',
    );
    expect(messageOf(() => simulate(ring, testCar({ massKg: 1e308 })))).toMatch(
      /massKg must be between .* \(got 1e\+308\)/,
    );
    expect(messageOf(() => simulate(ring, testCar({ muLat: Number.NaN })))).toMatch(
      /tyre\.muLat must be between 0\.05 and 5/,
    );
    // Grip of 1e-300 drove a lap of 8e12 s before the check.
    expect(messageOf(() => simulate(ring, testCar({ mu: 1e-300 })))).toMatch(/tyre\.muLong .*tyre\.muLat/);
    expect(
      messageOf(() =>
        simulate(
          ring,
          looseCar((car) => (car['model'] = 'hovercraft')),
        ),
      ),
    ).toMatch(/field model must be one of point-mass, bicycle/);
  });

  it('refuses a grid with a NaN, a wrong length or a curvature no car turns, naming the sample', () => {
    const nanCurvature = new Float64Array(ring.curvaturePerM);
    nanCurvature[7] = Number.NaN;
    expect(messageOf(() => simulate({ ...ring, curvaturePerM: nanCurvature }, testCar()))).toBe(
      'simulate: track: field curvaturePerM at sample 7 must be within +/- 2 (got NaN)',
    );
    expect(messageOf(() => simulate({ ...ring, xM: ring.xM.subarray(1) }, testCar()))).toMatch(/field xM has/);
    const path = {
      closed: true,
      curvaturePerM: new Float64Array(ring.curvaturePerM.length).fill(1e300),
      segmentLengthM: new Float64Array(ring.curvaturePerM.length).fill(1),
    };
    expect(messageOf(() => simulate(ring, testCar(), { path }))).toMatch(
      /^simulate: options\.path: field curvaturePerM at sample 0/,
    );
  });
});

describe('racingLine as a script calls it', () => {
  it('refuses a missing track or a car out of range', () => {
    expect(messageOf(() => racingLine(null as unknown as TrackGrid, testCar()))).toMatch(/^racingLine: track: /);
    expect(messageOf(() => racingLine(ring, testCar({ massKg: 0 })))).toMatch(/^racingLine: car: field massKg/);
  });
});
