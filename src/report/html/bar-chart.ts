// A bar chart of one signed quantity per category (the braking-point shift per corner): bars up from zero
// for positive values and down for negative ones, each with its value as a <title>; a category without a
// value is marked, not drawn as zero.

import { escapeHtml } from './escape.js';
import { coord, linearScale, paddedDomain } from './scale.js';
import { legendRow, svgElement, tickText, yAxis, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';

const WIDTH = 960;
const PLOT_LEFT = 64;
const PLOT_RIGHT = 16;
const PLOT_TOP = 30;
const PLOT_BOTTOM = 40;

export interface BarChartSpec {
  name: string;
  title: string;
  yTitle: string;
  height?: number;
  colour: string;
  legend: string;
  bars: { label: string; value: number | null; title: string }[];
  /** Text under a category without a value. */
  missingText: string;
}

export function barChartSvg(spec: BarChartSpec, options: SvgOptions): string {
  const height = spec.height ?? 260;
  const plotBottom = height - PLOT_BOTTOM;
  const right = WIDTH - PLOT_RIGHT;
  const values = spec.bars.map((b) => b.value).filter((v): v is number => v !== null && Number.isFinite(v));
  const [d0, d1] = paddedDomain(Math.min(0, ...values), Math.max(0, ...values), 0.1);
  const y = linearScale([d0, d1], [plotBottom, PLOT_TOP]);
  const slot = (right - PLOT_LEFT) / Math.max(1, spec.bars.length);
  const barWidth = Math.min(48, slot * 0.6);
  let body = `<text class="chart-title" x="${PLOT_LEFT}" y="16" font-size="13" font-weight="600">${escapeHtml(spec.title)}</text>`;
  body += legendRow([{ label: spec.legend, colour: spec.colour, mark: 'swatch' }], right, 16);
  body += yAxis(y, PLOT_LEFT, right, spec.yTitle, tickText, 5);
  const zero = y(0);
  spec.bars.forEach((bar, index) => {
    const centre = PLOT_LEFT + slot * (index + 0.5);
    body += `<text x="${coord(centre)}" y="${plotBottom + 15}" text-anchor="middle" fill="${PALETTE.axis}">${escapeHtml(bar.label)}</text>`;
    if (bar.value === null || !Number.isFinite(bar.value)) {
      body += `<text x="${coord(centre)}" y="${coord(zero - 4)}" text-anchor="middle" font-size="10" font-style="italic" fill="${PALETTE.axis}">${escapeHtml(spec.missingText)}</text>`;
      return;
    }
    const top = Math.min(zero, y(bar.value));
    const barHeight = Math.max(0.5, Math.abs(y(bar.value) - zero));
    body +=
      `<path class="bar" data-value="${bar.value}" d="M${coord(centre - barWidth / 2)},${coord(top)}h${coord(barWidth)}v${coord(barHeight)}h${coord(-barWidth)}Z" fill="${spec.colour}">` +
      `<title>${escapeHtml(bar.title)}</title></path>`;
  });
  body += `<line x1="${PLOT_LEFT}" x2="${right}" y1="${coord(zero)}" y2="${coord(zero)}" stroke="#555"/>`;
  body += `<rect x="${PLOT_LEFT}" y="${PLOT_TOP}" width="${right - PLOT_LEFT}" height="${plotBottom - PLOT_TOP}" fill="none" stroke="#bdbdbd"/>`;
  return svgElement(spec.name, WIDTH, height, body, options, `${spec.title}: ${spec.yTitle}`, ' data-bar-chart=""');
}
