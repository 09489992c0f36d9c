// The lap-against-lap part of the report: the driver's lap and the chosen lap corner by corner (each pair written
// driver / other lap), each lap's time to the reference over the same stretch, and the findings in plain words.
// All input text goes through escapeHtml.

import { formatLapTime, mps2ToG } from '../../units.js';
import type { LapCornerFigures } from '../../compare/against/lap-corner.js';
import { escapeHtml } from './escape.js';
import { againstFindingText } from '../against-phrases.js';
import { shownUnits, type ReportModel } from './model.js';
import { cornerCell, fixed, signed, tile } from './cells.js';

/** Summary tiles for the chosen lap: its time and the driver's gap to it. */
export function againstTilesHtml(model: ReportModel): string {
  const against = model.input.against;
  if (!against) return '';
  const result = against.result;
  const gap = result.driverLapTimeS - result.lapTimeS;
  const toReference = result.lapTimeS - result.referenceLapTimeS;
  return (
    tile(
      'Set against',
      formatLapTime(result.lapTimeS),
      `${result.label}, ${signed(toReference, 3)} s to the reference`,
    ) + tile(`Gap to ${result.label}`, `${signed(gap, 3)} s`, gap >= 0 ? 'driver slower' : 'driver faster')
  );
}

export function againstTableHtml(model: ReportModel): string {
  const against = model.input.against;
  if (!against) return '';
  const result = against.result;
  const pair =
    (pick: (f: LapCornerFigures) => number | null, digits: number) =>
    (c: { first: LapCornerFigures; second: LapCornerFigures }) =>
      `${fixed(pick(c.first), digits)} / ${fixed(pick(c.second), digits)}`;
  const { speedOfKph: v, distanceOfM: m } = shownUnits(model);
  const rows = result.corners
    .map(
      (c) =>
        `<tr class="corner-row" data-corner="${c.id}" tabindex="0">${cornerCell(c.id, c.name)}` +
        `<td>${signed(m(c.brakingPointDeltaM), 0)}</td>` +
        `<td>${pair((f) => m(f.brakingBeforeTurnInM), 0)(c)}</td>` +
        `<td>${pair((f) => (f.peakBrakingMps2 === null ? null : mps2ToG(f.peakBrakingMps2)), 2)(c)}</td>` +
        `<td>${pair((f) => m(f.brakeReleaseFromApexM), 0)(c)}</td>` +
        `<td>${pair((f) => v(f.entrySpeedKph), 1)(c)}</td>` +
        `<td>${pair((f) => v(f.minSpeedKph), 1)(c)}</td>` +
        `<td>${pair((f) => v(f.exitSpeedKph), 1)(c)}</td>` +
        `<td>${pair((f) => f.coastingS, 2)(c)}</td>` +
        `<td>${signed(c.entryTimeLostS, 2)} / ${signed(c.middleTimeLostS, 2)} / ${signed(c.exitTimeLostS, 2)}</td>` +
        `<td class="strong">${signed(c.timeLostS, 2)}</td>` +
        `<td>${signed(c.driverToReferenceS, 2)} / ${signed(c.otherToReferenceS, 2)}</td></tr>`,
    )
    .join('');
  const label = escapeHtml(result.label);
  const { speedLabel: sl, distanceLabel: dl } = model.units;
  return (
    `<section class="corners against"><h2>Corner by corner against ${label}</h2>` +
    `<p class="hint">Pairs are driver / ${label}. Brake point Δ is positive where the driver brakes later; lost is the driver's time minus ${label}'s, positive where the driver is slower; to the reference is each lap's time lost to the reference over the same stretch. Click a row to zoom every chart to that corner.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>brake point Δ, ${dl}</th><th>brakes before turn-in, ${dl}</th><th>peak braking, g</th>` +
    `<th>brake off from apex, ${dl}</th><th>entry, ${sl}</th><th>slowest, ${sl}</th><th>exit, ${sl}</th><th>coasting, s</th>` +
    `<th>lost in entry / middle / exit, s</th><th>lost, s</th><th>to the reference, s</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

export function againstFindingsHtml(model: ReportModel): string {
  const against = model.input.against;
  if (!against) return '';
  const result = against.result;
  const items = result.findings
    .map((finding) => {
      const where =
        finding.corner !== null
          ? `<button type="button" class="corner-link" data-corner="${finding.corner}">corner ${finding.corner}</button>`
          : '<span class="whole-lap">whole lap</span>';
      return `<li><span class="stake">${fixed(finding.timeS, 2)} s</span>${where}<span class="finding-text">${escapeHtml(againstFindingText(finding, model.units))}</span></li>`;
    })
    .join('');
  const notes = result.notes.map((note) => `<li>${escapeHtml(note)}</li>`).join('');
  return (
    `<section class="findings against"><h2>Lap against lap: ${escapeHtml(result.driverLabel)} and ${escapeHtml(result.label)}</h2>` +
    (items
      ? `<ol class="finding-list">${items}</ol>`
      : '<p>The two laps differ by less than a hundredth of a second in every corner.</p>') +
    (notes ? `<ul class="notes">${notes}</ul>` : '') +
    `</section>`
  );
}
