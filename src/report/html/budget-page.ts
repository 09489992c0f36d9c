// `budget --html` and `--svg`: the point on the friction circle. The car's envelope boundary at the given speed,
// the lateral demand as a point on it or inside it, and from that point what is left to brake and to accelerate
// with on the friction ellipse (arrows to the boundary) beside the linear split (ticks), in g.

import { mps2ToG } from '../../units.js';
import type { BudgetReport } from '../budget-text.js';
import { plainNumber, type DisplayUnits } from '../units.js';
import { escapeHtml } from './escape.js';
import { htmlPage } from './page-frame.js';
import { coord, linearScale } from './scale.js';
import { legendRows, svgElement, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';
import { ggGridSvg } from './gg-grid.js';
import { tile } from './cells.js';

const SIZE = 520;
const PAD = 56;
const TOP = 70;

export interface BudgetPicture {
  report: BudgetReport;
  /** The envelope's boundary at the report's speed, [lateral, longitudinal] in g (gg-diagram.ts envelopeBoundaryG). */
  boundaryG: Array<[number, number]>;
}

export function budgetSvg(picture: BudgetPicture, units: DisplayUnits, options: SvgOptions): string {
  const { report, boundaryG } = picture;
  const budget = report.budget;
  const demandG = mps2ToG(Math.abs(budget.lateralDemandMps2));
  let maxG = Math.max(demandG, budget.lateralLimitG, budget.brakingStraightG, budget.accelStraightG, 0.5);
  for (const [lat, lon] of boundaryG) maxG = Math.max(maxG, Math.abs(lat), Math.abs(lon));
  maxG = Math.ceil(maxG * 1.1 * 4) / 4;
  const plot = SIZE - PAD - 20;
  const lateral = linearScale([-maxG, maxG], [PAD, PAD + plot]);
  const longitudinal = linearScale([-maxG, maxG], [TOP + plot, TOP]);
  const speed = `${plainNumber(units.speed(report.speedMps), 0)} ${units.speedLabel}`;
  let body = `<text class="chart-title" x="14" y="18" font-size="13" font-weight="600">${escapeHtml(`The friction circle at ${speed}`)}</text>`;
  const legend: LegendItem[] = [
    { label: 'car envelope', colour: PALETTE.carEnvelope },
    { label: 'lateral demand', colour: PALETTE.driver, mark: 'dot' },
    { label: 'left on the ellipse', colour: PALETTE.reference },
    { label: 'linear split', colour: PALETTE.gripNear },
  ];
  body += legendRows(legend, SIZE - 10, 38, SIZE - 20).svg;
  body += ggGridSvg({ maxG, lateral, longitudinal, left: PAD, right: PAD + plot, top: TOP, bottom: TOP + plot });
  body += `<text x="${coord(PAD + plot / 2)}" y="${TOP + plot + 32}" text-anchor="middle" fill="${PALETTE.axis}">lateral acceleration, g (left turn +)</text>`;
  body += `<text transform="translate(16 ${coord(TOP + plot / 2)}) rotate(-90)" text-anchor="middle" fill="${PALETTE.axis}">longitudinal acceleration, g (drive +, braking −)</text>`;
  const boundary =
    boundaryG.map(([lat, lon], k) => `${k ? 'L' : 'M'}${coord(lateral(lat))},${coord(longitudinal(lon))}`).join('') +
    'Z';
  body += `<path class="envelope" d="${boundary}" fill="#f2f2f2" stroke="${PALETTE.carEnvelope}" stroke-width="1.4"/>`;
  const x = lateral(demandG);
  const beyond = budget.lateralShare > 1;
  if (!beyond) {
    // Arrows from the point to the boundary: what the tyres still give at this lateral load.
    const arrow = (toG: number, name: string) =>
      `<line class="${name}" data-g="${toG.toFixed(4)}" x1="${coord(x)}" y1="${coord(longitudinal(0))}" x2="${coord(x)}" y2="${coord(longitudinal(toG))}" stroke="${PALETTE.reference}" stroke-width="2.2"/>`;
    body += arrow(budget.accelAvailableG, 'accel-left') + arrow(-budget.brakingAvailableG, 'braking-left');
    const tick = (toG: number, name: string) =>
      `<line class="${name}" data-g="${toG.toFixed(4)}" x1="${coord(x - 9)}" x2="${coord(x + 9)}" y1="${coord(longitudinal(toG))}" y2="${coord(longitudinal(toG))}" stroke="${PALETTE.gripNear}" stroke-width="2.4"/>`;
    body +=
      tick(budget.linearAccelAvailableG, 'linear-accel') + tick(-budget.linearBrakingAvailableG, 'linear-braking');
    // Labels on the side of the arrow with more room.
    const right = x < PAD + plot / 2;
    const label = (toG: number, text: string) =>
      `<text x="${coord(right ? x + 12 : x - 12)}" y="${coord(longitudinal(toG))}" dy="${toG >= 0 ? '1em' : '-0.3em'}" text-anchor="${right ? 'start' : 'end'}" fill="${PALETTE.reference}">${escapeHtml(text)}</text>`;
    body += label(budget.accelAvailableG, `${plainNumber(budget.accelAvailableG, 2)} g to accelerate`);
    body += label(-budget.brakingAvailableG, `${plainNumber(budget.brakingAvailableG, 2)} g to brake`);
  }
  body += `<circle class="demand" data-g="${demandG.toFixed(4)}" cx="${coord(x)}" cy="${coord(longitudinal(0))}" r="6" fill="${PALETTE.driver}" stroke="#fff" stroke-width="1.5"/>`;
  const note = beyond
    ? `${plainNumber(demandG, 2)} g is beyond the lateral limit of ${plainNumber(budget.lateralLimitG, 2)} g: nothing is left to brake or accelerate with`
    : `${plainNumber(demandG, 2)} g lateral, ${plainNumber(budget.lateralShare * 100, 0)} % of the limit`;
  body += `<text x="${SIZE - 10}" y="56" text-anchor="end" fill="${PALETTE.axis}">${escapeHtml(note)}</text>`;
  const attributes = ` data-lateral-px="${coord(lateral(0))} ${coord(lateral(1))}" data-longitudinal-px="${coord(longitudinal(0))} ${coord(longitudinal(1))}"`;
  return svgElement(
    'budget',
    SIZE,
    TOP + plot + 44,
    body,
    options,
    `The friction circle at ${speed}: the lateral demand and what is left to brake and accelerate with, g`,
    attributes,
  );
}

/** The page `budget --html` writes: the figures as tiles and the picture, in the report pages' frame. */
export function budgetHtml(picture: BudgetPicture, units: DisplayUnits): string {
  const { report } = picture;
  const budget = report.budget;
  const speed = (speedMps: number) => `${plainNumber(units.speed(speedMps), 0)} ${units.speedLabel}`;
  const g = (value: number) => `${plainNumber(value, 2)} g`;
  const tiles = [
    tile(
      'Lateral in use',
      g(mps2ToG(Math.abs(budget.lateralDemandMps2))),
      `of ${g(budget.lateralLimitG)} at ${speed(report.speedMps)}`,
    ),
    tile(
      'Left to brake',
      g(budget.lateralShare > 1 ? 0 : budget.brakingAvailableG),
      `of ${g(budget.brakingStraightG)} in a straight line`,
    ),
    tile(
      'Left to accelerate',
      g(budget.lateralShare > 1 ? 0 : budget.accelAvailableG),
      `of ${g(budget.accelStraightG)} in a straight line`,
    ),
  ];
  if (report.cornerSpeedLimitMps !== null && report.radiusM !== null)
    tiles.push(
      tile(
        'Fastest on this radius',
        speed(report.cornerSpeedLimitMps),
        `${plainNumber(units.distance(report.radiusM), 0)} ${units.distanceLabel} radius`,
      ),
    );
  return htmlPage({
    title: `Grip budget: ${report.carName} at ${speed(report.speedMps)}`,
    subtitle:
      'What the tyres leave for braking and accelerating while cornering: the friction ellipse beside the linear split',
    header: `<section class="summary" aria-label="Grip budget">${tiles.join('')}</section>`,
    main: `<section class="panel budget-panel">${budgetSvg(picture, units, { standalone: false })}</section>`,
    footerNote: 'Made by reflap. The envelope is the car model’s at this speed; drag is counted in every figure.',
  });
}
