// What the solver may take for granted of every envelope: braking never decelerates less than coasting at the same
// speed and road load. The braking limit is the tyres' braking force plus drag and rolling resistance (Newton's second
// law along the path; Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 3), and a tyre's braking force is
// never negative, so a descent that drag and rolling resistance alone hold the car on needs no braking limit
// (src/solve/speed-profile.ts). Checked on random speeds, lateral demands and loads for each kind of envelope.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readCarFile } from '../../src/io/read-car.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { demonstratedEnvelope } from '../../src/car/demonstrated-envelope.js';
import type { Envelope } from '../../src/car/envelope.js';
import { clubCar } from './bicycle-fixtures.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const ambient = ambientFrom();
const demoCar = (name: string) => readCarFile(path.join(projectRoot, 'cars', `${name}.json`));

/** A driver's envelope as the fit writes it: four limits in three speed bands, a fitted coast-down. */
const demonstrated = demonstratedEnvelope({
  format: 'reflap-demonstrated-envelope',
  version: 1,
  source: 'invented bands',
  quantile: 0.98,
  bandWidthMps: 10,
  topSpeedMps: 52,
  coast: { constantMps2: 0.12, quadraticPerM: 0.0004, fitted: true },
  bands: [15, 25, 35].map((speedMps, k) => ({
    speedMps,
    samples: 400,
    brakeMps2: 9 + k,
    accelMps2: 5 - k,
    leftMps2: 10 + 0.5 * k,
    rightMps2: 9.5 + 0.5 * k,
  })),
});

const envelopes: [string, Envelope][] = [
  ['point mass with gears', buildEnvelope(demoCar('tarnfell-gt'), ambient)],
  ['point mass without gears', buildEnvelope(demoCar('brackle-club'), ambient)],
  ['bicycle model', buildEnvelope(clubCar(), ambient)],
  ['demonstrated', demonstrated],
];

describe('braking never decelerates less than coasting', () => {
  it.each(envelopes)('%s', (_, envelope) => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.double({ min: 0.05, max: 2.5, noNaN: true }),
        (share, lateralMps2, load) => {
          const speedMps = share * envelope.topSpeedMps;
          expect(envelope.brakeLimitMps2(speedMps, lateralMps2, load)).toBeGreaterThanOrEqual(
            envelope.coastDecelMps2(speedMps, load),
          );
        },
      ),
      { numRuns: 2000, seed: 14 },
    );
  });
});
