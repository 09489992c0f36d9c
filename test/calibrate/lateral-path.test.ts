// GPS-only calibration of a driver who uses the track: synthetic logs of a known car driven on the minimum-curvature
// line of the bundled club circuit (not its centreline), speed and positions only, with position noise of 0.5 to
// 1.5 m (./synthetic-log.ts: white and wandering parts), at 10 and 25 Hz. The lateral acceleration derived from the
// driver's own path against the one the car had, and the fitted lateral grip against the known one; then the
// fallback to the centreline where the fixes are too noisy or too sparse.

import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { calibrationSamples } from '../../src/calibrate/samples.js';
import { calibrateCar } from '../../src/calibrate/calibrate-car.js';
import { MAX_PATH_AY_NOISE_MPS2 } from '../../src/calibrate/lateral-path.js';
import { racingLine } from '../../src/line/racing-line.js';
import { trackFromCentreline } from '../../src/track/resample.js';
import { readTrackFile } from '../../src/io/read-track.js';
import type { TrackGrid } from '../../src/track/types.js';
import type { LapResult } from '../../src/solve/types.js';
import { projectRoot } from '../helpers/cli.js';
import { syntheticSession } from './synthetic-log.js';
import { guessedCar, knownCar, knownValues } from './known-car.js';
import { noteText } from '../../src/report/note-text.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from '../report/converted-quantities.js';

const ambient = ambientFrom();
const truth = knownCar;
const guess = guessedCar;
const TRUE_MU_LAT = knownValues['tyre.muLat']!;
/** The helper's noise is 0.4 m white plus 0.7 m of wander per unit: a standard deviation of 0.81 m per unit. */
const POSITION_SD_PER_UNIT = Math.hypot(0.4, 0.7);

let track: TrackGrid;
let lineTrack: TrackGrid;
let lap: LapResult;
/** The lateral acceleration the car had at each centreline station: v^2 kappa on the line, as the solver drove it. */
let trueAyMps2: Float64Array;

beforeAll(() => {
  track = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), { stepM: 1 });
  const line = racingLine(track, truth, { ambient, objective: 'curvature' });
  // The driver's line as a track of its own: the solver drives it, and the log's positions follow it.
  lineTrack = trackFromCentreline(
    { xM: line.xM, yM: line.yM, widthLeftM: null, widthRightM: null },
    { name: 'driver line', closed: true, stepM: 1, smoothingM: 0, source: 'driver line' },
  );
  lap = simulate(lineTrack, truth, { ambient });
  const n = track.distanceM.length;
  trueAyMps2 = new Float64Array(n);
  let alongLineM = 0;
  for (let j = 0; j < n; j++) {
    const at = Math.round(alongLineM / lineTrack.stepM) % lineTrack.distanceM.length;
    trueAyMps2[j] = lap.trace.speedMps[at]! ** 2 * lineTrack.curvaturePerM[at]!;
    alongLineM += line.path.segmentLengthM[j]!;
  }
}, 60_000);

function gpsLog(seed: number, rateHz: number, noise: number) {
  return syntheticSession(lineTrack, lap, { seed, laps: 4, rateHz, noise, accelerometer: false, throttle: false });
}

/** RMS of the derived lateral acceleration about the true one over every station of every lap, m/s^2. */
function ayRmsError(ayMps2: Float64Array): number {
  const n = trueAyMps2.length;
  let sum = 0;
  for (let i = 0; i < ayMps2.length; i++) sum += (ayMps2[i]! - trueAyMps2[i % n]!) ** 2;
  return Math.sqrt(sum / ayMps2.length);
}

