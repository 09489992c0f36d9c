// The report's HTML tables and lists: the lap summary, the per-corner table (or the reference's braking
// zones when there is no driver) and the ranked findings. All input text goes through escapeHtml.

import { formatLapTime } from '../../units.js';
import { escapeHtml } from './escape.js';
import { shownUnits, type ReportModel } from './model.js';
import { againstTilesHtml } from './against-tables.js';
import { cornerCell, fixed, signed, tile } from './cells.js';

export { tile } from './cells.js';
import type { UncertainFinding } from '../../uncertainty/uncertain-reference.js';
import { claimText, findingText } from '../finding-phrases.js';
import type { DisplayUnits } from '../units.js';
import { noteText } from '../note-text.js';

export function summaryHtml(model: ReportModel): string {
  const reference = model.input.reference;
  const tiles = [tile('Reference lap', formatLapTime(reference.lapTimeS), `${reference.envelopeKind} envelope`)];
  const comparison = model.input.comparison;
  if (comparison) {
    const result = comparison.result;
    const gap = result.driverLapTimeS - result.referenceLapTimeS;
    tiles.push(
      tile(
        'Driver lap',
        formatLapTime(result.driverLapTimeS),
        `lap ${comparison.driver.lapNumber} of ${comparison.driver.source}`,
      ),
    );
    tiles.push(tile('Gap to reference', `${signed(gap, 3)} s`, gap >= 0 ? 'driver slower' : 'driver faster'));
    if (result.demonstratedLapTimeS !== null)
      tiles.push(tile('On demonstrated grip', formatLapTime(result.demonstratedLapTimeS), 'driver’s own envelope'));
  }
  const uncertainty = model.input.uncertainty;
  if (uncertainty) {
    const band = uncertainty.lapTimeS;
    tiles.push(
      tile(
        'Reference over the draws',
        formatLapTime(band.median),
        `90 % band ${formatLapTime(band.low)} to ${formatLapTime(band.high)}, ${uncertainty.draws} draws`,
      ),
    );
  }
  tiles.push(againstTilesHtml(model));
  const units = model.units;
  tiles.push(tile('Top speed', `${units.speed(reference.maxSpeedMps).toFixed(1)} ${units.speedLabel}`, 'reference'));
  tiles.push(tile('Lowest speed', `${units.speed(reference.minSpeedMps).toFixed(1)} ${units.speedLabel}`, 'reference'));
  tiles.push(
    tile(
      'Length',
      `${units.length(reference.lengthM).toFixed(3)} ${units.lengthLabel}`,
      reference.track.closed ? 'closed circuit' : 'open stage',
    ),
  );
  return `<section class="summary" aria-label="Lap summary">${tiles.join('')}</section>`;
}

