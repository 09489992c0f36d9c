// A stint: the same car lap after lap with the fuel burning off, so the lap times and braking points drift
// as the car gets lighter. Each lap is solved as a flying lap with the fuel load it starts with.

import type { Path, TrackGrid } from '../track/types.js';
import type { LapResult } from '../solve/types.js';
import { InputError } from '../errors.js';
import { mpsToKph } from '../units.js';
import { defaultContext, outcomeWidth, solveSetup, sweepJob, VALUES_PER_CORNER, writeOutcome } from './evaluate.js';
import { runSetups, runSetupsInProcess, startWorkersEarly, type RunOptions } from './pool.js';
import { cornersOf, DIGITS, type SweepCorner } from './table.js';
import { roundToDigits } from '../numeric/round.js';
import { tidy, type SetupBase } from './settings.js';

export const MAX_STINT_LAPS = 10_000;

export interface StintLap {
  lap: number;
  /** Fuel on board at the start of the lap, kg. */
  fuelKg: number;
  lapTimeS: number;
  /** Per corner of lap 1: braking point (m) and slowest speed (km/h); NaN where the lap does not brake there. */
  brakingPointM: number[];
  minSpeedKph: number[];
}

export interface StintResult {
  laps: StintLap[];
  corners: SweepCorner[];
  /** First lap that starts with an empty tank, or null. */
  emptyFromLap: number | null;
  totalTimeS: number;
}

/** Fuel at the start of each lap: the car's fuel less one lap's burn per lap done, never below zero. */
export function stintFuelLoads(fuelKg: number, burnKgPerLap: number, laps: number): number[] {
  if (!Number.isInteger(laps) || laps < 1 || laps > MAX_STINT_LAPS)
    throw new InputError(`--laps: ${laps} should be a whole number from 1 to ${MAX_STINT_LAPS}`);
  const loads: number[] = [];
  for (let lap = 0; lap < laps; lap++) loads.push(tidy(Math.max(0, fuelKg - lap * burnKgPerLap)));
  return loads;
}

export interface StintInput {
  track: TrackGrid;
  base: SetupBase;
  laps: number;
  startSpeedMps?: number;
  path?: Path;
}

function prepare(input: StintInput): {
  loads: number[];
  firstLap: LapResult;
  context: ReturnType<typeof defaultContext>;
} {
  const { fuel } = input.base.car;
  const loads = stintFuelLoads(fuel.massKg, fuel.burnKgPerLap, input.laps);
  const partial = {
    track: input.track,
    base: input.base,
    fields: ['fuel.massKg'],
    startSpeedMps: input.startSpeedMps ?? 0,
    ...(input.path ? { path: input.path } : {}),
  };
  const firstLap = solveSetup(partial, [loads[0]!], 'stint lap 1');
  return { loads, firstLap, context: defaultContext({ ...partial, corners: firstLap.brakingZones }) };
}

/** Lap 1 is already solved in prepare: its outcome goes first, ahead of the laps the pool solved. */
function withFirstLap(
  context: ReturnType<typeof defaultContext>,
  firstLap: LapResult,
  rest: Float64Array,
): Float64Array {
  const width = outcomeWidth(context.corners.length);
  const outcomes = new Float64Array(width + rest.length);
  writeOutcome(context, firstLap, outcomes, 0);
  outcomes.set(rest, width);
  return outcomes;
}

function assemble(loads: number[], firstLap: LapResult, outcomes: Float64Array): StintResult {
  const cornerCount = firstLap.brakingZones.length;
  const width = outcomeWidth(cornerCount);
  const laps: StintLap[] = loads.map((fuelKg, r) => {
    const at = r * width;
    const lap: StintLap = {
      lap: r + 1,
      fuelKg,
      lapTimeS: roundToDigits(outcomes[at]!, DIGITS.lapTimeS),
      brakingPointM: [],
      minSpeedKph: [],
    };
    for (let k = 0; k < cornerCount; k++) {
      const c = at + 1 + VALUES_PER_CORNER * k;
      lap.brakingPointM.push(roundToDigits(outcomes[c]!, DIGITS.brakingPointM));
      lap.minSpeedKph.push(roundToDigits(mpsToKph(outcomes[c + 2]!), DIGITS.speedKph));
    }
    return lap;
  });
  const empty = loads.findIndex((fuel) => fuel === 0);
  // An empty tank on lap 1 is the car file's own choice (fuel.massKg 0), not the stint running dry.
  const emptyFromLap = empty > 0 ? empty + 1 : null;
  return {
    laps,
    corners: cornersOf(firstLap),
    emptyFromLap,
    totalTimeS: laps.reduce((sum, lap) => sum + lap.lapTimeS, 0),
  };
}

/** The stint in the calling thread. */
export function runStint(input: StintInput): StintResult {
  const { loads, firstLap, context } = prepare(input);
  return assemble(
    loads,
    firstLap,
    withFirstLap(context, firstLap, runSetupsInProcess(sweepJob, context, Float64Array.from(loads.slice(1)), 1)),
  );
}

/** The stint across worker threads (laps are independent: each starts from its own fuel load). */
export async function runStintInWorkers(input: StintInput, options: RunOptions = {}): Promise<StintResult> {
  startWorkersEarly(sweepJob, options);
  const { loads, firstLap, context } = prepare(input);
  const { onProgress } = options;
  const rest = await runSetups(sweepJob, context, Float64Array.from(loads.slice(1)), 1, {
    ...options,
    ...(onProgress ? { onProgress: (done: number, total: number) => onProgress(done + 1, total + 1) } : {}),
  });
  return assemble(loads, firstLap, withFirstLap(context, firstLap, rest));
}
