// The track map: the track's surface, the reference line and the driver's path, the lap that the page is
// about coloured by its grip use, the corners numbered (clickable), and a dot the page's script moves.

import { escapeHtml } from './escape.js';
import { strideIndices } from './downsample.js';
import { coord } from './scale.js';
import { legendRow, svgElement, type LegendItem, type SvgOptions } from './svg-frame.js';
import { GRIP_CLASS_COLOUR, GRIP_CLASS_LABEL, gripClass, PALETTE, type GripClass } from './palette.js';
import type { ReportModel } from './model.js';
import type { DisplayUnits } from '../units.js';
import { boxAround, placeLabels, type LabelBox } from './label-placement.js';

export const MAP_WIDTH = 520;
export const MAP_HEIGHT = 440;
const MARGIN = 34;
const LEGEND_HEIGHT = 44;
/** Map points are drawn about this many metres apart. */
const MAP_STEP_M = 3;

/** Maps track metres to map pixels, north up. */
export interface MapProjection {
  x(xM: number): number;
  y(yM: number): number;
  pxPerM: number;
}

export function mapProjection(model: ReportModel): MapProjection {
  const { track } = model.input.reference;
  let minX = Infinity;
  let maxX = -Infinity;
  let minY = Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < track.xM.length; i++) {
    minX = Math.min(minX, track.xM[i]!);
    maxX = Math.max(maxX, track.xM[i]!);
    minY = Math.min(minY, track.yM[i]!);
    maxY = Math.max(maxY, track.yM[i]!);
  }
  const spanX = Math.max(maxX - minX, 1);
  const spanY = Math.max(maxY - minY, 1);
  const usableWidth = MAP_WIDTH - 2 * MARGIN;
  const usableHeight = MAP_HEIGHT - 2 * MARGIN - LEGEND_HEIGHT;
  const pxPerM = Math.min(usableWidth / spanX, usableHeight / spanY);
  const offsetX = MARGIN + (usableWidth - spanX * pxPerM) / 2;
  const offsetY = LEGEND_HEIGHT + MARGIN + (usableHeight - spanY * pxPerM) / 2;
  return {
    x: (xM) => offsetX + (xM - minX) * pxPerM,
    y: (yM) => offsetY + (maxY - yM) * pxPerM,
    pxPerM,
  };
}

function polyline(indices: number[], xs: ArrayLike<number>, ys: ArrayLike<number>, map: MapProjection): string {
  let d = '';
  for (const i of indices) d += `${d ? 'L' : 'M'}${coord(map.x(xs[i]!))},${coord(map.y(ys[i]!))}`;
  return d;
}

/** The path split into runs of one grip-use class; each run's class is the highest use within it, or 'power'
 * where the stretch is power-limited throughout with grip to spare. */
function colouredPath(
  indices: number[],
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  gripPct: ArrayLike<number>,
  map: MapProjection,
  width: number,
  powerLimited: ArrayLike<number> | null = null,
): string {
  let out = '';
  let run: number[] = [];
  let runClass: GripClass | null = null;
  const flush = () => {
    if (run.length > 1 && runClass) {
      out += `<path class="grip-${runClass}" d="${polyline(run, xs, ys, map)}" fill="none" stroke="${GRIP_CLASS_COLOUR[runClass]}" stroke-width="${width}" stroke-linecap="round" stroke-linejoin="round"/>`;
    }
  };
  for (let k = 0; k < indices.length; k++) {
    const start = indices[k]!;
    const end = k + 1 < indices.length ? indices[k + 1]! : start + 1;
    let peak = 0;
    let power = powerLimited !== null;
    for (let i = start; i < Math.min(end, gripPct.length); i++) {
      peak = Math.max(peak, gripPct[i]!);
      if (powerLimited && !powerLimited[i]) power = false;
    }
    const grip = gripClass(peak / 100);
    const cls: GripClass = power && grip === 'unused' ? 'power' : grip;
    if (cls !== runClass) {
      if (run.length) run.push(start);
      flush();
      run = [start];
      runClass = cls;
    } else {
      run.push(start);
    }
  }
  flush();
  return out;
}

/** What the map colours the lap by: the tyres' grip use, or where the driver gains or loses against the other lap. */
export type MapColouring = 'grip' | 'gain';

