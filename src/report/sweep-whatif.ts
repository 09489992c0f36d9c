// The what-if page: one change against the baseline, the lap time change as tiles and the braking-point
// shift per corner as a bar chart, in the lap report's frame. Pure: the CLI writes the strings.

import { zoneLabel } from '../track/corner-layout.js';
import type { LapComparison } from '../sweep/setup-change.js';
import { formatLapTime } from '../units.js';
import { barChartSvg, type BarChartSpec } from './html/bar-chart.js';
import { htmlPage } from './html/page-frame.js';
import type { ChartSvg } from './html/page.js';
import { PALETTE } from './html/palette.js';
import type { SvgOptions } from './html/svg-frame.js';
import { tile } from './html/tables.js';

export interface WhatifPageInput {
  comparison: LapComparison;
  /** The changes as `field before -> after` lines. */
  described: string[];
  trackName: string;
  carName: string;
}

function shiftChart(input: WhatifPageInput): BarChartSpec {
  return {
    name: 'braking-shift',
    title: 'Braking-point shift per corner',
    yTitle: 'shift, m (− = earlier)',
    colour: PALETTE.reference,
    legend: 'changed car minus baseline',
    missingText: 'no braking now',
    bars: input.comparison.zones.map((zone) => {
      const shift = zone.brakingPointShiftM;
      return {
        label: zone.tag,
        value: shift,
        title:
          shift === null
            ? `${zoneLabel({ tag: zone.tag, name: zone.cornerName })}: the changed car no longer brakes here`
            : `${zoneLabel({ tag: zone.tag, name: zone.cornerName })} (baseline brakes at ${zone.brakingPointM.toFixed(1)} m): ${shift >= 0 ? '+' : ''}${shift.toFixed(2)} m, ${shift < 0 ? 'earlier' : 'later'}`,
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
    main: `<section class="panel">${chart!.svg}</section>`,
    footerNote:
      'Made by reflap. Hold the pointer on a bar for its values. Colours: Okabe–Ito palette, chosen to stay readable for colour-blind readers.',
  });
}