describe("a GPS-only log of a driver on a racing line: lateral acceleration from the driver's own path", () => {
  it('reads ay to 2.5 m/s² RMS and fits muLat within 2 standard errors in at least 10 of 12 logs', () => {
    // 12 logs: 10 and 25 Hz, position noise 0.5, 1.0 and 1.5 m, two seeds each, four laps. The bound on the RMS
    // error is a quarter of the 10 m/s² and more the car pulls in its corners (1.4 g); over 12 logs an unbiased
    // normal estimate falls within 2 standard errors in at least 10 with probability 0.98 (binomial, n = 12,
    // p = 0.954).
    let covered = 0;
    const lines: string[] = [];
    for (const rateHz of [10, 25]) {
      for (const sdM of [0.5, 1.0, 1.5]) {
        for (const seed of [1, 2]) {
          const samples = calibrationSamples(gpsLog(seed, rateHz, sdM / POSITION_SD_PER_UNIT), track);
          expect(samples.lateralPath?.path, `${rateHz} Hz, ${sdM} m, seed ${seed}`).toBe('driver');
          // The stated noise: within a factor of two of what was put in (the wander's slow part counts as path).
          expect(samples.lateralPath!.positionNoiseM! / sdM).toBeGreaterThan(0.5);
          expect(samples.lateralPath!.positionNoiseM! / sdM).toBeLessThan(2);
          const error = ayRmsError(samples.ayMps2);
          expect(error, `${rateHz} Hz, ${sdM} m, seed ${seed}: ay RMS error`).toBeLessThan(2.5);
          const mu = calibrateCar(guess, ambient, samples).fitted.find((f) => f.field === 'tyre.muLat');
          expect(mu, `muLat fitted (${rateHz} Hz, ${sdM} m, seed ${seed})`).toBeDefined();
          if (Math.abs(mu!.value - TRUE_MU_LAT) <= 2 * mu!.sd) covered++;
          lines.push(
            `${rateHz} Hz ${sdM} m seed ${seed}: ay error ${error.toFixed(2)}, muLat ${mu!.value} ± ${mu!.sd}`,
          );
        }
      }
    }
    expect(covered, lines.join('\n')).toBeGreaterThanOrEqual(10);
  }, 120_000);

  it("the centreline's curvature on the same logs puts muLat far too high", () => {
    // The premise: the racing line turns on larger radii than the centreline, so v^2 times the centreline's curvature
    // overstates the corners. Computed here from the samples' own speeds, not by the calibration.
    const samples = calibrationSamples(gpsLog(1, 25, 1.0 / POSITION_SD_PER_UNIT), track);
    const n = track.distanceM.length;
    const onCentreline = Float64Array.from(
      samples.ayMps2,
      (_, i) => samples.speedMps[i]! ** 2 * track.curvaturePerM[i % n]!,
    );
    expect(ayRmsError(onCentreline)).toBeGreaterThan(2 * ayRmsError(samples.ayMps2));
    const mu = calibrateCar(guess, ambient, { ...samples, ayMps2: onCentreline }).fitted.find(
      (f) => f.field === 'tyre.muLat',
    );
    expect(mu!.value).toBeGreaterThan(TRUE_MU_LAT * 1.3);
  }, 60_000);
});

describe('the centreline as the fallback', () => {
  it('takes the centreline, saying why, where the fixes are too noisy for the path', () => {
    // 2.5 m of position noise at 25 Hz: the path would carry more than the allowed noise in v^2 kappa.
    const samples = calibrationSamples(gpsLog(1, 25, 2.5 / POSITION_SD_PER_UNIT), track);
    expect(samples.lateralPath?.path).toBe('centreline');
    expect(samples.lateralPath!.ayNoiseMps2!).toBeGreaterThan(MAX_PATH_AY_NOISE_MPS2);
    expect(samples.notes.map((note) => noteText(note)).join('\n')).toMatch(
      /curvature of the track's centreline \(positions scatter .* more than the 1\.75 m\/s² allowed\)/,
    );
    // Under imperial: the scatter in feet, the fixes per foot and the speed in mph, each the metric figure converted
    // (1 ft = 0.3048 m, 1 mph = 0.44704 m/s: NIST SP 811, appendix B); the accelerations stay m/s².
    const pathNote = samples.notes.find((note) => noteText(note).includes('positions scatter'))!;
    const metricText = noteText(pathNote, displayUnits('metric'));
    const imperialText = noteText(pathNote, displayUnits('imperial'));
    expectConverted(metricText, imperialText);
    expect(imperialText).toMatch(/scatter \d+\.\d\d ft across the track, .* of noise at \d+ mph, more than/);
    const perMetre = Number(/([\d.]+) fixes per metre/.exec(metricText)![1]);
    const perFoot = Number(/([\d.]+) fixes per foot/.exec(imperialText)![1]);
    // A foot is 0.3048 m: a tenth per metre of rounding carried over, and half a hundredth per foot.
    expect(Math.abs(perFoot - perMetre * 0.3048)).toBeLessThanOrEqual(0.05 * 0.3048 + 0.005 + 1e-9);
  }, 60_000);

  it('takes the centreline where the fixes are more than 5 m apart', () => {
    // 1 Hz over four laps of a lap averaging well over 20 m/s: pooled, a fix every 5 m or more.
    const samples = calibrationSamples(gpsLog(1, 1, 0), track);
    expect(samples.lateralPath?.path).toBe('centreline');
    expect(samples.notes.map((note) => noteText(note)).join('\n')).toMatch(/more than 5 m apart/);
    // 5 m / 0.3048 = 16.4 ft (NIST SP 811, appendix B).
    expect(samples.notes.map((note) => noteText(note, displayUnits('imperial'))).join('\n')).toMatch(
      /more than 16 ft apart/,
    );
  }, 60_000);
});