/** The driver's delta to the other lap is compared between the GAIN_WINDOW_M before a point and the GAIN_WINDOW_M
 * after it (the mean over each, so that a logged clock's jitter does not speckle the map); a change within
 * GAIN_EVEN_S counts as even. */
export const GAIN_WINDOW_M = 30;
export const GAIN_EVEN_S = 0.01;

type GainClass = 'gain' | 'loss' | 'even';
const GAIN_COLOUR: Record<GainClass, string> = { gain: PALETTE.gain, loss: PALETTE.loss, even: PALETTE.even };

/** Each drawn point's class: the mean of the driver's delta to the other lap over the window after it, minus the
 * mean over the window before it. The windows stop at the ends of the lap (the delta restarts at the line). */
export function gainClasses(deltaS: ArrayLike<number>, indices: number[], stepM: number): GainClass[] {
  const n = deltaS.length;
  const half = Math.max(1, Math.round(GAIN_WINDOW_M / stepM));
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i]! + (Number.isFinite(deltaS[i]!) ? deltaS[i]! : 0);
  const mean = (from: number, to: number) => (prefix[to + 1]! - prefix[from]!) / (to - from + 1);
  return indices.map((i) => {
    const before = mean(Math.max(0, i - half), i);
    const after = mean(i, Math.min(n - 1, i + half));
    const change = after - before;
    return change > GAIN_EVEN_S ? 'loss' : change < -GAIN_EVEN_S ? 'gain' : 'even';
  });
}

function gainPath(
  indices: number[],
  classes: GainClass[],
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  map: MapProjection,
): string {
  let out = '';
  let k = 0;
  while (k < indices.length) {
    const cls = classes[k]!;
    const run = [indices[k]!];
    while (k + 1 < indices.length && classes[k + 1] === cls) run.push(indices[++k]!);
    if (k + 1 < indices.length) run.push(indices[k + 1]!);
    k++;
    if (run.length > 1)
      out += `<path class="gain-${cls}" d="${polyline(run, xs, ys, map)}" fill="none" stroke="${GAIN_COLOUR[cls]}" stroke-width="4" stroke-linecap="round" stroke-linejoin="round"/>`;
  }
  return out;
}

