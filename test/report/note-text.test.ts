// Notes whose speeds and distances are SI quantities, written in the reader's units: km/h and metres, or mph and
// feet through the exact definitions 1 mph = 0.44704 m/s and 1 ft = 0.3048 m (NIST SP 811, appendix B). The
// envelope fit's note on the speeds where the car model filled in is one of them.

import { describe, expect, it } from 'vitest';
import { distanceOf, note, speedsOf } from '../../src/note.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { fitEnvelope } from '../../src/compare/envelope-fit.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { testCar } from '../helpers/cars.js';

const MPS_PER_MPH = 0.44704; // NIST SP 811, appendix B (exact)
const metric = displayUnits('metric');
const imperial = displayUnits('imperial');

/** The numbers of a list such as '59, 68, 77 km/h' before the unit given. */
const listBefore = (text: string, unit: string) =>
  new RegExp(`((?:\\d+, )*\\d+) ${unit.replace('/', '\\/')}`).exec(text)![1]!.split(', ').map(Number);

describe('a note with quantities', () => {
  const lap = note`lap ${2} left out: the log ends ${distanceOf(3766.4)} before the line`;
  const thin = note`braking at ${speedsOf([16.39, 18.89])}: too few samples`;

  it('is the same text as before in km/h and metres', () => {
    expect(noteText(lap, metric)).toBe('lap 2 left out: the log ends 3766 m before the line');
    // 16.39 m/s x 3.6 = 59.0 km/h; 18.89 m/s x 3.6 = 68.0 km/h (SI definition of the km/h).
    expect(noteText(thin, metric)).toBe('braking at 59, 68 km/h: too few samples');
    expect(noteText('a note without numbers', imperial)).toBe('a note without numbers');
  });

  it('says feet and mph in imperial, converted by the exact factors', () => {
    // 3766.4 m / 0.3048 = 12357.0 ft (NIST SP 811 factor, worked by hand).
    expect(noteText(lap, imperial)).toBe('lap 2 left out: the log ends 12357 ft before the line');
    // 16.39 / 0.44704 = 36.7 mph; 18.89 / 0.44704 = 42.3 mph.
    expect(noteText(thin, imperial)).toBe('braking at 37, 42 mph: too few samples');
  });

  it('splices a note into another', () => {
    const reason = note`the log ends ${distanceOf(120, 1)} before the line`;
    expect(noteText(note`lap ${3}: ${reason}; lap time extrapolated`, imperial)).toBe(
      // 120 m / 0.3048 = 393.70 ft.
      'lap 3: the log ends 393.7 ft before the line; lap time extrapolated',
    );
  });
});

describe("the envelope fit's note on thin speeds", () => {
  // A log that never brakes below 20 m/s: the car model fills the braking limit at the low speeds, and says where.
  const count = 40_000;
  const speedMps = new Float64Array(count);
  const axMps2 = new Float64Array(count);
  const ayMps2 = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    speedMps[i] = 8 + (40 * i) / count;
    const angle = (2 * Math.PI * ((i * 7919) % 1000)) / 1000;
    const braking = Math.cos(angle) < 0;
    axMps2[i] = braking && speedMps[i]! < 20 ? 0 : 9 * Math.cos(angle);
    ayMps2[i] = 9 * Math.sin(angle);
  }
  const car = testCar();
  const record = fitEnvelope(
    { speedMps, axMps2, ayMps2, throttle: null, brake: null },
    'thin log',
    undefined,
    buildEnvelope(car, ambientFrom()),
  );
  const braking = (record.notes ?? []).find((n) => noteText(n, metric).startsWith('braking at '));

  it('names the low speeds in km/h, and in mph under imperial, each converted', () => {
    expect(braking).toBeDefined();
    const kph = listBefore(noteText(braking!, metric), 'km/h');
    const mph = listBefore(noteText(braking!, imperial), 'mph');
    expect(kph.length).toBeGreaterThan(0);
    // Every speed named is below the 20 m/s (72 km/h) under which the log never brakes, give or take a band.
    for (const speed of kph) expect(speed).toBeLessThan(72 + 9);
    expect(mph).toHaveLength(kph.length);
    // Whole km/h converted (half a km/h of rounding, 0.31 mph) plus the mph's own rounding (0.5).
    kph.forEach((speed, k) => expect(Math.abs(mph[k]! - speed / 3.6 / MPS_PER_MPH)).toBeLessThanOrEqual(0.82));
    expect(noteText(braking!, imperial)).not.toMatch(/km\/h/);
  });
});
