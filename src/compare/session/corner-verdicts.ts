// What a corner's numbers across the session mean for the driver: time available (the median lap's corner against
// the reference), and whether it is a matter of consistency (driven well once, rarely repeated: the best is near
// the reference but the median is not) or of technique (never driven well: even the best is far off). Ranked by
// the time available.

import { plainNumber } from '../../units.js';

export interface VerdictOptions {
  /** Differences under this are not worth a verdict, s. */
  minTimeS: number;
  /** A corner whose median gives away at least this share of its time available over its own best is a matter of consistency. */
  consistencyShare: number;
}

/** Thresholds by common practice of coaching from lap data, no source. */
export const DEFAULT_VERDICT_OPTIONS: VerdictOptions = { minTimeS: 0.03, consistencyShare: 0.5 };

export interface CornerVerdict {
  corner: number;
  kind: 'consistency' | 'never-driven-well' | 'near-reference';
  /** Median corner time minus the reference's, s. */
  availableS: number;
  text: string;
}

interface CornerFigures {
  id: number;
  name: string | null;
  bestTimeS: number;
  bestLap: number;
  medianTimeS: number;
  spreadTimeS: number;
  referenceTimeS: number;
}

const label = (corner: CornerFigures) => (corner.name ? `corner ${corner.id} (${corner.name})` : `corner ${corner.id}`);
const seconds = (value: number) => `${plainNumber(value, 2)} s`;

export function cornerVerdicts(
  corners: readonly CornerFigures[],
  lapCount: number,
  options: VerdictOptions = DEFAULT_VERDICT_OPTIONS,
): CornerVerdict[] {
  const verdicts = corners.map((corner): CornerVerdict => {
    const availableS = corner.medianTimeS - corner.referenceTimeS;
    const bestGapS = corner.bestTimeS - corner.referenceTimeS;
    const repeatS = corner.medianTimeS - corner.bestTimeS;
    if (availableS < options.minTimeS)
      return {
        corner: corner.id,
        kind: 'near-reference',
        availableS,
        text: `${label(corner)}: the median lap is within ${seconds(Math.max(0, availableS))} of the reference`,
      };
    if (lapCount > 1 && repeatS >= options.minTimeS && repeatS >= options.consistencyShare * availableS)
      return {
        corner: corner.id,
        kind: 'consistency',
        availableS,
        text: `${label(corner)}: driven well on lap ${corner.bestLap} (${seconds(bestGapS)} off the reference) but rarely: the median lap gives ${seconds(repeatS)} more (spread ${seconds(corner.spreadTimeS)}); repeating the best is worth most here`,
      };
    return {
      corner: corner.id,
      kind: 'never-driven-well',
      availableS,
      text: `${label(corner)}: never driven near the reference: even the best, lap ${corner.bestLap}, is ${seconds(bestGapS)} off it (median ${seconds(availableS)}); the way it is driven has to change, not only its repetition`,
    };
  });
  return verdicts.sort((a, b) => b.availableS - a.availableS || a.corner - b.corner);
}