export function cornerTableHtml(model: ReportModel): string {
  const comparison = model.input.comparison;
  if (!comparison) return brakingZoneTableHtml(model);
  const uncertainty = model.input.uncertainty;
  const holds = (index: number) => {
    const share = uncertainty?.corners[index]?.holds;
    return share === null || share === undefined ? '–' : `${Math.round(share * 100)} %`;
  };
  const { speedOfKph: v, distanceOfM: m } = shownUnits(model);
  const rows = comparison.result.corners
    .map(
      (c, index) =>
        `<tr class="corner-row" data-corner="${c.id}" tabindex="0">${cornerCell(c.id, c.name)}` +
        `<td>${fixed(m(c.entryM), 0)}–${fixed(m(c.exitM), 0)}</td>` +
        `<td>${signed(m(c.brakingPointDeltaM), 0)}</td>` +
        `<td>${fixed(v(c.entrySpeedDriverKph), 1)} / ${fixed(v(c.entrySpeedReferenceKph), 1)}</td>` +
        `<td>${fixed(v(c.minSpeedDriverKph), 1)} / ${fixed(v(c.minSpeedReferenceKph), 1)}</td>` +
        `<td>${signed(v(c.minSpeedDeltaKph), 1)}</td>` +
        `<td>${signed(m(c.minSpeedOffsetFromApexM), 0)}</td>` +
        `<td>${fixed(v(c.exitSpeedDriverKph), 1)} / ${fixed(v(c.exitSpeedReferenceKph), 1)}</td>` +
        `<td>${signed(c.entryTimeLostS, 2)} / ${signed(c.middleTimeLostS, 2)} / ${signed(c.exitTimeLostS, 2)}</td>` +
        `<td class="strong">${signed(c.timeLostS, 2)}</td>` +
        `<td>${fixed(c.coastingS, 2)}</td>` +
        `<td>${fixed(c.peakGripUse * 100, 0)}</td>${uncertainty ? `<td>${holds(index)}</td>` : ''}</tr>`,
    )
    .join('');
  const { speedLabel: sl, distanceLabel: dl } = model.units;
  return (
    `<section class="corners"><h2>Corner by corner</h2><p class="hint">Driver / reference. Time lost is positive where the driver is slower. Click a row to zoom every chart to that corner.${uncertainty ? ` The last column is the share of the ${uncertainty.draws} draws of the car's uncertain values in which the corner's finding holds.` : ''}</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>entry–exit, ${dl}</th><th>brake point Δ, ${dl}</th><th>entry, ${sl}</th><th>slowest, ${sl}</th><th>slowest Δ, ${sl}</th>` +
    `<th>slowest after apex, ${dl}</th><th>exit, ${sl}</th><th>lost in entry / middle / exit, s</th><th>lost, s</th><th>coasting, s</th><th>peak grip, %</th>${uncertainty ? '<th>finding holds in</th>' : ''}</tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

function brakingZoneTableHtml(model: ReportModel): string {
  const zones = model.input.reference.brakingZones;
  const { distanceOfM: m } = shownUnits(model);
  const speed = (speedMps: number) => model.units.speed(speedMps);
  const rows = zones
    .map((zone) => {
      const before = zone.beforeTurnInM === null ? '' : fixed(m(zone.beforeTurnInM), 0);
      return (
        `<tr class="corner-row" data-corner="${zone.corner}" tabindex="0">${cornerCell(zone.tag, zone.cornerName)}` +
        `<td>${fixed(m(zone.startM), 0)}</td><td>${before}</td><td>${fixed(speed(zone.entrySpeedMps), 1)}</td><td>${fixed(m(zone.brakingLengthM), 0)}</td>` +
        `<td>${fixed(m(zone.minSpeedAtM), 0)}</td><td>${fixed(speed(zone.minSpeedMps), 1)}</td></tr>`
      );
    })
    .join('');
  const { speedLabel: sl, distanceLabel: dl } = model.units;
  return (
    `<section class="corners"><h2>Braking zones of the reference</h2><p class="hint">Click a row to zoom every chart to that zone.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>brakes at, ${dl}</th><th>before turn-in, ${dl}</th><th>entry, ${sl}</th><th>braking, ${dl}</th><th>slowest at, ${dl}</th><th>slowest, ${sl}</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

function robustnessText(finding: UncertainFinding, units: DisplayUnits): string {
  const share = (value: number) => `${Math.round(value * 100)} %`;
  const rest = finding.clauses.slice(1).map((clause) => `${claimText(clause.claim, units)}: ${share(clause.holds)}`);
  const head = `${finding.uncertain ? 'Uncertain: holds' : 'Holds'} in ${share(finding.holds)} of draws (90 % band ${finding.timeS.low.toFixed(2)} to ${finding.timeS.high.toFixed(2)} s)`;
  return rest.length > 0 ? `${head}; ${rest.join('; ')}.` : `${head}.`;
}

/** `shownAbove`: notes the page already lists (a session's, above its best lap), not listed again. */
export function findingsHtml(model: ReportModel, shownAbove: ReadonlySet<string> = new Set()): string {
  const comparison = model.input.comparison;
  if (!comparison) return '';
  const uncertainty = model.input.uncertainty;
  // Over draws of the car's uncertain values the findings come ranked by their median time, each with how often it holds.
  const findings = uncertainty
    ? uncertainty.findings.map((f) => ({
        corner: f.corner,
        timeS: f.timeS.median,
        text: findingText(f.finding, model.units),
        robustness: robustnessText(f, model.units),
      }))
    : [...comparison.result.findings]
        .sort((a, b) => b.timeS - a.timeS)
        .map((f) => ({ corner: f.corner, timeS: f.timeS, text: findingText(f, model.units), robustness: '' }));
  const items = findings
    .map((finding) => {
      const where =
        finding.corner !== null
          ? `<button type="button" class="corner-link" data-corner="${finding.corner}">corner ${finding.corner}</button>`
          : '<span class="whole-lap">whole lap</span>';
      return `<li><span class="stake">${fixed(finding.timeS, 2)} s</span>${where}<span class="finding-text">${escapeHtml(finding.text)}${finding.robustness ? ` <em>${escapeHtml(finding.robustness)}</em>` : ''}</span></li>`;
    })
    .join('');
  const notes = comparison.result.notes
    .map((note) => noteText(note, model.units))
    .filter((text) => !shownAbove.has(text))
    .map((text) => `<li>${escapeHtml(text)}</li>`)
    .join('');
  const derived = comparison.driver.derivedChannels.length
    ? `<li>${escapeHtml(`Derived, not measured: ${comparison.driver.derivedChannels.join(', ')}.`)}</li>`
    : '';
  return (
    `<section class="findings"><h2>Where the time is</h2>` +
    (items ? `<ol class="finding-list">${items}</ol>` : '<p>No findings.</p>') +
    (notes || derived ? `<ul class="notes">${notes}${derived}</ul>` : '') +
    `</section>`
  );
}
