import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/solve/simulate.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { parseVariation, type SetupBase } from '../../src/sweep/settings.js';
import { runSweep } from '../../src/sweep/run-sweep.js';
import { sensitivities } from '../../src/sweep/table.js';
import { mergeSweepCsv, parseSweepCsv, sweepCsv } from '../../src/sweep/csv.js';
import { sweepChartData } from '../../src/sweep/chart-data.js';
import { compareSetupChange } from '../../src/sweep/setup-change.js';
import { runStint } from '../../src/sweep/stint.js';
// Worker threads run compiled modules, so the runs on workers call the build (dist/, made before vitest runs).
import { runSweep as runSweepBuilt } from '../../dist/src/sweep/run-sweep.js';
import { runStintInWorkers } from '../../dist/src/sweep/stint.js';
import { solvedThreadCount } from '../../dist/src/sweep/threads.js';
import { InputError } from '../../src/errors.js';
import { WORKER_START_S, workersWorthStarting } from '../../src/sweep/pool.js';
import { testCar } from '../helpers/cars.js';
import { stadium } from './tracks.js';

const track = stadium(400, 30, 15, 1);
const car = {
  ...testCar({
    massKg: 900,
    muLong: 1.3,
    muLat: 1.25,
    maxPowerW: 150_000,
    dragAreaM2: 0.7,
    liftAreaM2: 0.5,
    drive: 'rear',
  }),
  fuel: { massKg: 40, burnKgPerLap: 3 },
};
const air = { airTempC: 20, pressureHpa: 1005 };
const base: SetupBase = { car, air };
const variations = [
  parseVariation('massKg=880:920:20'),
  parseVariation('tyre.muLat=-4%:+4%:4%'),
  parseVariation('airTempC=10:30:10'),
];

describe('sweep sensitivities', () => {
  it('agree with two separate simulate runs by central differences', async () => {
    const { table } = await runSweep({ track, base, variations, mode: 'one-at-a-time' }, { workers: 0 });
    const found = sensitivities(table);
    expect(found.map((s) => s.field)).toEqual(['massKg', 'tyre.muLat', 'airTempC']);
    // Central difference f'(x) ~ (f(x + h) - f(x - h)) / 2h (any numerical analysis text), here from plain simulate calls.
    const lap = (c: typeof car, a = air) => simulate(track, c, { ambient: ambientFrom(a) });
    const baseline = lap(car);
    const cases = [
      { s: found[0]!, h: 20, minus: lap({ ...car, massKg: 880 }), plus: lap({ ...car, massKg: 920 }) },
      {
        s: found[1]!,
        h: 0.05,
        minus: lap({ ...car, tyre: { ...car.tyre, muLat: 1.2 } }),
        plus: lap({ ...car, tyre: { ...car.tyre, muLat: 1.3 } }),
      },
      { s: found[2]!, h: 10, minus: lap(car, { ...air, airTempC: 10 }), plus: lap(car, { ...air, airTempC: 30 }) },
    ];
    for (const { s, h, minus, plus } of cases) {
      expect(s.scheme).toBe('central');
      expect(s.stepUsed).toBeCloseTo(h, 12);
      const expected = (plus.lapTimeS - minus.lapTimeS) / (2 * h);
      // The sweep keeps lap times to 1 µs (CSV digits): over 2h that is at most 1e-6 / h s per unit.
      expect(Math.abs(s.lapTimeSPerUnit - expected)).toBeLessThan(1.01e-6 / h);
      expect(expected).not.toBe(0);
      const minusZones = compareSetupChange(baseline, minus).zones;
      const plusZones = compareSetupChange(baseline, plus).zones;
      s.brakingPointMPerUnit.forEach((perUnit, c) => {
        const shift = (plusZones[c]!.changedBrakingPointM! - minusZones[c]!.changedBrakingPointM!) / (2 * h);
        // Braking points are kept to 1 mm (CSV digits): each end rounds by up to 0.5 mm, so over 2h the rate
        // is off by at most 0.5e-3 / h m per unit.
        expect(Math.abs(perUnit! - shift)).toBeLessThan(0.505e-3 / h);
      });
    }
    // Physical sense: more mass is slower, more grip quicker, hotter air (less density, less power) ...
    expect(found[0]!.lapTimeSPerUnit).toBeGreaterThan(0);
    expect(found[1]!.lapTimeSPerUnit).toBeLessThan(0);
  });
});

