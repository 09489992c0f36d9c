// The track's one corner identity: corners against the geometry the track was built from, corners files
// (edit, merge, markers, sectors) and their one-line errors, and braking points measured from the turn-in.

import { describe, expect, it } from 'vitest';
import { arcRanges, circuitCar, testCircuit } from '../compare/fixtures.js';
import { cornerLayoutOf, equalThirds, withCornerLayout } from '../../src/track/corner-layout.js';
import { parseCornersText } from '../../src/io/read-corners.js';
import { cornersFileJson } from '../../src/report/corners-file.js';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments } from '../../src/track/segments.js';
import { InputError } from '../../src/errors.js';
import { testCar } from '../helpers/cars.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';

const fileOf = (corners: unknown[], sectors?: unknown[]) =>
  JSON.stringify({ format: 'reflap corners 1', corners, ...(sectors ? { sectors } : {}) });

describe('corners found once per track', () => {
  const track = testCircuit();
  const layout = cornerLayoutOf(track);

  // The circuit is built from known arcs (test/compare/fixtures.ts): each detected corner must lie on one of
  // them, its apex inside the arc and its tightest radius the arc's radius (geometry of the construction).
  it('puts each corner on the arc it was built from, numbered from the start line', () => {
    const arcs = arcRanges();
    expect(layout.corners.map((c) => c.id)).toEqual(arcs.map((_, k) => k + 1));
    layout.corners.forEach((corner, k) => {
      const arc = arcs[k]!;
      expect(corner.apexM).toBeGreaterThan(arc.fromM);
      expect(corner.apexM).toBeLessThan(arc.toM);
      expect(Math.abs(corner.entryM - arc.fromM)).toBeLessThan(15);
      expect(Math.abs(corner.exitM - arc.toM)).toBeLessThan(15);
      expect(Math.abs(corner.radiusM - Math.abs(arc.radiusM)) / Math.abs(arc.radiusM)).toBeLessThan(0.05);
      expect(corner.side).toBe(Math.sign(arc.radiusM));
    });
    expect(cornerLayoutOf(track)).toBe(layout);
  });

  // Three equal sectors where the track gives none: common practice, no source.
  it('splits the lap into three equal sectors by default', () => {
    expect(layout.sectors.map((s) => [s.startM, s.endM])).toEqual([
      [0, track.lengthM / 3],
      [track.lengthM / 3, (2 * track.lengthM) / 3],
      [(2 * track.lengthM) / 3, track.lengthM],
    ]);
    expect(equalThirds(900).map((s) => s.name)).toEqual(['S1', 'S2', 'S3']);
  });

  it('gives every braking zone of the reference the number of the corner it serves', () => {
    const lap = simulate(track, circuitCar());
    expect(lap.brakingZones.length).toBeGreaterThan(0);
    for (const zone of lap.brakingZones) {
      const corner = layout.corners.find((c) => c.id === zone.corner)!;
      expect(corner).toBeDefined();
      // The slowest point lies within the corner it serves (or within a few metres of its ends).
      expect(zone.minSpeedAtM).toBeGreaterThan(corner.entryM - 10);
      expect(zone.minSpeedAtM).toBeLessThan(corner.exitM + 10);
    }
  });
});

describe('braking point as metres before the turn-in', () => {
  // Constant-deceleration kinematics: braking distance (v1^2 - v2^2) / (2 mu g) before an arc of radius R
  // taken at v2 = sqrt(mu g R) (Milliken and Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 2). The corners
  // file puts the turn-in exactly at the arc's start, so the distance before it is the braking distance.
  it('equals the braking distance into a hairpin', () => {
    const mu = 1.2;
    const v1 = 100 / 3.6;
    const straightM = 400;
    const radiusM = 30;
    const stage = trackFromSegments(
      {
        name: 'stage',
        closed: false,
        widthM: 10,
        segments: [
          { kind: 'straight', lengthM: straightM },
          { kind: 'arc', radiusM, angleDeg: 180 },
        ],
      },
      1,
      'stage',
    );
    const arcEndM = straightM + Math.PI * radiusM;
    const layout = parseCornersText(
      fileOf([{ name: 'Hairpin', entryM: straightM, apexM: straightM + 40, exitM: arcEndM - 1 }]),
      'hairpin.json',
      stage,
    );
    const lap = simulate(withCornerLayout(stage, layout), testCar({ mu, maxPowerW: 1 }), { startSpeedMps: v1 });
    const v2 = Math.sqrt(mu * g * radiusM);
    const expectedM = (v1 * v1 - v2 * v2) / (2 * mu * g);
    expect(lap.brakingZones).toHaveLength(1);
    const zone = lap.brakingZones[0]!;
    expect(zone.tag).toBe('c1');
    expect(zone.cornerName).toBe('Hairpin');
    expect(Math.abs(zone.beforeTurnInM! - expectedM)).toBeLessThan(1.5);
  });
});

