// A session for the terminal (laps with sector times, the four answers to "where could my lap be", the corners
// across the laps, the two rankings and the verdicts) and as the JSON object of `session --json`.

import type { SessionOverview } from '../compare/session/session-overview.js';
import { formatLapTime, kphToMps } from '../units.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { roundToDigits as round } from '../numeric/round.js';
import { noteText } from './note-text.js';

const signed = (value: number, digits: number) => plainNumber(value, digits, true);
const cornerName = (id: number, overview: SessionOverview) => {
  const corner = overview.corners.find((c) => c.id === id);
  return corner?.name ? `${id} ${corner.name}` : String(id);
};

export function sessionText(overview: SessionOverview, units: DisplayUnits = displayUnits('metric')): string {
  const d = units.distanceLabel;
  const speed = (kph: number) => plainNumber(units.speed(kphToMps(kph)), 0);
  const completeCount = overview.laps.filter((lap) => lap.complete).length;
  const answers: [string, number | null][] = [
    [`Best lap (lap ${overview.bestLap})`, overview.bestLapTimeS],
    ['Session best (your best corners)', overview.sessionBestS],
    ['With the grip already shown', overview.demonstratedLapTimeS],
    ['Reference', overview.referenceLapTimeS],
  ];
  const lines = [
    `${overview.trackName} · session of ${overview.source}: ${overview.laps.length} laps, ${completeCount} complete`,
    '',
    formatTable(
      ['lap', 'time', ...overview.sectorNames, 'complete'],
      overview.laps.map((lap) => [
        String(lap.lap),
        formatLapTime(lap.lapTimeS),
        ...overview.sectorNames.map((_, k) => (lap.sectorsS ? lap.sectorsS[k]!.toFixed(3) : '-')),
        lap.complete ? 'yes' : `no: ${lap.reason === null ? 'incomplete' : noteText(lap.reason, units)}`,
      ]),
    ),
    '',
    'Where could my lap be',
    formatTable(
      ['', 'lap', 'to best lap s'],
      answers.map(([name, time]) => [
        name,
        time === null ? '-' : formatLapTime(time),
        time === null ? '-' : signed(time - overview.bestLapTimeS, 3),
      ]),
    ),
    '',
    `Corners across the ${completeCount} complete laps (corner time over the corner's stretch of the lap, s; spread = sample`,
    `standard deviation; brake = braking point, ${d} before the turn-in, median and spread; slowest in ${units.speedLabel}: best/median/spread)`,
    formatTable(
      ['#', 'best s', 'on lap', 'median s', 'spread s', 'reference s', `brake ${d}`, `slowest ${units.speedLabel}`],
      overview.corners.map((c) => [
        cornerName(c.id, overview),
        c.bestTimeS.toFixed(3),
        String(c.bestLap),
        c.medianTimeS.toFixed(3),
        c.spreadTimeS.toFixed(3),
        c.referenceTimeS.toFixed(3),
        c.medianBrakingBeforeTurnInM === null
          ? '-'
          : `${plainNumber(units.distance(c.medianBrakingBeforeTurnInM), 0)} ±${plainNumber(units.distance(c.spreadBrakingPointM ?? 0), 1)}`,
        `${speed(c.bestMinSpeedKph)}/${speed(c.medianMinSpeedKph)}/${plainNumber(units.speed(kphToMps(c.spreadMinSpeedKph)), 1)}`,
      ]),
    ),
    '',
    `Time available (median corner against the reference), most first: ${overview.byTimeAvailable.map((id) => cornerName(id, overview)).join(', ')}`,
    `Least consistent (spread of the corner time), first: ${overview.byConsistency.map((id) => cornerName(id, overview)).join(', ')}`,
    '',
  ];
  const told = overview.verdicts.filter((verdict) => verdict.kind !== 'near-reference');
  if (told.length === 0) lines.push('Every corner of the median lap is within a few hundredths of the reference.');
  else {
    lines.push('Corner by corner (most time available first):');
    told.forEach((verdict, index) => lines.push(`${index + 1}. ${verdict.text}.`));
  }
  if (overview.notes.length > 0) lines.push('', ...overview.notes.map((note) => `Note: ${noteText(note, units)}`));
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}

const roundOrNull = (value: number | null, digits: number) => (value === null ? null : round(value, digits));

export function sessionJson(overview: SessionOverview) {
  return {
    track: overview.trackName,
    source: overview.source,
    laps: overview.laps.map((lap) => ({
      lap: lap.lap,
      lapTimeS: round(lap.lapTimeS, 4),
      complete: lap.complete,
      ...(lap.reason ? { reason: noteText(lap.reason) } : {}),
      sectorsS: lap.sectorsS ? lap.sectorsS.map((s) => round(s, 4)) : [],
    })),
    sectors: overview.sectorNames,
    bestLap: overview.bestLap,
    bestLapTimeS: round(overview.bestLapTimeS, 4),
    sessionBestS: round(overview.sessionBestS, 4),
    demonstratedLapTimeS: roundOrNull(overview.demonstratedLapTimeS, 4),
    referenceLapTimeS: round(overview.referenceLapTimeS, 4),
    corners: overview.corners.map((c) => ({
      id: c.id,
      name: c.name,
      bestTimeS: round(c.bestTimeS, 4),
      bestLap: c.bestLap,
      medianTimeS: round(c.medianTimeS, 4),
      spreadTimeS: round(c.spreadTimeS, 4),
      referenceTimeS: round(c.referenceTimeS, 4),
      medianBrakingBeforeTurnInM: roundOrNull(c.medianBrakingBeforeTurnInM, 1),
      spreadBrakingPointM: roundOrNull(c.spreadBrakingPointM, 2),
      brakingLaps: c.brakingLaps,
      bestMinSpeedKph: round(c.bestMinSpeedKph, 1),
      medianMinSpeedKph: round(c.medianMinSpeedKph, 1),
      spreadMinSpeedKph: round(c.spreadMinSpeedKph, 2),
      referenceMinSpeedKph: round(c.referenceMinSpeedKph, 1),
    })),
    byTimeAvailable: overview.byTimeAvailable,
    byConsistency: overview.byConsistency,
    verdicts: overview.verdicts.map((v) => ({
      corner: v.corner,
      kind: v.kind,
      availableS: round(v.availableS, 3),
      text: v.text,
    })),
    notes: overview.notes.map((note) => noteText(note)),
  };
}
