// The report's HTML tables and lists: the lap summary, the per-corner table (or the reference's braking
// zones when there is no driver) and the ranked findings. All input text goes through escapeHtml.

import { formatLapTime, mpsToKph } from '../../units.js';
import { escapeHtml } from './escape.js';
import type { ReportModel } from './model.js';
import { againstTilesHtml } from './against-tables.js';
import { cornerCell, fixed, signed, tile } from './cells.js';

export { tile } from './cells.js';
import type { UncertainFinding } from '../../uncertainty/uncertain-reference.js';

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
  tiles.push(tile('Top speed', `${mpsToKph(reference.maxSpeedMps).toFixed(1)} km/h`, 'reference'));
  tiles.push(tile('Lowest speed', `${mpsToKph(reference.minSpeedMps).toFixed(1)} km/h`, 'reference'));
  tiles.push(
    tile(
      'Length',
      `${(reference.lengthM / 1000).toFixed(3)} km`,
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
  const rows = comparison.result.corners
    .map(
      (c, index) =>
        `<tr class="corner-row" data-corner="${c.id}" tabindex="0">${cornerCell(c.id, c.name)}` +
        `<td>${fixed(c.entryM, 0)}–${fixed(c.exitM, 0)}</td>` +
        `<td>${signed(c.brakingPointDeltaM, 0)}</td>` +
        `<td>${fixed(c.entrySpeedDriverKph, 1)} / ${fixed(c.entrySpeedReferenceKph, 1)}</td>` +
        `<td>${fixed(c.minSpeedDriverKph, 1)} / ${fixed(c.minSpeedReferenceKph, 1)}</td>` +
        `<td>${signed(c.minSpeedDeltaKph, 1)}</td>` +
        `<td>${signed(c.minSpeedOffsetFromApexM, 0)}</td>` +
        `<td>${fixed(c.exitSpeedDriverKph, 1)} / ${fixed(c.exitSpeedReferenceKph, 1)}</td>` +
        `<td>${signed(c.entryTimeLostS, 2)} / ${signed(c.middleTimeLostS, 2)} / ${signed(c.exitTimeLostS, 2)}</td>` +
        `<td class="strong">${signed(c.timeLostS, 2)}</td>` +
        `<td>${fixed(c.coastingS, 2)}</td>` +
        `<td>${fixed(c.peakGripUse * 100, 0)}</td>${uncertainty ? `<td>${holds(index)}</td>` : ''}</tr>`,
    )
    .join('');
  return (
    `<section class="corners"><h2>Corner by corner</h2><p class="hint">Driver / reference. Time lost is positive where the driver is slower. Click a row to zoom every chart to that corner.${uncertainty ? ` The last column is the share of the ${uncertainty.draws} draws of the car's uncertain values in which the corner's finding holds.` : ''}</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>entry–exit, m</th><th>brake point Δ, m</th><th>entry, km/h</th><th>slowest, km/h</th><th>slowest Δ, km/h</th>` +
    `<th>slowest after apex, m</th><th>exit, km/h</th><th>lost in entry / middle / exit, s</th><th>lost, s</th><th>coasting, s</th><th>peak grip, %</th>${uncertainty ? '<th>finding holds in</th>' : ''}</tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

function brakingZoneTableHtml(model: ReportModel): string {
  const zones = model.input.reference.brakingZones;
  const rows = zones
    .map((zone) => {
      const before = zone.beforeTurnInM === null ? '' : fixed(zone.beforeTurnInM, 0);
      return (
        `<tr class="corner-row" data-corner="${zone.corner}" tabindex="0">${cornerCell(zone.tag, zone.cornerName)}` +
        `<td>${fixed(zone.startM, 0)}</td><td>${before}</td><td>${fixed(mpsToKph(zone.entrySpeedMps), 1)}</td><td>${fixed(zone.brakingLengthM, 0)}</td>` +
        `<td>${fixed(zone.minSpeedAtM, 0)}</td><td>${fixed(mpsToKph(zone.minSpeedMps), 1)}</td></tr>`
      );
    })
    .join('');
  return (
    `<section class="corners"><h2>Braking zones of the reference</h2><p class="hint">Click a row to zoom every chart to that zone.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>brakes at, m</th><th>before turn-in, m</th><th>entry, km/h</th><th>braking, m</th><th>slowest at, m</th><th>slowest, km/h</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

function robustnessText(finding: UncertainFinding): string {
  const share = (value: number) => `${Math.round(value * 100)} %`;
  const rest = finding.clauses.slice(1).map((clause) => `${clause.text}: ${share(clause.holds)}`);
  const head = `${finding.uncertain ? 'Uncertain: holds' : 'Holds'} in ${share(finding.holds)} of draws (90 % band ${finding.timeS.low.toFixed(2)} to ${finding.timeS.high.toFixed(2)} s)`;
  return rest.length > 0 ? `${head}; ${rest.join('; ')}.` : `${head}.`;
}

export function findingsHtml(model: ReportModel): string {
  const comparison = model.input.comparison;
  if (!comparison) return '';
  const uncertainty = model.input.uncertainty;
  // Over draws of the car's uncertain values the findings come ranked by their median time, each with how often it holds.
  const findings = uncertainty
    ? uncertainty.findings.map((f) => ({
        corner: f.corner,
        timeS: f.timeS.median,
        text: f.text,
        robustness: robustnessText(f),
      }))
    : [...comparison.result.findings].sort((a, b) => b.timeS - a.timeS).map((f) => ({ ...f, robustness: '' }));
  const items = findings
    .map((finding) => {
      const where =
        finding.corner !== null
          ? `<button type="button" class="corner-link" data-corner="${finding.corner}">corner ${finding.corner}</button>`
          : '<span class="whole-lap">whole lap</span>';
      return `<li><span class="stake">${fixed(finding.timeS, 2)} s</span>${where}<span class="finding-text">${escapeHtml(finding.text)}${finding.robustness ? ` <em>${escapeHtml(finding.robustness)}</em>` : ''}</span></li>`;
    })
    .join('');
  const notes = comparison.result.notes.map((note) => `<li>${escapeHtml(note)}</li>`).join('');
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
