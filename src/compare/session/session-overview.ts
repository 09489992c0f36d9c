// The whole session at once: every lap as `compare` cuts it, with its time, completeness and sector times; per
// corner across the complete laps the best, median and spread of the corner time, braking point and slowest speed;
// the session best (the driver's own best corner of each lap, summed); and the four answers to "where could my
// lap be" side by side. Corner times are taken over stretches fixed by the reference lap (../corner-phases.ts), the
// same for every lap, so a lap's corner times add up to its lap time and the best corners to the session best.

import type { Envelope } from '../../car/envelope.js';
import type { LapResult } from '../../solve/types.js';
import type { TrackGrid } from '../../track/types.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { cornerLayoutOf } from '../../track/corner-layout.js';
import type { CornerSpan } from '../../track/corners.js';
import type { LapCut } from '../laps.js';
import { alignLap } from '../align.js';
import { compareBraking } from '../braking-points.js';
import { ownershipBounds } from '../corner-phases.js';
import { DEFAULT_COMPARE_OPTIONS } from '../compare-options.js';
import { lapCornerFigures, type LapCornerFigures } from '../against/lap-corner.js';
import { pairLapOfDriver, pairLapOfReference, type PairLap } from '../against/pair-lap.js';
import { sectorTimesS } from './lap-sectors.js';
import { sampleStandardDeviation } from './spread.js';
import { median } from '../../numeric/quantile.js';
import { cornerVerdicts, type CornerVerdict, DEFAULT_VERDICT_OPTIONS, type VerdictOptions } from './corner-verdicts.js';
import type { Note } from '../../note.js';

export interface SessionLap {
  lap: number;
  lapTimeS: number;
  complete: boolean;
  /** Why an incomplete lap is left out, or how a complete one was finished. */
  reason: Note | null;
  /** Sector times, s (null for an incomplete lap). */
  sectorsS: number[] | null;
}

export interface SessionCorner {
  id: number;
  name: string | null;
  apexM: number;
  /** Corner time over its fixed stretch: best (and the lap it came from), median and spread (sample SD), s. */
  bestTimeS: number;
  bestLap: number;
  medianTimeS: number;
  spreadTimeS: number;
  /** The reference's time over the same stretch, s. */
  referenceTimeS: number;
  /** Braking point as metres before the turn-in, over the laps that brake for the corner; null where none does. */
  medianBrakingBeforeTurnInM: number | null;
  spreadBrakingPointM: number | null;
  /** Laps that brake for the corner (the braking figures are over these). */
  brakingLaps: number;
  bestMinSpeedKph: number;
  medianMinSpeedKph: number;
  spreadMinSpeedKph: number;
  referenceMinSpeedKph: number;
}

export interface SessionOverview {
  trackName: string;
  source: string;
  laps: SessionLap[];
  sectorNames: string[];
  bestLap: number;
  bestLapTimeS: number;
  /** The driver's best corner of each lap, summed, s. */
  sessionBestS: number;
  demonstratedLapTimeS: number | null;
  referenceLapTimeS: number;
  corners: SessionCorner[];
  /** Corner ids, most time available (median against the reference) first; and least consistent first. */
  byTimeAvailable: number[];
  byConsistency: number[];
  verdicts: CornerVerdict[];
  notes: Note[];
}

export interface SessionInputs {
  track: TrackGrid;
  /** The session with any accelerations derived from its positions, and its laps as `compare` cut them. */
  session: TelemetrySession;
  laps: readonly LapCut[];
  reference: LapResult;
  envelope: Envelope;
  demonstratedLapTimeS: number | null;
}

/** One complete lap's figures at every corner, its braking matched against the reference's. */
function cornerFiguresOfLap(
  lap: PairLap,
  ref: PairLap,
  spans: readonly CornerSpan[],
  bounds: readonly number[],
  track: TrackGrid,
  threshold: number,
): LapCornerFigures[] {
  const n = track.distanceM.length;
  return spans.map((span, c) => {
    const braking = compareBraking(
      ref.brakingStarts,
      lap.brakingStarts,
      ref,
      lap,
      span,
      bounds[c]!,
      n,
      track.stepM,
      threshold,
    );
    return lapCornerFigures(lap, span, bounds[c]!, bounds[c + 1]!, braking.driverBrake, track, threshold);
  });
}

