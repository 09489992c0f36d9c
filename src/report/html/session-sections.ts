// The session's part of a report page (`session --html`): the four answers to "where could my lap be" as tiles,
// every lap with its time and sectors, each corner across the laps, and the small multiples of speed and brake of
// every lap corner by corner. The best lap's own report follows on the same page.

import type { SessionOverview } from '../../compare/session/session-overview.js';
import type { CornerTraces } from '../../compare/session/corner-traces.js';
import { formatLapTime } from '../../units.js';
import { escapeHtml } from './escape.js';
import { cornerCell, fixed, signed, tile } from './cells.js';
import { cornerMultipleSvg, cornerMultiplesLegendSvg, sessionPicks } from './corner-multiples.js';
import type { ChartSvg } from './page.js';
import type { SvgOptions } from './svg-frame.js';
import { displayUnits, type DisplayUnits } from '../units.js';
import { noteText } from '../note-text.js';

export interface SessionReportPart {
  overview: SessionOverview;
  cornerTraces: CornerTraces[];
}

function answersHtml(overview: SessionOverview): string {
  const best = overview.bestLapTimeS;
  const gap = (time: number) => `${signed(time - best, 3)} s to the best lap`;
  const complete = overview.laps.filter((lap) => lap.complete).length;
  return (
    `<section class="summary" aria-label="Where could my lap be">` +
    tile(
      `Best lap (lap ${overview.bestLap})`,
      formatLapTime(best),
      `${complete} of ${overview.laps.length} laps complete`,
    ) +
    tile('Session best', formatLapTime(overview.sessionBestS), `your best corners, ${gap(overview.sessionBestS)}`) +
    (overview.demonstratedLapTimeS === null
      ? ''
      : tile(
          'On the grip already shown',
          formatLapTime(overview.demonstratedLapTimeS),
          gap(overview.demonstratedLapTimeS),
        )) +
    tile('Reference', formatLapTime(overview.referenceLapTimeS), gap(overview.referenceLapTimeS)) +
    `</section>`
  );
}

function lapTableHtml(overview: SessionOverview, units: DisplayUnits): string {
  const rows = overview.laps
    .map((lap) => {
      const best = lap.lap === overview.bestLap;
      const sectors = overview.sectorNames.map((_, k) => `<td>${lap.sectorsS ? fixed(lap.sectorsS[k], 3) : '–'}</td>`);
      const reason = lap.reason === null ? null : noteText(lap.reason, units);
      const state = lap.complete ? (reason ? `yes (${reason})` : 'yes') : `no: ${reason ?? 'incomplete'}`;
      return (
        `<tr class="lap-row${best ? ' best' : ''}" data-lap="${lap.lap}"><td>${lap.lap}${best ? ' ★' : ''}</td>` +
        `<td class="strong">${formatLapTime(lap.lapTimeS)}</td><td>${lap.complete ? signed(lap.lapTimeS - overview.bestLapTimeS, 3) : '–'}</td>` +
        `${sectors.join('')}<td class="state">${escapeHtml(state)}</td></tr>`
      );
    })
    .join('');
  const sectorHeads = overview.sectorNames.map((name) => `<th>${escapeHtml(name)}, s</th>`).join('');
  return (
    `<section class="laps"><h2>Laps</h2><p class="hint">★ the best lap. Sectors from the corners file, else three equal thirds of the lap.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>lap</th><th>time</th><th>to best, s</th>${sectorHeads}<th>complete</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

function cornerAcrossHtml(overview: SessionOverview, units: DisplayUnits): string {
  const speed = (kph: number | null) => (kph === null ? null : units.speed(kph / 3.6));
  const distance = (m: number | null) => (m === null ? null : units.distance(m));
  const verdict = new Map(overview.verdicts.map((v) => [v.corner, v]));
  const rows = overview.corners
    .map((c) => {
      const v = verdict.get(c.id);
      return (
        `<tr class="corner-row" data-corner="${c.id}" tabindex="0">${cornerCell(c.id, c.name)}` +
        `<td class="strong">${fixed(c.bestTimeS, 3)}</td><td>${c.bestLap}</td><td>${fixed(c.medianTimeS, 3)}</td><td>${fixed(c.spreadTimeS, 3)}</td>` +
        `<td>${fixed(c.referenceTimeS, 3)}</td>` +
        `<td>${fixed(distance(c.medianBrakingBeforeTurnInM), 0)} / ${fixed(distance(c.spreadBrakingPointM), 1)}</td>` +
        `<td>${fixed(speed(c.bestMinSpeedKph), 1)} / ${fixed(speed(c.medianMinSpeedKph), 1)} / ${fixed(speed(c.spreadMinSpeedKph), 1)}</td>` +
        `<td>${fixed(speed(c.referenceMinSpeedKph), 1)}</td>` +
        `<td class="verdict">${v ? escapeHtml(v.text) : ''}</td></tr>`
      );
    })
    .join('');
  const d = units.distanceLabel;
  const s = units.speedLabel;
  return (
    `<section class="corners"><h2>Corners across the laps</h2>` +
    `<p class="hint">Corner time over the corner's own stretch of the lap; spread is the sample standard deviation. Braking point in ${d} before the turn-in. Click a row to zoom the best lap's charts below to that corner.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>best, s</th><th>on lap</th><th>median, s</th><th>spread, s</th><th>reference, s</th>` +
    `<th>braking point median / spread, ${d}</th><th>slowest best / median / spread, ${s}</th><th>reference slowest, ${s}</th><th>what it means</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

/** Each corner's small multiple, as SVG files or inline charts. */
export function cornerMultipleCharts(part: SessionReportPart, options: SvgOptions, units?: DisplayUnits): ChartSvg[] {
  const byId = new Map(part.overview.corners.map((corner) => [corner.id, corner]));
  return part.cornerTraces.map((traces) => {
    const corner = byId.get(traces.id);
    const title = corner?.name ? `Corner ${traces.id}: ${corner.name}` : `Corner ${traces.id}`;
    return {
      name: `corner-${traces.id}.svg`,
      title,
      svg: cornerMultipleSvg(
        {
          traces,
          title,
          picked: sessionPicks(part.overview.bestLap, corner?.bestLap ?? part.overview.bestLap),
          ...(units ? { units } : {}),
        },
        options,
      ),
    };
  });
}

export function sessionSectionsHtml(part: SessionReportPart, units: DisplayUnits = displayUnits('metric')): string {
  const { overview } = part;
  const multiples = cornerMultipleCharts(part, { standalone: false }, units)
    .map((chart) => `<div class="multiple">${chart.svg}</div>`)
    .join('');
  const notes = overview.notes.map((note) => `<li>${escapeHtml(noteText(note, units))}</li>`).join('');
  return (
    answersHtml(overview) +
    `<section class="panel">${lapTableHtml(overview, units)}</section>` +
    `<section class="panel">${cornerAcrossHtml(overview, units)}</section>` +
    `<section class="panel multiples-panel" aria-label="Every lap, corner by corner"><h2>Every lap, corner by corner</h2>` +
    `<p class="hint">Speed (above) and brake (below) of every complete lap over each corner; hover a line for its lap.</p>` +
    `${cornerMultiplesLegendSvg({ standalone: false })}<div class="multiples">${multiples}</div></section>` +
    (notes ? `<section class="panel"><ul class="notes">${notes}</ul></section>` : '') +
    `<h2 class="best-lap-heading">The best lap, lap ${overview.bestLap}, against the reference</h2>`
  );
}
