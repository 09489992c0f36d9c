// One chart against distance along the lap (speed, time delta, pedals, grip use), drawn with d3-shape.
// Series are placed in full-lap coordinates inside a `zoom` group; the page's script zooms by changing that
// group's transform, and vector-effect keeps the strokes their width. The corners are numbered at their apex in a
// strip above the plot, the labels kept apart by greedy placement (label-placement.ts).

import { area, line } from 'd3-shape';
import { escapeHtml } from './escape.js';
import { minMaxIndices } from './downsample.js';
import { coord, linearScale, type LinearScale } from './scale.js';
import { legendRow, svgElement, tickText, xAxis, yAxis, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';
import { boxAround, placeLabels, textWidth, type LabelBox } from './label-placement.js';

export const CHART_WIDTH = 960;
export const PLOT_LEFT = 62;
export const PLOT_RIGHT = 16;
const PLOT_TOP = 30;
const PLOT_BOTTOM = 28;
/** Two rows of corner labels above the plot, where a chart numbers its corners. */
const CORNER_ROW_PX = 12;
export const CORNER_STRIP_PX = 2 * CORNER_ROW_PX;

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
  /** The lap's corners, numbered (and named where the track names them) at their apex above the plot. */
  corners?: { id: number; name: string | null; apexM: number }[];
}

/** A corner's label above the plot: where it sits, its text, and whether the whole-lap view shows it. */
export interface CornerLabel {
  id: number;
  text: string;
  x: number;
  y: number;
  shown: boolean;
}

/** Each corner's label at its apex: the number and name where both fit, else the number alone, in the first of two
 * rows where it clears the labels before it; a label that fits nowhere is hidden until the page zooms in. */
export function cornerLabels(
  corners: NonNullable<DistanceChartSpec['corners']>,
  apexX: (apexM: number) => number,
  plotLeft: number,
  plotRight: number,
  stripTop: number,
): CornerLabel[] {
  const rows = [stripTop + CORNER_ROW_PX / 2, stripTop + CORNER_ROW_PX * 1.5];
  const texts = corners.map((c) => (c.name ? [`${c.id} ${c.name}`, String(c.id)] : [String(c.id)]));
  const boxOf = (text: string, x: number, y: number): LabelBox =>
    boxAround(x, y, textWidth(text, 10) + 4, CORNER_ROW_PX - 4);
  const candidates = corners.map((corner, k) => {
    const x = apexX(corner.apexM);
    return texts[k]!.flatMap((text) => rows.map((y) => ({ text, y, box: boxOf(text, x, y) })));
  });
  const within = { x: plotLeft - 6, y: stripTop, width: plotRight - plotLeft + 12, height: 2 * CORNER_ROW_PX };
  const chosen = placeLabels(
    candidates.map((list) => list.map((c) => c.box)),
    { within, gap: 3 },
  );
  return corners.map((corner, k) => {
    const pick = chosen[k]!;
    const place = candidates[k]![Math.max(0, pick)]!;
    const text = pick >= 0 ? place.text : String(corner.id);
    return { id: corner.id, text, x: apexX(corner.apexM), y: place.y, shown: pick >= 0 };
  });
}

/** The uncertainty ranges and the series of a chart as thinned paths (each keeping its peaks within a bucket). */
function seriesPathsSvg(
  spec: DistanceChartSpec,
  x: (distanceM: number) => number,
  y: LinearScale,
  bucket: number,
): string {
  let body = '';
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
  return body;
}

