// The reference lap of an uncertain car: N draws of its uncertain fields (./draws.ts) run by the sweep's worker pool,
// summarised as the median and the 90 % band (the 5th to the 95th percentile of the draws, Hyndman and Fan type 7)
// of the lap time, of the speed at every station and of each braking zone; and, for a comparison, each corner's
// finding with the share of draws in which it holds. The library entry behind `--uncertainty` on simulate and
// compare, and for any command that wants the same (it needs only the records already read).

import type { Ambient, Car } from '../car/types.js';
import type { ComparisonResult, CornerComparison, DriverLap, Finding } from '../compare/types.js';
import type { CompareOptions } from '../compare/compare-options.js';
import { DEFAULT_COMPARE_OPTIONS } from '../compare/compare-options.js';
import { CLAIM_KINDS, cornerClaims, phaseClaim, type Claim, type ClaimKind } from '../compare/findings.js';
import { quantileSorted } from '../numeric/quantile.js';
import type { LapResult } from '../solve/types.js';
import type { Path, TrackGrid } from '../track/types.js';
import { defaultContext, outcomeWidth, VALUES_PER_CORNER } from '../sweep/evaluate.js';
import { runSetups, startWorkersEarly, type RunOptions } from '../sweep/pool.js';
import { DEFAULT_DRAW_SEED, drawParameters } from './draws.js';
import {
  drawOutcomeWidth,
  drawJob,
  type DrawContext,
  evaluateDraw,
  traceSamples,
  VALUES_PER_COMPARED_CORNER,
  type DrawSpec,
} from './evaluate-draw.js';
import { lerp } from '../numeric/interpolate.js';

export interface UncertainInput {
  track: TrackGrid;
  car: Car;
  ambient: Ambient;
  path?: Path;
  startSpeedMps?: number;
  /** The plain reference lap (the car's own values): each draw's braking zones are matched against its zones. */
  nominal: LapResult;
  /** For a comparison: the driver's lap and the plain comparison whose findings the draws test. */
  comparison?: { driver: DriverLap; result: ComparisonResult; compare?: Partial<CompareOptions> };
}

export interface UncertainOptions {
  draws: number;
  seed?: number;
  workers?: number;
  onProgress?: RunOptions['onProgress'];
}

/** The median and the 90 % band of a quantity over the draws. */
export interface Band {
  median: number;
  low: number;
  high: number;
}

export interface UncertainClause {
  claim: Claim;
  /** Share of draws in which the corner loses time and its finding makes this claim, 0-1. */
  holds: number;
}

export interface UncertainFinding {
  /** The finding of the plain answer (its corner and claims). */
  finding: Finding;
  corner: number | null;
  /** Time at stake in the plain answer, and over the draws, s. */
  nominalTimeS: number;
  timeS: Band;
  /** Share of draws in which the finding's main claim holds, 0-1. */
  holds: number;
  /** Holds in fewer than half the draws. */
  uncertain: boolean;
  clauses: UncertainClause[];
}

export interface UncertainCorner {
  id: number;
  timeLostS: Band;
  /** The main claim of the corner's finding in the plain answer, and the share of draws in which it holds; null
   * where the corner loses no time worth a finding. */
  claim: ClaimKind | null;
  holds: number | null;
}

export interface UncertainReference {
  draws: number;
  seed: number;
  design: string;
  fields: { field: string; value: number; sd: number }[];
  /** Drawn values moved back inside their field's range. */
  clamped: number;
  lapTimeS: Band;
  /** Reference speed at every station of the grid over the draws, m/s. */
  speedMps: { median: Float64Array; low: Float64Array; high: Float64Array };
  /** The plain reference's braking zones over the draws (null bands where no draw found the zone). */
  zones: { brakingPointM: Band | null; minSpeedMps: Band | null; foundShare: number }[];
  corners: UncertainCorner[];
  findings: UncertainFinding[];
}

export const DESIGN = 'Latin hypercube (McKay, Beckman and Conover 1979), normal margins';
/** A finding holding in fewer than this share of draws is marked uncertain. */
export const UNCERTAIN_BELOW = 0.5;
/** Speed samples kept per draw: every station of any ordinary circuit (so a certain car's band is its trace exactly). */
const MAX_TRACE_SAMPLES = 20000;

