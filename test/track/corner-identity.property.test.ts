// Property: on any circuit, every analysis numbers the corners the same way as the track's one corner layout
// (the reference's braking zones, a what-if, a sweep's corner list, a stint and the driver comparison).

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { trackFromCurvature } from '../line/hand-tracks.js';
import { runs } from '../fuzz/generators.js';
import { cornerLayoutOf } from '../../src/track/corner-layout.js';
import { simulate } from '../../src/solve/simulate.js';
import { compareSetupChange } from '../../src/sweep/setup-change.js';
import { cornersOf } from '../../src/sweep/table.js';
import { runStint } from '../../src/sweep/stint.js';
import { compareLaps } from '../../src/compare/compare-laps.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { circuitCar, driverLapFromReference } from '../compare/fixtures.js';

/** Straights and arcs in turn; the closing error is irrelevant to corner numbering. */
const circuit = fc.array(
  fc.record({
    straightM: fc.integer({ min: 60, max: 400 }),
    radiusM: fc.integer({ min: 25, max: 250 }),
    left: fc.boolean(),
    angleDeg: fc.integer({ min: 30, max: 160 }),
  }),
  { minLength: 2, maxLength: 6 },
);

function buildTrack(pieces: { straightM: number; radiusM: number; left: boolean; angleDeg: number }[]) {
  const kappa: number[] = [];
  for (const piece of pieces) {
    for (let s = 0; s < piece.straightM; s++) kappa.push(0);
    const arcM = Math.round((piece.angleDeg * Math.PI * piece.radiusM) / 180);
    for (let s = 0; s < arcM; s++) kappa.push((piece.left ? 1 : -1) / piece.radiusM);
  }
  return trackFromCurvature('fuzzed circuit', true, 1, Float64Array.from(kappa), 6, 6);
}

describe('one corner identity across analyses', () => {
  it('reference, what-if, sweep, stint and comparison carry the layout numbers', () => {
    const car = circuitCar();
    const heavier = { ...car, massKg: car.massKg + 150 };
    const envelope = buildEnvelope(car, ambientFrom());
    fc.assert(
      fc.property(circuit, (pieces) => {
        const track = buildTrack(pieces);
        const layout = cornerLayoutOf(track);
        const ids = layout.corners.map((c) => c.id);
        expect(ids).toEqual(ids.map((_, k) => k + 1));
        const lap = simulate(track, car);
        const zoneCorners = lap.brakingZones.map((z) => z.corner);
        for (const corner of zoneCorners) expect(ids).toContain(corner);
        expect(new Set(lap.brakingZones.map((z) => z.tag)).size).toBe(lap.brakingZones.length);

        const whatif = compareSetupChange(lap, simulate(track, heavier));
        expect(whatif.zones.map((z) => [z.corner, z.tag])).toEqual(lap.brakingZones.map((z) => [z.corner, z.tag]));
        expect(cornersOf(lap).map((c) => [c.corner, c.tag])).toEqual(lap.brakingZones.map((z) => [z.corner, z.tag]));
        const stint = runStint({ track, base: { car, air: { airTempC: 15, pressureHpa: 1013.25 } }, laps: 1 });
        expect(stint.corners.map((c) => c.corner)).toEqual(zoneCorners);

        const compared = compareLaps(track, car, lap, driverLapFromReference(track, lap), envelope);
        expect(compared.corners.map((c) => c.id)).toEqual(ids);
        for (const finding of compared.findings) if (finding.corner !== null) expect(ids).toContain(finding.corner);
      }),
      runs(12, 20261204),
    );
  });
});