export function distanceChartSvg(spec: DistanceChartSpec, options: SvgOptions): string {
  const plotWidth = CHART_WIDTH - PLOT_LEFT - PLOT_RIGHT;
  const strip = spec.corners?.length ? CORNER_STRIP_PX : 0;
  const height = spec.height + strip;
  const plotTop = PLOT_TOP + strip;
  const plotBottom = height - PLOT_BOTTOM;
  const plotHeight = plotBottom - plotTop;
  const y = linearScale(spec.yDomain, [plotBottom, plotTop]);
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
  body += `<clipPath id="${clipId}"><rect x="${PLOT_LEFT}" y="${plotTop - 2}" width="${plotWidth}" height="${plotHeight + 4}"/></clipPath>`;
  body += `<g clip-path="url(#${clipId})"><g class="zoom" transform="translate(${PLOT_LEFT} 0)">`;
  for (const band of spec.bands ?? []) {
    const top = y(Math.min(band.to, spec.yDomain[1]));
    const bottom = y(Math.max(band.from, spec.yDomain[0]));
    body += `<rect class="band" x="0" width="${plotWidth}" y="${coord(top)}" height="${coord(Math.max(0, bottom - top))}" fill="${band.colour}"/>`;
  }
  for (const span of spec.spans ?? []) {
    const left = x(span.fromM);
    body += `<rect class="span" x="${coord(left)}" width="${coord(Math.max(0.8, x(span.toM) - left))}" y="${plotTop}" height="${plotHeight}" fill="${span.colour}"/>`;
  }
  for (const guide of spec.guides ?? []) {
    body += `<line x1="0" x2="${plotWidth}" y1="${coord(y(guide))}" y2="${coord(y(guide))}" stroke="#777" stroke-dasharray="4 3" vector-effect="non-scaling-stroke"/>`;
  }
  body += seriesPathsSvg(spec, x, y, bucket);
  for (const corner of spec.corners ?? []) {
    const at = coord(x(corner.apexM));
    body += `<line class="apex" x1="${at}" x2="${at}" y1="${plotTop}" y2="${plotBottom}" stroke="#c4c4c4" stroke-dasharray="2 3" vector-effect="non-scaling-stroke"/>`;
  }
  body += '</g></g>';
  if (spec.corners?.length) body += cornerLabelsSvg(spec, x, plotWidth, PLOT_TOP);
  body += `<rect x="${PLOT_LEFT}" y="${plotTop}" width="${plotWidth}" height="${plotHeight}" fill="none" stroke="#bdbdbd"/>`;
  body += `<g class="x-axis" data-y="${plotBottom}">${xTicks(0, spec.lengthM * spec.distancePerM, plotWidth, plotBottom, spec.distanceLabel)}</g>`;
  if (spec.note)
    body += `<text x="${PLOT_LEFT + 8}" y="${plotTop + 14}" fill="${PALETTE.axis}" font-style="italic">${escapeHtml(spec.note)}</text>`;
  body +=
    `<line class="cursor" x1="0" x2="0" y1="${plotTop}" y2="${plotBottom}" stroke="${PALETTE.cursor}" stroke-width="1" visibility="hidden"/>` +
    `<rect class="hover-area" x="${PLOT_LEFT}" y="${plotTop}" width="${plotWidth}" height="${plotHeight}" fill="transparent"/>`;
  const rescale = spec.rescaleKeys?.length
    ? ` data-y-keys="${spec.rescaleKeys.join(' ')}" data-y-domain="${spec.yDomain.map((v) => Number(v.toPrecision(6))).join(' ')}"` +
      ` data-plot-top="${plotTop}" data-plot-bottom="${plotBottom}"${spec.rescaleWithZero ? ' data-y-zero=""' : ''}`
    : '';
  const attributes = ` data-distance-chart="" data-plot-left="${PLOT_LEFT}" data-plot-width="${plotWidth}"${rescale}`;
  return svgElement(
    spec.name,
    CHART_WIDTH,
    height,
    body,
    options,
    `${spec.title}: ${spec.yTitle} against distance, ${spec.distanceLabel}`,
    attributes,
  );
}

function cornerLabelsSvg(
  spec: DistanceChartSpec,
  x: (distanceM: number) => number,
  plotWidth: number,
  stripTop: number,
): string {
  const labels = cornerLabels(
    spec.corners!,
    (apexM) => PLOT_LEFT + x(apexM),
    PLOT_LEFT,
    PLOT_LEFT + plotWidth,
    stripTop,
  );
  let svg = '<g class="corner-labels">';
  spec.corners!.forEach((corner, k) => {
    const label = labels[k]!;
    const title = corner.name ? `Corner ${corner.id}: ${corner.name}` : `Corner ${corner.id}`;
    svg +=
      `<text class="corner-label" data-corner="${corner.id}" data-at="${Number((corner.apexM * spec.distancePerM).toFixed(1))}" ` +
      `data-whole="${label.shown ? 'visible' : 'hidden'}" visibility="${label.shown ? 'visible' : 'hidden'}" x="${coord(label.x)}" y="${coord(label.y)}" dy="0.35em" ` +
      `text-anchor="middle" font-size="10" font-weight="600" fill="#333" cursor="pointer"><title>${escapeHtml(title)}</title>${escapeHtml(label.text)}</text>`;
  });
  return svg + '</g>';
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