describe('shards and workers', () => {
  it('merged shards equal the unsharded sweep byte for byte, whatever the worker count', async () => {
    const whole = await runSweepBuilt({ track, base, variations, mode: 'grid' }, { workers: 2 });
    expect(whole.complete).toBe(true);
    expect(whole.table.records).toHaveLength(1 + 6 + 27);
    const wholeCsv = sweepCsv(whole.table);
    const shards: { text: string; source: string }[] = [];
    for (let i = 0; i < 4; i++) {
      const part = await (i % 2 === 0 ? runSweep : runSweepBuilt)(
        { track, base, variations, mode: 'grid', shard: { index: i, count: 4 } },
        { workers: i % 2 === 0 ? 0 : 1 },
      );
      expect(part.complete).toBe(false);
      shards.push({ text: sweepCsv(part.table), source: `shard${i + 1}.csv` });
    }
    const merged = mergeSweepCsv([shards[2]!, shards[0]!, shards[3]!, shards[1]!]);
    expect(merged.csv).toBe(wholeCsv);
    expect(sensitivities(merged.table)).toEqual(sensitivities(whole.table));
    // The CSV reads back to the same table.
    expect(sweepCsv(parseSweepCsv(wholeCsv, 'whole.csv'))).toBe(wholeCsv);
    // A shard left out, or a shard of another sweep, is a one-line error.
    expect(() => mergeSweepCsv(shards.slice(0, 3))).toThrow(/runs are missing/);
    const other = await runSweep(
      { track, base, variations: variations.slice(0, 1), mode: 'grid', shard: { index: 1, count: 4 } },
      { workers: 0 },
    );
    expect(() => mergeSweepCsv([shards[0]!, { text: sweepCsv(other.table), source: 'other.csv' }])).toThrow(InputError);
  });

  it('keeps its threads between sweeps, and a second sweep on them gives the same table', async () => {
    const first = await runSweepBuilt({ track, base, variations, mode: 'grid' }, { workers: 2 });
    expect(solvedThreadCount()).toBe(2);
    const again = await runSweepBuilt({ track, base, variations, mode: 'grid' }, { workers: 2 });
    const here = await runSweep({ track, base, variations, mode: 'grid' }, { workers: 0 });
    expect(sweepCsv(again.table)).toBe(sweepCsv(first.table));
    expect(sweepCsv(again.table)).toBe(sweepCsv(here.table));
  });

  it('solves a small sweep in this thread when the worker count is left to it, with the same table', async () => {
    // The stadium's 34 runs take a few milliseconds each: far under what starting two workers costs. Solved from the
    // sources (dist/ is not imported), the sweep could not have run on workers, which load the build.
    const chosen = await runSweep({ track, base, variations, mode: 'grid' }, {});
    const here = await runSweep({ track, base, variations, mode: 'grid' }, { workers: 0 });
    expect(sweepCsv(chosen.table)).toBe(sweepCsv(here.table));
  });

  // This thread goes on solving while c - 1 workers start (S each, side by side), so runs that would take T here end
  // after about (T + (c - 1) S) / c: sooner only when T > S (arithmetic of the two ways); one core never has a worker.
  it.each([
    [0.3, 2, 0],
    [0.79, 2, 0],
    [0.81, 2, 1],
    [0.81, 4, 3],
    [0.7, 4, 0],
    [100, 1, 0],
  ])(
    'starts workers beside this thread for %s s of runs on %s cores only where they pay: %s',
    (remainingS, cores, expected) => {
      expect(WORKER_START_S).toBe(0.8);
      expect(workersWorthStarting(remainingS, cores)).toBe(expected);
    },
  );

  it('lends threads kept from an earlier job for any runs left, since they cost nothing to start', () => {
    expect(workersWorthStarting(0.01, 2, 0)).toBe(1);
    expect(workersWorthStarting(0.01, 1, 0)).toBe(0);
  });

  it('gives chart series of lap time and braking-point shift against each field', async () => {
    const { table } = await runSweep({ track, base, variations, mode: 'one-at-a-time' }, { workers: 0 });
    const series = sweepChartData(table);
    expect(series.map((s) => s.values)).toEqual([
      [880, 900, 920],
      [1.2, 1.25, 1.3],
      [10, 20, 30],
    ]);
    // At the baseline value the shift from the baseline is zero, by definition of the series.
    expect(series[0]!.brakingPointShiftM.every((perCorner) => perCorner[1] === 0)).toBe(true);
    expect(series[0]!.lapTimeS[0]!).toBeLessThan(series[0]!.lapTimeS[2]!);
  });
});

describe('stint', () => {
  it('burns fuel lap by lap and the lap times fall with the mass', async () => {
    const result = runStint({ track, base, laps: 16 });
    expect(result.laps.map((l) => l.fuelKg)).toEqual([40, 37, 34, 31, 28, 25, 22, 19, 16, 13, 10, 7, 4, 1, 0, 0]);
    expect(result.emptyFromLap).toBe(15);
    for (let k = 1; k < 14; k++) expect(result.laps[k]!.lapTimeS).toBeLessThan(result.laps[k - 1]!.lapTimeS);
    expect(result.laps[15]!.lapTimeS).toBe(result.laps[14]!.lapTimeS);
    // Each lap equals a plain simulate with that fuel load.
    const lap5 = simulate(track, { ...car, fuel: { ...car.fuel, massKg: 28 } }, { ambient: ambientFrom(air) });
    expect(result.laps[4]!.lapTimeS).toBeCloseTo(lap5.lapTimeS, 5);
    const parallel = await runStintInWorkers({ track, base, laps: 16 }, { workers: 2 });
    expect(parallel).toEqual(result);
  });
});