export function band(values: ArrayLike<number>): Band | null {
  const finite = Array.from(values).filter(Number.isFinite);
  if (finite.length === 0) return null;
  const sorted = Float64Array.from(finite).sort();
  return { median: quantileSorted(sorted, 0.5), low: quantileSorted(sorted, 0.05), high: quantileSorted(sorted, 0.95) };
}

export async function uncertainReference(
  input: UncertainInput,
  options: UncertainOptions,
): Promise<UncertainReference> {
  const { track, car, nominal } = input;
  startWorkersEarly(drawJob, options);
  const seed = options.seed ?? DEFAULT_DRAW_SEED;
  const count = Math.max(1, Math.round(options.draws));
  const drawn = drawParameters(car, count, seed);
  const stations = track.distanceM.length;
  const draw: DrawSpec = {
    traceStride: Math.max(1, Math.ceil(stations / MAX_TRACE_SAMPLES)),
    driver: input.comparison?.driver ?? null,
    compare: input.comparison?.compare ?? {},
  };
  const context: DrawContext = {
    ...defaultContext({
      track,
      base: { car, air: { airTempC: input.ambient.airTempC, pressureHpa: input.ambient.pressureHpa } },
      fields: drawn.fields,
      corners: nominal.brakingZones,
      startSpeedMps: input.startSpeedMps ?? 0,
      ...(input.path ? { path: input.path } : {}),
    }),
    draw,
  };
  const width = drawOutcomeWidth(context);
  let rows: Float64Array;
  if (drawn.fields.length === 0) {
    // Nothing is uncertain: every draw is the plain answer.
    const one = new Float64Array(width);
    evaluateDraw(context, [], one, 0, 'uncertainty draw');
    rows = new Float64Array(width * count);
    for (let d = 0; d < count; d++) rows.set(one, d * width);
    options.onProgress?.(count, count);
  } else {
    rows = await runSetups(drawJob, context, drawn.values, 0, {
      ...(options.workers !== undefined ? { workers: options.workers } : {}),
      ...(options.onProgress ? { onProgress: options.onProgress } : {}),
    });
  }
  const column = (offset: number) => {
    const out = new Float64Array(count);
    for (let d = 0; d < count; d++) out[d] = rows[d * width + offset]!;
    return out;
  };
  const zoneCount = nominal.brakingZones.length;
  const zones = Array.from({ length: zoneCount }, (_, k) => {
    const at = 1 + VALUES_PER_CORNER * k;
    const points = column(at);
    const found = points.filter(Number.isFinite).length;
    return { brakingPointM: band(points), minSpeedMps: band(column(at + 2)), foundShare: found / count };
  });
  const traceAt = outcomeWidth(zoneCount);
  const samples = traceSamples(stations, draw.traceStride);
  const speedMps = speedBands(rows, width, count, traceAt, samples, draw.traceStride, stations, track.closed);
  const compared = input.comparison
    ? robustness(input.comparison, rows, width, count, traceAt + samples)
    : { corners: [], findings: [] };
  return {
    draws: count,
    seed,
    design: DESIGN,
    fields: drawn.fields.map((field, d) => ({ field, value: drawn.centre[d]!, sd: drawn.sd[d]! })),
    clamped: drawn.clamped,
    lapTimeS: band(column(0))!,
    speedMps,
    zones,
    ...compared,
  };
}

/** Per kept station the band over the draws, then linear in between so every station of the grid has one. */
function speedBands(
  rows: Float64Array,
  width: number,
  count: number,
  at: number,
  samples: number,
  stride: number,
  stations: number,
  closed: boolean,
): UncertainReference['speedMps'] {
  const median = new Float64Array(stations);
  const low = new Float64Array(stations);
  const high = new Float64Array(stations);
  const kept = { median: new Float64Array(samples), low: new Float64Array(samples), high: new Float64Array(samples) };
  const values = new Float64Array(count);
  for (let s = 0; s < samples; s++) {
    for (let d = 0; d < count; d++) values[d] = rows[d * width + at + s]!;
    values.sort();
    kept.median[s] = quantileSorted(values, 0.5);
    kept.low[s] = quantileSorted(values, 0.05);
    kept.high[s] = quantileSorted(values, 0.95);
  }
  for (let i = 0; i < stations; i++) {
    const s = Math.floor(i / stride);
    const w = (i - s * stride) / stride;
    const next = s + 1 < samples ? s + 1 : closed ? 0 : s;
    for (const [target, source] of [
      [median, kept.median],
      [low, kept.low],
      [high, kept.high],
    ] as const) {
      target[i] = lerp(source[s]!, source[next]!, w);
    }
  }
  return { median, low, high };
}

