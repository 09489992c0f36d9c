// The g-g diagram: each sample's lateral and longitudinal acceleration, with the envelope's boundary at a
// few speeds (the friction-circle view of the g-g-v envelope), for the car model and, where fitted, for what
// the driver demonstrated.

import type { Envelope } from '../../car/envelope.js';
import { STANDARD_GRAVITY_MPS2 } from '../../units.js';
import { escapeHtml } from './escape.js';
import { strideIndices } from './downsample.js';
import { coord, linearScale, quantileOf } from './scale.js';
import { legendRow, svgElement, type LegendItem, type SvgOptions } from './svg-frame.js';
import { PALETTE } from './palette.js';
import { ggGridSvg } from './gg-grid.js';
import { curveLabelsSvg } from './gg-curve-labels.js';
import type { ReportModel } from './model.js';

export const GG_SIZE = 440;
const LEGEND_HEIGHT = 44;
const PAD = 42;
/** At most this many points per lap on the diagram. */
const MAX_POINTS = 1500;
const BOUNDARY_STEPS = 48;

export interface GgFrame {
  centreX: number;
  centreY: number;
  pxPerG: number;
}

/** Boundary of the envelope at one speed, in g: accelerating half then braking half, left turn positive. */
export function envelopeBoundaryG(envelope: Envelope, speedMps: number): Array<[number, number]> {
  const leftMps2 = Math.abs(envelope.lateralLimitMps2(speedMps, 1));
  const rightMps2 = Math.abs(envelope.lateralLimitMps2(speedMps, -1));
  const points: Array<[number, number]> = [];
  for (let k = 0; k <= BOUNDARY_STEPS; k++) {
    const ay = -rightMps2 + ((leftMps2 + rightMps2) * k) / BOUNDARY_STEPS;
    points.push([ay / STANDARD_GRAVITY_MPS2, envelope.accelLimitMps2(speedMps, ay) / STANDARD_GRAVITY_MPS2]);
  }
  for (let k = BOUNDARY_STEPS; k >= 0; k--) {
    const ay = -rightMps2 + ((leftMps2 + rightMps2) * k) / BOUNDARY_STEPS;
    points.push([ay / STANDARD_GRAVITY_MPS2, -envelope.brakeLimitMps2(speedMps, ay) / STANDARD_GRAVITY_MPS2]);
  }
  return points.filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b));
}

/** Speeds for the boundaries in the page's unit: slow, middle and fast parts of this lap, rounded to 10 km/h or
 * 10 mph so that each curve's label is a round number. */
export function boundarySpeedsShown(model: ReportModel): number[] {
  const top = model.units.speed(model.input.reference.maxSpeedMps);
  const low = model.units.speed(model.input.reference.minSpeedMps);
  const picks = [low + 0.1 * (top - low), (low + top) / 2, top * 0.95].map((v) =>
    Math.max(10, Math.round(v / 10) * 10),
  );
  return [...new Set(picks)];
}

/** A speed in the page's unit back in m/s. */
function shownToMps(model: ReportModel, speedShown: number): number {
  return speedShown / model.units.speed(1);
}

export function ggFrame(model: ReportModel): { frame: GgFrame; maxG: number } {
  // The reference sets the range in full; a logged lap only up to its 99.5th percentile, so that a few
  // noisy samples do not shrink the rest (they are clipped at the frame).
  let maxG = 0.5;
  const reference = model.reference;
  for (let i = 0; i < reference.axG.length; i++)
    maxG = Math.max(maxG, Math.abs(reference.axG[i]!), Math.abs(reference.ayG[i]!));
  if (model.driver) maxG = Math.max(maxG, quantileOf([model.driver.axG, model.driver.ayG], 0.995, true) || 0);
  const envelope = model.input.envelope;
  for (const speed of boundarySpeedsShown(model)) {
    for (const [a, b] of envelopeBoundaryG(envelope, shownToMps(model, speed)))
      maxG = Math.max(maxG, Math.abs(a), Math.abs(b));
  }
  maxG = Math.min(6, Math.ceil(maxG * 1.08 * 4) / 4);
  const plotSize = GG_SIZE - 2 * PAD;
  const pxPerG = (plotSize - LEGEND_HEIGHT) / (2 * maxG);
  return {
    frame: { centreX: GG_SIZE / 2 + 8, centreY: LEGEND_HEIGHT + PAD + (plotSize - LEGEND_HEIGHT) / 2, pxPerG },
    maxG,
  };
}

/** Dots as zero-length round-capped strokes: one short path instead of a thousand circles. */
function dotsPath(ax: Float64Array, ay: Float64Array, frame: GgFrame, colour: string, className: string): string {
  const indices = strideIndices(ax.length, Math.ceil(ax.length / MAX_POINTS));
  let d = '';
  for (const i of indices) {
    if (!Number.isFinite(ax[i]!) || !Number.isFinite(ay[i]!)) continue;
    d += `M${coord(frame.centreX + ay[i]! * frame.pxPerG)} ${coord(frame.centreY - ax[i]! * frame.pxPerG)}h0`;
  }
  return `<path class="${className}" d="${d}" fill="none" stroke="${colour}" stroke-opacity="0.55" stroke-width="3.2" stroke-linecap="round"/>`;
}