/** Corner c across the complete laps: best, median and spread of its time, braking point and slowest speed. */
function cornerAcrossLaps(
  span: CornerSpan,
  figures: readonly { lap: number; corners: LapCornerFigures[] }[],
  c: number,
  reference: LapCornerFigures,
): SessionCorner {
  const times = figures.map((f) => f.corners[c]!.cornerTimeS);
  const bestIndex = times.reduce((bi, t, i) => (t < times[bi]! ? i : bi), 0);
  const braking = figures.map((f) => f.corners[c]!.brakingBeforeTurnInM).filter((v): v is number => v !== null);
  const slowest = figures.map((f) => f.corners[c]!.minSpeedKph);
  return {
    id: span.id,
    name: span.name,
    apexM: span.apexM,
    bestTimeS: times[bestIndex]!,
    bestLap: figures[bestIndex]!.lap,
    medianTimeS: median(times),
    spreadTimeS: sampleStandardDeviation(times),
    referenceTimeS: reference.cornerTimeS,
    medianBrakingBeforeTurnInM: braking.length > 0 ? median(braking) : null,
    spreadBrakingPointM: braking.length > 0 ? sampleStandardDeviation(braking) : null,
    brakingLaps: braking.length,
    bestMinSpeedKph: Math.max(...slowest),
    medianMinSpeedKph: median(slowest),
    spreadMinSpeedKph: sampleStandardDeviation(slowest),
    referenceMinSpeedKph: reference.minSpeedKph,
  };
}

export function sessionOverview(
  inputs: SessionInputs,
  options: {
    pedalThreshold?: number;
    verdicts?: VerdictOptions;
    /** Called with each complete lap as it is read, for a caller that keeps more of it (corner-traces.ts). */
    onLap?: (lapNumber: number, lap: PairLap) => void;
  } = {},
): SessionOverview {
  const { track, session, reference, envelope } = inputs;
  const threshold = options.pedalThreshold ?? DEFAULT_COMPARE_OPTIONS.pedalThreshold;
  const n = track.distanceM.length;
  const layout = cornerLayoutOf(track);
  const spans = layout.corners;
  const ref = pairLapOfReference(reference);
  const bounds = ownershipBounds(spans, ref, ref, n, track.stepM, track.closed);
  const referenceFigures = spans.map((span, c) =>
    lapCornerFigures(ref, span, bounds[c]!, bounds[c + 1]!, null, track, threshold),
  );
  const notes: Note[] = [];
  const laps: SessionLap[] = [];
  // Per complete lap only the corner figures are kept, never the aligned channels: memory stays flat in the laps.
  const figures: { lap: number; corners: LapCornerFigures[] }[] = [];
  for (const cut of inputs.laps) {
    if (!cut.complete) {
      laps.push({
        lap: cut.lapNumber,
        lapTimeS: cut.lapTimeS,
        complete: false,
        reason: cut.reason ?? null,
        sectorsS: null,
      });
      continue;
    }
    const lap = pairLapOfDriver(alignLap(session, cut, track), envelope, track, `lap ${cut.lapNumber}`);
    const corners = cornerFiguresOfLap(lap, ref, spans, bounds, track, threshold);
    figures.push({ lap: cut.lapNumber, corners });
    options.onLap?.(cut.lapNumber, lap);
    laps.push({
      lap: cut.lapNumber,
      lapTimeS: cut.lapTimeS,
      complete: true,
      reason: cut.reason ?? null,
      sectorsS: sectorTimesS(lap, layout.sectors, track),
    });
    if (lap.brakeEstimated && notes.length === 0)
      notes.push('no brake channel: braking points estimated from the deceleration');
  }
  if (figures.length === 0) throw new Error('sessionOverview needs at least one complete lap');
  if (figures.length === 1) notes.push('one complete lap: no spread and no session best beyond that lap');
  const best = laps.filter((lap) => lap.complete).reduce((a, b) => (b.lapTimeS < a.lapTimeS ? b : a));
  const corners = spans.map((span, c) => cornerAcrossLaps(span, figures, c, referenceFigures[c]!));
  const available = (corner: SessionCorner) => corner.medianTimeS - corner.referenceTimeS;
  const verdictOptions = options.verdicts ?? DEFAULT_VERDICT_OPTIONS;
  return {
    trackName: track.name,
    source: session.source,
    laps,
    sectorNames: layout.sectors.map((sector) => sector.name),
    bestLap: best.lap,
    bestLapTimeS: best.lapTimeS,
    sessionBestS: corners.reduce((sum, corner) => sum + corner.bestTimeS, 0),
    demonstratedLapTimeS: inputs.demonstratedLapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    corners,
    byTimeAvailable: [...corners].sort((a, b) => available(b) - available(a) || a.id - b.id).map((c) => c.id),
    byConsistency: [...corners].sort((a, b) => b.spreadTimeS - a.spreadTimeS || a.id - b.id).map((c) => c.id),
    verdicts: cornerVerdicts(corners, figures.length, verdictOptions),
    notes,
  };
}