describe('corners files', () => {
  const track = testCircuit();
  const written = cornersFileJson(track, cornerLayoutOf(track));

  it('reads back what the corners command writes', () => {
    const layout = parseCornersText(JSON.stringify(written), 'c.json', track);
    const detected = cornerLayoutOf(track);
    expect(layout.corners.map((c) => [c.id, c.name, c.side])).toEqual(
      detected.corners.map((c) => [c.id, c.name, c.side]),
    );
    layout.corners.forEach((c, k) => expect(Math.abs(c.apexM - detected.corners[k]!.apexM)).toBeLessThanOrEqual(1));
  });

  it('takes renamed, merged and renumbered corners, markers and sectors', () => {
    const corners = written.corners.map((c) => ({ ...c }));
    // Merge corners 2 and 3 into one (number 2), rename corner 1, give corner 4 a braking board.
    const merged = { ...corners[1]!, name: 'Long Double', exitM: corners[2]!.exitM };
    const edited = [
      { ...corners[0]!, name: 'Gate' },
      merged,
      { ...corners[3]!, number: 4, marker: { name: 'board 100', atM: corners[3]!.entryM - 100 } },
      { ...corners[4]!, number: 5 },
    ];
    const layout = parseCornersText(
      fileOf(edited, [
        { name: 'Top', startM: 0 },
        { name: 'Bottom', startM: 1000 },
      ]),
      'edited.json',
      track,
    );
    expect(layout.corners.map((c) => [c.id, c.name])).toEqual([
      [1, 'Gate'],
      [2, 'Long Double'],
      [4, null],
      [5, null],
    ]);
    expect(layout.corners[2]!.marker).toEqual({ name: 'board 100', atM: corners[3]!.entryM - 100 });
    expect(layout.sectors.map((s) => [s.name, s.startM, s.endM])).toEqual([
      ['Top', 0, 1000],
      ['Bottom', 1000, track.lengthM],
    ]);
    const lap = simulate(withCornerLayout(track, layout), circuitCar());
    expect(new Set(lap.brakingZones.map((z) => z.corner))).not.toContain(3);
    expect(lap.brakingZones.every((z) => [1, 2, 4, 5].includes(z.corner))).toBe(true);
  });

  const refused = (text: string) => {
    try {
      parseCornersText(text, 'bad.json', track);
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      return (error as Error).message;
    }
    throw new Error('the corners file was accepted');
  };
  const c = written.corners;

  it('refuses overlapping corners, naming both entries', () => {
    const message = refused(fileOf([c[0], { ...c[1]!, entryM: c[0]!.apexM }]));
    expect(message).toMatch(/^bad\.json: corners\[1\]: overlaps corners\[0\]/);
    expect(message).not.toContain('\n');
  });

  it('refuses a corner outside the track', () => {
    expect(refused(fileOf([{ ...c[0]!, exitM: track.lengthM + 50 }]))).toMatch(
      /^bad\.json: corners\[0\]: exitM .* falls outside the track/,
    );
  });

  it('refuses an apex outside its corner, a repeated number, sectors off the start line', () => {
    expect(refused(fileOf([{ ...c[0]!, apexM: c[0]!.exitM + 20 }]))).toMatch(/corners\[0\]: apexM .* not between/);
    expect(refused(fileOf([c[0], { ...c[1]!, number: 1 }]))).toMatch(/corners\[1\]: corner number 1 is used twice/);
    expect(refused(fileOf([c[0]], [{ startM: 10 }]))).toMatch(/sectors\[0\]: the first sector must start at 0 m/);
    expect(refused(JSON.stringify({ format: 'reflap corners 1', corners: [{ entryM: 1 }] }))).toMatch(
      /^bad\.json: corners\[0\]\.apexM: /,
    );
  });
});
