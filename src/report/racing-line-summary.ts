// The racing line of `reflap line` for people and programs: the laps on the centreline and on the line, the
// line's length, tightest radius and largest offset, as terminal lines (metres, or feet under imperial) or a JSON
// object (metres).

import type { TrackGrid } from '../track/types.js';
import type { RacingLine } from '../line/types.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { roundToDigits } from '../numeric/round.js';
import { formatLapTime } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

export function racingLineJson(line: RacingLine, track: TrackGrid, carName: string) {
  return {
    track: track.name,
    car: carName,
    objective: line.objective,
    marginM: roundToDigits(line.marginM, 3),
    lapTimeCentrelineS: roundToDigits(line.centrelineLap.lapTimeS, 4),
    lapTimeLineS: roundToDigits(line.lap.lapTimeS, 4),
    lapTimeCurvatureLineS: roundToDigits(line.curvatureLineLapTimeS, 4),
    gainS: roundToDigits(line.centrelineLap.lapTimeS - line.lap.lapTimeS, 4),
    lengthM: roundToDigits(line.lengthM, 2),
    centrelineLengthM: roundToDigits(track.lengthM, 2),
    minRadiusM: Number.isFinite(line.minRadiusM) ? roundToDigits(line.minRadiusM, 2) : null,
    minRadiusAtM: roundToDigits(line.minRadiusAtM, 1),
    maxOffsetM: roundToDigits(line.maxOffsetM, 3),
    lapsDriven: line.lapEvaluations,
  };
}

export function racingLineText(
  line: RacingLine,
  track: TrackGrid,
  carName: string,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const gain = line.centrelineLap.lapTimeS - line.lap.lapTimeS;
  const distance = (distanceM: number, digits: number) =>
    `${units.distance(distanceM).toFixed(digits)} ${units.distanceLabel}`;
  const radius = Number.isFinite(line.minRadiusM)
    ? `${distance(line.minRadiusM, 1)} at ${distance(line.minRadiusAtM, 0)}`
    : 'none (straight)';
  return [
    `${track.name} · ${carName} · ${line.objective} line, ${distance(line.marginM, 2)} from the edges`,
    `Lap on the centreline   ${formatLapTime(line.centrelineLap.lapTimeS)}`,
    `Lap on the line         ${formatLapTime(line.lap.lapTimeS)}  (${gain >= 0 ? '-' : '+'}${Math.abs(gain).toFixed(3)} s)`,
    `Line length             ${distance(line.lengthM, 1)} (centreline ${distance(track.lengthM, 1)})`,
    `Tightest radius         ${radius}`,
    `Largest offset          ${distance(line.maxOffsetM, 2)}`,
    '',
    SAFETY_CAUTION,
    '',
  ].join('\n');
}
