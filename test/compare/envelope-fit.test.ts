// The demonstrated envelope: quantiles, the fit against samples drawn on known friction ellipses, and the Envelope made
// from the fitted record driving a ring at the speed uniform circular motion allows.

import { describe, expect, it } from 'vitest';
import { fitEnvelope } from '../../src/compare/envelope-fit.js';
import { demonstratedEnvelope } from '../../src/car/demonstrated-envelope.js';
import { parseEnvelopeJson } from '../../src/io/read-envelope.js';
import { simulate } from '../../src/solve/simulate.js';
import { ring } from '../line/hand-tracks.js';
import { testCar } from '../helpers/cars.js';

/** Deterministic uniform numbers (a 32-bit linear congruential generator, Numerical Recipes constants). */
function lcg(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
}

/** Points on friction ellipses of the given semi-axes (70 %) and inside them (30 %), at speeds 10-50 m/s. */
function ellipseSamples(limits: { brake: number; accel: number; left: number; right: number }, count: number) {
  const random = lcg(7);
  const speedMps = new Float64Array(count);
  const axMps2 = new Float64Array(count);
  const ayMps2 = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const angle = 2 * Math.PI * random();
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    const a = c < 0 ? limits.brake : limits.accel;
    const b = s > 0 ? limits.left : limits.right;
    // Radius of the ellipse x^2/a^2 + y^2/b^2 = 1 in this direction.
    const onEdge = 1 / Math.sqrt((c * c) / (a * a) + (s * s) / (b * b));
    const radius = random() < 0.7 ? onEdge : onEdge * random();
    speedMps[i] = 10 + 40 * random();
    axMps2[i] = radius * c;
    ayMps2[i] = radius * s;
  }
  return { speedMps, axMps2, ayMps2, throttle: null, brake: null };
}

describe('fitting the envelope', () => {
  const limits = { brake: 12, accel: 5, left: 11, right: 10 };
  const record = fitEnvelope(ellipseSamples(limits, 80_000), 'ellipse samples');

  it('recovers the semi-axes of the friction ellipse the samples lie on', () => {
    // Geometry of the ellipse: the component along an axis is largest on the axis, where it equals the semi-axis;
    // the top 2 % of points in a 90-degree sector lie within about 2 degrees of it (cos 2 deg = 0.9994).
    for (const band of record.bands) {
      expect(band.brakeMps2 / limits.brake).toBeGreaterThan(0.99);
      expect(band.accelMps2 / limits.accel).toBeGreaterThan(0.99);
      expect(band.leftMps2 / limits.left).toBeGreaterThan(0.99);
      expect(band.rightMps2 / limits.right).toBeGreaterThan(0.99);
      for (const value of [
        band.brakeMps2 / limits.brake,
        band.accelMps2 / limits.accel,
        band.leftMps2 / limits.left,
        band.rightMps2 / limits.right,
      ])
        expect(value).toBeLessThanOrEqual(1 + 1e-12);
    }
    expect(record.coast.fitted).toBe(false);
    expect(record.topSpeedMps).toBeGreaterThan(49.5);
  });

  it('reads back what it writes and drives a ring at sqrt(a R)', () => {
    const back = parseEnvelopeJson(JSON.stringify(record), 'envelope.json');
    const envelope = demonstratedEnvelope(back);
    const radiusM = 100;
    const lateral = envelope.lateralLimitMps2(30, 1);
    // Uniform circular motion: a = v^2 / R, so the steady speed on the limit is sqrt(a R).
    const lap = simulate(ring(radiusM, 12, 1), testCar(), { envelope });
    const expected = Math.sqrt(lateral * radiusM);
    expect(Math.abs(lap.maxSpeedMps - expected) / expected).toBeLessThan(0.01);
    // Coasting (tyres free of drive and brake) while turning on the limit uses exactly the whole envelope.
    expect(envelope.gripUse(30, -envelope.coastDecelMps2(30), lateral)).toBeCloseTo(1, 9);
  });

  it('reads an envelope file that starts with a byte-order mark', () => {
    const back = parseEnvelopeJson(`\uFEFF${JSON.stringify(record)}`, 'bom-envelope.json');
    expect(back).toEqual(JSON.parse(JSON.stringify(record)));
  });

  it('names the bad field of an envelope file', () => {
    const broken = JSON.parse(JSON.stringify(record));
    broken.bands[0].leftMps2 = -1;
    expect(() => parseEnvelopeJson(JSON.stringify(broken), 'env.json')).toThrow(/env\.json: field bands\.0\.leftMps2/);
  });

  it('refuses unknown keys and accelerations, speeds or coast terms outside their plausible range', () => {
    const withKey = JSON.parse(JSON.stringify(record));
    withKey.bands[1].gripBoost = 2;
    expect(() => parseEnvelopeJson(JSON.stringify(withKey), 'env.json')).toThrow(
      'env.json: unknown field bands.1.gripBoost',
    );
    // 100 m/s^2 (about 10 g) is the stated limit for any acceleration (src/car/plausible.ts, from memory).
    for (const [path, value] of [
      [['bands', 0, 'brakeMps2'], 1e308],
      [['bands', 0, 'accelMps2'], -101],
      [['topSpeedMps'], 1e308],
      [['coast', 'quadraticPerM'], 1e308],
    ] as const) {
      const broken = JSON.parse(JSON.stringify(record));
      let node = broken;
      for (const key of path.slice(0, -1)) node = node[key];
      node[path[path.length - 1]!] = value;
      expect(() => parseEnvelopeJson(JSON.stringify(broken), 'env.json')).toThrow(
        `env.json: field ${path.join('.')}: `,
      );
    }
  });
});
