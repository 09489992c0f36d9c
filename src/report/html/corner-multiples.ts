// Small multiples of a session, one small chart per corner: the speed (above) and the brake (below) of every
// complete lap over the corner's stretch, on one distance axis, each lap a thin line named on hover, the best lap
// and the lap with the corner's best time picked out, the reference dashed (E. Tufte's small multiples: one frame,
// many laps, compared at a glance). Axes are each corner's own.

import { line } from 'd3-shape';
import type { CornerTraces } from '../../compare/session/corner-traces.js';
import { escapeHtml } from './escape.js';
import { linearScale, paddedDomain } from './scale.js';
import { legendRows, svgElement, tickText, xAxis, yAxis, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';
import { displayUnits, type DisplayUnits } from '../units.js';

const WIDTH = 360;
const LEFT = 46;
const RIGHT = 10;
const SPEED_TOP = 30;
const SPEED_BOTTOM = 150;
const BRAKE_TOP = 162;
const BRAKE_BOTTOM = 212;
const HEIGHT = 244;
const OTHER_LAP_COLOUR = '#b3b3b3';

export interface CornerMultipleSpec {
  traces: CornerTraces;
  title: string;
  units?: DisplayUnits;
  /** The laps picked out, drawn over the others in their own colour and named on hover; the rest are grey. */
  picked: ReadonlyMap<number, { colour: string; name: string }>;
}

/** A session's picks: its best lap, and the lap with this corner's best time. */
export function sessionPicks(
  bestLap: number,
  cornerBestLap: number,
): ReadonlyMap<number, { colour: string; name: string }> {
  const picks = new Map<number, { colour: string; name: string }>();
  picks.set(cornerBestLap, { colour: PALETTE.gain, name: `lap ${cornerBestLap} (best in this corner)` });
  picks.set(bestLap, {
    colour: PALETTE.driver,
    name: `lap ${bestLap} (best lap)${bestLap === cornerBestLap ? ' (best in this corner)' : ''}`,
  });
  return picks;
}

export function cornerMultiplesLegend(): LegendItem[] {
  return [
    { label: 'each lap', colour: OTHER_LAP_COLOUR },
    { label: 'best lap', colour: PALETTE.driver },
    { label: 'best lap in this corner', colour: PALETTE.gain },
    { label: 'reference', colour: PALETTE.reference, dash: '6 3' },
  ];
}

export function cornerMultipleSvg(spec: CornerMultipleSpec, options: SvgOptions): string {
  const units = spec.units ?? displayUnits('metric');
  const { traces } = spec;
  const stations = traces.stationM;
  const count = stations.length;
  const from = stations[0] ?? 0;
  const to = stations[count - 1] ?? from + 1;
  const x = linearScale([units.distance(from), units.distance(to)], [LEFT, WIDTH - RIGHT]);
  let low = Infinity;
  let high = -Infinity;
  for (const values of [traces.reference.speedMps, ...traces.laps.map((lap) => lap.speedMps)])
    for (let i = 0; i < values.length; i++) {
      const v = units.speed(values[i]!);
      if (v < low) low = v;
      if (v > high) high = v;
    }
  const speedDomain = paddedDomain(low, high, 0.06);
  const ySpeed = linearScale(speedDomain, [SPEED_BOTTOM, SPEED_TOP]);
  const yBrake = linearScale([0, 100], [BRAKE_BOTTOM, BRAKE_TOP]);
  const path = (values: ArrayLike<number>, y: (v: number) => number) =>
    line<number>()
      .x((i) => x(units.distance(stations[i]!)))
      .y((i) => y(values[i]!))
      .digits(1)(Array.from({ length: count }, (_, i) => i)) ?? '';
  const speedOf = (v: number) => ySpeed(units.speed(v));
  const brakeOf = (v: number) => yBrake(v * 100);

  let body = `<text class="chart-title" x="${LEFT}" y="16" font-size="12.5" font-weight="600">${escapeHtml(spec.title)}</text>`;
  body += yAxis(ySpeed, LEFT, WIDTH - RIGHT, `speed, ${units.speedLabel}`, tickText, 3);
  body += yAxis(yBrake, LEFT, WIDTH - RIGHT, 'brake, %', tickText, 1);
  // The laps drawn grey first, the picked laps over them, the reference on top.
  const { picked } = spec;
  const order = [...traces.laps.filter((lap) => !picked.has(lap.lap)), ...traces.laps.filter((l) => picked.has(l.lap))];
  for (const lap of order) {
    const pick = picked.get(lap.lap);
    const colour = pick?.colour ?? OTHER_LAP_COLOUR;
    const width = pick ? 1.8 : 1;
    const name = pick?.name ?? `lap ${lap.lap}`;
    body +=
      `<g class="lap-trace" data-lap="${lap.lap}"><title>${escapeHtml(name)}${lap.brakeEstimated ? ', brake estimated from the deceleration' : ''}</title>` +
      `<path class="speed" d="${path(lap.speedMps, speedOf)}" fill="none" stroke="${colour}" stroke-width="${width}" stroke-linejoin="round"/>` +
      `<path class="brake" d="${path(lap.brake, brakeOf)}" fill="none" stroke="${colour}" stroke-width="${width}" stroke-linejoin="round"/></g>`;
  }
  body +=
    `<g class="reference-trace"><title>reference</title>` +
    `<path class="speed" d="${path(traces.reference.speedMps, speedOf)}" fill="none" stroke="${PALETTE.reference}" stroke-width="1.5" stroke-dasharray="6 3"/>` +
    `<path class="brake" d="${path(traces.reference.brake, brakeOf)}" fill="none" stroke="${PALETTE.reference}" stroke-width="1.5" stroke-dasharray="6 3"/></g>`;
  for (const [top, bottom] of [
    [SPEED_TOP, SPEED_BOTTOM],
    [BRAKE_TOP, BRAKE_BOTTOM],
  ] as const)
    body += `<rect x="${LEFT}" y="${top}" width="${WIDTH - LEFT - RIGHT}" height="${bottom - top}" fill="none" stroke="#bdbdbd"/>`;
  body += xAxis(x, BRAKE_BOTTOM, `distance, ${units.distanceLabel}`, tickText, 4);
  return svgElement(
    `corner-${traces.id}`,
    WIDTH,
    HEIGHT,
    body,
    options,
    `${spec.title}: speed and brake of every lap against distance`,
    ` data-corner-multiple="${traces.id}"`,
  );
}

/** The legend the small multiples share, as its own small SVG above them. */
export function cornerMultiplesLegendSvg(options: SvgOptions, items: LegendItem[] = cornerMultiplesLegend()): string {
  const { svg } = legendRows(items, 700, 16, 690);
  return svgElement('corner-legend', 700, 24, svg, options, 'Legend of the corner charts');
}
