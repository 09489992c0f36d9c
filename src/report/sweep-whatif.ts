// The what-if page: one change against the baseline, the lap time change as tiles, the braking-point shift per
// corner as a bar chart and, corner by corner, the braking point, its shift and the speed and time changes, in the
// lap report's frame. Pure: the CLI writes the strings.

import { zoneLabel } from '../track/corner-layout.js';
import type { LapComparison } from '../sweep/setup-change.js';
import { formatLapTime } from '../units.js';
import { barChartSvg, type BarChartSpec } from './html/bar-chart.js';
import { htmlPage } from './html/page-frame.js';
import type { ChartSvg } from './html/page.js';
import { PALETTE } from './html/palette.js';
import type { SvgOptions } from './html/svg-frame.js';
import { tile } from './html/tables.js';
import { cornerCell, fixed, signed } from './html/cells.js';
import { kphToMps } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

export interface WhatifPageInput {
  comparison: LapComparison;
  /** The changes as `field before -> after` lines. */
  described: string[];
  trackName: string;
  carName: string;
  /** Metric when omitted. */
  units?: DisplayUnits;
}

const unitsOfPage = (input: WhatifPageInput) => input.units ?? displayUnits('metric');

function shiftChart(input: WhatifPageInput): BarChartSpec {
  const units = unitsOfPage(input);
  const d = units.distanceLabel;
  return {
    name: 'braking-shift',
    title: 'Braking-point shift per corner',
    yTitle: `shift, ${d} (− = earlier)`,
    colour: PALETTE.reference,
    legend: 'changed car minus baseline',
    missingText: 'no braking now',
    bars: input.comparison.zones.map((zone) => {
      const shift = zone.brakingPointShiftM === null ? null : units.distance(zone.brakingPointShiftM);
      return {
        label: zone.tag,
        value: shift,
        title:
          shift === null
            ? `${zoneLabel({ tag: zone.tag, name: zone.cornerName })}: the changed car no longer brakes here`
            : `${zoneLabel({ tag: zone.tag, name: zone.cornerName })} (baseline brakes at ${units.distance(zone.brakingPointM).toFixed(1)} ${d}): ${shift >= 0 ? '+' : ''}${shift.toFixed(2)} ${d}, ${shift < 0 ? 'earlier' : 'later'}`,
      };
    }),
  };
}

function charts(input: WhatifPageInput, options: SvgOptions): ChartSvg[] {
  const spec = shiftChart(input);
  return [{ name: `${spec.name}.svg`, title: spec.title, svg: barChartSvg(spec, options) }];
}

export function whatifChartSvgs(input: WhatifPageInput): ChartSvg[] {
  return charts(input, { standalone: true });
}

/** Corner by corner: where the baseline brakes, how far the change moves it, and the speed and time changes. */
export function whatifCornerTableHtml(input: WhatifPageInput): string {
  const units = unitsOfPage(input);
  const speed = (kph: number | null) => (kph === null ? null : units.speed(kphToMps(kph)));
  const distance = (m: number | null) => (m === null ? null : units.distance(m));
  const rows = input.comparison.zones
    .map((zone) => {
      const shift = zone.brakingPointShiftM;
      const moved = shift === null ? 'no braking now' : signed(distance(shift), 1);
      return (
        `<tr class="corner-row" data-corner="${zone.corner}">${cornerCell(zone.tag, zone.cornerName)}` +
        `<td>${fixed(distance(zone.brakingPointM), 0)}</td><td>${fixed(distance(zone.beforeTurnInM), 0)}</td>` +
        `<td class="strong">${moved}</td><td>${signed(speed(zone.entrySpeedDeltaKph), 1)}</td>` +
        `<td>${signed(speed(zone.minSpeedDeltaKph), 1)}</td><td>${signed(zone.zoneTimeDeltaS, 3)}</td></tr>`
      );
    })
    .join('');
  const d = units.distanceLabel;
  const v = units.speedLabel;
  return (
    `<section class="corners"><h2>Corner by corner</h2><p class="hint">Changed car minus baseline. A negative braking-point shift brakes earlier; a negative time change is quicker.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>corner</th><th>baseline brakes at, ${d}</th><th>before turn-in, ${d}</th>` +
    `<th>braking point shift, ${d}</th><th>entry speed change, ${v}</th><th>slowest speed change, ${v}</th><th>zone time change, s</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

export function whatifReportHtml(input: WhatifPageInput): string {
  const { comparison } = input;
  const delta = comparison.lapTimeDeltaS;
  const tiles = [
    tile('Baseline lap', formatLapTime(comparison.baselineLapTimeS)),
    tile('Changed lap', formatLapTime(comparison.changedLapTimeS)),
    tile(
      'Lap time change',
      `${delta >= 0 ? '+' : '−'}${Math.abs(delta).toFixed(3)} s`,
      delta >= 0 ? 'slower' : 'quicker',
    ),
    tile('Corners', String(comparison.zones.length), 'braking zones of the baseline'),
  ];
  const [chart] = charts(input, { standalone: false });
  return htmlPage({
    title: `What if: ${input.trackName} · ${input.carName}`,
    subtitle: `Change: ${input.described.join('; ')}`,
    header: `<section class="summary" aria-label="What-if summary">${tiles.join('')}</section>`,
    main: `<section class="panel">${chart!.svg}</section>\n<section class="panel">${whatifCornerTableHtml(input)}</section>`,
    footerNote:
      'Made by reflap. Hold the pointer on a bar for its values. Colours: Okabe–Ito palette, chosen to stay readable for colour-blind readers.',
  });
}