export function trackMapSvg(model: ReportModel, options: SvgOptions, colouring: MapColouring = 'grip'): string {
  const { track } = model.input.reference;
  const map = mapProjection(model);
  const count = model.stationM.length;
  const indices = strideIndices(count, Math.max(1, Math.round(MAP_STEP_M / track.stepM)));
  if (model.closed) indices.push(0);
  const driver = model.driver;
  const driverHasPath = Boolean(driver?.xM && driver.yM);

  let widthM = 10;
  if (track.widthLeftM && track.widthRightM) {
    let sum = 0;
    for (let i = 0; i < count; i++) sum += track.widthLeftM[i]! + track.widthRightM[i]!;
    widthM = sum / count;
  }
  const surfaceWidth = Math.max(6, widthM * map.pxPerM);
  const other = colouring === 'gain' ? model.other : null;
  if (colouring === 'gain' && !other) throw new Error('track map: a gain map needs a lap to set the driver against');
  const title = other ? `Gain and loss against ${other.label}` : 'Track map';
  let body = `<text class="chart-title" x="14" y="18" font-size="13" font-weight="600">${escapeHtml(title)}</text>`;
  const classes: GripClass[] = driverHasPath ? ['unused', 'near', 'over'] : ['unused', 'power', 'near', 'over'];
  const legend: LegendItem[] = other
    ? [
        { label: 'driver gains', colour: PALETTE.gain },
        { label: 'loses', colour: PALETTE.loss },
        { label: `even (within ${GAIN_EVEN_S} s per ${GAIN_WINDOW_M} m)`, colour: PALETTE.even },
      ]
    : classes.map((cls) => ({ label: GRIP_CLASS_LABEL[cls], colour: GRIP_CLASS_COLOUR[cls] }));
  body += legendRow(legend, MAP_WIDTH - 10, 36);
  const path = driverHasPath ? 'driver’s path' : 'reference line';
  const subject = other
    ? `${path} coloured by the driver’s time to ${other.label}`
    : driverHasPath
      ? 'driver’s path coloured by grip use; reference line in black'
      : 'reference line coloured by grip use';
  body += `<text x="${MAP_WIDTH - 10}" y="52" text-anchor="end" fill="${PALETTE.axis}">${escapeHtml(subject)}</text>`;
  body += `<path class="track-surface" d="${polyline(indices, track.xM, track.yM, map)}" fill="none" stroke="${PALETTE.trackSurface}" stroke-width="${coord(surfaceWidth)}" stroke-linejoin="round" stroke-linecap="round"/>`;
  const reference = model.reference;
  if (other) {
    const xs = driverHasPath ? driver!.xM! : reference.xM!;
    const ys = driverHasPath ? driver!.yM! : reference.yM!;
    body += gainPath(indices, gainClasses(other.driverDeltaS, indices, track.stepM), xs, ys, map);
  } else if (driver && driverHasPath) {
    body += colouredPath(indices, driver.xM!, driver.yM!, driver.gripUsePct, map, 4);
    body += `<path class="reference-line" d="${polyline(indices, reference.xM!, reference.yM!, map)}" fill="none" stroke="#111" stroke-width="1.2" stroke-linejoin="round"/>`;
  } else {
    body += colouredPath(indices, reference.xM!, reference.yM!, reference.gripUsePct, map, 4, reference.powerLimited);
  }

  // Start/finish: a bar across the track at the first sample, and the direction of travel.
  const heading = track.headingRad[0]!;
  const nx = -Math.sin(heading);
  const ny = Math.cos(heading);
  const half = surfaceWidth / 2 + 5;
  const sx = map.x(track.xM[0]!);
  const sy = map.y(track.yM[0]!);
  body += `<line x1="${coord(sx + nx * half)}" y1="${coord(sy - ny * half)}" x2="${coord(sx - nx * half)}" y2="${coord(sy + ny * half)}" stroke="#111" stroke-width="2.5"/>`;
  body += `<text x="${coord(sx + nx * (half + 4))}" y="${coord(sy - ny * (half + 4))}" font-size="10" fill="#111" text-anchor="middle">start ▸</text>`;

  if (!model.closed) {
    const last = count - 1;
    const lh = track.headingRad[last]!;
    const ex = map.x(track.xM[last]!);
    const ey = map.y(track.yM[last]!);
    const enx = -Math.sin(lh);
    const eny = Math.cos(lh);
    body += `<line x1="${coord(ex + enx * half)}" y1="${coord(ey - eny * half)}" x2="${coord(ex - enx * half)}" y2="${coord(ey + eny * half)}" stroke="#111" stroke-width="2.5" stroke-dasharray="3 2"/>`;
    body += `<text x="${coord(ex + enx * (half + 4))}" y="${coord(ey - eny * (half + 4))}" font-size="10" fill="#111" text-anchor="middle">finish</text>`;
  }

  for (const mark of cornerMarks(model, map, surfaceWidth, indices)) {
    const { corner, cx, cy } = mark;
    const title = corner.name ? `Corner ${corner.id}: ${corner.name}` : `Corner ${corner.id}`;
    const leader = mark.leader
      ? `<line class="leader" x1="${coord(mark.leader[0])}" y1="${coord(mark.leader[1])}" x2="${coord(cx)}" y2="${coord(cy)}" stroke="#111" stroke-width="0.8"/>`
      : '';
    body +=
      `<g class="corner-mark" data-corner="${corner.id}" tabindex="0" role="button" cursor="pointer"><title>${escapeHtml(title)}</title>${leader}` +
      `<circle cx="${coord(cx)}" cy="${coord(cy)}" r="${MARK_RADIUS_PX}" fill="#ffffff" stroke="#111" stroke-width="1.2"/>` +
      `<text x="${coord(cx)}" y="${coord(cy)}" dy="0.35em" text-anchor="middle" font-size="10" font-weight="600">${corner.id}</text></g>`;
  }
  body += `<circle class="map-dot" cx="0" cy="0" r="5.5" fill="#111" stroke="#fff" stroke-width="2" visibility="hidden"/>`;
  const bar = scaleBarOf(map.pxPerM, model.units);
  body += `<text x="14" y="${MAP_HEIGHT - 10}" fill="${PALETTE.axis}">${escapeHtml(bar.label)}</text>`;
  body += scaleBar(bar.widthPx);
  return svgElement(
    other ? 'map-gain' : 'map',
    MAP_WIDTH,
    MAP_HEIGHT,
    body,
    options,
    other ? `${title}, the corners numbered` : 'Track map with the corners numbered',
    ' data-track-map=""',
  );
}

