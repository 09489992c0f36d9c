// The grid of a g-g diagram: one line per tick across and along, the zero lines darker, and the tick labels in g
// below and to the left of the plot. Shared by the lap report's g-g diagram and the budget's friction circle.

import { coord, niceTicks } from './scale.js';
import { tickText } from './svg-frame.js';
import { PALETTE } from './palette.js';

export interface GgPlotArea {
  /** Largest acceleration shown either way, g. */
  maxG: number;
  /** Pixel position of a lateral and of a longitudinal acceleration, g. */
  lateral: (g: number) => number;
  longitudinal: (g: number) => number;
  /** Edges of the plot, px. */
  left: number;
  right: number;
  top: number;
  bottom: number;
}

/** SVG of the grid lines and tick labels over the plot area. */
export function ggGridSvg(area: GgPlotArea): string {
  let svg = '';
  for (const tick of niceTicks(-area.maxG, area.maxG, 6)) {
    const px = coord(area.lateral(tick));
    const py = coord(area.longitudinal(tick));
    const stroke = tick === 0 ? '#a8a8a8' : PALETTE.grid;
    svg += `<line x1="${px}" x2="${px}" y1="${coord(area.top)}" y2="${coord(area.bottom)}" stroke="${stroke}"/>`;
    svg += `<line x1="${coord(area.left)}" x2="${coord(area.right)}" y1="${py}" y2="${py}" stroke="${stroke}"/>`;
    svg += `<text x="${px}" y="${coord(area.bottom + 14)}" text-anchor="middle" fill="${PALETTE.axis}">${tickText(tick)}</text>`;
    svg += `<text x="${coord(area.left - 6)}" y="${py}" dy="0.32em" text-anchor="end" fill="${PALETTE.axis}">${tickText(tick)}</text>`;
  }
  return svg;
}
