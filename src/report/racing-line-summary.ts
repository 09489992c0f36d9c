// The racing line of `reflap line` for people and programs: the laps on the centreline and on the line, the
// line's length, tightest radius and largest offset, as terminal lines or a JSON object.

import type { TrackGrid } from '../track/types.js';
import type { RacingLine } from '../line/types.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { roundToDigits } from '../numeric/round.js';
import { formatLapTime } from '../units.js';

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

export function racingLineText(line: RacingLine, track: TrackGrid, carName: string): string {
  const gain = line.centrelineLap.lapTimeS - line.lap.lapTimeS;
  const radius = Number.isFinite(line.minRadiusM)
    ? `${line.minRadiusM.toFixed(1)} m at ${line.minRadiusAtM.toFixed(0)} m`
    : 'none (straight)';
  return [
    `${track.name} · ${carName} · ${line.objective} line, ${line.marginM.toFixed(2)} m from the edges`,
    `Lap on the centreline   ${formatLapTime(line.centrelineLap.lapTimeS)}`,
    `Lap on the line         ${formatLapTime(line.lap.lapTimeS)}  (${gain >= 0 ? '-' : '+'}${Math.abs(gain).toFixed(3)} s)`,
    `Line length             ${line.lengthM.toFixed(1)} m (centreline ${track.lengthM.toFixed(1)} m)`,
    `Tightest radius         ${radius}`,
    `Largest offset          ${line.maxOffsetM.toFixed(2)} m`,
    '',
    SAFETY_CAUTION,
    '',
  ].join('\n');
}