const MARK_RADIUS_PX = 9;

/** A corner's number on the map: its centre, and the start of a leader line where it is moved off its first place. */
export interface CornerMark {
  corner: ReportModel['corners'][number];
  cx: number;
  cy: number;
  leader: [number, number] | null;
}

/** The corner numbers: each on the outside of its bend just clear of the surface; where that place is taken by
 * another number or lies on the track, further out along the normal, then on the inside, with a leader line to the
 * edge of the surface at the apex (greedy placement with collision tests, label-placement.ts). */
export function cornerMarks(
  model: ReportModel,
  map: MapProjection,
  surfaceWidth: number,
  indices: number[],
): CornerMark[] {
  const { track } = model.input.reference;
  const count = model.stationM.length;
  const r = MARK_RADIUS_PX;
  const trackX = indices.map((i) => map.x(track.xM[i]!));
  const trackY = indices.map((i) => map.y(track.yM[i]!));
  const clearance = surfaceWidth / 2 + r + 1;
  // Off the surface: no drawn point of the track within the surface's half-width of the number's circle.
  const offTrack = (box: LabelBox) => {
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    for (let k = 0; k < trackX.length; k++) {
      const dx = trackX[k]! - cx;
      const dy = trackY[k]! - cy;
      if (dx * dx + dy * dy < clearance * clearance) return false;
    }
    return true;
  };
  const first = surfaceWidth / 2 + 13;
  const offsets = [first, first + 16, first + 32];
  const places = model.corners.map((corner) => {
    const i = Math.min(count - 1, Math.max(0, Math.round(corner.apexM / track.stepM)));
    const h = track.headingRad[i]!;
    const ax = map.x(track.xM[i]!);
    const ay = map.y(track.yM[i]!);
    const outside = track.curvaturePerM[i]! >= 0 ? -1 : 1;
    return [outside, -outside].flatMap((side) =>
      offsets.map((offset) => ({
        cx: ax + side * -Math.sin(h) * offset,
        cy: ay - side * Math.cos(h) * offset,
        edge: [ax + side * -Math.sin(h) * (surfaceWidth / 2), ay - side * Math.cos(h) * (surfaceWidth / 2)] as [
          number,
          number,
        ],
      })),
    );
  });
  // The title, legend and caption above, and the scale bar below, stay clear.
  const within = { x: 2, y: 58, width: MAP_WIDTH - 4, height: MAP_HEIGHT - 58 - 30 };
  const chosen = placeLabels(
    places.map((list) => list.map((p) => boxAround(p.cx, p.cy, 2 * r, 2 * r))),
    { within, isClear: offTrack, gap: 1 },
  );
  return model.corners.map((corner, k) => {
    const pick = chosen[k]!;
    const place = places[k]![Math.max(0, pick)]!;
    return { corner, cx: place.cx, cy: place.cy, leader: pick > 0 ? place.edge : null };
  });
}

/** A round length (1, 2 or 5 times a power of ten, in the page's distance unit) that is at most about 90 px. */
export function scaleBarOf(pxPerM: number, units: DisplayUnits): { label: string; widthPx: number } {
  const perUnit = units.distance(1);
  const target = (90 / pxPerM) * perUnit;
  const power = 10 ** Math.floor(Math.log10(target));
  const length = [5, 2, 1].map((m) => m * power).find((m) => m <= target) ?? power;
  return { label: `${length} ${units.distanceLabel}`, widthPx: (length / perUnit) * pxPerM };
}

function scaleBar(width: number): string {
  const y = MAP_HEIGHT - 24;
  return `<path d="M14,${y - 4}V${y}H${coord(14 + width)}V${y - 4}" fill="none" stroke="${PALETTE.axis}" stroke-width="1.5"/>`;
}

/** Map coordinates of the lap drawn as the subject, for the page's hover dot. */
export function mapPoint(model: ReportModel, map: MapProjection, index: number): [number, number] {
  const driver = model.driver;
  const xs = driver?.xM ?? model.reference.xM!;
  const ys = driver?.yM ?? model.reference.yM!;
  return [Math.round(map.x(xs[index]!) * 10) / 10, Math.round(map.y(ys[index]!) * 10) / 10];
}
