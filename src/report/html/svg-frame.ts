// Pieces every chart of the report shares: the <svg> element itself, a legend row and a y axis.
// Only presentation attributes are used (no style attributes), so the page's Content-Security-Policy holds
// and a standalone .svg file looks the same as the chart on the page.

import { escapeHtml } from './escape.js';
import { coord, niceTicks, type LinearScale } from './scale.js';
import { PALETTE } from './palette.js';

/** The SVG namespace, needed on standalone files only (inline SVG in HTML takes it from the parser). */
const SVG_NAMESPACE = 'http://www.w3.org/2000/svg';

export interface SvgOptions {
  /** Standalone file: adds the namespace and an XML declaration. */
  standalone: boolean;
}

export function svgElement(
  name: string,
  width: number,
  height: number,
  body: string,
  options: SvgOptions,
  label: string,
  extraAttributes = '',
): string {
  const namespace = options.standalone ? ` xmlns="${SVG_NAMESPACE}"` : '';
  const prolog = options.standalone ? '<?xml version="1.0" encoding="UTF-8"?>\n' : '';
  return (
    `${prolog}<svg${namespace}${extraAttributes} class="chart" data-chart="${name}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" ` +
    `role="img" aria-label="${escapeHtml(label)}" font-family="system-ui, 'Segoe UI', Helvetica, Arial, sans-serif" font-size="11" fill="#222">` +
    `<rect width="${width}" height="${height}" fill="#ffffff"/>${body}</svg>`
  );
}

export interface LegendItem {
  label: string;
  colour: string;
  dash?: string;
  /** 'line' (default), 'dot' or 'swatch' (a filled box). */
  mark?: 'line' | 'dot' | 'swatch';
}

function legendItemWidth(item: LegendItem): number {
  return 26 + item.label.length * 6.1 + 12;
}

/** A legend row ending at `rightX`, baseline at `y`; widths estimated from the label length. */
export function legendRow(items: LegendItem[], rightX: number, y: number): string {
  const widths = items.map(legendItemWidth);
  let x = rightX - widths.reduce((sum, w) => sum + w, 0);
  let out = '<g class="legend">';
  items.forEach((item, index) => {
    const mark =
      item.mark === 'dot'
        ? `<circle cx="${coord(x + 9)}" cy="${y - 4}" r="3.5" fill="${item.colour}"/>`
        : item.mark === 'swatch'
          ? `<rect x="${coord(x)}" y="${y - 9}" width="18" height="9" fill="${item.colour}"/>`
          : `<line x1="${coord(x)}" x2="${coord(x + 18)}" y1="${y - 4}" y2="${y - 4}" stroke="${item.colour}" stroke-width="2.5"${item.dash ? ` stroke-dasharray="${item.dash}"` : ''}/>`;
    out += `${mark}<text x="${coord(x + 24)}" y="${y}">${escapeHtml(item.label)}</text>`;
    x += widths[index]!;
  });
  return out + '</g>';
}

/** Horizontal grid lines with labels at round values, and the axis title turned upright at the left. The grid
 * and labels sit in their own group (`.y-ticks`), which the page's script redraws when a zoom rescales the axis. */
export function yAxis(
  scale: LinearScale,
  left: number,
  right: number,
  title: string,
  format: (value: number) => string,
  tickCount = 4,
): string {
  const middle = coord((scale.range[0] + scale.range[1]) / 2);
  return (
    `<g class="y-axis"><g class="y-ticks">${yTicks(scale, left, right, format, tickCount)}</g>` +
    `<text transform="translate(14 ${middle}) rotate(-90)" text-anchor="middle" fill="${PALETTE.axis}">${escapeHtml(title)}</text></g>`
  );
}

/** The grid lines and tick labels of a y axis alone. */
export function yTicks(
  scale: LinearScale,
  left: number,
  right: number,
  format: (value: number) => string,
  tickCount = 4,
): string {
  const [d0, d1] = scale.domain;
  let out = '';
  for (const tick of niceTicks(Math.min(d0, d1), Math.max(d0, d1), tickCount)) {
    const y = coord(scale(tick));
    out += `<line x1="${left}" x2="${right}" y1="${y}" y2="${y}" stroke="${tick === 0 ? '#b8b8b8' : PALETTE.grid}"/>`;
    out += `<text x="${left - 6}" y="${y}" dy="0.32em" text-anchor="end" fill="${PALETTE.axis}">${escapeHtml(format(tick))}</text>`;
  }
  return out;
}

/** Tick marks and labels under a plot at round values, and the axis title at the right end below them. */
export function xAxis(
  scale: LinearScale,
  bottom: number,
  title: string,
  format: (value: number) => string = tickText,
  tickCount = 10,
): string {
  const [d0, d1] = scale.domain;
  let out = '';
  for (const tick of niceTicks(Math.min(d0, d1), Math.max(d0, d1), tickCount)) {
    const px = coord(scale(tick));
    out += `<line x1="${px}" x2="${px}" y1="${bottom}" y2="${bottom + 4}" stroke="${PALETTE.axis}"/>`;
    out += `<text x="${px}" y="${bottom + 15}" text-anchor="middle" fill="${PALETTE.axis}">${escapeHtml(format(tick))}</text>`;
  }
  out += `<text x="${coord(Math.max(scale.range[0], scale.range[1]))}" y="${bottom + 26}" text-anchor="end" fill="${PALETTE.axis}">${escapeHtml(title)}</text>`;
  return out;
}

/** Legend rows ending at `rightX`, the first with its baseline at `y`, wrapped so that no row is wider than `maxWidth`. */
export function legendRows(
  items: LegendItem[],
  rightX: number,
  y: number,
  maxWidth: number,
  rowHeight = 15,
): { svg: string; rows: number } {
  const rows: LegendItem[][] = [[]];
  let width = 0;
  for (const item of items) {
    const itemWidth = legendItemWidth(item);
    if (width + itemWidth > maxWidth && rows[rows.length - 1]!.length > 0) {
      rows.push([]);
      width = 0;
    }
    rows[rows.length - 1]!.push(item);
    width += itemWidth;
  }
  return { svg: rows.map((row, k) => legendRow(row, rightX, y + k * rowHeight)).join(''), rows: rows.length };
}

/** Plain number text for tick labels: integers as they are, otherwise up to two decimals. */
export function tickText(value: number): string {
  if (Number.isInteger(value)) return String(value);
  return String(Number(value.toFixed(2)));
}