function boundaryPath(
  envelope: Envelope,
  speedMps: number,
  frame: GgFrame,
  colour: string,
  dash: string | null,
): string {
  const points = envelopeBoundaryG(envelope, speedMps);
  const d =
    points
      .map(
        ([lat, lon], k) =>
          `${k ? 'L' : 'M'}${coord(frame.centreX + lat * frame.pxPerG)},${coord(frame.centreY - lon * frame.pxPerG)}`,
      )
      .join('') + 'Z';
  return `<path class="envelope" d="${d}" fill="none" stroke="${colour}" stroke-width="1" stroke-opacity="0.8"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`;
}

export function ggDiagramSvg(model: ReportModel, options: SvgOptions): string {
  const { frame, maxG } = ggFrame(model);
  const extent = maxG * frame.pxPerG;
  const left = frame.centreX - extent;
  const right = frame.centreX + extent;
  const top = frame.centreY - extent;
  const bottom = frame.centreY + extent;
  const lateral = linearScale([-maxG, maxG], [left, right]);
  const longitudinal = linearScale([-maxG, maxG], [bottom, top]);
  let body = `<text class="chart-title" x="14" y="18" font-size="13" font-weight="600">g-g diagram</text>`;
  const speeds = boundarySpeedsShown(model);
  const legend: LegendItem[] = [{ label: 'reference', colour: PALETTE.reference, mark: 'dot' }];
  if (model.driver) legend.push({ label: 'driver', colour: PALETTE.driver, mark: 'dot' });
  legend.push({ label: 'car envelope', colour: PALETTE.carEnvelope });
  const demonstrated = model.input.comparison?.demonstratedEnvelope;
  if (demonstrated) legend.push({ label: 'demonstrated', colour: PALETTE.demonstratedEnvelope, dash: '5 3' });
  body += legendRow(legend, GG_SIZE - 10, 36);
  body += `<text x="${GG_SIZE - 10}" y="52" text-anchor="end" fill="${PALETTE.axis}">${escapeHtml(`envelope at ${speeds.join(', ')} ${model.units.speedLabel}`)}</text>`;

  body += ggGridSvg({ maxG, lateral, longitudinal, left, right, top, bottom });
  body += `<text x="${coord(frame.centreX)}" y="${coord(bottom + 30)}" text-anchor="middle" fill="${PALETTE.axis}">lateral acceleration, g (left turn +)</text>`;
  body += `<text transform="translate(${coord(left - 34)} ${coord(frame.centreY)}) rotate(-90)" text-anchor="middle" fill="${PALETTE.axis}">longitudinal acceleration, g (drive +)</text>`;

  body += `<clipPath id="clip-gg"><rect x="${coord(left)}" y="${coord(top)}" width="${coord(2 * extent)}" height="${coord(2 * extent)}"/></clipPath><g clip-path="url(#clip-gg)">`;
  // Boundaries under the points: the reference rides on them, and its dots must stay visible.
  speeds.forEach((speed) => {
    const speedMps = shownToMps(model, speed);
    body += boundaryPath(model.input.envelope, speedMps, frame, PALETTE.carEnvelope, null);
    if (demonstrated) body += boundaryPath(demonstrated, speedMps, frame, PALETTE.demonstratedEnvelope, '5 3');
  });
  if (model.driver) body += dotsPath(model.driver.axG, model.driver.ayG, frame, PALETTE.driver, 'gg-driver');
  body += dotsPath(model.reference.axG, model.reference.ayG, frame, PALETTE.reference, 'gg-reference');
  body += '</g>';
  // Each car-envelope curve named by its speed on the curve itself, over the dots.
  body += curveLabelsSvg(
    speeds.map((speed) => ({
      text: `${speed} ${model.units.speedLabel}`,
      colour: PALETTE.carEnvelope,
      pointsG: envelopeBoundaryG(model.input.envelope, shownToMps(model, speed)),
    })),
    ([lat, lon]) => [frame.centreX + lat * frame.pxPerG, frame.centreY - lon * frame.pxPerG],
    { x: left, y: top, width: 2 * extent, height: 2 * extent },
  );
  body += `<rect x="${coord(left)}" y="${coord(top)}" width="${coord(2 * extent)}" height="${coord(2 * extent)}" fill="none" stroke="#bdbdbd"/>`;
  body += `<circle class="gg-dot-reference" r="5" fill="${PALETTE.reference}" stroke="#fff" stroke-width="1.5" visibility="hidden"/>`;
  if (model.driver)
    body += `<circle class="gg-dot-driver" r="5" fill="${PALETTE.driver}" stroke="#fff" stroke-width="1.5" visibility="hidden"/>`;
  const attributes = ` data-gg-cx="${coord(frame.centreX)}" data-gg-cy="${coord(frame.centreY)}" data-gg-px-per-g="${frame.pxPerG.toFixed(3)}"`;
  return svgElement(
    'gg',
    GG_SIZE,
    GG_SIZE,
    body,
    options,
    'g-g diagram: longitudinal against lateral acceleration, g',
    attributes,
  );
}