const bit = (kind: ClaimKind) => 1 << CLAIM_KINDS.indexOf(kind);

function mainClaim(corner: CornerComparison, options: Partial<CompareOptions>): { main: Claim; rest: Claim[] } {
  const claims = cornerClaims(corner, { ...DEFAULT_COMPARE_OPTIONS, ...options }.findings);
  return claims.length > 0 ? { main: claims[0]!, rest: claims.slice(1, 3) } : { main: phaseClaim(corner), rest: [] };
}

function robustness(
  comparison: NonNullable<UncertainInput['comparison']>,
  rows: Float64Array,
  width: number,
  count: number,
  at: number,
): Pick<UncertainReference, 'corners' | 'findings'> {
  const options = comparison.compare ?? {};
  const minTimeS = { ...DEFAULT_COMPARE_OPTIONS, ...options }.findings.minTimeS;
  const nominalCorners = comparison.result.corners;
  const value = (d: number, c: number, k: number) => rows[d * width + at + VALUES_PER_COMPARED_CORNER * c + k]!;
  const holds = (c: number, kind: ClaimKind) => {
    let yes = 0;
    for (let d = 0; d < count; d++) if (value(d, c, 0) >= minTimeS && (value(d, c, 1) & bit(kind)) !== 0) yes++;
    return yes / count;
  };
  const timeBand = (c: number) => band(Float64Array.from({ length: count }, (_, d) => value(d, c, 0)))!;
  const corners: UncertainCorner[] = nominalCorners.map((corner, c) => {
    const losing = corner.timeLostS >= minTimeS;
    const claim = losing ? mainClaim(corner, options).main.kind : null;
    return { id: corner.id, timeLostS: timeBand(c), claim, holds: claim ? holds(c, claim) : null };
  });
  const findings: UncertainFinding[] = comparison.result.findings.map((finding) => {
    const c = nominalCorners.findIndex((corner) => corner.id === finding.corner);
    if (c < 0)
      return {
        finding,
        corner: finding.corner,
        nominalTimeS: finding.timeS,
        timeS: { median: finding.timeS, low: finding.timeS, high: finding.timeS },
        holds: 1,
        uncertain: false,
        clauses: [],
      };
    const { main, rest } = mainClaim(nominalCorners[c]!, options);
    const share = holds(c, main.kind);
    return {
      finding,
      corner: finding.corner,
      nominalTimeS: finding.timeS,
      timeS: timeBand(c),
      holds: share,
      uncertain: share < UNCERTAIN_BELOW,
      clauses: [main, ...rest].map((claim) => ({ claim, holds: holds(c, claim.kind) })),
    };
  });
  // Ranked by the time at stake over the draws (the median), the plain answer's order breaking ties.
  findings.sort((a, b) => b.timeS.median - a.timeS.median);
  return { corners, findings };
}

/** The same over a whole-session comparison (src/compare/compare-session.ts): its reference, its lap, its findings. */
export function uncertainComparison(
  comparison: { reference: LapResult; lap: DriverLap; result: ComparisonResult },
  car: Car,
  ambient: Ambient,
  options: UncertainOptions & { startSpeedMps?: number; compare?: Partial<CompareOptions> },
): Promise<UncertainReference> {
  const reference = comparison.reference;
  return uncertainReference(
    {
      track: reference.track,
      car,
      ambient,
      path: reference.path,
      startSpeedMps: options.startSpeedMps ?? 0,
      nominal: reference,
      comparison: {
        driver: comparison.lap,
        result: comparison.result,
        ...(options.compare ? { compare: options.compare } : {}),
      },
    },
    options,
  );
}
