// Speed labels on the envelope curves of a g-g diagram: each curve named on itself, at its top (the most drive)
// where there is room, else at the nearest point along the curve where the label clears the others and stays in
// the plot (greedy placement, label-placement.ts). A white halo keeps the text readable over the grid and dots.

import { escapeHtml } from './escape.js';
import { boxAround, placeLabels, textWidth, type LabelBox } from './label-placement.js';
import { coord } from './scale.js';

export interface LabelledCurve {
  text: string;
  colour: string;
  /** The curve in g: [lateral, longitudinal]. */
  pointsG: Array<[number, number]>;
}

export interface CurveLabel {
  text: string;
  x: number;
  y: number;
}

const LABEL_HEIGHT_PX = 12;

/** Candidate points of one curve in pixels, from its top outward along both sides. */
function candidatePoints(points: Array<[number, number]>, toPx: (g: [number, number]) => [number, number]): number[][] {
  if (points.length === 0) return [];
  let top = 0;
  points.forEach(([, lon], k) => {
    if (lon > points[top]![1]) top = k;
  });
  const order: number[] = [top];
  const step = Math.max(1, Math.round(points.length / 48));
  for (let k = step; k < points.length / 2; k += step)
    order.push((top + k) % points.length, (top - k + points.length) % points.length);
  return order.map((k) => toPx(points[k]!));
}

/** Where each curve's label goes, or null where no place along it is clear. */
export function curveLabels(
  curves: LabelledCurve[],
  toPx: (g: [number, number]) => [number, number],
  plot: LabelBox,
): (CurveLabel | null)[] {
  const candidates = curves.map((curve) =>
    candidatePoints(curve.pointsG, toPx).map(([x, y]) => ({
      x: x!,
      y: y!,
      box: boxAround(x!, y!, textWidth(curve.text, 10) + 6, LABEL_HEIGHT_PX),
    })),
  );
  const chosen = placeLabels(
    candidates.map((list) => list.map((c) => c.box)),
    { within: plot, gap: 1 },
  );
  return curves.map((curve, k) => {
    const place = chosen[k]! >= 0 ? candidates[k]![chosen[k]!]! : null;
    return place ? { text: curve.text, x: place.x, y: place.y } : null;
  });
}

/** The labels as SVG text, each in its curve's colour over a white halo. */
export function curveLabelsSvg(
  curves: LabelledCurve[],
  toPx: (g: [number, number]) => [number, number],
  plot: LabelBox,
): string {
  const labels = curveLabels(curves, toPx, plot);
  let svg = '<g class="curve-labels">';
  labels.forEach((label, k) => {
    if (!label) return;
    svg +=
      `<text class="curve-label" x="${coord(label.x)}" y="${coord(label.y)}" dy="0.35em" text-anchor="middle" font-size="10" font-weight="600" ` +
      `fill="${curves[k]!.colour}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeHtml(label.text)}</text>`;
  });
  return svg + '</g>';
}
