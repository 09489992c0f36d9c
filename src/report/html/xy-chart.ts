// A chart of one quantity against another (lap time against a setup field, say): lines through the points
// with d3-shape, a marker per point carrying its values (data-x, data-y and a <title> the browser shows on
// hover, so the page needs no script), round-number axes and a legend that wraps.

import { line } from 'd3-shape';
import { escapeHtml } from './escape.js';
import { coord, linearScale, paddedDomain } from './scale.js';
import { legendRows, svgElement, tickText, xAxis, yAxis, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';

export const XY_CHART_WIDTH = 560;
const PLOT_LEFT = 64;
const PLOT_RIGHT = 16;
const PLOT_BOTTOM = 34;
const TITLE_HEIGHT = 22;
const LEGEND_ROW_HEIGHT = 15;

export interface XyPoint {
  x: number;
  /** NaN leaves a gap in the line and draws no marker. */
  y: number;
  /** Text shown on hover (escaped here). */
  title?: string;
}

export interface XySeries {
  label: string;
  colour: string;
  dash?: string;
  points: XyPoint[];
  /** Draw the line through the points (default true). */
  line?: boolean;
  /** Draw a marker at each point (default true). */
  markers?: boolean;
  markerRadius?: number;
}

export interface XyChartSpec {
  name: string;
  title: string;
  /** Axis titles with their units, e.g. 'massKg, kg'. */
  xTitle: string;
  yTitle: string;
  plotHeight?: number;
  series: XySeries[];
  /** Dashed horizontal lines at these y values. */
  yGuides?: number[];
  /** Dashed vertical lines at these x values, with a label. */
  xGuides?: { x: number; label: string }[];
  note?: string;
}

function extent(values: number[]): [number, number] {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return [min, max];
}

export function xyChartSvg(spec: XyChartSpec, options: SvgOptions): string {
  const right = XY_CHART_WIDTH - PLOT_RIGHT;
  const legendItems: LegendItem[] = spec.series
    .filter((series) => series.label)
    .map((series) => ({
      label: series.label,
      colour: series.colour,
      ...(series.dash ? { dash: series.dash } : {}),
      ...(series.line === false ? { mark: 'dot' as const } : {}),
    }));
  const legend = legendRows(legendItems, right, TITLE_HEIGHT + 14, right - PLOT_LEFT, LEGEND_ROW_HEIGHT);
  const plotTop = TITLE_HEIGHT + legend.rows * LEGEND_ROW_HEIGHT + 10;
  const plotHeight = spec.plotHeight ?? 210;
  const plotBottom = plotTop + plotHeight;
  const height = plotBottom + PLOT_BOTTOM;

  const xs = spec.series.flatMap((s) => s.points.map((p) => p.x)).concat((spec.xGuides ?? []).map((g) => g.x));
  const ys = spec.series.flatMap((s) => s.points.map((p) => p.y)).concat(spec.yGuides ?? []);
  const [xMin, xMax] = extent(xs);
  const [yMin, yMax] = extent(ys);
  const x = linearScale(paddedDomain(xMin, xMax, 0.04), [PLOT_LEFT, right]);
  const y = linearScale(paddedDomain(yMin, yMax, 0.08), [plotBottom, plotTop]);

  let body = `<text class="chart-title" x="${PLOT_LEFT}" y="16" font-size="13" font-weight="600">${escapeHtml(spec.title)}</text>`;
  body += legend.svg;
  body += yAxis(y, PLOT_LEFT, right, spec.yTitle, tickText, 5);
  body += `<g class="x-axis">${xAxis(x, plotBottom, spec.xTitle, tickText, 6)}</g>`;
  for (const guide of spec.yGuides ?? []) {
    body += `<line x1="${PLOT_LEFT}" x2="${right}" y1="${coord(y(guide))}" y2="${coord(y(guide))}" stroke="#777" stroke-dasharray="4 3"/>`;
  }
  for (const guide of spec.xGuides ?? []) {
    const px = coord(x(guide.x));
    body += `<line class="x-guide" x1="${px}" x2="${px}" y1="${plotTop}" y2="${plotBottom}" stroke="#777" stroke-dasharray="4 3"/>`;
    body += `<text x="${px}" y="${plotTop + 11}" dx="4" fill="${PALETTE.axis}" font-size="10">${escapeHtml(guide.label)}</text>`;
  }
  spec.series.forEach((series, index) => {
    const points = series.points;
    const attributes = `data-series="${index}" data-label="${escapeHtml(series.label)}"`;
    if (series.line !== false) {
      const d = line<XyPoint>()
        .x((p) => x(p.x))
        .y((p) => y(p.y))
        .defined((p) => Number.isFinite(p.x) && Number.isFinite(p.y))
        .digits(1)(points);
      body +=
        `<path class="series" ${attributes} d="${d ?? ''}" fill="none" stroke="${series.colour}" stroke-width="1.8" stroke-linejoin="round"` +
        `${series.dash ? ` stroke-dasharray="${series.dash}"` : ''}/>`;
    }
    if (series.markers !== false) {
      body += `<g class="points" ${attributes} fill="${series.colour}">`;
      for (const p of points) {
        if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) continue;
        body +=
          `<circle class="point" cx="${coord(x(p.x))}" cy="${coord(y(p.y))}" r="${series.markerRadius ?? 3}" data-x="${p.x}" data-y="${p.y}">` +
          `${p.title ? `<title>${escapeHtml(p.title)}</title>` : ''}</circle>`;
      }
      body += '</g>';
    }
  });
  body += `<rect x="${PLOT_LEFT}" y="${plotTop}" width="${right - PLOT_LEFT}" height="${plotHeight}" fill="none" stroke="#bdbdbd"/>`;
  if (spec.note)
    body += `<text x="${PLOT_LEFT}" y="${height - 4}" fill="${PALETTE.axis}" font-style="italic" font-size="10">${escapeHtml(spec.note)}</text>`;
  const attributes = ` data-xy-chart="" data-plot-top="${plotTop}" data-plot-bottom="${plotBottom}"`;
  return svgElement(
    spec.name,
    XY_CHART_WIDTH,
    height,
    body,
    options,
    `${spec.title}: ${spec.yTitle} against ${spec.xTitle}`,
    attributes,
  );
}
