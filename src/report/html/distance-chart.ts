// One chart against distance along the lap (speed, time delta, pedals, grip use), drawn with d3-shape.
// Series are placed in full-lap coordinates inside a `zoom` group; the page's script zooms by changing that
// group's transform, and vector-effect keeps the strokes their width.

import { area, line } from 'd3-shape';
import { escapeHtml } from './escape.js';
import { minMaxIndices } from './downsample.js';
import { coord, linearScale } from './scale.js';
import { legendRow, svgElement, tickText, xAxis, yAxis, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';

export const CHART_WIDTH = 960;
export const PLOT_LEFT = 62;
export const PLOT_RIGHT = 16;
const PLOT_TOP = 30;
const PLOT_BOTTOM = 28;

/** Samples per drawn bucket: about one bucket per this many metres keeps a 5 km lap light. */
export const DRAW_BUCKET_M = 4;

export interface DistanceSeries {
  label: string;
  colour: string;
  values: ArrayLike<number>;
  dash?: string;
  /** Fill between zero and the line as well. */
  fillToZero?: boolean;
  width?: number;
}

export interface Band {
  from: number;
  to: number;
  colour: string;
  label?: string;
}

/** A shaded range between two series (a band of values at each distance), drawn under the lines. */
export interface RangeArea {
  low: ArrayLike<number>;
  high: ArrayLike<number>;
  colour: string;
  label: string;
}

/** A stretch of the lap shaded across the plot's full height (a state such as power-limited, or a gear shift). */
export interface Span {
  fromM: number;
  toM: number;
  colour: string;
}

export interface DistanceChartSpec {
  name: string;
  title: string;
  /** Axis title with its unit, e.g. 'speed, km/h'. */
  yTitle: string;
  yDomain: [number, number];
  yFormat?: (value: number) => string;
  height: number;
  stationM: Float64Array;
  lengthM: number;
  stepM: number;
  /** The distance axis in the page's units: its label and the factor from metres. */
  distanceLabel: string;
  distancePerM: number;
  series: DistanceSeries[];
  bands?: Band[];
  spans?: Span[];
  ranges?: RangeArea[];
  /** Dashed reference lines at these values. */
  guides?: number[];
  legendExtra?: LegendItem[];
  note?: string;
  /** The page-data series (client-script.ts) whose values inside a zoomed stretch set the y axis there; a chart
   * without them keeps its axis (the pedals' 0-100 % is the scale the reader needs at any zoom). */
  rescaleKeys?: string[];
  /** Keep zero inside the zoomed axis (a delta reads against zero). */
  rescaleWithZero?: boolean;
}

export function distanceChartSvg(spec: DistanceChartSpec, options: SvgOptions): string {
  const plotWidth = CHART_WIDTH - PLOT_LEFT - PLOT_RIGHT;
  const plotBottom = spec.height - PLOT_BOTTOM;
  const plotHeight = plotBottom - PLOT_TOP;
  const y = linearScale(spec.yDomain, [plotBottom, PLOT_TOP]);
  const x = (distanceM: number) => (distanceM / spec.lengthM) * plotWidth;
  const format = spec.yFormat ?? tickText;
  const bucket = Math.max(1, Math.round(DRAW_BUCKET_M / spec.stepM));
  const clipId = `clip-${spec.name}`;

  let body = `<text class="chart-title" x="${PLOT_LEFT}" y="16" font-size="13" font-weight="600">${escapeHtml(spec.title)}</text>`;
  const legendItems: LegendItem[] = [
    ...(spec.ranges ?? []).map((range) => ({ label: range.label, colour: range.colour, mark: 'swatch' as const })),
    ...spec.series
      .filter((series) => series.label)
      .map((series) => ({ label: series.label, colour: series.colour, ...(series.dash ? { dash: series.dash } : {}) })),
    ...(spec.legendExtra ?? []),
  ];
  body += legendRow(legendItems, CHART_WIDTH - PLOT_RIGHT, 16);
  body += yAxis(y, PLOT_LEFT, PLOT_LEFT + plotWidth, spec.yTitle, format);
  body += `<clipPath id="${clipId}"><rect x="${PLOT_LEFT}" y="${PLOT_TOP - 2}" width="${plotWidth}" height="${plotHeight + 4}"/></clipPath>`;
  body += `<g clip-path="url(#${clipId})"><g class="zoom" transform="translate(${PLOT_LEFT} 0)">`;
  for (const band of spec.bands ?? []) {
    const top = y(Math.min(band.to, spec.yDomain[1]));
    const bottom = y(Math.max(band.from, spec.yDomain[0]));
    body += `<rect class="band" x="0" width="${plotWidth}" y="${coord(top)}" height="${coord(Math.max(0, bottom - top))}" fill="${band.colour}"/>`;
  }
  for (const span of spec.spans ?? []) {
    const left = x(span.fromM);
    body += `<rect class="span" x="${coord(left)}" width="${coord(Math.max(0.8, x(span.toM) - left))}" y="${PLOT_TOP}" height="${plotHeight}" fill="${span.colour}"/>`;
  }
  for (const guide of spec.guides ?? []) {
    body += `<line x1="0" x2="${plotWidth}" y1="${coord(y(guide))}" y2="${coord(y(guide))}" stroke="#777" stroke-dasharray="4 3" vector-effect="non-scaling-stroke"/>`;
  }
  const stationM = spec.stationM;
  for (const range of spec.ranges ?? []) {
    // The thinned points of both edges, so neither edge loses its peaks.
    const indices = [...new Set([...minMaxIndices(range.low, bucket), ...minMaxIndices(range.high, bucket)])].sort(
      (a, b) => a - b,
    );
    const fill = area<number>()
      .x((i) => x(stationM[i]!))
      .y0((i) => y(range.low[i]!))
      .y1((i) => y(range.high[i]!))
      .defined((i) => Number.isFinite(range.low[i]!) && Number.isFinite(range.high[i]!))
      .digits(1)(indices);
    body += `<path class="range" d="${fill ?? ''}" fill="${range.colour}" fill-opacity="0.25" stroke="none"/>`;
  }
  for (const series of spec.series) {
    const values = series.values;
    const indices = minMaxIndices(values, bucket);
    const defined = (i: number) => Number.isFinite(values[i]!);
    if (series.fillToZero) {
      const fill = area<number>()
        .x((i) => x(stationM[i]!))
        .y0(y(0))
        .y1((i) => y(values[i]!))
        .defined(defined)
        .digits(1)(indices);
      body += `<path class="series-fill" d="${fill ?? ''}" fill="${series.colour}" fill-opacity="0.22"/>`;
    }
    const path = line<number>()
      .x((i) => x(stationM[i]!))
      .y((i) => y(values[i]!))
      .defined(defined)
      .digits(1)(indices);
    body +=
      `<path class="series" d="${path ?? ''}" fill="none" stroke="${series.colour}" stroke-width="${series.width ?? 1.6}" ` +
      `stroke-linejoin="round"${series.dash ? ` stroke-dasharray="${series.dash}"` : ''} vector-effect="non-scaling-stroke"/>`;
  }
  body += '</g></g>';
  body += `<rect x="${PLOT_LEFT}" y="${PLOT_TOP}" width="${plotWidth}" height="${plotHeight}" fill="none" stroke="#bdbdbd"/>`;
  body += `<g class="x-axis" data-y="${plotBottom}">${xTicks(0, spec.lengthM * spec.distancePerM, plotWidth, plotBottom, spec.distanceLabel)}</g>`;
  if (spec.note)
    body += `<text x="${PLOT_LEFT + 8}" y="${PLOT_TOP + 14}" fill="${PALETTE.axis}" font-style="italic">${escapeHtml(spec.note)}</text>`;
  body +=
    `<line class="cursor" x1="0" x2="0" y1="${PLOT_TOP}" y2="${plotBottom}" stroke="${PALETTE.cursor}" stroke-width="1" visibility="hidden"/>` +
    `<rect class="hover-area" x="${PLOT_LEFT}" y="${PLOT_TOP}" width="${plotWidth}" height="${plotHeight}" fill="transparent"/>`;
  const rescale = spec.rescaleKeys?.length
    ? ` data-y-keys="${spec.rescaleKeys.join(' ')}" data-y-domain="${spec.yDomain.map((v) => Number(v.toPrecision(6))).join(' ')}"` +
      ` data-plot-top="${PLOT_TOP}" data-plot-bottom="${plotBottom}"${spec.rescaleWithZero ? ' data-y-zero=""' : ''}`
    : '';
  const attributes = ` data-distance-chart="" data-plot-left="${PLOT_LEFT}" data-plot-width="${plotWidth}"${rescale}`;
  return svgElement(
    spec.name,
    CHART_WIDTH,
    spec.height,
    body,
    options,
    `${spec.title}: ${spec.yTitle} against distance, ${spec.distanceLabel}`,
    attributes,
  );
}

/** Stretches where a 0/1 state channel is 1, as spans along the stations (each to the next station). */
export function stateSpans(
  state: ArrayLike<number>,
  stationM: ArrayLike<number>,
  stepM: number,
  colour: string,
): Span[] {
  const spans: Span[] = [];
  for (let i = 0; i < state.length; i++) {
    if (!state[i]) continue;
    const from = i;
    while (i + 1 < state.length && state[i + 1]) i++;
    spans.push({ fromM: stationM[from]!, toM: stationM[i]! + stepM, colour });
  }
  return spans;
}

/** Distance ticks under the plot for the range [from, to] in the page's distance unit; the page's script redraws
 * them on zoom. */
export function xTicks(from: number, to: number, plotWidth: number, plotBottom: number, distanceLabel: string): string {
  return xAxis(linearScale([from, to], [PLOT_LEFT, PLOT_LEFT + plotWidth]), plotBottom, `distance, ${distanceLabel}`);
}
